/**
 * The scales against the reference implementations they follow, which come with vega: d3-array's ticks,
 * tickIncrement and tickStep, d3-scale's linear nice() and scaleBand, and d3-time's utcTicks (all by Mike
 * Bostock, ISC licence), on hand-checked cases and on many random domains (fast-check).
 */
import { tickIncrement as d3TickIncrement, tickStep as d3TickStep, ticks as d3Ticks } from 'd3-array';
import { scaleBand, scaleLinear } from 'd3-scale';
import { utcMonday, utcTicks } from 'd3-time';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { bandScale } from '../../src/chart/scale-band.js';
import {
  linearScale,
  niceDomain,
  padDomain,
  stepDecimals,
  tickIncrement,
  tickStep,
  ticks,
} from '../../src/chart/scale-linear.js';
import { timeLabelUnit, timeTickInterval, timeTicks } from '../../src/chart/scale-time.js';

const domain = fc
  .tuple(
    fc.double({ min: -1e7, max: 1e7, noNaN: true }),
    fc.double({ min: 1e-4, max: 1e7, noNaN: true }),
    fc.integer({ min: 1, max: 12 }),
  )
  .map(([lo, span, count]) => ({ lo, hi: lo + span, count }));

describe('linear ticks (d3-array)', () => {
  it('match hand-worked cases', () => {
    // (10 − 0)/5 = 2: mantissa 2 ≥ √2 → factor 2, step 2.
    expect(ticks(0, 10, 5)).toEqual([0, 2, 4, 6, 8, 10]);
    // (7000 − 3500)/5 = 700: mantissa 7 ≥ √10 but < √50 → 5 × 100 = 500.
    expect(ticks(3500, 7000, 5)).toEqual([3500, 4000, 4500, 5000, 5500, 6000, 6500, 7000]);
    // (1 − 0)/5 = 0.2: step 0.2, written as k / 5 so that 0.6 is 0.6 and not 0.6000000000000001.
    expect(ticks(0, 1, 5)).toEqual([0, 0.2, 0.4, 0.6, 0.8, 1]);
  });

  it('equal d3-array’s ticks, tickIncrement and tickStep on random domains', () => {
    fc.assert(
      fc.property(domain, ({ lo, hi, count }) => {
        expect(ticks(lo, hi, count)).toEqual(d3Ticks(lo, hi, count));
        expect(tickIncrement(lo, hi, count)).toBe(d3TickIncrement(lo, hi, count));
        expect(tickStep(lo, hi, count)).toBe(d3TickStep(lo, hi, count));
      }),
      { numRuns: 2000 },
    );
  });
});

describe('nice domain (d3-scale linear.nice)', () => {
  it('widens [3751, 6777] to [3500, 7000]', () => {
    // Step 200 first gives [3600, 6800]; its step for 10 ticks is 320 → 500, giving [3500, 7000], stable.
    expect(niceDomain(3751, 6777)).toEqual([3500, 7000]);
  });

  it('equals d3-scale’s nice() on random domains and counts', () => {
    fc.assert(
      fc.property(domain, ({ lo, hi, count }) => {
        expect(niceDomain(lo, hi, count)).toEqual(scaleLinear().domain([lo, hi]).nice(count).domain());
        expect(niceDomain(lo, hi)).toEqual(scaleLinear().domain([lo, hi]).nice().domain());
      }),
      { numRuns: 2000 },
    );
  });
});

describe('padding, mapping and label decimals', () => {
  it('pads a domain by pixels about its middle (vega’s zoomLinear)', () => {
    // 100 px with 10 px at each end: the domain spans 100/80 = 1.25 times as much about 5: [−1.25, 11.25].
    expect(padDomain(0, 10, 100, 10)).toEqual([-1.25, 11.25]);
    expect(padDomain(0, 10, 100, 0)).toEqual([0, 10]);
  });

  it('maps the domain onto the range, a flat domain to its middle', () => {
    const y = linearScale(0, 10, 200, 0);
    expect([y(0), y(5), y(10)]).toEqual([200, 100, 0]);
    expect(linearScale(3, 3, 0, 100)(3)).toBe(50);
  });

  it('gives the decimals d3-format’s precisionFixed gives for a step', () => {
    expect([500, 1, 0.5, 0.2, 0.05, 0.001].map(stepDecimals)).toEqual([0, 0, 1, 1, 2, 3]);
  });
});

