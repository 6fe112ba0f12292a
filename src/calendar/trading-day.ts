/**
 * Trading-day regressors: six contrasts, the count of each of Monday … Saturday minus the count of Sundays
 * in the period, holidays on working days counted as Sundays. Source: Bell & Hillmer (1983), "Modeling time
 * series with calendar variation", JASA 78(383), 526–534, §2 (the contrasts Dⱼ − D₇); the holiday rule as
 * in day-counts.ts.
 *
 *   tradingDay(days of February 2024, no holidays) → Thursday 5 − 4 = 1, every other contrast 0
 */
import { dayCounts, WEEKDAYS } from './day-counts.js';
import type { PeriodDays } from './period-days.js';

export const TRADING_DAY_NAMES = ['Monday', 'Tuesday', 'Wednesday', 'Thursday', 'Friday', 'Saturday'] as const;

export function tradingDay(periods: PeriodDays, holidays: ReadonlySet<number>): Float64Array[] {
  const c = dayCounts(periods, holidays, WEEKDAYS);
  const n = periods.first.length;
  const out: Float64Array[] = [];
  for (let w = 0; w < 6; w++) {
    const col = new Float64Array(n);
    for (let t = 0; t < n; t++) col[t] = c[w][t] - (c[6][t] + c[7][t]);
    out.push(col);
  }
  return out;
}
