/**
 * The command line runs from the bundle `npm run build` writes (scripts/bundle.mjs, dist/bundle/). The
 * bundle must write the same files as the modules tsc writes to dist/ (same code, same pdfkit and fontkit),
 * byte for byte: a brief with Hebrew and Arabic words (fontkit's shaper and the fallback fonts from the
 * package's fonts/ folder) in an archival PDF (pdfkit's sRGB profile, read beside pdfkit's own file). A
 * Latin brief loads none of the packages the bundle puts off until first use.
 */
import { spawnSync } from 'node:child_process';
import { cpSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { BIN, EXAMPLE_COPY, ROOT } from './run.js';

const dir = mkdtempSync(join(tmpdir(), 'tb-bundle-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

/** The same command line from tsc's modules (dist/cli/main.js) rather than the bundle. */
const UNBUNDLED = join(dir, 'unbundled.mjs');
writeFileSync(
  UNBUNDLED,
  `import { main } from ${JSON.stringify(join(ROOT, 'dist/cli/main.js'))};\nmain(process.argv.slice(2)).then((code) => { process.exitCode = code; });\n`,
);

function render(entry: string, job: string, out: string, extra: string[] = [], env: Record<string, string> = {}) {
  const r = spawnSync(process.execPath, [...extra, entry, 'render', job, '--out', out, '--format', 'html,pdf'], {
    cwd: ROOT,
    env: { ...process.env, NO_COLOR: '1', TRENDBRIEF_RECORD: 'never', SOURCE_DATE_EPOCH: '1700000000', ...env },
    encoding: 'utf8',
  });
  expect(r.status, r.stderr).toBe(0);
  return readdirSync(out).sort();
}

describe('the bundled command line', () => {
  it('is what bin/trendbrief.js runs', () => {
    expect(readFileSync(BIN, 'utf8')).toContain("import('../dist/bundle/main.js')");
  });

  it('writes the same bytes as the unbundled modules: right-to-left words, archival PDF', () => {
    const job = join(dir, 'rtl');
    cpSync(join(ROOT, 'examples/water-deliveries'), job, EXAMPLE_COPY);
    const text = readFileSync(join(job, 'job.yaml'), 'utf8')
      .replace('organisation: Riverside Water Authority', 'organisation: "רשות המים — سلطة المياه"')
      .replace('outputs: [html, pdf]', 'outputs: [html, pdf]\n  pdf_archival: true');
    expect(text).toContain('pdf_archival: true');
    writeFileSync(join(job, 'job.yaml'), text);
    const a = join(dir, 'a');
    const b = join(dir, 'b');
    const files = render(BIN, join(job, 'job.yaml'), a);
    expect(render(UNBUNDLED, join(job, 'job.yaml'), b)).toEqual(files);
    expect(files.some((f) => f.endsWith('.pdf'))).toBe(true);
    for (const f of files) expect(readFileSync(join(a, f)).equals(readFileSync(join(b, f))), f).toBe(true);
    // The fallback fonts were really used (their subsets are in the file).
    const pdf = readFileSync(join(a, files.find((f) => f.endsWith('.pdf')) as string)).toString('latin1');
    expect(pdf).toMatch(/NotoSansHebrew/);
    expect(pdf).toMatch(/NotoSansArabic/);
  });

  it('a Latin brief loads none of the packages put off until first use', () => {
    const log = join(dir, 'imports.txt');
    render(
      BIN,
      'examples/water-deliveries/job.yaml',
      join(dir, 'latin'),
      [
        '--import',
        `${ROOT}test/cli/files/record-imports.mjs`,
        '--require',
        `${ROOT}test/chart/files/record-requires.cjs`,
      ],
      { IMPORT_LOG: log },
    );
    const loaded = readFileSync(log, 'utf8').split('\n');
    expect(loaded.some((u) => u.includes('/dist/bundle/main.js'))).toBe(true);
    for (const lazy of ['/brotli/', '/unicode-properties/', '/linebreak/', '/@noble/ciphers/']) {
      expect(loaded.filter((u) => u.includes(lazy))).toEqual([]);
    }
  });
});
