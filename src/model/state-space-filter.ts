/**
 * Kalman filter of an ARIMA process whose differencing is part of the state: state = (ARMA state of
 * dimension r, the last d' undifferenced values), where d' = d + D·m. The differenced part starts diffuse
 * (variance kappa = 1e6) and observations whose innovation variance is still 1e4 or more are left out of the
 * likelihood, so the sums are those of the differenced series. Missing values (NaN) are skipped by the
 * filter. Returns the likelihood sums and the final state and covariance, from which forecasts start.
 * The filter runs in the WebAssembly kernel (state-space-kernel.ts), which gives the bits of
 * stateSpaceScript below (its reference, and the filter where the kernel is not built).
 * Source: Durbin & Koopman, Time Series Analysis by State Space Methods, 2nd ed. (2012), §3.4 (ARIMA in
 * state-space form), §5.1 (diffuse initialisation), §4.10 (missing observations); Gardner, Harvey & Phillips
 * (1980) for the ARMA block. The recursions and constants are those of R's stats::arima (makeARIMA,
 * ARIMA_Like), so that likelihoods agree with it.
 *
 *   random walk (phi = theta = [], delta = [1]) on [1, 3, 6]: ssq = 2² + 3², count = 2
 */
import { armaInitialCovariance } from './initial-covariance.js';
import { filterByKernel } from './state-space-kernel.js';

export interface StateSpaceResult {
  ssq: number;
  sumlog: number;
  count: number;
  /** Final filtered state and its covariance (rd × rd, row-major), σ² factored out. */
  state: Float64Array;
  covariance: Float64Array;
  /** Standardised innovations (NaN where not observed). */
  residuals: Float64Array;
}

export const DIFFUSE_KAPPA = 1e6;

export function stateSpaceFilter(
  x: Float64Array,
  phi: Float64Array,
  theta: Float64Array,
  delta: Float64Array,
): StateSpaceResult {
  return (
    filterByKernel(x, phi, theta, delta, initialStateCovariance(phi, theta, delta)) ??
    stateSpaceScript(x, phi, theta, delta)
  );
}

/** The covariance the filter starts from: the ARMA block's stationary covariance, the differenced part diffuse. */
export function initialStateCovariance(phi: Float64Array, theta: Float64Array, delta: Float64Array): Float64Array {
  const r = Math.max(phi.length, theta.length + 1);
  const rd = r + delta.length;
  const P = new Float64Array(rd * rd);
  const P0 = armaInitialCovariance(phi, theta);
  for (let i = 0; i < r; i++) for (let j = 0; j < r; j++) P[i * rd + j] = P0[i * r + j];
  for (let i = r; i < rd; i++) P[i * rd + i] = DIFFUSE_KAPPA;
  return P;
}

/** The filter in JavaScript: the kernel's reference, step for step. */
export function stateSpaceScript(
  x: Float64Array,
  phi: Float64Array,
  theta: Float64Array,
  delta: Float64Array,
): StateSpaceResult {
  const p = phi.length;
  const q = theta.length;
  const r = Math.max(p, q + 1);
  const d = delta.length;
  const rd = r + d;
  const n = x.length;
  const P = initialStateCovariance(phi, theta, delta);
  const Pnew = new Float64Array(rd * rd);
  const mm = new Float64Array(rd * rd);
  const M = new Float64Array(rd);
  const a = new Float64Array(rd);
  const anew = new Float64Array(rd);
  const Rv = new Float64Array(r);
  Rv[0] = 1;
  for (let i = 1; i < r; i++) Rv[i] = i - 1 < q ? theta[i - 1] : 0;
  const residuals = new Float64Array(n);
  let ssq = 0;
  let sumlog = 0;
  let count = 0;
  for (let t = 0; t < n; t++) {
    predictState(a, anew, phi, delta, r, rd);
    if (t === 0) {
      Pnew.set(P);
    } else {
      predictCovariance(P, Pnew, mm, phi, Rv, delta, r, rd);
    }
    const y = x[t];
    if (!Number.isNaN(y)) {
      let v = y - anew[0];
      for (let i = 0; i < d; i++) v -= delta[i] * anew[r + i];
      for (let i = 0; i < rd; i++) {
        let w = Pnew[i * rd];
        for (let j = 0; j < d; j++) if (delta[j] !== 0) w += Pnew[i * rd + r + j] * delta[j];
        M[i] = w;
      }
      let F = M[0];
      for (let j = 0; j < d; j++) if (delta[j] !== 0) F += delta[j] * M[r + j];
      if (F < 1e4) {
        count++;
        ssq += (v * v) / F;
        sumlog += Math.log(F);
      }
      residuals[t] = v / Math.sqrt(F);
      for (let i = 0; i < rd; i++) a[i] = anew[i] + (M[i] * v) / F;
      // P is symmetric: one triangle computed, the other copied.
      for (let i = 0; i < rd; i++) {
        const mi = M[i] / F;
        for (let j = 0; j <= i; j++) {
          const w = Pnew[i * rd + j] - mi * M[j];
          P[i * rd + j] = w;
          P[j * rd + i] = w;
        }
      }
    } else {
      a.set(anew);
      P.set(Pnew);
      residuals[t] = Number.NaN;
    }
  }
  return { ssq, sumlog, count, state: a, covariance: P, residuals };
}

