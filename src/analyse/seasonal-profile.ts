/**
 * The seasonal profile as it stands now: each season's effect over the latest full cycle ending at the
 * reporting period, in units and as a percent of the level, with the peak and trough seasons; and how much
 * of the latest raw change the usual season accounts for: raw change minus the change of the seasonally
 * adjusted series (for an additive model exactly the change of the seasonal component).
 * Source: the seasonal factors of a decomposition read as typical effects, Hyndman & Athanasopoulos, FPP
 * 3rd ed., §3.2–3.4; the split of a movement into seasonal and adjusted parts is common practice.
 *
 *   additive, latest cycle seasonal [−10, 0, 10, 0] on a level of 100 → peak +10 (10%), trough −10 (−10%)
 */
import type { SeasonalProfile } from '../brief/model.js';

export interface ProfileInput {
  seasonal: ArrayLike<number>;
  trend: ArrayLike<number>;
  observed: ArrayLike<number>;
  adjusted: ArrayLike<number>;
  index: number;
  period: number;
  multiplicative: boolean;
  /** Calendar position (for ordering) and name of the season of the period at an index. */
  seasonOf: (index: number) => { position: number; label: string };
}

export function seasonalProfile(p: ProfileInput): SeasonalProfile {
  const from = Math.max(0, p.index - p.period + 1);
  const seasons = [];
  for (let i = from; i <= p.index; i++) {
    const { position, label } = p.seasonOf(i);
    const s = p.seasonal[i];
    const level = p.trend[i];
    const effect = p.multiplicative ? (s - 1) * level : s;
    const effectPercent = p.multiplicative ? 100 * (s - 1) : (100 * s) / level;
    seasons.push({ season: position, label, effect, effectPercent });
  }
  seasons.sort((a, b) => a.season - b.season);
  let peak = seasons[0];
  let trough = seasons[0];
  for (const s of seasons) {
    if (s.effectPercent > peak.effectPercent) peak = s;
    if (s.effectPercent < trough.effectPercent) trough = s;
  }
  const r = p.index;
  const latestRawChange = p.observed[r] - p.observed[r - 1];
  const latestSeasonalChange = latestRawChange - (p.adjusted[r] - p.adjusted[r - 1]);
  const seasonalSharePercent = latestRawChange !== 0 ? (100 * latestSeasonalChange) / latestRawChange : Number.NaN;
  return { seasons, peak, trough, latestRawChange, latestSeasonalChange, seasonalSharePercent };
}
