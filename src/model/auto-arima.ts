/**
 * Automatic ARIMA order selection: the stepwise algorithm of Hyndman & Khandakar (2008), "Automatic time
 * series forecasting: the forecast package for R", Journal of Statistical Software 27(3), §3.2. D from the
 * seasonal strength test (seasonal-differences.ts), d from repeated KPSS tests on the seasonally differenced
 * series (kpss.ts); then, by AICc: four starting models, and moves of p, q, P, Q by one (singly and in
 * pairs) and of the constant, from the best so far, until no move improves it. A constant is a mean when
 * d + D = 0 and a drift when d + D = 1. Models with a root of the AR or MA polynomial within 1.01 of the
 * unit circle are not chosen. Limits and order of moves as forecast::auto.arima (stepwise, max.p = max.q = 5,
 * max.P = max.Q = 2, at most 94 models), so that results compare with it.
 *
 *   autoArima(monthly, 12) → { spec: ARIMA(0,1,1)(0,1,1)12, fit, models tried }
 */
import { type ArimaFit, ArimaFitError, type ArimaSpec, fitArima } from './fit-arima.js';
import { isConstant, kpssDifferences } from './kpss.js';
import { regressionResiduals } from './regression-residuals.js';
import { seasonalDifferences } from './seasonal-differences.js';
import { isStable } from './stable.js';

export interface AutoArimaOptions {
  /** Fix the differencing orders instead of testing for them. */
  d?: number;
  D?: number;
  /** Regressors (issue of calendar effects); the tests for d and D then run on the regression residuals. */
  xreg?: Float64Array[];
  xregNames?: string[];
  maxP?: number;
  maxQ?: number;
  maxSP?: number;
  maxSQ?: number;
  /** Allow a constant (mean or drift). Default true. */
  constant?: boolean;
}

export interface AutoArimaResult {
  fit: ArimaFit;
  /** Every model tried: orders, constant, AICc (Infinity when rejected or failed). */
  tried: { p: number; q: number; P: number; Q: number; constant: boolean; aicc: number }[];
  d: number;
  D: number;
  /** Likelihood evaluations over the whole search and the final fit. */
  evaluations: number;
}

/**
 * Relative tolerance of the fits inside the search: 1e-6, looser than R's 1e-8 (forecast::auto.arima's
 * fits use optim's default), since the search only ranks models; the chosen model is then fitted again in
 * full (1e-10) from the search's estimates. Measured on the 28 series of bench/ARIMA-SELECTION.md: a
 * quarter fewer likelihood evaluations, and the same count of models within 0.5 AICc of auto.arima's.
 */
const SEARCH_TOLERANCE = 1e-6;

