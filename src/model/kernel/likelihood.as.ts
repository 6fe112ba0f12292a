/**
 * The Chandrasekhar recursions of the exact ARMA likelihood (Morf, Sidhu & Kailath 1974; Herbst 2015,
 * Computational Economics 45, 693–705, §2) as a WebAssembly kernel, written in AssemblyScript and compiled
 * by `npm run build` (scripts/kernels.mjs) into dist/model/likelihood-kernel.wasm. It is the step loops of
 * arma-chandrasekhar.ts (armaChandrasekharScript) and arma-likelihood-gradient.ts
 * (armaLikelihoodRecordScript and the reverse steps of armaLikelihoodAdjoint) step for step: the same IEEE
 * double operations in the same order, and the host's own Math.log (imported, since a logarithm of our own
 * could differ from V8's in the last place), so it gives the same bits (test/model/likelihood-kernel.test.ts).
 * The start is here too: armaAutocovariance, psiWeights, stepDownSolve, solveDense (arma-autocovariance.ts)
 * and chandrasekharStart, and in the reverse pass startAdjoint, stepDownAdjoint and denseAdjoint; the loader
 * (likelihood-kernel.ts) copies the series, φ and θ in and the sums or the gradient out.
 *
 * One long-lived instance per thread: `reserve(n, s)` lays the memory out for series of up to n values and
 * states of up to s elements, growing it when needed, and `at(k)` says where region k is. No allocation
 * happens here (the stub runtime is never used): every array is a region of the memory above the heap base.
 * `record` keeps each step's G, w, F, m, v and a₀ (and φ) for `adjoint`, which must follow for the same point;
 * `value` uses regions of its own (a start bank of its own; the series and the state are shared), so it may
 * run in between.
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
// Where each pass's start regions begin (bank(): PIN, TH, PSIA, CC, GAMMA, BB, FPSI, C0, ROWS, LEVELS).
let BANK0: usize = 0;
let BANK1: usize = 0;
let recStepped = false;
let recP: i32 = 0;
let recQ: i32 = 0;

function takeBank(s1: i32): void {
  take(2 * s1 + 6 * (s1 + 1) + 2 * s1 * s1);
}

/** Selects the start regions of the record pass (0) or of the value-only pass (1), and its φ, G₁, w₁. */
function bank(b: i32): void {
  const s1 = capS + 1;
  let p = b === 0 ? BANK0 : BANK1;
  PIN = p;
  p += (<usize>s1) << 3;
  TH = p;
  p += (<usize>s1) << 3;
  PSIA = p;
  p += (<usize>(s1 + 1)) << 3;
  CC = p;
  p += (<usize>(s1 + 1)) << 3;
  GAMMA = p;
  p += (<usize>(s1 + 1)) << 3;
  BB = p;
  p += (<usize>(s1 + 1)) << 3;
  FPSI = p;
  p += (<usize>(s1 + 1)) << 3;
  C0 = p;
  p += (<usize>(s1 + 1)) << 3;
  ROWS = p;
  p += (<usize>(s1 * s1)) << 3;
  LEVELS = p;
  SPHI = b === 0 ? PHI : VPHI;
  SG = b === 0 ? G : VG;
  SW = b === 0 ? W : VW;
}

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
  BANK0 = next;
  takeBank(s1);
  BANK1 = next;
  takeBank(s1);
  GAMMABAR = take(s + 2);
  PSIBAR = take(s + 2);
  CBAR = take(s + 2);
  LAMBDA = take(s + 2);
  RHS = take(s + 2);
  ROWSBAR = take(s1 * s1);
  GT = take(s1);
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
    case 12:
      return BANK0;
    case 13:
      return BANK0 + ((<usize>(capS + 1)) << 3);
    case 14:
      return BANK1;
    case 15:
      return BANK1 + ((<usize>(capS + 1)) << 3);
    case 16:
      return GT;
    default:
      return OUT;
  }
}

