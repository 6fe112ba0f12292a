/**
 * STL: Seasonal-Trend decomposition by Loess.
 * Source: Cleveland, Cleveland, McRae & Terpenning (1990), Journal of Official Statistics 6(1), 3–73.
 * The inner loop (§2.2) detrends, smooths each cycle-subseries (extended one cycle each side), removes
 * the low-pass of that, and smooths the deseasonalised series for the trend; the outer loop (§2.3)
 * recomputes bisquare robustness weights from the remainder. Defaults are the paper's, as R's stats::stl
 * applies them: trend window the smallest odd integer ≥ 1.5·period/(1 − 1.5/seasonal window), low-pass
 * window the smallest odd integer ≥ period, jumps ⌈window/10⌉, 2 inner and 0 outer passes (1 and 15 when
 * robust). A periodic seasonal uses a window of 10n + 1 with degree 0 and is then averaged per cycle
 * position. Missing values (NaN) get weight zero in every smoother, as the paper describes (§3.5), so the
 * trend and seasonal have values there; the remainder is NaN.
 *
 *   stl(monthlyValues, { period: 12, seasonalWindow: 13 }) → trend, seasonal, remainder, weights
 */
import { loessAt, loessSmooth, newTricube, type Tricube } from './loess.js';
import { partialSort } from './partial-sort.js';
import { fitByKernel } from './stl-kernel.js';

export interface StlOptions {
  period: number;
  seasonalWindow: number | 'periodic';
  seasonalDegree?: 0 | 1;
  trendWindow?: number;
  trendDegree?: 0 | 1;
  lowpassWindow?: number;
  lowpassDegree?: 0 | 1;
  seasonalJump?: number;
  trendJump?: number;
  lowpassJump?: number;
  robust?: boolean;
  inner?: number;
  outer?: number;
  /**
   * Robustness scale from the true median of |residual| instead of the reference Fortran's partial sort
   * (see partial-sort.ts). Default false, so that results agree with R's stats::stl.
   */
  trueMedian?: boolean;
}

export interface StlSettings {
  period: number;
  seasonalWindow: number | 'periodic';
  seasonalDegree: 0 | 1;
  trendWindow: number;
  trendDegree: 0 | 1;
  lowpassWindow: number;
  lowpassDegree: 0 | 1;
  seasonalJump: number;
  trendJump: number;
  lowpassJump: number;
  robust: boolean;
  inner: number;
  outer: number;
  trueMedian: boolean;
}

export interface StlResult {
  trend: Float64Array;
  seasonal: Float64Array;
  remainder: Float64Array;
  /** Final robustness weights (all 1 when not robust; 0 at missing values). */
  weights: Float64Array;
  settings: StlSettings;
}

/** R's nextodd: round, then add one when even. */
export function nextOdd(x: number): number {
  const r = Math.round(x);
  return r % 2 === 0 ? r + 1 : r;
}

/** Resolves every setting the way stats::stl does, for a series of n values. */
export function stlSettings(n: number, options: StlOptions): StlSettings {
  const period = options.period;
  const periodic = options.seasonalWindow === 'periodic';
  const sw = periodic ? 10 * n + 1 : (options.seasonalWindow as number);
  const trendWindow = options.trendWindow ?? nextOdd(Math.ceil((1.5 * period) / (1 - 1.5 / sw)));
  const lowpassWindow = options.lowpassWindow ?? nextOdd(period);
  const trendDegree = options.trendDegree ?? 1;
  const robust = options.robust ?? false;
  return {
    period,
    seasonalWindow: periodic ? 'periodic' : sw,
    seasonalDegree: periodic ? 0 : (options.seasonalDegree ?? 0),
    trendWindow,
    trendDegree,
    lowpassWindow,
    lowpassDegree: options.lowpassDegree ?? trendDegree,
    seasonalJump: options.seasonalJump ?? Math.ceil(sw / 10),
    trendJump: options.trendJump ?? Math.ceil(trendWindow / 10),
    lowpassJump: options.lowpassJump ?? Math.ceil(lowpassWindow / 10),
    robust,
    inner: options.inner ?? (robust ? 1 : 2),
    outer: options.outer ?? (robust ? 15 : 0),
    trueMedian: options.trueMedian ?? false,
  };
}

