/**
 * Unusual periods: remainder values beyond median ± 3 × 1.4826 × MAD of the remainder (common practice; a
 * robust "three sigma" rule, Hampel 1974). Multiplicative remainders (around 1) are judged on their logs so
 * that a doubling and a halving count alike. NaN remainders are never outliers.
 *
 *   remainder [0, 1, −1, 0, 12] → median 0, MAD 1 → scale 1.4826 → 12 is an outlier with score 8.1
 */
import { robustScale } from './robust-scale.js';

export interface RemainderOutlier {
  index: number;
  /** (remainder − median) / (1.4826·MAD), on the log scale for multiplicative remainders. */
  score: number;
}

export const OUTLIER_THRESHOLD = 3;

export function remainderOutliers(remainder: ArrayLike<number>, multiplicative: boolean): RemainderOutlier[] {
  const r = Float64Array.from({ length: remainder.length }, (_, i) =>
    multiplicative ? Math.log(remainder[i]) : remainder[i],
  );
  const { median, mad } = robustScale(r);
  const out: RemainderOutlier[] = [];
  if (!(mad > 0)) return out;
  for (let i = 0; i < r.length; i++) {
    const score = (r[i] - median) / mad;
    if (Math.abs(score) > OUTLIER_THRESHOLD) out.push({ index: i, score });
  }
  return out;
}
