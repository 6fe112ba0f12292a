/**
 * Check of a seasonal pattern's peak and low: over the whole cycles the claim names, the seasonal
 * component of that pattern is averaged by season (the season each period's date names), and the season
 * with the largest (smallest) average must be the one named, with the stated size: percent of the mean
 * observed level over those cycles (additive, relative), 100·(factor − 1) (multiplicative, relative), or
 * units (absolute; a multiplicative factor times the mean level).
 */
import type { SeasonalPeakLowClaim, SeasonNaming } from '../vocabulary/claims.js';
import type { VerifyContext } from './context.js';
import { isoWeek, MONTHS, monthOf, ms, WEEKDAYS, weekdayOf } from './dates.js';
import { agrees } from './numbers.js';

export function seasonLabel(naming: SeasonNaming, iso: string, position: number): string {
  const t = ms(iso);
  switch (naming) {
    case 'month':
      return MONTHS[monthOf(t)];
    case 'quarter':
      return `Q${Math.floor(monthOf(t) / 3) + 1}`;
    case 'iso-week':
      return `week ${isoWeek(t).week}`;
    case 'weekday':
      return WEEKDAYS[weekdayOf(t)];
    case 'hour':
      return `${String(new Date(t).getUTCHours()).padStart(2, '0')}:00`;
    case 'cycle-position':
      return String(position + 1);
  }
}

export function checkSeasonalPeakLow(c: SeasonalPeakLowClaim, ctx: VerifyContext): string[] {
  const { s } = ctx;
  const k = s.components;
  const out: string[] = [];
  const len = c.cycles.to - c.cycles.from + 1;
  if (c.cycles.from < 0 || c.cycles.to > s.reportingIndex || len <= 0 || len % c.period !== 0) {
    return [`cycles ${c.cycles.from}–${c.cycles.to} are not whole cycles of ${c.period} within the series`];
  }
  if (!s.settings.periods.includes(c.period))
    return [`describes a period of ${c.period}, not one of the decomposition's`];
  const seasonal = k.seasonals?.[String(c.period)] ?? k.seasonal;
  const mult = s.settings.model === 'multiplicative';
  const groups = new Map<string, { sum: number; n: number }>();
  let level = 0;
  for (let i = c.cycles.from; i <= c.cycles.to; i++) {
    if (!Number.isFinite(seasonal[i]) || !Number.isFinite(k.observed[i])) {
      return [`the seasonal component or the data is undefined at ${k.dates[i]}, inside the cycles used`];
    }
    level += k.observed[i];
    const key = seasonLabel(c.seasonsBy, k.dates[i], (i - c.cycles.from) % c.period);
    const g = groups.get(key) ?? { sum: 0, n: 0 };
    g.sum += seasonal[i];
    g.n++;
    groups.set(key, g);
  }
  level /= len;
  let peak = '';
  let low = '';
  let hi = Number.NEGATIVE_INFINITY;
  let lo = Number.POSITIVE_INFINITY;
  for (const [key, g] of groups) {
    const m = g.sum / g.n;
    if (m > hi) [hi, peak] = [m, key];
    if (m < lo) [lo, low] = [m, key];
  }
  const size = (m: number): number => {
    if (c.expression === 'absolute') return mult ? (m - 1) * level : m;
    if (mult) return 100 * (m - 1);
    return level > 0 ? (100 * m) / level : Number.NaN;
  };
  if (c.expression === 'relative' && !mult && !(level > 0)) out.push(`gives a percent of a level of ${level}`);
  if (c.peak.label !== peak) out.push(`names ${c.peak.label} as the peak; the seasonal component peaks in ${peak}`);
  if (c.low.label !== low) out.push(`names ${c.low.label} as the low; the seasonal component is lowest in ${low}`);
  const unitScale = c.expression === 'relative' ? 100 : ctx.scale;
  if (c.peak.label === peak && !agrees(c.peak.size, size(hi), unitScale, 1e-9)) {
    out.push(`peak size ${c.peak.size}, recomputed ${size(hi)}`);
  }
  if (c.low.label === low && !agrees(c.low.size, size(lo), unitScale, 1e-9)) {
    out.push(`low size ${c.low.size}, recomputed ${size(lo)}`);
  }
  if (!(size(hi) > 0) || !(size(lo) < 0)) out.push('the peak is not above the trend or the low not below it');
  const text = ctx.statement.text;
  if (!text.includes(c.peak.label) || !text.includes(c.low.label)) out.push('the words do not name the peak and low');
  return out;
}