/**
 * The fit by the WebAssembly kernel (stl-kernel.ts), which gives the same bits as stlScript below without
 * its warm-up in a fresh process; by stlScript where the build has not made the kernel.
 */
export function stl(values: Float64Array, options: StlOptions): StlResult {
  const n = values.length;
  const s = stlSettings(n, options);
  const periodic = s.seasonalWindow === 'periodic';
  const sw = periodic ? 10 * n + 1 : (s.seasonalWindow as number);
  const fit = fitByKernel(values, {
    ...s,
    np: Math.max(2, s.period),
    periodic,
    ns: oddAtLeast3(sw),
    nt: oddAtLeast3(s.trendWindow),
    nl: oddAtLeast3(s.lowpassWindow),
  });
  return fit === null ? stlScript(values, options) : { ...fit, settings: s };
}

/** STL in JavaScript: the kernel's reference, step for step. */
export function stlScript(values: Float64Array, options: StlOptions): StlResult {
  const n = values.length;
  const s = stlSettings(n, options);
  const periodic = s.seasonalWindow === 'periodic';
  const sw = periodic ? 10 * n + 1 : (s.seasonalWindow as number);
  const np = Math.max(2, s.period);
  const ns = oddAtLeast3(sw);
  const nt = oddAtLeast3(s.trendWindow);
  const nl = oddAtLeast3(s.lowpassWindow);

  // Missing values: a finite stand-in with weight zero everywhere. The values are only read, so a series
  // with none missing is used as it is (a copy of a million values is 8 MB more at the peak).
  let missing = 0;
  const present = new Uint8Array(n);
  for (let i = 0; i < n; i++) {
    if (Number.isFinite(values[i])) present[i] = 1;
    else missing++;
  }
  const y = missing === 0 ? values : new Float64Array(n);
  if (missing > 0) for (let i = 0; i < n; i++) if (present[i] === 1) y[i] = values[i];
  const rw = new Float64Array(n);
  for (let i = 0; i < n; i++) rw[i] = present[i];
  // Robust fits pass weights from the first pass on (all 1 until the first robustness step): the fits are
  // those of unweighted loess to rounding, and a fresh process compiles the weighted code during the first
  // pass instead of meeting it cold in the second.
  let useWeights = missing > 0 || s.outer > 0;

  const trend = new Float64Array(n);
  const season = new Float64Array(n);
  const work = new StlWork(n, np);
  for (let pass = 0; ; pass++) {
    innerLoop(y, n, np, ns, nt, nl, s, useWeights ? rw : null, season, trend, work);
    if (pass >= s.outer) break;
    const fit = work.a;
    for (let i = 0; i < n; i++) fit[i] = trend[i] + season[i];
    robustnessWeights(y, fit, present, rw, s.trueMedian, work.b);
    useWeights = true;
  }
  if (s.outer <= 0) for (let i = 0; i < n; i++) rw[i] = present[i];

  if (periodic) {
    const sums = new Float64Array(s.period);
    const counts = new Float64Array(s.period);
    for (let i = 0; i < n; i++) {
      sums[i % s.period] += season[i];
      counts[i % s.period]++;
    }
    for (let i = 0; i < n; i++) season[i] = sums[i % s.period] / counts[i % s.period];
  }
  const remainder = new Float64Array(n);
  for (let i = 0; i < n; i++) remainder[i] = values[i] - season[i] - trend[i];
  return { trend, seasonal: season, remainder, weights: rw, settings: s };
}

function oddAtLeast3(w: number): number {
  const v = Math.max(3, w);
  return v % 2 === 0 ? v + 1 : v;
}

/**
 * Scratch arrays reused across passes. a and b are columns of length n + 2·period, as in the Fortran; c, d
 * and e hold the cycle-subseries side by side (each with room for its two extended points), so each one is
 * read and written contiguously rather than with a stride of one period.
 */
