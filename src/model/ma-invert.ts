/**
 * An invertible MA polynomial with the same autocovariances: each root of 1 + θ₁z + … + θ_q z^q inside the
 * unit circle is replaced by its reciprocal, and the polynomial multiplied out again. Source: Brockwell &
 * Davis (1991), §4.4 (a non-invertible MA has an invertible twin with the same second-order properties);
 * done as R's stats::arima does after a fit (maInvert). The roots are found by the Durand–Kerner iteration
 * (Kerner 1966, Numerische Mathematik 8, 290–294).
 *
 *   invertMa([2]) → [0.5];  invertMa([0.4]) → [0.4]
 */
export function invertMa(ma: Float64Array): Float64Array {
  let q0 = ma.length;
  while (q0 > 0 && ma[q0 - 1] === 0) q0--;
  if (q0 === 0) return Float64Array.from(ma);
  const { re, im } = polynomialRoots(Float64Array.from([1, ...ma.subarray(0, q0)]));
  let inside = false;
  for (let i = 0; i < q0; i++) if (Math.hypot(re[i], im[i]) < 1) inside = true;
  if (!inside) return Float64Array.from(ma);
  const out = new Float64Array(ma.length);
  if (q0 === 1) {
    out[0] = 1 / ma[0];
    return out;
  }
  for (let i = 0; i < q0; i++) {
    const m2 = re[i] * re[i] + im[i] * im[i];
    if (m2 < 1) {
      re[i] = re[i] / m2;
      im[i] = -im[i] / m2;
    }
  }
  // x ← (x, 0) − (0, x)/r for each root r: the polynomial Π (1 − z/r) with constant term 1.
  let xr = [1];
  let xi = [0];
  for (let k = 0; k < q0; k++) {
    const m2 = re[k] * re[k] + im[k] * im[k];
    const ir = re[k] / m2;
    const ii = -im[k] / m2;
    const nr = new Array<number>(xr.length + 1).fill(0);
    const ni = new Array<number>(xr.length + 1).fill(0);
    for (let j = 0; j < xr.length; j++) {
      nr[j] += xr[j];
      ni[j] += xi[j];
      nr[j + 1] -= xr[j] * ir - xi[j] * ii;
      ni[j + 1] -= xr[j] * ii + xi[j] * ir;
    }
    xr = nr;
    xi = ni;
  }
  for (let i = 0; i < q0; i++) out[i] = xr[i + 1];
  return out;
}

/** Roots of c[0] + c[1]z + … + c[n]zⁿ (c[n] ≠ 0) by the Durand–Kerner iteration. */
export function polynomialRoots(c: Float64Array): { re: Float64Array; im: Float64Array } {
  let n = c.length - 1;
  while (n > 0 && c[n] === 0) n--;
  const re = new Float64Array(n);
  const im = new Float64Array(n);
  if (n === 0) return { re, im };
  const lead = c[n];
  // Start on a circle of the Cauchy bound's radius, at angles that are not symmetric about the real axis.
  let radius = 0;
  for (let i = 0; i < n; i++) radius = Math.max(radius, Math.abs(c[i] / lead));
  radius = 1 + radius;
  for (let i = 0; i < n; i++) {
    const angle = (2 * Math.PI * i) / n + 0.4;
    re[i] = radius * Math.cos(angle);
    im[i] = radius * Math.sin(angle);
  }
  for (let iter = 0; iter < 500; iter++) {
    let change = 0;
    for (let i = 0; i < n; i++) {
      // p(z)/lead by Horner.
      let pr = 1;
      let pi = 0;
      for (let k = n - 1; k >= 0; k--) {
        const tr = pr * re[i] - pi * im[i] + c[k] / lead;
        pi = pr * im[i] + pi * re[i];
        pr = tr;
      }
      let dr = 1;
      let di = 0;
      for (let j = 0; j < n; j++) {
        if (j === i) continue;
        const ar = re[i] - re[j];
        const ai = im[i] - im[j];
        const tr = dr * ar - di * ai;
        di = dr * ai + di * ar;
        dr = tr;
      }
      const m2 = dr * dr + di * di;
      const qr = (pr * dr + pi * di) / m2;
      const qi = (pi * dr - pr * di) / m2;
      re[i] -= qr;
      im[i] -= qi;
      change = Math.max(change, Math.hypot(qr, qi) / Math.max(1, Math.hypot(re[i], im[i])));
    }
    if (change < 1e-14) break;
  }
  return { re, im };
}
