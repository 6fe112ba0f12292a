/**
 * changeAt, percentChange and annualisedGrowth on series small enough to check by hand. The rules are the
 * growth-rate definitions of Hyndman & Athanasopoulos, FPP 3rd ed., §3.1 (percent = 100·(current/base − 1))
 * and compound annualisation (Australian Bureau of Statistics, "A Guide to Interpreting Time Series", 2003).
 */
import { describe, expect, test } from 'vitest';
import { annualisedGrowth, changeAt, percentChange } from '../../src/analyse/change.js';

const dates = (n: number, year = 2025): string[] =>
  Array.from({ length: n }, (_, i) => `${year + Math.floor(i / 12)}-${String((i % 12) + 1).padStart(2, '0')}-01`);

describe('changeAt', () => {
  test('year-over-year on monthly data: lag 12', () => {
    // 13 months: January 2025 = 80, January 2026 = 100 (the rest filler).
    const v = [80, 81, 82, 83, 84, 85, 86, 87, 88, 89, 90, 91, 100];
    const c = changeAt(v, 12, 12, dates(13));
    expect(c.current).toBe(100);
    expect(c.yearAgo).toBe(80);
    expect(c.change).toBe(20); // 100 − 80
    expect(c.percent).toBeCloseTo(25, 12); // 100·(100/80 − 1) = 100·0.25 = 25
    expect(c.currentDate).toBe('2026-01-01');
    expect(c.baseDate).toBe('2025-01-01');
  });

  test('period-on-period: lag 1', () => {
    const c = changeAt([100, 104, 110], 2, 1, dates(3));
    expect(c.yearAgo).toBe(104);
    expect(c.change).toBe(6); // 110 − 104
    expect(c.percent).toBeCloseTo(5.769230769, 8); // 100·(110/104 − 1) = 600/104 = 5.7692…
    expect(c.baseDate).toBe('2025-02-01');
  });

  test('the header example: lag 2 over [100, 104, 110]', () => {
    const c = changeAt([100, 104, 110], 2, 2, dates(3));
    expect([c.current, c.yearAgo, c.change]).toEqual([110, 100, 10]);
    expect(c.percent).toBeCloseTo(10, 12); // 100·(110/100 − 1)
  });

  test('a fall gives a negative percent', () => {
    expect(changeAt([200, 150], 1, 1, dates(2)).percent).toBeCloseTo(-25, 12); // 100·(150/200 − 1) = −25
  });

  test('percent is NaN for a base of zero, below zero or missing; the difference stays', () => {
    const zero = changeAt([0, 5], 1, 1, dates(2));
    expect(zero.percent).toBeNaN();
    expect(zero.change).toBe(5);
    const negative = changeAt([-4, 2], 1, 1, dates(2));
    expect(negative.percent).toBeNaN(); // 100·(2/−4 − 1) = −150 would mislead
    expect(negative.change).toBe(6);
    expect(changeAt([Number.NaN, 2], 1, 1, dates(2)).percent).toBeNaN();
  });

  test('no period a lag back: everything undefined, no base date', () => {
    const c = changeAt([1, 2, 3], 2, 12, dates(3));
    expect(c.yearAgo).toBeNaN();
    expect(c.change).toBeNaN();
    expect(c.percent).toBeNaN();
    expect(c.baseDate).toBe('');
    expect(changeAt([1, 2, 3], 5, 1, dates(3)).current).toBeNaN();
  });
});

describe('percentChange', () => {
  test('hand values', () => {
    expect(percentChange(105, 100)).toBeCloseTo(5, 12);
    expect(percentChange(50, 200)).toBeCloseTo(-75, 12); // 100·(0.25 − 1)
    expect(percentChange(0, 10)).toBeCloseTo(-100, 12);
    expect(percentChange(10, 0)).toBeNaN();
    expect(percentChange(10, -1)).toBeNaN();
  });
});

describe('annualisedGrowth', () => {
  test('3% over six months of monthly data is 6.09% a year', () => {
    const v = [100, 100.5, 101, 101.5, 102, 102.5, 103];
    // 100·((103/100)^(12/6) − 1) = 100·(1.0609 − 1) = 6.09
    expect(annualisedGrowth(v, 6, 6, 12)).toBeCloseTo(6.09, 10);
  });

  test('quarterly: 2% over two quarters is 4.04% a year', () => {
    // 100·(1.02^(4/2) − 1) = 100·(1.0404 − 1) = 4.04
    expect(annualisedGrowth([100, 101, 102], 2, 2, 4)).toBeCloseTo(4.04, 10);
  });

  test('a fall: 100 → 97 over six months is −5.91% a year', () => {
    // 0.97² = 0.9409 → 100·(0.9409 − 1) = −5.91
    expect(annualisedGrowth([100, 99, 99, 98, 98, 97, 97], 5, 5, 12)).toBeCloseTo(100 * (0.97 ** (12 / 5) - 1), 10);
    expect(annualisedGrowth([100, 0, 0, 0, 0, 0, 97], 6, 6, 12)).toBeCloseTo(-5.91, 10);
  });

  test('twelve months annualise to the plain year-over-year change', () => {
    const v = Array.from({ length: 13 }, (_, i) => 100 + i);
    expect(annualisedGrowth(v, 12, 12, 12)).toBeCloseTo(12, 10); // (112/100)^1 − 1
  });

  test('NaN without a positive base or without k periods of history', () => {
    expect(annualisedGrowth([0, 1, 2], 2, 2, 12)).toBeNaN();
    expect(annualisedGrowth([-1, 1, 2], 2, 2, 12)).toBeNaN();
    expect(annualisedGrowth([1, 2], 1, 6, 12)).toBeNaN();
    expect(annualisedGrowth([1, 2, -3], 2, 2, 12)).toBeNaN(); // a negative ratio has no real root
  });
});
