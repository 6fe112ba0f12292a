import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { defaultIcRatio, hendersonSmooth, hendersonWeights, musgraveWeights } from '../../src/decompose/henderson.js';

/**
 * Symmetric Henderson weights as printed to 3 decimals in tables such as the Australian Bureau of
 * Statistics' "A Guide to Interpreting Time Series — Monitoring Trends" (2003). The printed table itself
 * could not be found with the search tool, so these values are given FROM MEMORY. Half of each filter, from
 * the outermost lag to the centre.
 */
const PRINTED: Record<number, number[]> = {
  5: [-0.073, 0.294, 0.559],
  7: [-0.059, 0.059, 0.294, 0.412],
  9: [-0.041, -0.01, 0.119, 0.267, 0.33],
  13: [-0.019, -0.028, 0.0, 0.066, 0.147, 0.214, 0.24],
  23: [-0.004, -0.011, -0.016, -0.015, -0.005, 0.013, 0.039, 0.068, 0.097, 0.122, 0.138, 0.144],
};

/**
 * Exact rational forms of the shorter filters (from memory; each numerator set sums to its denominator,
 * which is a check on the memory): 5-term /286, 7-term /715, 9-term /2431, 13-term /16796.
 */
const EXACT: Record<number, [number[], number]> = {
  5: [[-21, 84, 160], 286],
  7: [[-42, 42, 210, 295], 715],
  9: [[-99, -24, 288, 648, 805], 2431],
  13: [[-325, -468, 0, 1100, 2475, 3600, 4032], 16796],
};

const mirror = (half: number[]): number[] => [...half, ...half.slice(0, -1).reverse()];

describe('hendersonWeights — Henderson (1916), closed form as in ABS (2003)', () => {
  for (const [length, half] of Object.entries(PRINTED)) {
    it(`${length}-term weights match the printed 3-decimal table (ABS 2003, values from memory)`, () => {
      const w = Array.from(hendersonWeights(Number(length)));
      const printed = mirror(half);
      expect(w).toHaveLength(printed.length);
      // Printed tables round to 3 decimals (±0.0005) and nudge one weight by a unit in the last place so
      // that the printed weights sum to 1 (the 7-term centre is printed 0.412 although it is 0.41259):
      // hence 0.0015.
      for (let i = 0; i < w.length; i++) expect(Math.abs(w[i] - printed[i])).toBeLessThanOrEqual(0.0015);
    });
  }

  for (const [length, [numerators, denominator]] of Object.entries(EXACT)) {
    it(`${length}-term weights equal the exact fractions over ${denominator} (from memory)`, () => {
      const w = hendersonWeights(Number(length));
      const exact = mirror(numerators).map((k) => k / denominator);
      for (let i = 0; i < w.length; i++) expect(Math.abs(w[i] - exact[i])).toBeLessThanOrEqual(1e-15);
    });
  }

  it('symmetric weights sum to 1 for every odd length 3…41 (Henderson 1916)', () => {
    for (let length = 3; length <= 41; length += 2) {
      const w = hendersonWeights(length);
      let sum = 0;
      for (const v of w) sum += v;
      expect(Math.abs(sum - 1)).toBeLessThanOrEqual(1e-12);
      for (let i = 0; i < length; i++) expect(w[i]).toBe(w[length - 1 - i]);
    }
  });

  it('the symmetric filter reproduces any cubic exactly (property; Henderson 1916)', () => {
    fc.assert(
      fc.property(
        fc.constantFrom(5, 7, 9, 13, 23),
        fc.array(fc.double({ min: -5, max: 5, noNaN: true }), { minLength: 4, maxLength: 4 }),
        (length, [a, b, c, d]) => {
          const n = length + 10;
          const x = (t: number): number => (t - n / 2) / n;
          const y = Float64Array.from({ length: n }, (_, t) => a + b * x(t) + c * x(t) ** 2 + d * x(t) ** 3);
          const out = hendersonSmooth(y, length);
          const m = (length - 1) / 2;
          const scale = Math.abs(a) + Math.abs(b) + Math.abs(c) + Math.abs(d) + 1;
          for (let t = m; t < n - m; t++) expect(Math.abs(out[t] - y[t])).toBeLessThanOrEqual(1e-12 * scale);
        },
      ),
      { numRuns: 100 },
    );
  });

  it('rejects even or too short lengths', () => {
    expect(() => hendersonWeights(4)).toThrow(RangeError);
    expect(() => hendersonWeights(1)).toThrow(RangeError);
  });
});