describe('band scale (d3-scale scaleBand)', () => {
  it('equals d3’s bands for vega-lite’s bar padding on random ranges', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 60 }), fc.double({ min: 10, max: 2000, noNaN: true }), (n, width) => {
        const labels = Array.from({ length: n }, (_, i) => `b${i}`);
        const d3 = scaleBand().domain(labels).range([0, width]).paddingInner(0.1).paddingOuter(0.05).align(0.5);
        const ours = bandScale(n, 0, width, 0.1, 0.05);
        expect(ours.bandwidth).toBeCloseTo(d3.bandwidth(), 9);
        expect(ours.step).toBeCloseTo(d3.step(), 9);
        labels.forEach((l, i) => {
          expect(ours.start(i)).toBeCloseTo(d3(l) as number, 9);
        });
      }),
      { numRuns: 300 },
    );
  });
});

describe('time ticks (d3-time utcTicks)', () => {
  const DAY = 86_400_000;
  // Spans a brief's time axes cover: 36 months, ten years, a year of days, five years of days, two weeks
  // of hours, a few days of hours, three quarters, thirty years.
  const cases: [string, number, number][] = [
    ['36 months', Date.UTC(2023, 9, 1), Date.UTC(2026, 9, 1)],
    ['ten years', Date.UTC(2015, 0, 1), Date.UTC(2026, 8, 1)],
    ['a year of days', Date.UTC(2025, 9, 1), Date.UTC(2026, 8, 30)],
    ['five years of days', Date.UTC(2022, 0, 1), Date.UTC(2026, 8, 30)],
    ['two weeks of hours', Date.UTC(2026, 8, 1), Date.UTC(2026, 8, 15, 23)],
    ['three days of hours', Date.UTC(2026, 8, 1), Date.UTC(2026, 8, 3, 23)],
    ['three quarters', Date.UTC(2026, 0, 1), Date.UTC(2026, 9, 1)],
    ['thirty years', Date.UTC(1996, 0, 1), Date.UTC(2026, 0, 1)],
    ['a week of days', Date.UTC(2026, 8, 2), Date.UTC(2026, 8, 9)],
  ];

  it.each(cases)('equal d3’s ticks over %s (15 and 8 ticks wanted)', (_, start, stop) => {
    for (const count of [15, 8]) {
      const ours = timeTicks(start, stop, count);
      if (ours.interval.unit === 'week') continue;
      expect(ours.values, `count ${count}`).toEqual(utcTicks(new Date(start), new Date(stop), count).map(Number));
    }
  });

  it('start weeks on Monday (ISO 8601), where d3 starts them on Sunday', () => {
    // Ten weeks over 15 ticks: a target of 4.7 days lies between 2 days and a week, nearer a week by ratio
    // (7/4.7 = 1.5 against 4.7/2 = 2.3).
    const start = Date.UTC(2026, 0, 1);
    const stop = start + 70 * DAY;
    const ours = timeTicks(start, stop, 15);
    expect(ours.interval).toEqual({ unit: 'week', step: 1 });
    const mondays = (utcMonday.every(1) as { range: (a: Date, b: Date) => Date[] })
      .range(new Date(start), new Date(stop + 1))
      .map(Number);
    expect(ours.values).toEqual(mondays);
    // 2026-01-05 was a Monday.
    expect(ours.values[0]).toBe(Date.UTC(2026, 0, 5));
  });

  it('choose calendar-aligned quarters and whole years', () => {
    expect(timeTickInterval(Date.UTC(2023, 9, 1), Date.UTC(2026, 9, 1), 15)).toEqual({ unit: 'month', step: 3 });
    const q = timeTicks(Date.UTC(2023, 9, 15), Date.UTC(2026, 9, 1), 15).values.map((t) => new Date(t).getUTCMonth());
    expect(new Set(q)).toEqual(new Set([0, 3, 6, 9]));
    // A century over 15 ticks: 6.7 years a tick, mantissa 6.7 ≥ √10 but < √50, so steps of 5 years.
    expect(timeTickInterval(Date.UTC(1900, 0, 1), Date.UTC(2000, 0, 1), 15)).toEqual({ unit: 'year', step: 5 });
  });

  it('label each tick at the field that makes it round', () => {
    expect(timeLabelUnit(Date.UTC(2026, 0, 1))).toBe('year');
    expect(timeLabelUnit(Date.UTC(2026, 3, 1))).toBe('month');
    expect(timeLabelUnit(Date.UTC(2026, 3, 7))).toBe('day');
    expect(timeLabelUnit(Date.UTC(2026, 3, 7, 13))).toBe('hour');
  });
});
