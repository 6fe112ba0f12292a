/**
 * STL (Cleveland, Cleveland, McRae & Terpenning 1990, Journal of Official Statistics 6(1), 3–73) as a
 * WebAssembly kernel, written in AssemblyScript and compiled by `npm run build` (scripts/kernels.mjs)
 * into dist/decompose/stl-kernel.wasm. It is stl.ts, loess.ts and partial-sort.ts step for step: the same
 * IEEE double operations in the same order, so it gives the same bits (test/decompose/stl-kernel.test.ts
 * compares every component bit for bit). A fresh process runs WebAssembly compiled before its first call,
 * where the JavaScript would first run interpreted; that start-up is what the kernel is for.
 *
 * One instance per thread (stl-kernel.ts): `reset()` frees the last fit's arrays, `input(n)` gives where the
 * values go, `fit(…)` runs, `output(k)` gives where component k is (0 trend, 1 seasonal, 2 weights). The
 * runtime is the stub, which frees only all at once (reset). Indices are never bounds-checked
 * (compiled with --uncheckedBehavior always): every index below is that of the JavaScript.
 */

// ---------- tricube weights (loess.ts tabulate) ----------

let tw = new Float64Array(64);
let twH: i32 = -1;
let twSize: i32 = 0;

function tabulate(h: i32, maxDist: i32): void {
  if (twH === h && twSize > maxDist) return;
  if (tw.length <= maxDist) tw = new Float64Array(2 * (maxDist + 1));
  const hf = <f64>h;
  const h9 = 0.999 * hf;
  const h1 = 0.001 * hf;
  for (let r = 0; r <= maxDist; r++) {
    const rf = <f64>r;
    if (rf > h9) tw[r] = 0;
    else if (rf <= h1) tw[r] = 1;
    else {
      const q = rf / hf;
      const c = 1 - q * q * q;
      tw[r] = c * c * c;
    }
  }
  twH = h;
  twSize = maxDist + 1;
}

// ---------- one fit (loess.ts fitInto, meanPlain, meanWeighted, line) ----------

function fitInto(
  y: Float64Array,
  n: i32,
  len: i32,
  degree: i32,
  xs: i32,
  nleft: i32,
  nright: i32,
  rw: Float64Array,
  useRw: bool,
  out: Float64Array,
  at: i32,
): void {
  const maxDist = max(xs - nleft, nright - xs);
  let h = maxDist;
  if (len > n) h += (len - n) / 2;
  tabulate(h, maxDist);
  if (degree <= 0 || h <= 0 || (!useRw && xs - nleft === nright - xs)) {
    if (!useRw) meanPlain(y, xs, nleft, nright, out, at);
    else meanWeighted(y, xs, nleft, nright, rw, out, at);
  } else line(y, n, xs, nleft, nright, rw, useRw, out, at);
}

function meanPlain(y: Float64Array, xs: i32, nleft: i32, nright: i32, out: Float64Array, at: i32): void {
  let s0: f64 = 0;
  let t0: f64 = 0;
  const mid = min(xs, nright + 1);
  for (let j = nleft; j < mid; j++) {
    const wj = tw[xs - j];
    s0 += wj;
    t0 += wj * y[j];
  }
  for (let j = max(xs, nleft); j <= nright; j++) {
    const wj = tw[j - xs];
    s0 += wj;
    t0 += wj * y[j];
  }
  out[at] = s0 > 0 ? t0 / s0 : NaN;
}

function meanWeighted(
  y: Float64Array,
  xs: i32,
  nleft: i32,
  nright: i32,
  rw: Float64Array,
  out: Float64Array,
  at: i32,
): void {
  let s0: f64 = 0;
  let t0: f64 = 0;
  const mid = min(xs, nright + 1);
  for (let j = nleft; j < mid; j++) {
    const wj = tw[xs - j] * rw[j];
    s0 += wj;
    t0 += wj * y[j];
  }
  for (let j = max(xs, nleft); j <= nright; j++) {
    const wj = tw[j - xs] * rw[j];
    s0 += wj;
    t0 += wj * y[j];
  }
  out[at] = s0 > 0 ? t0 / s0 : NaN;
}

