/**
 * The spans a comparison sets side by side, as inclusive ranges of period ordinals, like with like:
 * - the same period a year ago: the same month or quarter; the same ISO week number (week 52 for a week 53
 *   whose year before has none); for days and hours the same weekday 52 weeks back (364 days: common
 *   practice in retail and service reporting, and the words say so);
 * - a calendar or fiscal year to date: for months, quarters, days and hours the same stretch of the
 *   calendar a year before — 1 January to 15 March against 1 January to 15 March (common practice), so a
 *   leap year's 29 February makes the spans differ by a day, which the brief then says; for weeks, the same
 *   number of weeks from the start of the year before (ISO weeks 1–10 against 1–10; a fiscal year's weeks
 *   counted from its first week), cut at that year's end, so only a week 53 without a twin differs;
 * - the latest year of periods against the one before, and custom spans.
 */
import {
  type Frequency,
  isoWeekOf,
  isoWeekStart,
  isoWeeksInYear,
  ordinalOf,
  startOf,
  yearLag,
} from '../vocabulary/period-index.js';

export interface Span {
  from: number;
  to: number;
}

/**
 * How the baseline was matched to the current span: 'calendar' (the same months, quarters or dates a year
 * before), 'iso-week' (the same ISO week numbers), 'weekday' (52 weeks back, so weekdays match),
 * 'periods' (a year of periods back) or 'custom' (spans the job names).
 */
export type Alignment = 'calendar' | 'iso-week' | 'weekday' | 'periods' | 'custom';

export interface SpanPair {
  current: Span;
  baseline: Span;
  /** True when the current span is shorter than its calendar unit (a year). */
  partial: boolean;
  alignment: Alignment;
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
  kind: 'year-on-year' | 'year-to-date' | 'fiscal-year-to-date' | 'latest-year',
  frequency: Frequency,
  reporting: number,
  fiscalStartMonth: number,
): SpanPair {
  const lag = yearLag(frequency);
  const back = (s: Span): Span => ({ from: s.from - lag, to: s.to - lag });
  const daysOrHours = frequency === 'daily' || frequency === 'hourly';
  let current: Span;
  switch (kind) {
    case 'year-on-year': {
      current = { from: reporting, to: reporting };
      if (frequency === 'weekly') {
        const b = sameTimeLastYear(frequency, reporting);
        return { current, baseline: { from: b, to: b }, partial: false, alignment: 'iso-week' };
      }
      return { current, baseline: back(current), partial: false, alignment: daysOrHours ? 'weekday' : 'calendar' };
    }
    case 'year-to-date':
    case 'fiscal-year-to-date': {
      const month = kind === 'year-to-date' ? 1 : fiscalStartMonth;
      const from = yearStart(frequency, reporting, month);
      current = { from, to: reporting };
      // Partial unless the next period opens a new year.
      const partial = yearStart(frequency, reporting + 1, month) === from;
      if (frequency === 'weekly') {
        // As many weeks from the start of the year before, but not past its end (a week 53 with no twin).
        const before = yearStart(frequency, from - 1, month);
        const baseline = { from: before, to: Math.min(before + (reporting - from), from - 1) };
        return { current, baseline, partial, alignment: 'iso-week' };
      }
      const to = sameTimeLastYear(frequency, reporting);
      return { current, baseline: { from: yearStart(frequency, to, month), to }, partial, alignment: 'calendar' };
    }
    case 'latest-year':
      current = { from: reporting - lag + 1, to: reporting };
      return { current, baseline: back(current), partial: false, alignment: 'periods' };
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
