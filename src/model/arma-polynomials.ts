/**
 * The full AR and MA polynomials of a seasonal ARMA(p,q)(P,Q)m model, multiplied out:
 * (1 − φ₁z − … − φₚzᵖ)(1 − Φ₁zᵐ − … − Φ_P z^{Pm}) = 1 − Σ phi[k−1] zᵏ and
 * (1 + θ₁z + … + θ_q z^q)(1 + Θ₁zᵐ + … + Θ_Q z^{Qm}) = 1 + Σ theta[k−1] zᵏ.
 * Source: Box, Jenkins, Reinsel & Ljung, Time Series Analysis, 5th ed. (2015), §9.1 (multiplicative seasonal
 * model); the layout of the coefficients is that of R's stats::arima (ARIMA_transPars).
 *
 *   expandArma([0.5], [], [0.3], [], 4) → phi = [0.5, 0, 0, 0.3, −0.15], theta = []
 */
export interface ArmaOrders {
  p: number;
  q: number;
  P: number;
  Q: number;
  period: number;
}

export function expandArma(
  ar: ArrayLike<number>,
  ma: ArrayLike<number>,
  sar: ArrayLike<number>,
  sma: ArrayLike<number>,
  period: number,
  into: { phi: Float64Array; theta: Float64Array } | null = null,
): { phi: Float64Array; theta: Float64Array } {
  const p = ar.length + sar.length * period;
  const q = ma.length + sma.length * period;
  // `into`: arrays of exactly these lengths to fill (a search calls this once per likelihood evaluation).
  const phi = into ? into.phi.fill(0) : new Float64Array(p);
  const theta = into ? into.theta.fill(0) : new Float64Array(q);
  for (let i = 0; i < ar.length; i++) phi[i] = ar[i];
  for (let i = 0; i < ma.length; i++) theta[i] = ma[i];
  for (let j = 0; j < sar.length; j++) {
    phi[(j + 1) * period - 1] += sar[j];
    for (let i = 0; i < ar.length; i++) phi[(j + 1) * period + i] -= ar[i] * sar[j];
  }
  for (let j = 0; j < sma.length; j++) {
    theta[(j + 1) * period - 1] += sma[j];
    for (let i = 0; i < ma.length; i++) theta[(j + 1) * period + i] += ma[i] * sma[j];
  }
  return { phi, theta };
}
