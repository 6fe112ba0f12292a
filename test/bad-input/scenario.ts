/**
 * Small jobs written into a temporary folder for the write-path suites: 72 invented months of
 * 200 + 1.5·t + 25·sin(2π·month/12) per group (the good job of test/bad-input/good/ with groups), so a
 * brief renders in a second or two.
 */
import { mkdirSync, mkdtempSync, readdirSync, readFileSync, statSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

export const temps: string[] = [];

export function tempDir(name: string): string {
  const dir = mkdtempSync(join(tmpdir(), `tb-${name}-`));
  temps.push(dir);
  return dir;
}

/** Monthly rows for each group ("month,region,value"), or without a group column when `groups` is null. */
export function monthlyCsv(groups: string[] | null, months = 72): string {
  const rows = [groups === null ? 'month,value' : 'month,region,value'];
  for (const g of groups ?? [null]) {
    for (let i = 0; i < months; i++) {
      const y = 2019 + Math.floor(i / 12);
      const m = (i % 12) + 1;
      const v = (200 + 1.5 * i + 25 * Math.sin((2 * Math.PI * m) / 12)).toFixed(1);
      const month = `${y}-${String(m).padStart(2, '0')}`;
      rows.push(g === null ? `${month},${v}` : `${month},${csvCell(g)},${v}`);
    }
  }
  return `${rows.join('\n')}\n`;
}

function csvCell(text: string): string {
  return /[",\n]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
}

export interface JobOptions {
  title: string;
  /** Groups of the data column "region"; null for one brief. */
  groups?: string[] | null;
  /** The data file's name beside the job (default data/values.csv). */
  dataFile?: string;
  /** The data file's bytes when not the generated CSV. */
  data?: string;
  /** Lines added under brief:, indented by the caller (e.g. "  logo: logo.svg"). */
  brief?: string[];
}

/** Writes job.yaml and its data into `dir`; returns the job file's path. */
export function writeJob(dir: string, o: JobOptions, jobName = 'job.yaml'): string {
  const dataFile = o.dataFile ?? 'data/values.csv';
  mkdirSync(join(dir, dataFile, '..'), { recursive: true });
  writeFileSync(join(dir, dataFile), o.data ?? monthlyCsv(o.groups ?? null));
  const lines = [
    'brief:',
    `  title: ${JSON.stringify(o.title)}`,
    ...(o.brief ?? []),
    'series:',
    '  - id: sample',
    '    label: Sample measure',
    '    combine: sum',
    '    data:',
    `      file: ${JSON.stringify(dataFile)}`,
    '      date: month',
    '      value: value',
    ...(o.groups ? ['      group_by: region'] : []),
  ];
  const job = join(dir, jobName);
  writeFileSync(job, `${lines.join('\n')}\n`);
  return job;
}

/** Every name in a folder (dotfiles too) with its bytes and modification time. */
export function snapshot(dir: string): Map<string, { bytes: Buffer; mtimeMs: number }> {
  return new Map(
    readdirSync(dir)
      .sort()
      .map((f) => {
        const st = statSync(join(dir, f));
        return [f, { bytes: st.isFile() ? readFileSync(join(dir, f)) : Buffer.alloc(0), mtimeMs: st.mtimeMs }];
      }),
  );
}

/** Earlier outputs a failed run must leave as they are: distinctive bytes, dated long ago. */
export function earlierOutputs(out: string, stem: string, formats: string[]): void {
  mkdirSync(out, { recursive: true });
  for (const f of formats) writeFileSync(join(out, `${stem}.${f}`), `last month's ${f} of ${stem}\n`);
}
