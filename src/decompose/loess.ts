/**
 * The local regression (loess) smoother inside STL: tricube neighbourhood weights, optional robustness
 * weights, local degree 0 (weighted mean) or 1 (weighted line), and the "jump" speed-up that fits every
 * jump-th point and interpolates linearly between them.
 * Source: Cleveland, Cleveland, McRae & Terpenning (1990), "STL: A Seasonal-Trend Decomposition Procedure
 * Based on Loess", Journal of Official Statistics 6(1), 3–73, §2 and the appendix's routines est and ess;
 * written to give the same numbers as that Fortran (as shipped with R's stats::stl), to rounding.
 * Positions are 0-based integers here; the fitted position xs may lie outside 0…n−1 (STL extrapolates one
 * cycle each side).
 *
 *   loessAt([1, 2, 4], 3, 3, 0, 1, 0, 2, null) → 2 (h = 1: the ends are at distance h and get weight 0)
 *
 * Speed: the fits write into the output array instead of returning a number (a returned double is boxed
 * on the heap when the call is not inlined, which on long series means hundreds of MB of garbage), and the
 * tricube weights are tabulated once per bandwidth.
 */

/**
 * Tricube weights by integer distance for one bandwidth h, kept between fits: inside a smooth every
 * interior fit has the same h, so each weight is computed once per smooth instead of once per point.
 * The table holds exactly what the per-point formula gives, so the weights are unchanged. One table can
 * serve many smooths (STL passes one through all of its passes: allocating typed arrays is slow).
 */
export interface Tricube {
  h: number;
  size: number;
  w: Float64Array;
  /** One-value output of loessAt. */
  one: Float64Array;
}

export function newTricube(): Tricube {
  return { h: -1, size: 0, w: new Float64Array(64), one: new Float64Array(1) };
}

/** Makes t hold the weights of bandwidth h for distances 0…maxDist. */
function tabulate(t: Tricube, h: number, maxDist: number): void {
  if (t.h === h && t.size > maxDist) return;
  if (t.w.length <= maxDist) t.w = new Float64Array(2 * (maxDist + 1));
  const h9 = 0.999 * h;
  const h1 = 0.001 * h;
  const w = t.w;
  for (let r = 0; r <= maxDist; r++) {
    if (r > h9) w[r] = 0;
    else if (r <= h1) w[r] = 1;
    else {
      const q = r / h;
      const c = 1 - q * q * q;
      w[r] = c * c * c;
    }
  }
  t.h = h;
  t.size = maxDist + 1;
}

/**
 * Writes into out[at] the fit at xs from the points nleft…nright, or NaN when every weight is zero.
 * Degree 1 in one pass: with weights w, sums S0 = Σw, S1 = Σw·d, S2 = Σw·d², T0 = Σw·y, T1 = Σw·d·y over
 * d = j − xs. The Fortran's normalised weights and its slope adjustment w·(1 + b·(j − mean)) then give
 * ys = (T0 + b·(T1 − m·T0)) / S0 with m = S1/S0, c = S2/S0 − m² and b = −m/c: the same estimate, summed
 * in a different order.
 */
function fitInto(
  y: Float64Array,
  n: number,
  len: number,
  degree: number,
  xs: number,
  nleft: number,
  nright: number,
  rw: Float64Array | null,
  t: Tricube,
  out: Float64Array,
  at: number,
): void {
  const maxDist = Math.max(xs - nleft, nright - xs);
  let h = maxDist;
  if (len > n) h += Math.floor((len - n) / 2);
  tabulate(t, h, maxDist);
  // A window centred on xs without robustness weights is symmetric, so the local line's slope term
  // vanishes (m = 0, b = 0) and the fit is the weighted mean.
  if (degree <= 0 || h <= 0 || (rw === null && xs - nleft === nright - xs)) {
    if (rw === null) meanPlain(y, xs, nleft, nright, t.w, out, at);
    else meanWeighted(y, xs, nleft, nright, rw, t.w, out, at);
  } else line(y, n, xs, nleft, nright, rw, t.w, out, at);
}

