/**
 * The days each period of a regular index covers, as [first, end) in days since 1970-01-01 (UTC), for
 * daily, weekly, monthly and quarterly indexes (calendar regressors count days; hourly data has none).
 *
 *   periodDays({ frequency: 'monthly', start: ordinal of 2024-02, length: 1 }) → first = 2024-02-01, end = 2024-03-01
 */
import { startOf, type TimeIndex } from '../vocabulary/period-index.js';

export interface PeriodDays {
  first: Int32Array;
  end: Int32Array;
}

const DAY = 86_400_000;

export function periodDays(index: TimeIndex): PeriodDays {
  const first = new Int32Array(index.length);
  const end = new Int32Array(index.length);
  for (let t = 0; t < index.length; t++) {
    first[t] = Math.round(startOf(index.frequency, index.start + t) / DAY);
    end[t] = Math.round(startOf(index.frequency, index.start + t + 1) / DAY);
  }
  return { first, end };
}

/** Day of the week of a day number: 0 = Monday … 6 = Sunday (ISO 8601); 1970-01-01 was a Thursday. */
export function weekday(day: number): number {
  return (((day + 3) % 7) + 7) % 7;
}
