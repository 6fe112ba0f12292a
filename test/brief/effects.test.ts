/**
 * Effects around the decomposition (src/brief/effects.ts): for any seeded series with a planted step, a
 * one-off and a working-day effect, additive or multiplicative, observed = trend + seasonal + calendar +
 * remainder (or the product) to 1e-9 of the range, and the verifier's identity check (src/verify/
 * identities.ts) agrees; it catches a calendar component that was left out. Property test (fast-check).
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { putBack, removeEffects } from '../../src/brief/effects.js';
import { periodDays } from '../../src/calendar/period-days.js';
import { workingDayRegressor } from '../../src/calendar/working-days.js';
import { mulberry32, normal } from '../../src/data/synthetic.js';
import { runDecomposition } from '../../src/decompose/index.js';
import { emptyDecompositionSpec, resolveDecomposition } from '../../src/job/resolve.js';
import { checkIdentities } from '../../src/verify/identities.js';
import type { SeriesBrief } from '../../src/vocabulary/brief.js';
import { ordinalOf } from '../../src/vocabulary/period-index.js';

const start = ordinalOf('monthly', Date.UTC(2014, 0, 1));

function series(seed: number, n: number, multiplicative: boolean) {
  const rand = mulberry32(seed);
  const index = { frequency: 'monthly' as const, start, length: n };
  const wd = workingDayRegressor(periodDays(index), new Set());
  const y = new Float64Array(n);
  const step = 40 + 20 * rand();
  for (let t = 0; t < n; t++) {
    const level = 800 + 2 * t + (t >= 50 ? step : 0) + (t === 70 ? 90 : 0);
    const season = 60 * Math.sin((2 * Math.PI * t) / 12);
    const v = level + season + 6 * wd[t] + 8 * normal(rand);
    y[t] = multiplicative ? v * (1 + 0.1 * Math.cos((2 * Math.PI * t) / 12)) : v;
  }
  return { y, index };
}

describe('effects put back around the decomposition', () => {
  it('observed = trend + seasonal + calendar + remainder (or ×) to 1e-9; the verifier agrees', {
    timeout: 120_000,
  }, () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 1_000_000 }), fc.boolean(), (seed, multiplicative) => {
        const { y, index } = series(seed, 108, multiplicative);
        const spec = { ...emptyDecompositionSpec(), model: multiplicative ? 'multiplicative' : 'additive' } as const;
        const settings = resolveDecomposition(spec, y, 'monthly', {});
        const removed = removeEffects(
          y,
          index,
          {
            on: true,
            days: 'working',
            leapYear: false,
            easterDays: null,
            holidays: null,
            events: [{ kind: 'step', at: 50, date: '2018-03-01', until: null, label: 'Step', fadingRate: 0.7 }],
            find: ['one-off'],
            findReason: '',
            asked: true,
          },
          multiplicative,
        );
        expect(removed.report.skipped).toBeNull();
        const fx = removed.effects!;
        const d = putBack(runDecomposition(removed.linearised, settings), fx, multiplicative, y);
        let range = 0;
        for (const v of y) range = Math.max(range, Math.abs(v));
        for (let t = 0; t < y.length; t++) {
          const back = multiplicative
            ? d.trend[t] * d.seasonal[t] * d.calendar[t] * d.remainder[t]
            : d.trend[t] + d.seasonal[t] + d.calendar[t] + d.remainder[t];
          expect(Math.abs(back - y[t])).toBeLessThanOrEqual(1e-9 * range);
        }
        const brief = {
          settings,
          components: {
            dates: Array.from({ length: y.length }, (_, t) => `t${t}`),
            observed: Array.from(y),
            trend: Array.from(d.trend),
            seasonal: Array.from(d.seasonal),
            remainder: Array.from(d.remainder),
            adjusted: Array.from(d.adjusted),
            calendar: Array.from(d.calendar),
          },
        } as unknown as SeriesBrief;
        expect(checkIdentities(brief, y)).toEqual([]);
        // Left out, the calendar breaks the identity wherever it is not nil.
        const without = { ...brief, components: { ...brief.components, calendar: undefined } } as SeriesBrief;
        expect(checkIdentities(without, y).length).toBeGreaterThan(0);
      }),
      { numRuns: 6, seed: 42 },
    );
  });

  it('a series too short to estimate: effects skipped with a sentence, the data untouched', () => {
    const { y, index } = series(3, 10, false);
    const r = removeEffects(
      y,
      { ...index, length: 10 },
      {
        on: true,
        days: 'working',
        leapYear: false,
        easterDays: null,
        holidays: null,
        events: [],
        find: [],
        findReason: '',
        asked: true,
      },
      false,
    );
    expect(r.effects).toBeNull();
    expect(r.linearised).toBe(y);
    expect(r.report.skipped).toMatch(/^Calendar effects and events were not estimated for this series: .+\.$/);
  });

  it('regressors that cannot be told apart: effects skipped with a sentence naming them', () => {
    const { y, index } = series(5, 96, false);
    const r = removeEffects(
      y,
      index,
      {
        on: true,
        days: 'none',
        leapYear: false,
        easterDays: null,
        holidays: null,
        events: [
          { kind: 'step', at: 40, date: '', until: null, label: 'Tariff', fadingRate: 0.7 },
          { kind: 'step', at: 40, date: '', until: null, label: 'Boundary change', fadingRate: 0.7 },
        ],
        find: [],
        findReason: '',
        asked: true,
      },
      false,
    );
    expect(r.effects).toBeNull();
    expect(r.report.skipped).toContain('"Boundary change"');
  });
});
