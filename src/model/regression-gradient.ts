/**
 * The exact gradient, in the regression coefficients β, of the concentrated Gaussian log-likelihood
 * objective ½·(log(Σ ṽₜ²/N) + Σ log Fₜ/N) of a regression with stationary ARMA errors, u = y − Xβ, with no
 * missing values. The innovations are linear in the data, so ṽ(u) = ṽ(y) − Σ βⱼ ṽ(xⱼ) and
 * ∂/∂βⱼ = −Σ ṽₜ(u)·ṽₜ(xⱼ) / Σ ṽₜ(u)² (the Fₜ do not depend on β): one filtering of u and the k columns
 * together (arma-chandrasekhar-columns.ts) instead of k or 2k likelihood evaluations by differences.
 * Source: Harvey & Phillips (1979), "Maximum likelihood estimation of regression models with
 * autoregressive-moving average disturbances", Biometrika 66(1), 49–58 (the likelihood through the
 * filtered regressors); Durbin & Koopman (2012), §7.3.3 (score vectors of state space models).
 *
 *   white noise (phi = theta = []), u = [1, −1], x = [1, 1]: ∂/∂β = −(1 − 1) / 2 = 0
 */
import { armaChandrasekharColumns, type ColumnsWork, columnsWork } from './arma-chandrasekhar-columns.js';

/** Scratch for series of n values, k regressors and states of up to `size` elements. */
export interface GradientWork {
  columns: ColumnsWork;
  filtered: Float64Array[];
}

export function regressionGradientWork(n: number, k: number, size: number): GradientWork {
  return {
    columns: columnsWork(size, k + 1),
    filtered: Array.from({ length: k + 1 }, () => new Float64Array(n)),
  };
}

/**
 * Writes ∂objective/∂βⱼ into g[offset + j] for each column j of X; returns false (g untouched beyond what
 * was written) when the objective is not finite there.
 */
export function regressionGradient(
  u: Float64Array,
  X: readonly Float64Array[],
  phi: Float64Array,
  theta: Float64Array,
  g: Float64Array,
  offset = 0,
  work: GradientWork | null = null,
): boolean {
  const n = u.length;
  const k = X.length;
  const ws = work ?? regressionGradientWork(n, k, Math.max(phi.length, theta.length + 1));
  const { filtered } = ws;
  armaChandrasekharColumns([u, ...X], phi, theta, filtered, ws.columns);
  const fu = filtered[0];
  let ssq = 0;
  for (let t = 0; t < n; t++) ssq += fu[t] * fu[t];
  if (!(ssq > 0) || !Number.isFinite(ssq)) return false;
  for (let j = 0; j < k; j++) {
    const fj = filtered[j + 1];
    let s = 0;
    for (let t = 0; t < n; t++) s += fu[t] * fj[t];
    g[offset + j] = -s / ssq;
  }
  return true;
}
