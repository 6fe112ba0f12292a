/**
 * Checks of the seasonality tests the words report, recomputed from the brief's components:
 *
 * - identifiable seasonality: the seasonal-irregular values against a centred moving average of order
 *   `period` (2×period when even: half weights at both ends), the one-way F of stable seasonality, the
 *   two-way (cycles × seasons) F of moving seasonality on |SI − centre| over whole cycles, the Kruskal–Wallis
 *   H with mid-ranks and the tie correction (values within 1e-9 of the largest magnitude tie), and the
 *   combined verdict of Lothian & Morry (1978) at the published levels (0.1%, 5%, 0.1%; thresholds 7 and 3,
 *   for monthly and quarterly cycles only); p-values by integration (tails.ts). The words must not name a
 *   peak when the verdict is not 'present', and a brief without adjustment must carry no season.
 * - residual seasonality: the one-way F of the adjusted series' period-on-period changes by season over the
 *   last whole cycles, and whether p lies below the level stated.
 */
import type { IdentifiableSeasonalityClaim, ResidualSeasonalityClaim } from '../vocabulary/claims.js';
import type { VerifyContext } from './context.js';
import { chiSquareTail, fTail } from './tails.js';

const LEVELS = { stable: 0.001, moving: 0.05, kruskalWallis: 0.001 };

interface Stat {
  statistic: number;
  df1: number;
  df2: number;
}

/** Sums of squares by group: between = total − within, each from its own pass. */
function oneWay(values: number[], groups: number[]): Stat {
  const byGroup = new Map<number, number[]>();
  values.forEach((v, i) => {
    const g = byGroup.get(groups[i]) ?? [];
    g.push(v);
    byGroup.set(groups[i], g);
  });
  const n = values.length;
  const k = byGroup.size;
  const mean = values.reduce((a, b) => a + b, 0) / n;
  const total = values.reduce((a, v) => a + (v - mean) ** 2, 0);
  let within = 0;
  for (const g of byGroup.values()) {
    const m = g.reduce((a, b) => a + b, 0) / g.length;
    within += g.reduce((a, v) => a + (v - m) ** 2, 0);
  }
  const between = total - within;
  return { statistic: between / (k - 1) / (within / (n - k)), df1: k - 1, df2: n - k };
}

function movingAverage(y: number[], p: number): number[] {
  const h = Math.floor(p / 2);
  const w = (j: number) => (p % 2 === 0 && Math.abs(j) === h ? 0.5 / p : 1 / p);
  return y.map((_, i) => {
    if (i - h < 0 || i + h >= y.length) return Number.NaN;
    let sum = 0;
    for (let j = -h; j <= h; j++) sum += w(j) * y[i + j];
    return sum;
  });
}

function twoWay(cycles: number[][]): Stat {
  const N = cycles.length;
  const k = cycles[0].length;
  const all = cycles.flat();
  const grand = all.reduce((a, b) => a + b, 0) / all.length;
  const total = all.reduce((a, v) => a + (v - grand) ** 2, 0);
  const rows = cycles.reduce((a, c) => a + k * (c.reduce((x, y) => x + y, 0) / k - grand) ** 2, 0);
  let cols = 0;
  for (let j = 0; j < k; j++) cols += N * (cycles.reduce((a, c) => a + c[j], 0) / N - grand) ** 2;
  const residual = total - rows - cols;
  return { statistic: rows / (N - 1) / (residual / ((N - 1) * (k - 1))), df1: N - 1, df2: (N - 1) * (k - 1) };
}

function kruskal(values: number[], groups: number[]): { statistic: number; df: number } {
  const n = values.length;
  const order = values.map((_, i) => i).sort((a, b) => values[a] - values[b]);
  const tol = 1e-9 * Math.max(...values.map(Math.abs));
  const rank = new Array<number>(n);
  let ties = 0;
  for (let i = 0; i < n; ) {
    let j = i;
    while (j + 1 < n && values[order[j + 1]] - values[order[i]] <= tol) j++;
    for (let m = i; m <= j; m++) rank[order[m]] = (i + j + 2) / 2;
    ties += (j - i + 1) ** 3 - (j - i + 1);
    i = j + 1;
  }
  const sums = new Map<number, { r: number; c: number }>();
  rank.forEach((r, i) => {
    const g = sums.get(groups[i]) ?? { r: 0, c: 0 };
    g.r += r;
    g.c++;
    sums.set(groups[i], g);
  });
  let h = 0;
  for (const g of sums.values()) h += (g.r * g.r) / g.c;
  h = ((12 / (n * (n + 1))) * h - 3 * (n + 1)) / (1 - ties / (n ** 3 - n));
  return { statistic: h, df: sums.size - 1 };
}

