/**
 * Calendar effects, named interventions and outliers before decomposition (src/adjust/regression-effects.ts):
 * the identity observed = linearised + calendar + level + one-off (or the product), a planted working-day
 * effect recovered from a seeded series of our own, the seat-belt law as a named level shift in open data
 * (datasets::Seatbelts, Harvey & Durbin 1986), and bad input as plain errors.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { EffectsError, estimateEffects } from '../../src/adjust/regression-effects.js';
import { periodDays } from '../../src/calendar/period-days.js';
import { workingDayRegressor } from '../../src/calendar/working-days.js';
import { mulberry32 } from '../../src/data/synthetic.js';
import { ordinalOf } from '../../src/vocabulary/period-index.js';

const monthly = (from: string, length: number) => ({
  frequency: 'monthly' as const,
  start: ordinalOf('monthly', Date.parse(`${from}T00:00:00Z`)),
  length,
});

function seeded(n: number, seed: number, wdEffect: number) {
  const rand = mulberry32(seed);
  const normal = () => Math.sqrt(-2 * Math.log(1 - rand())) * Math.cos(2 * Math.PI * rand());
  const index = monthly('2012-01-01', n);
  const wd = workingDayRegressor(periodDays(index), new Set());
  const y = new Float64Array(n);
  let u = 0;
  for (let t = 0; t < n; t++) {
    u = 0.5 * u + normal();
    y[t] = 500 + 20 * Math.sin((2 * Math.PI * t) / 12) + wdEffect * wd[t] + 3 * u + (t >= 80 ? 40 : 0);
  }
  return { y, index };
}

describe('estimateEffects', () => {
  it('recovers a planted working-day effect and a level shift; the parts add back to the data to 1e-9', () => {
    const { y, index } = seeded(144, 7, 4);
    const r = estimateEffects(y, index, {
      multiplicative: false,
      calendar: { workingDays: true },
      outliers: ['AO', 'LS', 'TC'],
    });
    expect(r.groups.find((g) => g.name === 'working days')?.kept).toBe(true);
    // calendar[t] = β·wd[t]; the planted β is 4 (innovations of sd 3·… : within 1).
    const wd = workingDayRegressor(periodDays(index), new Set());
    const t0 = wd.findIndex((v) => v !== 0);
    expect(Math.abs(r.calendar[t0] / wd[t0] - 4)).toBeLessThan(1);
    const ls = r.events.filter((e) => e.type === 'LS');
    expect(ls.map((e) => e.at)).toContain(80);
    let worst = 0;
    for (let t = 0; t < y.length; t++) {
      worst = Math.max(worst, Math.abs(r.linearised[t] + r.calendar[t] + r.level[t] + r.oneOff[t] - y[t]));
    }
    expect(worst).toBeLessThanOrEqual(1e-9 * 600);
    expect(r.workingDays?.[0]).toBe(22); // January 2012: 31 days from a Sunday, 22 weekdays
  });

  it('Seatbelts (log drivers): the law of February 1983 as a named level shift, about −0.24 (Harvey & Durbin 1986); product identity', () => {
    const fx = JSON.parse(readFileSync(new URL('../model/fixtures/arima.json', import.meta.url), 'utf8'));
    const c = fx.cases.find((x: { id: string }) => x.id === 'seatbelts-law-airline');
    const y = Float64Array.from(c.values as number[], Math.exp); // the fixture holds log(drivers)
    const r = estimateEffects(y, monthly('1969-01-01', y.length), {
      multiplicative: true,
      interventions: [{ type: 'LS', at: 169, label: 'seat-belt law' }],
    });
    const law = r.events.find((e) => e.label === 'seat-belt law')!;
    expect(Math.abs(law.effect + 0.24)).toBeLessThan(0.05);
    for (let t = 0; t < y.length; t++) {
      const back = r.linearised[t] * r.calendar[t] * r.level[t] * r.oneOff[t];
      expect(Math.abs(back / y[t] - 1)).toBeLessThanOrEqual(1e-12);
    }
  });

  it('bad input: an intervention outside the data, on a missing period, or collinear with another', () => {
    const { y, index } = seeded(60, 3, 0);
    const run =
      (interventions: Parameters<typeof estimateEffects>[2]['interventions'], values = y) =>
      () =>
        estimateEffects(values, index, { multiplicative: false, interventions });
    expect(run([{ type: 'AO', at: 70, label: 'strike' }])).toThrow(
      new EffectsError('intervention "strike" is outside the data'),
    );
    const gappy = Float64Array.from(y);
    gappy[10] = Number.NaN;
    expect(run([{ type: 'AO', at: 10, label: 'strike' }], gappy)).toThrow(/falls on a missing period/);
    expect(
      run([
        { type: 'LS', at: 20, label: 'new tariff' },
        { type: 'LS', at: 20, label: 'boundary change' },
      ]),
    ).toThrow(/"boundary change" is constant or a combination of the others \(new tariff\)/);
  });
});
