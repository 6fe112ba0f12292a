/**
 * What the line charts (scenes/line-with-trend.ts), the year-over-year bars and the alt texts share: the
 * trend's names in the legend and its provisional stretch, drawn dashed.
 */
import type { SeriesBrief } from '../vocabulary/brief.js';

export const TREND_NAME = 'trend';
export const PROVISIONAL_NAME = 'trend (provisional)';

/** The provisional stretch of the trend as an index range [from, n), or null when every value is final. */
export function provisionalRange(series: SeriesBrief): { from: number; count: number } | null {
  const n = series.components.trend.length;
  const { provisionalFrom, provisionalCount } = series.analysis.firmness;
  if (!Number.isInteger(provisionalFrom) || !(provisionalCount > 0) || provisionalFrom >= n) return null;
  const from = Math.max(0, provisionalFrom);
  return { from, count: n - from };
}
