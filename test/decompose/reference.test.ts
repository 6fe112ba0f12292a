/**
 * Reference checks against R: every case in test/reference/fixtures/ (written by test/reference/generate.R
 * with R 4.2, forecast 8.20) is recomputed here and compared point by point.
 * Tolerances: classical decomposition is a handful of sums and divisions, so it must agree to rounding,
 * |a − b| ≤ 1e-9·max(1, |b|). STL and MSTL run thousands of loess fits whose sums are taken in a different
 * order from the Fortran; they agree to about 1e-13 of the range (largest disagreement over all fixtures,
 * measured when the tolerance was set: 7e-14 × (max − min of the input series) for STL's components, 1.2e-13
 * for MSTL's, 3e-12 for STL's robustness weights, which lie in [0, 1]) and must agree within 1e-10 × (max −
 * min of the input series) at every point (the weights within 1e-10).
 * Undefined points (R's NA, our NaN) must be exactly the same set.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { classicalDecomposition } from '../../src/decompose/classical.js';
import { defaultMstlWindows, mstl } from '../../src/decompose/mstl.js';
import { select, stl, stlSettings } from '../../src/decompose/stl.js';
import { fUpperTail } from '../../src/diagnose/f-distribution.js';
import { robustScale } from '../../src/diagnose/robust-scale.js';

type Num = number | null;
interface Fixture<C> {
  description: string;
  generator: string;
  cases: C[];
}
interface ClassicalCase {
  id: string;
  source: string;
  call: string;
  model: 'additive' | 'multiplicative';
  period: number;
  values: Num[];
  trend: Num[];
  seasonal: Num[];
  random: Num[];
  figure: Num[];
}
interface Triple {
  s: number;
  t: number;
  l: number;
}
interface StlCase {
  id: string;
  source: string;
  call: string;
  period: number;
  periodic: boolean;
  robust: boolean;
  win: Triple;
  deg: Triple;
  jump: Triple;
  inner: number;
  outer: number;
  values: Num[];
  trend: Num[];
  seasonal: Num[];
  remainder: Num[];
  weights: Num[];
}
interface MstlCase {
  id: string;
  source: string;
  call: string;
  periods: number[];
  s_window: number[];
  iterate: number;
  robust: boolean;
  values: Num[];
  trend: Num[];
  seasonals: Record<string, Num[]>;
  remainder: Num[];
}
interface RobustCase {
  vectors: Num[][];
  median: Num[];
  mad: Num[];
  mad_raw: Num[];
}
interface PfCase {
  q: number[];
  df1: number[];
  df2: number[];
  upper: number[];
}

function load<C>(name: string): Fixture<C> {
  const url = new URL(`../reference/fixtures/${name}.json`, import.meta.url);
  return JSON.parse(readFileSync(url, 'utf8')) as Fixture<C>;
}

/** JSON null (R's NA) becomes NaN. */
function f64(values: Num[]): Float64Array {
  return Float64Array.from(values, (v) => (v === null ? Number.NaN : v));
}

function range(values: Float64Array): number {
  let lo = Number.POSITIVE_INFINITY;
  let hi = Number.NEGATIVE_INFINITY;
  for (const v of values) {
    if (Number.isNaN(v)) continue;
    lo = Math.min(lo, v);
    hi = Math.max(hi, v);
  }
  return hi - lo;
}

/**
 * Compares point by point; returns a description of the first few disagreements (empty when all agree), so
 * that a failure names the component, the index and both values.
 */
function disagreements(name: string, ours: Float64Array, theirs: Num[], tolerance: (b: number) => number): string[] {
  const out: string[] = [];
  if (ours.length !== theirs.length) return [`${name}: length ${ours.length}, R has ${theirs.length}`];
  for (let i = 0; i < ours.length && out.length < 5; i++) {
    const a = ours[i];
    const b = theirs[i];
    if (b === null || Number.isNaN(a)) {
      if (!(b === null && Number.isNaN(a))) out.push(`${name}[${i}]: ours ${a}, R ${b}`);
      continue;
    }
    if (!(Math.abs(a - b) <= tolerance(b))) out.push(`${name}[${i}]: ours ${a}, R ${b}, diff ${a - b}`);
  }
  return out;
}

const relative = (b: number): number => 1e-9 * Math.max(1, Math.abs(b));

/** STL and MSTL: the largest disagreement allowed, as a fraction of the input series' range. */
const TOLERANCE = 1e-10;

