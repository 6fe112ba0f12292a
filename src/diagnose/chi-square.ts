/**
 * Upper tail of the chi-square distribution, P(X > x) for `df` degrees of freedom: the regularised upper
 * incomplete gamma function Q(df/2, x/2) (Abramowitz & Stegun 1964, Handbook of Mathematical Functions,
 * 26.4.19), evaluated by its series below a + 1 and by its continued fraction (modified Lentz) above, as in
 * Press et al., Numerical Recipes, 3rd ed., §6.2.
 *
 *   chiSquareUpperTail(2, 2) → e^−1 = 0.36788  (with two degrees of freedom the tail is e^(−x/2))
 */
import { logGamma } from './f-distribution.js';

export function chiSquareUpperTail(x: number, df: number): number {
  if (Number.isNaN(x) || !(df > 0)) return Number.NaN;
  if (x <= 0) return 1;
  if (!Number.isFinite(x)) return 0;
  const a = df / 2;
  const z = x / 2;
  const front = Math.exp(-z + a * Math.log(z) - logGamma(a));
  if (z < a + 1) {
    // P(a, z) by its series: e^−z z^a / Γ(a) · Σ z^n / (a(a+1)…(a+n)).
    let term = 1 / a;
    let sum = term;
    for (let n = 1; n < 10_000; n++) {
      term *= z / (a + n);
      sum += term;
      if (Math.abs(term) < Math.abs(sum) * 1e-16) break;
    }
    return 1 - front * sum;
  }
  const tiny = 1e-300;
  let b = z + 1 - a;
  let c = 1 / tiny;
  let d = 1 / b;
  let h = d;
  for (let i = 1; i < 10_000; i++) {
    const an = -i * (i - a);
    b += 2;
    d = an * d + b;
    if (Math.abs(d) < tiny) d = tiny;
    c = b + an / c;
    if (Math.abs(c) < tiny) c = tiny;
    d = 1 / d;
    const del = d * c;
    h *= del;
    if (Math.abs(del - 1) < 1e-16) break;
  }
  return front * h;
}
