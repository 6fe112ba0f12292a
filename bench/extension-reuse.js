#!/usr/bin/env node
/**
 * The forecast extension taking the effects model's orders instead of searching again (src/brief/extended.ts
 * effectsModel), timed: a one-series daily brief (weekly STL, `extend: on`, a named step, so the effects
 * regression runs) rendered to HTML by this build and by an earlier build in alternating runs; the median
 * CPU and wall time of each and their ratio. The data are invented here: 1,280 days from 2021-01-01, a slow
 * rise, a weekly pattern, a step of +40 on day 900 and a repeating wobble (no random numbers).
 *
 *   npm run build && node bench/extension-reuse.js --baseline-dir DIR [--runs 6]
 *
 * DIR is the root of another build of trendbrief (its bin/, dist/, schema/, templates/ and fonts/), e.g. a
 * copy of main's before this change. Results: bench/EXTENSION-REUSE.md.
 */
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { measure, median } from './measure.js';

const root = join(dirname(fileURLToPath(import.meta.url)), '..');
const option = (name, fallback) => {
  const i = process.argv.indexOf(name);
  return i >= 0 ? process.argv[i + 1] : fallback;
};
const baseline = option('--baseline-dir', null);
const runs = Number(option('--runs', '6'));
if (!baseline) {
  console.error('bench/extension-reuse.js: give --baseline-dir DIR, the root of the build to compare with');
  process.exit(2);
}

const dir = mkdtempSync(join(tmpdir(), 'trendbrief-extension-reuse-'));
const day = (i) => new Date(Date.UTC(2021, 0, 1 + i)).toISOString().slice(0, 10);
const values = Array.from(
  { length: 1280 },
  (_, t) =>
    300 +
    0.05 * t +
    [0, 12, 15, 14, 10, -25, -30][t % 7] +
    (t >= 900 ? 40 : 0) +
    [4, -3, 1, -5, 2, 0, 6, -2, -1, 3, -4][t % 11] +
    8 * Math.sin(t * 0.37) * Math.cos(t * 0.011),
);
writeFileSync(join(dir, 'd.csv'), `date,v\n${values.map((v, i) => `${day(i)},${v.toFixed(1)}`).join('\n')}\n`);
const job = join(dir, 'job.yaml');
writeFileSync(
  job,
  `brief:
  title: Daily effects
  locale: en-GB
  outputs: [html]
series:
  - id: s
    label: Visits
    unit: visits
    combine: sum
    frequency: daily
    data: { file: d.csv, date: date, value: v }
    decomposition: { method: stl, period: 7, extend: on }
    effects: { events: [ { kind: step, at: ${day(900)}, label: New wing } ] }
`,
);

const ours = [];
const theirs = [];
for (let i = 0; i < runs; i++) {
  ours.push(measure([join(root, 'bin', 'trendbrief.js'), 'render', job, '--out', join(dir, 'ours')]));
  theirs.push(measure([join(baseline, 'bin', 'trendbrief.js'), 'render', job, '--out', join(dir, 'theirs')]));
}
const row = (label, xs) =>
  `${label.padEnd(10)} CPU ${median(xs.map((x) => x.cpu)).toFixed(2)} s, wall ${median(xs.map((x) => x.wall)).toFixed(2)} s`;
console.log(row('this build', ours));
console.log(row('baseline', theirs));
const ratio = (k) => median(ours.map((x, i) => x[k] / theirs[i][k]));
console.log(
  `ratio (median of pairs): CPU ${ratio('cpu').toFixed(2)}, wall ${ratio('wall').toFixed(2)} (${runs} pairs)`,
);
