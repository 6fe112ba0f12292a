/**
 * reversalValue with fake, monotone `lastStep` functions whose root is known, so the value found by the
 * step search and bisection (Burden & Faires, Numerical Analysis, §2.1) can be checked exactly.
 */
import { describe, expect, test } from 'vitest';
import { reversalValue } from '../../src/analyse/sensitivity.js';

describe('reversalValue', () => {
  test('rising trend, last step x − 80: a value below 80 turns it down', () => {
    // From 100, steps of 40/40 = 1 downwards: 80 still leaves the step at 0 (not below), 79 turns it.
    const r = reversalValue('rising', 100, 40, false, (x) => x - 80);
    expect(r.side).toBe('below');
    expect(r.reversalValue).toBeCloseTo(80, 6); // bisection of [79, 80] thirty times: width 1/2³⁰
  });

  test('falling trend, last step (x − 120)/50: a value above 120 turns it up', () => {
    const r = reversalValue('falling', 100, 40, false, (x) => (x - 120) / 50);
    expect(r.side).toBe('above');
    expect(r.reversalValue).toBeCloseTo(120, 6);
  });

  test('a non-linear monotone step: cube root of x − 87.5', () => {
    const r = reversalValue('rising', 100, 30, false, (x) => Math.cbrt(x - 87.5));
    expect(r.reversalValue).toBeCloseTo(87.5, 6);
  });

  test('when the expected value already turns the trend, the boundary lies above it', () => {
    // rising, last step x − 80, start 70: 70 turns it; searching upwards, 80 is where it stops turning.
    const r = reversalValue('rising', 70, 40, false, (x) => x - 80);
    expect(r.reversalValue).toBeCloseTo(80, 6);
    expect(r.side).toBe('below'); // still: values below 80 turn the trend down
  });

  test('no boundary within the search range: NaN and side none', () => {
    // root at 10, but the search reaches only 100 − 40 = 60
    expect(reversalValue('rising', 100, 40, false, (x) => x - 10)).toEqual({ reversalValue: Number.NaN, side: 'none' });
  });

  test('positive values only (multiplicative models): the search stops at zero', () => {
    const step = (x: number) => x + 5; // root at −5
    expect(reversalValue('rising', 100, 200, true, step).side).toBe('none');
    expect(reversalValue('rising', 100, 200, false, step).reversalValue).toBeCloseTo(-5, 6);
  });

  test('a flat trend, a zero scale or an undefined start: nothing to reverse', () => {
    expect(reversalValue('flat', 100, 40, false, (x) => x - 80).side).toBe('none');
    expect(reversalValue('rising', 100, 0, false, (x) => x - 80).side).toBe('none');
    expect(reversalValue('rising', Number.NaN, 40, false, (x) => x - 80).side).toBe('none');
  });
});
