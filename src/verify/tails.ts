/**
 * Upper tails of the F and chi-square distributions for the verifier, by numerical integration of the
 * densities (composite Simpson rule) rather than by the incomplete beta and gamma functions the pipeline
 * uses (diagnose/f-distribution.ts, chi-square.ts), so that a fault there is not repeated here.
 *
 * F: with u = df1·F / (df1·F + df2) ~ Beta(df1/2, df2/2) (Abramowitz & Stegun 1964, 26.6.2) and
 * u = sin²θ, the density becomes 2·sin^(df1−1)θ·cos^(df2−1)θ on [0, π/2], with no end singularity.
 * Chi-square: with x = s², the density of s is proportional to s^(df−1)·e^(−s²/2) on [0, ∞).
 * Both are integrated in log space against the integrand's largest value, so tails down to about 1e-300
 * keep their relative accuracy (about 1e-10 with the grid used).
 *
 *   fTail(1, 1, 1) → 0.5;  chiSquareTail(2, 2) → e^−1
 */
const POINTS = 20_000;

/** e·ln(x), with 0·ln(0) = 0 (a power of zero is one, even at zero). */
const powLog = (e: number, x: number) => (e === 0 ? 0 : e * Math.log(x));

/** ∫ exp(logf(x) − top) over [a, b] by Simpson's rule on an even number of intervals. */
function simpson(logf: (x: number) => number, a: number, b: number, top: number, intervals = POINTS): number {
  if (!(b > a)) return 0;
  const h = (b - a) / intervals;
  let sum = 0;
  for (let i = 0; i <= intervals; i++) {
    const v = Math.exp(logf(a + i * h) - top);
    const w = i === 0 || i === intervals ? 1 : i % 2 ? 4 : 2;
    sum += Number.isFinite(v) ? w * v : 0;
  }
  return (sum * h) / 3;
}

/** The largest of logf over a grid of [a, b]; where the density peaks, for scaling. */
function peak(logf: (x: number) => number, a: number, b: number): number {
  let top = Number.NEGATIVE_INFINITY;
  for (let i = 0; i <= 2000; i++) {
    const v = logf(a + ((b - a) * i) / 2000);
    if (v > top) top = v;
  }
  return top;
}

export function fTail(f: number, df1: number, df2: number): number {
  if (!(f >= 0) || !(df1 > 0) || !(df2 > 0)) return Number.NaN;
  if (f === Number.POSITIVE_INFINITY) return 0;
  const logf = (t: number) => powLog(df1 - 1, Math.sin(t)) + powLog(df2 - 1, Math.cos(t));
  const u = (df1 * f) / (df1 * f + df2);
  const from = Math.asin(Math.sqrt(u));
  const top = peak(logf, 1e-12, Math.PI / 2 - 1e-12);
  const whole = simpson(logf, 0, Math.PI / 2, top, 4 * POINTS);
  return simpson(logf, from, Math.PI / 2, top) / whole;
}

export function chiSquareTail(x: number, df: number): number {
  if (!(x >= 0) || !(df > 0)) return Number.NaN;
  const logf = (s: number) => powLog(df - 1, s) - (s * s) / 2;
  const end = Math.max(Math.sqrt(x), Math.sqrt(df)) + 40;
  const top = peak(logf, 1e-12, end);
  const whole = simpson(logf, 0, end, top, 4 * POINTS);
  return simpson(logf, Math.sqrt(x), end, top) / whole;
}
