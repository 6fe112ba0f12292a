import { describe, expect, it } from 'vitest';
import { trendYoYSeries } from '../../src/analyse/yoy-series.js';

describe('trendYoYSeries', () => {
  it('gives the percent change on the value `lag` periods earlier (worked by hand)', () => {
    // lag 2: t=2: 105/100 − 1 = 0.05 → 5 %; t=3: 121/110 − 1 = 0.1 → 10 %; t=4: 99/105 − 1 = −0.0571… → −5.714 %.
    const out = trendYoYSeries([100, 110, 105, 121, 99], 2);
    expect(out[0]).toBeNaN();
    expect(out[1]).toBeNaN();
    expect(out[2]).toBeCloseTo(5, 12);
    expect(out[3]).toBeCloseTo(10, 12);
    expect(out[4]).toBeCloseTo(-5.714285714, 8);
  });

  it('matches the usual monthly year-over-year rate (common practice: lag 12)', () => {
    // Twelve months of 200, then 210: 210/200 − 1 = 5 % in month 13 only.
    const trend = [...new Array(12).fill(200), 210];
    const out = trendYoYSeries(trend, 12);
    expect(out.slice(0, 12).every(Number.isNaN)).toBe(true);
    expect(out[12]).toBeCloseTo(5, 12);
  });

  it('is NaN, never zero, where the base is zero, negative or undefined or the value is undefined', () => {
    const out = trendYoYSeries([0, -4, Number.NaN, 10, 3, 8, Number.NaN], 3);
    // t=3: base 0; t=4: base −4; t=5: base NaN; t=6: value NaN.
    expect(out.slice(3).every(Number.isNaN)).toBe(true);
  });

  it('accepts a Float64Array and rejects a lag that is not a positive integer', () => {
    expect(trendYoYSeries(Float64Array.from([50, 60]), 1)[1]).toBeCloseTo(20, 12); // 60/50 − 1 = 20 %
    expect(() => trendYoYSeries([1, 2], 0)).toThrow(RangeError);
    expect(() => trendYoYSeries([1, 2], 1.5)).toThrow(RangeError);
  });
});
