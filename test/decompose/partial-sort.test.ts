import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { partialSort } from '../../src/decompose/partial-sort.js';

// Singleton (1969), Algorithm 347, as extended to partial sorting in the Fortran STL ships with (psort).
describe('partialSort — Singleton (1969)', () => {
  it('with ascending positions, leaves the true order statistics at those positions', () => {
    fc.assert(
      fc.property(
        fc.array(fc.integer({ min: -30, max: 30 }), { minLength: 2, maxLength: 300 }),
        fc.nat(),
        fc.nat(),
        (values, p, q) => {
          const n = values.length;
          const positions = [...new Set([(p % n) + 1, (q % n) + 1])].sort((x, y) => x - y);
          const a = Float64Array.from(values);
          partialSort(a, positions);
          const sorted = Float64Array.from(values).sort();
          for (const k of positions) expect(a[k - 1]).toBe(sorted[k - 1]);
        },
      ),
      { numRuns: 300 },
    );
  });

  it('always only rearranges its input (any position order, ties included)', () => {
    fc.assert(
      fc.property(fc.array(fc.integer({ min: -5, max: 5 }), { minLength: 2, maxLength: 300 }), (values) => {
        const n = values.length;
        const mid = (n >> 1) + 1;
        const a = Float64Array.from(values);
        partialSort(a, [mid, n - mid + 1]); // the descending pair STL's robustness step asks for
        expect(Float64Array.from(a).sort()).toEqual(Float64Array.from(values).sort());
      }),
      { numRuns: 300 },
    );
  });
});
