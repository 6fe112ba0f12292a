/**
 * The exact gradient of fitArima's objective ½·(log(Σ vₜ²/Fₜ / N) + Σ log Fₜ / N) — the concentrated exact
 * Gaussian log-likelihood of a zero-mean stationary ARMA series with no missing values, as computed by the
 * Chandrasekhar recursions of arma-chandrasekhar.ts — in the expanded AR and MA coefficients (phi, theta)
 * and in the data x (for regression coefficients: x = y − Xβ gives ∂/∂βⱼ = −Σₜ x̄ₜ Xⱼₜ). Reverse-mode
 * differentiation (the adjoint of each assignment, in reverse order) through the recursions, the start
 * F₁, G₁ = T·P₁·Z′ and w₁ = G₁/F₁, the first column of the initial covariance, the ψ weights and the
 * autocovariance system (adjoint of A·γ = c: λ = A⁻ᵀγ̄, c̄ = λ, φ̄ⱼ = Σₖ λₖ γ(|k − j|), in O(p²) through the
 * step-down that solved it, stepDownAdjoint in arma-autocovariance.ts). The settling test
 * of the filter is a branch, not differentiated: after it the gain is held fixed, as in the value.
 * Source: derived here by the chain rule (Griewank & Walther, Evaluating Derivatives, 2nd ed. (2008),
 * ch. 3, reverse mode) on the recursions of Morf, Sidhu & Kailath (1974) as written by Herbst (2015),
 * Computational Economics 45, 693–705, §2; the same score as Durbin & Koopman (2012), §7.3.3, computed
 * without the smoother. Its cost is about three likelihood evaluations, whatever the number of coefficients.
 *
 *   white noise on [1, 2] (phi = theta = []): objective ½ log(5/2); ∂/∂x = x / Σx² = [0.2, 0.4]
 */
import { type AutocovarianceWork, solveDense, stepDownAdjoint } from './arma-autocovariance.js';
import { type ChandrasekharWork, chandrasekharStart, chandrasekharWork } from './arma-chandrasekhar.js';
import { adjointByKernel, recordByKernel } from './likelihood-kernel.js';

/** Scratch of one fit: the recursions' record (rows of size + 1 per step) and the adjoints. */
export interface LikelihoodGradientWork {
  n: number;
  size: number;
  filter: ChandrasekharWork;
  /** Gₜ and wₜ, row t for step t (row n after the last). */
  G: Float64Array;
  w: Float64Array;
  F: Float64Array;
  m: Float64Array;
  v: Float64Array;
  a0: Float64Array;
  a: Float64Array;
  /** Steps before the covariance settled, ssq (of a record kept here) and the count of the recorded value. */
  unsettled: number;
  /** F of the settled steps. */
  settledF: number;
  ssq: number;
  count: number;
  /** 0 where the record is in the arrays here; else the stamp of the likelihood kernel's record (likelihood-kernel.ts). */
  stamp: number;
  /**
   * Adjoints of the state a and of w, each a window sliding back through a longer buffer: the recursions
   * shift both by one place a step (a′ᵢ takes aᵢ₊₁), so moving the window's start down one place does the
   * shift without copying the vector.
   */
  aBar: Float64Array;
  GBar: Float64Array;
  wBar: Float64Array;
  phiBar: Float64Array;
  c0Bar: Float64Array;
  gammaBar: Float64Array;
  psiBar: Float64Array;
  cBar: Float64Array;
  A: Float64Array;
  rhs: Float64Array;
  lambda: Float64Array;
}

/** Scratch for series of up to n values and states of up to `size` elements (contents never carry over). */
export function likelihoodGradientWork(n: number, size: number): LikelihoodGradientWork {
  const s = size + 1;
  const v = () => new Float64Array(s + 1);
  return {
    n,
    size,
    filter: chandrasekharWork(size),
    G: new Float64Array((n + 1) * s),
    w: new Float64Array((n + 1) * s),
    F: new Float64Array(n),
    m: new Float64Array(n),
    v: new Float64Array(n),
    a0: new Float64Array(n),
    a: v(),
    unsettled: 0,
    settledF: Number.NaN,
    ssq: Number.NaN,
    count: 0,
    stamp: 0,
    aBar: new Float64Array(n + s + 2),
    GBar: v(),
    wBar: new Float64Array(n + s + 2),
    phiBar: v(),
    c0Bar: v(),
    gammaBar: v(),
    psiBar: v(),
    cBar: v(),
    A: new Float64Array(s * s),
    rhs: v(),
    lambda: v(),
  };
}

