/**
 * Easter Sunday 1900–2099 (src/calendar/easter-sunday.ts, the arithmetic of Meeus, Astronomical Algorithms,
 * 2nd ed. (1998), ch. 8) against a table: the dates of the Paschal full moon by Golden Number for the
 * years 1900–2199, as printed in the tables for finding Easter of the Book of Common Prayer (Church of
 * England) and reproduced in the Explanatory Supplement to the Astronomical Almanac. Easter is the first
 * Sunday after that full moon; the Golden Number is (year mod 19) + 1. The nineteen dates below are typed
 * from memory, not copied from a printed page; that they give all 200 years exactly as the arithmetic does
 * (and as timeDate::Easter and python-dateutil, regressors.test.ts) is the check of both.
 * Also Meeus's own worked examples (ch. 8), from memory: 1991 → 31 March, 1992 → 19 April, 1993 → 11 April,
 * 1954 → 18 April, 2000 → 23 April, 1818 → 22 March.
 */
import { describe, expect, it } from 'vitest';
import { easterSunday } from '../../src/calendar/easter-sunday.js';

const DAY = 86_400_000;
const iso = (day: number) => new Date(day * DAY).toISOString().slice(0, 10);

// Golden Number 1 … 19 → Paschal full moon, [month, day].
const PASCHAL_FULL_MOON: [number, number][] = [
  [4, 14],
  [4, 3],
  [3, 23],
  [4, 11],
  [3, 31],
  [4, 18],
  [4, 8],
  [3, 28],
  [4, 16],
  [4, 5],
  [3, 25],
  [4, 13],
  [4, 2],
  [3, 22],
  [4, 10],
  [3, 30],
  [4, 17],
  [4, 7],
  [3, 27],
];

function easterFromTable(year: number): string {
  const [month, day] = PASCHAL_FULL_MOON[year % 19];
  const moon = Date.UTC(year, month - 1, day) / DAY;
  const weekday = (((moon + 3) % 7) + 7) % 7; // 0 = Monday; 1970-01-01 was a Thursday
  return iso(moon + (7 - ((weekday + 1) % 7))); // the next Sunday strictly after the full moon
}

describe('Easter Sunday against the table of Paschal full moons, 1900–2099', () => {
  it('all 200 years agree', () => {
    const differ: string[] = [];
    for (let y = 1900; y <= 2099; y++) if (easterFromTable(y) !== iso(easterSunday(y))) differ.push(String(y));
    expect(differ).toEqual([]);
  });

  it('the table itself: a full moon on a Sunday gives the Sunday after (2025: 13 April → 20 April)', () => {
    expect(easterFromTable(2025)).toBe('2025-04-20');
    expect(easterFromTable(2008)).toBe('2008-03-23'); // 22 March a Saturday
  });

  it('Meeus’s worked examples', () => {
    for (const [y, want] of [
      [1991, '1991-03-31'],
      [1992, '1992-04-19'],
      [1993, '1993-04-11'],
      [1954, '1954-04-18'],
      [2000, '2000-04-23'],
      [1818, '1818-03-22'],
    ] as const) {
      expect(iso(easterSunday(y))).toBe(want);
    }
  });
});
