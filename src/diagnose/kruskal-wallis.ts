/**
 * The Kruskal–Wallis rank test that the seasons share one distribution (Kruskal & Wallis 1952, "Use of
 * ranks in one-criterion variance analysis", JASA 47(260), 583–621): mid-ranks for ties and the tie
 * correction, referred to chi-square with k − 1 degrees of freedom, as R's stats::kruskal.test does. Season
 * of value i is i mod period; undefined values (NaN) are left out. Values within 1e-9 of the largest
 * magnitude of each other are ties: seasonal-irregular values of whole-number data are often equal in
 * exact arithmetic but not after rounding, and which of them tie should not depend on the order of a sum.
 *
 *   H = [12 / (n(n+1)) Σ R_s² / n_s − 3(n+1)] / [1 − Σ(t³ − t) / (n³ − n)]
 *   values [1, 2, 3, 4] with period 2 → seasons {1, 3}, {2, 4}: rank sums 4 and 6, H = 0.6
 */
import { chiSquareUpperTail } from './chi-square.js';

export interface ChiSquareTest {
  statistic: number;
  df: number;
  pValue: number;
}

export function kruskalWallis(values: ArrayLike<number>, period: number): ChiSquareTest {
  const items: { v: number; s: number }[] = [];
  for (let i = 0, s = 0; i < values.length; i++) {
    if (Number.isFinite(values[i])) items.push({ v: values[i], s });
    if (++s === period) s = 0;
  }
  const n = items.length;
  items.sort((a, b) => a.v - b.v);
  let scale = 0;
  for (const it of items) scale = Math.max(scale, Math.abs(it.v));
  const tol = 1e-9 * scale;
  const rankSums = new Float64Array(period);
  const counts = new Float64Array(period);
  let ties = 0;
  for (let i = 0; i < n; ) {
    let j = i;
    while (j + 1 < n && items[j + 1].v - items[i].v <= tol) j++;
    const rank = (i + j) / 2 + 1;
    for (let m = i; m <= j; m++) {
      rankSums[items[m].s] += rank;
      counts[items[m].s]++;
    }
    const t = j - i + 1;
    ties += t * t * t - t;
    i = j + 1;
  }
  let k = 0;
  let sum = 0;
  for (let s = 0; s < period; s++) {
    if (counts[s] === 0) continue;
    k++;
    sum += (rankSums[s] * rankSums[s]) / counts[s];
  }
  const correction = 1 - ties / (n * n * n - n);
  if (k < 2 || !(correction > 0)) return { statistic: Number.NaN, df: Number.NaN, pValue: Number.NaN };
  const statistic = ((12 / (n * (n + 1))) * sum - 3 * (n + 1)) / correction;
  return { statistic, df: k - 1, pValue: chiSquareUpperTail(statistic, k - 1) };
}
