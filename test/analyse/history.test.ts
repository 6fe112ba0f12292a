/**
 * seriesHistory on hand-checked examples: a yearly lag of 2 keeps the arithmetic small enough to check.
 */
import { describe, expect, it } from 'vitest';
import { PUBLISHED_MIN, seriesHistory } from '../../src/analyse/history.js';
import type { PastIssue } from '../../src/vocabulary/brief.js';

const dates = ['2026-01-01', '2026-02-01', '2026-03-01', '2026-04-01', '2026-05-01'];
const trend = [100, 110, 105, 121, 126];
const observed = [100, 110, 105, 121, 126];

function issue(period: string, trendYoYPercent: number, values: number[], n = 1): PastIssue {
  const k = dates.indexOf(period) + 1;
  return {
    period,
    issue: n,
    recordedAt: '',
    trendYoYPercent,
    trendYoYChange: Number.NaN,
    dates: dates.slice(0, k),
    values: values.slice(0, k),
  };
}

describe('seriesHistory', () => {
  it('is null without an earlier period', () => {
    expect(seriesHistory([issue('2026-05-01', 1, observed)], dates, observed, trend, 2)).toBeNull();
  });

  it("takes the latest earlier period's latest issue and today's figure for it", () => {
    const past = [
      issue('2026-03-01', 4, observed),
      issue('2026-04-01', 12, observed),
      issue('2026-04-01', 11, observed, 2),
    ];
    const h = seriesHistory(past, dates, observed, trend, 2);
    // April now: 100·(121 / 110 − 1) = 10 %.
    expect(h?.sinceLast?.period).toBe('2026-04-01');
    expect(h?.sinceLast?.published).toBe(11);
    expect(h?.sinceLast?.now).toBeCloseTo(10, 12);
    expect(h?.briefs).toBe(2);
    expect(h?.published).toBeNull();
  });

  it('lists values the source changed since the last brief, gaps included', () => {
    const then = [100, 111, Number.NaN, 121];
    const h = seriesHistory([issue('2026-04-01', 10, then)], dates, observed, trend, 2);
    expect(h?.sourceRevisions).toEqual([
      { date: '2026-02-01', before: 111, after: 110 },
      { date: '2026-03-01', before: Number.NaN, after: 105 },
    ]);
  });

  it('compares published first estimates with today once there are enough', () => {
    // Twelve monthly periods, trend rising 1 a month from 100: today's yoy at t (lag 2) is 100·2/(98 + t).
    const d = Array.from({ length: 12 }, (_, i) => `2026-${String(i + 1).padStart(2, '0')}-01`);
    const tr = d.map((_, i) => 100 + i);
    const past = d.slice(2, 2 + PUBLISHED_MIN).map((p, k) => ({
      period: p,
      issue: 1,
      recordedAt: '',
      trendYoYPercent: (100 * 2) / (100 + k) + 0.5,
      trendYoYChange: Number.NaN,
      dates: [],
      values: [],
    }));
    const h = seriesHistory(past, d, tr, tr, 2);
    // Each first estimate was 0.5 points above today's: revisions (today − first) all −0.5.
    expect(h?.published?.revisions.map((r) => r.revision)).toEqual(past.map(() => expect.closeTo(-0.5, 12)));
    expect(h?.published?.meanAbsoluteRevision).toBeCloseTo(0.5, 12);
    expect(h?.published?.range80[0]).toBeCloseTo(-0.5, 12);
    const fewer = seriesHistory(past.slice(1), d, tr, tr, 2);
    expect(fewer?.published).toBeNull();
  });
});