describe('musgraveWeights — Musgrave (1964), as in Doherty (2001)', () => {
  it('end weights sum to 1 for every q and every length, and q = m returns the symmetric weights', () => {
    for (const length of [5, 7, 9, 13, 23]) {
      const w = hendersonWeights(length);
      const m = (length - 1) / 2;
      for (let q = 0; q <= m; q++) {
        const u = musgraveWeights(w, q, defaultIcRatio(length));
        expect(u).toHaveLength(m + q + 1);
        let sum = 0;
        for (const v of u) sum += v;
        expect(Math.abs(sum - 1)).toBeLessThanOrEqual(1e-12);
      }
      const full = musgraveWeights(w, m, defaultIcRatio(length));
      for (let i = 0; i < length; i++) expect(Math.abs(full[i] - w[i])).toBeLessThanOrEqual(1e-15);
    }
  });

  it('7-term end weights with I/C 4.5 match a published table to 3 decimals', () => {
    // Source: the 7-term Henderson end weights tabulated in a public GAUSS program (henderson7.txt, a
    // geocities mirror), which gives the symmetric half 0.412, 0.294, 0.059, −0.059 and, for the last,
    // second-last and third-last points, the weights below (lags −m…q). They are reproduced by I/C = 4.5,
    // the ratio X-11 uses for this length (Doherty 2001; from memory). Tolerance as for the symmetric table.
    const w = hendersonWeights(7);
    const published = [
      [-0.034, 0.116, 0.383, 0.535],
      [-0.054, 0.061, 0.294, 0.41, 0.289],
      [-0.053, 0.058, 0.287, 0.399, 0.275, 0.034],
    ];
    expect(defaultIcRatio(7)).toBe(4.5);
    published.forEach((row, q) => {
      const u = Array.from(musgraveWeights(w, q, 4.5));
      expect(u).toHaveLength(row.length);
      for (let i = 0; i < row.length; i++) expect(Math.abs(u[i] - row[i])).toBeLessThanOrEqual(0.0015);
    });
  });

  it('with a tiny I/C ratio (a line with almost no noise) the end weights reproduce a straight line', () => {
    // D = 4/(π·R²) → ∞ makes the weights the least-squares line through the available points (Doherty 2001).
    for (const length of [5, 7, 9, 13, 23]) {
      const w = hendersonWeights(length);
      const m = (length - 1) / 2;
      for (let q = 0; q < m; q++) {
        const u = musgraveWeights(w, q, 1e-3);
        // Value at lag 0 of the line 3 + 2·lag from lags −m…q: must be 3.
        let s = 0;
        for (let i = -m; i <= q; i++) s += u[i + m] * (3 + 2 * i);
        expect(Math.abs(s - 3)).toBeLessThanOrEqual(1e-6);
      }
    }
  });

  it('rejects q outside 0…m', () => {
    expect(() => musgraveWeights(hendersonWeights(5), 3, 1)).toThrow(RangeError);
  });
});

describe('hendersonSmooth', () => {
  it('has a value at every point, including the first and the last', () => {
    const y = Float64Array.from({ length: 40 }, (_, t) => 100 + t + 5 * Math.sin(t / 3));
    for (const length of [5, 7, 9, 13, 23]) {
      const out = hendersonSmooth(y, length);
      expect(out).toHaveLength(40);
      for (const v of out) expect(Number.isFinite(v)).toBe(true);
    }
  });

  it('at the last point uses the q = 0 Musgrave weights (hand check, 5-term)', () => {
    const y = Float64Array.of(1, 4, 2, 8, 5, 7, 3);
    const u = musgraveWeights(hendersonWeights(5), 0, defaultIcRatio(5));
    // Last point: u₋₂·y[4] + u₋₁·y[5] + u₀·y[6].
    const expected = u[0] * 5 + u[1] * 7 + u[2] * 3;
    expect(hendersonSmooth(y, 5)[6]).toBeCloseTo(expected, 14);
    // First point: the mirror image, u₀·y[0] + u₋₁·y[1] + u₋₂·y[2].
    expect(hendersonSmooth(y, 5)[0]).toBeCloseTo(u[2] * 1 + u[1] * 4 + u[0] * 2, 14);
  });

  it('a NaN in a window gives NaN there', () => {
    const y = Float64Array.from({ length: 20 }, (_, t) => t);
    y[10] = Number.NaN;
    const out = hendersonSmooth(y, 5);
    for (let t = 0; t < 20; t++) expect(Number.isNaN(out[t])).toBe(t >= 8 && t <= 12);
  });

  it('needs at least as many values as the filter has terms', () => {
    expect(() => hendersonSmooth(new Float64Array(4), 5)).toThrow(RangeError);
  });
});
