/**
 * The leap-year regressor: for the period that holds 29 February, the share of a day it has beyond the
 * average February: 0.75 in a leap year and −0.25 otherwise; 0 for every other period. Source: US Census
 * Bureau, X-13ARIMA-SEATS Reference Manual, v1.1 (2017), §7.13, table 7.27 ("lpyear"); Bell & Hillmer
 * (1983), §2.
 *
 *   leapYear(monthly 2023-01 … 2024-12) → −0.25 at 2023-02, 0.75 at 2024-02, 0 elsewhere
 */
import type { PeriodDays } from './period-days.js';

const DAY = 86_400_000;

export function leapYear(periods: PeriodDays): Float64Array {
  const n = periods.first.length;
  const out = new Float64Array(n);
  for (let t = 0; t < n; t++) {
    const first = new Date(periods.first[t] * DAY);
    const last = new Date((periods.end[t] - 1) * DAY);
    // The period holds the end of February of some year (28 February), when it spans at least 28 days.
    for (let y = first.getUTCFullYear(); y <= last.getUTCFullYear(); y++) {
      const feb28 = Date.UTC(y, 1, 28) / DAY;
      if (feb28 < periods.first[t] || feb28 >= periods.end[t]) continue;
      if (periods.end[t] - periods.first[t] < 28) continue;
      const leap = (y % 4 === 0 && y % 100 !== 0) || y % 400 === 0;
      out[t] += leap ? 0.75 : -0.25;
    }
  }
  return out;
}
