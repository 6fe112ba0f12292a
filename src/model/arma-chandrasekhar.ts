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
import { type AutocovarianceWork, armaAutocovariance, autocovarianceWork, psiWeights } from './arma-autocovariance.js';
import type { FilterSums } from './arma-filter.js';
import { valueByKernel } from './likelihood-kernel.js';

/** Scratch arrays of one fit, reused from call to call (their contents never carry over). */
export interface ChandrasekharWork {
  size: number;
  phi: Float64Array;
  c0: Float64Array;
  G: Float64Array;
  w: Float64Array;
  a: Float64Array;
  psi: Float64Array;
  acv: AutocovarianceWork;
  /** F₁, the first innovation's variance, set by chandrasekharStart. */
  F: number;
}

/** Scratch for states of up to `size` elements. */
export function chandrasekharWork(size: number): ChandrasekharWork {
  // One element more than the state, kept zero, so the fused loop below needs no test at its last index.
  const v = () => new Float64Array(size + 1);
  return { size, phi: v(), c0: v(), G: v(), w: v(), a: v(), psi: v(), acv: autocovarianceWork(size), F: 0 };
}

/**
 * The recursions' start for the model (phi, theta): the AR coefficients padded to the state's length, the
 * first column of the initial covariance (c0), G₁ = T·P₁·Z′, w₁ = G₁ / F₁ and F₁, written into `work` when it
 * is large enough (nothing is written otherwise). Returns the state's length r.
 */
export function chandrasekharStart(phiIn: Float64Array, theta: Float64Array, work: ChandrasekharWork | null): number {
  const p = phiIn.length;
  const q = theta.length;
  const r = Math.max(p, q + 1);
  if (!work || work.size < r) return r;
  const gamma = armaAutocovariance(phiIn, theta, r, work.acv);
  const psi = psiWeights(phiIn, theta, r, work.psi);
  // AR coefficients padded with zeros to the state's length, so the loops need no tests.
  const { phi, c0, G, w } = work;
  phi.fill(0, 0, r + 1);
  phi.set(phiIn);
  // First column of the initial covariance.
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
  c0[r] = 0;
  const F = c0[0];
  for (let i = 0; i < r; i++) G[i] = phi[i] * c0[0] + c0[i + 1];
  for (let i = 0; i < r; i++) w[i] = G[i] / F;
  w[r] = 0;
  work.F = F;
  return r;
}

/**
 * The sums by the likelihood's WebAssembly kernel (likelihood-kernel.ts), the same bits as
 * armaChandrasekharScript (start included); by that JavaScript where the kernel is not built.
 */
export function armaChandrasekhar(
  x: Float64Array,
  phiIn: Float64Array,
  theta: Float64Array,
  residuals: Float64Array | null = null,
  work: ChandrasekharWork | null = null,
): FilterSums {
  return valueByKernel(x, phiIn, theta, residuals) ?? armaChandrasekharScript(x, phiIn, theta, residuals, work);
}

/** The sums in JavaScript: the kernel's reference, and the fit where the kernel is not built. */
export function armaChandrasekharScript(
  x: Float64Array,
  phiIn: Float64Array,
  theta: Float64Array,
  residuals: Float64Array | null = null,
  work: ChandrasekharWork | null = null,
): FilterSums {
  const r = chandrasekharStart(phiIn, theta, work);
  const ws = work && work.size >= r ? work : chandrasekharWork(r);
  if (ws !== work) chandrasekharStart(phiIn, theta, ws);
  return chandrasekharSteps(x, r, ws, residuals);
}

/** The recursions from the start chandrasekharStart wrote into ws. */
function chandrasekharSteps(
  x: Float64Array,
  r: number,
  ws: ChandrasekharWork,
  residuals: Float64Array | null,
): FilterSums {
  const n = x.length;
  const { phi, G, w, a } = ws;
  let F = ws.F;
  a.fill(0, 0, r + 1);
  let m = -F;
  let ssq = 0;
  let sumlog = 0;
  let settled = false;
  let t = 0;
  // While the covariance still changes: one pass over the state a step updates a (with the old gain),
  // then G, w (u = T·w is formed on the fly; w[i + 1] is read before it is overwritten).
  for (; t < n && !settled; t++) {
    const v = x[t] - a[0];
    ssq += (v * v) / F;
    sumlog += Math.log(F);
    if (residuals) residuals[t] = v / Math.sqrt(F);
    const a0 = a[0];
    const kv = v / F;
    const z = w[0];
    const Fn = F + m * z * z;
    const mz = m * z;
    const zf = z / Fn;
    let size = 0;
    for (let i = 0; i < r; i++) {
      const gi = G[i];
      a[i] = phi[i] * a0 + a[i + 1] + gi * kv;
      const ui = phi[i] * z + w[i + 1];
      const gn = gi + ui * mz;
      G[i] = gn;
      const wi = ui - gn * zf;
      w[i] = wi;
      size += wi * wi;
    }
    m = (m * Fn) / F;
    F = Fn;
    // Once the covariance no longer changes, F and G stay as they are.
    if (size * Math.abs(m) < 1e-30) settled = true;
  }
  // Settled: the state update alone, with fixed gain G / F.
  const logF = Math.log(F);
  const sdF = Math.sqrt(F);
  for (; t < n; t++) {
    const v = x[t] - a[0];
    ssq += (v * v) / F;
    sumlog += logF;
    if (residuals) residuals[t] = v / sdF;
    const a0 = a[0];
    const kv = v / F;
    for (let i = 0; i < r; i++) a[i] = phi[i] * a0 + a[i + 1] + G[i] * kv;
  }
  return { ssq, sumlog, count: n };
}