/** anew = T·a for the ARIMA transition T (AR column, shift, differencing rows). */
export function predictState(
  a: Float64Array,
  anew: Float64Array,
  phi: Float64Array,
  delta: Float64Array,
  r: number,
  rd: number,
): void {
  const p = phi.length;
  const d = delta.length;
  for (let i = 0; i < r; i++) {
    let v = i < r - 1 ? a[i + 1] : 0;
    if (i < p) v += phi[i] * a[0];
    anew[i] = v;
  }
  if (d > 0) {
    for (let i = r + 1; i < rd; i++) anew[i] = a[i - 1];
    let v = a[0];
    for (let i = 0; i < d; i++) v += delta[i] * a[r + i];
    anew[r] = v;
  }
}

/** Pnew = T·P·T' + R·R' for the ARIMA transition T (AR column, shift, differencing rows). */
export function predictCovariance(
  P: Float64Array,
  Pnew: Float64Array,
  mm: Float64Array,
  phi: Float64Array,
  Rv: Float64Array,
  delta: Float64Array,
  r: number,
  rd: number,
): void {
  const p = phi.length;
  const d = delta.length;
  // mm = T·P (row i of mm from the rows of P).
  for (let i = 0; i < r; i++) {
    for (let j = 0; j < rd; j++) {
      let v = 0;
      if (i < p) v += phi[i] * P[j];
      if (i < r - 1) v += P[(i + 1) * rd + j];
      mm[i * rd + j] = v;
    }
  }
  if (d > 0) {
    for (let j = 0; j < rd; j++) {
      let v = P[j];
      for (let k = 0; k < d; k++) if (delta[k] !== 0) v += delta[k] * P[(r + k) * rd + j];
      mm[r * rd + j] = v;
    }
    for (let i = 1; i < d; i++) for (let j = 0; j < rd; j++) mm[(r + i) * rd + j] = P[(r + i - 1) * rd + j];
  }
  // Pnew = mm·T' + R·R' (column i of Pnew from the columns of mm), symmetric: the lower triangle (rows
  // j ≥ i) computed, the upper copied from it.
  for (let i = 0; i < r; i++) {
    const ph = i < p ? phi[i] : 0;
    const shift = i < r - 1;
    for (let j = i; j < rd; j++) {
      let v = ph * mm[j * rd];
      if (shift) v += mm[j * rd + i + 1];
      if (j < r) v += Rv[i] * Rv[j];
      Pnew[j * rd + i] = v;
    }
  }
  if (d > 0) {
    for (let j = r; j < rd; j++) {
      let v = mm[j * rd];
      for (let k = 0; k < d; k++) if (delta[k] !== 0) v += delta[k] * mm[j * rd + r + k];
      Pnew[j * rd + r] = v;
    }
    for (let i = 1; i < d; i++) for (let j = r + i; j < rd; j++) Pnew[j * rd + r + i] = mm[j * rd + r + i - 1];
  }
  for (let i = 0; i < rd; i++) for (let j = i + 1; j < rd; j++) Pnew[i * rd + j] = Pnew[j * rd + i];
}
