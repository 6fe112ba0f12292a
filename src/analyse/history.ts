/**
 * What the record of earlier briefs says about this one: the trend's yearly change the last brief published
 * for its period beside the same figure from today's data, the past values the source changed since then,
 * and — once six or more earlier periods were published — the revisions between published first estimates
 * and today's (a real-vintage revision study: Mankiw & Shapiro, "News or noise? An analysis of GNP
 * revisions", Survey of Current Business 66(5), 1986, compare first releases with later ones the same
 * way). The range is the 10th–90th percentile, quantile type 7 (Hyndman & Fan 1996), as in revisions.ts.
 *
 *   last brief (August) published +0.4 %; today's trend gives 100·(101.9/102.0 − 1) = −0.1 % for August
 */
import type { PastIssue, Revision, SeriesHistory } from '../vocabulary/brief.js';
import { percentChange } from './change.js';
import { quantile } from './revisions.js';

/** Earlier periods published before real-vintage revisions are shown (fewer say little about a spread). */
export const PUBLISHED_MIN = 6;

export function seriesHistory(
  past: PastIssue[],
  dates: string[],
  observed: ArrayLike<number>,
  trend: ArrayLike<number>,
  lag: number,
): SeriesHistory | null {
  const reporting = dates[dates.length - 1];
  const earlier = past.filter((p) => p.period < reporting);
  if (earlier.length === 0) return null;
  const at = new Map(dates.map((d, i) => [d, i]));
  const yoyNow = (date: string): number => {
    const i = at.get(date);
    return i === undefined || i < lag ? Number.NaN : percentChange(trend[i], trend[i - lag]);
  };
  const changeNow = (date: string): number => {
    const i = at.get(date);
    return i === undefined || i < lag ? Number.NaN : trend[i] - trend[i - lag];
  };
  // The last brief: the latest period, its latest issue.
  const last = earlier.reduce((a, b) => (b.period > a.period || (b.period === a.period && b.issue > a.issue) ? b : a));
  const sourceRevisions: SeriesHistory['sourceRevisions'] = [];
  for (let k = 0; k < last.dates.length; k++) {
    const i = at.get(last.dates[k]);
    if (i === undefined) continue;
    const before = last.values[k];
    const after = observed[i];
    if (sameValue(before, after)) continue;
    sourceRevisions.push({ date: last.dates[k], before, after });
  }
  // First published estimate of each period: its lowest issue.
  const firsts = new Map<string, PastIssue>();
  for (const p of earlier) {
    const seen = firsts.get(p.period);
    if (!seen || p.issue < seen.issue) firsts.set(p.period, p);
  }
  const revisions: Revision[] = [];
  for (const p of [...firsts.values()].sort((a, b) => (a.period < b.period ? -1 : 1))) {
    const latest = yoyNow(p.period);
    if (!Number.isFinite(p.trendYoYPercent) || !Number.isFinite(latest)) continue;
    revisions.push({
      index: at.get(p.period) ?? -1,
      date: p.period,
      first: p.trendYoYPercent,
      latest,
      revision: latest - p.trendYoYPercent,
    });
  }
  const r = revisions.map((v) => v.revision);
  return {
    sinceLast: {
      period: last.period,
      published: last.trendYoYPercent,
      now: yoyNow(last.period),
      publishedChange: last.trendYoYChange,
      nowChange: changeNow(last.period),
    },
    sourceRevisions,
    published:
      revisions.length >= PUBLISHED_MIN
        ? {
            revisions,
            meanAbsoluteRevision: r.reduce((a, b) => a + Math.abs(b), 0) / r.length,
            range80: [quantile(r, 0.1), quantile(r, 0.9)],
          }
        : null,
    briefs: firsts.size,
  };
}

/** Equal values, both gaps, or equal to the 15 significant digits a decimal file holds. */
function sameValue(a: number, b: number): boolean {
  if (Number.isNaN(a) || Number.isNaN(b)) return Number.isNaN(a) && Number.isNaN(b);
  return a === b || Math.abs(a - b) <= 1e-15 * Math.max(Math.abs(a), Math.abs(b));
}