function line(
  y: Float64Array,
  n: i32,
  xs: i32,
  nleft: i32,
  nright: i32,
  rw: Float64Array,
  useRw: bool,
  out: Float64Array,
  at: i32,
): void {
  let s0: f64 = 0;
  let s1: f64 = 0;
  let s2: f64 = 0;
  let t0: f64 = 0;
  let t1: f64 = 0;
  const mid = min(xs, nright + 1);
  for (let j = nleft; j < mid; j++) {
    const d = <f64>(j - xs);
    const wj = useRw ? tw[xs - j] * rw[j] : tw[xs - j];
    const wd = wj * d;
    const wy = wj * y[j];
    s0 += wj;
    s1 += wd;
    s2 += wd * d;
    t0 += wy;
    t1 += wy * d;
  }
  for (let j = max(xs, nleft); j <= nright; j++) {
    const d = <f64>(j - xs);
    const wj = useRw ? tw[j - xs] * rw[j] : tw[j - xs];
    const wd = wj * d;
    const wy = wj * y[j];
    s0 += wj;
    s1 += wd;
    s2 += wd * d;
    t0 += wy;
    t1 += wy * d;
  }
  if (s0 <= 0) {
    out[at] = NaN;
    return;
  }
  const m = s1 / s0;
  const c = s2 / s0 - m * m;
  if (Math.sqrt(c) > 0.001 * <f64>(n - 1)) {
    const b = -m / c;
    out[at] = (t0 + b * (t1 - m * t0)) / s0;
  } else out[at] = t0 / s0;
}

// ---------- interior fits (loess.ts interiorMean, interiorWeightedMean, interiorLine) ----------

function interiorMean(y: Float64Array, h: i32, out: Float64Array, from: i32, to: i32, step: i32): void {
  let s0 = tw[0];
  for (let r = 1; r <= h; r++) s0 += 2 * tw[r];
  for (let xs = from; xs <= to; xs += step) {
    let t0 = tw[0] * y[xs];
    for (let r = 1; r <= h; r++) t0 += tw[r] * (y[xs - r] + y[xs + r]);
    out[xs] = t0 / s0;
  }
}

function interiorWeightedMean(
  y: Float64Array,
  h: i32,
  rw: Float64Array,
  out: Float64Array,
  from: i32,
  to: i32,
  step: i32,
): void {
  for (let xs = from; xs <= to; xs += step) {
    const w0 = tw[0] * rw[xs];
    let s0 = w0;
    let t0 = w0 * y[xs];
    for (let r = 1; r <= h; r++) {
      const wl = tw[r] * rw[xs - r];
      const wr = tw[r] * rw[xs + r];
      s0 += wl + wr;
      t0 += wl * y[xs - r] + wr * y[xs + r];
    }
    out[xs] = s0 > 0 ? t0 / s0 : y[xs];
  }
}

function interiorLine(
  y: Float64Array,
  n: i32,
  h: i32,
  rw: Float64Array,
  out: Float64Array,
  from: i32,
  to: i32,
  step: i32,
): void {
  const spread = 0.001 * <f64>(n - 1);
  for (let xs = from; xs <= to; xs += step) {
    const w0 = tw[0] * rw[xs];
    let s0 = w0;
    let s1: f64 = 0;
    let s2: f64 = 0;
    let t0 = w0 * y[xs];
    let t1: f64 = 0;
    for (let r = 1; r <= h; r++) {
      const rf = <f64>r;
      const wl = tw[r] * rw[xs - r];
      const wr = tw[r] * rw[xs + r];
      const yl = wl * y[xs - r];
      const yr = wr * y[xs + r];
      const sw = wl + wr;
      s0 += sw;
      s1 += (wr - wl) * rf;
      s2 += sw * rf * rf;
      t0 += yl + yr;
      t1 += (yr - yl) * rf;
    }
    let v = y[xs];
    if (s0 > 0) {
      const m = s1 / s0;
      const c = s2 / s0 - m * m;
      v = Math.sqrt(c) > spread ? (t0 + (-m / c) * (t1 - m * t0)) / s0 : t0 / s0;
    }
    out[xs] = v;
  }
}

