/**
 * Median and scaled median absolute deviation (1.4826·MAD, which estimates the standard deviation of a
 * normal sample; Hampel 1974, "The influence curve and its role in robust estimation", JASA 69(346)).
 * NaN values are skipped; an empty input gives NaN for both.
 *
 *   robustScale([1, 2, 3, 4, 100]) → { median: 3, mad: 1.4826 }   (|x − 3| = 2, 1, 0, 1, 97 → median 1)
 */
export function robustScale(values: ArrayLike<number>): { median: number; mad: number } {
  const finite: number[] = [];
  for (let i = 0; i < values.length; i++) if (!Number.isNaN(values[i])) finite.push(values[i]);
  if (finite.length === 0) return { median: Number.NaN, mad: Number.NaN };
  const median = medianOf(finite);
  const deviations = finite.map((v) => Math.abs(v - median));
  return { median, mad: 1.4826 * medianOf(deviations) };
}

/** Median of finite numbers (the mean of the two middle values for an even count). */
export function medianOf(values: number[]): number {
  const s = Float64Array.from(values).sort();
  const n = s.length;
  if (n === 0) return Number.NaN;
  return n % 2 === 1 ? s[(n - 1) / 2] : (s[n / 2 - 1] + s[n / 2]) / 2;
}
