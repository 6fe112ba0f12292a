/**
 * The Jacobian of the stationary AR map (ar-transform.ts) at unconstrained values u: entry [i·p + j] is
 * ∂φⱼ/∂uᵢ, by forward differences of step 1e-3 — the rule of R's stats::arima (ARIMA_Gradtrans in
 * src/library/stats/src/arima.c), which turns the Hessian on the unconstrained scale into the coefficients'
 * covariance, var = Aᵀ H⁻¹ A. Following R's step keeps our standard errors equal to R's; the exact
 * derivative differs from it by about 1e-3 relative.
 *
 *   arJacobian([0]) → [1 − tanh²(0)] ≈ [0.99999967] (the forward difference of tanh at 0)
 */
import { arFromUnconstrained } from './ar-transform.js';

export function arJacobian(raw: Float64Array, eps = 1e-3): Float64Array {
  const p = raw.length;
  const base = arFromUnconstrained(raw);
  const A = new Float64Array(p * p);
  const w = Float64Array.from(raw);
  for (let i = 0; i < p; i++) {
    w[i] = raw[i] + eps;
    const moved = arFromUnconstrained(w);
    w[i] = raw[i];
    for (let j = 0; j < p; j++) A[i * p + j] = (moved[j] - base[j]) / eps;
  }
  return A;
}
