/**
 * The decompose command end to end, checked against R: the CSV files here hold open datasets that ship
 * with R (AirPassengers: Box, Jenkins & Reinsel, Series G; UKDriverDeaths: Harvey & Durbin 1986), and the
 * expected components are R's own (test/reference/fixtures, written by test/reference/generate.R).
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { ROOT, runCli } from './run.js';

interface Fixture {
  id: string;
  values: number[];
  trend: (number | null)[];
  seasonal: number[];
  random?: (number | null)[];
  remainder?: number[];
  weights?: number[];
}

function fixture(file: string, id: string): Fixture {
  const f = JSON.parse(readFileSync(`${ROOT}test/reference/fixtures/${file}`, 'utf8'));
  const cases: Fixture[] = Array.isArray(f) ? f : f.cases;
  const c = cases.find((x) => x.id === id);
  if (!c) throw new Error(`no fixture ${id}`);
  return c;
}

function close(actual: (number | null)[], expected: (number | null)[], tol: number): void {
  expect(actual.length).toBe(expected.length);
  for (let i = 0; i < expected.length; i++) {
    const e = expected[i];
    const a = actual[i];
    if (e === null) expect(a).toBeNull();
    else expect(Math.abs((a as number) - e)).toBeLessThanOrEqual(tol * Math.max(1, Math.abs(e)));
  }
}

const AIR = 'test/cli/files/air-passengers.csv';
const DEATHS = 'test/cli/files/uk-driver-deaths.csv';

describe('trendbrief decompose', () => {
  it('classical multiplicative on AirPassengers matches R stats::decompose, with null where undefined', () => {
    const r = runCli([
      'decompose',
      AIR,
      '--date',
      'month',
      '--value',
      'passengers',
      '--method',
      'classical',
      '--model',
      'multiplicative',
    ]);
    expect(r.stderr).toBe('');
    expect(r.code).toBe(0);
    const out = JSON.parse(r.stdout);
    const ref = fixture('classical.json', 'AirPassengers-multiplicative');
    expect(out.dates[0]).toBe('1949-01-01');
    expect(out.dates).toHaveLength(144);
    expect(out.observed).toEqual(ref.values);
    close(out.trend, ref.trend, 1e-9);
    close(out.seasonal, ref.seasonal, 1e-9);
    close(out.remainder, ref.random as (number | null)[], 1e-9);
    // 2×12 average: six undefined values at each end (common practice).
    expect(out.trend.slice(0, 6)).toEqual([null, null, null, null, null, null]);
    expect(out.settings).toMatchObject({
      method: 'classical',
      model: 'multiplicative',
      period: 12,
      trendFilter: 'centred',
    });
    expect(out.weights).toBeUndefined();
  });

  it('robust STL on UKDriverDeaths matches R stats::stl(s.window = 13, robust = TRUE), weights included', () => {
    const r = runCli(['decompose', DEATHS, '--date', 'month', '--value', 'deaths', '--robust', '--model', 'additive']);
    expect(r.code).toBe(0);
    const out = JSON.parse(r.stdout);
    const ref = fixture('stl.json', 'UKDriverDeaths-s13-robust');
    const range = Math.max(...ref.values) - Math.min(...ref.values);
    for (const [name, expected] of [
      ['trend', ref.trend],
      ['seasonal', ref.seasonal],
      ['remainder', ref.remainder],
      ['weights', ref.weights],
    ] as const) {
      const a = out[name] as number[];
      const tol = name === 'weights' ? 1e-6 : 1e-6 * range;
      for (let i = 0; i < a.length; i++) expect(Math.abs(a[i] - (expected as number[])[i])).toBeLessThanOrEqual(tol);
    }
    // Every value actually used, defaults included (Cleveland et al. 1990 defaults, as R applies them).
    expect(out.settings).toMatchObject({
      method: 'stl',
      model: 'additive',
      period: 12,
      seasonalWindow: 13,
      trendWindow: 21,
      lowpassWindow: 13,
      seasonalDegree: 0,
      trendDegree: 1,
      lowpassDegree: 1,
      seasonalJump: 2,
      trendJump: 3,
      lowpassJump: 2,
      inner: 1,
      outer: 15,
      robust: true,
    });
  });

  it('CSV output has the same columns, empty cells where undefined', () => {
    const r = runCli([
      'decompose',
      AIR,
      '--date',
      'month',
      '--value',
      'passengers',
      '--method',
      'classical',
      '--format',
      'csv',
    ]);
    expect(r.code).toBe(0);
    const lines = r.stdout.trim().split('\n');
    expect(lines[0]).toBe('date,observed,trend,seasonal,remainder');
    expect(lines).toHaveLength(145);
    expect(lines[1].startsWith('1949-01-01,112,,')).toBe(true);
  });

  it('mstl gives one seasonal per period', () => {
    const r = runCli([
      'decompose',
      AIR,
      '--date',
      'month',
      '--value',
      'passengers',
      '--method',
      'mstl',
      '--periods',
      '3,12',
      '--model',
      'additive',
    ]);
    expect(r.code).toBe(0);
    const out = JSON.parse(r.stdout);
    expect(Object.keys(out.seasonals)).toEqual(['3', '12']);
    for (let i = 0; i < 144; i++) {
      const sum = out.trend[i] + out.seasonals['3'][i] + out.seasonals['12'][i] + out.remainder[i];
      expect(Math.abs(sum - out.observed[i])).toBeLessThan(1e-9 * 1000);
    }
    expect(out.settings).toMatchObject({ method: 'mstl', periods: [3, 12], seasonalWindows: [11, 15] });
  });

  const bad: [string, string[], RegExp][] = [
    [
      'fewer than two full periods',
      ['--period', '100'],
      /fewer than two full cycles of period 100 .* — give more data or a shorter period/,
    ],
    ['a period below 2', ['--period', '1'], /^--period must be a whole number of at least 2, got 1 — /],
    [
      'an even seasonal window',
      ['--seasonal-window', '12'],
      /seasonal window 12 must be an odd whole number of at least 7 — use an odd number such as 7, 13 or 23, or periodic/,
    ],
    [
      'a too-small seasonal window',
      ['--seasonal-window', '5'],
      /seasonal window 5 must be an odd whole number of at least 7/,
    ],
    ['an unknown method', ['--method', 'x11'], /unknown method "x11" — use --method classical, stl or mstl/],
    ['an unknown option', ['--colour'], /^unknown option "--colour" — run "trendbrief decompose --help"/],
  ];
  for (const [what, extra, message] of bad) {
    it(`rejects ${what} with one line and exit 2`, () => {
      const r = runCli(['decompose', AIR, '--date', 'month', '--value', 'passengers', ...extra]);
      expect(r.code).toBe(2);
      expect(r.stdout).toBe('');
      expect(r.stderr.trim().split('\n')).toHaveLength(1);
      expect(r.stderr).toMatch(message);
      expect(r.stderr).not.toMatch(/\n\s+at /);
    });
  }

  it('rejects a missing column, listing the columns found', () => {
    const r = runCli(['decompose', AIR, '--date', 'month', '--value', 'pasengers']);
    expect(r.code).toBe(2);
    expect(r.stderr.trim().split('\n')).toHaveLength(1);
    expect(r.stderr).toMatch(/pasengers/);
    expect(r.stderr).toMatch(/month, passengers|"month", "passengers"/);
    expect(r.stderr).toMatch(/passengers/);
  });

  it('rejects a multiplicative model on data with zero or negative values', () => {
    const r = runCli([
      'decompose',
      'test/cli/files/with-zero.csv',
      '--date',
      'month',
      '--value',
      'v',
      '--model',
      'multiplicative',
    ]);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(
      /multiplicative model needs every value above zero.* — use model: additive, or model: auto/,
    );
  });

  it('rejects infinite values', () => {
    const r = runCli(['decompose', 'test/cli/files/with-zero.csv', '--date', 'month', '--value', 'inf']);
    expect(r.code).toBe(2);
    expect(r.stderr.trim().split('\n')).toHaveLength(1);
    expect(r.stderr).toMatch(/with-zero\.csv/);
  });

  it('shows a stack trace only with --debug', () => {
    const r = runCli(['decompose', AIR, '--date', 'month', '--value', 'passengers', '--period', '1', '--debug']);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/\n\s+at /);
  });
});
