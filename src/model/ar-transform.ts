/**
 * Maps unconstrained numbers onto the coefficients of a stationary AR polynomial and back: each number goes
 * through tanh to a partial autocorrelation in (−1, 1), and the Durbin–Levinson recursion turns partial
 * autocorrelations into AR coefficients. Source: Jones (1980), "Maximum likelihood fitting of ARMA models to
 * time series with missing observations", Technometrics 22(3), 389–395; Monahan (1984), Biometrika 71(2),
 * 403–404. The same map R's stats::arima uses for method "ML" with transform.pars = TRUE (partrans).
 *
 *   arFromUnconstrained([atanh(0.5)]) → [0.5];  two values u₁, u₂ → [r₁ − r₂r₁, r₂] with rᵢ = tanh(uᵢ)
 */
export function arFromUnconstrained(raw: Float64Array, out: Float64Array = new Float64Array(raw.length)): Float64Array {
  const p = raw.length;
  for (let i = 0; i < p; i++) out[i] = Math.tanh(raw[i]);
  // φₖ ← φₖ − a·φ_{j−1−k} for k < j, in place by pairs (k, j − 1 − k), so a likelihood search allocates nothing.
  for (let j = 1; j < p; j++) {
    const a = out[j];
    for (let k = 0, h = j - 1; k <= h; k++, h--) {
      const ok = out[k];
      const oh = out[h];
      out[k] = ok - a * oh;
      if (h !== k) out[h] = oh - a * ok;
    }
  }
  return out;
}

/** The inverse map; NaN when the coefficients are not those of a stationary polynomial. */
export function unconstrainedFromAr(coefs: Float64Array): Float64Array {
  const p = coefs.length;
  const cur = Float64Array.from(coefs);
  const work = new Float64Array(p);
  for (let j = p - 1; j > 0; j--) {
    const a = cur[j];
    if (!(Math.abs(a) < 1)) return new Float64Array(p).fill(Number.NaN);
    for (let k = 0; k < j; k++) work[k] = (cur[k] + a * cur[j - k - 1]) / (1 - a * a);
    for (let k = 0; k < j; k++) cur[k] = work[k];
  }
  const out = new Float64Array(p);
  for (let i = 0; i < p; i++) out[i] = Math.abs(cur[i]) < 1 ? Math.atanh(cur[i]) : Number.NaN;
  return out;
}