// ---------- a smooth (loess.ts loessAt, loessSmooth) ----------

let one = new Float64Array(1);

function loessAt(
  y: Float64Array,
  n: i32,
  len: i32,
  degree: i32,
  xs: i32,
  nleft: i32,
  nright: i32,
  rw: Float64Array,
  useRw: bool,
  offset: i32,
): f64 {
  fitInto(y, n, len, degree, offset + xs, offset + nleft, offset + nright, rw, useRw, one, 0);
  return one[0];
}

/** ⌊a / b⌋ for b > 0 and any sign of a (Math.floor of the JavaScript's division). */
function floorDiv(a: i32, b: i32): i32 {
  return a >= 0 ? a / b : -((-a + b - 1) / b);
}

function loessSmooth(
  y: Float64Array,
  n: i32,
  len: i32,
  degree: i32,
  jump: i32,
  rw: Float64Array,
  useRw: bool,
  out: Float64Array,
  offset: i32,
): void {
  const o = offset;
  if (n < 2) {
    out[o] = y[o];
    return;
  }
  const step = min(jump, n - 1);
  const k = floorDiv(n - 1, step) * step;
  const half = (len + 1) >> 1;
  let nleft = 0;
  let nright = len >= n ? n - 1 : len - 1;
  const h = half - 1;
  let skipFrom = n;
  let skipTo = -1;
  if (len < n && h >= 1) {
    const first = -floorDiv(-(half - 1), step) * step;
    const last = min(k, floorDiv(n - half - 1, step) * step);
    if (first <= last) {
      tabulate(h, h);
      if (!useRw) interiorMean(y, h, out, o + first, o + last, step);
      else if (degree <= 0) interiorWeightedMean(y, h, rw, out, o + first, o + last, step);
      else interiorLine(y, n, h, rw, out, o + first, o + last, step);
      skipFrom = first;
      skipTo = last;
    }
  }
  for (let i = 0; ; ) {
    if (i === skipFrom) {
      i = skipTo;
      nleft = i - h;
      nright = i + h;
      if (i < k) i += step;
      else if (i === k && k !== n - 1) i = n - 1;
      else break;
      continue;
    }
    if (i <= k && len < n) {
      if (step === 1) {
        if (i + 1 > half && nright !== n - 1) {
          nleft++;
          nright++;
        }
      } else {
        const i1 = i + 1;
        nleft = i1 < half ? 0 : i1 >= n - half + 1 ? n - len : i1 - half;
        nright = nleft + len - 1;
      }
    }
    fitInto(y, n, len, degree, o + i, o + nleft, o + nright, rw, useRw, out, o + i);
    const v = out[o + i];
    out[o + i] = Number.isNaN(v) ? y[o + i] : v;
    if (i < k) i += step;
    else if (i === k && k !== n - 1) i = n - 1;
    else break;
  }
  if (step !== 1) {
    for (let a = o, end = o + n - 1, kk = o + k; a < end; ) {
      const b = a + step <= kk ? a + step : end;
      const delta = (out[b] - out[a]) / <f64>(b - a);
      for (let j = a + 1; j < b; j++) out[j] = out[a] + delta * <f64>(j - a);
      a = b;
    }
  }
}

// ---------- STL (stl.ts) ----------

