/**
 * The gain of forecast extension, measured: on the open series of bench/data/extension-study.json (written
 * by bench/extension-data.R), a real-time revision study of the trend's year-over-year change, with and
 * without extension, through the brief's own decomposition (resolveDecomposition + runDecomposition with
 * the job defaults) and the brief's extension (src/adjust/extend.ts).
 *
 * For each cut c the series is decomposed as it stood at c (first estimate of the trend's yearly change at
 * c) and the same change is read from the decomposition of the whole series (settled estimate). Cuts run
 * over the K periods that end one year (the settling distance S) before the last observation, so the settled
 * estimate is not itself at the end: K = 24 monthly, 12 quarterly; daily series (three years only) take
 * cuts every 7th day over the year before the last 60 days and a weekly STL, the brief's default for daily
 * data. Each arm compares its first estimates with its own settled estimates. Arms:
 *   none      no extension
 *   auto      a seasonal ARIMA on the series (the brief's model for a weekly cycle of daily data)
 *   adjusted  a non-seasonal ARIMA on the seasonally adjusted series, seasonal pattern carried forward
 *             (the brief's model for monthly, quarterly and every longer period)
 * In both, orders are selected on the series up to the last observation (as a brief does) and the
 * coefficients re-estimated at each cut.
 *
 * The default (src/job/resolve.ts EXTEND_BY_DEFAULT) follows one rule, printed at the end: extension is on
 * by default for a frequency when, with the brief's model for it, the median series' revision is at least
 * 25% smaller (the goal the work was set), it is smaller on at least two thirds of the series, and at least
 * five series of that frequency were measured.
 *
 *   npm run build && node bench/extension-study.js [--write]
 */
