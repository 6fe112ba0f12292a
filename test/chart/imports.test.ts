/**
 * Drawing a brief's charts loads no vega: the chart stage builds scenes and writes SVG itself, and the
 * vega-lite specs are only descriptions (src/chart/index.ts). Checked on the built code (dist/, which
 * `npm test` builds first) in a child process whose every module load is logged — ES modules by a resolve
 * hook, CommonJS modules from require.cache at exit — for the library's brief path and for the command line
 * writing HTML and PDF. svg-to-pdfkit, the PDF's fallback for SVG without a scene, is not loaded either, nor resvg.
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { BIN, ROOT } from '../cli/run.js';
import { loadedSources } from '../support/loaded-sources.js';

const dir = mkdtempSync(join(tmpdir(), 'tb-chart-imports-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

/** Runs node with args, logging every module it loads; the log's lines. */
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
    { cwd: ROOT, env: { ...process.env, IMPORT_LOG: log, NO_COLOR: '1' }, encoding: 'utf8' },
  );
  expect(r.status, r.stderr).toBe(0);
  return loadedSources(readFileSync(log, 'utf8').split('\n'));
}

// resvg (a native module) is only for the email's PNG pictures.
const HEAVY = ['/node_modules/vega', 'svg-to-pdfkit', '@resvg/resvg-js'];

describe('the brief’s charts', () => {
  it('are drawn by the library without loading vega or vega-lite', () => {
    const loaded = loadedBy('library', [`${ROOT}test/chart/files/build-charts.mjs`]);
    // The log is real: it holds the chart stage itself, and a CommonJS module (the csv or yaml reader's kin).
    expect(loaded.some((u) => u.includes('/dist/chart/scene-svg.js'))).toBe(true);
    expect(loaded.some((u) => u.includes('/dist/chart/index.js'))).toBe(true);
    for (const heavy of HEAVY) expect(loaded.filter((u) => u.includes(heavy))).toEqual([]);
  });

  it('are drawn into HTML and PDF by the command line without loading vega, vega-lite or svg-to-pdfkit', () => {
    const out = join(dir, 'out');
    const loaded = loadedBy('cli', [
      BIN,
      'render',
      'examples/water-deliveries/job.yaml',
      '--out',
      out,
      '--format',
      'html,pdf',
    ]);
    expect(loaded.some((u) => u.includes('/src/render/pdf/charts.ts'))).toBe(true);
    // pdfkit is in the bundle (scripts/bundle.mjs): its file is among the chunk's sources.
    expect(loaded.some((u) => /node_modules\/pdfkit\//.test(u))).toBe(true);
    for (const heavy of HEAVY) expect(loaded.filter((u) => u.includes(heavy))).toEqual([]);
  });
});
