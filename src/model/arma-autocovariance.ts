/**
 * Autocovariances γ(0), …, γ(maxLag) of a stationary ARMA process with unit innovation variance,
 * xₜ = Σ phi[j−1] x_{t−j} + εₜ + Σ theta[j−1] ε_{t−j}, and its ψ weights (the MA(∞) coefficients).
 * Source: Brockwell & Davis, Time Series: Theory and Methods, 2nd ed. (1991), §3.3, the "third method":
 * γ(k) − Σ φⱼγ(k−j) = Σ_{j=k}^{q} θⱼψ_{j−k} for k ≤ p solved as a linear system, then the recursion.
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
  const A = ws ? ws.A.fill(0, 0, m * m) : new Float64Array(m * m);
  const b = ws ? ws.b : new Float64Array(m);
  for (let k = 0; k < m; k++) {
    A[k * m + k] += 1;
    for (let j = 1; j <= p; j++) A[k * m + Math.abs(k - j)] -= phi[j - 1];
    b[k] = c[k] ?? 0;
  }
  solveDense(A, b, m, gamma);
  for (let k = m; k < gamma.length; k++) {
    let v = k <= q ? c[k] : 0;
    for (let j = 1; j <= p; j++) v += phi[j - 1] * gamma[k - j];
    gamma[k] = v;
  }
  return gamma.subarray(0, maxLag + 1);
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
