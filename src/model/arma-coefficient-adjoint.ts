/**
 * Adjoints (reverse-mode derivatives) of the two maps between fitArima's search parameters and the expanded
 * polynomials: the multiplication of the seasonal and non-seasonal factors (arma-polynomials.ts), and the
 * stationary AR map of Jones (1980) (ar-transform.ts), through tanh and the Durbin–Levinson recursion. Given
 * the gradient in the outputs, each returns the gradient in the inputs (Jᵀ·ḡ).
 * Source: derived here by the chain rule from Box, Jenkins, Reinsel & Ljung (2015), §9.1 (the product) and
 * Jones (1980), Technometrics 22(3), 389–395 (the map); exact, unlike the forward differences of step 1e-3
 * that ar-transform-jacobian.ts keeps for R's standard errors.
 *
 *   expandArmaAdjoint([0.5], [], [0.3], [], 4, φ̄ = [1, 0, 0, 0, 1], []) → ar̄ = [1 − 0.3], sar̄ = [−0.5]
 *   arFromUnconstrainedAdjoint([0], [1]) → [1]   (d tanh(u)/du at 0)
 */
export function expandArmaAdjoint(
  ar: ArrayLike<number>,
  ma: ArrayLike<number>,
  sar: ArrayLike<number>,
  sma: ArrayLike<number>,
  period: number,
  phiBar: ArrayLike<number>,
  thetaBar: ArrayLike<number>,
  out: { ar: Float64Array; ma: Float64Array; sar: Float64Array; sma: Float64Array },
): void {
  // φ = ar + Σⱼ sarⱼ z^{(j+1)m} − Σⱼᵢ arᵢ sarⱼ z^{(j+1)m+i+1}; θ likewise with a plus sign.
  for (let i = 0; i < ar.length; i++) {
    let s = phiBar[i];
    for (let j = 0; j < sar.length; j++) s -= phiBar[(j + 1) * period + i] * sar[j];
    out.ar[i] = s;
  }
  for (let j = 0; j < sar.length; j++) {
    let s = phiBar[(j + 1) * period - 1];
    for (let i = 0; i < ar.length; i++) s -= phiBar[(j + 1) * period + i] * ar[i];
    out.sar[j] = s;
  }
  for (let i = 0; i < ma.length; i++) {
    let s = thetaBar[i];
    for (let j = 0; j < sma.length; j++) s += thetaBar[(j + 1) * period + i] * sma[j];
    out.ma[i] = s;
  }
  for (let j = 0; j < sma.length; j++) {
    let s = thetaBar[(j + 1) * period - 1];
    for (let i = 0; i < ma.length; i++) s += thetaBar[(j + 1) * period + i] * ma[i];
    out.sma[j] = s;
  }
}

let scratch = new Float64Array(64);

/** Gradient in the unconstrained values, given the gradient `coefBar` in the AR coefficients they map to. */
export function arFromUnconstrainedAdjoint(
  raw: ArrayLike<number>,
  coefBar: ArrayLike<number>,
  out: Float64Array = new Float64Array(raw.length),
): Float64Array {
  const p = raw.length;
  if (p === 0) return out;
  // Forward mode, one direction per input (p is small): D[i·p + k] = ∂coefₖ/∂rawᵢ. Scratch kept between
  // calls (a search asks for this at every gradient); every entry used is written first.
  if (scratch.length < p * p + 3 * p) scratch = new Float64Array(2 * (p * p + 3 * p));
  const D = scratch;
  const cur = p * p;
  const next = cur + p;
  const dNext = next + p;
  D.fill(0, 0, p * p);
  for (let i = 0; i < p; i++) {
    const t = Math.tanh(raw[i]);
    D[cur + i] = t;
    D[i * p + i] = 1 - t * t;
  }
  for (let j = 1; j < p; j++) {
    const a = D[cur + j];
    for (let i = 0; i < p; i++) {
      const o = i * p;
      const da = D[o + j];
      for (let k = 0; k < j; k++) D[dNext + k] = D[o + k] - da * D[cur + j - k - 1] - a * D[o + j - k - 1];
      for (let k = 0; k < j; k++) D[o + k] = D[dNext + k];
    }
    for (let k = 0; k < j; k++) D[next + k] = D[cur + k] - a * D[cur + j - k - 1];
    for (let k = 0; k < j; k++) D[cur + k] = D[next + k];
  }
  for (let i = 0; i < p; i++) {
    let s = 0;
    for (let k = 0; k < p; k++) s += D[i * p + k] * coefBar[k];
    out[i] = s;
  }
  return out;
}
