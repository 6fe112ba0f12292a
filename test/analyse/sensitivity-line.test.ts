/**
 * The sensitivity search on the line three fits give (reversalValue's `affine`) against the step-by-step walk
 * with a fit per trial, on real decompositions: additive STL without robustness weights (linear in the data)
 * of the monthly and quarterly open datasets of the verifier's corpus (sources in
 * test/verify/corpus/corpus.json), as the brief searches them (48 steps out to twelve robust spreads of the
 * remainder from the value the pattern expects next). Stated tolerance: none, the same value to the last bit
 * (the line gives the fits' own decisions unless a trial's step lies within rounding of zero).
 * bench/refits.js prints the same comparison with its counts.
 */
import { describe, expect, it } from 'vitest';
import { trendDirection } from '../../src/analyse/direction.js';
import { type ReversalSearch, reversalValue } from '../../src/analyse/sensitivity.js';
import { stl } from '../../src/decompose/stl.js';
import { robustScale } from '../../src/diagnose/robust-scale.js';
import { DATASETS, readDataset } from '../verify/corpus.js';

const PERIOD: Record<string, number> = { monthly: 12, quarterly: 4 };

const sets = DATASETS.filter((d) => PERIOD[d.frequency] && d.n >= 4 * PERIOD[d.frequency])
  .map((d) => ({ id: d.id, period: PERIOD[d.frequency], y: Float64Array.from(readDataset(d).values) }))
  .filter((d) => d.y.every(Number.isFinite));

function search(y: Float64Array, period: number, seasonalWindow: number | 'periodic', options: ReversalSearch) {
  const n = y.length;
  const full = stl(y, { period, seasonalWindow });
  const { direction } = trendDirection(full.trend, n - 1);
  const spread = robustScale(Array.from(y, (v, i) => v - full.trend[i] - full.seasonal[i])).mad;
  const expected = full.trend[n - 1] + full.seasonal[n - period];
  const extended = new Float64Array(n + 1);
  extended.set(y);
  let fits = 0;
  const lastStep = (x: number) => {
    fits++;
    extended[n] = x;
    const t = stl(extended, { period, seasonalWindow }).trend;
    return t[n] - t[n - 1];
  };
  const result = reversalValue(direction, expected, 12 * spread, false, lastStep, { steps: 48, ...options });
  return { result, fits };
}

describe('the sensitivity search on the line of three fits, on the corpus', () => {
  it("gives the walk's value to the last bit with three fits", () => {
    expect(sets.length).toBeGreaterThanOrEqual(10);
    let crossings = 0;
    for (const d of sets) {
      for (const window of [13, 'periodic'] as const) {
        const walk = search(d.y, d.period, window, {});
        const line = search(d.y, d.period, window, { singleCrossing: true, affine: true });
        expect({ id: d.id, window, ...line.result }).toEqual({ id: d.id, window, ...walk.result });
        expect(line.fits).toBe(3);
        if (walk.result.side !== 'none') crossings++;
      }
    }
    expect(crossings).toBeGreaterThan(10); // most searches find a boundary, so the bisection is compared too
  });
});
