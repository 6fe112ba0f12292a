/**
 * `--pdf-engine browser` with SOURCE_DATE_EPOCH set gives the same bytes on every run, as the built-in
 * engine does (DEVELOPERS.md: with SOURCE_DATE_EPOCH set, every output is byte-identical across runs; the
 * variable is the reproducible-builds.org convention). Chromium stamps the PDF's CreationDate and ModDate with
 * the wall clock; they must carry the epoch instead, read back by poppler's pdfinfo. Real Chromium: skipped
 * without one, required when TRENDBRIEF_REQUIRE_BROWSER=1 (CI).
 */
import { execFileSync } from 'node:child_process';
import { readFileSync, rmSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { tempDir, temps, writeJob } from '../bad-input/scenario.js';
import { runCli } from '../cli/run.js';
import { browserRequired, findBrowser } from './browser.js';

const executable = findBrowser();

afterAll(() => {
  for (const t of temps) rmSync(t, { recursive: true, force: true });
});

it.runIf(browserRequired)('a browser is present, as TRENDBRIEF_REQUIRE_BROWSER=1 demands', () => {
  expect(executable).not.toBeNull();
});

describe.skipIf(executable === null)('the browser PDF with SOURCE_DATE_EPOCH', () => {
  it('is the same bytes on two runs, dated at the epoch', async () => {
    const dir = tempDir('browser-epoch');
    const job = writeJob(dir, { title: 'Epoch' });
    const env = { SOURCE_DATE_EPOCH: '1767225600', CHROMIUM_PATH: executable ?? '' };
    const pdfs: Buffer[] = [];
    for (const run of ['a', 'b']) {
      const out = join(dir, run);
      const r = runCli(['render', job, '--out', out, '--format', 'pdf', '--pdf-engine', 'browser'], env);
      expect(r.code, r.stderr).toBe(0);
      pdfs.push(readFileSync(join(out, 'epoch.pdf')));
      // The wall clock moves on by at least a second between the runs (Chromium stamps whole seconds).
      await new Promise((resolve) => setTimeout(resolve, 1100));
    }
    expect(pdfs[0].equals(pdfs[1])).toBe(true);
    // 1767225600 s after 1970-01-01T00:00:00Z is 2026-01-01T00:00:00Z (date -u -d @1767225600).
    const info = execFileSync('pdfinfo', ['-isodates', join(dir, 'a', 'epoch.pdf')], { encoding: 'utf8' });
    expect(info).toMatch(/^CreationDate:\s+2026-01-01T00:00:00(Z|\+00(:00)?)$/m);
    expect(info).toMatch(/^ModDate:\s+2026-01-01T00:00:00(Z|\+00(:00)?)$/m);
  }, 120_000);
});
