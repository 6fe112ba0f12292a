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
import type { ChiSquareTest } from '../vocabulary/seasonality.js';
import { chiSquareUpperTail } from './chi-square.js';

export function kruskalWallis(values: ArrayLike<number>, period: number): ChiSquareTest {
  // Typed arrays and no object per value: a million hourly values as objects were a hundred megabytes of
  // short-lived garbage, and sorting them by a comparator the slowest step of a long brief.
  let n = 0;
  for (let i = 0; i < values.length; i++) if (Number.isFinite(values[i])) n++;
  const sorted = new Float64Array(n);
  for (let i = 0, m = 0; i < values.length; i++) if (Number.isFinite(values[i])) sorted[m++] = values[i];
  sorted.sort();
  const scale = Math.max(Math.abs(sorted[0] ?? 0), Math.abs(sorted[n - 1] ?? 0));
  const tol = 1e-9 * scale;
  // The mid-rank of each tie group, at every sorted position of the group. Equal values always fall in one
  // group (a group runs on while values stay within tol of its first), so a value's rank is the one at the
  // first position holding it.
  const midRank = new Float64Array(n);
  let ties = 0;
  for (let i = 0; i < n; ) {
    let j = i;
    while (j + 1 < n && sorted[j + 1] - sorted[i] <= tol) j++;
    const rank = (i + j) / 2 + 1;
    midRank.fill(rank, i, j + 1);
    const t = j - i + 1;
    ties += t * t * t - t;
    i = j + 1;
  }
  // Ranks are multiples of one half and their sums far below 2^53, so the sums are exact in any order.
  const rankSums = new Float64Array(period);
  const counts = new Float64Array(period);
  for (let i = 0, s = 0; i < values.length; i++) {
    const v = values[i];
    if (Number.isFinite(v)) {
      rankSums[s] += midRank[firstAtLeast(sorted, v)];
      counts[s]++;
    }
    if (++s === period) s = 0;
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

/** The first index of sorted (ascending) whose value is at least v. */
function firstAtLeast(sorted: Float64Array, v: number): number {
  let lo = 0;
  let hi = sorted.length;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if (sorted[mid] < v) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}
