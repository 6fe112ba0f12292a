import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { select, stl } from '../../src/decompose/stl.js';

/** Seasonal series of modest size: level + slope·t + a sine of the period + uniform noise in ±noise. */
function makeSeries(period: number, n: number, noise: number[], slope = 0.3): Float64Array {
  return Float64Array.from(
    { length: n },
    (_, t) => 50 + slope * t + 10 * Math.sin((2 * Math.PI * t) / period) + noise[t % noise.length],
  );
}

const caseArb = fc.record({
  period: fc.constantFrom(4, 7, 12),
  cycles: fc.integer({ min: 3, max: 8 }),
  seasonalWindow: fc.constantFrom<number | 'periodic'>(7, 11, 'periodic'),
  robust: fc.boolean(),
  noise: fc.array(fc.double({ min: -1, max: 1, noNaN: true }), { minLength: 96, maxLength: 96 }),
});

const rangeOf = (y: Float64Array): number => {
  let lo = Number.POSITIVE_INFINITY;
  let hi = Number.NEGATIVE_INFINITY;
  for (const v of y) {
    if (Number.isNaN(v)) continue;
    lo = Math.min(lo, v);
    hi = Math.max(hi, v);
  }
  return hi - lo;
};

describe('stl — Cleveland et al. (1990)', () => {
  it('is additive: Y = T + S + R to 1e-9 of the range at every point (the paper, §2)', () => {
    fc.assert(
      fc.property(caseArb, ({ period, cycles, seasonalWindow, robust, noise }) => {
        const y = makeSeries(period, period * cycles, noise);
        const r = stl(y, { period, seasonalWindow, robust });
        const tol = 1e-9 * rangeOf(y);
        for (let t = 0; t < y.length; t++) {
          expect(Math.abs(r.trend[t] + r.seasonal[t] + r.remainder[t] - y[t])).toBeLessThanOrEqual(tol);
        }
      }),
      { numRuns: 40 },
    );
  });

  it('a constant series gives a constant trend at its level and a zero seasonal (within 1e-9)', () => {
    for (const period of [4, 7, 12]) {
      for (const seasonalWindow of [7, 'periodic'] as const) {
        for (const robust of [false, true]) {
          const y = new Float64Array(period * 5).fill(37.25);
          const r = stl(y, { period, seasonalWindow, robust });
          for (let t = 0; t < y.length; t++) {
            expect(Math.abs(r.trend[t] - 37.25)).toBeLessThanOrEqual(1e-9);
            expect(Math.abs(r.seasonal[t])).toBeLessThanOrEqual(1e-9);
          }
        }
      }
    }
  });

  it('a periodic seasonal is exactly periodic', () => {
    fc.assert(
      fc.property(caseArb, ({ period, cycles, robust, noise }) => {
        const y = makeSeries(period, period * cycles + 1, noise);
        const r = stl(y, { period, seasonalWindow: 'periodic', robust });
        for (let t = 0; t + period < y.length; t++) expect(r.seasonal[t + period]).toBe(r.seasonal[t]);
      }),
      { numRuns: 30 },
    );
  });

  it('missing values: trend and seasonal defined there, remainder NaN there, weight 0 (the paper, §3.5)', () => {
    fc.assert(
      fc.property(caseArb, fc.array(fc.nat(), { minLength: 1, maxLength: 3 }), (c, holes) => {
        const n = c.period * c.cycles;
        const y = makeSeries(c.period, n, c.noise);
        const missing = new Set(holes.map((h) => h % n));
        for (const k of missing) y[k] = Number.NaN;
        const r = stl(y, { period: c.period, seasonalWindow: c.seasonalWindow, robust: c.robust });
        for (let t = 0; t < n; t++) {
          expect(Number.isFinite(r.trend[t])).toBe(true);
          expect(Number.isFinite(r.seasonal[t])).toBe(true);
          expect(Number.isNaN(r.remainder[t])).toBe(missing.has(t));
          if (missing.has(t)) expect(r.weights[t]).toBe(0);
        }
      }),
      { numRuns: 30 },
    );
  });

  it('one missing value inside the series moves the trend by less than the noise amplitude', () => {
    // Tolerance: the noise is uniform in ±1. Dropping a point changes each loess fit by that point's share
    // of the fit times its departure from the fit, which is the noise (≤ 1) plus a small seasonal misfit;
    // the share is below 1, so the trend cannot move by much more than the noise itself. We allow 1.0
    // (2–4 % of these series' range); in 3000 trials the largest move seen was 0.64. The hole is kept one
    // cycle away from either end, where the trend is an extrapolation and can move by the full noise.
    fc.assert(
      fc.property(caseArb, fc.nat(), (c, hole) => {
        const n = c.period * c.cycles;
        const y = makeSeries(c.period, n, c.noise);
        const options = { period: c.period, seasonalWindow: c.seasonalWindow };
        const full = stl(y, options);
        const k = c.period + (hole % (n - 2 * c.period));
        const gap = Float64Array.from(y);
        gap[k] = Number.NaN;
        const partial = stl(gap, options);
        for (let t = 0; t < n; t++) expect(Math.abs(partial.trend[t] - full.trend[t])).toBeLessThanOrEqual(1.0);
      }),
      { numRuns: 60 },
    );
  });

  it('weights are all 1 when not robust, and lie in [0, 1] when robust', () => {
    const y = makeSeries(12, 72, [0.3, -0.8, 0.1, 0.9, -0.2]);
    y[30] += 40; // an outlier the robust fit should down-weight
    expect(Array.from(stl(y, { period: 12, seasonalWindow: 7 }).weights).every((w) => w === 1)).toBe(true);
    const robust = stl(y, { period: 12, seasonalWindow: 7, robust: true }).weights;
    expect(Array.from(robust).every((w) => w >= 0 && w <= 1)).toBe(true);
    expect(robust[30]).toBe(0);
  });
});

describe('select (quickselect)', () => {
  it('agrees with sorting: a[k] is the k-th smallest and everything before it is ≤ a[k]', () => {
    fc.assert(
      fc.property(
        // Small integers so that ties are frequent.
        fc.array(fc.integer({ min: -20, max: 20 }), { minLength: 1, maxLength: 300 }),
        fc.nat(),
        (values, k0) => {
          const a = Float64Array.from(values);
          const k = k0 % a.length;
          const sorted = Float64Array.from(values).sort();
          expect(select(a, k)).toBe(sorted[k]);
          expect(a[k]).toBe(sorted[k]);
          for (let i = 0; i < k; i++) expect(a[i]).toBeLessThanOrEqual(a[k]);
          for (let i = k + 1; i < a.length; i++) expect(a[i]).toBeGreaterThanOrEqual(a[k]);
          expect(Float64Array.from(a).sort()).toEqual(sorted);
        },
      ),
      { numRuns: 300 },
    );
  });
});