/** The objective and its gradient (armaLikelihoodRecord, then armaLikelihoodAdjoint). */
export function armaLikelihoodGradient(
  x: Float64Array,
  phi: Float64Array,
  theta: Float64Array,
  gPhi: Float64Array,
  gTheta: Float64Array,
  gX: Float64Array,
  work: LikelihoodGradientWork | null = null,
): number {
  const r0 = Math.max(phi.length, theta.length + 1);
  const ws = work && work.size >= r0 && work.n >= x.length ? work : likelihoodGradientWork(x.length, r0);
  const value = armaLikelihoodRecord(x, phi, theta, ws);
  if (Number.isFinite(value)) armaLikelihoodAdjoint(phi, theta, gPhi, gTheta, gX, ws);
  return value;
}

/**
 * The objective, as armaChandrasekhar's sums give it, keeping each step's G, w, F, m, v and a₀ for
 * armaLikelihoodAdjoint (`work` must be large enough: size ≥ max(p, q + 1), n ≥ x.length). NaN where it is
 * not finite. By the likelihood's WebAssembly kernel, which keeps the record in its own memory
 * (likelihood-kernel.ts), the same bits as armaLikelihoodRecordScript; by that JavaScript where the kernel
 * is not built.
 */
export function armaLikelihoodRecord(
  x: Float64Array,
  phiIn: Float64Array,
  theta: Float64Array,
  ws: LikelihoodGradientWork,
): number {
  const k = recordByKernel(x, phiIn, theta);
  if (k === null) return armaLikelihoodRecordScript(x, phiIn, theta, ws);
  ws.count = x.length;
  ws.ssq = Number.NaN;
  ws.stamp = k.stamp;
  ws.unsettled = k.unsettled;
  return k.value;
}

/** The record pass in JavaScript, the record kept in `ws`: the kernel's reference. */
export function armaLikelihoodRecordScript(
  x: Float64Array,
  phiIn: Float64Array,
  theta: Float64Array,
  ws: LikelihoodGradientWork,
): number {
  const n = x.length;
  const r = chandrasekharStart(phiIn, theta, ws.filter);
  ws.count = n;
  ws.ssq = Number.NaN;
  ws.stamp = 0;
  if (!(ws.filter.F > 0) || n === 0) return Number.NaN;
  return recordSteps(x, r, ws);
}