class StlWork {
  readonly a: Float64Array;
  readonly b: Float64Array;
  readonly c: Float64Array;
  readonly d: Float64Array;
  readonly e: Float64Array;
  /** Distance between the starts of consecutive subseries in c, d and e. */
  readonly stride: number;
  readonly table: Tricube = newTricube();
  constructor(n: number, np: number) {
    const len = n + 2 * np;
    this.stride = Math.floor((n - 1) / np) + 3;
    const subLen = Math.max(len, np * this.stride);
    this.a = new Float64Array(len);
    this.b = new Float64Array(len);
    this.c = new Float64Array(subLen);
    this.d = new Float64Array(subLen);
    this.e = new Float64Array(subLen);
  }
}

function innerLoop(
  y: Float64Array,
  n: number,
  np: number,
  ns: number,
  nt: number,
  nl: number,
  s: StlSettings,
  rw: Float64Array | null,
  season: Float64Array,
  trend: Float64Array,
  w: StlWork,
): void {
  for (let pass = 0; pass < s.inner; pass++) {
    for (let i = 0; i < n; i++) w.a[i] = y[i] - trend[i];
    // w.b: cycle-subseries smooths extended one cycle each side (length n + 2·np).
    cycleSubseries(w.a, n, np, ns, s.seasonalDegree, s.seasonalJump, rw, w.b, w);
    // Low-pass: moving averages of length np, np, 3, then a loess of window nl.
    movingAverage(w.b, n + 2 * np, np, w.c);
    movingAverage(w.c, n + np + 1, np, w.a);
    movingAverage(w.a, n + 2, 3, w.c);
    loessSmooth(w.c, n, nl, s.lowpassDegree, s.lowpassJump, null, w.a, w.table);
    for (let i = 0; i < n; i++) {
      const v = w.b[np + i] - w.a[i];
      season[i] = v;
      w.a[i] = y[i] - v;
    }
    loessSmooth(w.a, n, nt, s.trendDegree, s.trendJump, rw, trend, w.table);
  }
}

/**
 * Smooths each cycle-subseries and extends it by one point at each end (the paper's step 2), writing the
 * n + 2·np values into season. The subseries are first gathered side by side into w.c (values) and w.d
 * (weights), smoothed into w.e, then scattered back: three sequential passes instead of strided ones.
 */
function cycleSubseries(
  y: Float64Array,
  n: number,
  np: number,
  ns: number,
  degree: number,
  jump: number,
  rw: Float64Array | null,
  season: Float64Array,
  w: StlWork,
): void {
  const stride = w.stride;
  const sub = w.c;
  const subW = w.d;
  const fitted = w.e;
  for (let base = 0, m = 1; base < n; base += np, m++) {
    const top = Math.min(np, n - base);
    for (let j = 0, at = m; j < top; j++, at += stride) sub[at] = y[base + j];
    if (rw !== null) for (let j = 0, at = m; j < top; j++, at += stride) subW[at] = rw[base + j];
  }
  const weights = rw !== null ? subW : null;
  for (let j = 0; j < np; j++) {
    const k = Math.floor((n - 1 - j) / np) + 1;
    // Subseries j occupies indices at + 0 … at + k − 1 of sub, subW and fitted; its extensions at − 1 and at + k.
    const at = j * stride + 1;
    loessSmooth(sub, k, ns, degree, jump, weights, fitted, w.table, at);
    const first = loessAt(sub, k, ns, degree, -1, 0, Math.min(ns, k) - 1, weights, w.table, at);
    fitted[at - 1] = Number.isNaN(first) ? fitted[at] : first;
    const last = loessAt(sub, k, ns, degree, k, Math.max(0, k - ns), k - 1, weights, w.table, at);
    fitted[at + k] = Number.isNaN(last) ? fitted[at + k - 1] : last;
  }
  // Position m of subseries j goes to m·np + j; subseries j has k_j + 2 values.
  const total = n + 2 * np;
  for (let base = 0, m = 0; base < total; base += np, m++) {
    const top = Math.min(np, total - base);
    for (let j = 0, at = m; j < top; j++, at += stride) season[base + j] = fitted[at];
  }
}

