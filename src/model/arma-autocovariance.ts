/**
 * Autocovariances γ(0), …, γ(maxLag) of a stationary ARMA process with unit innovation variance,
 * xₜ = Σ phi[j−1] x_{t−j} + εₜ + Σ theta[j−1] ε_{t−j}, and its ψ weights (the MA(∞) coefficients).
 * Source: Brockwell & Davis, Time Series: Theory and Methods, 2nd ed. (1991), §3.3, the "third method":
 * γ(k) − Σ φⱼγ(k−j) = Σ_{j=k}^{q} θⱼψ_{j−k} for k ≤ p, then the recursion. The (p+1)-system is solved in
 * O(p²) by the step-down (Durbin–Levinson run backwards) of the AR polynomial, applied to both sides, the
 * approach of Tunnicliffe Wilson (1979), "Some efficient computational procedures for high order ARMA
 * models", Journal of Statistical Computation and Simulation 8, 301–309 (cited from memory; the steps are
 * derived in stepDownSolve). Where a step-down coefficient reaches ±1 (not stationary) it falls back to
 * Gaussian elimination. stepDownAdjoint runs the step-down backwards for the likelihood's gradient.
 *
 *   armaAutocovariance([0.5], [], 2) → [4/3, 2/3, 1/3]   (AR(1): γ(k) = 0.5ᵏ / (1 − 0.25))
 *   armaAutocovariance([], [0.5], 1) → [1.25, 0.5]
 */
export function psiWeights(
  phi: Float64Array,
  theta: Float64Array,
  count: number,
  out: Float64Array = new Float64Array(count),
): Float64Array {
  const psi = out;
  if (count > 0) psi[0] = 1;
  for (let j = 1; j < count; j++) {
    let v = j <= theta.length ? theta[j - 1] : 0;
    for (let i = 1; i <= Math.min(j, phi.length); i++) v += phi[i - 1] * psi[j - i];
    psi[j] = v;
  }
  return psi;
}

/** Scratch arrays for armaAutocovariance with p, q and maxLag up to `size` (contents never carry over). */
export interface AutocovarianceWork {
  size: number;
  psi: Float64Array;
  c: Float64Array;
  gamma: Float64Array;
  A: Float64Array;
  b: Float64Array;
  /** The right-hand sides at each degree of the step-down (stepDownSolve's `levels`), for its adjoint. */
  levels: Float64Array;
  /** Whether the last call solved by the step-down (false: Gaussian elimination, `A` no longer holds rows). */
  steppedDown: boolean;
}

export function autocovarianceWork(size: number): AutocovarianceWork {
  const m = size + 1;
  return {
    size,
    psi: new Float64Array(m),
    c: new Float64Array(m),
    gamma: new Float64Array(m),
    A: new Float64Array(m * m),
    b: new Float64Array(m),
    levels: new Float64Array(m * m),
    steppedDown: false,
  };
}

export function armaAutocovariance(
  phi: Float64Array,
  theta: Float64Array,
  maxLag: number,
  work: AutocovarianceWork | null = null,
): Float64Array {
  const p = phi.length;
  const q = theta.length;
  const need = Math.max(p, q, maxLag);
  const ws = work && work.size >= need ? work : null;
  const psi = psiWeights(phi, theta, q + 1, ws ? ws.psi : new Float64Array(q + 1));
  // c[k] = Σ_{j=k}^{q} θⱼ ψ_{j−k}, θ₀ = 1.
  const c = ws ? ws.c.fill(0, 0, Math.max(p, q) + 1) : new Float64Array(Math.max(p, q) + 1);
  for (let k = 0; k <= q; k++) {
    let v = 0;
    for (let j = k; j <= q; j++) v += (j === 0 ? 1 : theta[j - 1]) * psi[j - k];
    c[k] = v;
  }
  const len = Math.max(maxLag, p) + 1;
  const gamma = ws ? ws.gamma.fill(0, 0, len).subarray(0, len) : new Float64Array(len);
  if (p === 0) {
    for (let k = 0; k <= Math.min(q, maxLag); k++) gamma[k] = c[k];
    return gamma.subarray(0, maxLag + 1);
  }
  // (p+1)×(p+1) system in γ(0..p): γ(k) − Σ_j φⱼ γ(|k−j|) = c[k].
  const m = p + 1;
  const A = ws ? ws.A : new Float64Array(m * m);
  const b = ws ? ws.b : new Float64Array(m);
  for (let k = 0; k < m; k++) b[k] = c[k] ?? 0;
  const stepped = stepDownSolve(phi, b, A, gamma, ws ? ws.levels : null);
  if (ws) ws.steppedDown = stepped;
  if (!stepped) {
    A.fill(0, 0, m * m);
    for (let k = 0; k < m; k++) {
      A[k * m + k] += 1;
      for (let j = 1; j <= p; j++) A[k * m + Math.abs(k - j)] -= phi[j - 1];
      b[k] = c[k] ?? 0;
    }
    solveDense(A, b, m, gamma);
  }
  for (let k = m; k < gamma.length; k++) {
    let v = k <= q ? c[k] : 0;
    for (let j = 1; j <= p; j++) v += phi[j - 1] * gamma[k - j];
    gamma[k] = v;
  }
  return gamma.subarray(0, maxLag + 1);
}

