/**
 * seasonalProfile on hand-built decompositions of one quarterly cycle. The split of a movement into a
 * seasonal part and an adjusted part is common practice (seasonal change = raw change − change of the
 * seasonally adjusted series; Hyndman & Athanasopoulos, FPP 3rd ed., §3.2–3.4 for the components).
 */
import { describe, expect, test } from 'vitest';
import { seasonalProfile } from '../../src/analyse/seasonal-profile.js';

const quarter = (i: number) => ({ order: i % 4, label: `Q${(i % 4) + 1}` });
const common = { naming: 'quarter' as const };

describe('seasonalProfile, additive', () => {
  // Trend 100, 102, 104, 106; seasonal −10, 0, 10, 0; observed = trend + seasonal; adjusted = trend.
  const trend = [100, 102, 104, 106];
  const seasonal = [-10, 0, 10, 0];
  const observed = [90, 102, 114, 106];
  const p = seasonalProfile({
    seasonal,
    observed,
    adjusted: trend,
    index: 3,
    period: 4,
    multiplicative: false,
    ...common,
    seasonAt: quarter,
  });

  test('effects in units and as a percent of the mean level of the cycle', () => {
    expect(p.seasons.map((s) => s.effect)).toEqual([-10, 0, 10, 0]);
    // mean observed (90 + 102 + 114 + 106)/4 = 103: 100·(−10/103) = −9.7087…; 0; 100·(10/103) = 9.7087…; 0
    expect(p.seasons[0].effectPercent).toBeCloseTo(-9.708737864, 8);
    expect(p.seasons[2].effectPercent).toBeCloseTo(9.708737864, 8);
    expect(p.level).toBe(103);
    expect(p.cycles).toEqual({ from: 0, to: 3 });
    expect(p.seasons.map((s) => s.label)).toEqual(['Q1', 'Q2', 'Q3', 'Q4']);
  });

  test('peak Q3, trough Q1', () => {
    expect(p.peak.label).toBe('Q3');
    expect(p.trough.label).toBe('Q1');
  });

  test('latest seasonal change = raw change − adjusted change', () => {
    expect(p.latestRawChange).toBe(-8); // 106 − 114
    // adjusted change 106 − 104 = +2, so the season accounts for −8 − 2 = −10 = seasonal[3] − seasonal[2]
    expect(p.latestSeasonalChange).toBe(-10);
    expect(p.seasonalSharePercent).toBeCloseTo(125, 12); // 100·(−10/−8)
  });
});

describe('seasonalProfile, multiplicative', () => {
  // Trend 100, 110, 120, 130; factors 0.9, 1, 1.1, 1; observed = trend·factor; adjusted = observed/factor.
  const trend = [100, 110, 120, 130];
  const seasonal = [0.9, 1, 1.1, 1];
  const observed = [90, 110, 132, 130];
  const p = seasonalProfile({
    seasonal,
    observed,
    adjusted: trend,
    index: 3,
    period: 4,
    multiplicative: true,
    ...common,
    seasonAt: quarter,
  });

  test('effects are (factor − 1)·(mean level) in units and 100·(factor − 1) in percent', () => {
    // mean observed (90 + 110 + 132 + 130)/4 = 115.5: (0.9 − 1)·115.5 = −11.55; 0; (1.1 − 1)·115.5 = 11.55; 0
    expect(p.seasons[0].effect).toBeCloseTo(-11.55, 10);
    expect(p.seasons[2].effect).toBeCloseTo(11.55, 10);
    expect(p.seasons[0].effectPercent).toBeCloseTo(-10, 10);
    expect(p.seasons[2].effectPercent).toBeCloseTo(10, 10);
    expect([p.peak.label, p.trough.label]).toEqual(['Q3', 'Q1']);
  });

  test('latest seasonal change = raw change − adjusted change', () => {
    expect(p.latestRawChange).toBe(-2); // 130 − 132
    expect(p.latestSeasonalChange).toBe(-12); // −2 − (130 − 120)
    expect(p.seasonalSharePercent).toBeCloseTo(600, 10); // 100·(−12/−2)
  });
});

describe('seasonalProfile, ordering and edge cases', () => {
  test('the latest cycle is read whatever season it ends in, then sorted by calendar position', () => {
    // index 5, period 4: periods 2..5 are Q3, Q4, Q1, Q2 of the fake calendar
    const seasonal = [0, 0, 3, 4, 1, 2];
    const p = seasonalProfile({
      seasonal,
      observed: [100, 100, 103, 104, 101, 102],
      adjusted: [100, 100, 100, 100, 100, 100],
      index: 5,
      period: 4,
      multiplicative: false,
      ...common,
      seasonAt: quarter,
    });
    expect(p.seasons.map((s) => [s.label, s.effect])).toEqual([
      ['Q1', 1],
      ['Q2', 2],
      ['Q3', 3],
      ['Q4', 4],
    ]);
    expect(p.peak.label).toBe('Q4');
  });

  test('no raw change: the seasonal share is undefined, not zero', () => {
    const p = seasonalProfile({
      seasonal: [-1, 1],
      observed: [9, 9],
      adjusted: [10, 8],
      index: 1,
      period: 2,
      multiplicative: false,
      naming: 'cycle-position',
      seasonAt: (i: number) => ({ order: i, label: `s${i}` }),
    });
    expect(p.latestRawChange).toBe(0);
    expect(p.latestSeasonalChange).toBe(2); // 0 − (8 − 10)
    expect(p.seasonalSharePercent).toBeNaN();
  });
});
