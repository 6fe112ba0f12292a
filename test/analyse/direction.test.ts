/**
 * trendDirection: the sign of the latest period-on-period step of the trend, and how many steps in a row
 * share it. Worked examples by hand; "flat" means a step within 1e-9 of the level (our rule, direction.ts).
 */
import { describe, expect, test } from 'vitest';
import { stepDirection, trendDirection } from '../../src/analyse/direction.js';

describe('trendDirection', () => {
  test('rising for three periods: steps +1, +1, +0.5', () => {
    expect(trendDirection([1, 2, 3, 3.5], 3)).toEqual({ direction: 'rising', run: 3 });
  });

  test('the run stops at the first step the other way', () => {
    // steps: +1, −1, −1, −1 → falling, run 3
    expect(trendDirection([1, 2, 1, 0, -1], 4)).toEqual({ direction: 'falling', run: 3 });
    // read at index 1 instead: one step, +1
    expect(trendDirection([1, 2, 1, 0, -1], 1)).toEqual({ direction: 'rising', run: 1 });
  });

  test('a step of no change is flat, and flat steps make their own run', () => {
    // steps: −1, 0, 0 → flat for 2
    expect(trendDirection([5, 4, 4, 4], 3)).toEqual({ direction: 'flat', run: 2 });
  });

  test('"flat" is relative to the level: 1e-4 on 1e6 is no change, 1e-4 on 1 is', () => {
    expect(stepDirection([1e6, 1e6 + 1e-4], 1)).toBe('flat'); // 1e-4 ≤ 1e-9·1e6 = 1e-3
    expect(stepDirection([1, 1 + 1e-4], 1)).toBe('rising'); // 1e-4 > 1e-9·max(1, 1)
  });

  test('no step to read: flat with a run of 0', () => {
    expect(trendDirection([3], 0)).toEqual({ direction: 'flat', run: 0 });
    expect(trendDirection([3, Number.NaN], 1)).toEqual({ direction: 'flat', run: 0 });
  });

  test('a missing value ends the run', () => {
    // steps: NaN, NaN, +1 → rising, run 1
    expect(trendDirection([1, Number.NaN, 2, 3], 3)).toEqual({ direction: 'rising', run: 1 });
  });
});
