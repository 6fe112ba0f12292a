/**
 * Fits a regression with seasonal ARIMA(p,d,q)(P,D,Q)m errors by exact maximum likelihood:
 * yₜ = Σ βⱼ xⱼₜ + uₜ, (1 − B)ᵈ(1 − Bᵐ)ᴰ φ(B)Φ(Bᵐ) uₜ = θ(B)Θ(Bᵐ) εₜ. The likelihood is that of the
 * differenced series, computed by the Kalman filter (arma-filter.ts; with gaps and differencing, the filter
 * with the differencing in its state, state-space-filter.ts), with σ² concentrated out. AR parts are
 * searched through the stationary map of Jones (1980) (ar-transform.ts), MA parts freely and inverted after
 * the fit (ma-invert.ts), regression coefficients from least squares on the differenced data, in units of
 * ten of their standard errors; the minimiser is BFGS (bfgs.ts), with the exact gradient of the likelihood in
 * every coefficient where it is computed by the Chandrasekhar recursions (arma-likelihood-gradient.ts).
 * AIC, AICc and BIC as forecast::Arima reports them (Hurvich & Tsai 1989 for AICc).
 * Source: Box, Jenkins, Reinsel & Ljung, Time Series Analysis, 5th ed. (2015), ch. 7 and §9.2;
 * Durbin & Koopman (2012), §7.2 (maximum likelihood); the steps follow R's stats::arima, method "ML",
 * so that results agree with it.
 *
 *   fitArima(monthly, { p: 0, d: 1, q: 1, P: 0, D: 1, Q: 1, period: 12 }) → the "airline model" (Box & Jenkins)
 */
import { arFromUnconstrained, unconstrainedFromAr } from './ar-transform.js';
import { arJacobian } from './ar-transform-jacobian.js';
import { solveDense } from './arma-autocovariance.js';
import { armaChandrasekhar, type ChandrasekharWork, chandrasekharWork } from './arma-chandrasekhar.js';
import { arFromUnconstrainedAdjoint, expandArmaAdjoint } from './arma-coefficient-adjoint.js';
import { armaFilter } from './arma-filter.js';
import {
  armaLikelihoodAdjoint,
  armaLikelihoodRecord,
  type LikelihoodGradientWork,
  likelihoodGradientWork,
} from './arma-likelihood-gradient.js';
import { expandArma } from './arma-polynomials.js';
import { bfgs } from './bfgs.js';
import { difference, differencingPolynomial } from './differencing.js';
import { invertMa } from './ma-invert.js';
import { optimHessian } from './optim-hessian.js';
import { stateSpaceFilter } from './state-space-filter.js';

export interface ArimaSpec {
  p: number;
  d: number;
  q: number;
  P: number;
  D: number;
  Q: number;
  /** Seasonal period m (1 for none). */
  period: number;
  /** An intercept (only when d + D = 0). Default true when d + D = 0. */
  mean?: boolean;
  /** A linear time trend 1, 2, …, n as a regressor (forecast's "drift"). */
  drift?: boolean;
  /** Other regressors, one column per array, each as long as the series. */
  xreg?: Float64Array[];
  xregNames?: string[];
}

export interface ArimaFit {
  spec: ArimaSpec;
  /** Coefficient names in R's order: ar1…, ma1…, sar1…, sma1…, intercept, drift, regressors. */
  names: string[];
  coef: Float64Array;
  /** Standard errors from the numerical Hessian (NaN where it is not positive definite), when asked for. */
  se: Float64Array | null;
  sigma2: number;
  loglik: number;
  aic: number;
  aicc: number;
  bic: number;
  /** Observations in the likelihood: observed values less the differencing order. */
  nUsed: number;
  converged: boolean;
  /** Likelihood evaluations the search took. */
  evaluations: number;
  /** Expanded polynomials and the differencing, for forecasts. */
  phi: Float64Array;
  theta: Float64Array;
  delta: Float64Array;
  /** Regression columns actually used (intercept and drift included), and their count. */
  regressors: Float64Array[];
  /** Final filtered state of y − Xβ, for forecasts. */
  state: Float64Array;
  covariance: Float64Array;
  /** Standardised one-step innovations of the final filter. */
  residuals: Float64Array;
}

