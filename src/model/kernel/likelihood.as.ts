/**
 * The Chandrasekhar recursions of the exact ARMA likelihood (Morf, Sidhu & Kailath 1974; Herbst 2015,
 * Computational Economics 45, 693–705, §2) as a WebAssembly kernel, written in AssemblyScript and compiled
 * by `npm run build` (scripts/kernels.mjs) into dist/model/likelihood-kernel.wasm. It is the step loops of
 * arma-chandrasekhar.ts (armaChandrasekharScript) and arma-likelihood-gradient.ts
 * (armaLikelihoodRecordScript and the reverse steps of armaLikelihoodAdjoint) step for step: the same IEEE
 * double operations in the same order, and the host's own Math.log (imported, since a logarithm of our own
 * could differ from V8's in the last place), so it gives the same bits (test/model/likelihood-kernel.test.ts).
 * The start (autocovariances, ψ weights, G₁, w₁, F₁) and its adjoint stay in JavaScript; the loader
 * (likelihood-kernel.ts) copies them in.
 *
 * One long-lived instance per thread: `reserve(n, s)` lays the memory out for series of up to n values and
 * states of up to s elements, growing it when needed, and `at(k)` says where region k is. No allocation
 * happens here (the stub runtime is never used): every array is a region of the memory above the heap base.
 * `record` keeps each step's G, w, F, m, v and a₀ (and φ) for `adjoint`, which must follow for the same point;
 * `value` uses regions of its own (but the series' and the state's), so it may run in between.
 */

// Imported from the host (likelihood-kernel.ts gives Math.log): the module is this file's name.
declare function hostLog(x: f64): f64;

// Regions (byte addresses), set by reserve().
let X: usize = 0; // the series, n
let PHI: usize = 0; // AR coefficients padded with zeros, s + 1
let G: usize = 0; // Gₜ, row t of r + 1 for step t, (n + 1)·(s + 1)
let W: usize = 0; // wₜ likewise
let FR: usize = 0; // Fₜ of the unsettled steps, n
let MR: usize = 0; // mₜ likewise
let VR: usize = 0; // innovations vₜ, n
let A0R: usize = 0; // a₀ before step t, n
let A: usize = 0; // the state, s + 2
let ASL: usize = 0; // ā, a window sliding back, n + s + 2
let WSL: usize = 0; // w̄ likewise
let GBAR: usize = 0; // Ḡ, s + 1
let PHIBAR: usize = 0; // φ̄, s + 1
let C0BAR: usize = 0; // c̄0, s + 1
let GX: usize = 0; // ∂/∂x, n
let VPHI: usize = 0; // φ of the value-only pass (which leaves the record alone), s + 1
let VG: usize = 0; // G of the value-only pass, s + 2
let VW: usize = 0; // w likewise
let RES: usize = 0; // standardised residuals, n
let OUT: usize = 0; // 0 ssq, 1 sumlog (value-only pass)
let capN: i32 = -1;
let capS: i32 = -1;

// What record() leaves for adjoint().
let recN: i32 = 0;
let recR: i32 = 0;
let recUnsettled: i32 = 0;
let recSsq: f64 = NaN;
let recSettledF: f64 = NaN;

function ld(base: usize, i: i32): f64 {
  return load<f64>(base + ((<usize>i) << 3));
}

function st(base: usize, i: i32, v: f64): void {
  store<f64>(base + ((<usize>i) << 3), v);
}

let next: usize = 0;

function take(len: i32): usize {
  const at = next;
  next += (<usize>len) << 3;
  return at;
}

/** Lays the memory out for up to n values and states of up to s elements; false if it cannot grow. */
export function reserve(n: i32, s: i32): bool {
  if (n <= capN && s <= capS) return true;
  const s1 = s + 1;
  next = (__heap_base + 15) & ~(<usize>15);
  X = take(n);
  PHI = take(s1);
  G = take((n + 1) * s1);
  W = take((n + 1) * s1);
  FR = take(n);
  MR = take(n);
  VR = take(n);
  A0R = take(n);
  A = take(s + 2);
  ASL = take(n + s + 2);
  WSL = take(n + s + 2);
  GBAR = take(s1);
  PHIBAR = take(s1);
  C0BAR = take(s1);
  GX = take(n);
  VPHI = take(s1);
  VG = take(s + 2);
  VW = take(s + 2);
  RES = take(n);
  OUT = take(4);
  const pages = <i32>((next + 0xffff) >> 16);
  const have = memory.size();
  if (pages > have && memory.grow(pages - have) < 0) return false;
  capN = n;
  capS = s;
  return true;
}

/** Where region k is: 0 x, 1 φ, 2 G (row 0: G₁), 3 w (row 0: w₁), 4 ∂/∂x, 5 φ̄, 6 c̄0, 7 value-only G, 8 value-only w, 9 residuals, 10 out, 11 value-only φ. */
export function at(k: i32): usize {
  switch (k) {
    case 0:
      return X;
    case 1:
      return PHI;
    case 2:
      return G;
    case 3:
      return W;
    case 4:
      return GX;
    case 5:
      return PHIBAR;
    case 6:
      return C0BAR;
    case 7:
      return VG;
    case 8:
      return VW;
    case 9:
      return RES;
    case 11:
      return VPHI;
    default:
      return OUT;
  }
}

