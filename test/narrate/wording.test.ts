/**
 * Words that judge or qualify a movement: the direction the job calls good, and "broadly unchanged" when
 * the trend's year-over-year change lies within the band first estimates usually move by (the larger end
 * of the firmness study's 80% range, statements.ts). The series is the water-deliveries example with its
 * figures replaced by hand-chosen ones, so each case is known in advance.
 */
import { describe, expect, test } from 'vitest';
import type { GoodDirection, SeriesBrief } from '../../src/brief/model.js';
import { narrateSeries } from '../../src/narrate/statements.js';
import { comparisonLabel, judgement, periodNoun } from '../../src/narrate/wording.js';
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

  /** The example with a chosen trend change, revision range and good direction. */
  function headline(percent: number, range: [number, number], good: GoodDirection): string {
    const s: SeriesBrief = structuredClone(water as SeriesBrief);
    s.goodDirection = good;
    s.analysis.trendYoY = { ...s.analysis.trendYoY, percent, change: percent * 60, yearAgo: 6000 };
    s.analysis.firmness.range80 = range;
    const h = narrateSeries(s, 'en-GB').find((x) => x.kind === 'headline');
    if (!h) throw new Error('no headline');
    return h.text;
  }

  test('up is good and the trend rose: the direction you want', () => {
    const text = headline(3, [-0.3, 0.6], 'up');
    expect(text).toContain('is up 3.0% on a year ago');
    expect(text).toContain(WANT);
  });

  test('down is good and the trend rose: not the direction you want', () => {
    expect(headline(3, [-0.3, 0.6], 'down')).toContain(NOT_WANT);
  });

  test('down is good and the trend fell: the direction you want', () => {
    const text = headline(-2.5, [-0.3, 0.6], 'down');
    expect(text).toContain('is down 2.5% on a year ago');
    expect(text).toContain(WANT);
  });

  test('neither direction is good: no judgement', () => {
    const text = headline(3, [-0.3, 0.6], 'neither');
    expect(text).not.toContain('direction you want');
  });

  test('a change inside the revision band is "broadly unchanged", with no judgement', () => {
    // band = max(|−0.3|, |0.6|) = 0.6; |0.5| ≤ 0.6
    const text = headline(0.5, [-0.3, 0.6], 'up');
    expect(text).toContain('broadly unchanged');
    expect(text).toContain('+0.5%');
    expect(text).toContain('up to 0.6 points');
    expect(text).not.toContain('direction you want');
    // the band is symmetric: −0.5 is inside it too
    expect(headline(-0.5, [-0.3, 0.6], 'down')).toContain('broadly unchanged');
  });

  test('a change outside the band is reported as a rise or fall', () => {
    // |0.7| > 0.6
    const text = headline(0.7, [-0.3, 0.6], 'up');
    expect(text).not.toContain('broadly unchanged');
    expect(text).toContain('is up 0.7%');
  });

  test('without a revision range, no change is called unchanged', () => {
    expect(headline(0.1, [Number.NaN, Number.NaN], 'up')).not.toContain('broadly unchanged');
  });

  test('the example itself: −0.1% inside its own band of 0.6 points', () => {
    // water-deliveries, September 2026: trend change −0.13%, revision range about −0.3 to 0.6 points
    const h = water.statements.find((x) => x.kind === 'headline');
    expect(Math.abs(water.analysis.trendYoY.percent)).toBeLessThan(
      Math.max(...water.analysis.firmness.range80.map(Math.abs)),
    );
    expect(h?.text).toContain('broadly unchanged');
  });
});

describe('labels', () => {
  test('comparison labels and period nouns', () => {
    expect(comparisonLabel({ kind: 'same-period-last-year', label: null }, 'quarterly')).toBe('Same quarter last year');
    expect(comparisonLabel({ kind: 'rolling-12', label: null }, 'monthly')).toBe('Last 12 months');
    expect(comparisonLabel({ kind: 'rolling-12', label: null }, 'quarterly')).toBe('Last 4 quarters');
    // 52 weeks: the daily rolling year is 364 days (calendar.yearLag)
    expect(comparisonLabel({ kind: 'rolling-12', label: null }, 'daily')).toBe('Last 52 weeks');
    expect(
      comparisonLabel({ kind: 'custom', label: 'Winter', current: ['a', 'b'], baseline: ['c', 'd'] }, 'daily'),
    ).toBe('Winter');
    expect(periodNoun('weekly')).toBe('week');
  });
});
