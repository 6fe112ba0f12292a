/**
 * The Kalman filter of an ARIMA process with the differencing in its state (Durbin & Koopman, Time Series
 * Analysis by State Space Methods, 2nd ed. (2012), §3.4, §5.1, §4.10; the recursions of R's stats::arima) as
 * a WebAssembly kernel, written in AssemblyScript and compiled by `npm run build` (scripts/kernels.mjs) into
 * dist/model/state-space-kernel.wasm. It is state-space-filter.ts (stateSpaceScript, predictState,
 * predictCovariance), innovations-operator.ts (innovationsScript) and the outlier search's patterns and scan
 * (detect-outliers.ts, scriptSearch) step for step: the same IEEE double operations in the same order, and
 * the logarithm imported from the host (V8's Math.log), so it gives the same bits
 * (test/model/state-space-kernel.test.ts and detect-outliers.test.ts compare them bit for bit). A fresh
 * process runs WebAssembly compiled before its first call, where the JavaScript would first run interpreted.
 *
 * The kernel allocates nothing: every array is a byte address in the memory that the loader
 * (state-space-kernel.ts) lays out and grows, and indices are those of the JavaScript (never bounds-checked).
 * One instance lives for the whole thread.
 */

// V8's Math.log, passed in by the loader (module "env"): AssemblyScript's own may differ from it in the last bit.
declare function hostLog(x: f64): f64;

function ld(base: usize, i: i32): f64 {
  return load<f64>(base + ((<usize>i) << 3));
}

function st(base: usize, i: i32, v: f64): void {
  store<f64>(base + ((<usize>i) << 3), v);
}

function copy(to: usize, from: usize, len: i32): void {
  memory.copy(to, from, (<usize>len) << 3);
}

/** anew = T·a (predictState in state-space-filter.ts). */
function predictState(a: usize, anew: usize, phi: usize, p: i32, delta: usize, d: i32, r: i32, rd: i32): void {
  for (let i = 0; i < r; i++) {
    let v: f64 = i < r - 1 ? ld(a, i + 1) : 0;
    if (i < p) v += ld(phi, i) * ld(a, 0);
    st(anew, i, v);
  }
  if (d > 0) {
    for (let i = r + 1; i < rd; i++) st(anew, i, ld(a, i - 1));
    let v = ld(a, 0);
    for (let i = 0; i < d; i++) v += ld(delta, i) * ld(a, r + i);
    st(anew, r, v);
  }
}

/** Pnew = T·P·T' + R·R' (predictCovariance in state-space-filter.ts). */
function predictCovariance(
  P: usize,
  Pnew: usize,
  mm: usize,
  phi: usize,
  p: i32,
  Rv: usize,
  delta: usize,
  d: i32,
  r: i32,
  rd: i32,
): void {
  for (let i = 0; i < r; i++) {
    for (let j = 0; j < rd; j++) {
      let v: f64 = 0;
      if (i < p) v += ld(phi, i) * ld(P, j);
      if (i < r - 1) v += ld(P, (i + 1) * rd + j);
      st(mm, i * rd + j, v);
    }
  }
  if (d > 0) {
    for (let j = 0; j < rd; j++) {
      let v = ld(P, j);
      for (let k = 0; k < d; k++) {
        const dk = ld(delta, k);
        if (dk !== 0) v += dk * ld(P, (r + k) * rd + j);
      }
      st(mm, r * rd + j, v);
    }
    for (let i = 1; i < d; i++) for (let j = 0; j < rd; j++) st(mm, (r + i) * rd + j, ld(P, (r + i - 1) * rd + j));
  }
  for (let i = 0; i < r; i++) {
    const ph: f64 = i < p ? ld(phi, i) : 0;
    const shift = i < r - 1;
    for (let j = i; j < rd; j++) {
      let v = ph * ld(mm, j * rd);
      if (shift) v += ld(mm, j * rd + i + 1);
      if (j < r) v += ld(Rv, i) * ld(Rv, j);
      st(Pnew, j * rd + i, v);
    }
  }
  if (d > 0) {
    for (let j = r; j < rd; j++) {
      let v = ld(mm, j * rd);
      for (let k = 0; k < d; k++) {
        const dk = ld(delta, k);
        if (dk !== 0) v += dk * ld(mm, j * rd + r + k);
      }
      st(Pnew, j * rd + r, v);
    }
    for (let i = 1; i < d; i++) for (let j = r + i; j < rd; j++) st(Pnew, j * rd + r + i, ld(mm, j * rd + r + i - 1));
  }
  for (let i = 0; i < rd; i++) for (let j = i + 1; j < rd; j++) st(Pnew, i * rd + j, ld(Pnew, j * rd + i));
}

