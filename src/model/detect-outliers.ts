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
 *    the critical value (between maximum-likelihood fits, with the ARMA part held and the regression
 *    re-estimated by generalised least squares, as in Chen & Liu's inner loop); go back to 2 until nothing
 *    changes (at most `rounds` times).
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
import { type Innovations, type OutlierPatterns, type PatternKind, releaseLargeMemory } from './state-space-kernel.js';

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
   * the candidates as regressors, `reselectOrders` in auto-arima.ts). Without it the orders stay. It may
   * return the fit of the new orders with exactly these regressors (named `names`), which is then used as
   * it is.
   */
  reselect?: (xreg: Float64Array[], names: string[]) => ArimaSpec | ArimaFit | null;
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
  const namesOf = (list: typeof found) => [...givenNames, ...list.map((f) => `${f.type}${f.at}`)];
  // Each refit starts from the ARMA coefficients of the fit before it when the orders are the same (the
  // outliers added or dropped move them little); the regression coefficients start from least squares.
  // The search's fits skip the final filter (the operator of each fit gives its σ², regressionSe); the
  // result is completed at the end.
  const fitWith = (list: typeof found, from: ArimaFit | null) =>
    fitArima(
      y,
      { ...orders, xreg: [...given, ...columns(list)], xregNames: namesOf(list) },
      { start: from ? armaStart(from, orders) : undefined, quick: true, relTol: 1e-10 },
    );
  let fit = o.initial ?? fitWith(found, null);
  if (!Number.isFinite(critical) || types.length === 0) return { outliers: [], fit: complete(y, fit), critical };

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
    let chosen: ArimaFit | null = null;
    if (round === 0 && o.reselect) {
      try {
        const r = o.reselect([...given, ...columns(found)], namesOf(found));
        // A fit of the new orders with exactly these regressors is taken as it is.
        if (r && 'coef' in r) [orders, chosen] = [{ ...r.spec, xreg: given, xregNames: givenNames }, r];
        else if (r) orders = r;
      } catch {
        // keep the orders we have
      }
    }
    fit = chosen ?? fitWith(found, fit);
    // Joint estimation (backward elimination): the least significant outlier is dropped while its |t| is
    // below the critical value. Between maximum-likelihood fits the ARMA part is held at the last fit's and
    // the regression re-estimated by generalised least squares (Chen & Liu 1993, §3: outlier effects are
    // estimated with the model's parameters fixed in their inner loop); the model is then fitted again with
    // what is left, until its own t-values all reach the critical value.
    for (;;) {
      const drop = eliminate(y, fit, found.length, critical);
      if (drop.size === 0) break;
      found = found.filter((_, i) => !drop.has(i));
      fit = fitWith(found, fit);
    }
  }
  fit = complete(y, fit);
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

/**
 * The outliers (the last `count` regressors of `fit`) to drop: the least significant while its |t| is below
 * `critical`, first by the fit's own coefficients, then with each one dropped, by generalised least squares
 * with the ARMA part held at the fit's (the innovations operator applied to y and to the regressors).
 * Indices among the outliers.
 */
function eliminate(y: Float64Array, fit: ArimaFit, count: number, critical: number): Set<number> {
  const dropped = new Set<number>();
  const k = fit.regressors.length;
  const first = k - count;
  const offset = fit.coef.length - k;
  // First by the fit itself (its coefficients, its σ²).
  let beta = fit.coef.subarray(offset);
  let se = regressionSe(y, fit);
  let active = Array.from({ length: k }, (_, j) => j);
  let filtered: { X: Float64Array[]; y: Float64Array } | null = null;
  for (;;) {
    let worst = -1;
    let worstT = Number.POSITIVE_INFINITY;
    active.forEach((j, a) => {
      if (j < first) return;
      const t = Math.abs(beta[a] / se[a]);
      const tt = Number.isFinite(t) ? t : 0;
      if (tt < worstT) [worst, worstT] = [j, tt];
    });
    if (worst < 0 || worstT >= critical) return dropped;
    dropped.add(worst - first);
    active = active.filter((j) => j !== worst);
    if (!filtered) {
      const op = operatorOf(y, fit);
      filtered = { X: filteredRegressors(y, fit), y: op(y.map((v) => (Number.isNaN(v) ? 0 : v))) };
    }
    const gls = generalisedLeastSquares(
      filtered.y,
      active.map((j) => filtered!.X[j]),
      fit.nUsed,
    );
    beta = gls.beta;
    se = gls.se;
  }
}

