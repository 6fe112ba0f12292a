/**
 * Exact Gaussian likelihood sums of a zero-mean stationary ARMA series with no missing values, by the
 * Kalman filter written as Chandrasekhar recursions: with the stationary start, each step's change of the
 * predicted state covariance has rank one, P_{t+1} − P_t = m_t w_t w_t′, so the filter carries F_t, the
 * vector T·P_t·Z′, w_t and m_t instead of P_t, at O(r) cost a step rather than O(r²). Only the first column
 * of the initial covariance is needed: Cov(state_i, x_t) = Σ_k φ_{i+k+1} γ(k+1) + θ_{i+k} ψ_k.
 * Source: Morf, Sidhu & Kailath (1974), "Some new algorithms for recursive estimation in constant, linear,
 * discrete-time systems", IEEE Transactions on Automatic Control 19(4), 315–323; Herbst (2015),
 * Computational Economics 45, 693–705, §2 (the recursions as used here); the same sums as arma-filter.ts.
 *
 *   white noise on [1, 2]: ssq = 5, sumlog = 0, count = 2
 */
import { armaAutocovariance, psiWeights } from './arma-autocovariance.js';
import type { FilterSums } from './arma-filter.js';

export function armaChandrasekhar(
  x: Float64Array,
  phiIn: Float64Array,
  theta: Float64Array,
  residuals: Float64Array | null = null,
): FilterSums {
  const p = phiIn.length;
  const q = theta.length;
  const r = Math.max(p, q + 1);
  const n = x.length;
  const gamma = armaAutocovariance(phiIn, theta, r);
  const psi = psiWeights(phiIn, theta, r);
  // AR coefficients padded with zeros to the state's length, so the loops below need no tests.
  const phi = new Float64Array(r);
  phi.set(phiIn);
  // First column of the initial covariance.
  const c0 = new Float64Array(r);
  for (let i = 0; i < r; i++) {
    let v = 0;
    for (let k = 0; i + k < r; k++) {
      const j = i + k + 1;
      if (j <= p) v += phiIn[j - 1] * gamma[k + 1];
      const mIdx = i + k;
      const th = mIdx === 0 ? 1 : mIdx <= q ? theta[mIdx - 1] : 0;
      v += th * psi[k];
    }
    c0[i] = v;
  }
  let F = c0[0];
  const G = new Float64Array(r);
  const w = new Float64Array(r);
  const u = new Float64Array(r);
  const a = new Float64Array(r);
  for (let i = 0; i < r; i++) G[i] = phi[i] * c0[0] + (i < r - 1 ? c0[i + 1] : 0);
  for (let i = 0; i < r; i++) w[i] = G[i] / F;
  let m = -F;
  let ssq = 0;
  let sumlog = 0;
  let settled = false;
  for (let t = 0; t < n; t++) {
    const v = x[t] - a[0];
    ssq += (v * v) / F;
    sumlog += Math.log(F);
    if (residuals) residuals[t] = v / Math.sqrt(F);
    // a ← T·a + K·v, K = G / F.
    const a0 = a[0];
    const kv = v / F;
    for (let i = 0; i < r - 1; i++) a[i] = phi[i] * a0 + a[i + 1] + G[i] * kv;
    a[r - 1] = phi[r - 1] * a0 + G[r - 1] * kv;
    if (settled) continue;
    const z = w[0];
    for (let i = 0; i < r - 1; i++) u[i] = phi[i] * z + w[i + 1];
    u[r - 1] = phi[r - 1] * z;
    const Fn = F + m * z * z;
    const mz = m * z;
    for (let i = 0; i < r; i++) G[i] += u[i] * mz;
    const zf = z / Fn;
    let size = 0;
    for (let i = 0; i < r; i++) {
      w[i] = u[i] - G[i] * zf;
      size += w[i] * w[i];
    }
    m = (m * Fn) / F;
    F = Fn;
    // Once the covariance no longer changes, F and G stay as they are.
    if (size * Math.abs(m) < 1e-30) settled = true;
  }
  return { ssq, sumlog, count: n };
}
