/**
 * trendYoYSeries: year-over-year percent at every period, 100·(x[t]/x[t − lag] − 1), by hand.
 */
import { describe, expect, test } from 'vitest';
import { changeAt } from '../../src/analyse/change.js';
import { trendYoYSeries } from '../../src/analyse/yoy-series.js';

describe('trendYoYSeries', () => {
  test('the header example, lag 2', () => {
    const y = trendYoYSeries([100, 110, 105, 121], 2);
    expect(y[0]).toBeNaN();
    expect(y[1]).toBeNaN();
    expect(y[2]).toBeCloseTo(5, 12); // 100·(105/100 − 1)
    expect(y[3]).toBeCloseTo(10, 12); // 100·(121/110 − 1)
  });

  test('undefined where the base is zero, negative or missing', () => {
    const y = trendYoYSeries([0, -2, Number.NaN, 5, 6, 7], 3);
    expect(y.slice(3).every(Number.isNaN)).toBe(true);
  });

  test('agrees with changeAt at every period', () => {
    const t = [90, 95, 100, 102, 99, 101, 108, 110];
    const y = trendYoYSeries(t, 4);
    for (let i = 4; i < t.length; i++) expect(y[i]).toBe(changeAt(t, i, 4, []).percent);
  });

  test('a lag that is not a positive whole number is refused', () => {
    expect(() => trendYoYSeries([1, 2], 0)).toThrow(RangeError);
    expect(() => trendYoYSeries([1, 2], 1.5)).toThrow(RangeError);
  });
});
