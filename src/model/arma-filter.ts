/**
 * Exact Gaussian likelihood of a zero-mean stationary ARMA series by the Kalman filter, missing values (NaN)
 * skipped by the filter. Returns the sums the concentrated likelihood needs: Σ vₜ²/Fₜ, Σ log Fₜ and the count
 * of observations used (innovation variance σ² factored out). Once the predicted state covariance has
 * settled (Fₜ = 1 and the filtered covariance zero to 1e-12) the filter runs as the innovations recursion,
 * which is the same filter without the covariance update.
 * Source: Gardner, Harvey & Phillips (1980), Applied Statistics 29(3), 311–322 (state-space form, the
 * structured update of P); Durbin & Koopman, Time Series Analysis by State Space Methods, 2nd ed. (2012),
 * §4.3 (filter) and §4.10 (missing observations). The update follows R's stats::arima (ARIMA_Like, d = 0).
 *
 *   white noise (phi = theta = []) on [1, 2]: ssq = 5, sumlog = 0, count = 2
 */
import { armaInitialCovariance } from './initial-covariance.js';

export interface FilterSums {
  ssq: number;
  sumlog: number;
  count: number;
}

export function armaFilter(
  x: Float64Array,
  phi: Float64Array,
  theta: Float64Array,
  residuals: Float64Array | null = null,
): FilterSums {
  const p = phi.length;
  const q = theta.length;
  const r = Math.max(p, q + 1);
  const n = x.length;
  const P = armaInitialCovariance(phi, theta);
  const Pnew = new Float64Array(r * r);
  const Rv = new Float64Array(r);
  Rv[0] = 1;
  for (let i = 1; i < r; i++) Rv[i] = i - 1 < q ? theta[i - 1] : 0;
  const a = new Float64Array(r);
  const anew = new Float64Array(r);
  let ssq = 0;
  let sumlog = 0;
  let count = 0;
  let settled = false;
  for (let t = 0; t < n; t++) {
    for (let i = 0; i < r; i++) {
      let v = i < r - 1 ? a[i + 1] : 0;
      if (i < p) v += phi[i] * a[0];
      anew[i] = v;
    }
    const y = x[t];
    if (settled && !Number.isNaN(y)) {
      const v = y - anew[0];
      for (let i = 0; i < r; i++) a[i] = anew[i] + Rv[i] * v;
      ssq += v * v;
      count++;
      if (residuals) residuals[t] = v;
      continue;
    }
    if (t === 0) {
      Pnew.set(P);
    } else {
      settled = false;
      const P0 = P[0];
      for (let i = 0; i < r; i++) {
        for (let j = i; j < r; j++) {
          let v = Rv[i] * Rv[j];
          if (i < p && j < p) v += phi[i] * phi[j] * P0;
          if (i < r - 1 && j < r - 1) v += P[(i + 1) * r + j + 1];
          if (i < p && j < r - 1) v += phi[i] * P[j + 1];
          if (j < p && i < r - 1) v += phi[j] * P[i + 1];
          Pnew[i * r + j] = v;
          Pnew[j * r + i] = v;
        }
      }
    }
    if (!Number.isNaN(y)) {
      const F = Pnew[0];
      const v = y - anew[0];
      ssq += (v * v) / F;
      sumlog += Math.log(F);
      count++;
      if (residuals) residuals[t] = v / Math.sqrt(F);
      let maxP = 0;
      for (let i = 0; i < r; i++) a[i] = anew[i] + (Pnew[i] * v) / F;
      for (let i = 0; i < r; i++) {
        const mi = Pnew[i] / F;
        for (let j = 0; j < r; j++) {
          const w = Pnew[i * r + j] - mi * Pnew[j];
          P[i * r + j] = w;
          if (Math.abs(w) > maxP) maxP = Math.abs(w);
        }
      }
      if (maxP < 1e-12 && Math.abs(F - 1) < 1e-12) settled = true;
    } else {
      a.set(anew);
      P.set(Pnew);
      if (residuals) residuals[t] = Number.NaN;
    }
  }
  return { ssq, sumlog, count };
}
