/**
 * Check of matched yearly totals: each year the claim lists is a whole year of the data (its first period
 * starts the year, calendar or financial, and its last ends it), the seasonally adjusted series adds up
 * to the observed total over it, and no whole year with every value present between the first and the
 * last listed is left out. Years are worked out here from the ISO dates, not from the pipeline's calendar.
 */
import type { YearlyTotalsClaim } from '../vocabulary/claims.js';
import type { VerifyContext } from './context.js';
import { ms } from './dates.js';
import { agrees } from './numbers.js';

/** The year (named by the calendar year it starts in) holding an instant, for years starting in `month`. */
function yearOf(t: number, month: number): number {
  const d = new Date(t);
  return d.getUTCMonth() + 1 >= month ? d.getUTCFullYear() : d.getUTCFullYear() - 1;
}

/** The start of the period `step` periods from the one starting at t (months and quarters by the calendar). */
function shifted(frequency: string, t: number, step: number): number {
  const d = new Date(t);
  if (frequency === 'monthly' || frequency === 'quarterly') {
    const months = frequency === 'monthly' ? step : 3 * step;
    return Date.UTC(d.getUTCFullYear(), d.getUTCMonth() + months, 1);
  }
  const hours = { hourly: 1, daily: 24, weekly: 168 }[frequency] ?? Number.NaN;
  return t + step * hours * 3_600_000;
}

export function checkYearlyTotals(c: YearlyTotalsClaim, ctx: VerifyContext): string[] {
  const out: string[] = [];
  const k = ctx.s.components;
  const r = ctx.s.reportingIndex;
  const year = (i: number) => yearOf(ms(k.dates[i]), c.yearStartMonth);
  if (c.years.length === 0) return ['lists no year'];
  // The whole years of the data: runs of one year whose neighbours outside the run (in the data or, at the
  // ends, the period just before the first or after the last) belong to other years.
  const f = ctx.s.frequency;
  const whole: { from: number; to: number }[] = [];
  for (let i = 0; i <= r; ) {
    let j = i;
    while (j + 1 <= r && year(j + 1) === year(i)) j++;
    const startsYear = i > 0 || yearOf(shifted(f, ms(k.dates[0]), -1), c.yearStartMonth) !== year(i);
    const endsYear = j < r || yearOf(shifted(f, ms(k.dates[r]), 1), c.yearStartMonth) !== year(j);
    if (startsYear && endsYear) whole.push({ from: i, to: j });
    i = j + 1;
  }
  const present = (y: { from: number; to: number }) => {
    for (let i = y.from; i <= y.to; i++) if (!Number.isFinite(k.observed[i])) return false;
    return true;
  };
  const listed = c.years.map((y) => ({ from: ctx.indexOf(y.from), to: ctx.indexOf(y.to) }));
  for (const [n, y] of listed.entries()) {
    if (!whole.some((w) => w.from === y.from && w.to === y.to)) {
      out.push(`${c.years[n].from}–${c.years[n].to} is not a whole year of the data`);
      continue;
    }
    let raw = 0;
    let adj = 0;
    let scale = 0;
    for (let i = y.from; i <= y.to; i++) {
      raw += k.observed[i];
      adj += k.adjusted[i];
      scale += Math.abs(k.observed[i]);
    }
    if (!agrees(adj, raw, scale, 1e-9))
      out.push(`over ${c.years[n].from}–${c.years[n].to} adjusted adds to ${adj}, data ${raw}`);
  }
  if (out.length) return out;
  const first = listed[0].from;
  const last = listed[listed.length - 1].to;
  for (const w of whole) {
    if (w.from >= first && w.to <= last && present(w) && !listed.some((y) => y.from === w.from)) {
      out.push(`the whole year ${k.dates[w.from]}–${k.dates[w.to]} is not listed`);
    }
  }
  return out;
}
