/**
 * STL's WebAssembly kernel (src/decompose/kernel/stl.as.ts) against the JavaScript it was written from
 * (stlScript in stl.ts), bit for bit: both are the same IEEE double operations in the same order, so any
 * difference at all is a mistake in the copy. stlScript itself is held to R's stats::stl by
 * reference.test.ts; since stl() fits by the kernel, those reference checks run through it too.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { type StlOptions, type StlResult, stl, stlScript } from '../../src/decompose/stl.js';
import { stlKernel } from '../../src/decompose/stl-kernel.js';

/** A seasonal series with a trend, noise from a seeded generator, outliers and optional gaps. */
function series(n: number, period: number, seed: number, gaps: number[] = []): Float64Array {
  let s = seed >>> 0 || 1;
  const random = () => {
    s = (Math.imul(s, 1664525) + 1013904223) >>> 0;
    return s / 2 ** 32;
  };
  const y = Float64Array.from(
    { length: n },
    (_, t) => 100 + 0.2 * t + 8 * Math.sin((2 * Math.PI * t) / period) + 3 * (random() - 0.5),
  );
  for (let t = 7; t < n; t += 37) y[t] += 40 * (random() - 0.3);
  for (const g of gaps) if (g < n) y[g] = Number.NaN;
  return y;
}

const bits = (a: Float64Array) => Buffer.from(a.buffer, a.byteOffset, a.byteLength);

function expectSameBits(a: StlResult, b: StlResult, label: string): void {
  for (const key of ['trend', 'seasonal', 'remainder', 'weights'] as const) {
    expect(bits(a[key]).equals(bits(b[key])), `${label}: ${key}`).toBe(true);
  }
  expect(a.settings).toEqual(b.settings);
}

describe('STL kernel (WebAssembly)', () => {
  it('is built (npm run build compiles it into dist/decompose/stl-kernel.wasm)', () => {
    expect(stlKernel(), 'no dist/decompose/stl-kernel.wasm: run npm run build').not.toBeNull();
  });

  it('gives the bits of the JavaScript for every kind of setting', () => {
    const cases: [number, number, StlOptions, number[]][] = [
      [120, 12, { period: 12, seasonalWindow: 13 }, []],
      [120, 12, { period: 12, seasonalWindow: 13, robust: true }, []],
      [1200, 12, { period: 12, seasonalWindow: 13, robust: true }, []],
      [1200, 12, { period: 12, seasonalWindow: 13, robust: true, trueMedian: true }, []],
      [1201, 12, { period: 12, seasonalWindow: 7, robust: true, trueMedian: true }, []],
      [97, 4, { period: 4, seasonalWindow: 'periodic' }, []],
      [97, 4, { period: 4, seasonalWindow: 'periodic', robust: true }, [0, 5, 96]],
      [365, 7, { period: 7, seasonalWindow: 11, seasonalDegree: 1, trendDegree: 0, lowpassDegree: 0 }, []],
      [365, 7, { period: 7, seasonalWindow: 11, seasonalDegree: 1, robust: true }, [3, 4, 5, 200]],
      [500, 24, { period: 24, seasonalWindow: 9, seasonalJump: 1, trendJump: 1, lowpassJump: 1 }, [10]],
      [500, 24, { period: 24, seasonalWindow: 21, trendWindow: 101, robust: true, inner: 2, outer: 3 }, [499]],
      [260, 52, { period: 52, seasonalWindow: 7, robust: true }, [0, 1, 2, 51, 52]],
      [9, 2, { period: 2, seasonalWindow: 7 }, []],
      [5, 2, { period: 2, seasonalWindow: 7, robust: true }, []],
      [30, 12, { period: 12, seasonalWindow: 'periodic', robust: true }, [29]],
    ];
    for (const [n, period, options, gaps] of cases) {
      const y = series(n, period, n + period, gaps);
      expectSameBits(stl(y, options), stlScript(y, options), `n ${n}, ${JSON.stringify(options)}`);
    }
  });

  it('gives the bits of the JavaScript on random series, windows and gaps', () => {
    fc.assert(
      fc.property(
        fc.record({
          period: fc.constantFrom(2, 3, 4, 7, 12, 24),
          cycles: fc.integer({ min: 2, max: 30 }),
          extra: fc.integer({ min: 0, max: 11 }),
          seasonalWindow: fc.constantFrom<number | 'periodic'>(7, 9, 13, 35, 'periodic'),
          robust: fc.boolean(),
          seasonalDegree: fc.constantFrom<0 | 1>(0, 1),
          gaps: fc.array(fc.nat(400), { maxLength: 6 }),
          seed: fc.nat(),
        }),
        ({ period, cycles, extra, seasonalWindow, robust, seasonalDegree, gaps, seed }) => {
          const n = period * cycles + extra;
          const y = series(n, period, seed, gaps);
          if (y.every((v) => Number.isNaN(v))) return;
          const options: StlOptions = { period, seasonalWindow, robust, seasonalDegree };
          expectSameBits(stl(y, options), stlScript(y, options), JSON.stringify({ n, ...options, gaps, seed }));
        },
      ),
      { numRuns: 150 },
    );
  });

  it('gives the same bits when one instance fits long and short series, the same settings again and again', () => {
    // The instance is kept between fits (stl-kernel.ts) and its arrays freed by reset: a table or a stack
    // kept from an earlier fit would be overwritten by the next fit's arrays and change these bits.
    const runs: [number, StlOptions][] = [
      [120, { period: 12, seasonalWindow: 13 }],
      [120, { period: 12, seasonalWindow: 13 }],
      [2400, { period: 12, seasonalWindow: 13, robust: true, trueMedian: true }],
      [120, { period: 12, seasonalWindow: 13 }],
      [60, { period: 12, seasonalWindow: 7, robust: true, trueMedian: true }],
      [2400, { period: 12, seasonalWindow: 13, robust: true, trueMedian: true }],
      [60, { period: 12, seasonalWindow: 7, robust: true, trueMedian: true }],
    ];
    for (const [i, [n, options]] of runs.entries()) {
      const y = series(n, 12, 31 + n);
      expectSameBits(stl(y, options), stlScript(y, options), `fit ${i + 1}: n ${n}, ${JSON.stringify(options)}`);
    }
  });
});
