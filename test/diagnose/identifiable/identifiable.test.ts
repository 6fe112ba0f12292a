/**
 * The tests for identifiable seasonality against R (fixtures/identifiable.json, written by generate.R: stats::anova of lm
 * fits and stats::kruskal.test on open datasets that ship with R), and small worked examples by hand.
 * The fixture holds R's numbers to 15 significant digits, so statistics agree to 1e-12 relative; p-values
 * (our incomplete beta and gamma against R's pf/pchisq) to 1e-10 relative.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, test } from 'vitest';
import { chiSquareUpperTail } from '../../../src/diagnose/chi-square.js';
import { identifiableSeasonality, seasonalIrregular } from '../../../src/diagnose/identifiable-seasonality.js';
import { kruskalWallis } from '../../../src/diagnose/kruskal-wallis.js';
import { movingSeasonalityTest } from '../../../src/diagnose/moving-seasonality.js';
import { stableSeasonalityTest } from '../../../src/diagnose/stable-seasonality.js';

interface Fixture {
  id: string;
  period: number;
  multiplicative: boolean;
  values: (number | null)[];
  stable: { statistic: number; df1: number; df2: number; p: number };
  moving: { statistic: number; df1: number; df2: number; p: number };
  kruskal: { statistic: number; df: number; p: number };
}
const FIXTURES: Fixture[] = JSON.parse(
  readFileSync(join(import.meta.dirname, 'fixtures', 'identifiable.json'), 'utf8'),
);

const close = (a: number, b: number, rel: number) => expect(Math.abs(a - b)).toBeLessThanOrEqual(rel * Math.abs(b));

describe.each(FIXTURES.map((f) => [f.id, f] as const))('%s against R', (_id, f) => {
  const values = Float64Array.from(f.values, (v) => (v === null ? Number.NaN : v));
  const si = seasonalIrregular(values, f.period, f.multiplicative);
  test('stable seasonality F (stats::anova, one-way by season)', () => {
    const r = stableSeasonalityTest(si, f.period);
    expect([r.df1, r.df2]).toEqual([f.stable.df1, f.stable.df2]);
    close(r.statistic, f.stable.statistic, 1e-12);
    close(r.pValue, f.stable.p, 1e-10);
  });
  test('moving seasonality F (stats::anova, cycles + seasons, the cycles row)', () => {
    const r = movingSeasonalityTest(si, f.period, f.multiplicative ? 100 : 0);
    expect([r.df1, r.df2]).toEqual([f.moving.df1, f.moving.df2]);
    close(r.statistic, f.moving.statistic, 1e-12);
    close(r.pValue, f.moving.p, 1e-10);
  });
  test('Kruskal–Wallis (stats::kruskal.test on the values rounded to 9 significant digits, so that ties agree)', () => {
    const r = kruskalWallis(si, f.period);
    expect(r.df).toBe(f.kruskal.df);
    close(r.statistic, f.kruskal.statistic, 1e-12);
    close(r.pValue, f.kruskal.p, 1e-10);
  });
});

describe('the combined verdict', () => {
  const get = (id: string) => {
    const f = FIXTURES.find((x) => x.id === id) as Fixture;
    return identifiableSeasonality(
      Float64Array.from(f.values, (v) => v ?? Number.NaN),
      f.period,
      f.multiplicative,
    );
  };
  test('strong, stable seasonality is identifiable (AirPassengers, nottem, UKgas)', () => {
    for (const id of ['air-passengers', 'nottem', 'uk-gas']) expect(get(id).verdict).toBe('present');
  });
  test('sunspots (an eleven-year cycle) and WWWusage have none: the stable F fails at 0.1%', () => {
    for (const id of ['sunspots-1950', 'www-usage']) {
      const r = get(id);
      expect(r.verdict).toBe('none');
      expect(r.decidedBy).toBe('stable');
    }
  });
  test('T1, T2 and M7 from F_S and F_M (Lothian & Morry: T1 = 7/F_S, T2 = 3·F_M/F_S, M7 = √((T1+T2)/2))', () => {
    const f = FIXTURES.find((x) => x.id === 'us-accidental-deaths') as Fixture;
    const r = get('us-accidental-deaths');
    close(r.t1, 7 / f.stable.statistic, 1e-12);
    close(r.t2, (3 * f.moving.statistic) / f.stable.statistic, 1e-12);
    close(r.m7, Math.sqrt((7 / f.stable.statistic + (3 * f.moving.statistic) / f.stable.statistic) / 2), 1e-12);
  });
  test('a pattern that moves a lot against a weak stable one: no identifiable seasonality by step 2', () => {
    // Hand-made: a sine whose amplitude is −1 and 3 in turn, cycle by cycle (cycles counted from the first
    // SI value, index 6): F_S ≈ 6 passes at 0.1%, but F_M ≈ 14 is significant and T = (T1 + T2)/2 ≈ 4 ≥ 1.
    const v = new Float64Array(120);
    for (let i = 0; i < 120; i++)
      v[i] = 100 + (Math.floor((i + 6) / 12) % 2 ? 3 : -1) * Math.sin((2 * Math.PI * (i + 0.5)) / 12);
    const r = identifiableSeasonality(v, 12, false);
    expect(r.stable.pValue).toBeLessThan(0.001);
    expect(r.moving.pValue).toBeLessThan(0.05);
    expect(r.verdict).toBe('none');
    expect(r.decidedBy).toBe('moving');
  });
});

describe('worked examples (arithmetic in each file header)', () => {
  test('stable F: [1, 3, 1, 3, 2, 4] by 2 → 18', () => {
    expect(stableSeasonalityTest([1, 3, 1, 3, 2, 4], 2).statistic).toBeCloseTo(18, 12);
  });
  test('moving F: |SI| [[1, 2], [3, 4], [2, 2]] → 13', () => {
    expect(movingSeasonalityTest([1, 2, 3, 4, 2, 2], 2, 0).statistic).toBeCloseTo(13, 12);
  });
  test('Kruskal–Wallis: [1, 2, 3, 4] by 2 → H = 0.6', () => {
    expect(kruskalWallis([1, 2, 3, 4], 2).statistic).toBeCloseTo(0.6, 12);
  });
  test('chi-square with 2 df: the tail is e^(−x/2) (common practice); 1 df: 2·(1 − Φ(√x))', () => {
    for (const x of [0.1, 1, 2, 5, 30]) close(chiSquareUpperTail(x, 2), Math.exp(-x / 2), 1e-13);
    // P(χ²₁ > 3.841459) = 0.05, the familiar 5% critical value (R: qchisq(0.95, 1) = 3.841458820694124).
    close(chiSquareUpperTail(3.841458820694124, 1), 0.05, 1e-12);
  });
});

describe('periods other than 12 and 4', () => {
  test('the T1/T2 thresholds do not apply: a plain yearly pattern of days with day-to-day noise is present', () => {
    // Hand-made: three years of days, a yearly sine of amplitude 2 in uniform noise of width 6 (a fixed
    // pseudo-random sequence): F_S is small (each day of the year has 2–3 values) but p is tiny.
    const v = new Float64Array(3 * 365);
    let x = 1;
    for (let i = 0; i < v.length; i++) {
      x = (x * 16807) % 2147483647;
      v[i] = 10 + 2 * Math.sin((2 * Math.PI * i) / 365) + 6 * (x / 2147483647 - 0.5);
    }
    const r = identifiableSeasonality(v, 365, false);
    expect(r.stable.pValue).toBeLessThan(0.001);
    expect(r.t1).toBeGreaterThan(1);
    expect(r.verdict).toBe('present');
  });
});
