/**
 * Automatic detection of additive outliers (AO), level shifts (LS) and temporary changes (TC) in a
 * regression with ARIMA errors, by the iterative method of Chen & Liu (1993), "Joint estimation of model
 * parameters and outlier effects in time series", JASA 88(421), 284–297:
 * 1. fit the model (given orders, with the regressors given and those found so far);
 * 2. locate: filter the regression errors by π(B) = φ(B)Δ(B)/θ(B) into residuals e; for every period T
 *    and type, the effect of a unit outlier on e is a known pattern g (π(B) applied to the type's own
 *    shape), so ω̂ = Σ g e / Σ g² and τ = ω̂ √(Σ g²) / σ̂ with σ̂ = 1.483·MAD(e) (their eq. 2.4–2.9);
 *    take the largest |τ| above the critical value, remove its effect from e, repeat;
 * 3. estimate the found outliers jointly with the model; drop, one at a time, any whose |t| falls below
 *    the critical value; go back to 2 until nothing changes (at most `rounds` times).
 * The critical value depends on the series length by Ljung's rule (outlier-critical-value.ts). A level
 * shift is not searched at the first or last period (there it cannot be told from the level or from an
 * additive outlier).
 *
 *   detectOutliers(y, airline) → [{ type: 'LS', at: 169, t: −5.1, effect: … }]   (Seatbelts, February 1983)
 */

import { solveDense } from './arma-autocovariance.js';
import { type ArimaFit, type ArimaSpec, fitArima } from './fit-arima.js';
import { innovationsOperator } from './innovations-operator.js';
import { outlierCriticalValue } from './outlier-critical-value.js';
import { outlierColumn } from './outlier-effects.js';

export type DetectedType = 'AO' | 'LS' | 'TC';

export interface DetectedOutlier {
  type: DetectedType;
  /** Index of the period. */
  at: number;
  /** Estimated effect, in the series' units (of the model's scale). */
  effect: number;
  /** t-value of the effect in the final joint fit. */
  t: number;
}

export interface DetectOptions {
  types?: readonly DetectedType[];
  /** Critical |t|; default by Ljung's rule for the series' length. */
  critical?: number;
  /** Decay rate of temporary changes. */
  rate?: number;
  /** Locate-and-estimate rounds. */
  rounds?: number;
  /** At most this many outliers (default: a tenth of the observations). */
  max?: number;
  /**
   * Once the first candidates are known, given all regressors: the orders to use from then on, or null to
   * keep those of `spec` (e.g. choose them again only when the differencing tests change their verdict with
   * the candidates as regressors, `reselectOrders` in auto-arima.ts). Without it the orders stay.
   */
  reselect?: (xreg: Float64Array[]) => ArimaSpec | null;
  /** The fit of `spec` as given (its regressors, no outliers), when the caller has it already. */
  initial?: ArimaFit;
}

export interface DetectResult {
  outliers: DetectedOutlier[];
  /** The final fit, with the regressors given first and then one column per outlier. */
  fit: ArimaFit;
  critical: number;
}

