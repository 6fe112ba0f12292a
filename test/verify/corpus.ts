/**
 * The verifier's corpus: open datasets exported by test/verify/corpus/generate.R (each one's source is in
 * corpus.json), and the job settings each is briefed with. A case is one dataset under one setting; its
 * brief is built in-process, without charts.
 */
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { buildBriefs } from '../../src/brief/build.js';
import type { BriefError } from '../../src/errors.js';
import { loadJob } from '../../src/job/load.js';
import type { Brief } from '../../src/vocabulary/brief.js';

export const CORPUS_DIR = join(import.meta.dirname, 'corpus');

export interface Dataset {
  id: string;
  file: string;
  frequency: 'hourly' | 'daily' | 'weekly' | 'monthly' | 'quarterly';
  unit: string;
  combine: 'sum' | 'mean';
  source: string;
  note: string;
  n: number;
}

export const DATASETS: Dataset[] = JSON.parse(readFileSync(join(CORPUS_DIR, 'corpus.json'), 'utf8'));

/** The dates and values of a dataset's CSV, as written by generate.R. */
export function readDataset(d: Dataset): { dates: string[]; values: number[] } {
  const lines = readFileSync(join(CORPUS_DIR, d.file), 'utf8').trim().split('\n').slice(1);
  return {
    dates: lines.map((l) => l.split(',')[0]),
    values: lines.map((l) => {
      const v = l.split(',')[1];
      return v === '' ? Number.NaN : Number(v);
    }),
  };
}

/** A year of periods back, for custom spans: the same period label a year earlier by counting periods. */
const YEAR: Record<Dataset['frequency'], number> = { monthly: 12, quarterly: 4, weekly: 52, daily: 364, hourly: 8736 };

export interface Setting {
  name: string;
  /** Lines under the series (indented by four spaces), or null when the setting does not apply. */
  series: (d: Dataset, dates: string[]) => string[] | null;
  /** The brief's reporting period, or null for the last observation. */
  period?: (d: Dataset, dates: string[]) => string | null;
  comparisons?: (d: Dataset, dates: string[]) => string[];
}

export const SETTINGS: Setting[] = [
  { name: 'stl, automatic model', series: () => [] },
  { name: 'classical', series: () => ['decomposition: { method: classical }'] },
  {
    name: 'robust stl in units, fiscal year from July, a custom span three years back',
    series: () => ['change_as: units', 'decomposition: { method: stl, robust: true }'],
    comparisons: (d, dates) => {
      const n = dates.length;
      const back = 3 * YEAR[d.frequency];
      const custom =
        n - 3 - back >= 0
          ? [
              `  - { custom: { label: Latest three against three years before, current: [${dates[n - 3]}, ${dates[n - 1]}], baseline: [${dates[n - 3 - back]}, ${dates[n - 1 - back]}] } }`,
            ]
          : [];
      return ['  - year_to_date', '  - fiscal_year_to_date', ...custom];
    },
  },
  {
    name: 'percent forced, reporting a year before the end',
    series: () => ['change_as: percent'],
    period: (d, dates) => {
      const i = dates.length - 1 - YEAR[d.frequency];
      return i >= 2 * YEAR[d.frequency] + 1 ? dates[i] : null;
    },
  },
  {
    // Less than two years before the reporting period: the brief gives what that history supports.
    // Monthly, quarterly and weekly data need two cycles and a period (25 months) anyway, so this is daily
    // data (300 days); the hourly dataset is twelve weeks long as it is.
    name: 'less than two years: daily data reported at day 300',
    series: () => [],
    period: (d, dates) => (d.frequency === 'daily' && dates.length > 300 ? dates[299] : null),
  },
  {
    // The corpus's jobs start the financial year in July: the years matched run July to June.
    name: 'adjusted matched to yearly totals (Denton), financial years from July',
    series: (d) =>
      d.frequency === 'weekly' ? null : ['decomposition: { match_yearly_totals: true }', 'change_as: units'],
    comparisons: () => ['  - year_to_date', '  - fiscal_year_to_date', '  - latest_year'],
  },
  {
    name: 'several seasonal periods',
    series: (d, dates) => {
      if (d.frequency === 'daily' && dates.length >= 2 * 365)
        return ['decomposition: { method: mstl, periods: [7, 365] }'];
      if (d.frequency === 'hourly') return ['decomposition: { method: mstl, periods: [24, 168] }'];
      return null;
    },
  },
];

export interface CaseResult {
  brief: Brief | null;
  error: BriefError | null;
  values: number[];
}

export async function buildCase(d: Dataset, setting: Setting): Promise<CaseResult | null> {
  const { dates, values } = readDataset(d);
  const lines = setting.series(d, dates);
  if (lines === null) return null;
  const period = setting.period?.(d, dates) ?? null;
  if (setting.period && period === null) return null;
  const dir = mkdtempSync(join(tmpdir(), 'tb-corpus-'));
  const yaml = [
    'brief:',
    `  title: ${d.id}`,
    ...(period ? [`  period: "${period}"`] : []),
    '  fiscal_year_start: 7',
    'series:',
    `  - id: ${d.id}`,
    `    label: ${d.id}`,
    `    unit: "${d.unit}"`,
    `    combine: ${d.combine}`,
    `    frequency: ${d.frequency}`,
    `    data: { file: ${JSON.stringify(join(CORPUS_DIR, d.file))}, date: date, value: value }`,
    ...lines.map((l) => `    ${l}`),
    ...(setting.comparisons ? ['comparisons:', ...setting.comparisons(d, dates)] : []),
  ].join('\n');
  writeFileSync(join(dir, 'job.yaml'), `${yaml}\n`);
  const job = loadJob(join(dir, 'job.yaml'));
  const [unit] = await buildBriefs(job, { toolVersion: 'test', charts: false, epoch: 0 });
  return { brief: unit.brief, error: unit.error, values };
}
