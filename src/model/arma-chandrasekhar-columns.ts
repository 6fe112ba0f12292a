/**
 * Standardised one-step innovations of several zero-mean stationary ARMA series at once, all under the same
 * model and with no missing values, by the Chandrasekhar recursions of arma-chandrasekhar.ts: the gains and
 * innovation variances Fₜ depend only on the model, so they are worked out once and each column adds only
 * its own state update. Returns Σ log Fₜ; column c's innovations vₜ/√Fₜ are written to out[c]. A regression
 * with ARMA errors needs this for the exact gradient of its likelihood in the regression coefficients: the
 * innovations are linear in the data (Harvey & Phillips 1979), so that gradient is a sum of products of the
 * filtered series and the filtered regressors.
 * Source: Morf, Sidhu & Kailath (1974), IEEE Transactions on Automatic Control 19(4), 315–323; Herbst
 * (2015), Computational Economics 45, 693–705, §2; Harvey & Phillips (1979), "Maximum likelihood estimation
 * of regression models with autoregressive-moving average disturbances", Biometrika 66(1), 49–58.
 *
 *   armaChandrasekharColumns([x, y], phi, theta, [ex, ey]) ≡ armaChandrasekhar(x, …, ex) and (y, …, ey)
 */
import { type ChandrasekharWork, chandrasekharStart, chandrasekharWork } from './arma-chandrasekhar.js';

/** Scratch for `columns` series with states of up to `size` elements (contents never carry over). */
export interface ColumnsWork {
  filter: ChandrasekharWork;
  columns: number;
  /** States, one row of size + 1 per column. */
  a: Float64Array;
  kv: Float64Array;
  a0: Float64Array;
}

export function columnsWork(size: number, columns: number): ColumnsWork {
  return {
    filter: chandrasekharWork(size),
    columns,
    a: new Float64Array(columns * (size + 1)),
    kv: new Float64Array(columns),
    a0: new Float64Array(columns),
  };
}

export function armaChandrasekharColumns(
  x: readonly Float64Array[],
  phiIn: Float64Array,
  theta: Float64Array,
  out: Float64Array[],
  work: ColumnsWork | null = null,
): number {
  const k = x.length;
  if (k === 0) return 0;
  const n = x[0].length;
  const r0 = Math.max(phiIn.length, theta.length + 1);
  const ws = work && work.filter.size >= r0 && work.columns >= k ? work : columnsWork(r0, k);
  const r = chandrasekharStart(phiIn, theta, ws.filter);
  const { phi, G, w } = ws.filter;
  const stride = ws.filter.size + 1;
  const { a, kv, a0 } = ws;
  a.fill(0, 0, k * stride);
  let F = ws.filter.F;
  let m = -F;
  let sumlog = 0;
  let settled = false;
  let t = 0;
  // While the covariance still changes: each column's state with the old gain, then the gain, as in
  // armaChandrasekhar (a[o + r] stays zero, so the shifted read needs no test).
  for (; t < n && !settled; t++) {
    sumlog += Math.log(F);
    const sd = Math.sqrt(F);
    for (let c = 0; c < k; c++) {
      const v = x[c][t] - a[c * stride];
      out[c][t] = v / sd;
      kv[c] = v / F;
      a0[c] = a[c * stride];
    }
    for (let c = 0; c < k; c++) {
      const o = c * stride;
      const s0 = a0[c];
      const kc = kv[c];
      for (let i = 0; i < r; i++) a[o + i] = phi[i] * s0 + a[o + i + 1] + G[i] * kc;
    }
    const z = w[0];
    const Fn = F + m * z * z;
    const mz = m * z;
    const zf = z / Fn;
    let size = 0;
    for (let i = 0; i < r; i++) {
      const ui = phi[i] * z + w[i + 1];
      const gn = G[i] + ui * mz;
      G[i] = gn;
      const wi = ui - gn * zf;
      w[i] = wi;
      size += wi * wi;
    }
    m = (m * Fn) / F;
    F = Fn;
    if (size * Math.abs(m) < 1e-30) settled = true;
  }
  // Settled: the state updates alone, with the fixed gain.
  const sdF = Math.sqrt(F);
  for (let c = 0; c < k; c++) {
    const o = c * stride;
    const xc = x[c];
    const oc = out[c];
    for (let s = t; s < n; s++) {
      const s0 = a[o];
      const v = xc[s] - s0;
      oc[s] = v / sdF;
      const kc = v / F;
      for (let i = 0; i < r; i++) a[o + i] = phi[i] * s0 + a[o + i + 1] + G[i] * kc;
    }
  }
  sumlog += (n - t) * Math.log(F);
  return sumlog;
}