export function detectOutliers(y: Float64Array, spec: ArimaSpec, o: DetectOptions = {}): DetectResult {
  const n = y.length;
  const types = o.types ?? ['AO', 'LS', 'TC'];
  let observed = 0;
  for (const v of y) if (!Number.isNaN(v)) observed++;
  const critical = o.critical ?? outlierCriticalValue(observed);
  const rate = o.rate ?? 0.7;
  const max = o.max ?? Math.max(1, Math.floor(observed / 10));
  const given = spec.xreg ?? [];
  const givenNames = spec.xregNames ?? given.map((_, i) => `xreg${i + 1}`);
  let orders = spec;
  let found: { type: DetectedType; at: number }[] = [];
  const columns = (list: typeof found) => list.map((f) => outlierColumn(f.type, f.at, n, { rate }));
  const fitWith = (list: typeof found) =>
    fitArima(
      y,
      {
        ...orders,
        xreg: [...given, ...columns(list)],
        xregNames: [...givenNames, ...list.map((f) => `${f.type}${f.at}`)],
      },
      {},
    );
  let fit = o.initial ?? fitWith(found);
  if (!Number.isFinite(critical) || types.length === 0) return { outliers: [], fit, critical };

  const rounds = o.rounds ?? 4;
  for (let round = 0; round < rounds; round++) {
    // The first round takes candidates at a lower bar (one below the critical value) and, when asked,
    // chooses the orders again with them as regressors: a level shift makes a series look integrated or
    // its AR part near a unit root, and then the shift is partly absorbed (the Nile under ARIMA(1,1,1):
    // |τ| = 3.0 for the 1899 step). Candidates stay only if the joint fit's |t| reaches the critical value.
    const bar = round === 0 ? Math.max(2.5, critical - 1) : critical;
    const added = locate(y, fit, types, bar, rate, found, max);
    if (added.length === 0) break;
    found = [...found, ...added];
    if (round === 0 && o.reselect) {
      try {
        orders = o.reselect([...given, ...columns(found)]) ?? orders;
      } catch {
        // keep the orders we have
      }
    }
    fit = fitWith(found);
    // Joint estimation: drop the least significant outlier while it is below the critical value.
    for (;;) {
      const first = fit.names.length - found.length;
      let worst = -1;
      let worstT = Number.POSITIVE_INFINITY;
      const ses = regressionSe(y, fit);
      for (let i = 0; i < found.length; i++) {
        const se = ses[first - (fit.coef.length - fit.regressors.length) + i];
        const t = Math.abs(fit.coef[first + i] / se);
        const tt = Number.isFinite(t) ? t : 0;
        if (tt < worstT) [worst, worstT] = [i, tt];
      }
      if (worst < 0 || worstT >= critical) break;
      found = found.filter((_, i) => i !== worst);
      fit = fitWith(found);
    }
  }
  const first = fit.names.length - found.length;
  const se = regressionSe(y, fit);
  const offset = fit.coef.length - fit.regressors.length;
  const outliers = found
    .map((f, i) => ({
      type: f.type,
      at: f.at,
      effect: fit.coef[first + i],
      t: fit.coef[first + i] / se[first - offset + i],
    }))
    .sort((a, b) => a.at - b.at);
  return { outliers, fit, critical };
}

