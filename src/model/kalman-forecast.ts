/**
 * Forecasts h steps ahead from a filtered ARIMA state, with their variances (σ² factored out): the state is
 * carried forward by the transition, a ← T·a, P ← T·P·T' + R·R', and the forecast is the observation's part of
 * the state. Source: Durbin & Koopman (2012), §4.11 (forecasting as filtering with missing observations);
 * the recursion of R's KalmanForecast.
 *
 *   AR(1), phi = [0.5], state [2], covariance [[0]]: forecasts 1, 0.5; variances 1, 1.25
 */
import { predictCovariance, predictState } from './state-space-filter.js';

export function kalmanForecast(
  horizon: number,
  state: Float64Array,
  covariance: Float64Array,
  phi: Float64Array,
  theta: Float64Array,
  delta: Float64Array,
): { mean: Float64Array; variance: Float64Array } {
  const p = phi.length;
  const q = theta.length;
  const r = Math.max(p, q + 1);
  const d = delta.length;
  const rd = r + d;
  const a = Float64Array.from(state);
  const anew = new Float64Array(rd);
  let P = Float64Array.from(covariance);
  let Pnew = new Float64Array(rd * rd);
  const mm = new Float64Array(rd * rd);
  const Rv = new Float64Array(r);
  Rv[0] = 1;
  for (let i = 1; i < r; i++) Rv[i] = i - 1 < q ? theta[i - 1] : 0;
  const mean = new Float64Array(horizon);
  const variance = new Float64Array(horizon);
  for (let h = 0; h < horizon; h++) {
    predictState(a, anew, phi, delta, r, rd);
    a.set(anew);
    let f = a[0];
    for (let i = 0; i < d; i++) f += delta[i] * a[r + i];
    mean[h] = f;
    predictCovariance(P, Pnew, mm, phi, Rv, delta, r, rd);
    const swap = P;
    P = Pnew;
    Pnew = swap;
    // Z·P·Z' with Z = (1, 0, …, 0, delta).
    let v = 0;
    for (let i = 0; i < rd; i++) {
      const zi = i === 0 ? 1 : i >= r ? delta[i - r] : 0;
      if (zi === 0) continue;
      for (let j = 0; j < rd; j++) {
        const zj = j === 0 ? 1 : j >= r ? delta[j - r] : 0;
        if (zj !== 0) v += zi * P[i * rd + j] * zj;
      }
    }
    variance[h] = v;
  }
  return { mean, variance };
}
