/**
 * The F test for stable seasonality: a one-way analysis of variance of the seasonal-irregular values by
 * season (Lothian & Morry 1978, "A test for the presence of identifiable seasonality when using the X-11
 * program", Statistics Canada, Seasonal Adjustment and Time Series Staff, research paper; the statistic F_S
 * of X-11-ARIMA's table D8). Season s of value i is i mod period, counted from the series' first value;
 * undefined values (NaN) are left out.
 *
 *   F_S = [S_A / (k − 1)] / [S_R / (n − k)],  S_A = Σ_s n_s (mean_s − mean)²,  S_R = Σ (x − mean_s)²
 *   values [1, 3, 1, 3, 2, 4] with period 2 → means 4/3 and 10/3, S_A = 6, S_R = 4/3, F = 6 / (1/3) = 18
 */
import type { FTest } from '../vocabulary/seasonality.js';
import { fUpperTail } from './f-distribution.js';

export function stableSeasonalityTest(values: ArrayLike<number>, period: number): FTest {
  const sums = new Float64Array(period);
  const counts = new Float64Array(period);
  let total = 0;
  let n = 0;
  for (let i = 0, s = 0; i < values.length; i++) {
    const v = values[i];
    if (Number.isFinite(v)) {
      sums[s] += v;
      counts[s]++;
      total += v;
      n++;
    }
    if (++s === period) s = 0;
  }
  let k = 0;
  for (let s = 0; s < period; s++) if (counts[s] > 0) k++;
  if (k < 2 || n - k < 1) return { statistic: Number.NaN, df1: Number.NaN, df2: Number.NaN, pValue: Number.NaN };
  const mean = total / n;
  let between = 0;
  for (let s = 0; s < period; s++) if (counts[s] > 0) between += counts[s] * (sums[s] / counts[s] - mean) ** 2;
  let within = 0;
  for (let i = 0, s = 0; i < values.length; i++) {
    const v = values[i];
    if (Number.isFinite(v)) within += (v - sums[s] / counts[s]) ** 2;
    if (++s === period) s = 0;
  }
  const df1 = k - 1;
  const df2 = n - k;
  const statistic = within > 0 ? between / df1 / (within / df2) : Number.POSITIVE_INFINITY;
  return { statistic, df1, df2, pValue: fUpperTail(statistic, df1, df2) };
}
