/**
 * Small numeric helpers of the verifier, written apart from the pipeline's own so that a fault there is
 * not repeated here: agreement within a tolerance, median, and the type-7 quantile (Hyndman & Fan 1996,
 * "Sample quantiles in statistical packages", The American Statistician 50(4); R's default).
 *
 *   quantile7([1, 2, 3, 4], 0.1) → 1.3     (h = 3 × 0.1 = 0.3: 1 + 0.3 × (2 − 1))
 */

/** Whether a stated number agrees with the recomputed one: both NaN, or within `rel` of `scale`. */
export function agrees(stated: number, recomputed: number, scale: number, rel = 1e-9): boolean {
  if (Number.isNaN(stated) || Number.isNaN(recomputed)) return Number.isNaN(stated) && Number.isNaN(recomputed);
  return Math.abs(stated - recomputed) <= rel * Math.max(Math.abs(scale), Math.abs(recomputed), 1e-300);
}

/** Largest absolute finite value, the scale tolerances are taken of. */
export function magnitude(values: ArrayLike<number>): number {
  let m = 0;
  for (let i = 0; i < values.length; i++) if (Number.isFinite(values[i])) m = Math.max(m, Math.abs(values[i]));
  return m;
}

export function median(values: number[]): number {
  const s = [...values].sort((a, b) => a - b);
  const n = s.length;
  if (n === 0) return Number.NaN;
  return n % 2 ? s[(n - 1) / 2] : (s[n / 2 - 1] + s[n / 2]) / 2;
}

export function quantile7(values: number[], p: number): number {
  const s = [...values].sort((a, b) => a - b);
  if (s.length === 0) return Number.NaN;
  const h = (s.length - 1) * p;
  const lo = Math.floor(h);
  return s[lo] + (h - lo) * ((s[Math.min(lo + 1, s.length - 1)] ?? s[lo]) - s[lo]);
}