export interface FitOptions {
  /** Standard errors of the coefficients from the Hessian (costs a few more likelihood evaluations). */
  standardErrors?: boolean;
  /** Start values in `names` order (AR/MA parts), e.g. a previous fit's. */
  start?: Float64Array;
  relTol?: number;
  /**
   * 'exact' (default): the likelihood of the differenced series, exactly. 'diffuse': R's approximation, the
   * differencing in the state with a prior variance of 1e6 (state-space-filter.ts); it depends on the data's
   * scale (a level of thousands is not diffuse at variance 1e6), and reproduces stats::arima's numbers.
   */
  likelihood?: 'exact' | 'diffuse';
  /**
   * A quick fit for a model search: forward differences, R's default tolerance (1e-8), at most 50
   * iterations, and no final filter (no state for forecasts). The chosen model is then fitted in full.
   */
  quick?: boolean;
  /** With `quick`: still run the final filter, so the fit can forecast. */
  forecastable?: boolean;
  /** Every coefficient given (names order): no search, only the filter and the likelihood at them. */
  fixed?: Float64Array;
}

export class ArimaFitError extends Error {
  constructor(
    readonly reason: 'too-short' | 'not-finite' | 'optimiser' | 'constant' | 'no-model',
    message: string,
  ) {
    super(message);
  }
}

