/**
 * Differencing: the coefficients of (1 − B)ᵈ(1 − Bᵐ)ᴰ written as x_t − Σ delta[k−1] x_{t−k}, and the
 * differenced series itself. Source: Box, Jenkins, Reinsel & Ljung (2015), §4.1 and §9.1; the coefficient
 * layout is that of R's stats::arima (its `Delta`).
 *
 *   differencingPolynomial(1, 0, 12) → [1];  differencingPolynomial(1, 1, 4) → [1, 0, 0, 1, −1]
 *   difference([1, 4, 9, 16], [1]) → [3, 5, 7]   (NaN in any value used gives NaN)
 */
export function differencingPolynomial(d: number, D: number, period: number): Float64Array {
  // Coefficients of the polynomial 1 + c₁z + … (c₀ = 1), multiplied out factor by factor.
  let c = [1];
  const times = (f: number[]) => {
    const out = new Array<number>(c.length + f.length - 1).fill(0);
    for (let i = 0; i < c.length; i++) for (let j = 0; j < f.length; j++) out[i + j] += c[i] * f[j];
    c = out;
  };
  for (let i = 0; i < d; i++) times([1, -1]);
  if (D > 0) {
    const seasonal = new Array<number>(period + 1).fill(0);
    seasonal[0] = 1;
    seasonal[period] = -1;
    for (let i = 0; i < D; i++) times(seasonal);
  }
  return Float64Array.from(c.slice(1), (v) => (v === 0 ? 0 : -v));
}

/** x_t − Σ delta[k−1] x_{t−k} for t = delta.length … n − 1. */
export function difference(x: ArrayLike<number>, delta: Float64Array): Float64Array {
  const k = delta.length;
  const out = new Float64Array(Math.max(0, x.length - k));
  for (let t = k; t < x.length; t++) {
    let v = x[t];
    for (let j = 0; j < k; j++) v -= delta[j] * x[t - 1 - j];
    out[t - k] = v;
  }
  return out;
}
