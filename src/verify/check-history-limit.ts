/**
 * Check of what a brief says it cannot compare: the count of periods is the data's to the reporting
 * period; "a yearly comparison needs at least two years" is said exactly when they hold fewer than two
 * years of periods before the reporting one (the verifier's own year: 12 months, 4 quarters, 52 weeks,
 * 364 days, 364 × 24 hours); each comparison left out does reach outside the data.
 */
import type { HistoryLimitClaim } from '../vocabulary/claims.js';
import type { VerifyContext } from './context.js';

export const YEAR_OF_PERIODS: Record<string, number> = {
  monthly: 12,
  quarterly: 4,
  weekly: 52,
  daily: 364,
  hourly: 364 * 24,
};

export function checkHistoryLimit(c: HistoryLimitClaim, ctx: VerifyContext): string[] {
  const out: string[] = [];
  const { s } = ctx;
  const n = s.reportingIndex + 1;
  const needed = 2 * YEAR_OF_PERIODS[s.frequency] + 1;
  if (c.periods !== n) out.push(`says the series has ${c.periods} periods, it has ${n} to the reporting period`);
  if (c.needed !== needed) out.push(`says a yearly comparison needs ${c.needed} periods, not ${needed}`);
  if (c.yearly !== n >= needed) out.push(`says the data ${c.yearly ? 'do' : 'do not'} hold two years; they hold ${n}`);
  const said = /A yearly comparison needs at least two years of data/.test(ctx.statement.text);
  if (said === c.yearly) out.push('the words do not match whether two years are held');
  const first = s.components.dates[0];
  const last = s.components.dates[s.reportingIndex];
  for (const x of c.leftOut) {
    const outside = [x.current, x.baseline].some((y) => y.from < first || y.to > last);
    if (!outside) out.push(`leaves out ${x.id}, whose spans lie inside the data`);
  }
  for (const x of s.analysis.comparisons) {
    if (c.leftOut.some((y) => y.id === x.id)) out.push(`leaves out ${x.id} but also compares it`);
  }
  return out;
}
