/**
 * A batch of briefs runs in a second process started with --single-threaded-gc (bin/batch-process.js): which
 * command lines count as batches, that the option list it skips is render's own, that a batch through the
 * command line writes the same briefs as the batch run in this process, and that a signal sent to the
 * waiting process alone still ends the run with no temporary left behind.
 */
import { type ChildProcess, spawn, spawnSync } from 'node:child_process';
import { mkdirSync, mkdtempSync, readdirSync, readFileSync, rmSync, watch, writeFileSync } from 'node:fs';
import { availableParallelism, tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { BATCH_FLAGS, isBatch, jobArguments, POOL_FROM, VALUE_OPTIONS } from '../../bin/batch-process.js';
import { RENDER_OPTIONS } from '../../src/cli/render.js';
import { loadedSources } from '../support/loaded-sources.js';
import { BIN, ROOT, runCli } from './run.js';

const dir = mkdtempSync(join(tmpdir(), 'tb-batch-process-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

/** A monthly job of four years (or `days` days); with `groups`, one series per branch and a `group_by`. */
function writeJob(at: string, groups: string[] = [], style: 'block' | 'flow' = 'block', days = 0): string {
  mkdirSync(join(at, 'data'), { recursive: true });
  const date = days ? 'day' : 'month';
  const rows = [groups.length ? `${date},branch,value` : `${date},value`];
  for (const [j, g] of (groups.length ? groups : [null]).entries()) {
    const n = days || 48;
    for (let i = 0; i < n; i++) {
      const month = days
        ? new Date(Date.UTC(2016, 0, 1 + i)).toISOString().slice(0, 10)
        : `${2021 + Math.floor(i / 12)}-${String((i % 12) + 1).padStart(2, '0')}`;
      const value = (100 * (j + 1) + i / 10 + 10 * Math.sin((2 * Math.PI * i) / (days ? 7 : 12))).toFixed(1);
      rows.push(g === null ? `${month},${value}` : `${month},${g},${value}`);
    }
  }
  writeFileSync(join(at, 'data/rows.csv'), `${rows.join('\n')}\n`);
  const group = groups.length ? 'group_by: branch' : '';
  const data =
    style === 'flow'
      ? `    data: {file: data/rows.csv, date: ${date}, value: value${group ? `, ${group}` : ''}}`
      : `    data:\n      file: data/rows.csv\n      date: ${date}\n      value: value\n${group ? `      ${group}\n` : ''}`;
  const file = join(at, 'job.yaml');
  writeFileSync(
    file,
    `brief:\n  title: Depot loads\n  outputs: [json]\nseries:\n  - id: load\n    label: Load\n    unit: t\n    combine: sum\n${data.replace(/\n$/, '')}\n`,
  );
  return file;
}

describe('which command lines are batches', () => {
  const plain = writeJob(join(dir, 'plain'));
  const grouped = writeJob(join(dir, 'grouped'), ['North', 'South']);
  const flow = writeJob(join(dir, 'flow'), ['North', 'South'], 'flow');
  const three = join(dir, 'three');
  const four = join(dir, 'four');
  for (const [folder, n] of [
    [three, 3],
    [four, POOL_FROM],
  ] as const)
    for (let k = 0; k < n; k++) writeJob(join(folder, `job-${k}`));
  // A pattern counts what it matches, as render reads it.
  const flat = join(dir, 'flat');
  mkdirSync(flat);
  for (let k = 0; k < POOL_FROM; k++) writeFileSync(join(flat, `a${k}.yaml`), '');
  const env = {};

  it('finds the job arguments among render’s options', () => {
    expect(jobArguments(['render', 'a.yaml', '--out', 'o', '--format=html', 'b.yaml', '--watch', 'c.yaml'])).toEqual([
      'a.yaml',
      'b.yaml',
      'c.yaml',
    ]);
    expect(jobArguments(['--quiet', 'render', '--period', '2026-01', '--', '--odd.yaml'])).toEqual(['--odd.yaml']);
  });

  it('skips a value after exactly the options of render that take one', () => {
    const taking = Object.entries(RENDER_OPTIONS)
      .filter(([, o]) => o.type === 'string')
      .map(([name]) => name)
      .sort();
    expect([...VALUE_OPTIONS].sort()).toEqual(taking);
  });

  it('counts a job with groups, four job files or more, and nothing less', () => {
    expect(isBatch(['render', plain], env, 2)).toBe(false);
    expect(isBatch(['render', grouped], env, 2)).toBe(true);
    expect(isBatch(['render', flow, '--out', join(dir, 'x')], env, 2)).toBe(true);
    expect(isBatch(['render', three], env, 2)).toBe(false);
    // A job with groups counts inside a folder too (two jobs and a grouped one: fewer than four files).
    const mixed = join(dir, 'mixed');
    writeJob(join(mixed, 'a'));
    writeJob(join(mixed, 'b'), ['North', 'South']);
    expect(isBatch(['render', mixed], env, 2)).toBe(true);
    expect(isBatch(['render', join(mixed, 'a')], env, 2)).toBe(false);
    expect(isBatch(['render', four], env, 2)).toBe(true);
    expect(isBatch(['render', join(flat, 'a?.yaml')], env, 2)).toBe(true);
    expect(isBatch(['render', join(flat, 'b*.yaml')], env, 2)).toBe(false);
    expect(isBatch(['render', plain, plain, plain, plain], env, 2)).toBe(true);
    // One core builds in-process; the opt-out and the batch's own process never start another.
    expect(isBatch(['render', grouped], env, 1)).toBe(false);
    expect(isBatch(['render', grouped], { TRENDBRIEF_BATCH_PROCESS: '0' }, 2)).toBe(false);
    expect(isBatch(['render', grouped], { TRENDBRIEF_BATCH_PROCESS: 'child' }, 2)).toBe(false);
  });
});

describe('a batch from the command line', () => {
  const groups = ['Ash', 'Birch', 'Cedar', 'Elm', 'Oak'];
  const job = writeJob(join(dir, 'run'), groups);

  it('runs in its own process and writes what the batch in this process writes', () => {
    const env = { SOURCE_DATE_EPOCH: '1767225600', TRENDBRIEF_RECORD: 'never' };
    const apart = runCli(['--verbose', 'render', job, '--out', join(dir, 'apart')], env);
    expect(apart.code, apart.stderr).toBe(0);
    expect(apart.stderr).toContain(`the batch runs in a process of its own, started with ${BATCH_FLAGS.join(' ')}`);
    const here = runCli(['render', job, '--out', join(dir, 'here')], { ...env, TRENDBRIEF_BATCH_PROCESS: '0' });
    expect(here.code, here.stderr).toBe(0);
    const names = readdirSync(join(dir, 'apart')).sort();
    expect(names).toHaveLength(groups.length);
    expect(readdirSync(join(dir, 'here')).sort()).toEqual(names);
    for (const f of names)
      expect(readFileSync(join(dir, 'apart', f)).equals(readFileSync(join(dir, 'here', f))), f).toBe(true);
  }, 120_000);

  it('runs its pool from the one-script build with its code cache, writing what the modules write', () => {
    // Kept in this process (TRENDBRIEF_BATCH_PROCESS=0) so that every module its workers load is logged.
    const run = (extra: string[], out: string) => {
      const log = join(dir, `${out}.imports.txt`);
      const r = spawnSync(
        process.execPath,
        [
          // Piscina loads a pool's worker module through require, which the import hooks do not see.
          ...['--import', `${ROOT}test/cli/files/record-imports.mjs`],
          ...['--require', `${ROOT}test/cli/files/record-requires.cjs`],
          ...[BIN, ...extra, 'render', job, '--out', join(dir, out)],
        ],
        {
          cwd: ROOT,
          encoding: 'utf8',
          env: {
            ...process.env,
            SOURCE_DATE_EPOCH: '1767225600',
            TRENDBRIEF_RECORD: 'never',
            TRENDBRIEF_BATCH_PROCESS: '0',
            IMPORT_LOG: log,
          },
        },
      );
      expect(r.status, r.stderr).toBe(0);
      const loaded = loadedSources(readFileSync(log, 'utf8').split('\n'));
      return {
        script: loaded.some((u) => u.endsWith('/bin/batch-thread.js')),
        modules: loaded.some((u) => u.endsWith('/src/cli/worker.ts')),
      };
    };
    const pooled = availableParallelism() >= 2;
    expect(run([], 'one-script')).toEqual({ script: pooled, modules: false });
    expect(run(['--debug'], 'modules')).toEqual({ script: false, modules: pooled });
    const names = readdirSync(join(dir, 'one-script')).sort();
    expect(names).toHaveLength(groups.length);
    expect(readdirSync(join(dir, 'modules')).sort()).toEqual(names);
    for (const f of names)
      expect(readFileSync(join(dir, 'one-script', f)).equals(readFileSync(join(dir, 'modules', f))), f).toBe(true);
  }, 120_000);

  it('passes on its exit code', () => {
    writeFileSync(
      join(dir, 'run/data/rows.csv'),
      `${readFileSync(join(dir, 'run/data/rows.csv'), 'utf8')}2025-01,Oak,oops\n`,
    );
    const r = runCli(['render', job, '--out', join(dir, 'failing')], { TRENDBRIEF_RECORD: 'never' });
    expect(r.code, r.stderr).toBe(1);
    expect(r.stderr).toContain('Oak');
    expect(readdirSync(join(dir, 'failing'))).toHaveLength(groups.length - 1);
  }, 120_000);

  it('ends by the signal sent to the waiting process, its temporaries removed', async () => {
    // Ten years of days a group: JSON of a few megabytes each, long enough to be caught while written.
    const long = writeJob(join(dir, 'long'), groups, 'block', 3653);
    let caught = 0;
    for (let attempt = 0; attempt < 6 && caught === 0; attempt++) {
      const out = join(dir, `killed-${attempt}`);
      mkdirSync(out);
      const child: ChildProcess = spawn(process.execPath, [BIN, 'render', long, '--out', out], {
        cwd: ROOT,
        env: { ...process.env, NO_COLOR: '1', TRENDBRIEF_RECORD: 'never' },
      });
      let sent = false;
      const watcher = watch(out, (_, name) => {
        if (sent || !name || !String(name).endsWith('.tmp')) return;
        sent = true;
        child.kill('SIGTERM');
      });
      const ended = await new Promise<NodeJS.Signals | null>((resolve) => child.on('exit', (_c, s) => resolve(s)));
      watcher.close();
      if (!sent) continue;
      caught++;
      expect(ended).toBe('SIGTERM');
      expect(readdirSync(out).filter((f) => f.endsWith('.tmp'))).toEqual([]);
    }
    expect(caught).toBe(1);
  }, 180_000);
});