/** Tricube-weighted mean (local degree 0, or a symmetric window without robustness weights). */
function meanPlain(
  y: Float64Array,
  xs: number,
  nleft: number,
  nright: number,
  tw: Float64Array,
  out: Float64Array,
  at: number,
): void {
  let s0 = 0;
  let t0 = 0;
  // Left of xs, then from xs on: the distance is then a plain difference, with no branch per point.
  const mid = Math.min(xs, nright + 1);
  for (let j = nleft; j < mid; j++) {
    const wj = tw[xs - j];
    s0 += wj;
    t0 += wj * y[j];
  }
  for (let j = Math.max(xs, nleft); j <= nright; j++) {
    const wj = tw[j - xs];
    s0 += wj;
    t0 += wj * y[j];
  }
  out[at] = s0 > 0 ? t0 / s0 : Number.NaN;
}

function meanWeighted(
  y: Float64Array,
  xs: number,
  nleft: number,
  nright: number,
  rw: Float64Array,
  tw: Float64Array,
  out: Float64Array,
  at: number,
): void {
  let s0 = 0;
  let t0 = 0;
  const mid = Math.min(xs, nright + 1);
  for (let j = nleft; j < mid; j++) {
    const wj = tw[xs - j] * rw[j];
    s0 += wj;
    t0 += wj * y[j];
  }
  for (let j = Math.max(xs, nleft); j <= nright; j++) {
    const wj = tw[j - xs] * rw[j];
    s0 += wj;
    t0 += wj * y[j];
  }
  out[at] = s0 > 0 ? t0 / s0 : Number.NaN;
}

/** Local line (degree 1), optionally with robustness weights. */
function line(
  y: Float64Array,
  n: number,
  xs: number,
  nleft: number,
  nright: number,
  rw: Float64Array | null,
  tw: Float64Array,
  out: Float64Array,
  at: number,
): void {
  let s0 = 0;
  let s1 = 0;
  let s2 = 0;
  let t0 = 0;
  let t1 = 0;
  const mid = Math.min(xs, nright + 1);
  for (let j = nleft; j < mid; j++) {
    const d = j - xs;
    const wj = rw === null ? tw[-d] : tw[-d] * rw[j];
    const wd = wj * d;
    const wy = wj * y[j];
    s0 += wj;
    s1 += wd;
    s2 += wd * d;
    t0 += wy;
    t1 += wy * d;
  }
  for (let j = Math.max(xs, nleft); j <= nright; j++) {
    const d = j - xs;
    const wj = rw === null ? tw[d] : tw[d] * rw[j];
    const wd = wj * d;
    const wy = wj * y[j];
    s0 += wj;
    s1 += wd;
    s2 += wd * d;
    t0 += wy;
    t1 += wy * d;
  }
  if (s0 <= 0) {
    out[at] = Number.NaN;
    return;
  }
  const m = s1 / s0;
  const c = s2 / s0 - m * m;
  // The Fortran's test: fit a line only when the positions are spread enough (sqrt(c) > 0.001·range).
  if (Math.sqrt(c) > 0.001 * (n - 1)) {
    const b = -m / c;
    out[at] = (t0 + b * (t1 - m * t0)) / s0;
  } else out[at] = t0 / s0;
}

/**
 * The interior fits of a smooth: positions from, from + step, …, ≤ to, each with the symmetric window
 * xs − h … xs + h, written to out with the value of y kept where a fit has no weight. The sums are those of
 * fitInto, taken a pair of points at a time (xs − r with xs + r, which share the tricube weight): half the
 * loop steps and multiplications, the same estimate to rounding. One function per case, each small enough
 * for the engine to compile soon after a cold start.
 */
function interior(
  y: Float64Array,
  n: number,
  degree: number,
  h: number,
  rw: Float64Array | null,
  tw: Float64Array,
  out: Float64Array,
  from: number,
  to: number,
  step: number,
): void {
  // Without robustness weights a symmetric window's line is its weighted mean (see fitInto).
  if (rw === null) interiorMean(y, h, tw, out, from, to, step);
  else if (degree <= 0) interiorWeightedMean(y, h, rw, tw, out, from, to, step);
  else interiorLine(y, n, h, rw, tw, out, from, to, step);
}

