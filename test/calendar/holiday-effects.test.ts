/**
 * Holiday day-of, day-before and day-after regressors (src/calendar/holiday-effects.ts), worked by hand on
 * England's Christmas and New Year 2024–25 (holidays from date-holidays: 25 and 26 December 2024, 1 January
 * 2025, all on weekdays) and on weekly periods.
 */
import { describe, expect, it } from 'vitest';
import { holidayEffects } from '../../src/calendar/holiday-effects.js';
import { publicHolidays } from '../../src/calendar/holidays.js';
import { periodDays } from '../../src/calendar/period-days.js';
import { type Frequency, ordinalOf } from '../../src/vocabulary/period-index.js';

const DAY = 86_400_000;
const dayOf = (iso: string) => Date.parse(`${iso}T00:00:00Z`) / DAY;
const index = (frequency: Frequency, from: string, length: number) => ({
  frequency,
  start: ordinalOf(frequency, Date.parse(`${from}T00:00:00Z`)),
  length,
});

describe('holiday regressors, worked by hand', () => {
  it('daily, 20 December 2024 to 3 January 2025 in England', () => {
    const h = publicHolidays('GB-ENG', 2024, 2025).days;
    const got = holidayEffects(periodDays(index('daily', '2024-12-20', 15)), h);
    //            20 21 22 23 24 25 26 27 28 29 30 31  1  2  3
    // holiday     .  .  .  .  .  1  1  .  .  .  .  .  1  .  .
    // day before  .  .  .  .  1  .  .  .  .  .  .  1  .  .  .   (the 25th is a holiday, not a day before)
    // day after   .  .  .  .  .  .  .  1  .  .  .  .  .  1  .   (the 26th likewise)
    expect(Array.from(got.dayOf)).toEqual([0, 0, 0, 0, 0, 1, 1, 0, 0, 0, 0, 0, 1, 0, 0]);
    expect(Array.from(got.before)).toEqual([0, 0, 0, 0, 1, 0, 0, 0, 0, 0, 0, 1, 0, 0, 0]);
    expect(Array.from(got.after)).toEqual([0, 0, 0, 0, 0, 0, 0, 1, 0, 0, 0, 0, 0, 1, 0]);
  });

  it('a day between two holidays is a day after and a day before; holidays outside the data still count', () => {
    // Holidays on the 1st and 3rd of a month: the 2nd is both. The data start on the 2nd.
    const h = new Set([dayOf('2026-06-01'), dayOf('2026-06-03')]);
    const got = holidayEffects(periodDays(index('daily', '2026-06-02', 3)), h);
    expect(Array.from(got.dayOf)).toEqual([0, 1, 0]);
    expect(Array.from(got.before)).toEqual([1, 0, 0]);
    expect(Array.from(got.after)).toEqual([1, 0, 1]);
  });

  it('weekly periods count the days: the ISO week of Christmas 2024 (Monday 23rd) holds 2 holidays, 1 day before, 1 after', () => {
    const h = publicHolidays('GB-ENG', 2024, 2025).days;
    const got = holidayEffects(periodDays(index('weekly', '2024-12-23', 2)), h);
    // Week 23–29 Dec: holidays 25, 26; before: 24; after: 27. Week 30 Dec–5 Jan: holiday 1st; before 31st; after 2nd.
    expect([got.dayOf[0], got.before[0], got.after[0]]).toEqual([2, 1, 1]);
    expect([got.dayOf[1], got.before[1], got.after[1]]).toEqual([1, 1, 1]);
  });

  it('no holidays: three columns of zeros', () => {
    const got = holidayEffects(periodDays(index('daily', '2026-01-01', 10)), new Set());
    for (const c of [got.dayOf, got.before, got.after]) expect(c.every((v) => v === 0)).toBe(true);
  });
});
