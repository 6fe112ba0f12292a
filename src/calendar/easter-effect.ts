/**
 * The Easter regressor: the share of a window of days around Easter Sunday that falls in each period.
 * Bell & Hillmer (1983), "Modeling time series with calendar variation", JASA 78(383), 526–534, §3: a
 * level change over the w days before Easter (window from Easter − w to Easter − 1). With before = 2 and
 * after = 0 (Good Friday to Easter Sunday) it is forecast::easter's regressor (Hyndman et al., forecast
 * package for R), checked against it 1990–2040.
 *
 *   easterEffect(monthly 2024-03, 2024-04, { before: 8, after: −1 }) → [1, 0] (Easter 2024-03-31)
 */
import { easterSunday } from './easter-sunday.js';
import type { PeriodDays } from './period-days.js';

const DAY = 86_400_000;

export interface EasterWindow {
  /** Days before Easter Sunday the window starts (w in Bell & Hillmer). */
  before: number;
  /** Days after Easter Sunday it ends: −1 ends on Saturday, 0 on Sunday, 1 on Monday. */
  after: number;
}

export function easterEffect(periods: PeriodDays, window: EasterWindow): Float64Array {
  const n = periods.first.length;
  const out = new Float64Array(n);
  if (n === 0) return out;
  const width = window.before + window.after + 1;
  const y0 = new Date(periods.first[0] * DAY).getUTCFullYear();
  const y1 = new Date((periods.end[n - 1] - 1) * DAY).getUTCFullYear();
  for (let y = y0; y <= y1; y++) {
    const from = easterSunday(y) - window.before;
    const to = easterSunday(y) + window.after + 1;
    for (let t = 0; t < n; t++) {
      const overlap = Math.min(to, periods.end[t]) - Math.max(from, periods.first[t]);
      if (overlap > 0) out[t] += overlap / width;
    }
  }
  return out;
}
