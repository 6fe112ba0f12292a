/**
 * Calendar regressors against R's forecast and timeDate packages (fixture: test/calendar/generate.R) and
 * Easter dates against two implementations independent of ours (timeDate::Easter; python-dateutil's
 * easter(), test/calendar/generate-easter.py) and dates recalled from memory.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { easterEffect } from '../../src/calendar/easter-effect.js';
import { easterSunday } from '../../src/calendar/easter-sunday.js';
import { leapYear } from '../../src/calendar/leap-year.js';
import { periodDays } from '../../src/calendar/period-days.js';
import { tradingDay } from '../../src/calendar/trading-day.js';
import { workingDayRegressor, workingDays } from '../../src/calendar/working-days.js';
import { type Frequency, ordinalOf } from '../../src/vocabulary/period-index.js';

const fx = JSON.parse(readFileSync(new URL('./fixtures/calendar.json', import.meta.url), 'utf8'));
const du = JSON.parse(readFileSync(new URL('./fixtures/easter-dateutil.json', import.meta.url), 'utf8'));
const DAY = 86_400_000;
const dayOf = (iso: string) => Date.parse(`${iso}T00:00:00Z`) / DAY;
const iso = (day: number) => new Date(day * DAY).toISOString().slice(0, 10);
const index = (frequency: Frequency, from: string, length: number) => ({
  frequency,
  start: ordinalOf(frequency, Date.parse(`${from}T00:00:00Z`)),
  length,
});

describe('working days against forecast::bizdays (1990–2040, timeDate holiday calendars)', () => {
  for (const freq of ['monthly', 'quarterly'] as const) {
    for (const centre of ['London', 'NewYork'] as const) {
      it(`${freq}, ${centre}: every period equal`, () => {
        const expected: number[] = fx.bizdays[freq][centre];
        const periods = periodDays(index(freq, '1990-01-01', expected.length));
        const holidays = new Set<number>(fx.holidays[centre].map(dayOf));
        expect(Array.from(workingDays(periods, holidays))).toEqual(expected);
      });
    }
  }
});

describe('Easter regressor against forecast::easter (1990–2040)', () => {
  // forecast::easter rounds its shares to two decimals (round(dif/denominator, 2)): 1/3 is written 0.33,
  // so the tolerance is that rounding, 0.005.
  const cases = [
    ['monthly', 'monthly', 0],
    ['monthly', 'monthlyWithMonday', 1],
    ['quarterly', 'quarterly', 0],
    ['quarterly', 'quarterlyWithMonday', 1],
  ] as const;
  for (const [freq, key, after] of cases) {
    it(`${key}: Good Friday to Easter ${after ? 'Monday' : 'Sunday'}`, () => {
      const expected: number[] = fx.easter[key];
      const got = easterEffect(periodDays(index(freq, '1990-01-01', expected.length)), { before: 2, after });
      for (let t = 0; t < expected.length; t++) expect(Math.abs(got[t] - expected[t])).toBeLessThanOrEqual(0.005);
      expect(got.some((v) => v > 0 && v < 1)).toBe(true); // some year splits its window (1991: Good Friday 29 March)
    });
  }
  it('Bell & Hillmer window of w = 8 days before Easter, worked by hand for 2024 (Easter 31 March) and 2027 (28 March)', () => {
    const got = easterEffect(periodDays(index('monthly', '2024-03-01', 2)), { before: 8, after: -1 });
    expect(Array.from(got)).toEqual([1, 0]); // 23–30 March 2024
    const g27 = easterEffect(periodDays(index('monthly', '2027-03-01', 2)), { before: 8, after: -1 });
    expect(Array.from(g27)).toEqual([1, 0]); // 20–27 March 2027
    const g25 = easterEffect(periodDays(index('monthly', '2018-03-01', 2)), { before: 8, after: -1 });
    // Easter 2018-04-01: window 24–31 March, all in March
    expect(Array.from(g25)).toEqual([1, 0]);
    const g29 = easterEffect(periodDays(index('monthly', '2029-03-01', 2)), { before: 8, after: -1 });
    // Easter 2029-04-01 as well; 2013 (31 March) likewise; 2016-03-27; a split year: 2021-04-04 → 27 March–3 April: 5 in March, 3 in April
    expect(Array.from(g29)).toEqual([1, 0]);
    const g21 = easterEffect(periodDays(index('monthly', '2021-03-01', 2)), { before: 8, after: -1 });
    expect(Array.from(g21)).toEqual([5 / 8, 3 / 8]);
  });
});

describe('Easter Sunday 1900–2099', () => {
  it('equals timeDate::Easter and python-dateutil (two implementations independent of ours) in all 200 years', () => {
    for (let y = 1900; y <= 2099; y++) {
      expect(iso(easterSunday(y))).toBe(fx.easterSunday.dates[y - 1900]);
      expect(iso(easterSunday(y))).toBe(du.dates[y - 1900]);
    }
  });
  it('dates recalled from memory: the extremes of the century and recent years', () => {
    // From memory: earliest in these two centuries 22 March does not occur (next in 2285); 23 March in 1913
    // and 2008; latest, 25 April, in 1943 and 2038.
    expect(iso(easterSunday(1913))).toBe('1913-03-23');
    expect(iso(easterSunday(2008))).toBe('2008-03-23');
    expect(iso(easterSunday(1943))).toBe('1943-04-25');
    expect(iso(easterSunday(2038))).toBe('2038-04-25');
    expect(iso(easterSunday(2024))).toBe('2024-03-31');
    expect(iso(easterSunday(2025))).toBe('2025-04-20');
    expect(iso(easterSunday(2285))).toBe('2285-03-22');
  });
});

describe('trading day, working-day regressor and leap year, worked by hand', () => {
  it('February 2024: 29 days, five Thursdays; contrasts against Sundays', () => {
    const p = periodDays(index('monthly', '2024-02-01', 1));
    expect(tradingDay(p, new Set()).map((c) => c[0])).toEqual([0, 0, 0, 1, 0, 0]);
    expect(workingDays(p, new Set())[0]).toBe(21);
    expect(workingDayRegressor(p, new Set())[0]).toBe(21 - 2.5 * 8);
  });
  it('a holiday on a weekday counts as a Sunday: Good Friday 2024-03-29 in March 2024', () => {
    const p = periodDays(index('monthly', '2024-03-01', 1));
    // March 2024: 31 days from a Friday: Fri, Sat, Sun ×5, every other weekday ×4; 21 working days.
    expect(workingDays(p, new Set())[0]).toBe(21);
    const h = new Set([dayOf('2024-03-29')]);
    expect(workingDays(p, h)[0]).toBe(20);
    expect(tradingDay(p, h).map((c) => c[0])).toEqual([4 - 6, 4 - 6, 4 - 6, 4 - 6, 4 - 6, 5 - 6]);
  });
  it('September 2026 has 22 working days without holidays (30 days from a Tuesday)', () => {
    expect(workingDays(periodDays(index('monthly', '2026-09-01', 1)), new Set())[0]).toBe(22);
  });
  it('leap year: 0.75 in February 2024, −0.25 in February 2023, 0 in other months; quarterly in Q1', () => {
    const m = leapYear(periodDays(index('monthly', '2023-01-01', 24)));
    expect(m[1]).toBe(-0.25);
    expect(m[13]).toBe(0.75);
    expect(m.reduce((a, v) => a + Math.abs(v), 0)).toBe(1);
    const q = leapYear(periodDays(index('quarterly', '2099-10-01', 3)));
    expect(Array.from(q)).toEqual([0, -0.25, 0]); // 2100 is not a leap year (Gregorian rule)
  });
});
