/**
 * Whether one period is "a year before" another, as the words "a year ago" and "the same span a year
 * before" promise: the same month or quarter of the previous year; for weeks the same ISO week number
 * (ISO 8601) or 52 weeks back, and week 52 for a week 53 whose year before has no week 53; for days and
 * hours the same date or 52 weeks back, so the weekday matches (common practice in retail and service
 * reporting).
 */
import type { Frequency } from '../vocabulary/period-index.js';
import { days, isoWeek, ms, yearsBefore } from './dates.js';

export function isYearBefore(frequency: Frequency, earlier: string, later: string): boolean {
  const a = ms(earlier);
  const b = ms(later);
  if (yearsBefore(b, 1) === a) return true;
  if (frequency === 'monthly' || frequency === 'quarterly') return false;
  if (days(a, b) === 364) return true;
  if (frequency === 'weekly') {
    const wa = isoWeek(a);
    const wb = isoWeek(b);
    return wa.year === wb.year - 1 && (wa.week === wb.week || isWeek53StandIn(a, b));
  }
  return false;
}

/** 52 weeks back and same weekday: "the same weekday a year earlier". */
export function isSameWeekdayYearBefore(earlier: string, later: string): boolean {
  return days(ms(earlier), ms(later)) === 364;
}

/**
 * Whether `earlier` is the ISO week standing for `later` a year before: the same week number of the
 * previous ISO year, or its week 52 when `later` is a week 53 and the previous ISO year has only 52.
 */
export function isIsoWeekYearBefore(earlier: string, later: string): boolean {
  const a = ms(earlier);
  const b = ms(later);
  const wa = isoWeek(a);
  const wb = isoWeek(b);
  return wa.year === wb.year - 1 && (wa.week === wb.week || isWeek53StandIn(a, b));
}

/** `b` is in week 53 and `a` in week 52 of a previous ISO year that has no week 53. */
function isWeek53StandIn(a: number, b: number): boolean {
  const wa = isoWeek(a);
  const wb = isoWeek(b);
  // A year has week 53 exactly when 28 December (always in the year's last week) falls in week 53.
  const hasWeek53 = isoWeek(Date.UTC(wa.year, 11, 28)).week === 53;
  return wb.week === 53 && wa.week === 52 && !hasWeek53;
}