let values = new Float64Array(0);
let trend = new Float64Array(0);
let season = new Float64Array(0);
let rw = new Float64Array(0);
let wa = new Float64Array(0);
let wb = new Float64Array(0);
let wc = new Float64Array(0);
let wd = new Float64Array(0);
let we = new Float64Array(0);
let stride: i32 = 0;

/**
 * Frees everything the last fit allocated, for the next fit on the same instance: the stub runtime's
 * allocator starts again from the heap's base, so the arrays kept between fits (the tricube table, whose
 * cache is emptied, and the sorter's stacks) are made afresh. The series' arrays are made by input() and
 * fit() before any use.
 */
export function reset(): void {
  __reset();
  tw = new Float64Array(64);
  twH = -1;
  twSize = 0;
  one = new Float64Array(1);
  indu = new Int32Array(17);
  indl = new Int32Array(17);
  iu = new Int32Array(17);
  il = new Int32Array(17);
  positions = new Int32Array(2);
}

/** Room for n values; returns where to write them. */
export function input(n: i32): usize {
  values = new Float64Array(n);
  return values.dataStart;
}

/**
 * Where component k of the last fit is: 0 trend, 1 seasonal, 2 weights. The remainder is left to the caller
 * (values − seasonal − trend, as stl.ts has it), so the kernel's memory holds one series fewer.
 */
export function output(k: i32): usize {
  return k === 0 ? trend.dataStart : k === 1 ? season.dataStart : rw.dataStart;
}

/**
 * The fit of stl.ts's stl() for the n values given to input(), with its settings resolved there: np the
 * period (at least 2) and period the one the periodic average uses; ns, nt, nl the windows (odd, ≥ 3).
 */
export function fit(
  n: i32,
  np: i32,
  period: i32,
  periodic: bool,
  ns: i32,
  seasonalDegree: i32,
  seasonalJump: i32,
  nt: i32,
  trendDegree: i32,
  trendJump: i32,
  nl: i32,
  lowpassDegree: i32,
  lowpassJump: i32,
  inner: i32,
  outer: i32,
  trueMedian: bool,
): void {
  let missing = 0;
  const present = new Uint8Array(n);
  for (let i = 0; i < n; i++) {
    if (Number.isFinite(values[i])) present[i] = 1;
    else missing++;
  }
  const y = missing === 0 ? values : new Float64Array(n);
  if (missing > 0) for (let i = 0; i < n; i++) if (present[i] === 1) y[i] = values[i];
  rw = new Float64Array(n);
  for (let i = 0; i < n; i++) rw[i] = <f64>present[i];
  let useWeights = missing > 0 || outer > 0;

  trend = new Float64Array(n);
  season = new Float64Array(n);
  const len = n + 2 * np;
  stride = (n - 1) / np + 3;
  const subLen = max(len, np * stride);
  wa = new Float64Array(len);
  wb = new Float64Array(len);
  wc = new Float64Array(subLen);
  wd = new Float64Array(subLen);
  we = new Float64Array(subLen);
  for (let pass = 0; ; pass++) {
    innerLoop(
      y,
      n,
      np,
      ns,
      nt,
      nl,
      seasonalDegree,
      seasonalJump,
      trendDegree,
      trendJump,
      lowpassDegree,
      lowpassJump,
      inner,
      useWeights,
    );
    if (pass >= outer) break;
    for (let i = 0; i < n; i++) wa[i] = trend[i] + season[i];
    robustnessWeights(y, n, present, trueMedian);
    useWeights = true;
  }
  if (outer <= 0) for (let i = 0; i < n; i++) rw[i] = <f64>present[i];

  if (periodic) {
    const sums = new Float64Array(period);
    const counts = new Float64Array(period);
    for (let i = 0; i < n; i++) {
      sums[i % period] += season[i];
      counts[i % period]++;
    }
    for (let i = 0; i < n; i++) season[i] = sums[i % period] / counts[i % period];
  }
}

