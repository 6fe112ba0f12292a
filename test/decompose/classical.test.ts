import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { classicalDecomposition } from '../../src/decompose/classical.js';

/** A random seasonal series: positive level, slope, a repeating pattern and noise. */
const seriesArb = fc
  .record({
    period: fc.integer({ min: 2, max: 12 }),
    cycles: fc.integer({ min: 2, max: 8 }),
    extra: fc.integer({ min: 0, max: 11 }),
    level: fc.double({ min: 50, max: 500, noNaN: true }),
    slope: fc.double({ min: -2, max: 2, noNaN: true }),
    noise: fc.array(fc.double({ min: -5, max: 5, noNaN: true }), { minLength: 120, maxLength: 120 }),
  })
  .map(({ period, cycles, extra, level, slope, noise }) => {
    const n = period * cycles + (extra % period);
    const values = Float64Array.from(
      { length: n },
      (_, t) => level + slope * t + 10 * Math.sin((2 * Math.PI * t) / period) + noise[t % 120],
    );
    return { period, values };
  });

const scaleOf = (y: Float64Array): number => Math.max(...Array.from(y, Math.abs), 1);

describe('classicalDecomposition — FPP3 §3.4 / R stats::decompose', () => {
  it('additive: Y = T + S + R to 1e-9 (relative) wherever the trend is defined', () => {
    fc.assert(
      fc.property(seriesArb, ({ period, values }) => {
        const d = classicalDecomposition(values, period, { model: 'additive' });
        const tol = 1e-9 * scaleOf(values);
        for (let t = 0; t < values.length; t++) {
          if (Number.isNaN(d.trend[t])) {
            expect(Number.isNaN(d.remainder[t])).toBe(true);
            continue;
          }
          expect(Math.abs(d.trend[t] + d.seasonal[t] + d.remainder[t] - values[t])).toBeLessThanOrEqual(tol);
        }
      }),
      { numRuns: 100 },
    );
  });

  it('multiplicative: Y = T·S·R to 1e-9 (relative) wherever the trend is defined', () => {
    fc.assert(
      fc.property(seriesArb, ({ period, values }) => {
        const d = classicalDecomposition(values, period, { model: 'multiplicative' });
        const tol = 1e-9 * scaleOf(values);
        for (let t = 0; t < values.length; t++) {
          if (Number.isNaN(d.trend[t])) continue;
          expect(Math.abs(d.trend[t] * d.seasonal[t] * d.remainder[t] - values[t])).toBeLessThanOrEqual(tol);
        }
      }),
      { numRuns: 100 },
    );
  });

  it('the seasonal figure sums to 0 (additive) and averages 1 (multiplicative) over a cycle', () => {
    fc.assert(
      fc.property(seriesArb, ({ period, values }) => {
        const add = classicalDecomposition(values, period, { model: 'additive' }).figure;
        const mult = classicalDecomposition(values, period, { model: 'multiplicative' }).figure;
        expect(add).toHaveLength(period);
        let sa = 0;
        let sm = 0;
        for (let s = 0; s < period; s++) {
          sa += add[s];
          sm += mult[s];
        }
        expect(Math.abs(sa)).toBeLessThanOrEqual(1e-9 * scaleOf(values));
        expect(Math.abs(sm / period - 1)).toBeLessThanOrEqual(1e-12);
      }),
      { numRuns: 100 },
    );
  });

  it('the seasonal component repeats the figure, starting at the first observation', () => {
    const values = Float64Array.from({ length: 30 }, (_, t) => 10 + t + (t % 3));
    const d = classicalDecomposition(values, 3, { model: 'additive' });
    for (let t = 0; t < 30; t++) expect(d.seasonal[t]).toBe(d.figure[t % 3]);
  });

  it('a constant series gives a constant trend and zero seasonal (one for multiplicative)', () => {
    for (const period of [4, 7, 12]) {
      const values = new Float64Array(5 * period).fill(42.5);
      const add = classicalDecomposition(values, period, { model: 'additive' });
      const mult = classicalDecomposition(values, period, { model: 'multiplicative' });
      for (let t = 0; t < values.length; t++) {
        expect(Math.abs(add.seasonal[t])).toBeLessThanOrEqual(1e-12);
        expect(Math.abs(mult.seasonal[t] - 1)).toBeLessThanOrEqual(1e-12);
        if (Number.isNaN(add.trend[t])) continue;
        expect(Math.abs(add.trend[t] - 42.5)).toBeLessThanOrEqual(1e-12);
        expect(Math.abs(mult.trend[t] - 42.5)).toBeLessThanOrEqual(1e-12);
      }
    }
  });

  it('hand-worked example: period 4, 12 points (also what R stats::decompose gives)', () => {
    // y = 1 3 2 4 | 2 4 3 5 | 3 5 4 6. The 2×4-MA (weights 1/8, 1/4, 1/4, 1/4, 1/8):
    //   t=2: 1/8 + (3+2+4)/4 + 2/8 = 0.125 + 2.25 + 0.25 = 2.625
    //   t=3: 3/8 + (2+4+2)/4 + 4/8 = 0.375 + 2 + 0.5 = 2.875, and so on up by 0.25: t=9 → 4.375.
    // Detrended y − T at t=2…9: −0.625, 1.125, −1.125, 0.625, −0.625, 1.125, −1.125, 0.625.
    // Means by position t mod 4: pos 0 (t=4, 8) −1.125; pos 1 (t=5, 9) 0.625; pos 2 (t=2, 6) −0.625;
    // pos 3 (t=3, 7) 1.125. They already sum to 0, so the figure is [−1.125, 0.625, −0.625, 1.125]; the
    // remainder is 0 wherever it is defined.
    const y = Float64Array.of(1, 3, 2, 4, 2, 4, 3, 5, 3, 5, 4, 6);
    const d = classicalDecomposition(y, 4, { model: 'additive' });
    const trend = [Number.NaN, Number.NaN, 2.625, 2.875, 3.125, 3.375, 3.625, 3.875, 4.125, 4.375];
    for (let t = 0; t < 10; t++) {
      if (Number.isNaN(trend[t])) expect(Number.isNaN(d.trend[t])).toBe(true);
      else expect(d.trend[t]).toBeCloseTo(trend[t], 14);
    }
    expect(Number.isNaN(d.trend[10]) && Number.isNaN(d.trend[11])).toBe(true);
    const figure = [-1.125, 0.625, -0.625, 1.125];
    for (let s = 0; s < 4; s++) expect(d.figure[s]).toBeCloseTo(figure[s], 14);
    for (let t = 2; t < 10; t++) expect(Math.abs(d.remainder[t])).toBeLessThanOrEqual(1e-14);
  });

  it('with hendersonLength the trend and remainder have a value at every point, including the last', () => {
    fc.assert(
      fc.property(seriesArb, fc.constantFrom(5, 7, 9, 13), ({ period, values }, length) => {
        fc.pre(values.length >= length);
        for (const model of ['additive', 'multiplicative'] as const) {
          const d = classicalDecomposition(values, period, { model, hendersonLength: length });
          for (let t = 0; t < values.length; t++) {
            expect(Number.isFinite(d.trend[t])).toBe(true);
            expect(Number.isFinite(d.remainder[t])).toBe(true);
          }
          const last = values.length - 1;
          const back =
            model === 'additive'
              ? d.trend[last] + d.seasonal[last] + d.remainder[last]
              : d.trend[last] * d.seasonal[last] * d.remainder[last];
          expect(Math.abs(back - values[last])).toBeLessThanOrEqual(1e-9 * scaleOf(values));
        }
      }),
      { numRuns: 60 },
    );
  });
});
