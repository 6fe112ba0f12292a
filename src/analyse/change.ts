/**
 * Change between two periods of one series: the value now, the value compared against, the difference
 * and the percent change 100·(current/base − 1) (Hyndman & Athanasopoulos, FPP 3rd ed., §3.1 and §5.1
 * on growth rates). Year-over-year when the lag is a year of periods, period-on-period when it is 1. The
 * percent is NaN when the base is zero, negative or undefined: a percent of such a base misleads.
 *
 *   changeAt([100, 104, 110], 2, 2) → current 110, base 100, change 10, percent 10
 */
import type { Change } from '../vocabulary/brief.js';

export function changeAt(values: ArrayLike<number>, index: number, lag: number, dates: string[]): Change {
  const current = index >= 0 && index < values.length ? values[index] : Number.NaN;
  const baseIndex = index - lag;
  const base = baseIndex >= 0 ? values[baseIndex] : Number.NaN;
  return {
    current,
    yearAgo: base,
    change: current - base,
    percent: percentChange(current, base),
    currentDate: dates[index] ?? '',
    baseDate: dates[baseIndex] ?? '',
  };
}

export function percentChange(current: number, base: number): number {
  return base > 0 ? 100 * (current / base - 1) : Number.NaN;
}

/**
 * Growth over the last k periods expressed as a yearly rate: 100·((T_t / T_{t−k})^(P/k) − 1) for P periods a
 * year (compound annualisation; e.g. Australian Bureau of Statistics, "A Guide to Interpreting Time
 * Series", 2003, on annualised trend growth).
 *
 *   annualisedGrowth([100, …, 103], 6, 12): 3% over 6 months → 100·(1.03² − 1) = 6.09%
 */
export function annualisedGrowth(values: ArrayLike<number>, index: number, k: number, periodsPerYear: number): number {
  const from = index - k;
  // As for percentChange: a growth rate from a zero, negative or missing base is undefined.
  if (from < 0 || !(values[from] > 0)) return Number.NaN;
  const ratio = values[index] / values[from];
  if (!(ratio > 0)) return Number.NaN;
  return 100 * (ratio ** (periodsPerYear / k) - 1);
}
