/** The decompose command must start fast: it may not load the chart, PDF, HTML or email stack. */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { DRAWING_MODULES, loadedOf, loadedSources } from '../support/loaded-sources.js';
import { BIN, DECOMPOSE_EXAMPLE, ROOT } from './run.js';

describe('decompose start-up', () => {
  it('loads no chart, PDF, HTML template or email module', () => {
    const log = join(mkdtempSync(join(tmpdir(), 'tb-imports-')), 'imports.txt');
    const r = spawnSync(
      process.execPath,
      ['--import', `${ROOT}test/cli/files/record-imports.mjs`, BIN, ...DECOMPOSE_EXAMPLE],
      { cwd: ROOT, env: { ...process.env, IMPORT_LOG: log }, encoding: 'utf8' },
    );
    expect(r.status).toBe(0);
    const urls = loadedSources(readFileSync(log, 'utf8').split('\n'));
    expect(urls.some((u) => u.includes('/src/decompose/stl.ts'))).toBe(true);
    expect(loadedOf(urls, DRAWING_MODULES)).toEqual([]);
  });
});