/** M = Pnew·Z (Z the observation vector (1, 0, …, δ)) and returns F = Z'·M. */
function gainOf(Pnew: usize, M: usize, delta: usize, d: i32, r: i32, rd: i32): f64 {
  for (let i = 0; i < rd; i++) {
    let w = ld(Pnew, i * rd);
    for (let j = 0; j < d; j++) {
      const dj = ld(delta, j);
      if (dj !== 0) w += ld(Pnew, i * rd + r + j) * dj;
    }
    st(M, i, w);
  }
  let F = ld(M, 0);
  for (let j = 0; j < d; j++) {
    const dj = ld(delta, j);
    if (dj !== 0) F += dj * ld(M, r + j);
  }
  return F;
}

/** P = Pnew − M·M'/F, one triangle computed and the other copied. */
function updateCovariance(P: usize, Pnew: usize, M: usize, F: f64, rd: i32): void {
  for (let i = 0; i < rd; i++) {
    const mi = ld(M, i) / F;
    for (let j = 0; j <= i; j++) {
      const w = ld(Pnew, i * rd + j) - mi * ld(M, j);
      st(P, i * rd + j, w);
      st(P, j * rd + i, w);
    }
  }
}

/** Rv = (1, θ₁, …, θ_q, 0, …) of length r. */
function fillRv(Rv: usize, theta: usize, q: i32, r: i32): void {
  st(Rv, 0, 1);
  for (let i = 1; i < r; i++) st(Rv, i, i - 1 < q ? ld(theta, i - 1) : 0);
}

/**
 * stateSpaceScript: filters x (n values, NaN missing) from the covariance the loader put in P; leaves the
 * final state in a, its covariance in P, the standardised innovations in res and (ssq, sumlog, count) in
 * out. Pnew, mm (rd × rd), M, anew (rd) and Rv (r) are scratch.
 */
export function filter(
  n: i32,
  p: i32,
  q: i32,
  d: i32,
  x: usize,
  phi: usize,
  theta: usize,
  delta: usize,
  P: usize,
  Pnew: usize,
  mm: usize,
  M: usize,
  a: usize,
  anew: usize,
  Rv: usize,
  res: usize,
  out: usize,
): void {
  const r = max(p, q + 1);
  const rd = r + d;
  for (let i = 0; i < rd; i++) st(a, i, 0);
  fillRv(Rv, theta, q, r);
  let ssq: f64 = 0;
  let sumlog: f64 = 0;
  let count: i32 = 0;
  for (let t = 0; t < n; t++) {
    predictState(a, anew, phi, p, delta, d, r, rd);
    if (t === 0) copy(Pnew, P, rd * rd);
    else predictCovariance(P, Pnew, mm, phi, p, Rv, delta, d, r, rd);
    const y = ld(x, t);
    if (!Number.isNaN(y)) {
      let v = y - ld(anew, 0);
      for (let i = 0; i < d; i++) v -= ld(delta, i) * ld(anew, r + i);
      const F = gainOf(Pnew, M, delta, d, r, rd);
      if (F < 1e4) {
        count++;
        ssq += (v * v) / F;
        sumlog += hostLog(F);
      }
      st(res, t, v / Math.sqrt(F));
      for (let i = 0; i < rd; i++) st(a, i, ld(anew, i) + (ld(M, i) * v) / F);
      updateCovariance(P, Pnew, M, F, rd);
    } else {
      copy(a, anew, rd);
      copy(P, Pnew, rd * rd);
      st(res, t, NaN);
    }
  }
  st(out, 0, ssq);
  st(out, 1, sumlog);
  st(out, 2, <f64>count);
}

/**
 * innovationsScript's first part: the gains (n × rd) and scales (n) of the model on the periods that
 * `missing` (n values, 1 where missing) leaves, from the covariance the loader put in P.
 */
export function gains(
  n: i32,
  p: i32,
  q: i32,
  d: i32,
  phi: usize,
  theta: usize,
  delta: usize,
  missing: usize,
  P: usize,
  Pnew: usize,
  mm: usize,
  M: usize,
  Rv: usize,
  gain: usize,
  scale: usize,
): void {
  const r = max(p, q + 1);
  const rd = r + d;
  fillRv(Rv, theta, q, r);
  for (let t = 0; t < n; t++) {
    if (t === 0) copy(Pnew, P, rd * rd);
    else predictCovariance(P, Pnew, mm, phi, p, Rv, delta, d, r, rd);
    if (ld(missing, t) !== 0) {
      st(scale, t, 0);
      for (let i = 0; i < rd; i++) st(gain, t * rd + i, 0);
      copy(P, Pnew, rd * rd);
      continue;
    }
    const F = gainOf(Pnew, M, delta, d, r, rd);
    for (let i = 0; i < rd; i++) st(gain, t * rd + i, ld(M, i) / F);
    st(scale, t, F < 1e4 ? 1 / Math.sqrt(F) : 0);
    updateCovariance(P, Pnew, M, F, rd);
  }
}

