/**
 * Firmness of the latest estimate, measured by a real-time revision study: for each of K cut-off periods,
 * fit the data as they stood then (cut at that period), take the trend's year-over-year percent change at
 * the cut — the first estimate — and compare it with the settled estimate of the same change from all the
 * data. Cuts are chosen so that the settled estimate exists: they end before the provisional zone (the
 * last trend values, which rest on end weights and will themselves be revised), so first estimates are
 * never compared with other provisional ones. A revision is the later estimate minus the earlier one,
 * positive when the first estimate was too low: the convention of official revision analysis (McKenzie
 * 2006, "Undertaking revisions and real-time data analysis using the OECD Main Economic Indicators original
 * release data and revisions database", OECD Statistics Working Paper STD/DOC(2006)2; cited from memory). The mean absolute revision and the 10th–90th percentile range (quantile type 7 of
 * Hyndman & Fan 1996) say how far a first estimate typically moves; the study also counts how many
 * revisions the range really holds, since with few cuts it is not exactly eight in ten. The approach is
 * that of revision histories of seasonal adjustment (Findley, Monsell, Bell, Otto & Chen 1998, "New
 * capabilities and methods of the X-12-ARIMA seasonal-adjustment program", JBES 16(2), §5).
 *
 *   first estimates [2.0, 3.0], settled [2.5, 2.5] → revisions [+0.5, −0.5], mean absolute 0.5
 */
import type { Revision } from '../vocabulary/brief.js';
import { percentChange } from './change.js';

/** Why a study has no revisions: 'none' when it ran. */
export type StudyLimit = 'none' | 'too-short' | 'no-end-estimate';

export interface RevisionStudy {
  revisions: Revision[];
  meanAbsoluteRevision: number;
  range80: [number, number];
  /** How many revisions lie inside range80, ends included. */
  withinRange80: number;
  limit: StudyLimit;
  /** Fewest periods of data that let the study make at least one cut. */
  neededLength: number;
}

export interface RevisionStudyInput {
  /** The data up to the reporting period. */
  values: Float64Array;
  /** The trend fitted to all of `values`. */
  settledTrend: ArrayLike<number>;
  /** First index whose trend value is still provisional; every cut lies before it. */
  settledBefore: number;
  /** Periods in a year (the year-over-year lag). */
  lag: number;
  /** How many cuts to make, the latest ones possible. */
  periods: number;
  /** Shortest prefix the fit accepts. */
  minLength: number;
  dates: string[];
  /**
   * Fits a prefix of the data and returns its trend (the same fit that made settledTrend). A cut whose fit
   * throws or gives NaN is skipped.
   */
  trendOf: (prefix: Float64Array) => Float64Array;
  /** How the yearly change is measured: percent (the default) or, for a change expressed in units, the difference. */
  measure?: (current: number, base: number) => number;
}

export function revisionStudy(x: RevisionStudyInput): RevisionStudy {
  const { values, settledTrend, lag, dates } = x;
  const measure = x.measure ?? percentChange;
  // The reporting period's own estimate is the one under study, never a settled one.
  const settledBefore = Math.min(x.settledBefore, values.length - 1);
  const earliest = Math.max(lag, x.minLength - 1);
  // A first cut at `earliest` needs every period up to it plus a provisional zone after it.
  const neededLength = earliest + 1 + (values.length - settledBefore);
  const revisions: Revision[] = [];
  let tried = 0;
  for (let cut = Math.max(settledBefore - x.periods, earliest); cut < settledBefore; cut++) {
    const latest = measure(settledTrend[cut], settledTrend[cut - lag]);
    if (Number.isNaN(latest)) continue;
    tried++;
    let trend: Float64Array;
    try {
      trend = x.trendOf(values.subarray(0, cut + 1));
    } catch {
      continue;
    }
    const first = measure(trend[cut], trend[cut - lag]);
    if (Number.isNaN(first)) continue;
    revisions.push({ index: cut, date: dates[cut], first, latest, revision: latest - first });
  }
  const r = revisions.map((v) => v.revision);
  const meanAbsoluteRevision = r.length > 0 ? r.reduce((a, b) => a + Math.abs(b), 0) / r.length : Number.NaN;
  const range80: [number, number] = [quantile(r, 0.1), quantile(r, 0.9)];
  // Ends included up to rounding: equal revisions computed along different paths differ in the last bit.
  const slack = 1e-9 * Math.max(0, ...r.map(Math.abs));
  const withinRange80 = r.filter((v) => v >= range80[0] - slack && v <= range80[1] + slack).length;
  const limit: StudyLimit = revisions.length > 0 ? 'none' : tried > 0 ? 'no-end-estimate' : 'too-short';
  return { revisions, meanAbsoluteRevision, range80, withinRange80, limit, neededLength };
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
