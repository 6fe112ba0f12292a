/**
 * A brief of many series is built on two threads by the built command line (src/brief/share.ts, which runs
 * only from dist/: under vitest the sources build one series after another). Checked against the same brief
 * built here one series at a time: the HTML page is the same byte for byte, and a job of six series whose
 * third and fifth fail reports the third, as the one-at-a-time build does.
 */
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { buildBriefs } from '../../src/brief/build.js';
import { loadJob } from '../../src/job/load.js';
import { renderHtml } from '../../src/render/html.js';
import { ROOT, runCli } from '../cli/run.js';

const EPOCH = 1767225600; // 2026-01-01T00:00:00Z
const VERSION = (JSON.parse(readFileSync(join(ROOT, 'package.json'), 'utf8')) as { version: string }).version;

async function oneAtATime(jobFile: string): Promise<{ html: string | null; error: string | null }> {
  const job = loadJob(jobFile);
  const [unit] = await buildBriefs(job, { toolVersion: VERSION, charts: true, epoch: EPOCH });
  if (unit.error || !unit.brief) return { html: null, error: unit.error?.oneLine() ?? 'no brief' };
  return { html: renderHtml(unit.brief, { templatesDir: job.brief.templates }), error: null };
}

describe('series built on two threads', () => {
  it('give the same HTML brief as series built one after another (bench/brief-12.yaml, twelve series)', async () => {
    const out = mkdtempSync(join(tmpdir(), 'tb-share-'));
    const r = runCli(['render', 'bench/brief-12.yaml', '--out', out, '--format', 'html'], {
      SOURCE_DATE_EPOCH: String(EPOCH),
    });
    expect(r.code, r.stderr).toBe(0);
    const shared = readFileSync(join(out, 'twelve-series-benchmark.html'), 'utf8');
    const { html } = await oneAtATime(join(ROOT, 'bench/brief-12.yaml'));
    expect(html).not.toBeNull();
    expect(shared === html).toBe(true);
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
    const r = runCli(['render', join(dir, 'job.yaml'), '--out', join(dir, 'out'), '--format', 'html']);
    expect(r.code).toBe(2);
    expect(r.stderr.trim()).toBe(expected.error);
  }, 180_000);
});
