/**
 * Centred moving average of order k; for even k the 2×k average (weight 1/(2k) at both ends, 1/k inside).
 * Source: Hyndman & Athanasopoulos, Forecasting: Principles and Practice, 3rd ed., §3.3.
 * Points where the window does not fit are NaN, never a shrunken window: order 5 leaves the first and last
 * two undefined (common practice), 2×12 the first and last six. A NaN inside the window gives NaN.
 *
 *   centredMovingAverage([1, 2, 3, 4, 5, 6], 3) → [NaN, 2, 3, 4, 5, NaN]
 */
export function centredMovingAverage(values: Float64Array, order: number): Float64Array {
  const weights = movingAverageWeights(order);
  return applySymmetricFilter(values, weights);
}

/** The weights of the centred average of order k: k equal weights for odd k, k+1 for even k (2×k). */
export function movingAverageWeights(order: number): Float64Array {
  if (!Number.isInteger(order) || order < 1) throw new RangeError(`order must be a positive integer, got ${order}`);
  if (order % 2 === 1) return new Float64Array(order).fill(1 / order);
  const w = new Float64Array(order + 1).fill(1 / order);
  w[0] = 1 / (2 * order);
  w[order] = 1 / (2 * order);
  return w;
}

/**
 * Applies a symmetric filter of odd length 2m+1; the first and last m points are NaN, as is any point whose
 * window holds a NaN.
 */
export function applySymmetricFilter(values: Float64Array, weights: Float64Array): Float64Array {
  const n = values.length;
  const len = weights.length;
  const m = (len - 1) >> 1;
  const out = new Float64Array(n).fill(Number.NaN);
  let symmetric = len % 2 === 1;
  for (let r = 1; r <= m; r++) if (weights[m - r] !== weights[m + r]) symmetric = false;
  if (!symmetric) {
    for (let t = m; t < n - m; t++) {
      let s = 0;
      const base = t - m;
      for (let j = 0; j < len; j++) s += weights[j] * values[base + j];
      out[t] = s;
    }
    return out;
  }
  // The points t − r and t + r share a weight: half the multiplications, and half as long a chain of
  // additions; the same sum to rounding.
  for (let t = m; t < n - m; t++) {
    let s = weights[m] * values[t];
    for (let r = 1; r <= m; r++) s += weights[m - r] * (values[t - r] + values[t + r]);
    out[t] = s;
  }
  return out;
}
