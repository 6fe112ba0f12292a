/**
 * `decompose --job`: one series of a job decomposed as its brief decomposes it — calendar effects, named and
 * found events taken out before the decomposition and put back after — so that the command and `render`
 * give the same components, and observed = trend + seasonal + calendar + remainder (or the product) holds.
 * The brief to compare with is the JSON `render` writes for the same job.
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readdirSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { DRAWING_MODULES, loadedOf, loadedSources } from '../support/loaded-sources.js';
import { BIN, DECOMPOSE_EXAMPLE, ROOT, runCli } from './run.js';

type Column = (number | null)[];

function briefOf(job: string) {
  const out = mkdtempSync(join(tmpdir(), 'tb-decompose-job-'));
  const r = runCli(['render', job, '--out', out, '--format', 'json', '--quiet'], { TRENDBRIEF_RECORD: 'never' });
  expect(r.stderr).toBe('');
  expect(r.code).toBe(0);
  const file = readdirSync(out).find((f) => f.endsWith('.json'))!;
  return JSON.parse(readFileSync(join(out, file), 'utf8'));
}

/** Largest |observed − (trend ⊕ seasonal ⊕ calendar ⊕ remainder)| over the range of the data. */
function identityGap(c: Record<string, Column>, multiplicative: boolean): number {
  const obs = c.observed as number[];
  const range = Math.max(...obs) - Math.min(...obs);
  let worst = 0;
  for (let t = 0; t < obs.length; t++) {
    const parts = [c.trend[t], c.seasonal[t], c.calendar ? c.calendar[t] : multiplicative ? 1 : 0, c.remainder[t]];
    if (parts.some((v) => v === null)) continue;
    const v = parts as number[];
    const back = multiplicative ? v[0] * v[1] * v[2] * v[3] : v[0] + v[1] + v[2] + v[3];
    worst = Math.max(worst, Math.abs(obs[t] - back) / range);
  }
  return worst;
}

describe('decompose --job: the brief’s own decomposition of one series', () => {
  it('harbour-freight (working days, a named step and one-off, the search on): the brief’s components, calendar included; the sum holds to 1e-9', () => {
    const job = 'examples/harbour-freight/job.yaml';
    const r = runCli(['decompose', '--job', job]);
    expect(r.stderr).toBe('');
    expect(r.code).toBe(0);
    const out = JSON.parse(r.stdout);
    const brief = briefOf(job);
    const c = brief.series[0].components;
    expect(out.dates).toEqual(c.dates);
    for (const [ours, theirs] of [
      ['observed', 'observed'],
      ['trend', 'trend'],
      ['seasonal', 'seasonal'],
      ['calendar', 'calendar'],
      ['remainder', 'remainder'],
      ['adjusted', 'adjusted'],
      ['steps', 'steps'],
      ['one_off', 'oneOff'],
    ]) {
      expect(c[theirs], theirs).toBeDefined();
      expect(out[ours], ours).toEqual(c[theirs]);
    }
    expect(identityGap(out, false)).toBeLessThanOrEqual(1e-9);
    // The effects the brief reports: the working-day group kept, both named events estimated.
    const e = out.settings.effects;
    expect(e.skipped).toBeNull();
    expect(e.model).toBe(brief.series[0].effects.model);
    expect(e.groups.find((g: { name: string }) => g.name === 'working days').kept).toBe(true);
    expect(e.events.map((v: { label: string | null }) => v.label)).toEqual(
      expect.arrayContaining(['Second container berth opened', 'Storm closure']),
    );
    expect(out.settings.extension).toBe(brief.series[0].extension.model);
  });

  it('online-orders (multiplicative, the default search finds March 2025): CSV with the brief’s components; the product holds to 1e-9', () => {
    const job = 'examples/online-orders/job.yaml';
    const r = runCli(['decompose', '--job', job, '--format', 'csv']);
    expect(r.code).toBe(0);
    const [head, ...rows] = r.stdout.trim().split('\n');
    const names = head.split(',');
    const brief = briefOf(job);
    const s = brief.series[0];
    expect(s.settings.model).toBe('multiplicative');
    expect(s.effects.events.length).toBeGreaterThan(0);
    const col = (name: string): Column =>
      rows.map((line) => {
        const v = line.split(',')[names.indexOf(name)];
        return v === '' ? null : Number(v);
      });
    expect(names.slice(0, 4)).toEqual(['date', 'observed', 'trend', 'seasonal']);
    expect(names).toContain('one_off');
    for (const name of ['observed', 'trend', 'seasonal', 'remainder', 'adjusted']) {
      expect(col(name), name).toEqual(s.components[name]);
    }
    expect(col('one_off')).toEqual(s.components.oneOff);
    const c = Object.fromEntries(['observed', 'trend', 'seasonal', 'remainder'].map((k) => [k, col(k)]));
    expect(identityGap(c, true)).toBeLessThanOrEqual(1e-9);
  });

  it('bad use: a method option beside --job, an unknown series, --series without --job — one line, exit 2', () => {
    const job = 'examples/harbour-freight/job.yaml';
    const a = runCli(['decompose', '--job', job, '--method', 'classical']);
    expect(a.code).toBe(2);
    expect(a.stderr.trim().split('\n')).toHaveLength(1);
    expect(a.stderr).toContain('--method cannot be used with --job');
    const b = runCli(['decompose', '--job', job, '--series', 'nope']);
    expect(b.code).toBe(2);
    expect(b.stderr).toContain('freight');
    const c = runCli([...DECOMPOSE_EXAMPLE, '--series', 'x']);
    expect(c.code).toBe(2);
    expect(c.stderr).toContain('--series needs --job');
  });

  it('loads no chart, PDF, HTML template or email module', () => {
    const log = join(mkdtempSync(join(tmpdir(), 'tb-imports-')), 'imports.txt');
    const r = spawnSync(
      process.execPath,
      [
        '--import',
        `${ROOT}test/cli/files/record-imports.mjs`,
        BIN,
        'decompose',
        '--job',
        'examples/harbour-freight/job.yaml',
      ],
      { cwd: ROOT, env: { ...process.env, IMPORT_LOG: log, TRENDBRIEF_RECORD: 'never' }, encoding: 'utf8' },
    );
    expect(r.status).toBe(0);
    const urls = loadedSources(readFileSync(log, 'utf8').split('\n'));
    expect(urls.some((u) => u.includes('/src/adjust/regression-effects.ts'))).toBe(true);
    expect(loadedOf(urls, DRAWING_MODULES)).toEqual([]);
  });
});
