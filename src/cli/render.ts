/**
 * `trendbrief render JOB...`: build every brief of one or more jobs and write the asked formats. Each
 * brief's files are produced in memory first and written atomically, so a failing brief writes nothing
 * and leaves earlier files untouched; the other briefs go on. Many briefs run on a worker pool.
 */
import { existsSync, readdirSync, rmdirSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { dropSeriesWorker, seriesThreads } from '../brief/early-worker.js';
import { BriefError } from '../errors.js';
import type { EmailOverrides } from '../render/email.js';
import type { SmtpSettings } from '../render/send.js';
import { ensureFolder, sweepStaleTemporaries } from '../render/write.js';
import type { ChartFileFormat, OutputFormat } from '../vocabulary/settings.js';
import { parseCommand, usage } from './args.js';
import {
  clearCaches,
  expandJobs,
  parseShard,
  planTasks,
  type Recording,
  runTasks,
  shardFailures,
  shardTasks,
  type TaskResult,
} from './batch.js';
import type { Console } from './output.js';
import { periodOption } from './period-option.js';
import type { PdfEngine, RenderOptions } from './render-files.js';
import { schedulerShard } from './scheduler.js';

export const help = `trendbrief render — write the briefs of one or more job files

Usage: trendbrief render JOB... [--out DIR] [--format html,pdf,eml,json] [--period YYYY-MM] [--watch]
                        [--pdf-engine builtin|browser] [--chart-files svg,png] [--send] [--to a@x,b@y] [--subject TEXT] [--shard K/N]
                        [--record auto|always|never] [--reason TEXT] [--run NAME]

  JOB...           job files, folders of them, or a pattern such as "jobs/*.yaml"
  --out DIR        output folder (created when missing; default: out/ beside each job file); with several
                   jobs, each gets a subfolder named after its file (or its folder, for job.yaml)
  --format LIST    formats to write, comma-separated (default: the job's brief.outputs)
  --period P       reporting period, e.g. 2026-09 (default: the job's, else the last observation)
  --watch          render again whenever the job, its data, logo or templates change (Ctrl-C stops)
  --chart-files L  also write each chart as its own file for slides: svg, png or svg,png (default: the
                   job's brief.chart_files; none turns them off), named BRIEF--SERIES--CHART.svg
  --pdf-engine E   builtin (drawn by trendbrief, the default) or browser (the HTML brief printed by a
                   system Chromium: CHROMIUM_PATH, else /usr/bin/chromium …); default: the job's pdf_engine
  --send           send each .eml over SMTP after writing it (adds eml to the formats); the server comes
                   from TRENDBRIEF_SMTP_HOST, _PORT, _SECURE=1 (TLS), _USER and _PASSWORD, never the job file
  --to LIST        email recipients, comma-separated, instead of the job's brief.email.to
  --subject TEXT   email subject instead of the job's brief.email.subject
  --shard K/N      render only the K-th of N equal parts of the briefs (for a batch scheduler); absent,
                   read from Kubernetes (JOB_COMPLETION_INDEX), Slurm (SLURM_ARRAY_TASK_ID) or GNU parallel
                   (PARALLEL_SEQ), with TRENDBRIEF_SHARD_COUNT where the scheduler does not give the count
  --record MODE    auto (the default; TRENDBRIEF_RECORD overrides it): record every brief written in the
                   job's record, except json alone; always: json alone too; never: record nothing
  --reason TEXT    why this brief is issued again for a period already published (kept in the record)
  --run NAME       the run's name in the record (default: TRENDBRIEF_RUN, the scheduler's job, or a new one)

Briefs run in parallel on all cores when there are several, in a process started for them with V8's
--single-threaded-gc and --no-concurrent-recompilation (TRENDBRIEF_BATCH_PROCESS=0 keeps them in this
one). A failing brief is listed and the others go on; the exit code is 1 when any failed. One brief of six
or more series is built on two threads on a machine of four or more cores; TRENDBRIEF_SERIES_THREADS=1 or 2
says otherwise. The PDF is drawn on a thread of its own on four or more cores; TRENDBRIEF_PDF_THREAD=0 or 1
says otherwise.

Examples:
  trendbrief render examples/water-deliveries/job.yaml --out out/water --format html,pdf
  trendbrief render examples/ --out out/all --shard 1/2`;

const FORMATS: OutputFormat[] = ['html', 'pdf', 'eml', 'json'];

/** The options of `render` (bin/batch-process.js lists those that take a value; a test keeps them equal). */
export const RENDER_OPTIONS = {
  out: { type: 'string' },
  format: { type: 'string' },
  period: { type: 'string' },
  watch: { type: 'boolean' },
  send: { type: 'boolean' },
  to: { type: 'string' },
  subject: { type: 'string' },
  'pdf-engine': { type: 'string' },
  'chart-files': { type: 'string' },
  shard: { type: 'string' },
  record: { type: 'string' },
  reason: { type: 'string' },
  run: { type: 'string' },
} as const;

export async function run(args: string[], con: Console): Promise<number> {
  const { values: o, positionals } = parseCommand('render', args, RENDER_OPTIONS);
  if (positionals.length === 0) throw usage('render', 'name a job file', 'e.g. trendbrief render job.yaml --out out');
  const jobFiles = expandJobs(positionals);
  const asked = typeof o.format === 'string' ? parseFormats(o.format) : null;
  const formats = o.send === true && asked && !asked.includes('eml') ? [...asked, 'eml' as const] : asked;
  const options: RenderOptions = {
    formats,
    period: typeof o.period === 'string' ? periodOption('render', o.period) : null,
    pdfEngine: pdfEngine(o['pdf-engine']),
    chartFiles: typeof o['chart-files'] === 'string' ? parseChartFiles(o['chart-files']) : null,
    overrides: await emailOverrides(o),
  };
  const scheduler = schedulerShard();
  const shard = typeof o.shard === 'string' ? parseShard(o.shard) : scheduler.shard;
  const recording: Recording = {
    mode: recordMode(typeof o.record === 'string' ? o.record : (process.env.TRENDBRIEF_RECORD ?? 'auto')),
    run: typeof o.run === 'string' ? o.run : (scheduler.run ?? newRunName()),
    shard: shard ? `${shard[0]}/${shard[1]}` : '',
    reason: typeof o.reason === 'string' ? o.reason.trim() : '',
  };
  // Like a missing browser, missing SMTP settings fail before the long render.
  if (options.pdfEngine === 'browser') (await import('../render/browser-pdf.js')).findBrowser();
  const smtp: SmtpSettings | null = o.send === true ? (await import('../render/send.js')).smtpSettings() : null;
  seriesThreads();
  const outDir = typeof o.out === 'string' ? resolve(o.out) : null;
  const once = () => renderOnce(jobFiles, outDir, options, smtp, shard, con, recording);
  const code = await once();
  if (o.watch !== true) return code;
  const { watchAndRender } = await import('./watch.js');
  return watchAndRender(jobFiles, once, con);
}

async function renderOnce(
  jobFiles: string[],
  outDir: string | null,
  options: RenderOptions,
  smtp: SmtpSettings | null,
  shard: [number, number] | null,
  con: Console,
  recording: Recording,
): Promise<number> {
  const started = Date.now();
  clearCaches();
  const planned = planTasks(jobFiles, outDir, options, smtp, recording);
  if (smtp) {
    const { checkEnvelope } = await import('../render/send.js');
    const { emailEnvelope } = await import('../render/email.js');
    const { loadJob } = await import('../job/load.js');
    for (const file of new Set(planned.tasks.map((t) => t.jobFile)))
      checkEnvelope(emailEnvelope(loadJob(file).brief.email, options.overrides));
  }
  const tasks = shardTasks(planned.tasks, shard);
  // Several briefs go to the worker pool, one brief per thread: the early second thread has no use.
  if (tasks.length !== 1) dropSeriesWorker();
  // Folders this run creates are removed again when nothing was written into them (a failed run leaves none).
  const created: string[] = [];
  for (const dir of new Set(tasks.map((t) => t.outDir))) {
    if (!existsSync(dir)) created.push(dir);
    ensureFolder(dir);
    // Temporaries of earlier runs that were killed before they could remove them.
    for (const name of sweepStaleTemporaries(dir)) con.detail(`removed ${join(dir, name)}, left by an earlier run`);
  }
  const failures = shardFailures(planned.failures, jobFiles, shard);
  const total = tasks.length + failures.length;
  const progress = makeProgress(total, con);
  for (const f of failures) progress(f);
  const results = [...failures, ...(await runTasks(tasks, progress))];
  dropSeriesWorker();
  if (recording.mode !== 'never') await (await import('../record/session.js')).closeRecords();
  const failed = results.filter((r) => r.error !== null);
  for (const dir of created.reverse()) if (readdirSync(dir).length === 0) rmdirSync(dir);
  // Written but not sent to everyone: the files are there (and counted), the sending failed.
  const unsent = results.filter((r) => r.error === null && r.sendError);
  progress.finish();
  if (total > 1 || shard || unsent.length > 0) {
    const seconds = ((Date.now() - started) / 1000).toFixed(1);
    const written = results.length - failed.length;
    const notSent = unsent.length > 0 ? `, ${unsent.length} not sent to every recipient` : '';
    con.info(
      `${written} brief${written === 1 ? '' : 's'} written${notSent}, ${failed.length} failed, in ${seconds} s${shard ? ` (shard ${shard[0]}/${shard[1]})` : ''}`,
    );
    for (const f of failed) if (total > 1) con.error(`  failed: ${f.name}: ${f.error}`);
  }
  if (failed.length === 0) return unsent.length > 0 ? 1 : 0;
  return failed.length === results.length && failed.every((f) => f.exitCode === 2) ? 2 : 1;
}

type Progress = ((r: TaskResult) => void) & { finish: () => void };

/** A progress bar on a terminal; one line per brief otherwise. */
function makeProgress(total: number, con: Console): Progress {
  const bar = process.stderr.isTTY === true && con.verbosity !== 'quiet' && total > 1;
  let done = 0;
  let failed = 0;
  const draw = (): void => {
    const width = 30;
    const filled = Math.round((width * done) / Math.max(1, total));
    process.stderr.write(
      `\r[${'#'.repeat(filled)}${'.'.repeat(width - filled)}] ${done}/${total} briefs${failed ? `, ${failed} failed` : ''}`,
    );
  };
  const step = ((r: TaskResult) => {
    done++;
    if (r.error) failed++;
    if (r.error && con.debug && r.stack) con.error(r.stack);
    if (bar) {
      for (const n of r.notes ?? []) {
        process.stderr.write('\r\x1b[K');
        con.error(`${r.name}: ${n}`);
      }
      if (r.error) {
        process.stderr.write('\r\x1b[K');
        con.error(`failed: ${r.name}: ${r.error}`);
      }
      draw();
      return;
    }
    for (const n of r.notes ?? []) con.error(total > 1 ? `${r.name}: ${n}` : n);
    if (r.error) con.error(total > 1 ? `failed: ${r.name}: ${r.error}` : r.error);
    else {
      for (const f of r.files) con.info(`wrote ${f}`);
      for (const line of r.sent) con.info(`sent ${line}`);
    }
    if (!r.error && r.sendError) for (const line of r.sendError.split('\n')) con.error(`not sent: ${line}`);
  }) as Progress;
  step.finish = () => {
    if (bar) process.stderr.write('\n');
  };
  return step;
}

function recordMode(text: string): Recording['mode'] {
  if (text === 'auto' || text === 'always' || text === 'never') return text;
  throw usage('render', `unknown record mode "${text}"`, 'use --record auto, always or never (or TRENDBRIEF_RECORD)');
}

/** A run's name when neither the user nor a scheduler gave one: the time and a few random letters. */
function newRunName(): string {
  const stamp = new Date()
    .toISOString()
    .replace(/[-:]/g, '')
    .replace(/\.\d+Z$/, 'Z');
  return `run-${stamp}-${Math.random().toString(36).slice(2, 6)}`;
}

export function parseFormats(text: string): OutputFormat[] {
  const list = text.split(',').map((s) => s.trim().toLowerCase());
  for (const f of list) {
    if (!FORMATS.includes(f as OutputFormat)) {
      throw usage('render', `unknown format "${f}"`, `use any of ${FORMATS.join(', ')}, e.g. --format html,pdf`);
    }
  }
  return list as OutputFormat[];
}

/** --chart-files svg,png (or none): charts also written as files of their own, overriding brief.chart_files. */
function parseChartFiles(value: string): ChartFileFormat[] {
  const kinds = value
    .split(',')
    .map((s) => s.trim().toLowerCase())
    .filter(Boolean);
  if (kinds.length === 1 && kinds[0] === 'none') return [];
  for (const k of kinds)
    if (k !== 'svg' && k !== 'png')
      throw usage('render', `unknown chart file format "${k}"`, 'use --chart-files svg, png, svg,png or none');
  if (kinds.length === 0) throw usage('render', 'no chart file format given', 'use --chart-files svg,png or none');
  return [...new Set(kinds)] as ChartFileFormat[];
}

/** --pdf-engine, or null for each job's brief.pdf_engine. */
function pdfEngine(value: string | boolean | undefined): PdfEngine | null {
  if (value === undefined) return null;
  if (value === 'builtin' || value === 'browser') return value;
  throw usage('render', `unknown PDF engine "${String(value)}"`, 'use --pdf-engine builtin or --pdf-engine browser');
}

/** --to and --subject, replacing the jobs' brief.email settings. */
async function emailOverrides(o: Record<string, string | boolean | undefined>): Promise<EmailOverrides> {
  const overrides: EmailOverrides = {};
  if (typeof o.to === 'string') overrides.to = (await import('../render/email.js')).addressList(o.to, '--to');
  if (typeof o.subject === 'string') {
    if (o.subject.trim() === '')
      throw usage('render', '--subject is empty', 'write e.g. --subject "Monthly orders brief"');
    overrides.subject = o.subject;
  }
  return overrides;
}

export { BriefError };