const close = (a: number, b: number, rel: number) =>
  (Number.isNaN(a) && Number.isNaN(b)) || Math.abs(a - b) <= rel * Math.max(Math.abs(a), Math.abs(b), 1e-300);
/** p-values: within 1e-6 relative, or both below 1e-250 (where neither is computed to any relative accuracy). */
const pClose = (a: number, b: number) => close(a, b, 1e-6) || (a < 1e-250 && b < 1e-250);

function compareF(
  name: string,
  stated: { statistic: number; df1: number; df2: number; pValue: number },
  s: Stat,
  p: number,
) {
  const out: string[] = [];
  if (stated.df1 !== s.df1 || stated.df2 !== s.df2)
    out.push(`${name}: degrees of freedom ${stated.df1}, ${stated.df2}; recomputed ${s.df1}, ${s.df2}`);
  if (!close(stated.statistic, s.statistic, 1e-9))
    out.push(`${name}: F ${stated.statistic}, recomputed ${s.statistic}`);
  if (!pClose(stated.pValue, p)) out.push(`${name}: p ${stated.pValue}, recomputed ${p}`);
  return out;
}

export function checkIdentifiableSeasonality(c: IdentifiableSeasonalityClaim, ctx: VerifyContext): string[] {
  const { s } = ctx;
  const out: string[] = [];
  const mult = s.settings.model === 'multiplicative';
  if (c.multiplicative !== mult)
    out.push(`tests ${c.multiplicative ? 'ratios' : 'differences'} for a ${s.settings.model} model`);
  if (!s.settings.periods.includes(c.period)) out.push(`tests a period of ${c.period}, not one of the decomposition's`);
  const y = s.components.observed;
  const trend = movingAverage(y, c.period);
  const si = y.map((v, i) => (mult ? (100 * v) / trend[i] : v - trend[i]));
  const vals: number[] = [];
  const groups: number[] = [];
  si.forEach((v, i) => {
    if (Number.isFinite(v)) {
      vals.push(v);
      groups.push(i % c.period);
    }
  });
  const stable = oneWay(vals, groups);
  const pStable = fTail(stable.statistic, stable.df1, stable.df2);
  out.push(...compareF('stable seasonality', c.stable, stable, pStable));
  // Whole cycles from the first defined value.
  const first = si.findIndex((v) => Number.isFinite(v));
  const cycles: number[][] = [];
  for (let i = first; i >= 0 && i + c.period <= si.length; i += c.period) {
    const row = si.slice(i, i + c.period).map((v) => Math.abs(v - (mult ? 100 : 0)));
    if (row.every(Number.isFinite)) cycles.push(row);
  }
  const moving = cycles.length >= 2 ? twoWay(cycles) : { statistic: Number.NaN, df1: Number.NaN, df2: Number.NaN };
  const pMoving = cycles.length >= 2 ? fTail(moving.statistic, moving.df1, moving.df2) : Number.NaN;
  if (cycles.length >= 2) out.push(...compareF('moving seasonality', c.moving, moving, pMoving));
  else if (Number.isFinite(c.moving.statistic)) out.push('states a moving-seasonality F without two whole cycles');
  const kw = kruskal(vals, groups);
  const pKw = chiSquareTail(kw.statistic, kw.df);
  if (c.kruskalWallis.df !== kw.df || !close(c.kruskalWallis.statistic, kw.statistic, 1e-9))
    out.push(
      `Kruskal–Wallis H ${c.kruskalWallis.statistic} (${c.kruskalWallis.df} df), recomputed ${kw.statistic} (${kw.df})`,
    );
  if (!pClose(c.kruskalWallis.pValue, pKw)) out.push(`Kruskal–Wallis p ${c.kruskalWallis.pValue}, recomputed ${pKw}`);
  for (const key of ['stable', 'moving', 'kruskalWallis'] as const)
    if (c.levels[key] !== LEVELS[key])
      out.push(`states the ${key} level as ${c.levels[key]}; the test's is ${LEVELS[key]}`);
  const thresholds = c.period === 12 || c.period === 4;
  if (c.thresholds !== thresholds)
    out.push(`says the T1/T2 thresholds ${c.thresholds ? 'apply' : 'do not apply'} to a period of ${c.period}`);
  const t1 = 7 / stable.statistic;
  const t2 = (3 * moving.statistic) / stable.statistic;
  let verdict: IdentifiableSeasonalityClaim['verdict'] = 'present';
  if (!(pStable < LEVELS.stable)) verdict = 'none';
  else if (thresholds && pMoving < LEVELS.moving && (t1 + t2) / 2 >= 1) verdict = 'none';
  else if (thresholds && (t1 >= 1 || t2 >= 1)) verdict = 'probably-none';
  else if (!(pKw < LEVELS.kruskalWallis)) verdict = 'probably-none';
  if (verdict !== c.verdict) out.push(`says seasonality is ${c.verdict}; the combined test gives ${verdict}`);
  const text = ctx.statement.text;
  if (c.verdict !== 'present') {
    if (/\bpeak (is|was)\b/.test(text)) out.push('names a peak for a pattern that is not identifiable');
    if (!/[Nn]o clear [\w-]+ pattern/.test(text)) out.push('does not say the pattern cannot be identified');
    if (!/0[.,]1\s?%/.test(text)) out.push('does not state the test level');
  } else if (!/test for a real seasonal pattern finds one/.test(text))
    out.push('does not say the pattern is identifiable');
  if (c.adjusted !== s.settings.seasonalAdjustment.applied)
    out.push(`says the data are ${c.adjusted ? '' : 'not '}adjusted; the settings say otherwise`);
  if (!s.settings.seasonalAdjustment.applied) {
    if (c.verdict === 'present') out.push('an identifiable pattern was not removed');
    const neutral = mult ? 1 : 0;
    const k = s.components;
    for (let i = 0; i < k.observed.length; i++) {
      // Unadjusted for season, the adjusted series is the data, less (over) a calendar effect if any.
      const y = k.calendar ? (mult ? k.observed[i] / k.calendar[i] : k.observed[i] - k.calendar[i]) : k.observed[i];
      const same = Object.is(k.adjusted[i], y) || k.adjusted[i] === y;
      if (k.seasonal[i] !== neutral || !same) {
        out.push(`unadjusted, yet the components carry a season at ${k.dates[i]}`);
        break;
      }
    }
  }
  return out;
}

