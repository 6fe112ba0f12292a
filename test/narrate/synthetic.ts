/**
 * Small invented jobs for the frequencies and locales the examples do not cover (quarterly, weekly and
 * hourly data; de-DE and fr-FR number formats), written to a temporary folder and built in-process.
 * The series are a level, a trend, a sine season and reproducible noise; only the wording is under test.
 */
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { buildBriefs } from '../../src/brief/build.js';
import { loadJob } from '../../src/job/load.js';
import type { Brief } from '../../src/vocabulary/brief.js';
import { type Frequency, isoOf, isoWeekOf, startOf } from '../../src/vocabulary/period-index.js';

export interface SyntheticJob {
  name: string;
  frequency: Frequency;
  /** Number of periods and the ordinal of the first. */
  length: number;
  start: number;
  locale: string;
  good: 'up' | 'down' | 'neither';
  /** Trend growth per period, as a fraction of the level. */
  growth: number;
  fiscalStart?: number;
}

function dateText(f: Frequency, ordinal: number): string {
  const ms = startOf(f, ordinal);
  const d = new Date(ms);
  switch (f) {
    case 'quarterly':
      return `${d.getUTCFullYear()}-Q${Math.floor(d.getUTCMonth() / 3) + 1}`;
    case 'weekly': {
      const w = isoWeekOf(ms);
      return `${w.year}-W${String(w.week).padStart(2, '0')}`;
    }
    case 'hourly':
      return `${isoOf('daily', Math.floor(ms / 86_400_000))} ${String(d.getUTCHours()).padStart(2, '0')}:00`;
    case 'monthly':
      return isoOf(f, ordinal).slice(0, 7);
    default:
      return isoOf(f, ordinal);
  }
}

const CYCLE: Record<Frequency, number> = { quarterly: 4, monthly: 12, weekly: 52, daily: 7, hourly: 24 };

export function writeSyntheticJob(dir: string, j: SyntheticJob): string {
  let seed = 7;
  const noise = () => {
    seed = (seed * 16807) % 2147483647; // Park & Miller (1988) minimal standard generator
    return seed / 2147483647 - 0.5;
  };
  const rows = ['period,value'];
  for (let i = 0; i < j.length; i++) {
    const level = 1000 * (1 + j.growth) ** i;
    const v = level + 0.1 * level * Math.sin((2 * Math.PI * i) / CYCLE[j.frequency]) + 5 * noise();
    rows.push(`${dateText(j.frequency, j.start + i)},${v.toFixed(1)}`);
  }
  writeFileSync(join(dir, `${j.name}.csv`), `${rows.join('\n')}\n`);
  const yaml = [
    'brief:',
    `  title: ${j.name}`,
    `  locale: ${j.locale}`,
    `  fiscal_year_start: ${j.fiscalStart ?? 1}`,
    'series:',
    `  - id: ${j.name}`,
    '    label: Parcels sent',
    '    unit: parcels',
    '    combine: sum',
    `    good: ${j.good}`,
    `    frequency: ${j.frequency}`,
    `    data: { file: ${j.name}.csv, date: period, value: value, decimal: "." }`,
    '    decomposition: { method: stl, model: additive }',
    '    firmness: { periods: 6 }',
    'comparisons: [year_on_year, year_to_date, fiscal_year_to_date, latest_year]',
  ].join('\n');
  const file = join(dir, `${j.name}.yaml`);
  writeFileSync(file, `${yaml}\n`);
  return file;
}

export const SYNTHETIC_JOBS: SyntheticJob[] = [
  {
    name: 'quarterly-de',
    frequency: 'quarterly',
    length: 40,
    start: 2016 * 4,
    locale: 'de-DE',
    good: 'up',
    growth: 0.01,
    fiscalStart: 7,
  },
  {
    name: 'weekly-fr',
    frequency: 'weekly',
    length: 52 * 4 + 10,
    start: 2800,
    locale: 'fr-FR',
    good: 'down',
    growth: 0.002,
  },
  {
    name: 'hourly-us',
    frequency: 'hourly',
    length: 364 * 24 * 2 + 48,
    start: 490_000,
    locale: 'en-US',
    good: 'neither',
    growth: -0.00001,
  },
  {
    name: 'monthly-fr',
    frequency: 'monthly',
    length: 60,
    start: 2021 * 12,
    locale: 'fr-FR',
    good: 'down',
    growth: 0.004,
    fiscalStart: 4,
  },
];

let cached: Promise<{ job: SyntheticJob; brief: Brief }[]> | null = null;

export function syntheticBriefs(): Promise<{ job: SyntheticJob; brief: Brief }[]> {
  cached ??= (async () => {
    const dir = mkdtempSync(join(tmpdir(), 'trendbrief-narrate-'));
    process.once('exit', () => rmSync(dir, { recursive: true, force: true }));
    const out: { job: SyntheticJob; brief: Brief }[] = [];
    for (const j of SYNTHETIC_JOBS) {
      const units = await buildBriefs(loadJob(writeSyntheticJob(dir, j)), {
        toolVersion: 'test',
        charts: false,
        epoch: 0,
      });
      for (const u of units) {
        if (u.error) throw u.error;
        if (u.brief) out.push({ job: j, brief: u.brief });
      }
    }
    return out;
  })();
  return cached;
}
