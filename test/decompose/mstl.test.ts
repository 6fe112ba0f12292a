import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { defaultMstlWindows, mstl } from '../../src/decompose/mstl.js';
import { stl } from '../../src/decompose/stl.js';

/** A two-period series (e.g. hourly data with daily and weekly cycles, scaled down) plus noise. */
function makeSeries(short: number, long: number, n: number, noise: number[]): Float64Array {
  return Float64Array.from(
    { length: n },
    (_, t) =>
      100 +
      0.05 * t +
      8 * Math.sin((2 * Math.PI * t) / short) +
      4 * Math.cos((2 * Math.PI * t) / long) +
      noise[t % noise.length],
  );
}

describe('mstl — Bandara, Hyndman & Bergmeir (2021)', () => {
  it('trend + every seasonal + remainder = series (to 1e-9 of the range), periods sorted ascending', () => {
    fc.assert(
      fc.property(
        fc.constantFrom(3, 4, 6),
        fc.integer({ min: 3, max: 5 }),
        fc.integer({ min: 3, max: 4 }),
        fc.boolean(),
        fc.array(fc.double({ min: -1, max: 1, noNaN: true }), { minLength: 50, maxLength: 50 }),
        (short, ratio, cycles, reversed, noise) => {
          const long = short * ratio;
          const y = makeSeries(short, long, long * cycles, noise);
          const periods = reversed ? [long, short] : [short, long];
          const r = mstl(y, { periods });
          expect(r.periods).toEqual([short, long]);
          expect([...r.seasonals.keys()]).toEqual([short, long]);
          let lo = Number.POSITIVE_INFINITY;
          let hi = Number.NEGATIVE_INFINITY;
          for (const v of y) {
            lo = Math.min(lo, v);
            hi = Math.max(hi, v);
          }
          const tol = 1e-9 * (hi - lo);
          for (let t = 0; t < y.length; t++) {
            let sum = r.trend[t] + r.remainder[t];
            let seasonal = 0;
            for (const s of r.seasonals.values()) seasonal += s[t];
            sum += seasonal;
            expect(Math.abs(sum - y[t])).toBeLessThanOrEqual(tol);
            expect(Math.abs(r.seasonal[t] - seasonal)).toBeLessThanOrEqual(tol);
          }
        },
      ),
      { numRuns: 25 },
    );
  });

  it('default seasonal windows are 7 + 4·i: 11, 15, 19, … (forecast 8.20 mstl, s.window = 7 + 4*seq(6))', () => {
    expect(defaultMstlWindows(3)).toEqual([11, 15, 19]);
    const y = makeSeries(4, 12, 48, [0.5, -0.25, 0.1]);
    expect(mstl(y, { periods: [12, 4] }).seasonalWindows).toEqual([11, 15]);
  });

  it('with one period and one iteration it is STL with s.window 11 (as forecast::mstl on a plain ts)', () => {
    const y = makeSeries(12, 60, 72, [0.7, -0.3, 0.2, -0.9]);
    const m = mstl(y, { periods: [12], iterations: 1 });
    const s = stl(y, { period: 12, seasonalWindow: 11 });
    for (let t = 0; t < y.length; t++) {
      expect(m.trend[t]).toBe(s.trend[t]);
      expect(m.seasonals.get(12)?.[t]).toBe(s.seasonal[t]);
    }
  });
});