export function checkResidualSeasonality(c: ResidualSeasonalityClaim, ctx: VerifyContext): string[] {
  const { s } = ctx;
  const out: string[] = [];
  if (c.period !== s.settings.period) out.push(`tests a period of ${c.period}, not the main one`);
  if (!s.settings.seasonalAdjustment.applied) out.push('tests residual seasonality of data that were not adjusted');
  const a = s.components.adjusted;
  const vals: number[] = [];
  const groups: number[] = [];
  for (let t = Math.max(1, a.length - c.cycles * c.period); t < a.length; t++) {
    const d = a[t] - a[t - 1];
    if (Number.isFinite(d)) {
      vals.push(d);
      groups.push(t % c.period);
    }
  }
  const f = oneWay(vals, groups);
  const p = fTail(f.statistic, f.df1, f.df2);
  out.push(...compareF('residual seasonality', c.test, f, p));
  if (c.present !== p < c.level) out.push(`says seasonality is ${c.present ? '' : 'not '}left; p = ${p} at ${c.level}`);
  const text = ctx.statement.text;
  const said = c.present ? /Some of the season is still left/.test(text) : /No season is left/.test(text);
  if (!said) out.push('the words do not say whether seasonality is left');
  const level = `${Number((100 * c.level).toPrecision(3))}`.replace('.', '[.,]');
  if (!new RegExp(`\\b${level}\\s?%`).test(text)) out.push('does not state the test level');
  return out;
}
