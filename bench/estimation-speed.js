/**
 * `node bench/estimation-speed.js`: the cost of the estimation step of calendar effects and outlier detection
 * (src/adjust/regression-effects.ts: automatic orders with the calendar regressors, the AICc test of each
 * calendar group, Chen & Liu's outlier search) against one automatic order selection (autoArima), in-process,
 * on the twelve monthly series of bench/brief-12.yaml (bench/data/brief-12.csv, ten years each). Alternating
 * rounds (selection, estimation, selection, …) so that both see the same load; prints CPU time per round of
 * twelve series, the ratio, the outliers found and the load average. Options: --runs N (default 5);
 * --root DIR also times DIR's build (DIR/dist, e.g. a checkout before a change) in the same alternation, and
 * prints the ratio of ours to it.
 *
 *   npm run build && node bench/estimation-speed.js [--root ../other-checkout]
 */
import { readFileSync } from 'node:fs';
import { loadavg } from 'node:os';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { estimateEffects } from '../dist/adjust/regression-effects.js';
import { autoArima } from '../dist/model/auto-arima.js';
import { ordinalOf } from '../dist/vocabulary/period-index.js';

const root = join(dirname(fileURLToPath(import.meta.url)), '..');
const argv = process.argv.slice(2);
const runsAt = argv.indexOf('--runs');
const RUNS = runsAt >= 0 ? Number(argv[runsAt + 1]) : 5;
const rootAt = argv.indexOf('--root');
const otherEstimate =
  rootAt >= 0 ? (await import(join(argv[rootAt + 1], 'dist/adjust/regression-effects.js'))).estimateEffects : null;

const lines = readFileSync(join(root, 'bench/data/brief-12.csv'), 'utf8').trim().split('\n');
const header = lines[0].split(',');
const rows = lines.slice(1).map((l) => l.split(','));
const index = {
  frequency: 'monthly',
  start: ordinalOf('monthly', Date.parse(`${rows[0][0]}-01T00:00:00Z`)),
  length: rows.length,
};
const series = header.slice(1).map((id, j) => ({ id, y: Float64Array.from(rows, (r) => Number(r[j + 1])) }));
const options = {
  multiplicative: false,
  calendar: { workingDays: true, leapYear: true, easter: 8 },
  outliers: ['AO', 'LS', 'TC'],
};

const cpuMs = () => {
  const u = process.cpuUsage();
  return (u.user + u.system) / 1000;
};
const select = () => {
  for (const s of series) autoArima(s.y, 12);
};
let found = [];
const estimate = () => {
  found = series.map((s) => {
    const r = estimateEffects(s.y, index, options);
    return `${s.id}: ${r.events.map((e) => `${e.type}@${e.at}`).join(' ') || '—'}`;
  });
};
let otherFound = [];
const estimateOther = () => {
  otherFound = series.map((s) => {
    const r = otherEstimate(s.y, index, options);
    return `${s.id}: ${r.events.map((e) => `${e.type}@${e.at}`).join(' ') || '—'}`;
  });
};
select();
estimate();
if (otherEstimate) estimateOther();
const timesSelect = [];
const timesEstimate = [];
const timesOther = [];
for (let i = 0; i < RUNS; i++) {
  let c0 = cpuMs();
  select();
  timesSelect.push(cpuMs() - c0);
  c0 = cpuMs();
  estimate();
  timesEstimate.push(cpuMs() - c0);
  if (otherEstimate) {
    c0 = cpuMs();
    estimateOther();
    timesOther.push(cpuMs() - c0);
  }
}
const mid = (xs) => [...xs].sort((a, b) => a - b)[xs.length >> 1];
const ratios = timesEstimate.map((t, i) => t / timesSelect[i]);
console.log(
  `Estimation step (calendar + outliers) against automatic selection, 12 monthly series, ${RUNS} alternating rounds`,
);
console.log(`  selection:  median ${mid(timesSelect).toFixed(0)} ms CPU a round of 12`);
console.log(`  estimation: median ${mid(timesEstimate).toFixed(0)} ms CPU a round of 12`);
console.log(
  `  ratio estimation / selection: median ${mid(ratios).toFixed(2)} (range ${Math.min(...ratios).toFixed(2)}–${Math.max(...ratios).toFixed(2)})`,
);
console.log(
  `  load average ${loadavg()
    .map((v) => v.toFixed(1))
    .join(' ')}`,
);
if (otherEstimate) {
  const r = timesEstimate.map((t, i) => t / timesOther[i]);
  console.log(`  --root build's estimation: median ${mid(timesOther).toFixed(0)} ms CPU a round of 12`);
  console.log(
    `  ours / --root: median ${mid(r).toFixed(2)} (range ${Math.min(...r).toFixed(2)}–${Math.max(...r).toFixed(2)})`,
  );
  const same = found.every((f, i) => f === otherFound[i]);
  console.log(`  outliers found: ${same ? 'the same in both builds' : 'DIFFERENT between the builds'}`);
  found.forEach((f, i) => {
    if (f !== otherFound[i]) console.log(`    ours ${f}\n    root ${otherFound[i]}`);
  });
}
if (argv.includes('--events')) console.log(found.join('\n'));
