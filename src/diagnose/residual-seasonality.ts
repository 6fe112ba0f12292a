/**
 * Residual seasonality: is any seasonal pattern left in the seasonally adjusted series? A one-way analysis
 * of variance of the adjusted series' period-on-period changes grouped by season — the F-test for
 * seasonality on the differenced adjusted series used as an adjustment diagnostic (Lothian & Morry 1978,
 * "A test for the presence of identifiable seasonality when using the X-11 program", Statistics Canada;
 * the same idea as the residual-seasonality F-test of X-13ARIMA-SEATS' documentation). Judged on the last
 * eight cycles at most, so an old pattern does not mask a recent one; "present" when p < 0.01.
 *
 *   changes grouped by season with equal means → F ≈ 1, p ≈ 0.5: nothing left
 */
import type { ResidualSeasonality } from '../vocabulary/seasonality.js';
import { fUpperTail } from './f-distribution.js';

export const RESIDUAL_SEASONALITY_ALPHA = 0.01;
export const RESIDUAL_SEASONALITY_CYCLES = 8;

export function residualSeasonality(adjusted: ArrayLike<number>, period: number): ResidualSeasonality {
  const n = adjusted.length;
  const start = Math.max(1, n - RESIDUAL_SEASONALITY_CYCLES * period);
  const sums = new Float64Array(period);
  const counts = new Float64Array(period);
  const diffs: { season: number; value: number }[] = [];
  for (let t = start; t < n; t++) {
    const d = adjusted[t] - adjusted[t - 1];
    if (Number.isNaN(d)) continue;
    const season = t % period;
    diffs.push({ season, value: d });
    sums[season] += d;
    counts[season]++;
  }
  const groups = counts.filter((c) => c > 0).length;
  const total = diffs.length;
  const test = 'F-test on the adjusted series’ period-on-period changes by season (last 8 cycles)';
  if (groups < 2 || total - groups < 1) {
    return {
      statistic: Number.NaN,
      df1: Number.NaN,
      df2: Number.NaN,
      pValue: Number.NaN,
      present: false,
      test,
      level: RESIDUAL_SEASONALITY_ALPHA,
      cycles: RESIDUAL_SEASONALITY_CYCLES,
    };
  }
  let grand = 0;
  for (const d of diffs) grand += d.value;
  grand /= total;
  let between = 0;
  for (let s = 0; s < period; s++) if (counts[s] > 0) between += counts[s] * (sums[s] / counts[s] - grand) ** 2;
  let within = 0;
  for (const d of diffs) within += (d.value - sums[d.season] / counts[d.season]) ** 2;
  const df1 = groups - 1;
  const df2 = total - groups;
  const statistic = within > 0 ? between / df1 / (within / df2) : Number.POSITIVE_INFINITY;
  const pValue = fUpperTail(statistic, df1, df2);
  return {
    statistic,
    df1,
    df2,
    pValue,
    present: pValue < RESIDUAL_SEASONALITY_ALPHA,
    test,
    level: RESIDUAL_SEASONALITY_ALPHA,
    cycles: RESIDUAL_SEASONALITY_CYCLES,
  };
}