/**
 * Solves Σ_{j=0}^{p} aⱼ γ(|k − j|) = d_k, k = 0…p, with a₀ = 1, aⱼ = −φⱼ, for γ(0…p) in O(p²); false
 * (γ untouched) where a step-down coefficient is not inside (−1, 1). Equation l − k read backwards is the
 * equation at k with the coefficients reversed, so a′ⱼ = (aⱼ − κ a_{l−j}) / (1 − κ²), κ = a_l, and
 * d′_k = (d_k − κ d_{l−k}) / (1 − κ²) satisfy the same equations with a polynomial of degree l − 1, for
 * k = 0…l; the system of degree l − 1 uses k < l, and the equation at k = l gives γ(l) once γ(0…l−1) are
 * known: γ(l) = d′_l − Σ_{j=1}^{l−1} a′ⱼ γ(l − j). `rows` holds (p+1)² numbers of scratch; `d` is overwritten.
 *
 *   φ = [0.5], d = [1, 0]: κ = −0.5, a′ = [1], d′ = [1/0.75, 0.5/0.75] → γ = [4/3, 2/3]
 */
export function stepDownSolve(
  phi: Float64Array,
  d: Float64Array,
  rows: Float64Array,
  gamma: Float64Array,
  levels: Float64Array | null = null,
): boolean {
  const p = phi.length;
  const m = p + 1;
  // Row l of `rows` holds the polynomial of degree l (entries 0…l), its entry l + 1 the value d⁽ˡ⁾_{l+1}.
  const top = p * m;
  rows[top] = 1;
  for (let j = 1; j <= p; j++) rows[top + j] = -phi[j - 1];
  for (let l = p; l >= 1; l--) {
    const o = l * m;
    const below = o - m;
    const kappa = rows[o + l];
    const den = 1 - kappa * kappa;
    if (!(den > 0) || !(Math.abs(kappa) < 1)) return false;
    if (levels) for (let k = 0; k <= l; k++) levels[o + k] = d[k];
    for (let j = 0; j < l; j++) rows[below + j] = (rows[o + j] - kappa * rows[o + l - j]) / den;
    // d: entries 0…l, updated in place in pairs (k, l − k).
    for (let k = 0, h = l; k <= h; k++, h--) {
      const dk = d[k];
      const dh = d[h];
      d[k] = (dk - kappa * dh) / den;
      if (h !== k) d[h] = (dh - kappa * dk) / den;
    }
    rows[below + l] = d[l];
  }
  gamma[0] = d[0];
  for (let l = 1; l <= p; l++) {
    const o = (l - 1) * m;
    let v = rows[o + l];
    for (let j = 1; j < l; j++) v -= rows[o + j] * gamma[l - j];
    gamma[l] = v;
  }
  return true;
}

/**
 * The adjoint of stepDownSolve (reverse mode through its steps, Griewank & Walther 2008, ch. 3): given
 * ḡ = ∂L/∂γ(0…p) (overwritten), adds ∂L/∂d (the right-hand side) to dBar and ∂L/∂φ to phiBar — the same as
 * λ = A⁻ᵀḡ, d̄ = λ, φ̄ⱼ = Σₖ λₖ γ(|k − j|) for the system's matrix A, in O(p²) rather than O(p³). Needs the
 * `rows`, `levels` and γ of a successful stepDownSolve on the same φ; `rowsBar` is (p+1)² numbers of scratch.
 */