describe('stats::decompose (R) — classical decomposition', () => {
  for (const c of load<ClassicalCase>('classical').cases) {
    it(`${c.call} on ${c.id} (${c.source.split(': ')[0]})`, () => {
      const r = classicalDecomposition(f64(c.values), c.period, { model: c.model });
      const problems = [
        ...disagreements('trend', r.trend, c.trend, relative),
        ...disagreements('seasonal', r.seasonal, c.seasonal, relative),
        ...disagreements('remainder', r.remainder, c.random, relative),
        ...disagreements('figure', r.figure, c.figure, relative),
      ];
      expect(problems).toEqual([]);
    });
  }
});

describe('stats::stl (R) — STL', () => {
  for (const c of load<StlCase>('stl').cases) {
    it(`${c.call} on ${c.id} (${c.source.split(': ')[0]})`, () => {
      const values = f64(c.values);
      // Only the arguments the R call named; the rest must come out of our defaults as R's did.
      const options = {
        period: c.period,
        seasonalWindow: c.periodic ? ('periodic' as const) : c.win.s,
        robust: c.robust,
        ...explicitStlOptions(c),
      };
      const settings = stlSettings(values.length, options);
      expect({
        s: settings.seasonalWindow === 'periodic' ? 10 * values.length + 1 : settings.seasonalWindow,
        t: settings.trendWindow,
        l: settings.lowpassWindow,
        degS: settings.seasonalDegree,
        degT: settings.trendDegree,
        degL: settings.lowpassDegree,
        jumpS: settings.seasonalJump,
        jumpT: settings.trendJump,
        jumpL: settings.lowpassJump,
        inner: settings.inner,
        outer: settings.outer,
      }).toEqual({
        s: c.win.s,
        t: c.win.t,
        l: c.win.l,
        degS: c.deg.s,
        degT: c.deg.t,
        degL: c.deg.l,
        jumpS: c.jump.s,
        jumpT: c.jump.t,
        jumpL: c.jump.l,
        inner: c.inner,
        outer: c.outer,
      });
      const r = stl(values, options);
      const tol = TOLERANCE * range(values);
      const abs = (): number => tol;
      const problems = [
        ...disagreements('trend', r.trend, c.trend, abs),
        ...disagreements('seasonal', r.seasonal, c.seasonal, abs),
        ...disagreements('remainder', r.remainder, c.remainder, abs),
        // Weights lie in [0, 1]: the same tolerance, on their own scale.
        ...disagreements('weights', r.weights, c.weights, () => TOLERANCE),
      ];
      expect(problems).toEqual([]);
    });
  }
});

describe('stats::stl (R) — robust fits need the Fortran partial sort', () => {
  // R's stl takes the robustness scale from a partial sort asked for its two middle positions in
  // descending order (partial-sort.ts), which is not always the true median. If no robust fixture told the
  // two apart, the checks above would not show that we follow R there.
  it('at least one robust fixture is matched only with the partial sort, not with the true median', () => {
    const robust = load<StlCase>('stl').cases.filter((c) => c.robust);
    const departs = robust.filter((c) => {
      const values = f64(c.values);
      const options = {
        period: c.period,
        seasonalWindow: c.periodic ? ('periodic' as const) : c.win.s,
        robust: true,
        trueMedian: true,
        ...explicitStlOptions(c),
      };
      const r = stl(values, options);
      // Far beyond rounding: ten thousand times the tolerance the partial sort is held to.
      const tol = 1e-6 * range(values);
      return disagreements('trend', r.trend, c.trend, () => tol).length > 0;
    });
    expect(departs.length).toBeGreaterThan(0);
  });
});

/** The options an R call set explicitly, read back from its recorded call text. */
function explicitStlOptions(c: StlCase): Record<string, number> {
  const named = (arg: string): boolean => new RegExp(`\\b${arg.replace('.', '\\.')} =`).test(c.call);
  const out: Record<string, number> = {};
  if (named('s.degree')) out.seasonalDegree = c.deg.s;
  if (named('t.window')) out.trendWindow = c.win.t;
  if (named('t.degree')) out.trendDegree = c.deg.t;
  if (named('l.window')) out.lowpassWindow = c.win.l;
  if (named('l.degree')) out.lowpassDegree = c.deg.l;
  if (named('s.jump')) out.seasonalJump = c.jump.s;
  if (named('t.jump')) out.trendJump = c.jump.t;
  if (named('l.jump')) out.lowpassJump = c.jump.l;
  if (named('inner')) out.inner = c.inner;
  if (named('outer')) out.outer = c.outer;
  return out;
}

