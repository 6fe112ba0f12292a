/**
 * The span the headline's trend change is over. A year of periods (52 weeks for days and hours, so that
 * weekdays line up) once the data hold two whole years before the reporting period: then the trend a year
 * ago rests on a full year of data on both sides of it. With less, the longest of a few calendar spans
 * that the data hold one more period than: for hours a week (the same hour of the same weekday) or a day;
 * for days four weeks or one; for weeks 13 or four; for months three; for quarters two or one. Our rule.
 *
 *   hourly, 2,016 hours (12 weeks): not yearly (17,473 needed), the change over 168 hours
 *   monthly, 30 months: yearly (25 needed), 12 months
 */
import { type Frequency, yearLag } from '../vocabulary/period-index.js';

const SHORT: Record<Frequency, number[]> = {
  hourly: [168, 24],
  daily: [28, 7],
  weekly: [13, 4],
  monthly: [3, 1],
  quarterly: [2, 1],
};

export function headlineSpan(
  frequency: Frequency,
  available: number,
): { periods: number; yearly: boolean; needed: number; available: number } {
  const lag = yearLag(frequency);
  const needed = 2 * lag + 1;
  if (available >= needed) return { periods: lag, yearly: true, needed, available };
  const fits = SHORT[frequency].find((k) => available > k) ?? 1;
  return { periods: fits, yearly: false, needed, available };
}
