import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  applySymmetricFilter,
  centredMovingAverage,
  movingAverageWeights,
} from '../../src/decompose/moving-average.js';

const definedIndices = (a: Float64Array): number[] => [...a.keys()].filter((i) => !Number.isNaN(a[i]));

describe('movingAverageWeights — Hyndman & Athanasopoulos, FPP 3rd ed., §3.3', () => {
  it('2×4-MA weights are 1/8, 1/4, 1/4, 1/4, 1/8 (FPP3 §3.3, as printed)', () => {
    expect(Array.from(movingAverageWeights(4))).toEqual([1 / 8, 1 / 4, 1 / 4, 1 / 4, 1 / 8]);
  });

  it('2×12-MA weights are 1/24, then 1/12 eleven times, then 1/24 (FPP3 §3.3, as printed)', () => {
    const w = Array.from(movingAverageWeights(12));
    expect(w).toHaveLength(13);
    expect(w[0]).toBe(1 / 24);
    expect(w[12]).toBe(1 / 24);
    for (let i = 1; i < 12; i++) expect(w[i]).toBe(1 / 12);
  });

  it('odd order k gives k equal weights 1/k (FPP3 §3.3: the 5-MA)', () => {
    expect(Array.from(movingAverageWeights(5))).toEqual([0.2, 0.2, 0.2, 0.2, 0.2]);
  });

  it('rejects an order that is not a positive integer', () => {
    expect(() => movingAverageWeights(0)).toThrow(RangeError);
    expect(() => movingAverageWeights(2.5)).toThrow(RangeError);
  });
});

describe('centredMovingAverage', () => {
  const series = Float64Array.from({ length: 30 }, (_, i) => Math.sin(i) * 10 + i);

  it('order 5 leaves the first and last two points undefined (common practice; FPP3 §3.3 table)', () => {
    const ma = centredMovingAverage(series, 5);
    expect(definedIndices(ma)).toEqual([...Array(26).keys()].map((i) => i + 2));
  });

  it('2×12 loses six points at each end (common practice; FPP3 §3.3)', () => {
    const ma = centredMovingAverage(series, 12);
    expect(definedIndices(ma)).toEqual([...Array(18).keys()].map((i) => i + 6));
  });

  it('hand-worked 3-MA and 2×4-MA', () => {
    // 3-MA of [3, 5, 4, 8, 10]: (3+5+4)/3 = 4, (5+4+8)/3 = 17/3, (4+8+10)/3 = 22/3; both ends undefined.
    const ma3 = centredMovingAverage(Float64Array.of(3, 5, 4, 8, 10), 3);
    expect(Number.isNaN(ma3[0]) && Number.isNaN(ma3[4])).toBe(true);
    expect(ma3[1]).toBeCloseTo(4, 14);
    expect(ma3[2]).toBeCloseTo(17 / 3, 14);
    expect(ma3[3]).toBeCloseTo(22 / 3, 14);
    // 2×4-MA of [2, 4, 6, 8, 6, 4, 2] at the middle point (index 3):
    // 4/8 + (6 + 8 + 6)/4 + 4/8 = 0.5 + 5 + 0.5 = 6; at index 2: 2/8 + (4+6+8)/4 + 6/8 = 0.25 + 4.5 + 0.75 = 5.5.
    const ma4 = centredMovingAverage(Float64Array.of(2, 4, 6, 8, 6, 4, 2), 4);
    expect(ma4[2]).toBeCloseTo(5.5, 14);
    expect(ma4[3]).toBeCloseTo(6, 14);
    expect(ma4[4]).toBeCloseTo(5.5, 14);
    expect(definedIndices(ma4)).toEqual([2, 3, 4]);
  });

  it('a moving average of a straight line is that line (property; common practice)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: -1e3, max: 1e3, noNaN: true }),
        fc.double({ min: -100, max: 100, noNaN: true }),
        fc.integer({ min: 1, max: 24 }),
        fc.integer({ min: 0, max: 40 }),
        (a, b, order, extra) => {
          const n = order + 1 + extra;
          const line = Float64Array.from({ length: n }, (_, t) => a + b * t);
          const ma = centredMovingAverage(line, order);
          const scale = Math.abs(a) + Math.abs(b) * n + 1;
          for (const t of definedIndices(ma)) expect(Math.abs(ma[t] - line[t])).toBeLessThanOrEqual(1e-12 * scale);
          // Odd k loses (k−1)/2 a side, even k loses k/2: n − 2·half points remain.
          const half = order % 2 === 1 ? (order - 1) / 2 : order / 2;
          expect(definedIndices(ma).length).toBe(Math.max(0, n - 2 * half));
        },
      ),
      { numRuns: 200 },
    );
  });

  it('a NaN inside a window gives NaN there, and only there', () => {
    const y = Float64Array.from({ length: 12 }, (_, i) => i * i);
    y[5] = Number.NaN;
    const ma = centredMovingAverage(y, 3);
    expect(definedIndices(ma)).toEqual([1, 2, 3, 7, 8, 9, 10]);
  });
});

describe('applySymmetricFilter', () => {
  it('applies arbitrary symmetric weights: [1, 2, 1]/4 on [0, 4, 8, 0] → [NaN, 4, 5, NaN]', () => {
    // (0 + 2·4 + 8)/4 = 4; (4 + 2·8 + 0)/4 = 5.
    const out = applySymmetricFilter(Float64Array.of(0, 4, 8, 0), Float64Array.of(0.25, 0.5, 0.25));
    expect(Array.from(out)).toEqual([Number.NaN, 4, 5, Number.NaN]);
  });
});