function innerLoop(
  y: Float64Array,
  n: i32,
  np: i32,
  ns: i32,
  nt: i32,
  nl: i32,
  seasonalDegree: i32,
  seasonalJump: i32,
  trendDegree: i32,
  trendJump: i32,
  lowpassDegree: i32,
  lowpassJump: i32,
  inner: i32,
  useRw: bool,
): void {
  for (let pass = 0; pass < inner; pass++) {
    for (let i = 0; i < n; i++) wa[i] = y[i] - trend[i];
    cycleSubseries(wa, n, np, ns, seasonalDegree, seasonalJump, useRw, wb);
    movingAverage(wb, n + 2 * np, np, wc);
    movingAverage(wc, n + np + 1, np, wa);
    movingAverage(wa, n + 2, 3, wc);
    loessSmooth(wc, n, nl, lowpassDegree, lowpassJump, rw, false, wa, 0);
    for (let i = 0; i < n; i++) {
      const v = wb[np + i] - wa[i];
      season[i] = v;
      wa[i] = y[i] - v;
    }
    loessSmooth(wa, n, nt, trendDegree, trendJump, rw, useRw, trend, 0);
  }
}

function cycleSubseries(
  y: Float64Array,
  n: i32,
  np: i32,
  ns: i32,
  degree: i32,
  jump: i32,
  useRw: bool,
  out: Float64Array,
): void {
  const sub = wc;
  const subW = wd;
  const fitted = we;
  for (let base = 0, m = 1; base < n; base += np, m++) {
    const top = min(np, n - base);
    for (let j = 0, at = m; j < top; j++, at += stride) sub[at] = y[base + j];
    if (useRw) for (let j = 0, at = m; j < top; j++, at += stride) subW[at] = rw[base + j];
  }
  for (let j = 0; j < np; j++) {
    const k = (n - 1 - j) / np + 1;
    const at = j * stride + 1;
    loessSmooth(sub, k, ns, degree, jump, subW, useRw, fitted, at);
    const first = loessAt(sub, k, ns, degree, -1, 0, min(ns, k) - 1, subW, useRw, at);
    fitted[at - 1] = Number.isNaN(first) ? fitted[at] : first;
    const last = loessAt(sub, k, ns, degree, k, max(0, k - ns), k - 1, subW, useRw, at);
    fitted[at + k] = Number.isNaN(last) ? fitted[at + k - 1] : last;
  }
  const total = n + 2 * np;
  for (let base = 0, m = 0; base < total; base += np, m++) {
    const top = min(np, total - base);
    for (let j = 0, at = m; j < top; j++, at += stride) out[base + j] = fitted[at];
  }
}

function movingAverage(x: Float64Array, n: i32, len: i32, ave: Float64Array): void {
  const newn = n - len + 1;
  const lf = <f64>len;
  let v: f64 = 0;
  for (let i = 0; i < len; i++) v += x[i];
  ave[0] = v / lf;
  for (let j = 1, k = len, m = 0; j < newn; j++, k++, m++) {
    v = v - x[m] + x[k];
    ave[j] = v / lf;
  }
}

/** stl.ts robustnessWeights with fit = wa and scratch = wb. */
function robustnessWeights(y: Float64Array, n: i32, present: Uint8Array, trueMedian: bool): void {
  const fit = wa;
  const abs = wb;
  let count = 0;
  for (let i = 0; i < n; i++) if (present[i] !== 0) abs[count++] = Math.abs(y[i] - fit[i]);
  const hi = count >> 1;
  const lo = count - hi - 1;
  let upper: f64 = NaN;
  let lower: f64 = NaN;
  if (count > 0) {
    if (trueMedian) {
      upper = select(abs, count, hi);
      lower = upper;
      if (lo !== hi) {
        lower = -Infinity;
        for (let i = 0; i < hi; i++) if (abs[i] > lower) lower = abs[i];
      }
    } else {
      partialSort(abs, count, hi + 1, lo + 1);
      upper = abs[hi];
      lower = abs[lo];
    }
  }
  const cmad = 3 * (upper + lower);
  const c9 = 0.999 * cmad;
  const c1 = 0.001 * cmad;
  for (let i = 0; i < n; i++) {
    const e = Math.abs(y[i] - fit[i]);
    const u = e / cmad;
    const t = 1 - u * u;
    rw[i] = present[i] === 0 ? 0 : e <= c1 ? 1 : e <= c9 ? t * t : 0;
  }
}

