/**
 * The analysis stage through the real engine (STL, Cleveland et al. 1990, additive, seasonal window 13) on
 * invented series whose answer is known from how they were made:
 * (a) a level shift makes the first estimates near it move, a clean series does not;
 * (b) a series with no trend has a trend year-over-year change of about zero (and one with 5% a year, 5%);
 * a daily series with a weekly and a yearly pattern (MSTL) shows the weekly pattern alone as its profile;
 * (c) the brief JSON is byte-identical on two runs with SOURCE_DATE_EPOCH set.
 */
import { join } from 'node:path';
import { afterEach, describe, expect, test } from 'vitest';
import { analyse } from '../../src/analyse/index.js';
import { buildBriefs } from '../../src/brief/build.js';
import { runDecomposition } from '../../src/decompose/index.js';
import { diagnose } from '../../src/diagnose/index.js';
import { loadJob } from '../../src/job/load.js';
import { emptyDecompositionSpec, resolveDecomposition } from '../../src/job/resolve.js';
import { renderJson } from '../../src/render/json.js';
import type { Analysis } from '../../src/vocabulary/brief.js';
import { type Frequency, isoDates, ordinalOf, seasonOf } from '../../src/vocabulary/period-index.js';
import type { DecompositionSpec } from '../../src/vocabulary/settings.js';

const START = 2015 * 12; // January 2015

/** Decompose and analyse a series the way brief/build.ts does (monthly STL unless told otherwise). */
function analyseSeries(
  values: Float64Array,
  firmnessPeriods: number,
  frequency: Frequency = 'monthly',
  start = START,
  spec: Partial<DecompositionSpec> = { seasonalWindow: 13 },
): Analysis {
  const settings = resolveDecomposition(
    { ...emptyDecompositionSpec(), model: 'additive', ...spec },
    values,
    frequency,
    {},
  );
  const d = runDecomposition(values, settings);
  const dates = isoDates({ frequency, start, length: values.length });
  const period = settings.period;
  const diagnostics = diagnose({ ...d, observed: values, period, multiplicative: false, dates, identifiable: [] });
  return analyse({
    frequency,
    start,
    dates,
    observed: values,
    ...d,
    period,
    multiplicative: false,
    aggregation: 'sum',
    provisionalReason: 'test',
    diagnostics,
    comparisons: [],
    firmnessPeriods,
    minLength: 2 * Math.max(...settings.periods),
    trendOf: (v) => runDecomposition(v, settings).trend,
    changeExpression: 'relative',
  });
}

