/**
 * Checks of the statements built from the record of earlier briefs. What an earlier brief published comes
 * from the record and cannot be recomputed from today's data; what the words say of today can: the change
 * of the trend over a year at the last brief's period, the values the source holds today, and the
 * published-against-today revisions with their summary (type-7 quantiles, Hyndman & Fan 1996).
 */
import type { PublishedFirmnessClaim, SinceLastBriefClaim, SourceRevisionsClaim } from '../vocabulary/claims.js';
import { checkRevisionSummary } from './check-firmness.js';
import type { VerifyContext } from './context.js';
import { agrees } from './numbers.js';
import { isYearBefore } from './year-back.js';

/** Index of the period a year before index i, by the calendar rule the words "a year before" promise. */
function yearBack(ctx: VerifyContext, i: number): number {
  const d = ctx.s.components.dates;
  for (let j = i - 1; j >= 0 && j >= i - 400; j--) if (isYearBefore(ctx.s.frequency, d[j], d[i])) return j;
  return -1;
}

/** The trend's change over a year at a period: percent of a positive base, or units; NaN when none. */
function trendChange(ctx: VerifyContext, iso: string, expression: 'relative' | 'absolute'): number {
  const i = ctx.indexOf(iso);
  const j = i < 0 ? -1 : yearBack(ctx, i);
  if (j < 0) return Number.NaN;
  const t = ctx.s.components.trend;
  if (expression === 'absolute') return t[i] - t[j];
  return t[j] > 0 ? 100 * (t[i] / t[j] - 1) : Number.NaN;
}

/** "higher" only of a rise, "lower" only of a fall, in the sentence about each figure. */
function wordsProblem(sentence: string, v: number, what: string): string | null {
  if (/\bhigher\b/.test(sentence) && !(v > 0)) return `says ${what} was higher, but it is ${v}`;
  if (/\blower\b/.test(sentence) && !(v < 0)) return `says ${what} was lower, but it is ${v}`;
  return null;
}

export function checkSinceLastBrief(c: SinceLastBriefClaim, ctx: VerifyContext): string[] {
  const out: string[] = [];
  if (!(c.period < ctx.s.reportingDate)) out.push(`the last brief's period ${c.period} is not before this one`);
  if (c.expression !== ctx.s.changeExpression)
    out.push(`puts the change as ${c.expression}, the series as ${ctx.s.changeExpression}`);
  const now = trendChange(ctx, c.period, c.expression);
  const scale = c.expression === 'relative' ? 100 : ctx.scale;
  if (!agrees(c.now, now, scale)) out.push(`gives ${c.now} for ${c.period} now, the trend gives ${now}`);
  const [first, second = ''] = ctx.statement.text.split(/(?<=\.) (?=With data)/);
  const p = wordsProblem(first, c.published, 'the published change');
  if (p) out.push(p);
  const n = wordsProblem(second, c.now, "today's change");
  if (n) out.push(n);
  return out;
}

export function checkSourceRevisions(c: SourceRevisionsClaim, ctx: VerifyContext): string[] {
  const out: string[] = [];
  if (c.named.length === 0 || c.named.length > c.count) out.push(`names ${c.named.length} of ${c.count} revisions`);
  for (const r of c.named) {
    const i = ctx.indexOf(r.date);
    if (i < 0 || !(r.date <= c.since)) {
      out.push(`names ${r.date}, which is not a period up to the last brief's`);
      continue;
    }
    const today = ctx.s.components.observed[i];
    if (!agrees(r.after, today, ctx.scale)) out.push(`says ${r.date} is now ${r.after}, the data hold ${today}`);
    if (agrees(r.before, r.after, ctx.scale)) out.push(`calls ${r.date} revised, but ${r.before} and ${r.after} agree`);
  }
  return out;
}

export function checkPublishedFirmness(c: PublishedFirmnessClaim, ctx: VerifyContext): string[] {
  const out: string[] = [];
  if (c.briefs !== c.revisions.length) out.push(`says ${c.briefs} briefs, lists ${c.revisions.length}`);
  if (c.revisions.length === 0) return [...out, 'lists no revision'];
  for (const r of c.revisions) {
    if (!(r.date < ctx.s.reportingDate)) out.push(`lists ${r.date}, not before the reporting period`);
    const latest = trendChange(ctx, r.date, 'relative');
    if (!agrees(r.latest, latest, 100))
      out.push(`gives ${r.latest} as today's change for ${r.date}, the trend gives ${latest}`);
  }
  out.push(
    ...checkRevisionSummary(
      c,
      c.revisions.map((r) => r.latest - r.first),
    ),
  );
  return out;
}
