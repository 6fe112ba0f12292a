#!/usr/bin/env node
/**
 * Invented, seeded data for the brief benchmark (bench/briefs.js). Random numbers come from
 * src/data/synthetic.ts (mulberry32, Box–Muller) through dist/, so run `npm run build` first.
 *
 *   node bench/make-brief-data.mjs                      → bench/data/brief-12.csv (the data of bench/brief-12.yaml)
 *   node bench/make-brief-data.mjs --groups 1000 --out DIR
 *                                                       → DIR/job.yaml and DIR/data/groups.csv: one series
 *                                                         split by a column into 1,000 groups
 *
 * Every series is monthly over ten years (October 2016 to September 2026, 120 months): a level with a
 * gentle bend, a yearly pattern (some proportional to the level), noise and now and then an odd month.
 * The numbers describe no real organisation.
 */
import { mkdirSync, realpathSync, writeFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { mulberry32, normal } from '../dist/data/synthetic.js';

const here = dirname(fileURLToPath(import.meta.url));
const MONTHS = 120;
const FIRST_YEAR = 2016;
const FIRST_MONTH = 10;

function monthText(i) {
  const m0 = FIRST_MONTH - 1 + i;
  return `${FIRST_YEAR + Math.floor(m0 / 12)}-${String((m0 % 12) + 1).padStart(2, '0')}`;
}

/** One series of MONTHS values, drawn from its own seed; `proportional` makes the season scale with the level. */
export function inventedSeries(seed, proportional) {
  const rand = mulberry32(seed);
  const base = 200 + 4800 * rand();
  const growth = (rand() - 0.35) * 0.012; // per month, mostly rising
  const bend = (rand() - 0.5) * 0.3;
  const amplitude = 0.05 + 0.2 * rand();
  const phase = Math.floor(12 * rand());
  const noise = 0.01 + 0.03 * rand();
  const out = [];
  for (let i = 0; i < MONTHS; i++) {
    const t = i / MONTHS;
    const level = base * Math.exp(growth * i + bend * t * t);
    const month = (FIRST_MONTH - 1 + i) % 12;
    const wave = Math.cos((2 * Math.PI * (month - phase)) / 12) + 0.3 * Math.cos((4 * Math.PI * (month - phase)) / 12);
    let v = proportional ? level * (1 + amplitude * wave) : level + base * amplitude * wave;
    v *= 1 + noise * normal(rand);
    if (rand() < 1 / 60) v *= rand() < 0.5 ? 0.8 : 1.2; // an odd month now and then, for the robust fits
    out.push(Math.max(1, v).toFixed(1));
  }
  return out;
}

/** bench/data/brief-12.csv: a month column and one column per series, s01 … s12. */
function writeTwelve() {
  const columns = Array.from({ length: 12 }, (_, k) => inventedSeries(20260100 + k, k % 3 === 2));
  const rows = ['month,' + columns.map((_, k) => `s${String(k + 1).padStart(2, '0')}`).join(',')];
  for (let i = 0; i < MONTHS; i++) rows.push(`${monthText(i)},${columns.map((c) => c[i]).join(',')}`);
  const path = join(here, 'data/brief-12.csv');
  mkdirSync(dirname(path), { recursive: true });
  writeFileSync(path, `${rows.join('\n')}\n`);
  return path;
}

/** DIR/data/groups.csv (month, branch, value) with `count` branches, and DIR/job.yaml briefing each branch. */
function writeGroups(count, dir) {
  const rows = ['month,branch,value'];
  for (let g = 0; g < count; g++) {
    const name = `B${String(g + 1).padStart(4, '0')}`;
    const values = inventedSeries(20270000 + g, g % 4 === 3);
    for (let i = 0; i < MONTHS; i++) rows.push(`${monthText(i)},${name},${values[i]}`);
  }
  mkdirSync(join(dir, 'data'), { recursive: true });
  writeFileSync(join(dir, 'data/groups.csv'), `${rows.join('\n')}\n`);
  const job = `# Benchmark: one invented monthly series per branch, ${count} branches (bench/make-brief-data.mjs).
brief:
  title: Branch throughput
  organisation: Benchmark
  outputs: [html, pdf]

series:
  - id: throughput
    label: Throughput
    unit: units
    combine: sum
    good: up
    data:
      file: data/groups.csv
      date: month
      value: value
      group_by: branch
    decomposition:
      method: stl
      robust: true
      seasonal_window: 13

comparisons:
  - year_on_year
  - year_to_date
  - latest_year
`;
  writeFileSync(join(dir, 'job.yaml'), job);
  return join(dir, 'job.yaml');
}

if (process.argv[1] && realpathSync(process.argv[1]) === fileURLToPath(import.meta.url)) {
  const argv = process.argv.slice(2);
  const option = (name) => {
    const i = argv.indexOf(name);
    return i >= 0 ? argv[i + 1] : undefined;
  };
  const groups = option('--groups');
  if (groups !== undefined) {
    const out = option('--out');
    if (!out) {
      process.stderr.write('make-brief-data: --groups needs --out DIR\n');
      process.exit(2);
    }
    process.stdout.write(`${writeGroups(Number(groups), out)}\n`);
  } else process.stdout.write(`${writeTwelve()}\n`);
}
