/**
 * Words that judge or qualify a movement: the direction the job calls good, and "broadly unchanged" when
 * the materiality rule (analyse/materiality.ts) finds zero inside the change plus the range of past
 * revisions. The series is the water-deliveries example with its
 * figures replaced by hand-chosen ones, so each case is known in advance.
 */
import { describe, expect, test } from 'vitest';
import { directionOf } from '../../src/analyse/materiality.js';
import { narrateSeries } from '../../src/narrate/statements.js';
import { comparisonLabel, judgement, periodNoun } from '../../src/narrate/wording.js';
import type { SeriesBrief } from '../../src/vocabulary/brief.js';
import type { Materiality } from '../../src/vocabulary/claims.js';
import type { GoodDirection } from '../../src/vocabulary/settings.js';
import { exampleBriefs } from './examples.js';

const WANT = 'That is the direction you want.';
const NOT_WANT = 'That is not the direction you want.';

describe('judgement', () => {
  test('good direction against the movement', () => {
    expect(judgement('rising', 'up')).toBe('better');
    expect(judgement('falling', 'up')).toBe('worse');
    expect(judgement('rising', 'down')).toBe('worse');
    expect(judgement('falling', 'down')).toBe('better');
    expect(judgement('rising', 'neither')).toBeNull();
    expect(judgement('flat', 'up')).toBeNull();
  });
});

describe('the headline', async () => {
  const water = (await exampleBriefs()).find((b) => b.example === 'water-deliveries')?.brief.series[0];
  if (!water) throw new Error('water-deliveries example missing');

  /** The example with a chosen trend change, revision range (later minus earlier) and good direction. */
  function headline(percent: number, range: [number, number], good: GoodDirection): string {
    const s: SeriesBrief = structuredClone(water as SeriesBrief);
    s.goodDirection = good;
    s.analysis.trendYoY = { ...s.analysis.trendYoY, percent, change: percent * 60, yearAgo: 6000 };
    const materiality: Materiality = Number.isFinite(range[0])
      ? { rule: 'revision-range', low: range[0], high: range[1] }
      : { rule: 'noise', low: -0.05, high: 0.05 };
    s.analysis.trendYearly = {
      ...s.analysis.trendYearly,
      value: percent,
      materiality,
      direction: directionOf(percent, materiality),
    };
    const h = narrateSeries(s, 'en-GB').find((x) => x.kind === 'headline');
    if (!h) throw new Error('no headline');
    return h.text;
  }

  test('up is good and the trend rose: the direction you want', () => {
    const text = headline(3, [-0.3, 0.6], 'up');
    expect(text).toContain('the trend is up 3.0% on a year ago (180 ML higher)');
    expect(text).toContain(WANT);
  });

  test('down is good and the trend rose: not the direction you want', () => {
    expect(headline(3, [-0.3, 0.6], 'down')).toContain(NOT_WANT);
  });

  test('down is good and the trend fell: the direction you want', () => {
    const text = headline(-2.5, [-0.3, 0.6], 'down');
    expect(text).toContain('the trend is down 2.5% on a year ago (150 ML lower)');
    expect(text).toContain(WANT);
  });

  test('neither direction is good: no judgement', () => {
    const text = headline(3, [-0.3, 0.6], 'neither');
    expect(text).not.toContain('direction you want');
  });

  test('zero inside change + revision range is "broadly unchanged", with no judgement and no signed number', () => {
    // 0.2 + [−0.3, 0.6] = [−0.1, 0.8] holds 0
    const text = headline(0.2, [-0.3, 0.6], 'up');
    expect(text).toContain('broadly unchanged on a year ago (0.2% higher)');
    expect(text).not.toMatch(/[+−-]\d/);
    expect(text).not.toContain('direction you want');
    // the range is used as it is, one-sided or not: −0.5 + [−0.3, 0.6] = [−0.8, 0.1] holds 0 too …
    expect(headline(-0.5, [-0.3, 0.6], 'down')).toContain('broadly unchanged');
    // … but 0.5 + [−0.3, 0.6]... no: 0.4 + [0.1, 0.6] = [0.5, 1.0] does not
    expect(headline(0.4, [0.1, 0.6], 'up')).toContain('the trend is up 0.4%');
  });

  test('zero outside the range: a rise or fall', () => {
    // −0.7 + [−0.3, 0.6] = [−1.0, −0.1]
    const text = headline(-0.7, [-0.3, 0.6], 'up');
    expect(text).not.toContain('broadly unchanged');
    expect(text).toContain('the trend is down 0.7%');
  });

  test('without a revision range, the noise of one period decides', () => {
    expect(headline(0.04, [Number.NaN, Number.NaN], 'up')).toContain('within the usual noise of one month');
    expect(headline(0.1, [Number.NaN, Number.NaN], 'up')).not.toContain('broadly unchanged');
  });

  test('the example itself is up, as its generating trend is, and its tile says the same', () => {
    // examples/generate.mjs draws the North zone as level 4200 + 22t − 0.06t² (t = 0 in January 2015) plus a
    // season and noise of 70 ML. Its slope 22 − 0.12t stays positive to t = 183, so the level rose at each of
    // the 140 steps to September 2026 (t = 140): 6104.0 against 6033.0 a year earlier (t = 128), 71.0 ML or
    // 1.18% higher. The brief, its series extended by forecasts (monthly data), finds the trend up and
    // rising at every step; without the extension it read the last year as 0.1% lower, broadly unchanged.
    const h = water.statements.find((x) => x.kind === 'headline');
    expect(water.extension.used).toBe(true);
    expect(h?.text).toContain('the trend is up');
    expect(water.analysis.trendYearly.direction).toBe('rising');
    expect(water.analysis.trendYoY.percent).toBeGreaterThan(0);
    expect(water.analysis.trendYoY.percent).toBeLessThan(1.18 + 0.5);
    expect(water.analysis.trendYearly.run).toBe(140);
  });
});

describe('labels', () => {
  test('comparison labels and period nouns', () => {
    expect(comparisonLabel({ kind: 'year-on-year', label: null }, 'quarterly')).toBe('Same quarter last year');
    expect(comparisonLabel({ kind: 'latest-year', label: null }, 'monthly')).toBe('Last 12 months');
    expect(comparisonLabel({ kind: 'latest-year', label: null }, 'quarterly')).toBe('Last 4 quarters');
    // 52 weeks: the daily rolling year is 364 days (calendar.yearLag)
    expect(comparisonLabel({ kind: 'latest-year', label: null }, 'daily')).toBe('Last 52 weeks');
    expect(
      comparisonLabel({ kind: 'custom', label: 'Winter', current: ['a', 'b'], baseline: ['c', 'd'] }, 'daily'),
    ).toBe('Winter');
    expect(periodNoun('weekly')).toBe('week');
  });
});
