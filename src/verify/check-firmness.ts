/**
 * Check of the firmness statement: the counts and the summary of the revision study agree with its list
 * of revisions (mean absolute revision; the range as type-7 quantiles, Hyndman & Fan 1996, and how many
 * revisions it holds), every first estimate is compared with a settled one (before the provisional zone),
 * each revision is later minus earlier, and the provisional count is that of the analysis.
 */
import type { FirmnessClaim } from '../vocabulary/claims.js';
import type { VerifyContext } from './context.js';
import { agrees, quantile7 } from './numbers.js';

export function checkFirmness(c: FirmnessClaim, ctx: VerifyContext): string[] {
  const f = ctx.s.analysis.firmness;
  const out: string[] = [];
  if (c.provisionalCount !== f.provisionalCount) out.push('provisional count differs from the analysis');
  if (c.periodsChecked !== f.revisions.length)
    out.push(`says ${c.periodsChecked} periods checked, ${f.revisions.length} listed`);
  const n = ctx.s.reportingIndex + 1;
  if (c.settledBefore !== n - f.provisionalCount)
    out.push(`settled before index ${c.settledBefore}, the provisional zone starts at ${n - f.provisionalCount}`);
  for (const r of f.revisions) {
    if (r.index >= n - f.provisionalCount)
      out.push(`a first estimate at ${r.date} is compared inside the provisional zone`);
    if (r.revision !== r.latest - r.first) out.push(`the revision at ${r.date} is not later minus earlier`);
  }
  if (f.revisions.length === 0) return out;
  const rev = f.revisions.map((r) => r.revision);
  out.push(...checkRevisionSummary(c, rev));
  // What the range holds, counted with its ends widened by 1e-9 of the largest revision (equal revisions
  // computed along different paths differ in the last bit).
  const slack = 1e-9 * Math.max(...rev.map(Math.abs));
  const inside = rev.filter((v) => v >= c.range.low - slack && v <= c.range.high + slack).length;
  if (inside !== c.withinRange) out.push(`says ${c.withinRange} revisions lie in the range, the list has ${inside}`);
  return out;
}

/** A summary of revisions (their mean absolute value, a central range as type-7 quantiles) against the list. */
export function checkRevisionSummary(
  c: { meanAbsoluteRevision: number; range: { low: number; high: number; share: number } },
  rev: number[],
): string[] {
  const out: string[] = [];
  const mean = rev.reduce((a, b) => a + Math.abs(b), 0) / rev.length;
  if (!agrees(c.meanAbsoluteRevision, mean, 100))
    out.push(`mean absolute revision ${c.meanAbsoluteRevision}, list gives ${mean}`);
  const tail = (1 - c.range.share) / 2;
  const lo = quantile7(rev, tail);
  const hi = quantile7(rev, 1 - tail);
  if (!agrees(c.range.low, lo, 100) || !agrees(c.range.high, hi, 100))
    out.push(`range [${c.range.low}, ${c.range.high}], list gives [${lo}, ${hi}]`);
  return out;
}
