/**
 * revisionStudy on a fake decomposition whose revisions can be worked by hand, and quantile type 7
 * (Hyndman & Fan 1996, "Sample quantiles in statistical packages", The American Statistician 50(4),
 * definition 7, R's default): with sorted x₁…xₙ and h = (n − 1)·p, Q(p) = x₍⌊h⌋₊₁₎ + (h − ⌊h⌋)·(x₍⌊h⌋₊₂₎ − x₍⌊h⌋₊₁₎).
 */
import { describe, expect, test } from 'vitest';
import { quantile, type RevisionStudyInput, revisionStudy } from '../../src/analyse/revisions.js';

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
  // The fake fit returns the data as its trend, except that its last value overshoots by 10: the end
  // estimate of a trend that later data pull back. The settled trend is the data themselves.
  const trendOf = (prefix: Float64Array): Float64Array => {
    const t = Float64Array.from(prefix);
    t[t.length - 1] += 10;
    return t;
  };
  const values = Float64Array.from([100, 100, 100, 110, 120, 130, 140]);
  const dates = ['d0', 'd1', 'd2', 'd3', 'd4', 'd5', 'd6'];
  const study = (over: Partial<RevisionStudyInput> = {}) =>
    revisionStudy({
      values,
      settledTrend: values,
      settledBefore: 6,
      lag: 2,
      periods: 3,
      minLength: 1,
      dates,
      trendOf,
      ...over,
    });

  test('three cuts before the provisional zone, lag 2, revisions (later minus earlier) by hand', () => {
    const s = study();
    // cut 3: first 100·(120/100 − 1) = 20, settled 100·(110/100 − 1) = 10, revision 10 − 20 = −10
    // cut 4: first 100·(130/100 − 1) = 30, settled 100·(120/100 − 1) = 20, revision −10
    // cut 5: first 100·(140/110 − 1) = 27.27…, settled 100·(130/110 − 1) = 18.18…, revision −1000/110 = −9.0909…
    expect(s.revisions.map((r) => r.index)).toEqual([3, 4, 5]);
    expect(s.revisions.map((r) => r.date)).toEqual(['d3', 'd4', 'd5']);
    expect(s.revisions[0].first).toBeCloseTo(20, 10);
    expect(s.revisions[0].latest).toBeCloseTo(10, 10);
    expect(s.revisions[2].first).toBeCloseTo(300 / 11, 10);
    expect(s.revisions[2].latest).toBeCloseTo(200 / 11, 10);
    expect(s.revisions.map((r) => r.revision)).toEqual([-10, -10, -100 / 11].map((v) => expect.closeTo(v, 10)));
    // mean |revision| = (10 + 10 + 9.0909)/3 = 9.6970
    expect(s.meanAbsoluteRevision).toBeCloseTo((20 + 100 / 11) / 3, 10);
    // sorted −10, −10, −9.0909: Q(.1): h = 0.2 → −10 + 0.2·0 = −10; Q(.9): h = 1.8 → −10 + 0.8·0.9091 = −9.2727
    expect(s.range80[0]).toBeCloseTo(-10, 10);
    expect(s.range80[1]).toBeCloseTo(-10 + 0.8 * (10 - 100 / 11), 10);
    // The range holds two of the three (−9.09 lies above −9.27): not "eight in ten".
    expect(s.withinRange80).toBe(2);
    expect(s.limit).toBe('none');
  });

  test('no cut lies in the provisional zone, whose estimates are not settled', () => {
    // Found: every cut of the daily example lay inside its provisional zone, comparing first estimates with
    // other provisional ones. With the last three values provisional (settledBefore 4), cuts stop at 3.
    const s = study({ settledBefore: 4, periods: 10 });
    expect(s.revisions.map((r) => r.index)).toEqual([2, 3]); // from the lag up to settledBefore − 1
  });

  test('the reporting period itself is never a cut, even with no provisional zone', () => {
    expect(study({ settledBefore: 7, periods: 10 }).revisions.map((r) => r.index)).toEqual([2, 3, 4, 5]);
    expect(study({ settledBefore: 99 }).revisions.map((r) => r.index)).toEqual([3, 4, 5]);
  });

  test('cuts shorter than the minimum length, or that fail to fit, are skipped', () => {
    expect(study({ minLength: 6 }).revisions.map((r) => r.index)).toEqual([5]);
    const picky = (prefix: Float64Array) => {
      if (prefix.length === 5) throw new Error('too short for this fake');
      return trendOf(prefix);
    };
    expect(study({ trendOf: picky }).revisions.map((r) => r.index)).toEqual([3, 5]);
    const withNaN = (prefix: Float64Array) => {
      const t = trendOf(prefix);
      if (prefix.length === 4) t[3] = Number.NaN;
      return t;
    };
    expect(study({ trendOf: withNaN }).revisions.map((r) => r.index)).toEqual([4, 5]);
  });

  test('a fit that needs no revision gives zero revisions', () => {
    const s = study({ trendOf: (p) => Float64Array.from(p) });
    expect(s.revisions.map((r) => r.revision)).toEqual([0, 0, 0]);
    expect(s.meanAbsoluteRevision).toBe(0);
    expect(s.withinRange80).toBe(3);
  });

  test('too short: no cut leaves a settled estimate; undefined summaries and the length needed', () => {
    // The first cut possible is the lag (2); with the last five values provisional (settledBefore 2) it
    // would need 2 + 1 + 5 = 8 periods; there are 7.
    const s = study({ settledBefore: 2 });
    expect(s.revisions).toEqual([]);
    expect(s.limit).toBe('too-short');
    expect(s.neededLength).toBe(8);
    expect(s.meanAbsoluteRevision).toBeNaN();
    expect(s.range80[0]).toBeNaN();
    expect(s.range80[1]).toBeNaN();
    expect(study({ periods: 0 }).limit).toBe('too-short');
  });

  test('a fit with no trend at its end (a centred moving average) says so', () => {
    const s = study({ trendOf: (p) => Float64Array.from(p, (v, i) => (i === p.length - 1 ? Number.NaN : v)) });
    expect(s.revisions).toEqual([]);
    expect(s.limit).toBe('no-end-estimate');
  });
});