function recordSteps(x: Float64Array, r: number, ws: LikelihoodGradientWork): number {
  const n = x.length;
  const stride = ws.size + 1;
  const { phi, G: G1, w: w1 } = ws.filter;
  const { a, G, w } = ws;
  a.fill(0);
  let F = ws.filter.F;
  for (let i = 0; i < r; i++) {
    G[i] = G1[i];
    w[i] = w1[i];
  }
  w[r] = 0;
  let m = -F;
  let ssq = 0;
  let sumlog = 0;
  let settled = false;
  let t = 0;
  let o = 0;
  // Row t holds the gain before step t; the step writes row t + 1 (w[o + r] stays zero).
  for (; t < n && !settled; t++, o += stride) {
    ws.F[t] = F;
    ws.m[t] = m;
    const a0 = a[0];
    const v = x[t] - a0;
    ws.v[t] = v;
    ws.a0[t] = a0;
    ssq += (v * v) / F;
    sumlog += Math.log(F);
    const kv = v / F;
    const z = w[o];
    const Fn = F + m * z * z;
    const mz = m * z;
    const zf = z / Fn;
    const o1 = o + stride;
    let size = 0;
    for (let i = 0; i < r; i++) {
      const gi = G[o + i];
      a[i] = phi[i] * a0 + a[i + 1] + gi * kv;
      const ui = phi[i] * z + w[o + i + 1];
      const gn = gi + ui * mz;
      G[o1 + i] = gn;
      const wi = ui - gn * zf;
      w[o1 + i] = wi;
      size += wi * wi;
    }
    w[o1 + r] = 0;
    m = (m * Fn) / F;
    F = Fn;
    if (size * Math.abs(m) < 1e-30) settled = true;
  }
  ws.unsettled = t;
  // Settled: the gain of row t, held fixed.
  const logF = Math.log(F);
  for (; t < n; t++) {
    const a0 = a[0];
    const v = x[t] - a0;
    ws.v[t] = v;
    ws.a0[t] = a0;
    ssq += (v * v) / F;
    sumlog += logF;
    const kv = v / F;
    for (let i = 0; i < r; i++) a[i] = phi[i] * a0 + a[i + 1] + G[o + i] * kv;
  }
  if (!(ssq > 0) || !Number.isFinite(ssq) || !Number.isFinite(sumlog)) return Number.NaN;
  ws.ssq = ssq;
  ws.settledF = F;
  return 0.5 * (Math.log(ssq / n) + sumlog / n);
}
/**
 * The gradient at the point armaLikelihoodRecord last recorded in `ws` (the same phi and theta): gPhi[j] =
 * ∂/∂phi[j], gTheta[j] = ∂/∂theta[j], gX[t] = ∂/∂x[t].
 */
export function armaLikelihoodAdjoint(
  phiIn: Float64Array,
  theta: Float64Array,
  gPhi: Float64Array,
  gTheta: Float64Array,
  gX: Float64Array,
  ws: LikelihoodGradientWork,
): void {
  const n = ws.count;
  const p = phiIn.length;
  const r = Math.max(p, theta.length + 1);
  if (ws.stamp !== 0) {
    adjointByKernel(ws.stamp, gPhi, gTheta, gX, n);
    return;
  }
  reverseSteps(n, r, gX, ws);
  startAdjoint(phiIn, theta, r, ws.filter, ws, gTheta);
  for (let j = 0; j < p; j++) gPhi[j] = ws.phiBar[j];
}