export function fitArima(y: Float64Array, spec: ArimaSpec, options: FitOptions = {}): ArimaFit {
  const { p, q, P, Q, period } = spec;
  const m = P > 0 || Q > 0 || spec.D > 0 ? period : 1;
  const n = y.length;
  const delta = differencingPolynomial(spec.d, spec.D, m);
  const nd = delta.length;
  const regressors: Float64Array[] = [];
  const names: string[] = [];
  for (let i = 1; i <= p; i++) names.push(`ar${i}`);
  for (let i = 1; i <= q; i++) names.push(`ma${i}`);
  for (let i = 1; i <= P; i++) names.push(`sar${i}`);
  for (let i = 1; i <= Q; i++) names.push(`sma${i}`);
  const narma = names.length;
  if ((spec.mean ?? true) && nd === 0) {
    regressors.push(new Float64Array(n).fill(1));
    names.push('intercept');
  }
  if (spec.drift) {
    const trend = new Float64Array(n);
    for (let t = 0; t < n; t++) trend[t] = t + 1;
    regressors.push(trend);
    names.push('drift');
  }
  (spec.xreg ?? []).forEach((col, i) => {
    regressors.push(col);
    names.push(spec.xregNames?.[i] ?? `xreg${i + 1}`);
  });
  const k = regressors.length;
  const npar = narma + k;
  let observed = 0;
  let gaps = false;
  for (let t = 0; t < n; t++) {
    if (!Number.isNaN(y[t])) observed++;
    else gaps = true;
    for (const c of regressors)
      if (!Number.isFinite(c[t])) throw new ArimaFitError('not-finite', 'a regressor is missing or not finite');
  }
  const nUsed = observed - nd;
  if (nUsed < npar + 2) {
    throw new ArimaFitError(
      'too-short',
      `${observed} values are too few for this model (${npar} coefficients, ${nd} lost to differencing)`,
    );
  }

  // Start values and scales of the regression coefficients: least squares on the differenced data.
  const beta0 = new Float64Array(k);
  const betaScale = new Float64Array(k).fill(1);
  if (k > 0) {
    const ls = leastSquares(
      nd > 0 ? difference(y, delta) : y,
      regressors.map((c) => (nd > 0 ? difference(c, delta) : c)),
    );
    for (let j = 0; j < k; j++) {
      beta0[j] = Number.isFinite(ls.beta[j]) ? ls.beta[j] : 0;
      betaScale[j] = Number.isFinite(ls.se[j]) && ls.se[j] > 0 ? 10 * ls.se[j] : 1;
    }
  }

  const useDifferenced = !gaps && nd > 0 && options.likelihood !== 'diffuse';
  const dy = useDifferenced ? difference(y, delta) : y;
  const dX = useDifferenced ? regressors.map((c) => difference(c, delta)) : regressors;
  const work = new Float64Array(dy.length);
  const sar = new Float64Array(P);
  const ar = new Float64Array(p);
  const rawAr = new Float64Array(p);
  const rawSar = new Float64Array(P);
  const ma = new Float64Array(q);
  const sma = new Float64Array(Q);
  const chandra = scratchChandrasekhar(Math.max(p + P * period, q + Q * period + 1));
  const polyWork = { phi: new Float64Array(p + P * period), theta: new Float64Array(q + Q * period) };

  const series = (par: Float64Array, target: Float64Array, base: Float64Array, cols: Float64Array[]) => {
    target.set(base);
    for (let j = 0; j < k; j++) {
      const b = par[narma + j];
      const c = cols[j];
      for (let t = 0; t < target.length; t++) target[t] -= b * c[t];
    }
    return target;
  };
  const polys = (par: Float64Array, transformed: boolean) => {
    for (let i = 0; i < p; i++) rawAr[i] = par[i];
    for (let i = 0; i < P; i++) rawSar[i] = par[p + q + i];
    if (transformed) {
      arFromUnconstrained(rawAr, ar);
      arFromUnconstrained(rawSar, sar);
    } else {
      ar.set(rawAr);
      sar.set(rawSar);
    }
    for (let i = 0; i < q; i++) ma[i] = par[p + i];
    for (let i = 0; i < Q; i++) sma[i] = par[p + q + P + i];
    return expandArma(ar, ma, sar, sma, period, polyWork);
  };
  const objective = (par: Float64Array, transformed: boolean): number => {
    const { phi, theta } = polys(par, transformed);
    const x = series(par, work, dy, dX);
    const s =
      !gaps && (useDifferenced || nd === 0)
        ? armaChandrasekhar(x, phi, theta, null, chandra)
        : nd === 0
          ? armaFilter(x, phi, theta)
          : stateSpaceFilter(x, phi, theta, delta);
    if (s.count === 0 || !(s.ssq > 0)) return Number.POSITIVE_INFINITY;
    return 0.5 * (Math.log(s.ssq / s.count) + s.sumlog / s.count);
  };

  // The exact gradient in every coefficient where the series has no gaps and the exact likelihood is used
  // (arma-likelihood-gradient.ts, then back through the polynomial product and the AR map); elsewhere BFGS
  // takes differences.
  let exactGradient: ((par: Float64Array, g: Float64Array) => boolean) | null = null;
  let searchObjective = (par: Float64Array) => objective(par, true);
  if (!gaps && (useDifferenced || nd === 0)) {
    const lw = scratchGradient(dy.length, Math.max(p + P * period, q + Q * period + 1));
    const gPhi = new Float64Array(p + P * period);
    const gTheta = new Float64Array(q + Q * period);
    const gX = new Float64Array(dy.length);
    const adj = {
      ar: new Float64Array(p),
      ma: new Float64Array(q),
      sar: new Float64Array(P),
      sma: new Float64Array(Q),
    };
    const rawBar = new Float64Array(Math.max(p, P));
    // Each value of the search keeps the filter's record, so the gradient at the point just taken (BFGS asks
    // for it only there) needs the reverse pass alone.
    const recordedAt = new Float64Array(npar);
    let recorded = false;
    const record = (par: Float64Array): number => {
      const { phi, theta } = polys(par, true);
      const v = armaLikelihoodRecord(series(par, work, dy, dX), phi, theta, lw);
      recordedAt.set(par);
      recorded = Number.isFinite(v);
      return recorded ? v : Number.POSITIVE_INFINITY;
    };
    searchObjective = record;
    exactGradient = (par, g) => {
      let same = recorded;
      for (let i = 0; same && i < npar; i++) same = par[i] === recordedAt[i];
      if (!same && !Number.isFinite(record(par))) return false;
      const { phi, theta } = polys(par, true);
      armaLikelihoodAdjoint(phi, theta, gPhi, gTheta, gX, lw);
      expandArmaAdjoint(ar, ma, sar, sma, period, gPhi, gTheta, adj);
      arFromUnconstrainedAdjoint(rawAr, adj.ar, rawBar);
      for (let i = 0; i < p; i++) g[i] = rawBar[i];
      for (let i = 0; i < q; i++) g[p + i] = adj.ma[i];
      arFromUnconstrainedAdjoint(rawSar, adj.sar, rawBar);
      for (let i = 0; i < P; i++) g[p + q + i] = rawBar[i];
      for (let i = 0; i < Q; i++) g[p + q + P + i] = adj.sma[i];
      for (let j = 0; j < k; j++) {
        const c = dX[j];
        let s = 0;
        for (let t = 0; t < c.length; t++) s -= gX[t] * c[t];
        g[narma + j] = s;
      }
      return true;
    };
  }

  const start = new Float64Array(npar);
  if (options.start && options.start.length === narma) start.set(options.start);
  for (let j = 0; j < k; j++) start[narma + j] = beta0[j];
  // Start values of AR parts are given as coefficients; the search runs on the unconstrained scale.
  if (options.start) {
    const toRaw = (from: number, len: number) => {
      const v = unconstrainedFromAr(start.slice(from, from + len));
      for (let i = 0; i < len; i++) start[from + i] = Number.isFinite(v[i]) ? v[i] : 0;
    };
    toRaw(0, p);
    toRaw(p + q, P);
  }
  const scale = new Float64Array(npar).fill(1);
  for (let j = 0; j < k; j++) scale[narma + j] = betaScale[j];
  const quick = options.quick ?? false;
  const res = options.fixed
    ? fixedPoint(options.fixed, p, q, P, (par) => objective(par, false))
    : bfgs(searchObjective, start, {
        scale,
        relTol: options.relTol ?? (quick ? 1e-8 : 1e-10),
        forward: quick,
        maxIterations: quick ? 50 : 100,
        partial: exactGradient ? { from: 0, at: exactGradient } : undefined,
      });
  if (!Number.isFinite(res.value) || res.value === Number.MAX_VALUE) {
    throw new ArimaFitError('optimiser', 'the likelihood could not be evaluated at any start value');
  }
  // Back to coefficients; invertible MA parts.
  const coef = Float64Array.from(res.par);
  if (!options.fixed) {
    polys(coef, true);
    coef.set(ar, 0);
    coef.set(sar, p + q);
  }
  coef.set(invertMa(coef.slice(p, p + q)), p);
  coef.set(invertMa(coef.slice(p + q + P, p + q + P + Q)), p + q + P);
  const value = objective(coef, false);
  // Copies: the polynomials' arrays are reused by every later evaluation (standard errors).
  const phi = polys(coef, false).phi.slice();
  const theta = polyWork.theta.slice();

  const loglik = -0.5 * (2 * nUsed * value + nUsed + nUsed * Math.log(2 * Math.PI));
  const aic = -2 * loglik + 2 * (npar + 1);
  const nstar = n - nd;
  const np1 = npar + 1;
  const aicc = aic + (2 * np1 * (np1 + 1)) / (nstar - np1 - 1);
  const bic = aic + np1 * (Math.log(nstar) - 2);

  const full = series(coef, new Float64Array(n), y, regressors);
  const final =
    quick && !options.forecastable
      ? { ssq: Number.NaN, state: new Float64Array(0), covariance: new Float64Array(0), residuals: new Float64Array(0) }
      : stateSpaceFilter(full, phi, theta, delta);
  const sigma2 = final.ssq / nUsed;
  const se = options.standardErrors
    ? standardErrors(
        (par, transformed) => objective(par, transformed),
        coef,
        { p, q, P, Q, fixed: options.fixed !== undefined },
        scale,
        nUsed,
      )
    : null;
  return {
    spec,
    names,
    coef,
    se,
    sigma2,
    loglik,
    aic,
    aicc,
    bic,
    nUsed,
    converged: res.converged,
    evaluations: res.evaluations,
    phi,
    theta,
    delta,
    regressors,
    state: final.state,
    covariance: final.covariance,
    residuals: final.residuals,
  };
}

