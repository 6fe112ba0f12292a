/**
 * `trendbrief init [DIR]`: a starter job with invented data (bus boardings on a city network, monthly)
 * that renders on the first try. Refuses to overwrite an existing job file.
 */
import { existsSync, mkdirSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { mulberry32, normal } from '../data/synthetic.js';
import { BriefError } from '../errors.js';
import { writeFiles } from '../render/write.js';
import { parseCommand, usage } from './args.js';
import type { Console } from './output.js';

export const help = `trendbrief init — write a starter job with invented data

Usage: trendbrief init [DIR]      (default: the current folder)

Writes DIR/job.yaml and DIR/data/boardings.csv; an existing job.yaml is never overwritten.

Example:
  trendbrief init my-brief && trendbrief render my-brief/job.yaml --out my-brief/out`;

export const STARTER_JOB = `# A starter brief: monthly bus boardings on an invented city network.
# Change the title, point data.file at your own CSV (a date column and a value column), and render:
#   trendbrief render job.yaml --out out
brief:
  title: Bus boardings
  organisation: Example City Transport
  author: Your name
  locale: en-GB
  fiscal_year_start: 4
  outputs: [html, pdf]

series:
  - id: boardings
    label: Bus boardings
    unit: thousand
    combine: sum
    good: up
    data:
      file: data/boardings.csv
      date: month
      value: boardings
    decomposition:
      method: stl
      model: auto
      robust: true

comparisons:
  - year_on_year
  - year_to_date
  - fiscal_year_to_date
  - latest_year
`;

/** Ten years of invented monthly boardings (thousands): growth, a summer dip, school-term peaks. */
export function starterData(): string {
  const rand = mulberry32(20260904);
  const rows = ['month,boardings'];
  let t = 0;
  for (let y = 2016; y <= 2026; y++) {
    for (let m = 1; m <= 12; m++) {
      if (y === 2026 && m > 9) break;
      const level = 2400 + 6 * t;
      const season = [-60, 10, 70, 20, 60, 10, -150, -190, 80, 90, 70, -70][m - 1];
      rows.push(`${y}-${String(m).padStart(2, '0')},${(level + season + 25 * normal(rand)).toFixed(0)}`);
      t++;
    }
  }
  return `${rows.join('\n')}\n`;
}

export async function run(args: string[], con: Console): Promise<number> {
  const { positionals } = parseCommand('init', args, {});
  if (positionals.length > 1) throw usage('init', 'name at most one folder', 'e.g. trendbrief init my-brief');
  const dir = resolve(positionals[0] ?? '.');
  const jobFile = join(dir, 'job.yaml');
  if (existsSync(jobFile)) {
    throw new BriefError(
      'init-exists',
      `${jobFile} already exists`,
      'choose another folder, e.g. trendbrief init new-brief',
      { file: jobFile },
    );
  }
  try {
    mkdirSync(join(dir, 'data'), { recursive: true });
  } catch (e) {
    throw new BriefError(
      'init-unwritable',
      `cannot create ${dir} (${(e as NodeJS.ErrnoException).code})`,
      'choose a writable folder',
      { file: dir },
    );
  }
  const dataFile = join(dir, 'data', 'boardings.csv');
  await writeFiles([
    ...(existsSync(dataFile) ? [] : [{ path: dataFile, bytes: starterData() }]),
    { path: jobFile, bytes: STARTER_JOB },
  ]);
  con.info(`wrote ${jobFile} and ${dataFile}`);
  con.info(`next: trendbrief render ${jobFile} --out ${join(dir, 'out')}`);
  return 0;
}
