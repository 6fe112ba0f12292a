/**
 * Henderson trend filters (Henderson 1916, "Note on graduation by adjusted average", Transactions of the
 * Actuarial Society of America 17, 43–48) of any odd length H, from the closed formula as printed in the
 * Australian Bureau of Statistics' "A Guide to Interpreting Time Series — Monitoring Trends" (2003):
 * with m = (H−1)/2 and n = m + 2, for j = −m…m
 *
 *   w_j = 315[(n−1)² − j²][n² − j²][(n+1)² − j²][3n² − 16 − 11j²] / (8n(n² − 1)(4n² − 1)(4n² − 9)(4n² − 25))
 *
 *   hendersonWeights(5) → [−0.073, 0.294, 0.559, 0.294, −0.073] (3 decimals)
 *
 * The symmetric filter reproduces any cubic exactly. Near the ends it is replaced by Musgrave's asymmetric
 * weights (Musgrave 1964; the surrogate Henderson filters of X-11, Doherty 2001, Australian & New Zealand
 * Journal of Statistics 43(4), 385–392): weights u_i, i = −m…q, minimising the expected revision when the
 * series is locally a line with slope β plus noise of variance σ²:
 *
 *   u_i = w_i + (1/N)·Σ_{k>q} w_k + (i − c)·D/(1 + D·N(N²−1)/12)·Σ_{k>q} (k − c)·w_k,
 *
 * N = m + q + 1 points, c = (q − m)/2 their mean position, D = β²/σ² = 4/(π·R²) for the I/C ratio R.
 */

/** Symmetric Henderson weights of odd length ≥ 3, index 0 is lag −m. */
export function hendersonWeights(length: number): Float64Array {
  if (!Number.isInteger(length) || length < 3 || length % 2 === 0) {
    throw new RangeError(`Henderson length must be an odd integer ≥ 3, got ${length}`);
  }
  const m = (length - 1) / 2;
  const n = m + 2;
  const n2 = n * n;
  const denominator = 8 * n * (n2 - 1) * (4 * n2 - 1) * (4 * n2 - 9) * (4 * n2 - 25);
  const w = new Float64Array(length);
  for (let j = -m; j <= m; j++) {
    const j2 = j * j;
    w[j + m] = (315 * ((n - 1) ** 2 - j2) * (n2 - j2) * ((n + 1) ** 2 - j2) * (3 * n2 - 16 - 11 * j2)) / denominator;
  }
  return w;
}

/**
 * The I/C ratio used for a filter length's end weights, as in X-11 (Doherty 2001; the values 0.001, 4.5,
 * 1.0, 3.5 and 4.5 for the 5-, 7-, 9-, 13- and 23-term filters are given from memory). Other lengths take
 * the value of the nearest listed length below.
 */
export function defaultIcRatio(length: number): number {
  if (length <= 5) return 0.001;
  if (length <= 7) return 4.5;
  if (length <= 11) return 1.0;
  if (length <= 21) return 3.5;
  return 4.5;
}

/**
 * Musgrave end weights for a point with q (0 ≤ q ≤ m) observations after it: N = m + q + 1 weights for
 * lags −m…q. q = m gives the symmetric weights back.
 */
export function musgraveWeights(symmetric: Float64Array, q: number, icRatio: number): Float64Array {
  const m = (symmetric.length - 1) / 2;
  if (!Number.isInteger(q) || q < 0 || q > m) throw new RangeError(`q must be an integer in 0…${m}, got ${q}`);
  const count = m + q + 1;
  const c = (q - m) / 2;
  const d = 4 / (Math.PI * icRatio * icRatio);
  let outside = 0;
  let outsideMoment = 0;
  for (let k = q + 1; k <= m; k++) {
    outside += symmetric[k + m];
    outsideMoment += (k - c) * symmetric[k + m];
  }
  const slope = (d / (1 + (d * count * (count * count - 1)) / 12)) * outsideMoment;
  const u = new Float64Array(count);
  for (let i = -m; i <= q; i++) u[i + m] = symmetric[i + m] + outside / count + (i - c) * slope;
  return u;
}

/**
 * Henderson trend of a whole series: symmetric weights in the middle, Musgrave weights at both ends (the
 * start mirrored), so every point has a value. A NaN in a point's window gives NaN there.
 */
export function hendersonSmooth(values: Float64Array, length: number, icRatio = defaultIcRatio(length)): Float64Array {
  const n = values.length;
  const w = hendersonWeights(length);
  const m = (length - 1) / 2;
  if (n < length) throw new RangeError(`a ${length}-term Henderson filter needs at least ${length} values, got ${n}`);
  const ends: Float64Array[] = [];
  for (let q = 0; q < m; q++) ends.push(musgraveWeights(w, q, icRatio));
  const out = new Float64Array(n);
  for (let t = 0; t < n; t++) {
    const after = n - 1 - t;
    let s = 0;
    if (after < m) {
      // Only `after` points follow (n ≥ length, so all m before exist): weights for lags −m…after.
      const u = ends[after];
      for (let j = -m; j <= after; j++) s += u[j + m] * values[t + j];
    } else if (t < m) {
      // Only t points precede: the mirror image of the end weights.
      const u = ends[t];
      for (let j = -t; j <= m; j++) s += u[m - j] * values[t + j];
    } else {
      for (let j = -m; j <= m; j++) s += w[j + m] * values[t + j];
    }
    out[t] = s;
  }
  return out;
}