/** Stage 2 of Chen & Liu: new outliers located on the residuals of `fit`, largest |τ| first. */
function locate(
  y: Float64Array,
  fit: ArimaFit,
  types: readonly DetectedType[],
  critical: number,
  rate: number,
  already: { type: DetectedType; at: number }[],
  max: number,
): { type: DetectedType; at: number }[] {
  const n = y.length;
  // Regression errors u = y − Xβ (0 where y is missing, and not tested there).
  const k = fit.regressors.length;
  const first = fit.coef.length - k;
  const u = new Float64Array(n);
  for (let t = 0; t < n; t++) {
    if (Number.isNaN(y[t])) continue;
    let v = y[t];
    for (let j = 0; j < k; j++) v -= fit.coef[first + j] * fit.regressors[j][t];
    u[t] = v;
  }
  // Residuals: the Kalman filter's standardised innovations of the regression errors (exact start, so a
  // seasonal MA near −1, a stable seasonal pattern, leaves no trace of the first year in them); the
  // effect of a unit outlier of each type at each period is the same filter run on its column (the
  // innovations are linear in the data).
  const missing = (t: number) => Number.isNaN(y[t]);
  const innovations = innovationsOperator(fit.phi, fit.theta, fit.delta, missing, n);
  const e = innovations(u);
  const start = fit.delta.length;
  // The operator is linear and a level shift at T is the sum of one-offs at T, T + 1, …, a temporary
  // change their sum weighted by rate^(t − T): each pattern is the next period's pattern (times the rate)
  // plus the one-off's at T, so only the one-offs are filtered.
  const ao = Array.from({ length: n }, (_, T) => innovations(outlierColumn('AO', T, n), T));
  const cumulated = (w: number) => {
    const out: Float64Array[] = new Array(n);
    out[n - 1] = ao[n - 1];
    for (let T = n - 2; T >= 0; T--) {
      const g = Float64Array.from(ao[T]);
      const next = out[T + 1];
      for (let t = T + 1; t < n; t++) g[t] += w * next[t];
      out[T] = g;
    }
    return out;
  };
  const ls = types.includes('LS') ? cumulated(1) : [];
  const tc = types.includes('TC') ? cumulated(rate) : [];
  const pattern = (type: DetectedType, T: number) => (type === 'AO' ? ao[T] : type === 'LS' ? ls[T] : tc[T]);
  const taken = new Set(already.map((a) => a.at));
  const added: { type: DetectedType; at: number }[] = [];
  const sigma = () => {
    const abs: number[] = [];
    for (let t = start; t < n; t++) if (!missing(t)) abs.push(Math.abs(e[t]));
    abs.sort((a, b) => a - b);
    const m = abs.length;
    return m === 0 ? Number.NaN : 1.483 * (m % 2 ? abs[(m - 1) / 2] : 0.5 * (abs[m / 2 - 1] + abs[m / 2]));
  };
  while (already.length + added.length < max) {
    const s = sigma();
    if (!(s > 0)) break;
    let best: { type: DetectedType; at: number; omega: number; tau: number } | null = null;
    for (const type of types) {
      const lo = type === 'LS' ? Math.max(start, 1) : start;
      const hi = type === 'LS' ? n - 2 : n - 1;
      for (let T = lo; T <= hi; T++) {
        if (missing(T) || taken.has(T)) continue;
        const g = pattern(type, T);
        let num = 0;
        let den = 0;
        for (let t = T; t < n; t++) {
          if (missing(t)) continue;
          num += g[t] * e[t];
          den += g[t] * g[t];
        }
        if (!(den > 0)) continue;
        const omega = num / den;
        const tau = (omega * Math.sqrt(den)) / s;
        if (!best || Math.abs(tau) > Math.abs(best.tau)) best = { type, at: T, omega, tau };
      }
    }
    if (!best || Math.abs(best.tau) < critical) break;
    added.push({ type: best.type, at: best.at });
    taken.add(best.at);
    const g = pattern(best.type, best.at);
    for (let t = best.at; t < n; t++) e[t] -= best.omega * g[t];
  }
  return added;
}

/**
 * Standard errors of the regression coefficients given the ARMA coefficients (generalised least squares:
 * σ²(X̃ᵀX̃)⁻¹ with X̃ the regressors filtered into standardised innovations), the t-values X-13ARIMA-SEATS
 * reports for regressors (Findley et al. 1998, §2); far cheaper than the full Hessian, which a search that
 * refits many times cannot afford. One per column of `fit.regressors`.
 */
export function regressionSe(y: Float64Array, fit: ArimaFit): Float64Array {
  const n = y.length;
  const k = fit.regressors.length;
  const op = innovationsOperator(fit.phi, fit.theta, fit.delta, (t) => Number.isNaN(y[t]), n);
  const X = fit.regressors.map((c) => op(c));
  const M = new Float64Array(k * k);
  for (let i = 0; i < k; i++) {
    for (let j = 0; j <= i; j++) {
      let v = 0;
      for (let t = 0; t < n; t++) v += X[i][t] * X[j][t];
      M[i * k + j] = v;
      M[j * k + i] = v;
    }
  }
  const se = new Float64Array(k);
  for (let i = 0; i < k; i++) {
    const e = new Float64Array(k);
    e[i] = 1;
    const col = solveDense(Float64Array.from(M), e, k);
    se[i] = col[i] > 0 ? Math.sqrt(fit.sigma2 * col[i]) : Number.NaN;
  }
  return se;
}
