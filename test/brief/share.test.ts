/**
 * A brief of many series is built on two threads by the built command line (src/brief/share.ts, which runs
 * only from dist/: under vitest the sources build one series after another) when TRENDBRIEF_SERIES_THREADS
 * is 2, as it is by default on four or more cores; these tests set it. Checked against the same brief
 * built here one series at a time: the HTML page is the same byte for byte, and so is the PDF, which the
 * command line draws while the series are still being built (cli/render-files.ts); a job of six series whose
 * third and fifth fail reports the third, as the one-at-a-time build does, and writes no file.
 */

import { spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { availableParallelism, tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { buildBriefs } from '../../src/brief/build.js';
import { loadJob } from '../../src/job/load.js';
import { renderHtml } from '../../src/render/html.js';
import { renderPdf } from '../../src/render/pdf/index.js';
import { BIN, ROOT, runCli } from '../cli/run.js';
import { loadedSources } from '../support/loaded-sources.js';

const EPOCH = 1767225600; // 2026-01-01T00:00:00Z
const TWO = { TRENDBRIEF_SERIES_THREADS: '2' };
const VERSION = (JSON.parse(readFileSync(join(ROOT, 'package.json'), 'utf8')) as { version: string }).version;

async function oneAtATime(
  jobFile: string,
  pdf = false,
): Promise<{ html: string | null; pdf: Buffer | null; error: string | null }> {
  const job = loadJob(jobFile);
  const [unit] = await buildBriefs(job, { toolVersion: VERSION, charts: true, epoch: EPOCH });
  if (unit.error || !unit.brief) return { html: null, pdf: null, error: unit.error?.oneLine() ?? 'no brief' };
  return {
    html: renderHtml(unit.brief, { templatesDir: job.brief.templates }),
    pdf: pdf ? await renderPdf(unit.brief, { archival: job.brief.pdfArchival }) : null,
    error: null,
  };
}

describe('series built on two threads', () => {
  it('give the same HTML brief as series built one after another (bench/brief-12.yaml, twelve series)', async () => {
    const out = mkdtempSync(join(tmpdir(), 'tb-share-'));
    const r = runCli(['render', 'bench/brief-12.yaml', '--out', out, '--format', 'html,pdf'], {
      ...TWO,
      SOURCE_DATE_EPOCH: String(EPOCH),
    });
    expect(r.code, r.stderr).toBe(0);
    const shared = readFileSync(join(out, 'twelve-series-benchmark.html'), 'utf8');
    const { html, pdf } = await oneAtATime(join(ROOT, 'bench/brief-12.yaml'), true);
    expect(html).not.toBeNull();
    expect(shared === html).toBe(true);
    // Drawn series by series as the two threads finished them, against drawn from the finished brief.
    const drawnAsBuilt = readFileSync(join(out, 'twelve-series-benchmark.pdf'));
    expect(pdf?.length).toBeGreaterThan(100_000);
    expect(drawnAsBuilt.equals(pdf as Buffer)).toBe(true);
  }, 180_000);

  it('report the first failing series in the job’s order', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'tb-share-'));
    // Twelve months: shorter than the two full years before the reporting period a brief needs.
    const months = Array.from({ length: 12 }, (_, i) => `2025-${String(i + 1).padStart(2, '0')},${100 + i}`);
    writeFileSync(join(dir, 'short.csv'), `month,v\n${months.join('\n')}\n`);
    const series = (id: string, file: string, value: string) => `  - id: ${id}
    label: ${id}
    combine: sum
    data: { file: ${file}, date: month, value: ${value} }
`;
    const data = join(ROOT, 'bench/data/brief-12.csv');
    writeFileSync(
      join(dir, 'job.yaml'),
      `brief:\n  title: Share errors\nseries:\n${series('first', data, 's01')}${series('second', data, 's02')}${series('third', 'short.csv', 'v')}${series('fourth', data, 's04')}${series('fifth', 'short.csv', 'v')}${series('sixth', data, 's06')}`,
    );
    const expected = await oneAtATime(join(dir, 'job.yaml'));
    expect(expected.error).toMatch(/series "third"/);
    const r = runCli(['render', join(dir, 'job.yaml'), '--out', join(dir, 'out'), '--format', 'html,pdf'], TWO);
    expect(r.code).toBe(2);
    expect(r.stderr.trim()).toBe(expected.error);
    // The PDF begun while the first series were built is dropped with the rest.
    expect(existsSync(join(dir, 'out')) ? readdirSync(join(dir, 'out')) : []).toEqual([]);
  }, 180_000);

  it('drop the PDF begun while building when a later series fails in its decomposition', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'tb-share-'));
    // Four years of months, one of them zero: a multiplicative model cannot take it (found only after the
    // series' reporting period is known, so the PDF brief has been begun).
    const months = Array.from(
      { length: 48 },
      (_, i) => `${2022 + Math.floor(i / 12)}-${String((i % 12) + 1).padStart(2, '0')},${i === 30 ? 0 : 100 + i}`,
    );
    writeFileSync(join(dir, 'zero.csv'), `month,v\n${months.join('\n')}\n`);
    const data = join(ROOT, 'bench/data/brief-12.csv');
    const ids = ['s01', 's02', 'zero', 's04', 's05', 's06', 's07'];
    const series = ids
      .map(
        (id) => `  - id: ${id}
    label: ${id}
    combine: sum
    data: { file: ${id === 'zero' ? 'zero.csv' : data}, date: month, value: ${id === 'zero' ? 'v' : id} }
${id === 'zero' ? '    decomposition: { model: multiplicative }\n' : ''}`,
      )
      .join('');
    writeFileSync(join(dir, 'job.yaml'), `brief:\n  title: Share errors\nseries:\n${series}`);
    const expected = await oneAtATime(join(dir, 'job.yaml'));
    expect(expected.error).toMatch(/multiplicative/);
    const out = join(dir, 'out');
    const r = runCli(['render', join(dir, 'job.yaml'), '--out', out, '--format', 'pdf'], TWO);
    expect(r.code).toBe(2);
    expect(r.stderr.trim()).toBe(expected.error);
    expect(existsSync(out) ? readdirSync(out) : []).toEqual([]);
  }, 180_000);

  /** Runs the command line with every module load logged (test/cli/files/record-imports.mjs, which the
   * worker threads inherit); whether the series worker was loaded. */
  function loadsSeriesWorker(args: string[], env: Record<string, string> = TWO): boolean {
    const log = join(mkdtempSync(join(tmpdir(), 'tb-share-')), 'imports.txt');
    const r = spawnSync(process.execPath, ['--import', `${ROOT}test/cli/files/record-imports.mjs`, BIN, ...args], {
      cwd: ROOT,
      env: { ...process.env, TRENDBRIEF_SERIES_THREADS: '', ...env, IMPORT_LOG: log, NO_COLOR: '1' },
      encoding: 'utf8',
    });
    expect(r.status, r.stderr).toBe(0);
    // `render` runs the one-script build, whose thread starts from bin/series-thread.js with the code cache
    // (src/thread-entry.ts), never from the modules' series-worker.js.
    const loaded = loadedSources(readFileSync(log, 'utf8').split('\n'));
    expect(loaded.some((u) => u.endsWith('/src/brief/series-worker.ts'))).toBe(false);
    return loaded.some((u) => u.endsWith('/bin/series-thread.js'));
  }

  it('start the second thread early only for a job of six or more series', () => {
    const out = mkdtempSync(join(tmpdir(), 'tb-share-'));
    const render = (job: string) => ['render', job, '--out', out, '--format', 'html,pdf', '--quiet'];
    expect(loadsSeriesWorker(render('bench/brief-12.yaml'))).toBe(true);
    // One series: no second thread is loaded at all (it would cost a small brief start-up time).
    expect(loadsSeriesWorker(render('examples/water-deliveries/job.yaml'))).toBe(false);
    // JSON alone draws no charts and builds on one thread.
    expect(loadsSeriesWorker(['render', 'bench/brief-12.yaml', '--out', out, '--format', 'json', '--quiet'])).toBe(
      false,
    );
  }, 120_000);

  it('use one thread when told to, and by default on fewer than four cores', () => {
    const out = mkdtempSync(join(tmpdir(), 'tb-share-'));
    const args = ['render', 'bench/brief-12.yaml', '--out', out, '--format', 'html,pdf', '--quiet'];
    expect(loadsSeriesWorker(args, { TRENDBRIEF_SERIES_THREADS: '1' })).toBe(false);
    expect(loadsSeriesWorker(args, {})).toBe(availableParallelism() >= 4);
  }, 120_000);

  it('refuse a thread count other than 1 or 2, in one line, before any work', () => {
    const out = join(mkdtempSync(join(tmpdir(), 'tb-share-')), 'out');
    const r = runCli(['render', 'bench/brief-12.yaml', '--out', out], { TRENDBRIEF_SERIES_THREADS: 'many' });
    expect(r.code).toBe(2);
    expect(r.stderr.trim()).toBe(
      'TRENDBRIEF_SERIES_THREADS is "many", not 1 or 2 — set it to 1 (one thread) or 2 (two threads for a brief of six or more series), or unset it',
    );
    expect(existsSync(out)).toBe(false);
  });

  it('drop the early thread when the job is split into groups, and still write every brief', () => {
    const dir = mkdtempSync(join(tmpdir(), 'tb-share-'));
    const rows = ['a', 'b', 'c'].flatMap((grp, k) =>
      Array.from(
        { length: 48 },
        (_, i) =>
          `${2022 + Math.floor(i / 12)}-${String((i % 12) + 1).padStart(2, '0')},${grp},${100 + k * 10 + i + (i % 12)}`,
      ),
    );
    writeFileSync(join(dir, 'grouped.csv'), `month,grp,v\n${rows.join('\n')}\n`);
    const series = Array.from(
      { length: 6 },
      (_, i) => `  - id: m${i}
    label: Measure ${i}
    combine: sum
    data: { file: grouped.csv, date: month, value: v, group_by: grp }
`,
    ).join('');
    writeFileSync(join(dir, 'job.yaml'), `brief:\n  title: Grouped\nseries:\n${series}`);
    const r = runCli(
      ['render', join(dir, 'job.yaml'), '--out', join(dir, 'out'), '--format', 'html,pdf', '--quiet'],
      TWO,
    );
    expect(r.code, r.stderr).toBe(0);
    expect(readdirSync(join(dir, 'out')).sort()).toEqual([
      'grouped-a.html',
      'grouped-a.pdf',
      'grouped-b.html',
      'grouped-b.pdf',
      'grouped-c.html',
      'grouped-c.pdf',
    ]);
  }, 120_000);
});
