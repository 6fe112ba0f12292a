/**
 * Automatic outlier detection (Chen & Liu 1993) on published interventions in open data sets and on a
 * committed seeded simulation (simulate-outliers.ts).
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { autoArima, reselectOrders } from '../../src/model/auto-arima.js';
import { detectOutliers, regressionSe } from '../../src/model/detect-outliers.js';
import { fitArima } from '../../src/model/fit-arima.js';
import { innovationsOperator } from '../../src/model/innovations-operator.js';
import { outlierCriticalValue } from '../../src/model/outlier-critical-value.js';
import { outlierColumn } from '../../src/model/outlier-effects.js';
import { stateSpaceFilter } from '../../src/model/state-space-filter.js';
import { stateSpaceKernel } from '../../src/model/state-space-kernel.js';
import { ROOT } from '../cli/run.js';
import { simulateSeries } from './simulate-outliers.js';

const fx = JSON.parse(readFileSync(new URL('./fixtures/arima.json', import.meta.url), 'utf8')) as {
  cases: { id: string; values: (number | null)[] }[];
};
const series = (id: string) =>
  Float64Array.from(fx.cases.find((c) => c.id === id)!.values, (v) => (v === null ? Number.NaN : v));

// As the brief runs it (adjust/regression-effects.ts): orders chosen once, chosen again only when the first
// candidates change the differencing tests' verdict.
function detectAuto(y: Float64Array, period: number) {
  const first = autoArima(y, period).fit;
  return detectOutliers(y, first.spec, {
    initial: first,
    reselect: (xreg) => reselectOrders(y, period, first.spec, xreg),
  });
}

describe('outlierCriticalValue (Ljung 1993, α = 0.05)', () => {
  it('gives the default critical values X-13ARIMA-SEATS prints (from memory: 3.85 for 120, 3.89 for 144 values)', () => {
    expect(outlierCriticalValue(120)).toBeCloseTo(3.848, 3);
    expect(outlierCriticalValue(144)).toBeCloseTo(3.887, 3);
    expect(outlierCriticalValue(11)).toBeNaN();
  });
});

describe('outlierColumn', () => {
  it('shapes worked by hand', () => {
    expect(Array.from(outlierColumn('AO', 1, 4))).toEqual([0, 1, 0, 0]);
    expect(Array.from(outlierColumn('LS', 2, 5))).toEqual([0, 0, 1, 1, 1]);
    expect(Array.from(outlierColumn('TC', 1, 4, { rate: 0.5 }))).toEqual([0, 1, 0.5, 0.25]);
    expect(Array.from(outlierColumn('RAMP', 1, 5, { until: 3 }))).toEqual([0, 0, 0.5, 1, 1]);
  });
});

describe('published interventions in open data', () => {
  it('UK car drivers killed or seriously injured (datasets::UKDriverDeaths, logarithms): a level shift in February 1983, the seat-belt law (Harvey & Durbin 1986)', () => {
    const y = series('driver-drift').map(Math.log);
    const r = detectAuto(y, 12);
    const ls = r.outliers.filter((o) => o.type === 'LS');
    // Index 169 = February 1983 (series from January 1969). Harvey & Durbin estimate the law's effect at
    // about −0.24 in logarithms (a fall of about a fifth): the detector's estimate is within 0.05 of it.
    expect(ls.map((o) => o.at)).toContain(169);
    const e = ls.find((o) => o.at === 169)!.effect;
    expect(Math.abs(e + 0.24)).toBeLessThan(0.05);
  });
  it('the Nile at Aswan (datasets::Nile): a level shift in 1899 (Cobb 1978), a fall of about 250 (10⁸ m³)', () => {
    const r = detectAuto(series('nile-arima111'), 1);
    const ls = r.outliers.filter((o) => o.type === 'LS');
    expect(ls.map((o) => o.at)).toEqual([28]); // 1871 + 28 = 1899
    expect(Math.abs(ls[0].effect + 250)).toBeLessThan(30); // Cobb (1978): mean 1120 before, about 850 after
  });
});

describe('seeded simulation: planted outliers of 4 to 6 standard deviations', () => {
  it('finds at least 90% with the right type and place, with at most one false detection per 10 series-years', {
    timeout: 120_000,
  }, () => {
    // Orders fixed at ARIMA(1,0,0)(0,1,1)12 (the generator's AR(1) errors around a fixed seasonal pattern)
    // to keep the test short; the brief chooses orders automatically.
    const spec = { p: 1, d: 0, q: 0, P: 0, D: 1, Q: 1, period: 12 };
    const count = 25;
    let planted = 0;
    let found = 0;
    let falses = 0;
    for (let s = 1; s <= count; s++) {
      const sim = simulateSeries(1000 + s);
      const r = detectOutliers(sim.values, spec);
      for (const p of sim.planted) {
        planted++;
        if (r.outliers.some((o) => o.type === p.type && o.at === p.at)) found++;
      }
      // False: a detection at no planted event's place (the period before or after one counts as that event).
      falses += r.outliers.filter((o) => !sim.planted.some((p) => Math.abs(p.at - o.at) <= 1)).length;
    }
    const seriesYears = count * 10;
    expect(found / planted).toBeGreaterThanOrEqual(0.9);
    expect(falses).toBeLessThanOrEqual(seriesYears / 10);
    console.log(
      `planted ${planted}, found with type and place ${found}, false ${falses} in ${seriesYears} series-years`,
    );
  });
});

describe('the search in the state-space kernel', () => {
  it('finds the outliers the JavaScript search finds, bit for bit (with TRENDBRIEF_MODEL_KERNEL=0 in a child)', {
    timeout: 120_000,
  }, () => {
    expect(stateSpaceKernel(), 'the kernel is built by npm run build').not.toBeNull();
    // Simulated series (two with gaps), then the open datasets above: every outlier's type, place, effect
    // and t-value, and the final coefficients, as the bits of their doubles.
    const cases: (number | null)[][] = [];
    for (let s = 1; s <= 8; s++) {
      const v = Array.from(simulateSeries(2000 + s).values, (x): number | null => x);
      if (s % 4 === 0) v[30 + s] = v[61] = null;
      cases.push(v);
    }
    for (const id of ['nile-arima111', 'usacc-airline-gaps']) cases.push(fx.cases.find((c) => c.id === id)!.values);
    const hex = (v: number) => Buffer.from(Float64Array.of(v).buffer).toString('hex');
    const describeAll = (run: (y: Float64Array, period: number) => ReturnType<typeof detectAuto>) =>
      cases.map((c, i) => {
        const r = run(
          Float64Array.from(c, (v) => (v === null ? Number.NaN : v)),
          i === 8 ? 1 : 12,
        );
        return {
          outliers: r.outliers.map((o) => [o.type, o.at, hex(o.effect), hex(o.t)]),
          coef: Array.from(r.fit.coef, hex),
        };
      });
    const here = describeAll(detectAuto);
    const dir = mkdtempSync(join(tmpdir(), 'tb-outliers-'));
    writeFileSync(join(dir, 'cases.json'), JSON.stringify(cases));
    writeFileSync(
      join(dir, 'script.mjs'),
      `import { readFileSync } from 'node:fs';
import { autoArima, reselectOrders } from ${JSON.stringify(join(ROOT, 'dist/model/auto-arima.js'))};
import { detectOutliers } from ${JSON.stringify(join(ROOT, 'dist/model/detect-outliers.js'))};
import { stateSpaceKernel } from ${JSON.stringify(join(ROOT, 'dist/model/state-space-kernel.js'))};
const hex = (v) => Buffer.from(Float64Array.of(v).buffer).toString('hex');
const cases = JSON.parse(readFileSync(process.argv[2], 'utf8'));
const out = cases.map((c, i) => {
  const y = Float64Array.from(c, (v) => (v === null ? Number.NaN : v));
  const period = i === 8 ? 1 : 12;
  const first = autoArima(y, period).fit;
  const r = detectOutliers(y, first.spec, { initial: first, reselect: (xreg) => reselectOrders(y, period, first.spec, xreg) });
  return { outliers: r.outliers.map((o) => [o.type, o.at, hex(o.effect), hex(o.t)]), coef: Array.from(r.fit.coef, hex) };
});
console.log(JSON.stringify({ kernel: stateSpaceKernel() !== null, out }));
`,
    );
    const child = spawnSync(process.execPath, [join(dir, 'script.mjs'), join(dir, 'cases.json')], {
      encoding: 'utf8',
      env: { ...process.env, TRENDBRIEF_MODEL_KERNEL: '0' },
    });
    expect(child.status, child.stderr).toBe(0);
    const there = JSON.parse(child.stdout) as { kernel: boolean; out: typeof here };
    expect(there.kernel).toBe(false);
    expect(here.reduce((k, c) => k + c.outliers.length, 0)).toBeGreaterThanOrEqual(10);
    expect(here).toEqual(there.out);
  });
});

describe('a long series in the state-space kernel', () => {
  it('gives the JavaScript search’s outliers, then lets the grown memory go', { timeout: 120_000 }, () => {
    // 900 periods: three types of patterns take 19 MB of the kernel's memory, past the 16 MiB it keeps.
    const y = Array.from(simulateSeries(3001, 900).values);
    const spec = { p: 1, d: 0, q: 0, P: 0, D: 1, Q: 1, period: 12 };
    const before = stateSpaceKernel();
    const r = detectOutliers(Float64Array.from(y), spec);
    const after = stateSpaceKernel();
    expect(after).not.toBe(before);
    expect(after?.memory.buffer.byteLength).toBeLessThanOrEqual(16 * 1024 * 1024);
    const hex = (v: number) => Buffer.from(Float64Array.of(v).buffer).toString('hex');
    const here = r.outliers.map((o) => [o.type, o.at, hex(o.effect), hex(o.t)]);
    const dir = mkdtempSync(join(tmpdir(), 'tb-outliers-long-'));
    writeFileSync(join(dir, 'y.json'), JSON.stringify(y));
    writeFileSync(
      join(dir, 'script.mjs'),
      `import { readFileSync } from 'node:fs';
import { detectOutliers } from ${JSON.stringify(join(ROOT, 'dist/model/detect-outliers.js'))};
const hex = (v) => Buffer.from(Float64Array.of(v).buffer).toString('hex');
const y = Float64Array.from(JSON.parse(readFileSync(process.argv[2], 'utf8')));
const r = detectOutliers(y, ${JSON.stringify(spec)});
console.log(JSON.stringify(r.outliers.map((o) => [o.type, o.at, hex(o.effect), hex(o.t)])));
`,
    );
    const child = spawnSync(process.execPath, [join(dir, 'script.mjs'), join(dir, 'y.json')], {
      encoding: 'utf8',
      env: { ...process.env, TRENDBRIEF_MODEL_KERNEL: '0' },
    });
    expect(child.status, child.stderr).toBe(0);
    expect(here.length).toBeGreaterThanOrEqual(2); // the two planted events
    expect(here).toEqual(JSON.parse(child.stdout));
  });
});

describe('innovationsOperator', () => {
  it('equals the Kalman filter’s standardised innovations (state-space-filter.ts), gaps included', () => {
    const y = series('usacc-airline-gaps');
    const fit = fitArima(y, { p: 0, d: 1, q: 1, P: 0, D: 1, Q: 1, period: 12 });
    const missing = (t: number) => Number.isNaN(y[t]);
    const op = innovationsOperator(fit.phi, fit.theta, fit.delta, missing, y.length);
    const got = op(y);
    const want = stateSpaceFilter(y, fit.phi, fit.theta, fit.delta).residuals;
    let compared = 0;
    let diffuse = 0;
    for (let t = 0; t < y.length; t++) {
      if (missing(t)) continue;
      // Inside the diffuse start (13 observed values for d = D = 1 at period 12) the operator gives 0.
      if (got[t] === 0 && Math.abs(want[t]) > 0) {
        diffuse++;
        continue;
      }
      compared++;
      expect(Math.abs(got[t] - want[t])).toBeLessThanOrEqual(1e-9 * Math.max(1, Math.abs(want[t])));
    }
    expect(compared).toBeGreaterThan(50);
    expect(diffuse).toBe(13);
    // A column that is zero before T filtered from T gives the same as filtered from the start.
    const col = outlierColumn('LS', 40, y.length);
    const a = op(col);
    const b = op(col, 40);
    for (let t = 0; t < y.length; t++) expect(b[t]).toBe(a[t]);
  });
});

describe('fits of the search without their final filter', () => {
  // The search's fits skip the Kalman filter's final pass; σ² then comes from the innovations operator.
  const y = series('driver-drift').map(Math.log);
  const spec = {
    p: 0,
    d: 1,
    q: 1,
    P: 0,
    D: 1,
    Q: 1,
    period: 12,
    xreg: [outlierColumn('LS', 169, y.length), outlierColumn('AO', 40, y.length)],
  };
  it('give the standard errors of the full fit at the same coefficients (σ² from the operator)', () => {
    const full = fitArima(y, spec);
    const quick = fitArima(y, spec, { fixed: full.coef, quick: true });
    expect(quick.sigma2).toBeNaN();
    const a = regressionSe(y, full);
    const b = regressionSe(y, quick);
    expect(a.length).toBe(2);
    for (let j = 0; j < a.length; j++) expect(Math.abs(b[j] - a[j])).toBeLessThanOrEqual(1e-9 * a[j]);
  });
  it('the result is a complete fit: σ², state and residuals of the final filter at its coefficients', () => {
    const r = detectAuto(y, 12);
    expect(r.outliers.length).toBeGreaterThan(0);
    const again = fitArima(y, r.fit.spec, { fixed: r.fit.coef });
    expect(r.fit.sigma2).toBeGreaterThan(0);
    expect(Math.abs(r.fit.sigma2 - again.sigma2)).toBeLessThanOrEqual(1e-12 * again.sigma2);
    expect(r.fit.residuals.length).toBe(y.length);
    expect(Array.from(r.fit.state)).toEqual(Array.from(again.state));
    // Its standard errors (by the operator the search built, kept for it) are those of a fit made afresh.
    const a = regressionSe(y, r.fit);
    const b = regressionSe(y, again);
    for (let j = 0; j < a.length; j++) expect(Math.abs(a[j] - b[j])).toBeLessThanOrEqual(1e-12 * b[j]);
  });
  it('every outlier kept reaches the critical value in the final fit (backward elimination by GLS, then ML)', () => {
    // A low critical value leaves many candidates to eliminate; the simulated series of the study above.
    const simSpec = { p: 1, d: 0, q: 0, P: 0, D: 1, Q: 1, period: 12 };
    let kept = 0;
    for (let s = 1; s <= 6; s++) {
      const sim = simulateSeries(1000 + s);
      const r = detectOutliers(sim.values, simSpec, { critical: 3 });
      const se = regressionSe(sim.values, r.fit);
      const k = r.fit.regressors.length;
      for (const o of r.outliers) {
        const c = r.fit.names.indexOf(`${o.type}${o.at}`);
        expect(Math.abs(o.t)).toBeGreaterThanOrEqual(3);
        expect(Math.abs(o.t - r.fit.coef[c] / se[c - (r.fit.coef.length - k)])).toBeLessThan(1e-9 * Math.abs(o.t));
        kept++;
      }
    }
    expect(kept).toBeGreaterThan(6);
  });
});
