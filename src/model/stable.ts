/**
 * Whether every root of 1 − a₁z − … − aₖzᵏ lies outside the circle |z| = margin (margin 1: a stationary AR
 * polynomial; for an MA polynomial 1 + θ₁z + … pass a = −θ: invertibility). The step-down (Schur–Cohn)
 * recursion: the polynomial is stable exactly when every partial autocorrelation it implies is below one in
 * size. Scaling aₖ by marginᵏ moves the circle. Source: Brockwell & Davis, Time Series: Theory and Methods,
 * 2nd ed. (1991), §8.2 (Durbin–Levinson run backwards); Box, Jenkins, Reinsel & Ljung (2015), §3.2.
 * forecast::auto.arima rejects a model whose smallest root is within 1.01 of the origin: margin 1.01.
 *
 *   isStable([0.5]) → true (root 2);  isStable([1.2]) → false;  isStable([0.5], 2.5) → false
 */
export function isStable(a: ArrayLike<number>, margin = 1): boolean {
  let k = a.length;
  while (k > 0 && a[k - 1] === 0) k--;
  if (k === 0) return true;
  const cur = new Float64Array(k);
  let scale = 1;
  for (let i = 0; i < k; i++) {
    scale *= margin;
    cur[i] = a[i] * scale;
    if (!Number.isFinite(cur[i])) return false;
  }
  const work = new Float64Array(k);
  for (let j = k - 1; j >= 0; j--) {
    const r = cur[j];
    if (!(Math.abs(r) < 1)) return false;
    for (let i = 0; i < j; i++) work[i] = (cur[i] + r * cur[j - i - 1]) / (1 - r * r);
    for (let i = 0; i < j; i++) cur[i] = work[i];
  }
  return true;
}
