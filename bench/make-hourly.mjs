/**
 * `node bench/make-hourly.mjs --points N --out DIR`: a seeded hourly series (an invented city's electricity
 * demand, MW) and a one-series job that renders it, for the large-input benchmark (bench/large.js) and the
 * large-input test (test/cli/large-input.test.ts). A slow trend, a daily cycle (24 hours) whose shape
 * differs between weekdays and weekends (so the weekly cycle of 168 hours is real), a yearly swing,
 * Gaussian noise and a rare spike. Random numbers from src/data/synthetic.ts (mulberry32, Box–Muller),
 * through dist/ (`npm run build` first).
 *
 *   node bench/make-hourly.mjs --points 1200000 --out /tmp/big → /tmp/big/job.yaml, /tmp/big/demand.csv
 */
import { mkdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { normal as gaussian, mulberry32 } from '../dist/data/synthetic.js';

const HOUR = 3_600_000;

/** n hourly values from `start` (UTC ms), rounded to 0.1 MW; the same on every call for a seed. */
export function hourlyDemand(n, seed = 20261203) {
  const uniform = mulberry32(seed);
  const out = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const hour = i % 24;
    const weekday = Math.floor(i / 24 + 3) % 7; // 2000-01-01 (day 0) was a Saturday: 0 = Monday
    const weekend = weekday >= 5;
    const years = i / (24 * 365.25);
    const trend = 800 + 12 * years + 40 * Math.sin(years / 9);
    const yearly = 90 * Math.cos(2 * Math.PI * (years - 0.05));
    const daily =
      (weekend ? 0.6 : 1) *
      (120 * Math.sin((2 * Math.PI * (hour - 7)) / 24) + 35 * Math.cos((4 * Math.PI * hour) / 24));
    let v = trend + yearly + daily - (weekend ? 60 : 0) + 15 * gaussian(uniform);
    if (uniform() < 1 / 2000) v += (uniform() < 0.5 ? -1 : 1) * (90 + 80 * uniform());
    out[i] = Math.round(v * 10) / 10;
  }
  return out;
}

/** Writes DIR/demand.csv (hour,demand from 2000-01-01T00:00) and DIR/job.yaml; returns the job's path. */
export function writeHourlyJob(n, dir, seed) {
  mkdirSync(dir, { recursive: true });
  const x = hourlyDemand(n, seed);
  const t0 = Date.UTC(2000, 0, 1);
  const parts = ['hour,demand\n'];
  let chunk = '';
  for (let i = 0; i < n; i++) {
    chunk += `${new Date(t0 + i * HOUR).toISOString().slice(0, 16)},${x[i]}\n`;
    if (chunk.length > 1 << 20) {
      parts.push(chunk);
      chunk = '';
    }
  }
  parts.push(chunk);
  writeFileSync(join(dir, 'demand.csv'), parts.join(''));
  const job = `# An invented city's hourly electricity demand (bench/make-hourly.mjs, seeded).
brief:
  title: Hourly demand
  organisation: Riverside Grid
  locale: en-GB
  outputs: [html, pdf, json]
series:
  - id: demand
    label: Electricity demand
    unit: MW
    combine: mean
    good: neither
    frequency: hourly
    data:
      file: demand.csv
      date: hour
      value: demand
    decomposition:
      method: mstl
      periods: [24, 168]
      model: additive
comparisons:
  - year_on_year
  - latest_year
`;
  writeFileSync(join(dir, 'job.yaml'), job);
  return join(dir, 'job.yaml');
}

if (import.meta.url === `file://${process.argv[1]}`) {
  const argv = process.argv.slice(2);
  const opt = (name, fallback) => {
    const i = argv.indexOf(name);
    return i >= 0 ? argv[i + 1] : fallback;
  };
  const path = writeHourlyJob(
    Number(opt('--points', '1200000')),
    opt('--out', 'out/hourly'),
    Number(opt('--seed', '20261203')),
  );
  process.stdout.write(`${path}\n`);
}