/** innovationsScript's second part: the standardised innovations of x from period `from` on, into out. */
export function apply(
  n: i32,
  from: i32,
  p: i32,
  r: i32,
  d: i32,
  phi: usize,
  delta: usize,
  missing: usize,
  gain: usize,
  scale: usize,
  x: usize,
  out: usize,
  a: usize,
  anew: usize,
): void {
  const rd = r + d;
  for (let i = 0; i < rd; i++) st(a, i, 0);
  for (let t = 0; t < from; t++) st(out, t, 0);
  for (let t = from; t < n; t++) {
    predictState(a, anew, phi, p, delta, d, r, rd);
    if (ld(missing, t) !== 0) {
      st(out, t, 0);
      copy(a, anew, rd);
      continue;
    }
    let v = ld(x, t) - ld(anew, 0);
    for (let i = 0; i < d; i++) v -= ld(delta, i) * ld(anew, r + i);
    st(out, t, v * ld(scale, t));
    for (let i = 0; i < rd; i++) st(a, i, ld(anew, i) + ld(gain, t * rd + i) * v);
  }
}

/** Where the loader's layout may start: after the kernel's own static data. */
export function base(): usize {
  return (__heap_base + 15) & ~(<usize>15);
}

/**
 * The outlier search's patterns (detect-outliers.ts, locate): row T of `out` (n × n, row-major) is the
 * operator applied to a unit impulse at T, started at T (apply with x = e_T and from = T, as the JavaScript
 * calls it once per period). `x` is n doubles of scratch.
 */
export function impulses(
  n: i32,
  p: i32,
  r: i32,
  d: i32,
  phi: usize,
  delta: usize,
  missing: usize,
  gain: usize,
  scale: usize,
  x: usize,
  out: usize,
  a: usize,
  anew: usize,
): void {
  for (let t = 0; t < n; t++) st(x, t, 0);
  for (let T = 0; T < n; T++) {
    st(x, T, 1);
    apply(n, T, p, r, d, phi, delta, missing, gain, scale, x, out + ((<usize>T * <usize>n) << 3), a, anew);
    st(x, T, 0);
  }
}

/**
 * Patterns that sum the impulses after them (locate's `cumulated`): row T of dst is row T of src plus w
 * times row T + 1 of dst after T (w = 1 for a level shift, the decay rate for a temporary change).
 */
export function cumulate(n: i32, src: usize, dst: usize, w: f64): void {
  const len = (<usize>n) << 3;
  copy(dst + len * <usize>(n - 1), src + len * <usize>(n - 1), n);
  for (let T = n - 2; T >= 0; T--) {
    const row = dst + len * <usize>T;
    const next = row + len;
    copy(row, src + len * <usize>T, n);
    for (let t = T + 1; t < n; t++) st(row, t, ld(row, t) + w * ld(next, t));
  }
}

/**
 * locate's search over one type: for each period T from lo to hi that is neither missing nor taken, ω̂ =
 * Σ g e / Σ g² and τ = ω̂ √(Σ g²) / s over t ≥ T not missing (g row T of pat); the first T whose |τ| beats
 * the best so far wins. res holds [found (0 or 1), T, ω̂, τ] on entry (the best of the types before) and on
 * return; returns 1 when this type gave the best, else 0.
 */
export function scan(
  n: i32,
  lo: i32,
  hi: i32,
  pat: usize,
  e: usize,
  missing: usize,
  taken: usize,
  s: f64,
  res: usize,
): i32 {
  let better = 0;
  let found = ld(res, 0) !== 0;
  let bestT = ld(res, 1);
  let bestOmega = ld(res, 2);
  let bestTau = ld(res, 3);
  for (let T = lo; T <= hi; T++) {
    if (ld(missing, T) !== 0 || ld(taken, T) !== 0) continue;
    const g = pat + ((<usize>T * <usize>n) << 3);
    let num: f64 = 0;
    let den: f64 = 0;
    for (let t = T; t < n; t++) {
      if (ld(missing, t) !== 0) continue;
      const gt = ld(g, t);
      num += gt * ld(e, t);
      den += gt * gt;
    }
    if (!(den > 0)) continue;
    const omega = num / den;
    const tau = (omega * Math.sqrt(den)) / s;
    if (!found || Math.abs(tau) > Math.abs(bestTau)) {
      found = true;
      better = 1;
      bestT = <f64>T;
      bestOmega = omega;
      bestTau = tau;
    }
  }
  st(res, 0, found ? 1 : 0);
  st(res, 1, bestT);
  st(res, 2, bestOmega);
  st(res, 3, bestTau);
  return better;
}
