/**
 * The standardised one-step innovations of an ARIMA model as a linear operator on data: the Kalman
 * filter's covariances, gains and innovation variances depend only on the model and on which values are
 * missing, not on the values, so they are computed once (the recursions of state-space-filter.ts) and each
 * series is then filtered at the cost of the state update alone. Used by the outlier search, which filters
 * one column per period and type. Innovations still inside the diffuse start (variance 1e4 or more, left
 * out of the likelihood) are 0; missing values give 0.
 * Source: Durbin & Koopman, Time Series Analysis by State Space Methods, 2nd ed. (2012), §4.3 (the
 * filter's gains do not depend on the observations), §3.4 and §5.1 as in state-space-filter.ts.
 *
 * Both parts run in the WebAssembly kernel (state-space-kernel.ts), which gives the bits of
 * innovationsScript below (its reference, and the operator where the kernel is not built).
 *
 *   innovationsOperator(phi, theta, delta, missing)(x) ≡ stateSpaceFilter(x, phi, theta, delta).residuals
 */
import { initialStateCovariance, predictCovariance, predictState } from './state-space-filter.js';
import { type Innovations, innovationsByKernel } from './state-space-kernel.js';

export function innovationsOperator(
  phi: Float64Array,
  theta: Float64Array,
  delta: Float64Array,
  missing: (t: number) => boolean,
  n: number,
): Innovations {
  return (
    innovationsByKernel(phi, theta, delta, missing, n, initialStateCovariance(phi, theta, delta)) ??
    innovationsScript(phi, theta, delta, missing, n)
  );
}

/** The operator in JavaScript: the kernel's reference, step for step. */
export function innovationsScript(
  phi: Float64Array,
  theta: Float64Array,
  delta: Float64Array,
  missing: (t: number) => boolean,
  n: number,
): (x: Float64Array, from?: number) => Float64Array {
  const p = phi.length;
  const q = theta.length;
  const r = Math.max(p, q + 1);
  const d = delta.length;
  const rd = r + d;
  const P = initialStateCovariance(phi, theta, delta);
  const Pnew = new Float64Array(rd * rd);
  const mm = new Float64Array(rd * rd);
  const M = new Float64Array(rd);
  const Rv = new Float64Array(r);
  Rv[0] = 1;
  for (let i = 1; i < r; i++) Rv[i] = i - 1 < q ? theta[i - 1] : 0;
  const gains = new Float64Array(n * rd);
  const scale = new Float64Array(n); // 1/√F, 0 where not used
  for (let t = 0; t < n; t++) {
    if (t === 0) Pnew.set(P);
    else predictCovariance(P, Pnew, mm, phi, Rv, delta, r, rd);
    if (missing(t)) {
      P.set(Pnew);
      continue;
    }
    for (let i = 0; i < rd; i++) {
      let w = Pnew[i * rd];
      for (let j = 0; j < d; j++) if (delta[j] !== 0) w += Pnew[i * rd + r + j] * delta[j];
      M[i] = w;
    }
    let F = M[0];
    for (let j = 0; j < d; j++) if (delta[j] !== 0) F += delta[j] * M[r + j];
    for (let i = 0; i < rd; i++) gains[t * rd + i] = M[i] / F;
    scale[t] = F < 1e4 ? 1 / Math.sqrt(F) : 0;
    // As in stateSpaceFilter (the same arithmetic, so that both give the same innovations): one triangle of
    // the symmetric P computed, the other copied.
    for (let i = 0; i < rd; i++) {
      const mi = M[i] / F;
      for (let j = 0; j <= i; j++) {
        const w = Pnew[i * rd + j] - mi * M[j];
        P[i * rd + j] = w;
        P[j * rd + i] = w;
      }
    }
  }
  const a = new Float64Array(rd);
  const anew = new Float64Array(rd);
  // `from`: the data are zero before it, so the state is too and the filter can start there.
  return (x: Float64Array, from = 0) => {
    const out = new Float64Array(n);
    a.fill(0);
    for (let t = from; t < n; t++) {
      predictState(a, anew, phi, delta, r, rd);
      if (missing(t)) {
        a.set(anew);
        continue;
      }
      let v = x[t] - anew[0];
      for (let i = 0; i < d; i++) v -= delta[i] * anew[r + i];
      out[t] = v * scale[t];
      for (let i = 0; i < rd; i++) a[i] = anew[i] + gains[t * rd + i] * v;
    }
    return out;
  };
}
