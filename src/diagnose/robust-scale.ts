/**
 * Median and scaled median absolute deviation (1.4826·MAD, which estimates the standard deviation of a
 * normal sample; Hampel 1974, "The influence curve and its role in robust estimation", JASA 69(346)).
 * NaN values are skipped; an empty input gives NaN for both.
 *
 *   robustScale([1, 2, 3, 4, 100]) → { median: 3, mad: 1.4826 }   (|x − 3| = 2, 1, 0, 1, 97 → median 1)
 */
export function robustScale(values: ArrayLike<number>): { median: number; mad: number } {
  // One typed array, sorted twice in place: a long series' values as a plain list, mapped and copied, were
  // tens of megabytes of garbage per call that only a full collection frees.
  let count = 0;
  for (let i = 0; i < values.length; i++) if (!Number.isNaN(values[i])) count++;
  if (count === 0) return { median: Number.NaN, mad: Number.NaN };
  const work = new Float64Array(count);
  for (let i = 0, m = 0; i < values.length; i++) if (!Number.isNaN(values[i])) work[m++] = values[i];
  const median = sortedMedian(work.sort());
  for (let i = 0; i < count; i++) work[i] = Math.abs(work[i] - median);
  return { median, mad: 1.4826 * sortedMedian(work.sort()) };
}

/** Median of an ascending array (the mean of the two middle values for an even count). */
function sortedMedian(s: Float64Array): number {
  const n = s.length;
  return n % 2 === 1 ? s[(n - 1) / 2] : (s[n / 2 - 1] + s[n / 2]) / 2;
}