import { readFileSync, writeFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { extendSeries } from '../dist/adjust/extend.js';
import { percentChange } from '../dist/analyse/change.js';
import { runDecomposition } from '../dist/decompose/index.js';
import { emptyDecompositionSpec, resolveDecomposition } from '../dist/job/resolve.js';
import { yearLag } from '../dist/vocabulary/period-index.js';

const root = join(dirname(fileURLToPath(import.meta.url)), '..');
const data = JSON.parse(readFileSync(join(root, 'bench/data/extension-study.json'), 'utf8'));

function horizonFor(frequency, periods) {
  return Math.min(yearLag(frequency), 2 * Math.max(...periods));
}

function trendWith(values, settings, arm, reuse) {
  const n = values.length;
  if (arm === 'none') return { trend: runDecomposition(values, settings).trend, ext: null };
  const mult = settings.model === 'multiplicative';
  const options = {
    periods: settings.periods,
    horizon: horizonFor(settings.frequency, settings.periods),
    multiplicative: mult,
  };
  if (arm === 'adjusted') {
    options.kind = 'arima-on-adjusted';
    options.seasonal = runDecomposition(values, settings).seasonal;
  }
  if (reuse) options.reuse = reuse;
  const ext = extendSeries(values, options);
  const d = runDecomposition(ext.values, settings);
  return { trend: d.trend.subarray(0, n), ext };
}

const median = (xs) => {
  const s = [...xs].filter((x) => Number.isFinite(x)).sort((a, b) => a - b);
  if (s.length === 0) return Number.NaN;
  const h = (s.length - 1) / 2;
  return (s[Math.floor(h)] + s[Math.ceil(h)]) / 2;
};

const rows = [];
const started = performance.now();
for (const s of data.series) {
  const values = Float64Array.from(s.values, (v) => (v === null ? Number.NaN : v));
  const n = values.length;
  const frequency = s.frequency;
  const lag = yearLag(frequency);
  const daily = frequency === 'daily';
  const settings0 = resolveDecomposition(emptyDecompositionSpec(), values, frequency, {});
  const settings = { ...settings0, frequency };
  const settle = daily ? 60 : lag;
  const K = daily ? 365 : frequency === 'monthly' ? 24 : 12;
  const step = daily ? 7 : 1;
  const last = n - 1 - settle;
  const first = Math.max(last - K + 1, 2 * lag);
  const result = { id: s.id, frequency, n, model: '', skipped: '', mar: {} };
  for (const arm of ['none', 'auto', 'adjusted']) {
    const full = trendWith(values, settings, arm, null);
    if (arm === 'auto') {
      result.model = full.ext?.description ?? '';
      result.skipped = full.ext?.skipped ?? '';
    }
    const reuse = full.ext?.model ?? null;
    if (arm !== 'none' && !reuse) {
      result.mar[arm] = Number.NaN;
      continue;
    }
    const revisions = [];
    for (let c = first; c <= last; c += step) {
      const prefix = values.slice(0, c + 1);
      const t = trendWith(prefix, settings, arm, reuse).trend;
      const a = percentChange(t[c], t[c - lag]);
      const b = percentChange(full.trend[c], full.trend[c - lag]);
      if (Number.isFinite(a) && Number.isFinite(b)) revisions.push(Math.abs(a - b));
    }
    result.mar[arm] = revisions.reduce((x, y) => x + y, 0) / revisions.length;
  }
  rows.push(result);
  process.stderr.write(
    `${s.id}: none ${result.mar.none.toFixed(3)} auto ${result.mar.auto.toFixed(3)} adjusted ${result.mar.adjusted.toFixed(3)}\n`,
  );
}
const seconds = (performance.now() - started) / 1000;

const pct = (a, b) => (Number.isFinite(a) && Number.isFinite(b) && b > 0 ? 100 * (1 - a / b) : Number.NaN);
const fmt = (v, d = 3) => (Number.isFinite(v) ? v.toFixed(d) : '–');
const table = [
  '| series | frequency | n | extension model (auto) | MAR none | MAR auto | gain auto | MAR adjusted | gain adjusted |',
  '| --- | --- | --- | --- | --- | --- | --- | --- | --- |',
  ...rows.map(
    (r) =>
      `| ${r.id} | ${r.frequency} | ${r.n} | ${r.model || `skipped: ${r.skipped}`} | ${fmt(r.mar.none)} | ${fmt(r.mar.auto)} | ${fmt(pct(r.mar.auto, r.mar.none), 0)}% | ${fmt(r.mar.adjusted)} | ${fmt(pct(r.mar.adjusted, r.mar.none), 0)}% |`,
  ),
].join('\n');
const groups = [
  ['monthly and quarterly', rows.filter((r) => r.frequency !== 'daily')],
  ['monthly', rows.filter((r) => r.frequency === 'monthly')],
  ['quarterly', rows.filter((r) => r.frequency === 'quarterly')],
  ['daily', rows.filter((r) => r.frequency === 'daily')],
];
const summary = [
  '| group | series | median gain auto | median gain adjusted | auto better than none |',
  '| --- | --- | --- | --- | --- |',
  ...groups.map(
    ([name, rs]) =>
      `| ${name} | ${rs.length} | ${fmt(median(rs.map((r) => pct(r.mar.auto, r.mar.none))), 0)}% | ${fmt(median(rs.map((r) => pct(r.mar.adjusted, r.mar.none))), 0)}% | ${rs.filter((r) => r.mar.auto < r.mar.none).length} of ${rs.length} |`,
  ),
].join('\n');
// The default's rule (see the header), with the brief's model for each frequency.
const briefArm = { monthly: 'adjusted', quarterly: 'adjusted', daily: 'auto' };
const decisions = ['monthly', 'quarterly', 'daily'].map((freq) => {
  const rs = rows.filter((r) => r.frequency === freq);
  const arm = briefArm[freq];
  const gain = median(rs.map((r) => pct(r.mar[arm], r.mar.none)));
  const better = rs.filter((r) => r.mar[arm] < r.mar.none).length;
  const on = gain >= 25 && better >= (2 * rs.length) / 3 && rs.length >= 5;
  return `| ${freq} | ${arm} | ${rs.length} | ${fmt(gain, 0)}% | ${better} of ${rs.length} | ${on ? '**on**' : 'off'} |`;
});
const rule = [
  "| frequency | brief's model | series | median gain | smaller revision | default |",
  '| --- | --- | --- | --- | --- | --- |',
  ...decisions,
].join('\n');
console.log(table);
console.log('');
console.log(summary);
console.log('');
console.log(rule);
console.log(`\n${seconds.toFixed(0)} s`);
if (process.argv.includes('--write')) {
  writeFileSync(
    join(root, 'bench/EXTENSION-STUDY.md'),
    `# Forecast extension: the gain in firmness, measured\n\nWritten by \`node bench/extension-study.js --write\` (after \`npm run build\`); method in the script's header.\nMAR: mean absolute revision of the trend's year-over-year percent change, first estimate against settled\nestimate, in percentage points. Gain: 1 − MAR with / MAR without. Data: ${data.series.length} open series\n(bench/data/extension-study.json, ${data.generator}).\n\n${table}\n\n${summary}\n\n## The default\n\nExtension is on by default for a frequency when, with the brief's model for it, the median series' revision is\nat least 25% smaller, it is smaller on at least two thirds of the series, and at least five series were\nmeasured (src/job/resolve.ts EXTEND_BY_DEFAULT follows this table). Weekly and hourly data were not measured\nand stay off.\n\n${rule}\n`,
  );
}
