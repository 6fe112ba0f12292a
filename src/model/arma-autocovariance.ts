/**
 * Autocovariances γ(0), …, γ(maxLag) of a stationary ARMA process with unit innovation variance,
 * xₜ = Σ phi[j−1] x_{t−j} + εₜ + Σ theta[j−1] ε_{t−j}, and its ψ weights (the MA(∞) coefficients).
 * Source: Brockwell & Davis, Time Series: Theory and Methods, 2nd ed. (1991), §3.3, the "third method":
 * γ(k) − Σ φⱼγ(k−j) = Σ_{j=k}^{q} θⱼψ_{j−k} for k ≤ p, then the recursion. The (p+1)-system is solved in
 * O(p²) by the step-down (Durbin–Levinson run backwards) of the AR polynomial, applied to both sides, the
 * approach of Tunnicliffe Wilson (1979), "Some efficient computational procedures for high order ARMA
 * models", Journal of Statistical Computation and Simulation 8, 301–309 (cited from memory; the steps are
 * derived in stepDownSolve). Where a step-down coefficient reaches ±1 (not stationary) it falls back to
 * Gaussian elimination.
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
  if (!stepDownSolve(phi, b, A, gamma)) {
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
export function stepDownSolve(phi: Float64Array, d: Float64Array, rows: Float64Array, gamma: Float64Array): boolean {
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