/**
 * armaLikelihoodRecordScript's steps after the start: x, φ, G₁ (row 0 of G) and w₁ (row 0 of w) are in
 * place. Returns the objective, NaN where it is not finite.
 */
export function record(n: i32, r: i32, F1: f64): f64 {
  const stride = r + 1;
  for (let i = 0; i <= r; i++) st(A, i, 0);
  let F = F1;
  st(W, r, 0);
  let m = -F;
  let ssq: f64 = 0;
  let sumlog: f64 = 0;
  let settled = false;
  let t = 0;
  let o = 0;
  recN = n;
  recR = r;
  recSsq = NaN;
  for (; t < n && !settled; t++, o += stride) {
    st(FR, t, F);
    st(MR, t, m);
    const a0 = ld(A, 0);
    const v = ld(X, t) - a0;
    st(VR, t, v);
    st(A0R, t, a0);
    ssq += (v * v) / F;
    sumlog += hostLog(F);
    const kv = v / F;
    const z = ld(W, o);
    const Fn = F + m * z * z;
    const mz = m * z;
    const zf = z / Fn;
    const o1 = o + stride;
    let size: f64 = 0;
    for (let i = 0; i < r; i++) {
      const gi = ld(G, o + i);
      const ph = ld(PHI, i);
      st(A, i, ph * a0 + ld(A, i + 1) + gi * kv);
      const ui = ph * z + ld(W, o + i + 1);
      const gn = gi + ui * mz;
      st(G, o1 + i, gn);
      const wi = ui - gn * zf;
      st(W, o1 + i, wi);
      size += wi * wi;
    }
    st(W, o1 + r, 0);
    m = (m * Fn) / F;
    F = Fn;
    if (size * Math.abs(m) < 1e-30) settled = true;
  }
  recUnsettled = t;
  const logF = hostLog(F);
  for (; t < n; t++) {
    const a0 = ld(A, 0);
    const v = ld(X, t) - a0;
    st(VR, t, v);
    st(A0R, t, a0);
    ssq += (v * v) / F;
    sumlog += logF;
    const kv = v / F;
    for (let i = 0; i < r; i++) st(A, i, ld(PHI, i) * a0 + ld(A, i + 1) + ld(G, o + i) * kv);
  }
  if (!(ssq > 0) || !Number.isFinite(ssq) || !Number.isFinite(sumlog)) return NaN;
  recSsq = ssq;
  recSettledF = F;
  return 0.5 * (hostLog(ssq / <f64>n) + sumlog / <f64>n);
}

/** Steps the record kept before the covariance settled (for the loader's bookkeeping). */
export function unsettled(): i32 {
  return recUnsettled;
}

/**
 * armaLikelihoodAdjoint's reverse steps and the adjoint of G₁, w₁ and F₁, at the point record() last
 * recorded: writes ∂/∂x, φ̄ (from the steps and G₁) and c̄0 (the first column of the initial covariance),
 * which the JavaScript carries on through the start.
 */
