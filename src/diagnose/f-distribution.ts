/**
 * Upper tail of the F distribution, P(F > f) for df1 and df2 degrees of freedom, through the regularised
 * incomplete beta function: P(F > f) = I_x(df2/2, df1/2) with x = df2 / (df2 + df1·f)
 * (Abramowitz & Stegun 1964, Handbook of Mathematical Functions, 26.6.2). I_x(a, b) by its continued
 * fraction evaluated with the modified Lentz method (Press et al., Numerical Recipes, 3rd ed., §6.4), and
 * ln Γ by the Lanczos approximation (g = 7, n = 9 coefficients; Lanczos 1964, SIAM J. Numer. Anal. 1).
 *
 *   fUpperTail(1, 1, 1) → 0.5  (the F(1,1) median is 1)
 */
export function fUpperTail(f: number, df1: number, df2: number): number {
  if (Number.isNaN(f) || !(df1 > 0) || !(df2 > 0)) return Number.NaN;
  if (f <= 0) return 1;
  if (!Number.isFinite(f)) return 0;
  return regularisedBeta(df2 / (df2 + df1 * f), df2 / 2, df1 / 2);
}

/** I_x(a, b), the regularised incomplete beta function. */
export function regularisedBeta(x: number, a: number, b: number): number {
  if (x <= 0) return 0;
  if (x >= 1) return 1;
  const lnFront = logGamma(a + b) - logGamma(a) - logGamma(b) + a * Math.log(x) + b * Math.log(1 - x);
  const front = Math.exp(lnFront);
  // The continued fraction converges fast for x < (a + 1)/(a + b + 2); use the symmetry otherwise.
  if (x < (a + 1) / (a + b + 2)) return (front * betaFraction(x, a, b)) / a;
  return 1 - (front * betaFraction(1 - x, b, a)) / b;
}

function betaFraction(x: number, a: number, b: number): number {
  const tiny = 1e-300;
  const eps = 1e-15;
  const qab = a + b;
  const qap = a + 1;
  const qam = a - 1;
  let c = 1;
  let d = 1 - (qab * x) / qap;
  if (Math.abs(d) < tiny) d = tiny;
  d = 1 / d;
  let h = d;
  for (let m = 1; m <= 10_000; m++) {
    const m2 = 2 * m;
    let aa = (m * (b - m) * x) / ((qam + m2) * (a + m2));
    d = 1 + aa * d;
    if (Math.abs(d) < tiny) d = tiny;
    c = 1 + aa / c;
    if (Math.abs(c) < tiny) c = tiny;
    d = 1 / d;
    h *= d * c;
    aa = (-(a + m) * (qab + m) * x) / ((a + m2) * (qap + m2));
    d = 1 + aa * d;
    if (Math.abs(d) < tiny) d = tiny;
    c = 1 + aa / c;
    if (Math.abs(c) < tiny) c = tiny;
    d = 1 / d;
    const del = d * c;
    h *= del;
    if (Math.abs(del - 1) < eps) break;
  }
  return h;
}

const LANCZOS = [
  0.99999999999980993, 676.5203681218851, -1259.1392167224028, 771.32342877765313, -176.61502916214059,
  12.507343278686905, -0.13857109526572012, 9.9843695780195716e-6, 1.5056327351493116e-7,
];

/** ln Γ(x) for x > 0. */
export function logGamma(x: number): number {
  if (x < 0.5) return Math.log(Math.PI / Math.abs(Math.sin(Math.PI * x))) - logGamma(1 - x);
  const z = x - 1;
  let s = LANCZOS[0];
  for (let i = 1; i < 9; i++) s += LANCZOS[i] / (z + i);
  const t = z + 7.5;
  return 0.5 * Math.log(2 * Math.PI) + (z + 0.5) * Math.log(t) - t + Math.log(s);
}