function select(a: Float64Array, length: i32, k: i32): f64 {
  let left = 0;
  let right = length - 1;
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

// ---------- partial-sort.ts (Singleton 1969, as STL's reference Fortran applies it) ----------

let indu = new Int32Array(17);
let indl = new Int32Array(17);
let iu = new Int32Array(17);
let il = new Int32Array(17);
let positions = new Int32Array(2);

const OUTER = 0;
const POP = 1;
const LOOP = 2;
const SPLIT = 3;
const SMALL = 4;

function partialSort(a: Float64Array, n: i32, p1: i32, p2: i32): void {
  positions[0] = p1;
  positions[1] = p2;
  const ni = 2;
  if (n < 2) return;
  let jl = 1;
  let ju = ni;
  indl[1] = 1;
  indu[1] = ni;
  let i = 1;
  let j = n;
  let m = 1;
  let k = 0;
  let l = 0;
  let t: f64 = 0;
  let state = OUTER;
  for (;;) {
    if (state === OUTER) {
      state = i < j ? SPLIT : POP;
    } else if (state === POP) {
      m--;
      if (m === 0) return;
      i = il[m];
      j = iu[m];
      jl = indl[m];
      ju = indu[m];
      state = jl <= ju ? LOOP : POP;
    } else if (state === LOOP) {
      state = j - i > 10 ? SPLIT : SMALL;
    } else if (state === SPLIT) {
      k = i;
      const ij = (i + j) >> 1;
      t = a[ij - 1];
      if (a[i - 1] > t) {
        a[ij - 1] = a[i - 1];
        a[i - 1] = t;
        t = a[ij - 1];
      }
      l = j;
      if (a[j - 1] < t) {
        a[ij - 1] = a[j - 1];
        a[j - 1] = t;
        t = a[ij - 1];
        if (a[i - 1] > t) {
          a[ij - 1] = a[i - 1];
          a[i - 1] = t;
          t = a[ij - 1];
        }
      }
      for (;;) {
        l--;
        if (a[l - 1] <= t) {
          const tt = a[l - 1];
          do k++;
          while (!(a[k - 1] >= t));
          if (k > l) break;
          a[l - 1] = a[k - 1];
          a[k - 1] = tt;
        }
      }
      indl[m] = jl;
      indu[m] = ju;
      const p = m;
      m++;
      let popped = false;
      if (l - i <= j - k) {
        il[p] = k;
        iu[p] = j;
        j = l;
        for (;;) {
          if (jl > ju) {
            popped = true;
            break;
          }
          if (positions[ju - 1] > j) ju--;
          else break;
        }
        if (!popped) indl[p] = ju + 1;
      } else {
        il[p] = i;
        iu[p] = l;
        i = k;
        for (;;) {
          if (jl > ju) {
            popped = true;
            break;
          }
          if (positions[jl - 1] < i) jl++;
          else break;
        }
        if (!popped) indu[p] = jl - 1;
      }
      state = popped ? POP : LOOP;
    } else {
      if (i !== 1) {
        i--;
        for (;;) {
          i++;
          if (i === j) break;
          const v = a[i];
          if (a[i - 1] > v) {
            let q = i;
            do {
              a[q] = a[q - 1];
              q--;
            } while (!(v >= a[q - 1]));
            a[q] = v;
          }
        }
        state = POP;
      } else state = OUTER;
    }
  }
}