/*
 * Scratch of the likelihood and its gradient, kept between fits: a model search fits dozens of models to
 * one series, and allocating the recursions' record for each fit cost about a twentieth of the search
 * (mostly in the garbage collector). The work arrays' contents never carry over from one call to the next
 * (each recursion writes before it reads), and a fit runs to its end without yielding, so one set serves
 * every fit; it grows to the largest series and state met.
 */
let chandrasekharScratch: ChandrasekharWork | null = null;
let gradientScratch: LikelihoodGradientWork | null = null;

function scratchChandrasekhar(size: number): ChandrasekharWork {
  if (!chandrasekharScratch || chandrasekharScratch.size < size) chandrasekharScratch = chandrasekharWork(size);
  return chandrasekharScratch;
}

function scratchGradient(n: number, size: number): LikelihoodGradientWork {
  const s = gradientScratch;
  if (!s || s.n < n || s.size < size) {
    gradientScratch = likelihoodGradientWork(Math.max(n, s?.n ?? 0), Math.max(size, s?.size ?? 0));
  }
  return gradientScratch as LikelihoodGradientWork;
}

/** The "search" result of a fit at given coefficients. */
function fixedPoint(coef: Float64Array, _p: number, _q: number, _P: number, f: (par: Float64Array) => number) {
  const par = Float64Array.from(coef);
  return { par, value: f(par), iterations: 0, evaluations: 1, converged: true };
}

