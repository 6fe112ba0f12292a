/**
 * Holiday effects of daily data in the regression before decomposition (src/adjust/regression-effects.ts):
 * day-of, day-before and day-after effects planted in a seeded daily series of our own (England's public
 * holidays of 2023–2024 from date-holidays, a weekly pattern, AR(1) noise) are recovered, the calendar
 * component is exactly a combination of the regressors of src/calendar/holiday-effects.ts, and the parts
 * add back to the data.
 */
import { describe, expect, it } from 'vitest';
import { estimateEffects } from '../../src/adjust/regression-effects.js';
import { holidayEffects } from '../../src/calendar/holiday-effects.js';
import { publicHolidays } from '../../src/calendar/holidays.js';
import { periodDays } from '../../src/calendar/period-days.js';
import { mulberry32 } from '../../src/data/synthetic.js';
import { ordinalOf } from '../../src/vocabulary/period-index.js';

const daily = (from: string, length: number) => ({
  frequency: 'daily' as const,
  start: ordinalOf('daily', Date.parse(`${from}T00:00:00Z`)),
  length,
});
const PLANTED = { dayOf: -40, before: 15, after: -10 };

function seeded(seed: number) {
  const index = daily('2023-01-01', 731);
  const holidays = publicHolidays('GB-ENG', 2022, 2025).days;
  const x = holidayEffects(periodDays(index), holidays);
  const rand = mulberry32(seed);
  const normal = () => Math.sqrt(-2 * Math.log(1 - rand())) * Math.cos(2 * Math.PI * rand());
  const week = [10, 12, 11, 9, 14, -25, -31];
  const y = new Float64Array(index.length);
  let u = 0;
  for (let t = 0; t < y.length; t++) {
    u = 0.4 * u + normal();
    const h = PLANTED.dayOf * x.dayOf[t] + PLANTED.before * x.before[t] + PLANTED.after * x.after[t];
    y[t] = 300 + week[t % 7] + h + 3 * u;
  }
  return { y, index, holidays, x };
}

describe('holiday effects in daily data', () => {
  it('recovers the planted day-of, day-before and day-after effects; the calendar part is their combination', () => {
    const { y, index, holidays, x } = seeded(11);
    const r = estimateEffects(y, index, { multiplicative: false, calendar: { holidays } });
    expect(r.groups.find((g) => g.name === 'holidays')?.kept).toBe(true);
    // Least squares of the calendar part on the three regressors gives the coefficients back exactly, and
    // they are within 3 of the planted ones (16 holidays, noise sd 3·1.09; each estimate's sd about 1).
    const at = (col: Float64Array) => col.findIndex((v, t) => v === 1 && x.dayOf[t] + x.before[t] + x.after[t] === 1);
    const b = {
      dayOf: r.calendar[at(x.dayOf)],
      before: r.calendar[at(x.before)],
      after: r.calendar[at(x.after)],
    };
    for (const k of ['dayOf', 'before', 'after'] as const) expect(Math.abs(b[k] - PLANTED[k]), k).toBeLessThan(3);
    for (let t = 0; t < y.length; t++) {
      const want = b.dayOf * x.dayOf[t] + b.before * x.before[t] + b.after * x.after[t];
      expect(Math.abs(r.calendar[t] - want)).toBeLessThanOrEqual(1e-9 * 400);
      expect(Math.abs(r.linearised[t] + r.calendar[t] + r.level[t] + r.oneOff[t] - y[t])).toBeLessThanOrEqual(
        1e-9 * 400,
      );
    }
  });

  it('no effect planted: the holiday group does not earn its place by AICc in most seeds', () => {
    let kept = 0;
    for (const seed of [1, 2, 3]) {
      const { index, holidays } = seeded(seed);
      const rand = mulberry32(seed + 100);
      const y = Float64Array.from({ length: index.length }, (_, t) => 200 + (t % 7 === 6 ? -20 : 0) + 3 * rand());
      const r = estimateEffects(y, index, { multiplicative: false, calendar: { holidays } });
      if (r.groups.find((g) => g.name === 'holidays')?.kept) kept++;
    }
    expect(kept).toBeLessThanOrEqual(1);
  });

  it('a regressor that is zero throughout is dropped with its name: names and columns stay in line', () => {
    // Found: with the only holiday on the first day, no day lies before a holiday; the zero column was
    // dropped but its name kept, so "day before a holiday" labelled the day-after column.
    const { y, index } = seeded(5);
    const holidays = new Set([periodDays(index).first[0]]);
    const r = estimateEffects(y, index, { multiplicative: false, calendar: { holidays } });
    expect(r.fit.spec.xregNames?.slice(0, 2)).toEqual(['holiday', 'day after a holiday']);
    expect(r.fit.spec.xreg?.length).toBe(r.fit.spec.xregNames?.length);
  });
});