export function adjoint(F1: f64): void {
  const n = recN;
  const r = recR;
  const stride = r + 1;
  const sBar = 0.5 / recSsq;
  const lBar = 0.5 / <f64>n;
  for (let i = 0; i <= r; i++) {
    st(GBAR, i, 0);
    st(PHIBAR, i, 0);
  }
  const uns = recUnsettled;
  let ab = n;
  let wb = uns;
  for (let i = 0; i <= r; i++) {
    st(ASL, ab + i, 0);
    st(WSL, wb + i, 0);
  }
  let FBar: f64 = 0;
  {
    const f = recSettledF;
    const go = uns * stride;
    for (let t = n - 1; t >= uns; t--) {
      const v = ld(VR, t);
      const a0 = ld(A0R, t);
      const kv = v / f;
      let kvBar: f64 = 0;
      let a0Bar: f64 = 0;
      for (let i = 0; i < r; i++) {
        const abi = ld(ASL, ab + i);
        kvBar += abi * ld(G, go + i);
        st(PHIBAR, i, ld(PHIBAR, i) + abi * a0);
        st(GBAR, i, ld(GBAR, i) + abi * kv);
        a0Bar += abi * ld(PHI, i);
      }
      const vBar = (kvBar + 2 * sBar * v) / f;
      st(GX, t, vBar);
      ab--;
      st(ASL, ab, a0Bar - vBar);
      FBar += (-(kvBar + sBar * v) * v) / (f * f) + lBar / f;
    }
  }
  let mBar: f64 = 0;
  for (let t = uns - 1; t >= 0; t--) {
    const o = t * stride;
    const o1 = o + stride;
    const f = ld(FR, t);
    const mm = ld(MR, t);
    const z = ld(W, o);
    const Fn = f + mm * z * z;
    const mz = mm * z;
    const zf = z / Fn;
    const v = ld(VR, t);
    const a0 = ld(A0R, t);
    const kv = v / f;
    let zfBar: f64 = 0;
    let mzBar: f64 = 0;
    let kvBar: f64 = 0;
    let a0Bar: f64 = 0;
    let zu: f64 = 0;
    for (let i = 0; i < r; i++) {
      const ph = ld(PHI, i);
      const gi = ld(G, o + i);
      const ui = ph * z + ld(W, o + i + 1);
      const wbi = ld(WSL, wb + i);
      const abi = ld(ASL, ab + i);
      zfBar -= wbi * ld(G, o1 + i);
      const gpb = ld(GBAR, i) - wbi * zf;
      const ub = wbi + gpb * mz;
      mzBar += gpb * ui;
      st(PHIBAR, i, ld(PHIBAR, i) + (ub * z + abi * a0));
      zu += ub * ph;
      kvBar += abi * gi;
      a0Bar += abi * ph;
      st(GBAR, i, gpb + abi * kv);
      st(WSL, wb + i, ub);
    }
    const FnBar = FBar + (mBar * mm) / f - (zfBar * z) / (Fn * Fn);
    const vBar = (kvBar + 2 * sBar * v) / f;
    st(GX, t, vBar);
    FBar = (-mBar * mm * Fn) / (f * f) + FnBar + (-(kvBar + sBar * v) * v) / (f * f) + lBar / f;
    wb--;
    st(WSL, wb, zfBar / Fn + mzBar * mm + 2 * FnBar * mm * z + zu);
    mBar = (mBar * Fn) / f + mzBar * z + FnBar * z * z;
    ab--;
    st(ASL, ab, a0Bar - vBar);
  }
  // The start: F₁ = c0₀, m₁ = −F₁, Gᵢ = φᵢ·c0₀ + c0ᵢ₊₁, wᵢ = Gᵢ/F₁ (row 0).
  for (let i = 0; i <= r; i++) st(C0BAR, i, 0);
  for (let i = 0; i < r; i++) {
    st(GBAR, i, ld(GBAR, i) + ld(WSL, wb + i) / F1);
    FBar -= (ld(WSL, wb + i) * ld(G, i)) / (F1 * F1);
  }
  FBar -= mBar;
  for (let i = 0; i < r; i++) {
    st(PHIBAR, i, ld(PHIBAR, i) + ld(GBAR, i) * F1);
    st(C0BAR, 0, ld(C0BAR, 0) + ld(GBAR, i) * ld(PHI, i));
    if (i + 1 < r) st(C0BAR, i + 1, ld(C0BAR, i + 1) + ld(GBAR, i));
  }
  st(C0BAR, 0, ld(C0BAR, 0) + FBar);
}

/**
 * armaChandrasekharScript's steps after the start: x, φ, G₁ (value-only G) and w₁ (value-only w) are in
 * place. Writes ssq and sumlog to the out region, and the standardised residuals when asked.
 */
export function value(n: i32, r: i32, F1: f64, residuals: bool): void {
  let F = F1;
  for (let i = 0; i <= r; i++) st(A, i, 0);
  st(VW, r, 0);
  let m = -F;
  let ssq: f64 = 0;
  let sumlog: f64 = 0;
  let settled = false;
  let t = 0;
  for (; t < n && !settled; t++) {
    const v = ld(X, t) - ld(A, 0);
    ssq += (v * v) / F;
    sumlog += hostLog(F);
    if (residuals) st(RES, t, v / Math.sqrt(F));
    const a0 = ld(A, 0);
    const kv = v / F;
    const z = ld(VW, 0);
    const Fn = F + m * z * z;
    const mz = m * z;
    const zf = z / Fn;
    let size: f64 = 0;
    for (let i = 0; i < r; i++) {
      const gi = ld(VG, i);
      const ph = ld(VPHI, i);
      st(A, i, ph * a0 + ld(A, i + 1) + gi * kv);
      const ui = ph * z + ld(VW, i + 1);
      const gn = gi + ui * mz;
      st(VG, i, gn);
      const wi = ui - gn * zf;
      st(VW, i, wi);
      size += wi * wi;
    }
    m = (m * Fn) / F;
    F = Fn;
    if (size * Math.abs(m) < 1e-30) settled = true;
  }
  const logF = hostLog(F);
  const sdF = Math.sqrt(F);
  for (; t < n; t++) {
    const v = ld(X, t) - ld(A, 0);
    ssq += (v * v) / F;
    sumlog += logF;
    if (residuals) st(RES, t, v / sdF);
    const a0 = ld(A, 0);
    const kv = v / F;
    for (let i = 0; i < r; i++) st(A, i, ld(VPHI, i) * a0 + ld(A, i + 1) + ld(VG, i) * kv);
  }
  st(OUT, 0, ssq);
  st(OUT, 1, sumlog);
}
