/**
 * The F test for moving seasonality: a two-way analysis of variance without replication, cycles (years) by
 * seasons, of the absolute seasonal-irregular deviations |SI − centre| (centre 100 for ratios in percent, 0
 * for differences); the statistic is the cycles' mean square over the residual mean square (Higginson 1975,
 * "An F test for the presence of moving seasonality when using Census Method II-X-11 variant", Statistics
 * Canada; F_M of X-11-ARIMA's table D8, as in Lothian & Morry 1978). Only whole cycles count: runs of
 * `period` consecutive defined values, the first starting at the first defined value.
 *
 *   F_M = [S_B / (N − 1)] / [S_R / ((N − 1)(k − 1))],  N cycles, k seasons
 *   |SI| [[1, 2], [3, 4], [2, 2]] (3 cycles of 2) → S_B = 13/3, S_R = 1/3, F = (13/6) / (1/6) = 13
 */

import type { FTest } from '../vocabulary/seasonality.js';
import { fUpperTail } from './f-distribution.js';

export function movingSeasonalityTest(values: ArrayLike<number>, period: number, centre: number): FTest {
  const cycles: number[][] = [];
  let i = 0;
  while (i < values.length && !Number.isFinite(values[i])) i++;
  for (; i + period <= values.length; i += period) {
    const cycle: number[] = [];
    for (let j = 0; j < period; j++) cycle.push(Math.abs(values[i + j] - centre));
    if (cycle.every(Number.isFinite)) cycles.push(cycle);
  }
  const N = cycles.length;
  const k = period;
  if (N < 2 || k < 2) return { statistic: Number.NaN, df1: Number.NaN, df2: Number.NaN, pValue: Number.NaN };
  const rowMeans = cycles.map((c) => c.reduce((a, b) => a + b, 0) / k);
  const colMeans = new Float64Array(k);
  for (const c of cycles) for (let j = 0; j < k; j++) colMeans[j] += c[j] / N;
  const grand = rowMeans.reduce((a, b) => a + b, 0) / N;
  let between = 0;
  for (const m of rowMeans) between += k * (m - grand) ** 2;
  let residual = 0;
  cycles.forEach((c, r) => {
    for (let j = 0; j < k; j++) residual += (c[j] - rowMeans[r] - colMeans[j] + grand) ** 2;
  });
  const df1 = N - 1;
  const df2 = (N - 1) * (k - 1);
  const statistic = residual > 0 ? between / df1 / (residual / df2) : Number.POSITIVE_INFINITY;
  return { statistic, df1, df2, pValue: fUpperTail(statistic, df1, df2) };
}