export function autoArima(y: Float64Array, period: number, options: AutoArimaOptions = {}): AutoArimaResult {
  const m = Math.max(period, 1);
  const observed = y.filter((v) => !Number.isNaN(v));
  const maxp = options.maxP ?? 5;
  const maxq = options.maxQ ?? 5;
  let maxP = m > 1 ? (options.maxSP ?? 2) : 0;
  let maxQ = m > 1 ? (options.maxSQ ?? 2) : 0;
  if (m === 1) maxP = maxQ = 0;
  const { d, D } = differencingOrders(y, m, options);
  const allowConstant = options.constant ?? true;
  const drift = allowConstant && d + D === 1;
  const mean = allowConstant && d + D === 0;
  let constant = drift || mean;

  const tried: AutoArimaResult['tried'] = [];
  let evaluations = 0;
  const fits = new Map<string, ArimaFit | null>();
  const key = (p: number, q: number, P: number, Q: number, c: boolean) => `${p},${q},${P},${Q},${c}`;
  const tryModel = (p: number, q: number, P: number, Q: number, c: boolean): { fit: ArimaFit | null; aicc: number } => {
    const k = key(p, q, P, Q, c);
    let fit: ArimaFit | null = null;
    const spec: ArimaSpec = {
      p,
      d,
      q,
      P,
      D,
      Q,
      period: m,
      mean: c && d + D === 0,
      drift: c && d + D === 1,
      xreg: options.xreg,
      xregNames: options.xregNames,
    };
    try {
      fit = fitArima(y, spec, {
        quick: true,
        relTol: SEARCH_TOLERANCE,
        start: warmStart(best?.fit ?? null, p, q, P, Q),
      });
    } catch {
      fit = null;
    }
    let aicc = fit && Number.isFinite(fit.aicc) ? fit.aicc : Number.POSITIVE_INFINITY;
    if (
      fit &&
      (!isStable(fit.phi, 1.01) ||
        !isStable(
          fit.theta.map((v) => -v),
          1.01,
        ))
    )
      aicc = Number.POSITIVE_INFINITY;
    fits.set(k, fit);
    if (fit) evaluations += fit.evaluations;
    tried.push({ p, q, P, Q, constant: c, aicc });
    return { fit, aicc };
  };
  const isNew = (p: number, q: number, P: number, Q: number, c: boolean) => !fits.has(key(p, q, P, Q, c));

  if (isConstant(observed)) throw new ArimaFitError('constant', 'the series is constant: it needs no model');
  if (observed.length < 4) throw new ArimaFitError('too-short', `${observed.length} values are too few for a model`);

  let p = Math.min(2, maxp);
  let q = Math.min(2, maxq);
  let P = Math.min(1, maxP);
  let Q = Math.min(1, maxQ);
  let best: { fit: ArimaFit | null; aicc: number } | null = null;
  best = tryModel(p, q, P, Q, constant);
  const consider = (np: number, nq: number, nP: number, nQ: number, c: boolean): boolean => {
    const r = tryModel(np, nq, nP, nQ, c);
    if (best === null || r.aicc < best.aicc) {
      best = r;
      p = np;
      q = nq;
      P = nP;
      Q = nQ;
      constant = c;
      return true;
    }
    return false;
  };
  consider(0, 0, 0, 0, constant);
  if (maxp > 0 || maxP > 0) consider(maxp > 0 ? 1 : 0, 0, m > 1 && maxP > 0 ? 1 : 0, 0, constant);
  if (maxq > 0 || maxQ > 0) consider(0, maxq > 0 ? 1 : 0, 0, m > 1 && maxQ > 0 ? 1 : 0, constant);
  if (constant) consider(0, 0, 0, 0, false);

  const moves: [number, number, number, number][] = [
    [0, 0, -1, 0],
    [0, 0, 0, -1],
    [0, 0, 1, 0],
    [0, 0, 0, 1],
    [0, 0, -1, -1],
    [0, 0, -1, 1],
    [0, 0, 1, -1],
    [0, 0, 1, 1],
    [-1, 0, 0, 0],
    [0, -1, 0, 0],
    [1, 0, 0, 0],
    [0, 1, 0, 0],
    [-1, -1, 0, 0],
    [-1, 1, 0, 0],
    [1, -1, 0, 0],
    [1, 1, 0, 0],
  ];
  const maxModels = 94;
  let improved = true;
  while (improved && tried.length < maxModels) {
    improved = false;
    for (const [dp, dq, dP, dQ] of moves) {
      const np = p + dp;
      const nq = q + dq;
      const nP = P + dP;
      const nQ = Q + dQ;
      if (np < 0 || nq < 0 || nP < 0 || nQ < 0 || np > maxp || nq > maxq || nP > maxP || nQ > maxQ) continue;
      if (!isNew(np, nq, nP, nQ, constant)) continue;
      if (tried.length >= maxModels) break;
      if (consider(np, nq, nP, nQ, constant)) {
        improved = true;
        break;
      }
    }
    if (!improved && (drift || mean) && isNew(p, q, P, Q, !constant) && tried.length < maxModels) {
      improved = consider(p, q, P, Q, !constant);
    }
  }
  if (!best?.fit || !Number.isFinite(best.aicc)) {
    throw new ArimaFitError('no-model', 'no model fitted without a root on or near the unit circle');
  }
  // The chosen model fitted in full, from the search's estimates.
  const chosen = best.fit;
  const narma = chosen.spec.p + chosen.spec.q + chosen.spec.P + chosen.spec.Q;
  let fit = fitArima(y, chosen.spec, { start: chosen.coef.slice(0, narma) });
  evaluations += fit.evaluations;
  if (!(fit.aicc <= chosen.aicc + 1e-6 || !Number.isFinite(chosen.aicc))) {
    fit = fitArima(y, chosen.spec);
    evaluations += fit.evaluations;
  }
  return { fit, tried, d, D, evaluations };
}

