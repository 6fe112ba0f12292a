/**
 * Residuals of the least-squares regression of y on a constant and the given columns, NaN where y is
 * missing. The differencing tests of an automatic model search with regressors run on these residuals, not
 * on y (Hyndman & Khandakar 2008, §3.2, as forecast::auto.arima does with xreg: the residuals of
 * lm(y ~ xreg)), so a level shift carried by a regressor is not mistaken for a unit root.
 * Source: least squares by the normal equations, e.g. Seber & Lee, Linear Regression Analysis, 2nd ed.
 * (2003), §3.1. Columns that are exactly collinear with earlier ones are dropped (their coefficient is 0).
 *
 *   regressionResiduals([1, 2, 10, 11], [[0, 0, 1, 1]]) → [−0.5, 0.5, −0.5, 0.5]
 */
export function regressionResiduals(y: Float64Array, cols: Float64Array[]): Float64Array {
  const n = y.length;
  const X = [new Float64Array(n).fill(1), ...cols];
  // Gram–Schmidt with reorthogonalisation over the observed rows: stable, and collinear columns drop out.
  const r = new Float64Array(n);
  const basis: Float64Array[] = [];
  const observed = (t: number) => !Number.isNaN(y[t]);
  const dot = (a: Float64Array, b: Float64Array) => {
    let s = 0;
    for (let t = 0; t < n; t++) if (observed(t)) s += a[t] * b[t];
    return s;
  };
  for (const col of X) {
    const v = Float64Array.from(col);
    for (let pass = 0; pass < 2; pass++) {
      for (const b of basis) {
        const c = dot(v, b);
        for (let t = 0; t < n; t++) v[t] -= c * b[t];
      }
    }
    const norm = Math.sqrt(dot(v, v));
    const scale = Math.sqrt(dot(col, col));
    if (!(norm > 1e-10 * Math.max(scale, 1e-300))) continue;
    for (let t = 0; t < n; t++) v[t] /= norm;
    basis.push(v);
  }
  for (let t = 0; t < n; t++) r[t] = observed(t) ? y[t] : Number.NaN;
  for (const b of basis) {
    const c = dot(r, b);
    for (let t = 0; t < n; t++) if (observed(t)) r[t] -= c * b[t];
  }
  return r;
}