/** The reverse steps in JavaScript, down to φ̄ and c̄0 (the kernel's reference): the record is in `ws`. */
function reverseSteps(n: number, r: number, gX: Float64Array, ws: LikelihoodGradientWork): void {
  const stride = ws.size + 1;
  const phi = ws.filter.phi;
  const { G, w, phiBar, c0Bar } = ws;
  const sBar = 0.5 / ws.ssq;
  const lBar = 0.5 / n;
  // ā is aSlide[ab + i] and w̄ is wSlide[wb + i]; each step back lowers ab (wb) by one.
  const aSlide = ws.aBar;
  const wSlide = ws.wBar;
  const GBar = ws.GBar.fill(0);
  phiBar.fill(0);
  const unsettled = ws.unsettled;
  let ab = n;
  let wb = unsettled;
  aSlide.fill(0, ab, ab + r + 1);
  wSlide.fill(0, wb, wb + r + 1);
  // Settled steps: a′ᵢ = φᵢa₀ + aᵢ₊₁ + Gᵢ·v/F with the gain of row `unsettled` and F held fixed; each step
  // adds to φ̄, Ḡ and F̄, and gives x̄ₜ = v̄ and ā (shifted back one place).
  let FBar = 0;
  {
    const f = ws.settledF;
    const go = unsettled * stride;
    for (let t = n - 1; t >= unsettled; t--) {
      const v = ws.v[t];
      const a0 = ws.a0[t];
      const kv = v / f;
      let kvBar = 0;
      let a0Bar = 0;
      for (let i = 0; i < r; i++) {
        const abi = aSlide[ab + i];
        kvBar += abi * G[go + i];
        phiBar[i] += abi * a0;
        GBar[i] += abi * kv;
        a0Bar += abi * phi[i];
      }
      const vBar = (kvBar + 2 * sBar * v) / f;
      gX[t] = vBar;
      ab--;
      aSlide[ab] = a0Bar - vBar;
      FBar += (-(kvBar + sBar * v) * v) / (f * f) + lBar / f;
    }
  }
  // Steps while the covariance changes, last first; GBar, wBar, FBar, mBar hold the adjoints of the step's
  // outputs G′, w′, F′, m′ (F′ = Fn = F + m·z², m′ = m·Fn/F, G′ᵢ = Gᵢ + uᵢ·m·z, w′ᵢ = uᵢ − G′ᵢ·z/Fn,
  // uᵢ = φᵢ·z + wᵢ₊₁, z = w₀), and the state update as above with the step's own G and F.
  let mBar = 0;
  for (let t = unsettled - 1; t >= 0; t--) {
    const o = t * stride;
    const o1 = o + stride;
    const f = ws.F[t];
    const mm = ws.m[t];
    const z = w[o];
    const Fn = f + mm * z * z;
    const mz = mm * z;
    const zf = z / Fn;
    const v = ws.v[t];
    const a0 = ws.a0[t];
    const kv = v / f;
    let zfBar = 0;
    let mzBar = 0;
    let kvBar = 0;
    let a0Bar = 0;
    let zu = 0;
    for (let i = 0; i < r; i++) {
      const ph = phi[i];
      const gi = G[o + i];
      const ui = ph * z + w[o + i + 1];
      const wbi = wSlide[wb + i];
      const abi = aSlide[ab + i];
      zfBar -= wbi * G[o1 + i];
      const gpb = GBar[i] - wbi * zf;
      const ub = wbi + gpb * mz;
      mzBar += gpb * ui;
      phiBar[i] += ub * z + abi * a0;
      zu += ub * ph;
      kvBar += abi * gi;
      a0Bar += abi * ph;
      GBar[i] = gpb + abi * kv;
      // w̄ of the step before, at index i + 1 of the window moved down one place: where w̄ᵢ was.
      wSlide[wb + i] = ub;
    }
    const FnBar = FBar + (mBar * mm) / f - (zfBar * z) / (Fn * Fn);
    const vBar = (kvBar + 2 * sBar * v) / f;
    gX[t] = vBar;
    FBar = (-mBar * mm * Fn) / (f * f) + FnBar + (-(kvBar + sBar * v) * v) / (f * f) + lBar / f;
    wb--;
    wSlide[wb] = zfBar / Fn + mzBar * mm + 2 * FnBar * mm * z + zu;
    mBar = (mBar * Fn) / f + mzBar * z + FnBar * z * z;
    ab--;
    aSlide[ab] = a0Bar - vBar;
  }
  // The start: F₁ = c0₀, m₁ = −F₁, Gᵢ = φᵢ·c0₀ + c0ᵢ₊₁, wᵢ = Gᵢ/F₁ (row 0).
  const F1 = ws.filter.c0[0];
  c0Bar.fill(0);
  for (let i = 0; i < r; i++) {
    GBar[i] += wSlide[wb + i] / F1;
    FBar -= (wSlide[wb + i] * G[i]) / (F1 * F1);
  }
  FBar -= mBar;
  for (let i = 0; i < r; i++) {
    phiBar[i] += GBar[i] * F1;
    c0Bar[0] += GBar[i] * phi[i];
    if (i + 1 < r) c0Bar[i + 1] += GBar[i];
  }
  c0Bar[0] += FBar;
}

