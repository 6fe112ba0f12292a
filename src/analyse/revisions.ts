/**
 * Firmness of the latest estimate, measured by a real-time revision study: for each of the last K periods,
 * decompose the data as it stood then (cut at that period), take the trend's year-over-year percent change
 * at the cut — the first estimate — and compare it with the estimate for the same period from all the data.
 * The mean absolute revision and the 10th–90th percentile range of the revisions (an 80% range, quantile
 * type 7 of Hyndman & Fan 1996) say how far a first estimate typically moves. The approach is that of
 * revision analyses of seasonal adjustment (e.g. Findley, Monsell, Bell, Otto & Chen 1998, "New
 * capabilities and methods of the X-12-ARIMA seasonal-adjustment program", JBES 16(2), §5 on revision
 * histories).
 *
 *   first estimates [2.0, 3.0], latest [2.5, 2.5] → revisions [−0.5, 0.5], mean absolute 0.5
 */
import type { Revision } from '../brief/model.js';
import { percentChange } from './change.js';

export interface RevisionStudy {
  revisions: Revision[];
  meanAbsoluteRevision: number;
  range80: [number, number];
}

/**
 * `trendOf` decomposes a prefix of the series and returns its trend. Cuts run from index − K to
 * index − 1; a cut too short to decompose (trendOf throws or returns NaN) is skipped.
 */
export function revisionStudy(
  values: Float64Array,
  latestTrend: ArrayLike<number>,
  index: number,
  lag: number,
  periods: number,
  minLength: number,
  dates: string[],
  trendOf: (prefix: Float64Array) => Float64Array,
  /** How the yearly change is measured: percent (the default) or, for a change expressed in units, the difference. */
  measure: (current: number, base: number) => number = percentChange,
): RevisionStudy {
  const revisions: Revision[] = [];
  for (let cut = Math.max(index - periods, lag, minLength - 1); cut < index; cut++) {
    const prefix = values.subarray(0, cut + 1);
    let trend: Float64Array;
    try {
      trend = trendOf(prefix);
    } catch {
      continue;
    }
    const first = measure(trend[cut], trend[cut - lag]);
    const latest = measure(latestTrend[cut], latestTrend[cut - lag]);
    if (Number.isNaN(first) || Number.isNaN(latest)) continue;
    revisions.push({ index: cut, date: dates[cut], first, latest, revision: first - latest });
  }
  const r = revisions.map((v) => v.revision);
  const meanAbsoluteRevision = r.length > 0 ? r.reduce((a, b) => a + Math.abs(b), 0) / r.length : Number.NaN;
  return { revisions, meanAbsoluteRevision, range80: [quantile(r, 0.1), quantile(r, 0.9)] };
}

/** Sample quantile, type 7 (Hyndman & Fan 1996; R's default): linear between order statistics. */
export function quantile(values: number[], p: number): number {
  if (values.length === 0) return Number.NaN;
  const s = [...values].sort((a, b) => a - b);
  const h = (s.length - 1) * p;
  const lo = Math.floor(h);
  const hi = Math.min(lo + 1, s.length - 1);
  return s[lo] + (h - lo) * (s[hi] - s[lo]);
}
