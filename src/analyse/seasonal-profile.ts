/**
 * A seasonal pattern as it stands now: over the latest whole cycle(s) of the pattern's seasonal component
 * ending at the reporting period, the typical effect of each season (periods grouped by the season their
 * date names: see season-naming.ts), with the peak and low seasons; and how much of the latest raw change
 * the usual season accounts for: raw change minus the change of the seasonally adjusted series (for an
 * additive model exactly the change of the seasonal component).
 * The profile reads the seasonal component only, never the trend, so it exists wherever the component does
 * (a classical trend stops half a cycle before the end; its seasonal does not). An effect as a percent is of
 * the mean observed level over the same cycles, and only when that level and every value in them is
 * positive; otherwise NaN, and the words give units.
 * Source: the seasonal factors of a decomposition read as typical effects, Hyndman & Athanasopoulos, FPP
 * 3rd ed., §3.2–3.4; the split of a movement into seasonal and adjusted parts is common practice.
 *
 *   additive, last cycle seasonal [−10, 0, 10, 0] on observed values averaging 100 → peak +10 (10%), low −10 (−10%)
 */

import type { SeasonalProfile } from '../vocabulary/brief.js';
import type { SeasonNaming } from '../vocabulary/claims.js';

export interface ProfileInput {
  seasonal: ArrayLike<number>;
  observed: ArrayLike<number>;
  adjusted: ArrayLike<number>;
  index: number;
  period: number;
  multiplicative: boolean;
  naming: SeasonNaming;
  /** The season of the period at an index under the naming, given its position in the cycle. */
  seasonAt: (index: number, position: number) => { order: number; label: string };
}

/** The latest whole cycle ending at or before `index` over which the seasonal and the data are all defined. */
export function wholeCycle(p: ProfileInput): { from: number; to: number } | null {
  for (let to = p.index; to - p.period + 1 >= 0; to--) {
    let ok = true;
    for (let i = to - p.period + 1; i <= to && ok; i++) {
      ok = Number.isFinite(p.seasonal[i]) && Number.isFinite(p.observed[i]);
    }
    if (ok) return { from: to - p.period + 1, to };
  }
  return null;
}

export function seasonalProfile(p: ProfileInput): SeasonalProfile {
  const r = p.index;
  const latestRawChange = p.observed[r] - p.observed[r - 1];
  const latestSeasonalChange = latestRawChange - (p.adjusted[r] - p.adjusted[r - 1]);
  const seasonalSharePercent = latestRawChange !== 0 ? (100 * latestSeasonalChange) / latestRawChange : Number.NaN;
  const cycles = wholeCycle(p);
  const groups = new Map<string, { order: number; sum: number; n: number }>();
  let level = 0;
  let positive = true;
  if (cycles) {
    for (let i = cycles.from; i <= cycles.to; i++) {
      const { order, label } = p.seasonAt(i, (i - cycles.from) % p.period);
      const g = groups.get(label) ?? { order, sum: 0, n: 0 };
      g.sum += p.seasonal[i];
      g.n++;
      groups.set(label, g);
      level += p.observed[i];
      if (!(p.observed[i] > 0)) positive = false;
    }
    level /= cycles.to - cycles.from + 1;
  } else level = Number.NaN;
  const relative = positive && level > 0;
  const seasons = [...groups].map(([label, g]) => {
    const m = g.sum / g.n;
    return {
      season: g.order,
      label,
      effect: p.multiplicative ? (m - 1) * level : m,
      effectPercent: p.multiplicative ? 100 * (m - 1) : relative ? (100 * m) / level : Number.NaN,
    };
  });
  seasons.sort((a, b) => a.season - b.season);
  const none = { season: 0, label: '', effect: Number.NaN, effectPercent: Number.NaN };
  let peak = seasons[0] ?? none;
  let trough = seasons[0] ?? none;
  for (const s of seasons) {
    if (s.effect > peak.effect) peak = s;
    if (s.effect < trough.effect) trough = s;
  }
  return {
    period: p.period,
    naming: p.naming,
    cycles: cycles ?? { from: -1, to: -1 },
    level,
    seasons,
    peak,
    trough,
    latestRawChange,
    latestSeasonalChange,
    seasonalSharePercent,
  };
}