/** Ordinary least squares with standard errors (normal equations; NaN where singular). */
function leastSquares(y: Float64Array, cols: Float64Array[]): { beta: Float64Array; se: Float64Array } {
  const k = cols.length;
  const XtX = new Float64Array(k * k);
  const Xty = new Float64Array(k);
  let n = 0;
  for (let t = 0; t < y.length; t++) {
    if (Number.isNaN(y[t])) continue;
    n++;
    for (let i = 0; i < k; i++) {
      Xty[i] += cols[i][t] * y[t];
      for (let j = 0; j < k; j++) XtX[i * k + j] += cols[i][t] * cols[j][t];
    }
  }
  const beta = solveDense(Float64Array.from(XtX), Float64Array.from(Xty), k);
  let rss = 0;
  for (let t = 0; t < y.length; t++) {
    if (Number.isNaN(y[t])) continue;
    let f = 0;
    for (let i = 0; i < k; i++) f += beta[i] * cols[i][t];
    rss += (y[t] - f) ** 2;
  }
  const s2 = rss / Math.max(1, n - k);
  const se = new Float64Array(k);
  for (let i = 0; i < k; i++) {
    const e = new Float64Array(k);
    e[i] = 1;
    const col = solveDense(Float64Array.from(XtX), e, k);
    se[i] = Math.sqrt(s2 * col[i]);
  }
  return { beta, se };
}

/**
 * Standard errors as stats::arima reports them: the Hessian of n·objective by R's optimHess rule
 * (optim-hessian.ts), on the scale the search used (AR parts unconstrained, regression coefficients in units
 * of their scale), turned into the coefficients' covariance by the Jacobian of the AR map (R's
 * ARIMA_Gradtrans: var = Aᵀ(nH)⁻¹A). Where the AR map cannot be inverted (a fit at given coefficients that
 * are not stationary) the Hessian is taken on the coefficients themselves. NaN where the matrix is not
 * positive definite.
 */
function standardErrors(
  f: (par: Float64Array, transformed: boolean) => number,
  coef: Float64Array,
  orders: { p: number; q: number; P: number; Q: number; fixed: boolean },
  scale: Float64Array,
  n: number,
): Float64Array {
  const { p, q, P } = orders;
  const k = coef.length;
  const raw = Float64Array.from(coef);
  const rawAr = unconstrainedFromAr(coef.slice(0, p));
  const rawSar = unconstrainedFromAr(coef.slice(p + q, p + q + P));
  const transformed = !orders.fixed && [...rawAr, ...rawSar].every(Number.isFinite);
  if (transformed) {
    raw.set(rawAr, 0);
    raw.set(rawSar, p + q);
  }
  const H = optimHessian((par) => f(par, transformed), raw, scale);
  for (let i = 0; i < H.length; i++) H[i] *= n;
  // A = identity, with the AR blocks' Jacobians.
  const A = new Float64Array(k * k);
  for (let i = 0; i < k; i++) A[i * k + i] = 1;
  if (transformed) {
    const put = (from: number, J: Float64Array, len: number) => {
      for (let i = 0; i < len; i++) for (let j = 0; j < len; j++) A[(from + i) * k + from + j] = J[i * len + j];
    };
    put(0, arJacobian(rawAr), p);
    put(p + q, arJacobian(rawSar), P);
  }
  const se = new Float64Array(k);
  for (let c = 0; c < k; c++) {
    // var[c][c] = A[:,c]ᵀ H⁻¹ A[:,c]
    const col = new Float64Array(k);
    for (let i = 0; i < k; i++) col[i] = A[i * k + c];
    const sol = solveDense(Float64Array.from(H), Float64Array.from(col), k);
    let v = 0;
    for (let i = 0; i < k; i++) v += col[i] * sol[i];
    se[c] = v > 0 ? Math.sqrt(v) : Number.NaN;
  }
  return se;
}
