/**
 * reversalValue with fake, monotone `lastStep` functions whose root is known, so the value found by the
 * step search and bisection (Burden & Faires, Numerical Analysis, §2.1) can be checked exactly. Bisection
 * stops once the bracket is narrower than RELATIVE_TOLERANCE (0.05%) of the value, and the midpoint is
 * returned, so the value lies within half that of the root.
 */
import { describe, expect, test } from 'vitest';
import { RELATIVE_TOLERANCE, reversalValue } from '../../src/analyse/sensitivity.js';

/** |found − root| within half the final bracket. */
function expectNear(found: number, root: number): void {
  expect(Math.abs(found - root)).toBeLessThanOrEqual((RELATIVE_TOLERANCE / 2) * Math.abs(root) * 1.0001);
}

/** lastStep that counts its calls. */
function counted(f: (x: number) => number): { f: (x: number) => number; calls: () => number } {
  let n = 0;
  return {
    f: (x) => {
      n++;
      return f(x);
    },
    calls: () => n,
  };
}

describe('reversalValue', () => {
  test('rising trend, last step x − 80: a value below 80 turns it down', () => {
    // From 100, steps of 40/40 = 1 downwards: 80 still leaves the step at 0 (not below), 79 turns it.
    const r = reversalValue('rising', 100, 40, false, (x) => x - 80);
    expect(r.side).toBe('below');
    // bisection of [79, 80] until narrower than 0.05% of 80 = 0.04: five halvings, width 1/32
    expectNear(r.reversalValue, 80);
  });

  test('falling trend, last step (x − 120)/50: a value above 120 turns it up', () => {
    const r = reversalValue('falling', 100, 40, false, (x) => (x - 120) / 50);
    expect(r.side).toBe('above');
    expectNear(r.reversalValue, 120);
  });

  test('a non-linear monotone step: cube root of x − 87.5', () => {
    const r = reversalValue('rising', 100, 30, false, (x) => Math.cbrt(x - 87.5));
    expectNear(r.reversalValue, 87.5);
  });

  test('when the expected value already turns the trend, the boundary lies above it', () => {
    // rising, last step x − 80, start 70: 70 turns it; searching upwards, 80 is where it stops turning.
    const r = reversalValue('rising', 70, 40, false, (x) => x - 80);
    expectNear(r.reversalValue, 80);
    expect(r.side).toBe('below'); // still: values below 80 turn the trend down
  });

  test('no boundary within the search range: NaN and side none', () => {
    // root at 10, but the search reaches only 100 − 40 = 60
    expect(reversalValue('rising', 100, 40, false, (x) => x - 10)).toEqual({ reversalValue: Number.NaN, side: 'none' });
  });

  test('positive values only (multiplicative models): the search stops at zero', () => {
    const step = (x: number) => x + 5; // root at −5
    expect(reversalValue('rising', 100, 200, true, step).side).toBe('none');
    expectNear(reversalValue('rising', 100, 200, false, step).reversalValue, -5);
  });

  test('a flat trend, a zero scale or an undefined start: nothing to reverse', () => {
    expect(reversalValue('flat', 100, 40, false, (x) => x - 80).side).toBe('none');
    expect(reversalValue('rising', 100, 0, false, (x) => x - 80).side).toBe('none');
    expect(reversalValue('rising', Number.NaN, 40, false, (x) => x - 80).side).toBe('none');
  });

  test('a single crossing: the binary search over the grid finds the same cell in fewer trials', () => {
    // From 100 down in 48 steps of 40/48 ≈ 0.833: 80 is grid point k = 24 itself, where x − 80 = 0 does not
    // yet turn the trend, so the cell is [80, 79.17]; 63.1 lies in the cell [63.33, 62.5] (k = 44.28).
    for (const root of [80, 87.5, 63.1]) {
      const walk = counted((x) => x - root);
      const jump = counted((x) => x - root);
      const a = reversalValue('rising', 100, 40, false, walk.f, { steps: 48 });
      const b = reversalValue('rising', 100, 40, false, jump.f, { steps: 48, singleCrossing: true });
      expect(b).toEqual(a);
      expectNear(b.reversalValue, root);
      // the walk tries every grid point up to the cell; the binary search about log₂ 48 ≈ 6 of them
      expect(jump.calls()).toBeLessThan(walk.calls());
    }
  });

  test('a step that turns back (as a robust fit does far out): the walk finds the first crossing', () => {
    // Negative only on (90, 95): from 100 downwards in steps of 1, the first cell across is [95, 94].
    const dip = (x: number) => (x > 90 && x < 95 ? -1 : 1);
    const r = reversalValue('rising', 100, 40, false, dip, { steps: 40 });
    expectNear(r.reversalValue, 95);
    // the binary search looks only at the far end (60: no turn) and so, rightly for its promise, finds none
    expect(reversalValue('rising', 100, 40, false, dip, { steps: 40, singleCrossing: true }).side).toBe('none');
  });

  test('no crossing under a single-crossing promise costs two trials', () => {
    const none = counted((x) => x - 10);
    expect(reversalValue('rising', 100, 40, false, none.f, { steps: 48, singleCrossing: true }).side).toBe('none');
    expect(none.calls()).toBe(2); // the start and the far end of the grid
  });

  test("galloping (probes at grid steps 1, 2, 4, …) finds the walk's cell where the sign turns once", () => {
    // The same roots as above: cells k = 24 → 25, 14 → 15 (87.5 = 100 − 15·0.833), 44 → 45; the gallop probes
    // 1, 2, 4, 8, 16, 32, 48, then halves the interval between the last two.
    for (const root of [80, 87.5, 63.1, 99.5]) {
      const walk = counted((x) => x - root);
      const gallop = counted((x) => x - root);
      const a = reversalValue('rising', 100, 40, false, walk.f, { steps: 48 });
      const b = reversalValue('rising', 100, 40, false, gallop.f, { steps: 48, gallop: true });
      expect(b).toEqual(a);
      if (root < 99) expect(gallop.calls()).toBeLessThan(walk.calls());
    }
    // No crossing at all: 48 trials for the walk, 7 probes (and the start) for the gallop.
    const none = counted((x) => x - 10);
    expect(reversalValue('rising', 100, 40, false, none.f, { steps: 48, gallop: true }).side).toBe('none');
    expect(none.calls()).toBe(8);
  });

  test('galloping finds a dip that one of its probes lands in, and misses one that lies between probes', () => {
    // Negative on (90, 95): steps of 1 from 100; probes at 99, 98, 96, 92 — 92 is inside, so the gallop
    // halves (96, 92] and finds the walk's cell [95, 94].
    const dip = (x: number) => (x > 90 && x < 95 ? -1 : 1);
    expect(reversalValue('rising', 100, 40, false, dip, { steps: 40, gallop: true })).toEqual(
      reversalValue('rising', 100, 40, false, dip, { steps: 40 }),
    );
    // Negative only on (92.5, 93.5): probes 96 and 92 both miss it; the walk finds [94, 93] → ~93.5.
    const narrow = (x: number) => (x > 92.5 && x < 93.5 ? -1 : 1);
    expectNear(reversalValue('rising', 100, 40, false, narrow, { steps: 40 }).reversalValue, 93.5);
    expect(reversalValue('rising', 100, 40, false, narrow, { steps: 40, gallop: true }).side).toBe('none');
  });

  test("an affine step: three fits, then the same search on the line gives the walk's value", () => {
    // x − root is its own line: the fits at the start (100), the far end (60) and the middle (80) fix and
    // check it, and every further trial is read off the line.
    for (const root of [80.3, 87.7, 63.1, 99.5]) {
      const walk = counted((x) => (x - root) / 3);
      const line = counted((x) => (x - root) / 3);
      const a = reversalValue('rising', 100, 40, false, walk.f, { steps: 48 });
      const b = reversalValue('rising', 100, 40, false, line.f, { steps: 48, singleCrossing: true, affine: true });
      expect(b).toEqual(a);
      expect(line.calls()).toBe(3);
    }
    // A root on a grid point (80 = 100 − 24·40/48): the fit there is exactly 0, not a turn, but the line
    // through 100 and 60 gives −8.9e−16 there, a turn, so the line's cell is the one before the walk's — the
    // one place its decisions differ from the fits'. Both values are still within the search's tolerance.
    const onGrid = reversalValue('rising', 100, 40, false, (x) => (x - 80) / 3, { steps: 48, affine: true });
    expectNear(onGrid.reversalValue, 80);
    // Falling, with the boundary above: (x − 120)/50 from 100 upwards.
    const up = counted((x) => (x - 120) / 50);
    const r = reversalValue('falling', 100, 40, false, up.f, { steps: 48, affine: true });
    expect(r).toEqual(reversalValue('falling', 100, 40, false, (x) => (x - 120) / 50, { steps: 48 }));
    expect(up.calls()).toBe(3);
  });

  test('a step promised affine that is not: the check at the middle catches it and every trial is fitted', () => {
    // (x − 80)³ is single-crossing but not a line: the fit at 80 (the middle of 100 … 60) is 0, the line
    // through (100, 8000) and (60, −8000) says 0 too — so the check needs a point off the symmetry: from 100
    // with scale 36, the ends are 100 and 64, the middle 82; the line there says 888.9, the fit 8.
    const cube = (x: number) => (x - 80) ** 3;
    const promised = counted(cube);
    const a = reversalValue('rising', 100, 36, false, promised.f, { steps: 48, singleCrossing: true, affine: true });
    expect(a).toEqual(reversalValue('rising', 100, 36, false, cube, { steps: 48, singleCrossing: true }));
    expectNear(a.reversalValue, 80);
    expect(promised.calls()).toBeGreaterThan(3);
  });
});