/** β̂ = (X̃ᵀX̃)⁻¹X̃ᵀỹ on filtered data, with σ̂² = |ỹ − X̃β̂|²/m and standard errors σ̂ √((X̃ᵀX̃)⁻¹)ⱼⱼ. */
function generalisedLeastSquares(
  y: Float64Array,
  X: Float64Array[],
  m: number,
): { beta: Float64Array; se: Float64Array } {
  const k = X.length;
  const n = y.length;
  const M = gram(X);
  const b = new Float64Array(k);
  for (let i = 0; i < k; i++) {
    let v = 0;
    for (let t = 0; t < n; t++) v += X[i][t] * y[t];
    b[i] = v;
  }
  const beta = solveDense(Float64Array.from(M), b, k);
  let rss = 0;
  for (let t = 0; t < n; t++) {
    let r = y[t];
    for (let i = 0; i < k; i++) r -= beta[i] * X[i][t];
    rss += r * r;
  }
  return { beta, se: standardErrors(M, k, rss / m) };
}

function gram(X: Float64Array[]): Float64Array {
  const k = X.length;
  const n = X[0]?.length ?? 0;
  const M = new Float64Array(k * k);
  for (let i = 0; i < k; i++) {
    for (let j = 0; j <= i; j++) {
      let v = 0;
      for (let t = 0; t < n; t++) v += X[i][t] * X[j][t];
      M[i * k + j] = v;
      M[j * k + i] = v;
    }
  }
  return M;
}

function standardErrors(M: Float64Array, k: number, sigma2: number): Float64Array {
  const se = new Float64Array(k);
  for (let i = 0; i < k; i++) {
    const e = new Float64Array(k);
    e[i] = 1;
    const col = solveDense(Float64Array.from(M), e, k);
    se[i] = col[i] > 0 ? Math.sqrt(sigma2 * col[i]) : Number.NaN;
  }
  return se;
}

/**
 * A fit with its final filter (state, covariance, residuals, σ²), for forecasts and for callers that read
 * them: a quick fit of the search is filtered once at its own coefficients.
 */
function complete(y: Float64Array, fit: ArimaFit): ArimaFit {
  if (Number.isFinite(fit.sigma2)) return fit;
  const full = fitArima(y, fit.spec, { fixed: fit.coef });
  const done = { ...full, converged: fit.converged, evaluations: fit.evaluations };
  // The same coefficients give the same polynomials: the operator built for the search's fit serves.
  const known = operators.get(fit);
  // Its σ² is the final filter's: standard errors are taken again.
  if (known && known.y === y && same(done.phi, fit.phi) && same(done.theta, fit.theta)) {
    operators.set(done, { y, op: known.op, X: known.X });
  }
  return done;
}

function same(a: Float64Array, b: Float64Array): boolean {
  return a.length === b.length && a.every((v, i) => v === b[i]);
}

/** The ARMA coefficients of `fit` as start values for a fit of `orders`, when they are the same orders. */
function armaStart(fit: ArimaFit, orders: ArimaSpec): Float64Array | undefined {
  const s = fit.spec;
  if (s.p !== orders.p || s.q !== orders.q || s.P !== orders.P || s.Q !== orders.Q) return undefined;
  return fit.coef.slice(0, s.p + s.q + s.P + s.Q);
}

/**
 * The innovations operator of a fit's model on the periods `y` observes, built once per fit, with the
 * regressors it filters and their standard errors when asked for: the search locates outliers and takes
 * standard errors on the same fit, and the caller takes them again on the last.
 */
interface Filtered {
  y: Float64Array;
  op: Innovations;
  X?: Float64Array[];
  se?: Float64Array;
}
const operators = new WeakMap<ArimaFit, Filtered>();
function filteredOf(y: Float64Array, fit: ArimaFit): Filtered {
  const known = operators.get(fit);
  if (known && known.y === y) return known;
  const op = innovationsOperator(fit.phi, fit.theta, fit.delta, (t) => Number.isNaN(y[t]), y.length);
  const entry: Filtered = { y, op };
  operators.set(fit, entry);
  return entry;
}
function operatorOf(y: Float64Array, fit: ArimaFit): Innovations {
  return filteredOf(y, fit).op;
}
/** The fit's regressors filtered by its operator. */
function filteredRegressors(y: Float64Array, fit: ArimaFit): Float64Array[] {
  const f = filteredOf(y, fit);
  if (!f.X) f.X = fit.regressors.map((c) => f.op(c));
  return f.X;
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
  const u = regressionErrors(y, fit);
  // Residuals: the Kalman filter's standardised innovations of the regression errors (exact start, so a
  // seasonal MA near −1, a stable seasonal pattern, leaves no trace of the first year in them); the
  // effect of a unit outlier of each type at each period is the same filter run on its column (the
  // innovations are linear in the data).
  const missing = (t: number) => Number.isNaN(y[t]);
  const innovations = operatorOf(y, fit);
  const e = innovations(u);
  const start = fit.delta.length;
  // The operator is linear and a level shift at T is the sum of one-offs at T, T + 1, …, a temporary
  // change their sum weighted by rate^(t − T): each pattern is the next period's pattern (times the rate)
  // plus the one-off's at T, so only the one-offs are filtered. The kernel lays the patterns out and scans
  // them itself (the same operations in the same order as the JavaScript below, which runs without it).
  const kernel = innovations.patterns?.(rate, types.includes('LS'), types.includes('TC')) ?? null;
  const search = kernel ? kernelSearch(kernel, n) : scriptSearch(innovations, y, types, rate, n);
  for (const a of already) search.take(a.at);
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
    const best = new Float64Array(4); // found, T, ω̂, τ
    let type: DetectedType = types[0];
    for (const t of types) {
      const lo = t === 'LS' ? Math.max(start, 1) : start;
      const hi = t === 'LS' ? n - 2 : n - 1;
      if (search.scan(t, lo, hi, e, s, best)) type = t;
    }
    if (best[0] === 0 || Math.abs(best[3]) < critical) break;
    const at = best[1];
    added.push({ type, at });
    search.take(at);
    const g = search.row(type, at);
    for (let t = at; t < n; t++) e[t] -= best[2] * g[t];
  }
  if (kernel) releaseLargeMemory();
  return added;
}

