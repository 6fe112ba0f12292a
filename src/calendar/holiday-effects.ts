/**
 * Holiday regressors for daily (or weekly) data: in each period, how many days are holidays, how many are
 * the day before a holiday and how many the day after one. A day that is itself a holiday is only a holiday
 * (the 25th before Boxing Day is not a "day before"); a day between two holidays a day apart is both a day
 * after and a day before. Holidays just outside the data count for the days inside it (the set should hold
 * the year before and after). For daily data each regressor is 0 or 1. Indicators for the day of a holiday
 * and for the days next to it are common practice in daily models (dummy variables for public holidays:
 * Hyndman & Athanasopoulos, Forecasting: Principles and Practice, 3rd ed. (2021), §7.4, section cited
 * from memory); the counting rule here is ours.
 *
 *   holidayEffects(days 2024-12-23 … 2024-12-28, {25 and 26 December})
 *     → dayOf [0,0,1,1,0,0], before [0,1,0,0,0,0], after [0,0,0,0,1,0]
 */
import type { PeriodDays } from './period-days.js';

export interface HolidayEffects {
  dayOf: Float64Array;
  before: Float64Array;
  after: Float64Array;
}

export const HOLIDAY_EFFECT_NAMES = {
  dayOf: 'holiday',
  before: 'day before a holiday',
  after: 'day after a holiday',
} as const;

export function holidayEffects(periods: PeriodDays, holidays: ReadonlySet<number>): HolidayEffects {
  const n = periods.first.length;
  const dayOf = new Float64Array(n);
  const before = new Float64Array(n);
  const after = new Float64Array(n);
  for (let t = 0; t < n; t++) {
    for (let day = periods.first[t]; day < periods.end[t]; day++) {
      if (holidays.has(day)) {
        dayOf[t]++;
        continue;
      }
      if (holidays.has(day + 1)) before[t]++;
      if (holidays.has(day - 1)) after[t]++;
    }
  }
  return { dayOf, before, after };
}
