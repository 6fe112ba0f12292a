/**
 * compareSpans: totals for flows, averages for levels, then change and percent 100·(current/baseline − 1).
 * Worked examples by hand; spans are period ordinals, `start` the ordinal of values[0].
 */
import { describe, expect, test } from 'vitest';
import { combine, compareSpans } from '../../src/analyse/comparisons.js';

describe('compareSpans', () => {
  // ordinals 100..105 hold 10, 10, 10, 20, 30, 0
  const v = [10, 10, 10, 20, 30, 0];
  const start = 100;

  test('sum: 20 + 30 against 10 + 10', () => {
    const c = compareSpans(v, { from: 103, to: 104 }, { from: 100, to: 101 }, start, 'sum');
    expect(c).toEqual({ current: 50, baseline: 20, change: 30, percent: 150 }); // 100·(50/20 − 1) = 150
  });

  test('mean: (20 + 30)/2 = 25 against (10 + 10)/2 = 10', () => {
    const c = compareSpans(v, { from: 103, to: 104 }, { from: 100, to: 101 }, start, 'mean');
    expect(c.current).toBe(25);
    expect(c.baseline).toBe(10);
    expect(c.percent).toBeCloseTo(150, 12);
  });

  test('spans of different lengths: sum and mean disagree, as they should', () => {
    // current 10, 20, 30 (sum 60, mean 20) against 10, 10 (sum 20, mean 10)
    expect(compareSpans(v, { from: 102, to: 104 }, { from: 100, to: 101 }, start, 'sum').percent).toBeCloseTo(200, 12);
    expect(compareSpans(v, { from: 102, to: 104 }, { from: 100, to: 101 }, start, 'mean').percent).toBeCloseTo(100, 12);
  });

  test('the header example: sum of [10, 20] against [10, 10]', () => {
    const c = compareSpans([10, 10, 10, 20], { from: 2, to: 3 }, { from: 0, to: 1 }, 0, 'sum');
    expect(c).toEqual({ current: 30, baseline: 20, change: 10, percent: 50 });
  });

  test('a missing value inside a span makes its total, change and percent undefined', () => {
    const w = [10, Number.NaN, 10, 20];
    for (const how of ['sum', 'mean'] as const) {
      const c = compareSpans(w, { from: 2, to: 3 }, { from: 0, to: 1 }, 0, how);
      expect(c.baseline).toBeNaN();
      expect(c.change).toBeNaN();
      expect(c.percent).toBeNaN();
      expect(c.current).toBe(how === 'sum' ? 30 : 15);
    }
  });

  test('a zero baseline leaves the change but no percent', () => {
    const c = compareSpans(v, { from: 104, to: 104 }, { from: 105, to: 105 }, start, 'sum');
    expect(c.change).toBe(30);
    expect(c.percent).toBeNaN();
  });

  test('a span reaching outside the data is undefined', () => {
    expect(combine(v, { from: 99, to: 101 }, start, 'sum')).toBeNaN();
    expect(combine(v, { from: 104, to: 106 }, start, 'sum')).toBeNaN();
    expect(combine(v, { from: 104, to: 103 }, start, 'sum')).toBeNaN();
    expect(combine(v, { from: 105, to: 105 }, start, 'mean')).toBe(0); // a real zero stays zero
  });
});
