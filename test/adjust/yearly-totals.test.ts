/**
 * Which years matchYearlyTotals forces (src/adjust/yearly-totals.ts): whole calendar or financial years
 * only, never a part year or one with a missing value; and why it does nothing when it cannot. The data
 * are small invented numbers, checked by hand (the arithmetic beside each check).
 */
import { describe, expect, test } from 'vitest';
import { matchYearlyTotals, yearOfPeriod } from '../../src/adjust/yearly-totals.js';
import { ordinalOf } from '../../src/vocabulary/period-index.js';

const month = (iso: string) => ordinalOf('monthly', Date.parse(`${iso}-01T00:00:00Z`));

describe('the years forced', () => {
  test('monthly, November 2020 to February 2023: only 2021 and 2022 are whole', () => {
    // 28 months: Nov–Dec 2020 (part), 2021, 2022, Jan–Feb 2023 (part).
    const n = 28;
    const y = Float64Array.from({ length: n }, (_, i) => 100 + i);
    const a = Float64Array.from(y, (v) => v * 1.01);
    const r = matchYearlyTotals(y, a, 'monthly', month('2020-11'), 1);
    expect(r.years).toEqual([
      { from: 2, to: 13, startYear: 2021 },
      { from: 14, to: 25, startYear: 2022 },
    ]);
    // Adjusted 1% above the data everywhere: forced down by the one ratio 1/1.01 over both years and,
    // carried on, over the part years too, so the result is the data itself.
    for (let i = 0; i < n; i++) expect(r.adjusted[i]).toBeCloseTo(y[i], 10);
  });

  test('financial years from July: July 2021 – June 2022 is whole, January–June 2021 is not', () => {
    expect(yearOfPeriod('monthly', month('2021-06'), 7)).toBe(2020);
    expect(yearOfPeriod('monthly', month('2021-07'), 7)).toBe(2021);
    const y = Float64Array.from({ length: 18 }, () => 10);
    const r = matchYearlyTotals(y, y, 'monthly', month('2021-01'), 7);
    expect(r.years).toEqual([{ from: 6, to: 17, startYear: 2021 }]);
  });

  test('a year with a missing value is left free', () => {
    const y = Float64Array.from({ length: 24 }, () => 10);
    y[15] = Number.NaN; // April 2022
    const r = matchYearlyTotals(
      y,
      Float64Array.from(y, (v) => v + 1),
      'monthly',
      month('2021-01'),
      1,
    );
    expect(r.years.map((x) => x.startYear)).toEqual([2021]);
    expect(Number.isNaN(r.adjusted[15])).toBe(true);
  });

  test('nothing forced, with the reason: no whole year; a non-positive adjusted value', () => {
    const y = Float64Array.from({ length: 11 }, () => 10);
    expect(matchYearlyTotals(y, y, 'monthly', month('2021-01'), 1).skipped).toBe(
      'the data hold no whole year to match',
    );
    const z = Float64Array.from({ length: 12 }, () => 10);
    const adj = Float64Array.from(z);
    adj[3] = -0.5;
    const r = matchYearlyTotals(z, adj, 'monthly', month('2021-01'), 1);
    expect(r.skipped).toMatch(/zero or negative values/);
    expect(r.adjusted).toBe(adj);
  });

  test('hourly: a whole day-aligned calendar year of 8,760 hours', () => {
    const start = ordinalOf('hourly', Date.parse('2021-12-31T22:00:00Z'));
    const n = 2 + 8760 + 5; // two hours of 2021, all of 2022 (not a leap year), five of 2023
    const y = Float64Array.from({ length: n }, (_, i) => 50 + (i % 24));
    const r = matchYearlyTotals(
      y,
      Float64Array.from(y, (v) => v * 0.98),
      'hourly',
      start,
      1,
    );
    expect(r.years).toEqual([{ from: 2, to: 8761, startYear: 2022 }]);
    let a = 0;
    let b = 0;
    for (let i = 2; i <= 8761; i++) {
      a += r.adjusted[i];
      b += y[i];
    }
    expect(Math.abs(a - b)).toBeLessThanOrEqual(1e-9 * b);
  });
});