/** Running mean of length len over the first n values of x: n − len + 1 values into ave. */
function movingAverage(x: Float64Array, n: number, len: number, ave: Float64Array): void {
  const newn = n - len + 1;
  let v = 0;
  for (let i = 0; i < len; i++) v += x[i];
  ave[0] = v / len;
  for (let j = 1, k = len, m = 0; j < newn; j++, k++, m++) {
    v = v - x[m] + x[k];
    ave[j] = v / len;
  }
}

/**
 * Bisquare robustness weights from the residuals y − fit: h = 6·median|residual| (§2.3); missing points
 * keep weight zero and do not count towards the median. The median is found as the reference Fortran finds
 * it (partial-sort.ts) unless trueMedian is set.
 */
export function robustnessWeights(
  y: Float64Array,
  fit: Float64Array,
  present: Uint8Array,
  rw: Float64Array,
  trueMedian = false,
  scratch: Float64Array | null = null,
): void {
  const n = y.length;
  // The median search rearranges its input, so it works on a copy of |residual|: scratch when given.
  const abs = scratch !== null && scratch.length >= n ? scratch : new Float64Array(n);
  const count = absoluteResiduals(y, fit, present, abs);
  const r = abs.subarray(0, count);
  // Fortran: mid = n/2 + 1 and n − mid + 1 (1-based); the mean of the two middle order statistics.
  const hi = count >> 1;
  const lo = count - hi - 1;
  let upper: number;
  let lower: number;
  if (trueMedian) {
    upper = select(r, hi);
    lower = upper;
    if (lo !== hi) {
      lower = Number.NEGATIVE_INFINITY;
      for (let i = 0; i < hi; i++) if (r[i] > lower) lower = r[i];
    }
  } else {
    partialSort(r, [hi + 1, lo + 1]);
    upper = r[hi];
    lower = r[lo];
  }
  bisquare(y, fit, present, rw, 3 * (upper + lower));
}

// The loops live in small functions of their own, which the engine compiles whole after a few calls,
// rather than in the middle of a larger one, whose compiled loops kept bailing out on long series.

/** |y − fit| of the points present, packed into abs; returns how many. */
function absoluteResiduals(y: Float64Array, fit: Float64Array, present: Uint8Array, abs: Float64Array): number {
  let count = 0;
  for (let i = 0; i < y.length; i++) if (present[i] !== 0) abs[count++] = Math.abs(y[i] - fit[i]);
  return count;
}

/** Bisquare weights of |y − fit| / cmad; zero where the point is missing. */
function bisquare(y: Float64Array, fit: Float64Array, present: Uint8Array, rw: Float64Array, cmad: number): void {
  const c9 = 0.999 * cmad;
  const c1 = 0.001 * cmad;
  // Every step on every point, and one store: branches that only outliers or missing values reach would
  // make the compiled loop bail out the first time they are taken.
  for (let i = 0; i < y.length; i++) {
    const e = Math.abs(y[i] - fit[i]);
    const u = e / cmad;
    const t = 1 - u * u;
    rw[i] = present[i] === 0 ? 0 : e <= c1 ? 1 : e <= c9 ? t * t : 0;
  }
}

/** Quickselect: rearranges a so that a[k] is the k-th smallest and a[0…k−1] ≤ a[k]; returns a[k]. */
export function select(a: Float64Array, k: number): number {
  let left = 0;
  let right = a.length - 1;
  while (right > left) {
    const pivot = a[(left + right) >> 1];
    let i = left;
    let j = right;
    while (i <= j) {
      while (a[i] < pivot) i++;
      while (a[j] > pivot) j--;
      if (i <= j) {
        const t = a[i];
        a[i] = a[j];
        a[j] = t;
        i++;
        j--;
      }
    }
    if (k <= j) right = j;
    else if (k >= i) left = i;
    else break;
  }
  return a[k];
}
