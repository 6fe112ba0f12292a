/**
 * Start-up: a brief with the built-in stylesheet and no SVG logo loads neither css-tree (about 120 modules,
 * needed only to check a stylesheet the build has not checked) nor htmlparser2 (only for an SVG logo).
 * Checked on the built command line (dist/) with every module load logged, as test/chart/imports.test.ts
 * does; and the other way round, an SVG logo does load htmlparser2 and still comes out cleaned.
 */
import { spawnSync } from 'node:child_process';
import { cpSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { BIN, ROOT } from '../cli/run.js';
import { loadedSources } from '../support/loaded-sources.js';

const dir = mkdtempSync(join(tmpdir(), 'tb-lazy-imports-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

function loadedBy(name: string, args: string[]): string[] {
  const log = join(dir, `${name}.txt`);
  const r = spawnSync(
    process.execPath,
    [
      '--import',
      `${ROOT}test/cli/files/record-imports.mjs`,
      '--require',
      `${ROOT}test/chart/files/record-requires.cjs`,
      ...args,
    ],
    {
      cwd: ROOT,
      env: { ...process.env, IMPORT_LOG: log, NO_COLOR: '1', TRENDBRIEF_RECORD: 'never' },
      encoding: 'utf8',
    },
  );
  expect(r.status, r.stderr).toBe(0);
  return loadedSources(readFileSync(log, 'utf8').split('\n'));
}

describe('modules a brief loads', () => {
  it('no css-tree or htmlparser2 for the built-in stylesheet and no logo', () => {
    const out = join(dir, 'plain');
    const loaded = loadedBy('plain', [
      BIN,
      'render',
      'examples/water-deliveries/job.yaml',
      '--out',
      out,
      '--format',
      'html,pdf',
    ]);
    expect(loaded.some((u) => u.includes('/src/render/html.ts'))).toBe(true);
    expect(loaded.filter((u) => u.includes('/node_modules/css-tree/'))).toEqual([]);
    expect(loaded.filter((u) => u.includes('/node_modules/htmlparser2/'))).toEqual([]);
  });

  it('htmlparser2 for an SVG logo, which is still cleaned', () => {
    const job = join(dir, 'logo');
    cpSync(join(ROOT, 'examples/water-deliveries'), job, { recursive: true });
    writeFileSync(
      join(job, 'logo.svg'),
      '<svg xmlns="http://www.w3.org/2000/svg" width="8" height="4"><script>alert(1)</script><rect width="8" height="4"/></svg>',
    );
    const text = readFileSync(join(job, 'job.yaml'), 'utf8').replace(/^brief:\n/m, 'brief:\n  logo: logo.svg\n');
    writeFileSync(join(job, 'job.yaml'), text);
    const out = join(dir, 'logo-out');
    const loaded = loadedBy('logo', [BIN, 'render', join(job, 'job.yaml'), '--out', out, '--format', 'html']);
    expect(loaded.some((u) => u.includes('/node_modules/htmlparser2/'))).toBe(true);
    const html = readFileSync(join(out, 'water-delivered-north-zone.html'), 'utf8');
    expect(html).not.toContain('alert(1)');
    expect(html).toContain('data:image/svg+xml;base64,');
  });
});