/** mulberry32 (Tommy Ettinger's public-domain generator) and Box–Muller: reproducible normal noise. */
function normalNoise(seed: number): () => number {
  let a = seed;
  const uniform = () => {
    a = (a + 0x6d2b79f5) | 0;
    let t = Math.imul(a ^ (a >>> 15), 1 | a);
    t = (t + Math.imul(t ^ (t >>> 7), 61 | t)) ^ t;
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
  return () => Math.sqrt(-2 * Math.log(1 - uniform())) * Math.cos(2 * Math.PI * uniform());
}

const N = 120; // ten years of months
const season = (t: number) => 100 * Math.sin((2 * Math.PI * t) / 12);

describe('(a) firmness with a known level shift', () => {
  const SHIFT = 104; // September 2023: 15 months before the end, inside the last 24 periods
  const clean = Float64Array.from({ length: N }, (_, t) => 1000 + season(t));
  const shifted = Float64Array.from({ length: N }, (_, t) => 1000 * (t >= SHIFT ? 1.1 : 1) + season(t));
  // 60 cuts reach back to periods whose trend window (21 months here) never saw the shift.
  const withShift = analyseSeries(shifted, 60).firmness;
  const without = analyseSeries(clean, 60).firmness;
  const at = (cut: number) => withShift.revisions.find((r) => r.index === cut)?.revision ?? Number.NaN;

  test('the study re-ran the 60 cuts before the provisional zone, never inside it', () => {
    // STL's trend window here is 21 months, so its last 10 values are provisional (provisionalFrom 110):
    // the settled estimate a first estimate is compared with exists only before that.
    expect(withShift.provisionalFrom).toBe(N - withShift.provisionalCount);
    expect(withShift.provisionalCount).toBeGreaterThan(0);
    expect(withShift.periodsChecked).toBe(60);
    expect(withShift.revisions[0].index).toBe(withShift.provisionalFrom - 60);
    expect(withShift.revisions.at(-1)?.index).toBe(withShift.provisionalFrom - 1);
    expect(withShift.limit).toBe('none');
  });

  test('the first estimate in the month of the shift misses most of the rise and is revised up', () => {
    // With all the data, the centred trend at the shift sits about half-way up the +10% step (a year-over-
    // year change near +5%); cut there, the trend has seen one raised value. So the first estimate is
    // lower, and the revision (settled minus first) is well above +1 percentage point (a tenth of the step).
    expect(at(SHIFT)).toBeGreaterThan(1);
    // Five months on, the local-linear end fit overshoots the new level: revised down, a negative revision.
    expect(at(SHIFT + 5)).toBeLessThan(-1);
  });

  test('revisions near the shift are far larger than revisions a trend window away from it', () => {
    const near = withShift.revisions.filter((r) => Math.abs(r.index - SHIFT) <= 5).map((r) => Math.abs(r.revision));
    // More than half a trend window (10) plus a margin before the shift, the trend never saw it.
    const far = withShift.revisions.filter((r) => r.index < SHIFT - 12).map((r) => Math.abs(r.revision));
    expect(far.length).toBeGreaterThan(10);
    // The six cuts from five months before the shift up to it: the latest trend already climbs, the first does not.
    expect(Math.min(...near.slice(0, 6))).toBeGreaterThan(0.5);
    expect(Math.max(...far)).toBeLessThan(0.1 * Math.max(...near));
  });

  test('the mean absolute revision is larger with the shift than without', () => {
    expect(withShift.meanAbsoluteRevision).toBeGreaterThan(0.3);
    // A clean seasonal series is fitted exactly by any cut: revisions only at rounding level (1e-9 pp).
    expect(without.meanAbsoluteRevision).toBeLessThan(1e-9);
    expect(withShift.range80[1] - withShift.range80[0]).toBeGreaterThan(1);
  });
});

describe('(b) a trendless series', () => {
  // Level 1000, seasonal swing ±100, normal noise with sd σ = 2 (0.2% of the level).
  // Tolerance 0.5 percentage points: the trend at each end is a weighted mean of noisy values with weights
  // summing to 1; even if each rested on a single value, the difference of two would have sd √2·σ = 2.8,
  // i.e. 0.28% of the level. 0.5 pp is 1.8 of those worst-case sds, and about 4 sds for STL's real end
  // weights (which spread over about 21 months).
  const noise = normalNoise(20260901);
  const e = Float64Array.from({ length: N }, () => 2 * noise());
  const flat = Float64Array.from({ length: N }, (_, t) => 1000 + season(t) + e[t]);
  const growing = Float64Array.from({ length: N }, (_, t) => 1000 * 1.05 ** (t / 12) + season(t) + e[t]);

  test('trend year-over-year change within 0.5 percentage points of zero', () => {
    const a = analyseSeries(flat, 12);
    expect(Math.abs(a.trendYoY.percent)).toBeLessThan(0.5);
    expect(Math.abs(a.trendAnnualised6)).toBeLessThan(1); // six months annualised doubles the noise's effect
  });

  test('the same noise on a trend growing 5% a year gives 5% ± 0.5', () => {
    // 1000·1.05^(t/12) grows by exactly 5% over any twelve months.
    const a = analyseSeries(growing, 12);
    expect(a.trendYoY.percent).toBeGreaterThan(4.5);
    expect(a.trendYoY.percent).toBeLessThan(5.5);
    expect(a.direction).toBe('rising');
  });
});

describe('the seasonal profile of a series with two seasonal periods (MSTL)', () => {
  // Daily: level 1000, a weekly pattern Monday +200 … Sunday −200 (sum 0), and a yearly swing
  // 100·sin(2πt/365) that peaks (+100) in the last week. "Each week, the peak is on Monday" must read the
  // weekly pattern alone: about +200 on a level of 1000, i.e. +20%; with the yearly swing added in it would
  // read about +30%, and Sunday about −10% instead of −20%.
  const weekly = [200, 100, 50, 0, -50, -100, -200]; // Monday first (calendar.seasonOf)
  const start = ordinalOf('daily', Date.UTC(2022, 0, 3)); // Monday 3 January 2022
  const n = 730 + 92; // the last day, t = 821, is 91 days into its year: sin(2π·91/365) = 0.99998
  const values = Float64Array.from(
    { length: n },
    (_, t) => 1000 + weekly[seasonOf('daily', start + t)] + 100 * Math.sin((2 * Math.PI * t) / 365),
  );
  const p = analyseSeries(values, 0, 'daily', start, { method: 'mstl', periods: [7, 365] }).seasonalProfile;

  test('peak Monday near +20%, low point Sunday near −20% (within 3 points)', () => {
    expect(p.seasons).toHaveLength(7);
    expect(p.peak.season).toBe(0);
    expect(p.trough.season).toBe(6);
    // tolerance: MSTL splits a noiseless sum of the two patterns closely but not exactly; 3 points is a
    // third of the 10-point error that reading the total seasonal would make
    expect(Math.abs(p.peak.effectPercent - 20)).toBeLessThan(3);
    expect(Math.abs(p.trough.effectPercent + 20)).toBeLessThan(3);
  });
});

describe('(c) the brief JSON is reproducible', () => {
  const saved = process.env.SOURCE_DATE_EPOCH;
  afterEach(() => {
    if (saved === undefined) delete process.env.SOURCE_DATE_EPOCH;
    else process.env.SOURCE_DATE_EPOCH = saved;
  });

  test('two runs with SOURCE_DATE_EPOCH set give the same bytes, stamped with that time', async () => {
    process.env.SOURCE_DATE_EPOCH = '1790000000';
    const file = join(import.meta.dirname, '..', '..', 'examples', 'water-deliveries', 'job.yaml');
    const run = async () => {
      const units = await buildBriefs(loadJob(file), { toolVersion: 'test', charts: false });
      const brief = units[0].brief;
      if (!brief) throw units[0].error;
      return renderJson(brief);
    };
    const first = await run();
    const second = await run();
    expect(Buffer.from(second).equals(Buffer.from(first))).toBe(true);
    // 1790000000 s after 1970-01-01T00:00Z is 2026-09-21T14:13:20Z (20717 days + 51200 s)
    expect(JSON.parse(first).provenance.generatedAt).toBe('2026-09-21T14:13:20.000Z');
  });
});

describe('(d) the firmness study of every example', async () => {
  const { exampleBriefs } = await import('../narrate/examples.js');
  const briefs = await exampleBriefs();
  test.each(briefs.flatMap((b) => b.brief.series.map((s) => [`${b.example} ${s.group ?? ''}`, s] as const)))(
    '%s: first estimates compared with settled ones only, revision = settled − first',
    (_name, s) => {
      // Found: every cut of the daily example lay inside its 300-day provisional zone.
      const f = s.analysis.firmness;
      expect(f.periodsChecked).toBeGreaterThan(0);
      for (const r of f.revisions) {
        expect(r.index).toBeLessThan(f.provisionalFrom);
        expect(r.revision).toBe(r.latest - r.first);
      }
      // What the range holds, counted here with ends widened by 1e-9 of the largest revision (ties computed
      // along different paths differ in the last bit).
      const slack = 1e-9 * Math.max(...f.revisions.map((r) => Math.abs(r.revision)));
      const [lo, hi] = f.range80;
      expect(f.withinRange80).toBe(
        f.revisions.filter((r) => r.revision >= lo - slack && r.revision <= hi + slack).length,
      );
    },
  );
});
