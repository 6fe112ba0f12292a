/**
 * The built-in PDF drawn on a thread of its own (src/render/pdf/thread.ts, pdf-service.ts), which the built
 * command line does by default on four or more cores (TRENDBRIEF_PDF_THREAD=0 or 1 says otherwise; under
 * vitest the sources have no worker file and draw here). Checked against the PDF drawn on the main thread
 * and drawn here from the finished brief: the same bytes, for a brief whose overview comes first (drawn on
 * the thread once every series is built) and for a one-series brief (its series drawn as soon as it is
 * built); a build that fails after the thread was started reports the build's error,
 * writes nothing and ends.
 */
import { spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { availableParallelism, tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { buildBriefs } from '../../src/brief/build.js';
import { loadJob } from '../../src/job/load.js';
import { renderPdf } from '../../src/render/pdf/index.js';
import { BIN, ROOT, runCli } from '../cli/run.js';
import { loadedSources } from '../support/loaded-sources.js';

const EPOCH = 1767225600; // 2026-01-01T00:00:00Z
const VERSION = (JSON.parse(readFileSync(join(ROOT, 'package.json'), 'utf8')) as { version: string }).version;

/** The job's files from the command line with the PDF on its own thread (1) or on the main thread (0). */
function render(job: string, thread: '0' | '1', formats: string): Map<string, Buffer> {
  const out = mkdtempSync(join(tmpdir(), 'tb-pdf-thread-'));
  const r = runCli(['render', job, '--out', out, '--format', formats, '--quiet'], {
    TRENDBRIEF_PDF_THREAD: thread,
    TRENDBRIEF_RECORD: 'never',
    SOURCE_DATE_EPOCH: String(EPOCH),
  });
  expect(r.code, r.stderr).toBe(0);
  return new Map(readdirSync(out).map((f) => [f, readFileSync(join(out, f))]));
}

async function fromFinishedBrief(jobFile: string): Promise<Buffer> {
  const job = loadJob(jobFile);
  const [unit] = await buildBriefs(job, { toolVersion: VERSION, charts: true, epoch: EPOCH });
  if (!unit.brief) throw unit.error;
  return renderPdf(unit.brief, { archival: job.brief.pdfArchival });
}

/** Which entry the PDF's thread started from, if any (every module load logged by test/cli/files/record-imports.mjs). */
function pdfThreadOf(args: string[], env: Record<string, string>, status = 0): 'one-script' | 'modules' | null {
  const log = join(mkdtempSync(join(tmpdir(), 'tb-pdf-thread-')), 'imports.txt');
  const r = spawnSync(process.execPath, ['--import', `${ROOT}test/cli/files/record-imports.mjs`, BIN, ...args], {
    cwd: ROOT,
    env: { ...process.env, TRENDBRIEF_PDF_THREAD: '', TRENDBRIEF_RECORD: 'never', ...env, IMPORT_LOG: log },
    encoding: 'utf8',
  });
  expect(r.status, r.stderr).toBe(status);
  return pdfThreadEntry(loadedSources(readFileSync(log, 'utf8').split('\n')));
}

/** Whether the PDF's thread was started at all. */
function loadsPdfWorker(args: string[], env: Record<string, string>, status = 0): boolean {
  return pdfThreadOf(args, env, status) !== null;
}

/**
 * Which entry the PDF's thread was started from, if any: the one-script build's bin/pdf-thread.js (which
 * loads dist/bundle/main.cjs with its code cache, src/thread-entry.ts) or the modules' pdf-worker.js.
 */
function pdfThreadEntry(loaded: string[]): 'one-script' | 'modules' | null {
  const script = loaded.some((u) => u.endsWith('/bin/pdf-thread.js'));
  const modules = loaded.some((u) => u.endsWith('/src/render/pdf/pdf-worker.ts'));
  expect(script && modules, 'both entries loaded').toBe(false);
  return script ? 'one-script' : modules ? 'modules' : null;
}

describe('the PDF on a thread of its own', () => {
  it('is the same file as drawn on the main thread and from the finished brief: twelve series, overview first', async () => {
    const onThread = render('bench/brief-12.yaml', '1', 'html,pdf');
    const onMain = render('bench/brief-12.yaml', '0', 'html,pdf');
    const pdf = onThread.get('twelve-series-benchmark.pdf') as Buffer;
    expect(pdf.length).toBeGreaterThan(100_000);
    expect(pdf.equals(onMain.get('twelve-series-benchmark.pdf') as Buffer)).toBe(true);
    expect(pdf.equals(await fromFinishedBrief(join(ROOT, 'bench/brief-12.yaml')))).toBe(true);
    // The HTML, written while the thread finishes the PDF, is untouched by it.
    expect(
      onThread.get('twelve-series-benchmark.html')?.equals(onMain.get('twelve-series-benchmark.html') as Buffer),
    ).toBe(true);
  }, 240_000);

  it('is the same file, and attached the same, for a one-series brief drawn as its series is built', async () => {
    const onThread = render('bench/brief-1.yaml', '1', 'html,pdf,eml');
    const onMain = render('bench/brief-1.yaml', '0', 'html,pdf,eml');
    expect([...onThread.keys()].sort()).toEqual([...onMain.keys()].sort());
    for (const [name, bytes] of onThread) expect(bytes.equals(onMain.get(name) as Buffer), name).toBe(true);
    const pdf = onThread.get('one-series-benchmark.pdf') as Buffer;
    expect(pdf.equals(await fromFinishedBrief(join(ROOT, 'bench/brief-1.yaml')))).toBe(true);
  }, 240_000);

  it('is used when asked and by default on four or more cores, never with 0 or for JSON alone', () => {
    const out = mkdtempSync(join(tmpdir(), 'tb-pdf-thread-'));
    const args = ['render', 'bench/brief-1.yaml', '--out', out, '--format', 'html,pdf', '--quiet'];
    expect(loadsPdfWorker(args, { TRENDBRIEF_PDF_THREAD: '1' })).toBe(true);
    expect(loadsPdfWorker(args, { TRENDBRIEF_PDF_THREAD: '0' })).toBe(false);
    expect(loadsPdfWorker(args, {})).toBe(availableParallelism() >= 4);
    expect(loadsPdfWorker(['render', 'bench/brief-1.yaml', '--out', out, '--format', 'json', '--quiet'], {})).toBe(
      false,
    );
  }, 120_000);

  it('starts from the one-script build with its code cache, and from the modules with --debug', () => {
    const out = mkdtempSync(join(tmpdir(), 'tb-pdf-thread-'));
    const entry = (extra: string[]) =>
      pdfThreadOf([...extra, 'render', 'bench/brief-1.yaml', '--out', out, '--format', 'pdf', '--quiet'], {
        TRENDBRIEF_PDF_THREAD: '1',
      });
    expect(entry([])).toBe('one-script');
    expect(entry(['--debug'])).toBe('modules');
  }, 120_000);

  it('refuses a setting other than 0 or 1 in one line, writing nothing', () => {
    const out = join(mkdtempSync(join(tmpdir(), 'tb-pdf-thread-')), 'out');
    const r = runCli(['render', 'bench/brief-1.yaml', '--out', out], { TRENDBRIEF_PDF_THREAD: 'yes' });
    expect(r.code).toBe(2);
    expect(r.stderr.trim()).toBe(
      'TRENDBRIEF_PDF_THREAD is "yes", not 0 or 1 — set it to 0 (draw the PDF on the main thread) or 1 (on a thread of its own), or unset it',
    );
    expect(existsSync(out)).toBe(false);
  });

  it('ends with the build’s error and no file when the series fails after the thread was started', () => {
    const dir = mkdtempSync(join(tmpdir(), 'tb-pdf-thread-'));
    // A custom comparison past the reporting period of the last series only (its data end three months
    // earlier): found while that series is built, after the PDF's thread was started with the brief's head and
    // while four other series were built, so the thread has long begun loading when the run ends it. (With the
    // failure in the first series the run could end before the thread loaded anything: a race, not a check.)
    const csv = readFileSync(join(ROOT, 'bench/data/brief-12.csv'), 'utf8').trim().split('\n');
    writeFileSync(join(dir, 'short.csv'), `${csv.slice(0, -3).join('\n')}\n`);
    const series = ['s01', 's02', 's03', 's04']
      .map(
        (id) =>
          `  - id: ${id}\n    label: Series ${id}\n    combine: sum\n    data: { file: ${join(ROOT, 'bench/data/brief-12.csv')}, date: month, value: ${id} }\n`,
      )
      .join('');
    writeFileSync(
      join(dir, 'job.yaml'),
      `brief:\n  title: Thread errors\nseries:\n${series}  - id: s05\n    label: Short\n    combine: sum\n    data: { file: short.csv, date: month, value: s05 }\ncomparisons:\n  - custom: { label: Later, current: [2026-07, 2026-09], baseline: [2025-07, 2025-09] }\n`,
    );
    const out = join(dir, 'out');
    const args = ['render', join(dir, 'job.yaml'), '--out', out, '--format', 'html,pdf'];
    const r = runCli(args, { TRENDBRIEF_PDF_THREAD: '1', TRENDBRIEF_RECORD: 'never', TRENDBRIEF_SERIES_THREADS: '1' });
    expect(r.code).toBe(2);
    expect(r.stderr.trim()).toBe(
      `${join(dir, 'job.yaml')}: comparison "Later" reaches past the reporting period of series "s05" — end custom spans at or before the reporting period`,
    );
    expect(existsSync(out) ? readdirSync(out) : []).toEqual([]);
    // The thread had been started (so the run ended it rather than never began it).
    expect(loadsPdfWorker(args, { TRENDBRIEF_PDF_THREAD: '1', TRENDBRIEF_SERIES_THREADS: '1' }, 2)).toBe(true);
  }, 120_000);
});
