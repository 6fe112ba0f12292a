/**
 * The local regression (loess) smoother inside STL: tricube neighbourhood weights, optional robustness
 * weights, local degree 0 (weighted mean) or 1 (weighted line), and the "jump" speed-up that fits every
 * jump-th point and interpolates linearly between them.
 * Source: Cleveland, Cleveland, McRae & Terpenning (1990), "STL: A Seasonal-Trend Decomposition Procedure
 * Based on Loess", Journal of Official Statistics 6(1), 3–73, §2 and the appendix's routines est and ess;
 * written to give the same numbers as that Fortran (as shipped with R's stats::stl).
 * Positions are 0-based here; the fitted position xs may lie outside 0…n−1 (STL extrapolates one cycle
 * each side).
 */

/**
 * Fits the local regression at position xs from the points nleft…nright (inclusive) of y.
 * Returns NaN when every weight is zero. `w` is scratch space of length ≥ n.
 */
export function loessAt(
  y: Float64Array,
  n: number,
  len: number,
  degree: number,
  xs: number,
  nleft: number,
  nright: number,
  w: Float64Array,
  rw: Float64Array | null,
): number {
  const range = n - 1;
  let h = Math.max(xs - nleft, nright - xs);
  if (len > n) h += Math.floor((len - n) / 2);
  const h9 = 0.999 * h;
  const h1 = 0.001 * h;
  let a = 0;
  for (let j = nleft; j <= nright; j++) {
    let wj = 0;
    const r = Math.abs(j - xs);
    if (r <= h9) {
      if (r <= h1) wj = 1;
      else {
        const q = r / h;
        const t = 1 - q * q * q;
        wj = t * t * t;
      }
      if (rw !== null) wj *= rw[j];
      a += wj;
    }
    w[j] = wj;
  }
  if (a <= 0) return Number.NaN;
  for (let j = nleft; j <= nright; j++) w[j] /= a;
  if (h > 0 && degree > 0) {
    let mean = 0;
    for (let j = nleft; j <= nright; j++) mean += w[j] * j;
    let b = xs - mean;
    let c = 0;
    for (let j = nleft; j <= nright; j++) c += w[j] * (j - mean) * (j - mean);
    if (Math.sqrt(c) > 0.001 * range) {
      b /= c;
      for (let j = nleft; j <= nright; j++) w[j] *= b * (j - mean) + 1;
    }
  }
  let ys = 0;
  for (let j = nleft; j <= nright; j++) ys += w[j] * y[j];
  return ys;
}

/**
 * Loess smooth of y (length n) with window len (odd), writing n fitted values into out. Every jump-th
 * point is fitted and the rest interpolated linearly; the last point is always fitted. Where a fit has no
 * weight the value of y is kept.
 */
export function loessSmooth(
  y: Float64Array,
  n: number,
  len: number,
  degree: number,
  jump: number,
  rw: Float64Array | null,
  out: Float64Array,
  work: Float64Array,
): void {
  if (n < 2) {
    out[0] = y[0];
    return;
  }
  const step = Math.min(jump, n - 1);
  let nleft = 0;
  let nright = 0;
  const fitAt = (i: number): void => {
    const v = loessAt(y, n, len, degree, i, nleft, nright, work, rw);
    out[i] = Number.isNaN(v) ? y[i] : v;
  };
  if (len >= n) {
    nleft = 0;
    nright = n - 1;
    for (let i = 0; i < n; i += step) fitAt(i);
  } else if (step === 1) {
    const half = (len + 1) >> 1;
    nleft = 0;
    nright = len - 1;
    for (let i = 0; i < n; i++) {
      // 1-based i+1 > half, as in the Fortran.
      if (i + 1 > half && nright !== n - 1) {
        nleft++;
        nright++;
      }
      fitAt(i);
    }
  } else {
    const half = (len + 1) >> 1;
    for (let i = 0; i < n; i += step) {
      const i1 = i + 1;
      if (i1 < half) {
        nleft = 0;
        nright = len - 1;
      } else if (i1 >= n - half + 1) {
        nleft = n - len;
        nright = n - 1;
      } else {
        nleft = i1 - half;
        nright = len + i1 - half - 1;
      }
      fitAt(i);
    }
  }
  if (step !== 1) {
    for (let i = 0; i < n - step; i += step) {
      const delta = (out[i + step] - out[i]) / step;
      for (let j = i + 1; j < i + step; j++) out[j] = out[i] + delta * (j - i);
    }
    const k = Math.floor((n - 1) / step) * step;
    if (k !== n - 1) {
      fitAt(n - 1);
      if (k !== n - 2) {
        const delta = (out[n - 1] - out[k]) / (n - 1 - k);
        for (let j = k + 1; j < n - 1; j++) out[j] = out[k] + delta * (j - k);
      }
    }
  }
}
