/**
 * turningPoints. The rule (turning-points.ts, after the minimum-phase idea of Bry & Boschan 1971): a peak
 * (trough) is a period after which the trend falls (rises) for at least two steps, having risen (fallen)
 * for at least two steps before it; steps of no change are skipped. The turn is dated at the period the
 * last step before the turn arrived at. Each case below is worked out from the steps by hand.
 */
import { describe, expect, test } from 'vitest';
import { TURNING_POINT_RULE, turningPoints } from '../../src/analyse/turning-points.js';

const d = (n: number): string[] => Array.from({ length: n }, (_, i) => `d${i}`);
const kinds = (t: number[]) => turningPoints(t, d(t.length)).map((p) => [p.kind, p.index, p.value]);

describe('turningPoints', () => {
  test('a peak: steps +1 +1 −1 −1 turn at index 2', () => {
    expect(kinds([1, 2, 3, 2, 1])).toEqual([['peak', 2, 3]]);
    expect(turningPoints([1, 2, 3, 2, 1], d(5))[0].date).toBe('d2');
  });

  test('a trough: steps −1 −1 +1 +1 turn at index 2', () => {
    expect(kinds([5, 4, 3, 4, 5])).toEqual([['trough', 2, 3]]);
  });

  test('a peak then a trough: steps + + − − + +', () => {
    // peak after steps 1–2 at index 2; trough after steps 3–4 at index 4
    expect(kinds([0, 1, 2, 1, 0, 1, 2])).toEqual([
      ['peak', 2, 2],
      ['trough', 4, 0],
    ]);
  });

  test('a single step the other way is not a turn', () => {
    // steps + + − + + : the fall lasts one step
    expect(kinds([1, 2, 3, 2, 3, 4])).toEqual([]);
    // steps + + − : only one step after
    expect(kinds([1, 2, 3, 2])).toEqual([]);
    // steps + − − : only one step before
    expect(kinds([2, 3, 2, 1])).toEqual([]);
  });

  test('flat steps are skipped: a plateau turns where the rise ended', () => {
    // steps + + 0 0 − − : the non-flat steps are + + − −; the last rise (step 2) arrived at index 2
    expect(kinds([1, 2, 3, 3, 3, 2, 1])).toEqual([['peak', 2, 3]]);
    // steps − 0 − 0 + + : non-flat − − + +; the last fall (step 3) arrived at index 3
    expect(kinds([4, 3, 3, 2, 2, 3, 4])).toEqual([['trough', 3, 2]]);
  });

  test('a monotone or flat trend has no turning points', () => {
    expect(kinds([1, 2, 3, 4, 5, 6])).toEqual([]);
    expect(kinds([2, 2, 2, 2, 2])).toEqual([]);
  });

  test('a longer run requirement drops short swings', () => {
    // steps + + − − + + + − − − ; with three-step runs only the later peak (index 7) qualifies
    const t = [0, 1, 2, 1, 0, 1, 2, 3, 2, 1, 0];
    expect(turningPoints(t, d(t.length), 3).map((p) => [p.kind, p.index])).toEqual([['peak', 7]]);
  });

  test('the rule as the brief states it names the two-period minimum', () => {
    expect(TURNING_POINT_RULE).toMatch(/at least two periods/);
  });
});
