/**
 * Forecast extension before decomposition (src/adjust/extend.ts, src/brief/extended.ts). The series are
 * open data sets that ship with R (values in test/model/fixtures/arima.json, written by
 * test/model/generate.R); the gain in firmness itself is measured by bench/extension-study.js.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { describeModel, extendSeries } from '../../src/adjust/extend.js';
import { decomposeExtended } from '../../src/brief/extended.js';
import { EXTEND_BY_DEFAULT, emptyDecompositionSpec, resolveDecomposition } from '../../src/job/resolve.js';

const cases = JSON.parse(readFileSync(new URL('../model/fixtures/arima.json', import.meta.url), 'utf8')).cases as {
  id: string;
  values: number[];
}[];
const usAccDeaths = Float64Array.from(cases.find((c) => c.id === 'usacc-airline')!.values);

function settingsFor(values: Float64Array, extend: 'on' | 'off' | number) {
  return resolveDecomposition({ ...emptyDecompositionSpec(), model: 'additive', extend }, values, 'monthly', {});
}

describe('decomposeExtended', () => {
  it('keeps components up to the last observation, with observed = trend + seasonal + remainder to 1e-9', () => {
    const s = settingsFor(usAccDeaths, 'on');
    expect(s.extension).toMatchObject({ on: true, horizon: 12, kind: 'arima-on-adjusted' });
    const { d, extension } = decomposeExtended(usAccDeaths, s);
    expect(extension?.added).toBe(12);
    expect(extension?.description).toMatch(/^ARIMA\(\d,\d,\d\).* on the seasonally adjusted series/);
    expect(d.trend.length).toBe(usAccDeaths.length);
    const range = Math.max(...usAccDeaths) - Math.min(...usAccDeaths);
    for (let t = 0; t < usAccDeaths.length; t++) {
      expect(Math.abs(d.trend[t] + d.seasonal[t] + d.remainder[t] - usAccDeaths[t])).toBeLessThanOrEqual(1e-9 * range);
    }
  });

  it('changes the end of the trend far more than the middle (the seasonal smoother spans every year)', () => {
    const on = decomposeExtended(usAccDeaths, settingsFor(usAccDeaths, 'on')).d.trend;
    const off = decomposeExtended(usAccDeaths, settingsFor(usAccDeaths, 'off')).d.trend;
    const n = usAccDeaths.length;
    const end = Math.abs(on[n - 1] - off[n - 1]);
    expect(end).toBeGreaterThan(1);
    expect(Math.abs(on[20] - off[20])).toBeLessThan(end / 10);
  });

  it('re-estimates the chosen orders on a shorter series instead of selecting again', () => {
    const s = settingsFor(usAccDeaths, 'on');
    const first = decomposeExtended(usAccDeaths, s).extension!;
    const again = decomposeExtended(usAccDeaths.subarray(0, 60), s, first.model).extension!;
    expect(again.model?.spec).toEqual(first.model?.spec);
    expect(again.added).toBe(12);
  });
});

describe('extendSeries: bad input is skipped with a reason, never a crash', () => {
  it('too short for a model', () => {
    const e = extendSeries(Float64Array.from([1, 2, 3, 4, 5, 6, 7, 8, 9, 10]), {
      periods: [4],
      horizon: 4,
      multiplicative: false,
      kind: 'seasonal-arima',
    });
    expect(e.added).toBe(0);
    expect(e.skipped).toMatch(/too few/);
  });
  it('a constant series', () => {
    const e = extendSeries(new Float64Array(60).fill(5), {
      periods: [12],
      horizon: 12,
      multiplicative: false,
      kind: 'seasonal-arima',
    });
    expect(e.skipped).toBe('the series is constant');
  });
  it('logarithms of zero', () => {
    const v = Float64Array.from(usAccDeaths);
    v[3] = 0;
    const e = extendSeries(v, { periods: [12], horizon: 12, multiplicative: true, kind: 'seasonal-arima' });
    expect(e.skipped).toMatch(/zero or negative/);
  });
});

describe('extendSeries: a model that does not fit the series is skipped with a reason', () => {
  const quarterly = Float64Array.from({ length: 13 }, (_, i) => 100 + i + 5 * Math.sin((Math.PI * i) / 2));
  const seasonal = (p: number, q: number, P: number, Q: number, coef: number[]) => ({
    kind: 'seasonal-arima' as const,
    spec: { p, d: 0, q, P, D: 1, Q, period: 4 },
    coef: Float64Array.from(coef),
    log: false,
  });
  it('too short for the orders chosen on the whole series (a cut of the firmness study)', () => {
    // (2,0,2)(2,1,2)4: 8 coefficients, 4 values lost to the seasonal difference; 13 − 4 = 9 < 8 + 2 (fit-arima.ts
    // needs two more values than coefficients). 13 is above the 12 (2 × 4 + 4) extendSeries asks of any series.
    const e = extendSeries(quarterly, {
      periods: [4],
      horizon: 4,
      multiplicative: false,
      reuse: seasonal(2, 2, 2, 2, [0.1, 0, 0.1, 0, 0.1, 0, 0.1, 0]),
    });
    expect(e.added).toBe(0);
    expect(e.values).toBe(quarterly);
    expect(e.skipped).toBe(
      'the series is too short for a forecasting model: 13 values are too few for this model (8 coefficients, 4 lost to differencing)',
    );
  });
  it('kept coefficients that are non-stationary or non-invertible', () => {
    // 1 − 1.2z has its root at 1/1.2, inside the unit circle; 1 + 1.5z likewise.
    for (const coef of [
      [1.2, 0],
      [0.3, 1.5],
    ]) {
      const e = extendSeries(quarterly, {
        periods: [4],
        horizon: 4,
        multiplicative: false,
        reuse: seasonal(1, 1, 0, 0, coef),
        fixed: true,
      });
      expect(e.added).toBe(0);
      expect(e.skipped).toBe('the model is non-stationary or non-invertible, so its forecasts would not settle');
    }
  });
  it('an optimiser that cannot evaluate the likelihood (values whose squares overflow)', () => {
    const huge = Float64Array.from(usAccDeaths, (v) => v * 1e160);
    const first = extendSeries(usAccDeaths, {
      periods: [12],
      horizon: 12,
      multiplicative: false,
      kind: 'seasonal-arima',
    });
    const e = extendSeries(huge, { periods: [12], horizon: 12, multiplicative: false, reuse: first.model! });
    expect(e.added).toBe(0);
    expect(e.skipped).toBe('the model could not be estimated (the optimiser failed)');
    // Selecting a model afresh on it fails the same way, as a reason rather than a crash.
    const fresh = extendSeries(huge, { periods: [12], horizon: 12, multiplicative: false, kind: 'seasonal-arima' });
    expect(fresh.added).toBe(0);
    expect(fresh.skipped).not.toBeNull();
  });
});

describe('describeModel', () => {
  it('names orders, constant and scale', () => {
    expect(
      describeModel({
        kind: 'seasonal-arima',
        spec: { p: 0, d: 1, q: 1, P: 0, D: 1, Q: 1, period: 12 },
        coef: new Float64Array(2),
        log: true,
      }),
    ).toBe('ARIMA(0,1,1)(0,1,1)12, on logarithms');
  });
});

describe('the job setting', () => {
  it('auto follows EXTEND_BY_DEFAULT; on and a number turn it on', () => {
    const v = Float64Array.from({ length: 800 }, (_, i) => 10 + Math.sin(i / 3) + i / 100);
    const at = (f: 'monthly' | 'quarterly' | 'daily' | 'weekly' | 'hourly') =>
      resolveDecomposition({ ...emptyDecompositionSpec(), model: 'additive', extend: 'auto' }, v, f, {}).extension.on;
    const all = ['monthly', 'quarterly', 'daily', 'weekly', 'hourly'] as const;
    expect(all.map(at)).toEqual(all.map((f) => EXTEND_BY_DEFAULT.includes(f)));
    // bench/EXTENSION-STUDY.md: only monthly data met the rule (median revision 39% smaller, 12 of 13 series).
    expect(EXTEND_BY_DEFAULT).toEqual(['monthly']);
    const on = resolveDecomposition({ ...emptyDecompositionSpec(), extend: 'on' }, v, 'weekly', {}).extension;
    expect(on).toMatchObject({ on: true, horizon: 52 });
    const six = resolveDecomposition({ ...emptyDecompositionSpec(), extend: 6 }, v, 'monthly', {}).extension;
    expect(six).toMatchObject({ on: true, horizon: 6 });
  });
  it('the model: a seasonal ARIMA for a weekly cycle of daily data alone, else on the adjusted series', () => {
    const v = Float64Array.from({ length: 800 }, (_, i) => 10 + Math.sin(i / 3) + i / 100);
    const kind = (f: 'monthly' | 'quarterly' | 'daily', method: 'stl' | 'mstl' = 'stl') =>
      resolveDecomposition({ ...emptyDecompositionSpec(), method, extend: 'on' }, v, f, {}).extension.kind;
    expect(kind('daily')).toBe('seasonal-arima');
    expect(kind('daily', 'mstl')).toBe('arima-on-adjusted');
    // Quarterly data: 10% against 4% for a seasonal ARIMA in the study.
    expect(kind('quarterly')).toBe('arima-on-adjusted');
    expect(kind('monthly')).toBe('arima-on-adjusted');
  });
  it('more forecasts than values is a located error', () => {
    expect(() =>
      resolveDecomposition({ ...emptyDecompositionSpec(), extend: 500 }, usAccDeaths, 'monthly', (k) => ({
        file: 'job.yaml',
        line: 7,
        column: 5,
        field: k,
      })),
    ).toThrow(/extend: 500 asks for more forecasts than the series has values \(72\)/);
  });
});
