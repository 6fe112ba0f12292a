/**
 * Covariance of the state vector of a stationary ARMA process at its start, unit innovation variance, in the
 * state-space form of Gardner, Harvey & Phillips (1980) (state dimension r = max(p, q + 1); the state's i-th
 * element is Σ_{k≥0} φ_{i+k+1} x_{t−1−k} + θ_{i+k} ε_{t−k}). With Y = (x_{t−1}, …, x_{t−r}) and
 * E = (εₜ, …, ε_{t−r+1}) the state is A·Y + B·E, so P₀ = AΓA' + ACB' + BC'A' + BB', where Γ holds the
 * autocovariances and C the ψ weights (Cov(x_{t−1−k}, ε_{t−l}) = ψ_{l−1−k}).
 * Source: Gardner, Harvey & Phillips (1980), "Algorithm AS 154", Applied Statistics 29(3), 311–322, which
 * solves for the same matrix as a linear system (R's getQ0); Brockwell & Davis (1991), §3.3 for Γ and ψ.
 *
 *   armaInitialCovariance([0.5], []) → [[4/3]]   (1 / (1 − 0.5²))
 */
import { armaAutocovariance, psiWeights } from './arma-autocovariance.js';

export function armaInitialCovariance(phi: Float64Array, theta: Float64Array): Float64Array {
  const p = phi.length;
  const q = theta.length;
  const r = Math.max(p, q + 1);
  // Γ is the autocovariance of the ARMA process itself, not of its AR part alone.
  const g = armaAutocovariance(phi, theta, r);
  const psi = psiWeights(phi, theta, r + 1);
  const A = new Float64Array(r * r);
  const B = new Float64Array(r * r);
  for (let i = 0; i < r; i++) {
    for (let k = 0; k + i < r; k++) {
      const j = i + k + 1;
      A[i * r + k] = j <= p ? phi[j - 1] : 0;
      const m = i + k;
      B[i * r + k] = m === 0 ? 1 : m <= q ? theta[m - 1] : 0;
    }
  }
  // AΓ and AC (r×r each); Γ[k][l] = γ(|k−l|), C[k][l] = ψ_{l−1−k} for l > k.
  const AG = new Float64Array(r * r);
  const AC = new Float64Array(r * r);
  for (let i = 0; i < r; i++) {
    for (let l = 0; l < r; l++) {
      let sg = 0;
      let sc = 0;
      for (let k = 0; k < r; k++) {
        const a = A[i * r + k];
        if (a === 0) continue;
        sg += a * g[Math.abs(k - l)];
        if (l > k) sc += a * psi[l - 1 - k];
      }
      AG[i * r + l] = sg;
      AC[i * r + l] = sc;
    }
  }
  const P = new Float64Array(r * r);
  for (let i = 0; i < r; i++) {
    for (let j = i; j < r; j++) {
      let v = 0;
      for (let k = 0; k < r; k++) {
        const ajk = A[j * r + k];
        const bjk = B[j * r + k];
        const bik = B[i * r + k];
        v += AG[i * r + k] * ajk + AC[i * r + k] * bjk + bik * bjk;
        // (BC'A')[i][j] = Σ_k B[i][k] (AC)[j][k]
        v += bik * AC[j * r + k];
      }
      P[i * r + j] = v;
      P[j * r + i] = v;
    }
  }
  return P;
}