/** The adjoint of chandrasekharStart, from c̄0 (the first column of the initial covariance) to φ̄ and θ̄. */
function startAdjoint(
  ph: Float64Array,
  th: Float64Array,
  rr: number,
  fw: ChandrasekharWork,
  gw: LikelihoodGradientWork,
  gT: Float64Array,
): void {
  const p = ph.length;
  const q = th.length;
  const { phiBar, c0Bar, gammaBar, psiBar, cBar } = gw;
  const acv: AutocovarianceWork = fw.acv;
  const gamma = acv.gamma;
  const psi = fw.psi;
  gammaBar.fill(0);
  psiBar.fill(0);
  cBar.fill(0);
  gT.fill(0);
  // c0ᵢ = Σₖ φ_{i+k}·γ(k+1) + θ̃_{i+k}·ψₖ (θ̃₀ = 1)
  for (let i = 0; i < rr; i++) {
    const cb = c0Bar[i];
    if (cb === 0) continue;
    for (let k = 0; i + k < rr; k++) {
      const j = i + k + 1;
      if (j <= p) {
        phiBar[j - 1] += cb * gamma[k + 1];
        gammaBar[k + 1] += cb * ph[j - 1];
      }
      const mi = i + k;
      if (mi >= 1 && mi <= q) gT[mi - 1] += cb * psi[k];
      psiBar[k] += cb * (mi === 0 ? 1 : mi <= q ? th[mi - 1] : 0);
    }
  }
  // The autocovariances: γ(k) = c_k + Σ φⱼγ(k − j) beyond p, and the (p+1)-system below it.
  if (p === 0) {
    for (let k = 0; k <= Math.min(q, rr); k++) cBar[k] += gammaBar[k];
  } else {
    for (let k = rr; k > p; k--) {
      const gb = gammaBar[k];
      if (k <= q) cBar[k] += gb;
      for (let j = 1; j <= p; j++) {
        phiBar[j - 1] += gb * gamma[k - j];
        gammaBar[k - j] += gb * ph[j - 1];
      }
    }
    const mm = p + 1;
    if (acv.steppedDown) {
      // The system was solved by the step-down: its adjoint, in O(p²).
      const lambda = gw.lambda;
      stepDownAdjoint(ph, acv.A, acv.levels, gamma, gammaBar, lambda, phiBar, gw.A);
      for (let k = 0; k <= Math.min(p, q); k++) cBar[k] += lambda[k];
    } else {
      denseAdjoint(ph, p, q, mm, gamma, gammaBar, cBar, phiBar, gw);
    }
  }
  // c_k = Σ_{j=k}^{q} θ̃ⱼ ψ_{j−k}
  for (let k = 0; k <= q; k++) {
    const cb = cBar[k];
    if (cb === 0) continue;
    for (let j = k; j <= q; j++) {
      if (j >= 1) gT[j - 1] += cb * psi[j - k];
      psiBar[j - k] += cb * (j === 0 ? 1 : th[j - 1]);
    }
  }
  // ψⱼ = θ̃ⱼ + Σᵢ φᵢ ψ_{j−i}, j < r
  for (let j = rr - 1; j >= 1; j--) {
    const pb = psiBar[j];
    if (pb === 0) continue;
    if (j <= q) gT[j - 1] += pb;
    for (let i = 1; i <= Math.min(j, p); i++) {
      phiBar[i - 1] += pb * psi[j - i];
      psiBar[j - i] += pb * ph[i - 1];
    }
  }
}

/** The adjoint of the autocovariance system solved by elimination: λ = A⁻ᵀγ̄, c̄ = λ, φ̄ⱼ = Σₖ λₖ γ(|k − j|). */
function denseAdjoint(
  ph: Float64Array,
  p: number,
  q: number,
  mm: number,
  gamma: Float64Array,
  gammaBar: Float64Array,
  cBar: Float64Array,
  phiBar: Float64Array,
  gw: LikelihoodGradientWork,
): void {
  const A = gw.A;
  A.fill(0, 0, mm * mm);
  // Aᵀ: row l, column k holds A[k][l]; A[k][k] = 1, A[k][|k − j|] −= φⱼ.
  for (let k = 0; k < mm; k++) {
    A[k * mm + k] += 1;
    for (let j = 1; j <= p; j++) A[Math.abs(k - j) * mm + k] -= ph[j - 1];
  }
  const lambda = gw.lambda;
  const rhs = gw.rhs;
  for (let k = 0; k < mm; k++) rhs[k] = gammaBar[k];
  solveDense(A, rhs, mm, lambda);
  for (let k = 0; k <= Math.min(p, q); k++) cBar[k] += lambda[k];
  for (let j = 1; j <= p; j++) {
    let s = 0;
    for (let k = 0; k < mm; k++) s += lambda[k] * gamma[Math.abs(k - j)];
    phiBar[j - 1] += s;
  }
}