describe('forecast::mstl (R) — multiple seasonal STL', () => {
  const fixture = load<MstlCase>('mstl') as Fixture<MstlCase> & { default_s_window: number[] };
  it('our default seasonal windows are the default s.window of forecast::mstl (7 + 4·seq(6) in 8.20)', () => {
    expect(defaultMstlWindows(fixture.default_s_window.length)).toEqual(fixture.default_s_window);
  });
  for (const c of fixture.cases) {
    it(`${c.call} on ${c.id} (${c.source.split(': ')[0]})`, () => {
      const values = f64(c.values);
      const r = mstl(values, {
        periods: c.periods,
        seasonalWindows: c.s_window,
        iterations: c.iterate,
        robust: c.robust,
      });
      expect(r.periods).toEqual(c.periods);
      const tol = TOLERANCE * range(values);
      const abs = (): number => tol;
      const problems = [
        ...disagreements('trend', r.trend, c.trend, abs),
        ...disagreements('remainder', r.remainder, c.remainder, abs),
      ];
      for (const p of c.periods) {
        const ours = r.seasonals.get(p);
        expect(ours, `seasonal component for period ${p}`).toBeDefined();
        problems.push(...disagreements(`seasonal${p}`, ours as Float64Array, c.seasonals[String(p)], abs));
      }
      expect(problems).toEqual([]);
    });
  }
});

describe('stats::median and stats::mad (R) — the selection STL uses for medians', () => {
  const robust = load<RobustCase & { id: string }>('distributions').cases.find((c) => c.id === 'median-mad');
  /** Median by quickselect: the k-th smallest, and for even n the mean with the largest value below it. */
  const medianOf = (v: Float64Array): number => {
    const a = Float64Array.from(v);
    const n = a.length;
    const upper = select(a, n >> 1);
    if (n % 2 === 1) return upper;
    let lower = Number.NEGATIVE_INFINITY;
    for (let i = 0; i < n >> 1; i++) lower = Math.max(lower, a[i]);
    return (lower + upper) / 2;
  };
  it('fixture present', () => expect(robust).toBeDefined());
  robust?.vectors.forEach((vector, i) => {
    it(`median and mad(constant = 1) of vector ${i} (length ${vector.length})`, () => {
      const v = f64(vector);
      const med = medianOf(v);
      expect(Math.abs(med - (robust.median[i] as number))).toBeLessThanOrEqual(1e-12 * Math.max(1, Math.abs(med)));
      const dev = v.map((x) => Math.abs(x - med));
      const mad = medianOf(dev);
      expect(Math.abs(mad - (robust.mad_raw[i] as number))).toBeLessThanOrEqual(1e-12 * Math.max(1, Math.abs(mad)));
    });
  });
});

// The same fixture file serves the residual-seasonality F test and the robust scale in src/diagnose/; they
// are checked here so that every fixture generate.R writes is used (they may move to test/diagnose/).
describe('stats::pf (R) — F distribution upper tail used by the residual-seasonality test', () => {
  const grid = load<PfCase & { id: string }>('distributions').cases.find((c) => c.id === 'pf-grid') as PfCase;
  it(`pf(q, df1, df2, lower.tail = FALSE) on ${grid.q.length} grid points, within 1e-10`, () => {
    // A probability: 1e-10 absolute is far below any p-value we report yet well above the continued
    // fraction's 1e-15 stopping rule.
    const problems: string[] = [];
    grid.q.forEach((q, i) => {
      const ours = fUpperTail(q, grid.df1[i], grid.df2[i]);
      if (!(Math.abs(ours - grid.upper[i]) <= 1e-10)) {
        problems.push(`F=${q}, df=(${grid.df1[i]}, ${grid.df2[i]}): ours ${ours}, R ${grid.upper[i]}`);
      }
    });
    expect(problems).toEqual([]);
  });
});

describe('stats::median and stats::mad (R) — robustScale', () => {
  const robust = load<RobustCase & { id: string }>('distributions').cases.find(
    (c) => c.id === 'median-mad',
  ) as RobustCase;
  robust.vectors.forEach((vector, i) => {
    it(`median and mad (constant 1.4826) of vector ${i} (length ${vector.length})`, () => {
      const s = robustScale(f64(vector));
      expect(Math.abs(s.median - (robust.median[i] as number))).toBeLessThanOrEqual(relative(s.median) * 1e-3);
      expect(Math.abs(s.mad - (robust.mad[i] as number))).toBeLessThanOrEqual(relative(s.mad) * 1e-3);
    });
  });
});
