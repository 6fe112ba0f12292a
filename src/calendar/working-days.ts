/**
 * Working days in each period: days that are working weekdays (Monday–Friday by default) and not a
 * holiday; the count forecast::bizdays returns for a holiday calendar (checked against it, 1990–2040).
 * The working-day regressor is the contrast of working against other days weighted so that a period of
 * the average mix scores zero: W − (5/2)·N, with W working and N other days (one regressor in place of
 * six; the form of X-13ARIMA-SEATS's "td1coef", US Census Bureau, X-13ARIMA-SEATS Reference Manual,
 * v1.1 (2017), §7.13, table 7.27).
 *
 *   workingDays(days of September 2026, no holidays) → 22;  its regressor 22 − 2.5·8 = 2
 */
import { dayCounts, WEEKDAYS } from './day-counts.js';
import type { PeriodDays } from './period-days.js';

export function workingDays(periods: PeriodDays, holidays: ReadonlySet<number>): Float64Array {
  const c = dayCounts(periods, holidays, WEEKDAYS);
  const out = new Float64Array(periods.first.length);
  for (let t = 0; t < out.length; t++) out[t] = c[0][t] + c[1][t] + c[2][t] + c[3][t] + c[4][t];
  return out;
}

export function workingDayRegressor(periods: PeriodDays, holidays: ReadonlySet<number>): Float64Array {
  const w = workingDays(periods, holidays);
  const out = new Float64Array(w.length);
  for (let t = 0; t < out.length; t++) {
    const other = periods.end[t] - periods.first[t] - w[t];
    out[t] = w[t] - 2.5 * other;
  }
  return out;
}
