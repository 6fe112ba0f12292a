/**
 * How many of each weekday every period holds, with holidays that fall on a weekday counted apart: row w
 * (0 = Monday … 6 = Sunday) holds the count of that weekday that is not a holiday, row 7 the holidays on
 * Monday–Friday (or on the weekdays the job calls working). A fact of the calendar; counting holidays as a
 * day of their own is how trading-day regressors treat them in official practice (Findley et al. 1998,
 * J. Business & Economic Statistics 16(2), §2.3: a holiday counts as a Sunday).
 *
 *   dayCounts(days of February 2024, no holidays) → Thursdays 5, every other weekday 4
 */
import { type PeriodDays, weekday } from './period-days.js';

export function dayCounts(periods: PeriodDays, holidays: ReadonlySet<number>, workdays = WEEKDAYS): Float64Array[] {
  const n = periods.first.length;
  const rows = Array.from({ length: 8 }, () => new Float64Array(n));
  for (let t = 0; t < n; t++) {
    for (let day = periods.first[t]; day < periods.end[t]; day++) {
      const w = weekday(day);
      if (workdays[w] && holidays.has(day)) rows[7][t]++;
      else rows[w][t]++;
    }
  }
  return rows;
}

/** Monday to Friday are working days (common practice). */
export const WEEKDAYS: readonly boolean[] = [true, true, true, true, true, false, false];
