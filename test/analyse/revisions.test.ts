/**
 * revisionStudy on a fake decomposition whose revisions can be worked by hand, and quantile type 7
 * (Hyndman & Fan 1996, "Sample quantiles in statistical packages", The American Statistician 50(4),
 * definition 7, R's default): with sorted x₁…xₙ and h = (n − 1)·p, Q(p) = x₍⌊h⌋₊₁₎ + (h − ⌊h⌋)·(x₍⌊h⌋₊₂₎ − x₍⌊h⌋₊₁₎).
 */
import { describe, expect, test } from 'vitest';
import { quantile, revisionStudy } from '../../src/analyse/revisions.js';

describe('quantile, type 7', () => {
  test('R: quantile(1:10, c(.1, .9)) is 1.9 and 9.1', () => {
    const x = [1, 2, 3, 4, 5, 6, 7, 8, 9, 10];
    expect(quantile(x, 0.1)).toBeCloseTo(1.9, 12); // h = 9·0.1 = 0.9 → 1 + 0.9·(2 − 1)
    expect(quantile(x, 0.9)).toBeCloseTo(9.1, 12); // h = 9·0.9 = 8.1 → 9 + 0.1·(10 − 9)
  });

  test('R: quantile(c(3, -1, 4, 1.5), c(.1, .9)) is -0.25 and 3.7 (unsorted input)', () => {
    const x = [3, -1, 4, 1.5]; // sorted −1, 1.5, 3, 4
    expect(quantile(x, 0.1)).toBeCloseTo(-0.25, 12); // h = 3·0.1 = 0.3 → −1 + 0.3·(1.5 − (−1)) = −0.25
    expect(quantile(x, 0.9)).toBeCloseTo(3.7, 12); // h = 3·0.9 = 2.7 → 3 + 0.7·(4 − 3) = 3.7
    expect(x).toEqual([3, -1, 4, 1.5]); // the input is not reordered
  });

  test('R: quantile(c(2, 8), c(.1, .5, .9)) is 2.6, 5, 7.4', () => {
    // h = 1·p: 2 + 0.1·6 = 2.6; 2 + 0.5·6 = 5; 2 + 0.9·6 = 7.4
    expect([0.1, 0.5, 0.9].map((p) => quantile([8, 2], p))).toEqual([2.6, 5, 7.4].map((v) => expect.closeTo(v, 12)));
  });

  test('ends and degenerate samples', () => {
    expect(quantile([4, 1, 9], 0)).toBe(1);
    expect(quantile([4, 1, 9], 1)).toBe(9);
    expect(quantile([5], 0.1)).toBe(5);
    expect(quantile([], 0.5)).toBeNaN();
  });
});

describe('revisionStudy with a fake trend', () => {
  // The fake decomposition returns the data as its trend, except that its last value overshoots by 10:
  // the end estimate of a trend that later data pull back.
  const trendOf = (prefix: Float64Array): Float64Array => {
    const t = Float64Array.from(prefix);
    t[t.length - 1] += 10;
    return t;
  };
  const values = Float64Array.from([100, 100, 100, 110, 120, 130, 140]);
  const dates = ['d0', 'd1', 'd2', 'd3', 'd4', 'd5', 'd6'];

  test('three cuts before index 6, lag 2, revisions by hand', () => {
    const s = revisionStudy(values, values, 6, 2, 3, 1, dates, trendOf);
    // cut 3: first 100·(120/100 − 1) = 20, latest 100·(110/100 − 1) = 10, revision 10
    // cut 4: first 100·(130/100 − 1) = 30, latest 100·(120/100 − 1) = 20, revision 10
    // cut 5: first 100·(140/110 − 1) = 27.27…, latest 100·(130/110 − 1) = 18.18…, revision 1000/110 = 9.0909…
    expect(s.revisions.map((r) => r.index)).toEqual([3, 4, 5]);
    expect(s.revisions.map((r) => r.date)).toEqual(['d3', 'd4', 'd5']);
    expect(s.revisions[0].first).toBeCloseTo(20, 10);
    expect(s.revisions[0].latest).toBeCloseTo(10, 10);
    expect(s.revisions[2].first).toBeCloseTo(300 / 11, 10);
    expect(s.revisions[2].latest).toBeCloseTo(200 / 11, 10);
    expect(s.revisions.map((r) => r.revision)).toEqual([10, 10, 100 / 11].map((v) => expect.closeTo(v, 10)));
    // mean |revision| = (10 + 10 + 9.0909)/3 = 9.6970
    expect(s.meanAbsoluteRevision).toBeCloseTo((20 + 100 / 11) / 3, 10);
    // sorted 9.0909, 10, 10: Q(.1): h = 0.2 → 9.0909 + 0.2·0.9091 = 9.2727; Q(.9): h = 1.8 → 10 + 0.8·0 = 10
    expect(s.range80[0]).toBeCloseTo(100 / 11 + 0.2 * (10 - 100 / 11), 10);
    expect(s.range80[1]).toBeCloseTo(10, 10);
  });

  test('the reporting period itself is not a cut (its first estimate is the latest)', () => {
    const s = revisionStudy(values, values, 6, 2, 10, 1, dates, trendOf);
    expect(s.revisions.map((r) => r.index)).toEqual([2, 3, 4, 5]); // from the lag, not index − 10
  });

  test('cuts shorter than the minimum length, or that fail to decompose, are skipped', () => {
    expect(revisionStudy(values, values, 6, 2, 3, 6, dates, trendOf).revisions.map((r) => r.index)).toEqual([5]);
    const picky = (prefix: Float64Array) => {
      if (prefix.length === 5) throw new Error('too short for this fake');
      return trendOf(prefix);
    };
    expect(revisionStudy(values, values, 6, 2, 3, 1, dates, picky).revisions.map((r) => r.index)).toEqual([3, 5]);
    const withNaN = (prefix: Float64Array) => {
      const t = trendOf(prefix);
      if (prefix.length === 4) t[3] = Number.NaN;
      return t;
    };
    expect(revisionStudy(values, values, 6, 2, 3, 1, dates, withNaN).revisions.map((r) => r.index)).toEqual([4, 5]);
  });

  test('a decomposition that needs no revision gives zero revisions', () => {
    const s = revisionStudy(values, values, 6, 2, 3, 1, dates, (p) => Float64Array.from(p));
    expect(s.revisions.map((r) => r.revision)).toEqual([0, 0, 0]);
    expect(s.meanAbsoluteRevision).toBe(0);
  });

  test('no cut at all: undefined summaries, not zeros', () => {
    const s = revisionStudy(values, values, 6, 2, 0, 1, dates, trendOf);
    expect(s.revisions).toEqual([]);
    expect(s.meanAbsoluteRevision).toBeNaN();
    expect(s.range80[0]).toBeNaN();
    expect(s.range80[1]).toBeNaN();
  });
});
