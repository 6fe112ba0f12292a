/**
 * Year-over-year change of a series, period by period, in percent: 100·(x[t] / x[t − lag] − 1), where lag is
 * the periods back to the same period a year earlier (12 for monthly data, 4 for quarterly; calendar.yearLag).
 * Source: Hyndman & Athanasopoulos, Forecasting: Principles and Practice, 3rd ed., §9.1 — the seasonal
 * difference x[t] − x[t − m], here taken relative to x[t − m] so that it reads as a percent change on the same
 * period a year earlier (growth rates as in §3.1).
 * The first `lag` values have no base and are NaN; so is any value whose base is zero, negative or NaN, or
 * whose current value is NaN (the rule of percentChange, so the chart agrees with analysis.trendYoY).
 *
 *   trendYoYSeries([100, 110, 105, 121], 2) → [NaN, NaN, 5, 10]   (105/100 − 1 = 5 %, 121/110 − 1 = 10 %)
 */
import { percentChange } from './change.js';

export function trendYoYSeries(trend: ArrayLike<number>, lag: number): number[] {
  if (!Number.isInteger(lag) || lag < 1) throw new RangeError(`lag must be a positive integer, got ${lag}`);
  const n = trend.length;
  const out = new Array<number>(n).fill(Number.NaN);
  for (let t = lag; t < n; t++) out[t] = percentChange(trend[t], trend[t - lag]);
  return out;
}