/**
 * armaLikelihoodRecordScript's steps after the start: x, φ, G₁ (row 0 of G) and w₁ (row 0 of w) are in
 * place. Returns the objective, NaN where it is not finite.
 */
export function record(n: i32, p: i32, q: i32): f64 {
  const r = max(p, q + 1);
  bank(0);
  const F1 = start(p, q, r);
  recStepped = stepped;
  recP = p;
  recQ = q;
  recN = n;
  recR = r;
  recSsq = NaN;
  if (!(F1 > 0) || n === 0) return NaN;
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
export function adjoint(): void {
  bank(0);
  const F1 = ld(C0, 0);
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
  stepped = recStepped;
  startAdjoint(recP, recQ, r);
}

/**
 * armaChandrasekharScript's steps after the start: x, φ, G₁ (value-only G) and w₁ (value-only w) are in
 * place. Writes ssq and sumlog to the out region, and the standardised residuals when asked.
 */
export function value(n: i32, p: i32, q: i32, residuals: bool): void {
  const r = max(p, q + 1);
  bank(1);
  let F = start(p, q, r);
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

// ---------- the start (arma-autocovariance.ts, arma-chandrasekhar.ts chandrasekharStart) ----------

// The regions of the bank in use (a bank per pass: the record's start must outlive a value-only pass).
let PIN: usize = 0; // φ as given, p
let TH: usize = 0; // θ, q
let PSIA: usize = 0; // ψ of the autocovariances, q + 1
let CC: usize = 0; // c, the system's right-hand side before it is copied
let GAMMA: usize = 0; // γ(0…r)
let BB: usize = 0; // b, overwritten by the solve
let FPSI: usize = 0; // ψ₀…ψ_{r−1} of the start
let C0: usize = 0; // first column of the initial covariance
let ROWS: usize = 0; // the step-down's polynomials, (s + 1)²
let LEVELS: usize = 0; // its right-hand sides, (s + 1)²
let SPHI: usize = 0; // φ padded (PHI or VPHI)
let SG: usize = 0; // G₁ (row 0 of G, or VG)
let SW: usize = 0; // w₁ likewise
let stepped = false;

function psiWeights(p: i32, q: i32, count: i32, psi: usize): void {
  if (count > 0) st(psi, 0, 1);
  for (let j = 1; j < count; j++) {
    let v: f64 = j <= q ? ld(TH, j - 1) : 0;
    const top = min(j, p);
    for (let i = 1; i <= top; i++) v += ld(PIN, i - 1) * ld(psi, j - i);
    st(psi, j, v);
  }
}

function stepDownSolve(p: i32): bool {
  const m = p + 1;
  const top = p * m;
  st(ROWS, top, 1);
  for (let j = 1; j <= p; j++) st(ROWS, top + j, -ld(PIN, j - 1));
  for (let l = p; l >= 1; l--) {
    const o = l * m;
    const below = o - m;
    const kappa = ld(ROWS, o + l);
    const den = 1 - kappa * kappa;
    if (!(den > 0) || !(Math.abs(kappa) < 1)) return false;
    for (let k = 0; k <= l; k++) st(LEVELS, o + k, ld(BB, k));
    for (let j = 0; j < l; j++) st(ROWS, below + j, (ld(ROWS, o + j) - kappa * ld(ROWS, o + l - j)) / den);
    for (let k = 0, h = l; k <= h; k++, h--) {
      const dk = ld(BB, k);
      const dh = ld(BB, h);
      st(BB, k, (dk - kappa * dh) / den);
      if (h !== k) st(BB, h, (dh - kappa * dk) / den);
    }
    st(ROWS, below + l, ld(BB, l));
  }
  st(GAMMA, 0, ld(BB, 0));
  for (let l = 1; l <= p; l++) {
    const o = (l - 1) * m;
    let v = ld(ROWS, o + l);
    for (let j = 1; j < l; j++) v -= ld(ROWS, o + j) * ld(GAMMA, l - j);
    st(GAMMA, l, v);
  }
  return true;
}

/** Gaussian elimination with partial pivoting (arma-autocovariance.ts solveDense); A and b are overwritten. */
function solveDense(A: usize, b: usize, n: i32, x: usize): void {
  for (let col = 0; col < n; col++) {
    let piv = col;
    for (let r = col + 1; r < n; r++) if (Math.abs(ld(A, r * n + col)) > Math.abs(ld(A, piv * n + col))) piv = r;
    if (piv !== col) {
      for (let k = 0; k < n; k++) {
        const t = ld(A, col * n + k);
        st(A, col * n + k, ld(A, piv * n + k));
        st(A, piv * n + k, t);
      }
      const t = ld(b, col);
      st(b, col, ld(b, piv));
      st(b, piv, t);
    }
    const d = ld(A, col * n + col);
    for (let r = col + 1; r < n; r++) {
      const f = ld(A, r * n + col) / d;
      if (f === 0) continue;
      for (let k = col; k < n; k++) st(A, r * n + k, ld(A, r * n + k) - f * ld(A, col * n + k));
      st(b, r, ld(b, r) - f * ld(b, col));
    }
  }
  for (let r = n - 1; r >= 0; r--) {
    let v = ld(b, r);
    for (let k = r + 1; k < n; k++) v -= ld(A, r * n + k) * ld(x, k);
    st(x, r, v / ld(A, r * n + r));
  }
}

/** armaAutocovariance(φ, θ, r, work) into GAMMA. */
function autocovariance(p: i32, q: i32, r: i32): void {
  psiWeights(p, q, q + 1, PSIA);
  const pq = max(p, q);
  for (let k = 0; k <= pq; k++) st(CC, k, 0);
  for (let k = 0; k <= q; k++) {
    let v: f64 = 0;
    for (let j = k; j <= q; j++) v += (j === 0 ? 1 : ld(TH, j - 1)) * ld(PSIA, j - k);
    st(CC, k, v);
  }
  const len = max(r, p) + 1;
  for (let k = 0; k < len; k++) st(GAMMA, k, 0);
  if (p === 0) {
    const top = min(q, r);
    for (let k = 0; k <= top; k++) st(GAMMA, k, ld(CC, k));
    return;
  }
  const m = p + 1;
  for (let k = 0; k < m; k++) st(BB, k, ld(CC, k));
  stepped = stepDownSolve(p);
  if (!stepped) {
    for (let k = 0; k < m * m; k++) st(ROWS, k, 0);
    for (let k = 0; k < m; k++) {
      st(ROWS, k * m + k, ld(ROWS, k * m + k) + 1);
      for (let j = 1; j <= p; j++) {
        const at = k * m + abs(k - j);
        st(ROWS, at, ld(ROWS, at) - ld(PIN, j - 1));
      }
      st(BB, k, ld(CC, k));
    }
    solveDense(ROWS, BB, m, GAMMA);
  }
  for (let k = m; k < len; k++) {
    let v: f64 = k <= q ? ld(CC, k) : 0;
    for (let j = 1; j <= p; j++) v += ld(PIN, j - 1) * ld(GAMMA, k - j);
    st(GAMMA, k, v);
  }
}

/** chandrasekharStart: φ padded, c0, G₁, w₁; returns F₁. */
function start(p: i32, q: i32, r: i32): f64 {
  autocovariance(p, q, r);
  psiWeights(p, q, r, FPSI);
  for (let i = 0; i <= r; i++) st(SPHI, i, 0);
  for (let i = 0; i < p; i++) st(SPHI, i, ld(PIN, i));
  for (let i = 0; i < r; i++) {
    let v: f64 = 0;
    for (let k = 0; i + k < r; k++) {
      const j = i + k + 1;
      if (j <= p) v += ld(PIN, j - 1) * ld(GAMMA, k + 1);
      const mIdx = i + k;
      const th: f64 = mIdx === 0 ? 1 : mIdx <= q ? ld(TH, mIdx - 1) : 0;
      v += th * ld(FPSI, k);
    }
    st(C0, i, v);
  }
  st(C0, r, 0);
  const F = ld(C0, 0);
  for (let i = 0; i < r; i++) st(SG, i, ld(SPHI, i) * ld(C0, 0) + ld(C0, i + 1));
  for (let i = 0; i < r; i++) st(SW, i, ld(SG, i) / F);
  st(SW, r, 0);
  return F;
}

// ---------- the start's adjoint (arma-likelihood-gradient.ts startAdjoint, arma-autocovariance.ts stepDownAdjoint) ----------

let GAMMABAR: usize = 0;
let PSIBAR: usize = 0;
let CBAR: usize = 0;
let LAMBDA: usize = 0;
let RHS: usize = 0;
let ROWSBAR: usize = 0; // (s + 1)²
let GT: usize = 0; // ∂/∂θ, s

function stepDownAdjoint(p: i32): void {
  const m = p + 1;
  for (let k = 0; k < m * m; k++) st(ROWSBAR, k, 0);
  for (let k = 0; k < m; k++) st(LAMBDA, k, 0);
  for (let l = p; l >= 1; l--) {
    const gb = ld(GAMMABAR, l);
    st(LAMBDA, l, ld(LAMBDA, l) + gb);
    const o = (l - 1) * m;
    for (let j = 1; j < l; j++) {
      st(ROWSBAR, o + j, ld(ROWSBAR, o + j) - gb * ld(GAMMA, l - j));
      st(GAMMABAR, l - j, ld(GAMMABAR, l - j) - gb * ld(ROWS, o + j));
    }
  }
  st(LAMBDA, 0, ld(LAMBDA, 0) + ld(GAMMABAR, 0));
  for (let l = 1; l <= p; l++) {
    const o = l * m;
    const below = o - m;
    const kappa = ld(ROWS, o + l);
    const den = 1 - kappa * kappa;
    let kappaBar: f64 = 0;
    let denBar: f64 = 0;
    for (let k = 0, h = l; k <= h; k++, h--) {
      const ak = ld(LAMBDA, k) / den;
      const ah: f64 = h !== k ? ld(LAMBDA, h) / den : 0;
      const dk = ld(LEVELS, o + k);
      const dh = ld(LEVELS, o + h);
      st(LAMBDA, k, ak - kappa * ah);
      if (h !== k) st(LAMBDA, h, ah - kappa * ak);
      else st(LAMBDA, k, ak - kappa * ak);
      kappaBar -= ak * dh + ah * dk;
      denBar -= (ak * (dk - kappa * dh) + ah * (dh - kappa * dk)) / den;
    }
    for (let j = 0; j < l; j++) {
      const a = ld(ROWSBAR, below + j) / den;
      if (a === 0) continue;
      st(ROWSBAR, o + j, ld(ROWSBAR, o + j) + a);
      st(ROWSBAR, o + l - j, ld(ROWSBAR, o + l - j) - kappa * a);
      kappaBar -= a * ld(ROWS, o + l - j);
      denBar -= a * ld(ROWS, below + j);
    }
    kappaBar -= 2 * kappa * denBar;
    st(ROWSBAR, o + l, ld(ROWSBAR, o + l) + kappaBar);
  }
  for (let j = 1; j <= p; j++) st(PHIBAR, j - 1, ld(PHIBAR, j - 1) - ld(ROWSBAR, p * m + j));
}

function denseAdjoint(p: i32, q: i32, mm: i32): void {
  const A = ROWSBAR;
  for (let k = 0; k < mm * mm; k++) st(A, k, 0);
  for (let k = 0; k < mm; k++) {
    st(A, k * mm + k, ld(A, k * mm + k) + 1);
    for (let j = 1; j <= p; j++) {
      const at = abs(k - j) * mm + k;
      st(A, at, ld(A, at) - ld(PIN, j - 1));
    }
  }
  for (let k = 0; k < mm; k++) st(RHS, k, ld(GAMMABAR, k));
  solveDense(A, RHS, mm, LAMBDA);
  const top = min(p, q);
  for (let k = 0; k <= top; k++) st(CBAR, k, ld(CBAR, k) + ld(LAMBDA, k));
  for (let j = 1; j <= p; j++) {
    let s: f64 = 0;
    for (let k = 0; k < mm; k++) s += ld(LAMBDA, k) * ld(GAMMA, abs(k - j));
    st(PHIBAR, j - 1, ld(PHIBAR, j - 1) + s);
  }
}

/** From c̄0 (C0BAR) and φ̄ of the steps to φ̄ (PHIBAR) and θ̄ (GT). */
function startAdjoint(p: i32, q: i32, rr: i32): void {
  for (let k = 0; k <= capS + 1; k++) {
    st(GAMMABAR, k, 0);
    st(PSIBAR, k, 0);
    st(CBAR, k, 0);
  }
  for (let k = 0; k < q; k++) st(GT, k, 0);
  for (let i = 0; i < rr; i++) {
    const cb = ld(C0BAR, i);
    if (cb === 0) continue;
    for (let k = 0; i + k < rr; k++) {
      const j = i + k + 1;
      if (j <= p) {
        st(PHIBAR, j - 1, ld(PHIBAR, j - 1) + cb * ld(GAMMA, k + 1));
        st(GAMMABAR, k + 1, ld(GAMMABAR, k + 1) + cb * ld(PIN, j - 1));
      }
      const mi = i + k;
      if (mi >= 1 && mi <= q) st(GT, mi - 1, ld(GT, mi - 1) + cb * ld(FPSI, k));
      const th: f64 = mi === 0 ? 1 : mi <= q ? ld(TH, mi - 1) : 0;
      st(PSIBAR, k, ld(PSIBAR, k) + cb * th);
    }
  }
  if (p === 0) {
    const top = min(q, rr);
    for (let k = 0; k <= top; k++) st(CBAR, k, ld(CBAR, k) + ld(GAMMABAR, k));
  } else {
    for (let k = rr; k > p; k--) {
      const gb = ld(GAMMABAR, k);
      if (k <= q) st(CBAR, k, ld(CBAR, k) + gb);
      for (let j = 1; j <= p; j++) {
        st(PHIBAR, j - 1, ld(PHIBAR, j - 1) + gb * ld(GAMMA, k - j));
        st(GAMMABAR, k - j, ld(GAMMABAR, k - j) + gb * ld(PIN, j - 1));
      }
    }
    const mm = p + 1;
    if (stepped) {
      stepDownAdjoint(p);
      const top = min(p, q);
      for (let k = 0; k <= top; k++) st(CBAR, k, ld(CBAR, k) + ld(LAMBDA, k));
    } else {
      denseAdjoint(p, q, mm);
    }
  }
  for (let k = 0; k <= q; k++) {
    const cb = ld(CBAR, k);
    if (cb === 0) continue;
    for (let j = k; j <= q; j++) {
      if (j >= 1) st(GT, j - 1, ld(GT, j - 1) + cb * ld(FPSI, j - k));
      const th: f64 = j === 0 ? 1 : ld(TH, j - 1);
      st(PSIBAR, j - k, ld(PSIBAR, j - k) + cb * th);
    }
  }
  for (let j = rr - 1; j >= 1; j--) {
    const pb = ld(PSIBAR, j);
    if (pb === 0) continue;
    if (j <= q) st(GT, j - 1, ld(GT, j - 1) + pb);
    const top = min(j, p);
    for (let i = 1; i <= top; i++) {
      st(PHIBAR, i - 1, ld(PHIBAR, i - 1) + pb * ld(FPSI, j - i));
      st(PSIBAR, j - i, ld(PSIBAR, j - i) + pb * ld(PIN, i - 1));
    }
  }
}