/**
 * Standard errors of the regression coefficients given the ARMA coefficients (generalised least squares:
 * σ²(X̃ᵀX̃)⁻¹ with X̃ the regressors filtered into standardised innovations), the t-values X-13ARIMA-SEATS
 * reports for regressors (Findley et al. 1998, §2); far cheaper than the full Hessian, which a search that
 * refits many times cannot afford. One per column of `fit.regressors`.
 */
export function regressionSe(y: Float64Array, fit: ArimaFit): Float64Array {
  const f = filteredOf(y, fit);
  if (!f.se) {
    const X = filteredRegressors(y, fit);
    const sigma2 = Number.isFinite(fit.sigma2) ? fit.sigma2 : sigma2Of(y, fit, f.op);
    f.se = standardErrors(gram(X), X.length, sigma2);
  }
  return f.se.slice();
}

/** The regression errors y − Xβ of a fit, 0 where y is missing. */
function regressionErrors(y: Float64Array, fit: ArimaFit): Float64Array {
  const n = y.length;
  const k = fit.regressors.length;
  const first = fit.coef.length - k;
  const u = new Float64Array(n);
  for (let t = 0; t < n; t++) {
    if (Number.isNaN(y[t])) continue;
    let v = y[t];
    for (let j = 0; j < k; j++) v -= fit.coef[first + j] * fit.regressors[j][t];
    u[t] = v;
  }
  return u;
}

/**
 * σ̂² of a fit without its final filter: the sum of squares of the standardised innovations of y − Xβ over
 * the observations in the likelihood (what the final filter gives, state-space-filter.ts), by the operator.
 */
function sigma2Of(y: Float64Array, fit: ArimaFit, op: (x: Float64Array) => Float64Array): number {
  const n = y.length;
  const u = regressionErrors(y, fit);
  const e = op(u);
  let ssq = 0;
  for (let t = 0; t < n; t++) ssq += e[t] * e[t];
  return ssq / fit.nUsed;
}

/**
 * locate's search over the patterns of every period: scan updates the best candidate so far ([found, T, ω̂,
 * τ]: the largest |τ|, the first on ties) and says whether this type gave it.
 */
interface Search {
  scan(type: DetectedType, lo: number, hi: number, e: Float64Array, s: number, best: Float64Array): boolean;
  take(T: number): void;
  row(type: DetectedType, T: number): Float64Array;
}

const KIND: Record<DetectedType, PatternKind> = { AO: 0, LS: 1, TC: 2 };

/** The search on the kernel's patterns (state-space-kernel.ts). */
function kernelSearch(k: OutlierPatterns, n: number): Search {
  const taken = new Float64Array(n);
  return {
    scan: (type, lo, hi, e, s, best) => k.scan(KIND[type], lo, hi, e, taken, s, best),
    take(T) {
      taken[T] = 1;
    },
    row: (type, T) => k.row(KIND[type], T),
  };
}

/** The search in JavaScript: the kernel's reference, step for step. */
function scriptSearch(
  innovations: Innovations,
  y: Float64Array,
  types: readonly DetectedType[],
  rate: number,
  n: number,
): Search {
  const missing = (t: number) => Number.isNaN(y[t]);
  const impulse = new Float64Array(n); // outlierColumn('AO', T, n), one at a time
  const ao = Array.from({ length: n }, (_, T) => {
    impulse[T] = 1;
    const g = innovations(impulse, T);
    impulse[T] = 0;
    return g;
  });
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
  const row = (type: DetectedType, T: number) => (type === 'AO' ? ao[T] : type === 'LS' ? ls[T] : tc[T]);
  const taken = new Set<number>();
  return {
    scan(type, lo, hi, e, s, best) {
      let better = false;
      for (let T = lo; T <= hi; T++) {
        if (missing(T) || taken.has(T)) continue;
        const g = row(type, T);
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
        if (best[0] === 0 || Math.abs(tau) > Math.abs(best[3])) {
          best[0] = 1;
          best[1] = T;
          best[2] = omega;
          best[3] = tau;
          better = true;
        }
      }
      return better;
    },
    take(T) {
      taken.add(T);
    },
    row,
  };
}
