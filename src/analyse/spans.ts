/**
 * The spans a comparison sets side by side, as inclusive ranges of period ordinals: the same period a year
 * ago, the calendar year to date, the fiscal year to date (the year starting in the job's fiscal month),
 * the latest year of periods against the one before, and custom spans. A year to date is compared with the
 * same stretch of the year before by the calendar — 1 January to 15 March against 1 January to 15 March
 * (common practice) — while the same period last year and the last 12 months step back a year of periods
 * (yearLag: 52 weeks for daily and hourly data, so weekdays match).
 */
import {
  type Frequency,
  isoWeekOf,
  isoWeekStart,
  isoWeeksInYear,
  ordinalOf,
  startOf,
  yearLag,
} from '../data/calendar.js';

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
      const month = kind === 'year-to-date' ? 1 : fiscalStartMonth;
      const from = yearStart(frequency, reporting, month);
      current = { from, to: reporting };
      const to = sameTimeLastYear(frequency, reporting);
      const baseline = { from: yearStart(frequency, to, month), to };
      // Partial unless the next period opens a new year.
      return { current, baseline, partial: yearStart(frequency, reporting + 1, month) === from };
    }
    case 'rolling-12':
      current = { from: reporting - lag + 1, to: reporting };
      return { current, baseline: back(current), partial: false };
  }
}

/**
 * The period at the same point of the calendar a year earlier: the same month or quarter, the same ISO
 * week number (week 52 for a week 53 without a twin), the same date (28 February for 29 February), the
 * same hour of that date.
 */
export function sameTimeLastYear(frequency: Frequency, ordinal: number): number {
  switch (frequency) {
    case 'monthly':
      return ordinal - 12;
    case 'quarterly':
      return ordinal - 4;
    case 'weekly': {
      const w = isoWeekOf(startOf('weekly', ordinal));
      const week = Math.min(w.week, isoWeeksInYear(w.year - 1));
      return ordinalOf('weekly', isoWeekStart(w.year - 1, week));
    }
    case 'daily':
    case 'hourly': {
      const d = new Date(startOf(frequency, ordinal));
      const y = d.getUTCFullYear() - 1;
      const m = d.getUTCMonth();
      const day = Math.min(d.getUTCDate(), new Date(Date.UTC(y, m + 1, 0)).getUTCDate());
      return ordinalOf(frequency, Date.UTC(y, m, day, d.getUTCHours()));
    }
  }
}