/**
 * The orders to use once regressors (e.g. the first outlier candidates) join a model chosen without them.
 * Chen & Liu (1993, §3) re-estimate the coefficients of the model with the outliers and keep its orders; we
 * keep them too, unless the differencing tests, repeated on what the regressors leave, now give other
 * differencing orders: a level shift makes a stationary series look integrated (the Nile's 1899 step), and
 * then the orders are chosen again with the regressors. Null: keep the orders of `current`.
 */
export function reselectOrders(
  y: Float64Array,
  period: number,
  current: Pick<ArimaSpec, 'd' | 'D'>,
  xreg: Float64Array[],
): ArimaSpec | null {
  const { d, D } = differencingOrders(y, period, { xreg });
  if (d === current.d && D === current.D) return null;
  return autoArima(y, period, { xreg }).fit.spec;
}

/**
 * The differencing orders the search uses: D from the seasonal strength test, then d from repeated KPSS
 * tests on the seasonally differenced series (Hyndman & Khandakar 2008, §3.2); with regressors, both are
 * tested on what the regressors leave (forecast::auto.arima does the same). Orders given are kept.
 */
export function differencingOrders(
  y: Float64Array,
  period: number,
  options: Pick<AutoArimaOptions, 'd' | 'D' | 'xreg'> = {},
): { d: number; D: number } {
  const m = Math.max(period, 1);
  let observed = 0;
  for (const v of y) if (!Number.isNaN(v)) observed++;
  const tested = options.xreg && options.xreg.length > 0 ? regressionResiduals(y, options.xreg) : y;
  let D = options.D ?? (m > 1 && observed > 2 * m ? seasonalDifferences(tested, m) : 0);
  if ((m === 1 || observed <= 2 * m) && options.D === undefined) D = 0;
  const dx = D > 0 ? seasonalDifference(tested, m) : tested;
  const d = options.d ?? kpssDifferences(dx);
  return { d, D };
}

function seasonalDifference(y: Float64Array, m: number): Float64Array {
  const out = new Float64Array(Math.max(0, y.length - m));
  for (let t = m; t < y.length; t++) out[t - m] = y[t] - y[t - m];
  return out;
}

/**
 * Start values for a neighbour of the best model so far: its AR, MA, seasonal AR and seasonal MA
 * coefficients, cut or padded with zeros to the new orders (Hyndman & Khandakar's moves change one or two
 * orders by one, so the neighbour's optimum is usually close). Undefined without a fit to start from.
 */
function warmStart(from: ArimaFit | null, p: number, q: number, P: number, Q: number): Float64Array | undefined {
  if (!from) return undefined;
  const s = from.spec;
  if (p < s.p || q < s.q || P < s.P || Q < s.Q) return undefined;
  const out = new Float64Array(p + q + P + Q);
  const copy = (src: number, len: number, dst: number, want: number) => {
    for (let i = 0; i < Math.min(len, want); i++) out[dst + i] = from.coef[src + i];
  };
  copy(0, s.p, 0, p);
  copy(s.p, s.q, p, q);
  copy(s.p + s.q, s.P, p + q, P);
  copy(s.p + s.q + s.P, s.Q, p + q + P, Q);
  return out;
}
