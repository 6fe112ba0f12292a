/**
 * The spans a comparison sets side by side, as inclusive ranges of period ordinals: the same period a year
 * ago, the calendar year to date, the fiscal year to date (the year starting in the job's fiscal month),
 * the latest year of periods against the one before, and custom spans. Baselines are the current span
 * moved back by a year of periods (yearLag), so a year to date of 9 months is compared with the same 9
 * months a year earlier (common practice).
 */
import { type Frequency, ordinalOf, startOf, yearLag } from '../data/calendar.js';

export interface Span {
  from: number;
  to: number;
}

export interface SpanPair {
  current: Span;
  baseline: Span;
  /** True when the current span is shorter than its calendar unit (a year). */
  partial: boolean;
}

const DAY_MS = 86_400_000;

/**
 * The instant that decides which year a period belongs to: its start, except for weeks, which belong to
 * the year holding their Thursday (ISO 8601's rule, so ISO week 1 opens the year; applied alike to a
 * fiscal year, whose first week is the one holding most of its days).
 */
function anchorOf(frequency: Frequency, ordinal: number): number {
  return startOf(frequency, ordinal) + (frequency === 'weekly' ? 3 * DAY_MS : 0);
}

/** First period of the year (or fiscal year) that holds `ordinal`. */
export function yearStart(frequency: Frequency, ordinal: number, startMonth: number): number {
  const d = new Date(anchorOf(frequency, ordinal));
  let year = d.getUTCFullYear();
  if (d.getUTCMonth() + 1 < startMonth) year--;
  const startMs = Date.UTC(year, startMonth - 1, 1);
  let first = ordinalOf(frequency, startMs);
  // A period anchored before the year start (a quarter begun in an earlier month, a week whose Thursday
  // falls before it) belongs to the previous year.
  if (anchorOf(frequency, first) < startMs) first++;
  return first;
}

export function spansFor(
  kind: 'same-period-last-year' | 'year-to-date' | 'fiscal-year-to-date' | 'rolling-12',
  frequency: Frequency,
  reporting: number,
  fiscalStartMonth: number,
): SpanPair {
  const lag = yearLag(frequency);
  const back = (s: Span): Span => ({ from: s.from - lag, to: s.to - lag });
  let current: Span;
  switch (kind) {
    case 'same-period-last-year':
      current = { from: reporting, to: reporting };
      return { current, baseline: back(current), partial: false };
    case 'year-to-date':
    case 'fiscal-year-to-date': {
      const from = yearStart(frequency, reporting, kind === 'year-to-date' ? 1 : fiscalStartMonth);
      current = { from, to: reporting };
      return { current, baseline: back(current), partial: reporting - from + 1 < lag };
    }
    case 'rolling-12':
      current = { from: reporting - lag + 1, to: reporting };
      return { current, baseline: back(current), partial: false };
  }
}
