/**
 * Whether one period is "a year before" another, as the words "a year ago" and "the same span a year
 * before" promise: the same month or quarter of the previous year; for weeks the same ISO week number
 * (ISO 8601) or 52 weeks back; for days and hours the same date or 52 weeks back, so the weekday matches
 * (common practice in retail and service reporting).
 */
import type { Frequency } from '../data/calendar.js';
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
    return wa.year === wb.year - 1 && wa.week === wb.week;
  }
  return false;
}