export function stepDownAdjoint(
  phi: Float64Array,
  rows: Float64Array,
  levels: Float64Array,
  gamma: Float64Array,
  gBar: Float64Array,
  dBar: Float64Array,
  phiBar: Float64Array,
  rowsBar: Float64Array,
): void {
  const p = phi.length;
  const m = p + 1;
  rowsBar.fill(0, 0, m * m);
  dBar.fill(0, 0, m);
  // γ(l) = d_l − Σ_{j=1}^{l−1} r^{(l−1)}_j γ(l − j), last l first; γ(0) = d₀.
  for (let l = p; l >= 1; l--) {
    const gb = gBar[l];
    dBar[l] += gb;
    const o = (l - 1) * m;
    for (let j = 1; j < l; j++) {
      rowsBar[o + j] -= gb * gamma[l - j];
      gBar[l - j] -= gb * rows[o + j];
    }
  }
  dBar[0] += gBar[0];
  // The step-downs, degree 1 first (the reverse of their order).
  for (let l = 1; l <= p; l++) {
    const o = l * m;
    const below = o - m;
    const kappa = rows[o + l];
    const den = 1 - kappa * kappa;
    let kappaBar = 0;
    let denBar = 0;
    // d′_k = (d_k − κ d_{l−k}) / den, k = 0…l, from d = levels row l.
    for (let k = 0, h = l; k <= h; k++, h--) {
      const ak = dBar[k] / den;
      const ah = h !== k ? dBar[h] / den : 0;
      const dk = levels[o + k];
      const dh = levels[o + h];
      dBar[k] = ak - kappa * ah;
      if (h !== k) dBar[h] = ah - kappa * ak;
      else dBar[k] = ak - kappa * ak;
      kappaBar -= ak * dh + ah * dk;
      denBar -= (ak * (dk - kappa * dh) + ah * (dh - kappa * dk)) / den;
    }
    // r^{(l−1)}_j = (r^{(l)}_j − κ r^{(l)}_{l−j}) / den, j = 0…l − 1.
    for (let j = 0; j < l; j++) {
      const a = rowsBar[below + j] / den;
      if (a === 0) continue;
      rowsBar[o + j] += a;
      rowsBar[o + l - j] -= kappa * a;
      kappaBar -= a * rows[o + l - j];
      denBar -= a * rows[below + j];
    }
    kappaBar -= 2 * kappa * denBar;
    rowsBar[o + l] += kappaBar;
  }
  // The top row is 1, −φ₁, …, −φ_p.
  for (let j = 1; j <= p; j++) phiBar[j - 1] -= rowsBar[p * m + j];
}

/** Gaussian elimination with partial pivoting; A (row-major, n×n) and b are overwritten. */
export function solveDense(
  A: Float64Array,
  b: Float64Array,
  n: number,
  out: Float64Array = new Float64Array(n),
): Float64Array {
  for (let col = 0; col < n; col++) {
    let piv = col;
    for (let r = col + 1; r < n; r++) if (Math.abs(A[r * n + col]) > Math.abs(A[piv * n + col])) piv = r;
    if (piv !== col) {
      for (let k = 0; k < n; k++) {
        const t = A[col * n + k];
        A[col * n + k] = A[piv * n + k];
        A[piv * n + k] = t;
      }
      const t = b[col];
      b[col] = b[piv];
      b[piv] = t;
    }
    const d = A[col * n + col];
    for (let r = col + 1; r < n; r++) {
      const f = A[r * n + col] / d;
      if (f === 0) continue;
      for (let k = col; k < n; k++) A[r * n + k] -= f * A[col * n + k];
      b[r] -= f * b[col];
    }
  }
  const x = out;
  for (let r = n - 1; r >= 0; r--) {
    let v = b[r];
    for (let k = r + 1; k < n; k++) v -= A[r * n + k] * x[k];
    x[r] = v / A[r * n + r];
  }
  return x;
}
