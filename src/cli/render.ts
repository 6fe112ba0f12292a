/**
 * `trendbrief render JOB`: build every brief of a job and write the asked formats into the output folder.
 * Each brief's files are produced in memory first and written atomically, so a failing group writes
 * nothing and leaves earlier files untouched.
 */
import { resolve } from 'node:path';
import { type BriefUnit, buildBriefs } from '../brief/build.js';
import type { Brief } from '../brief/model.js';
import { BriefError } from '../errors.js';
import { loadJob } from '../job/load.js';
import type { Job, OutputFormat } from '../job/types.js';
import { ensureFolder, type OutputFile, writeAll } from '../render/write.js';
import { parseCommand, usage } from './args.js';
import { toolVersion } from './main.js';
import type { Console } from './output.js';

export const help = `trendbrief render — write the briefs of a job file

Usage: trendbrief render JOB.yaml [--out DIR] [--format html,pdf,eml,json] [--period YYYY-MM]

  --out DIR        output folder (created when missing; default: out/ beside the job file)
  --format LIST    formats to write, comma-separated (default: the job's brief.outputs)
  --period P       reporting period, e.g. 2026-09 (default: the job's, else the last observation)

Example:
  trendbrief render examples/water-deliveries/job.yaml --out out/water --format html,pdf`;

const FORMATS: OutputFormat[] = ['html', 'pdf', 'eml', 'json'];

export async function run(args: string[], con: Console): Promise<number> {
  const { values: o, positionals } = parseCommand('render', args, {
    out: { type: 'string' },
    format: { type: 'string' },
    period: { type: 'string' },
  });
  if (positionals.length !== 1) throw usage('render', 'name one job file', 'e.g. trendbrief render job.yaml --out out');
  const job = loadJob(positionals[0]);
  const formats = o.format ? parseFormats(String(o.format)) : job.brief.outputs;
  const outDir = resolve(typeof o.out === 'string' ? o.out : resolve(job.dir, 'out'));
  const units = await buildBriefs(job, {
    period: typeof o.period === 'string' ? o.period : null,
    toolVersion: await toolVersion(),
    charts: formats.some((f) => f !== 'json'),
  });
  ensureFolder(outDir);
  let failed = 0;
  for (const unit of units) {
    const name = unit.group === null ? 'brief' : `brief for ${unit.group}`;
    if (unit.error) {
      failed++;
      con.error(`${name}: ${unit.error.oneLine()}`);
      continue;
    }
    try {
      const files = await renderUnit(job, unit, formats, outDir);
      writeAll(files);
      for (const f of files) con.info(`wrote ${f.path}`);
    } catch (e) {
      if (!(e instanceof BriefError)) throw e;
      failed++;
      con.error(`${name}: ${e.oneLine()}`);
    }
  }
  if (failed > 0 && failed === units.length && units.every((u) => u.error?.exitCode === 2)) return 2;
  return failed > 0 ? 1 : 0;
}

export function parseFormats(text: string): OutputFormat[] {
  const list = text.split(',').map((s) => s.trim().toLowerCase());
  for (const f of list) {
    if (!FORMATS.includes(f as OutputFormat))
      throw usage('render', `unknown format "${f}"`, `use any of ${FORMATS.join(', ')}, e.g. --format html,pdf`);
  }
  return list as OutputFormat[];
}

/** File stem of a brief: its title (and group) in lower case with dashes. */
export function fileStem(brief: Brief): string {
  return (
    brief.meta.title
      .normalize('NFKD')
      .replace(/[\u0300-\u036f]/g, '')
      .toLowerCase()
      .replace(/[^a-z0-9]+/g, '-')
      .replace(/^-+|-+$/g, '') || 'brief'
  );
}

async function renderUnit(_job: Job, unit: BriefUnit, formats: OutputFormat[], outDir: string): Promise<OutputFile[]> {
  const brief = unit.brief as Brief;
  const stem = resolve(outDir, fileStem(brief));
  const files: OutputFile[] = [];
  for (const format of formats) {
    if (format === 'json') {
      const { renderJson } = await import('../render/json.js');
      files.push({ path: `${stem}.json`, bytes: renderJson(brief) });
    } else {
      throw new BriefError(
        'format-unavailable',
        `the ${format} format is not built yet`,
        'use --format json for now',
        {},
        2,
      );
    }
  }
  return files;
}