function interiorMean(
  y: Float64Array,
  h: number,
  tw: Float64Array,
  out: Float64Array,
  from: number,
  to: number,
  step: number,
): void {
  // The weights are the same for every fit, and so is their sum (positive: the centre has weight 1).
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
  h: number,
  rw: Float64Array,
  tw: Float64Array,
  out: Float64Array,
  from: number,
  to: number,
  step: number,
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
  n: number,
  h: number,
  rw: Float64Array,
  tw: Float64Array,
  out: Float64Array,
  from: number,
  to: number,
  step: number,
): void {
  const spread = 0.001 * (n - 1);
  for (let xs = from; xs <= to; xs += step) {
    const w0 = tw[0] * rw[xs];
    let s0 = w0;
    let s1 = 0;
    let s2 = 0;
    let t0 = w0 * y[xs];
    let t1 = 0;
    for (let r = 1; r <= h; r++) {
      const wl = tw[r] * rw[xs - r];
      const wr = tw[r] * rw[xs + r];
      const yl = wl * y[xs - r];
      const yr = wr * y[xs + r];
      const sw = wl + wr;
      s0 += sw;
      s1 += (wr - wl) * r;
      s2 += sw * r * r;
      t0 += yl + yr;
      t1 += (yr - yl) * r;
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

/**
 * Fits the local regression at position xs from the points nleft…nright (inclusive) of y.
 * Returns NaN when every weight is zero. The series is y[offset … offset + n − 1] (rw alike); positions
 * are counted from offset.
 */
export function loessAt(
  y: Float64Array,
  n: number,
  len: number,
  degree: number,
  xs: number,
  nleft: number,
  nright: number,
  rw: Float64Array | null,
  table: Tricube = newTricube(),
  offset = 0,
): number {
  fitInto(y, n, len, degree, offset + xs, offset + nleft, offset + nright, rw, table, table.one, 0);
  return table.one[0];
}

/**
 * Loess smooth of y (length n) with window len (odd), writing n fitted values into out. Every jump-th
 * point is fitted and the rest interpolated linearly; the last point is always fitted. Where a fit has no
 * weight the value of y is kept. The series is y[offset … offset + n − 1], its weights rw at the same
 * indices, and the fits go to the same indices of out, so one buffer can hold many series side by side.
 */
export function loessSmooth(
  y: Float64Array,
  n: number,
  len: number,
  degree: number,
  jump: number,
  rw: Float64Array | null,
  out: Float64Array,
  table: Tricube = newTricube(),
  offset = 0,
): void {
  const o = offset;
  if (n < 2) {
    out[o] = y[o];
    return;
  }
  const step = Math.min(jump, n - 1);
  // The fitted points are 0, step, …, k, and also n − 1 when k falls short of it; that last fit keeps the
  // window of the fit before it, as in the Fortran. One loop with one call of the fit, so the compiled
  // code meets every path on the first smooth instead of bailing out later on one it has not seen.
  const k = Math.floor((n - 1) / step) * step;
  const half = (len + 1) >> 1;
  let nleft = 0;
  let nright = len >= n ? n - 1 : len - 1;
  // Fits at half − 1 … n − half − 1 have the symmetric window i − h … i + h (h = half − 1, in every branch
  // of the Fortran): those go to interior(), the ends to fitInto one by one.
  const h = half - 1;
  let skipFrom = n;
  let skipTo = -1;
  if (len < n && h >= 1) {
    const first = Math.ceil((half - 1) / step) * step;
    const last = Math.min(k, Math.floor((n - half - 1) / step) * step);
    if (first <= last) {
      tabulate(table, h, h);
      interior(y, n, degree, h, rw, table.w, out, o + first, o + last, step);
      skipFrom = first;
      skipTo = last;
    }
  }
  for (let i = 0; ; ) {
    if (i === skipFrom) {
      // Carry on after the interior run with the window its last fit used.
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
        // 1-based i+1 > half, as in the Fortran.
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
    fitInto(y, n, len, degree, o + i, o + nleft, o + nright, rw, table, out, o + i);
    // A fit without weight keeps the value of y.
    const v = out[o + i];
    out[o + i] = Number.isNaN(v) ? y[o + i] : v;
    if (i < k) i += step;
    else if (i === k && k !== n - 1) i = n - 1;
    else break;
  }
  // Straight lines between consecutive fitted points: a … a + step, and at the end k … n − 1. One loop
  // for both, so no smooth takes a path the compiled code has not met.
  if (step !== 1) {
    for (let a = o, end = o + n - 1, kk = o + k; a < end; ) {
      const b = a + step <= kk ? a + step : end;
      const delta = (out[b] - out[a]) / (b - a);
      for (let j = a + 1; j < b; j++) out[j] = out[a] + delta * (j - a);
      a = b;
    }
  }
}
