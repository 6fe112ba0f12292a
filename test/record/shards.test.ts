/**
 * Many machines, one record: four shard processes of one run, started together, each taking its shard from
 * a scheduler's environment (Slurm for the SQLite file, a Kubernetes indexed Job for PostgreSQL), record
 * into one real database. The union is every brief once, the chain verifies, and the run's index lists
 * them all. Then a process killed while appending (SIGKILL, no chance to clean up) leaves the record whole.
 */
import { type ChildProcess, spawn, spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { verifyChain } from '../../src/record/chain.js';
import { openRecord, type RecordPlace } from '../../src/record/store.js';
import { BIN, ROOT, runCli } from '../cli/run.js';
import { createDatabase, describePostgres, type TestDatabase } from '../support/postgres.js';

const GROUPS = ['ash', 'beech', 'cedar', 'elm', 'fir', 'hazel', 'larch', 'oak'];
const SHARDS = 4;

/** A job of eight groups, one brief each, with monthly data 2022-01 to 2026-09 (invented, seeded by index). */
function estate(record: string): string {
  const dir = mkdtempSync(join(tmpdir(), 'tb-shards-'));
  const rows = ['month,site,visits'];
  GROUPS.forEach((g, k) => {
    for (let i = 0; i < 57; i++) {
      const month = `${2022 + Math.floor(i / 12)}-${String((i % 12) + 1).padStart(2, '0')}`;
      const v = 1000 + 50 * k + 3 * i + 80 * Math.sin((2 * Math.PI * i) / 12) + ((i * 37 + k * 11) % 17);
      rows.push(`${month},${g},${v.toFixed(1)}`);
    }
  });
  writeFileSync(join(dir, 'visits.csv'), `${rows.join('\n')}\n`);
  writeFileSync(
    join(dir, 'job.yaml'),
    `brief:\n  title: Site visits\nseries:\n  - id: visits\n    label: Visits\n    combine: sum\n    data: { file: visits.csv, date: month, value: visits, group_by: site }\n${record}`,
  );
  return dir;
}

function spawnShard(
  dir: string,
  env: Record<string, string>,
  period: string,
): Promise<{ code: number; stderr: string }> {
  return new Promise((resolve) => {
    const child: ChildProcess = spawn(
      process.execPath,
      [
        BIN,
        'render',
        join(dir, 'job.yaml'),
        '--out',
        join(dir, 'out'),
        '--format',
        'json',
        '--record',
        'always',
        '--period',
        period,
      ],
      {
        cwd: ROOT,
        env: { ...process.env, NO_COLOR: '1', TRENDBRIEF_RECORD: 'auto', ...env },
        stdio: ['ignore', 'ignore', 'pipe'],
      },
    );
    let stderr = '';
    child.stderr?.on('data', (b: Buffer) => {
      stderr += b.toString();
    });
    child.on('close', (code) => resolve({ code: code ?? -1, stderr }));
  });
}

function shardChecks(
  setup: () => { dir: string; place: RecordPlace; env: Record<string, string>; locate: string[] },
  schedulerEnv: (k: number, run: string) => Record<string, string>,
): void {
  it('records every brief of four concurrent shards once, in one unbroken chain', async () => {
    const { dir, place, env, locate } = setup();
    for (const [run, period] of [
      ['night-1', '2026-08'],
      ['night-2', '2026-09'],
    ]) {
      const results = await Promise.all(
        Array.from({ length: SHARDS }, (_, i) => spawnShard(dir, { ...env, ...schedulerEnv(i, run) }, period)),
      );
      for (const r of results) expect(r.code, r.stderr).toBe(0);
    }
    const store = await openRecord(place, { toolVersion: '0.1.0', write: false, env });
    try {
      const entries = await store.entries();
      expect(verifyChain(entries)).toEqual({ count: 2 * GROUPS.length, broken: null });
      for (const [run, period] of [
        ['night-1', '2026-08-01'],
        ['night-2', '2026-09-01'],
      ]) {
        const mine = entries.filter((e) => e.run === run);
        expect(mine.map((e) => e.group).sort()).toEqual(GROUPS);
        expect(new Set(mine.map((e) => e.period))).toEqual(new Set([period]));
        expect(new Set(mine.map((e) => e.shard))).toEqual(new Set(['1/4', '2/4', '3/4', '4/4']));
        expect(mine.every((e) => e.issue === 1)).toBe(true);
      }
      // The second night's briefs read the first night's: each says what the August brief said.
      const september = JSON.parse(entries.filter((e) => e.run === 'night-2')[0].body) as {
        statements: { id: string; text: string }[];
      };
      expect(september.statements.find((s) => s.id === 'since-last')?.text).toMatch(/^In the August 2026 brief/);
    } finally {
      await store.close();
    }
    const index = runCli(['history', 'index', ...locate, '--run', 'night-2', '--out', join(dir, 'index')], env);
    expect(index.code, index.stderr).toBe(0);
    const csv = readFileSync(join(dir, 'index', 'index.csv'), 'utf8')
      .trimEnd()
      .split('\r\n');
    expect(csv[0]).toBe('title,brief,group,series,period,issue,shard,headline,files');
    expect(
      csv
        .slice(1)
        .map((l) => l.split(',')[0])
        .sort(),
    ).toEqual(GROUPS.map((g) => `Site visits — ${g}`));
    const html = readFileSync(join(dir, 'index', 'index.html'), 'utf8');
    expect(html).toContain('<p>8 briefs, 8 series, from the record.</p>');
    expect(html).toContain('href="../out/site-visits-oak.json"');
  });

  it('stays whole when a writer is killed mid-run', async () => {
    const { place, env } = setup();
    // A writer appending as fast as it can, killed without warning once it is well under way.
    const script = `
      import { openRecord } from '${join(ROOT, 'dist/record/store.js')}';
      const place = ${JSON.stringify(place)};
      const store = await openRecord(place, { toolVersion: '0.1.0', write: true });
      for (let i = 0; ; i++) {
        await store.append([1, 2, 3].map((k) => ({ kind: 'publication', brief: 'crash', group: '', series: 's' + k,
          period: '2026-0' + (1 + (i % 9)) + '-01', reason: '', toolVersion: '0.1.0', run: 'crash', shard: '',
          jobSha256: 'j', dataSha256: 'd', message: '', recipient: '', status: '', body: JSON.stringify({ i, pad: 'x'.repeat(20000) }) })));
        if (i === 5) process.stderr.write('going\\n');
      }`;
    const child = spawn(process.execPath, ['--input-type=module', '-e', script], {
      env: { ...process.env, ...env },
      stdio: ['ignore', 'ignore', 'pipe'],
    });
    await new Promise<void>((resolve, reject) => {
      child.stderr?.on('data', (b: Buffer) =>
        b.toString().includes('going') ? resolve() : reject(new Error(b.toString())),
      );
      child.on('close', () => reject(new Error('the writer ended before it was killed')));
    });
    await new Promise((r) => setTimeout(r, 150));
    child.kill('SIGKILL');
    await new Promise((r) => child.on('close', r));
    const store = await openRecord(place, { toolVersion: '0.1.0', write: true, env });
    try {
      const entries = await store.entries();
      expect(verifyChain(entries).broken).toBeNull();
      const crashed = entries.filter((e) => e.run === 'crash');
      // Appends of three go in together or not at all.
      expect(crashed.length % 3).toBe(0);
      expect(crashed.length).toBeGreaterThanOrEqual(18);
      for (const e of crashed) expect(JSON.parse(e.body).pad).toHaveLength(20000);
      const [next] = await store.append([{ ...crashed[0], reason: 'after the crash' }]);
      expect(next.seq).toBe(entries.length + 1);
      expect(verifyChain(await store.entries()).broken).toBeNull();
    } finally {
      await store.close();
    }
  });
}

describe('shards recording into one SQLite file (Slurm job array)', () => {
  const dir = estate('record: { file: shared/record.sqlite }\n');
  const file = join(dir, 'shared', 'record.sqlite');
  shardChecks(
    () => ({ dir, place: { store: 'sqlite', file }, env: {}, locate: ['--file', file] }),
    (i, run) => ({
      SLURM_ARRAY_TASK_ID: String(i + 1),
      SLURM_ARRAY_TASK_MIN: '1',
      SLURM_ARRAY_TASK_COUNT: String(SHARDS),
      SLURM_ARRAY_JOB_ID: '1',
      TRENDBRIEF_RUN: run,
    }),
  );
});

describePostgres('shards recording into one PostgreSQL database (Kubernetes indexed Job)', () => {
  let db: TestDatabase;
  const dir = estate('record: { store: postgres, connection_env: BRIEFS_DB }\n');
  beforeAll(async () => {
    db = await createDatabase('shards');
  });
  afterAll(async () => {
    await db?.drop();
  });
  shardChecks(
    () => ({
      dir,
      place: { store: 'postgres', env: 'BRIEFS_DB' },
      env: { BRIEFS_DB: db.url },
      locate: ['--connection-env', 'BRIEFS_DB'],
    }),
    (i, run) => ({ JOB_COMPLETION_INDEX: String(i), TRENDBRIEF_SHARD_COUNT: String(SHARDS), TRENDBRIEF_RUN: run }),
  );
});

/** GNU parallel, run as README shows; skipped without it, required in CI (.ci/run installs it). */
const parallelBin = ['/usr/bin/parallel', '/usr/local/bin/parallel'].find((p) => existsSync(p));
const ci = process.env.CI === 'true';
if (!parallelBin && !ci) console.warn("GNU parallel test skipped: install Debian's parallel package to run it");
describe.skipIf(!parallelBin && !ci)('shards run by GNU parallel (PARALLEL_SEQ)', () => {
  it('records every brief once, each shard from PARALLEL_SEQ', () => {
    if (!parallelBin) throw new Error('GNU parallel is required in CI: install the parallel package');
    const dir = estate('record: { file: record.sqlite }\n');
    const r = spawnSync(
      parallelBin,
      [
        '--will-cite',
        '-j4',
        '-N0',
        process.execPath,
        BIN,
        'render',
        join(dir, 'job.yaml'),
        '--out',
        join(dir, 'out'),
        '--format',
        'json',
        '--record',
        'always',
        '--period',
        '2026-09',
        ':::',
        '1',
        '2',
        '3',
        '4',
      ],
      {
        encoding: 'utf8',
        env: { ...process.env, TRENDBRIEF_RECORD: 'auto', TRENDBRIEF_SHARD_COUNT: '4', TRENDBRIEF_RUN: 'par-1' },
      },
    );
    expect(r.status, r.stderr).toBe(0);
    const index = runCli([
      'history',
      'index',
      '--file',
      join(dir, 'record.sqlite'),
      '--run',
      'par-1',
      '--out',
      join(dir, 'index'),
    ]);
    expect(index.code, index.stderr).toBe(0);
    const rows = readFileSync(join(dir, 'index', 'index.csv'), 'utf8')
      .trimEnd()
      .split('\r\n')
      .slice(1);
    expect(rows.map((l) => l.split(',')[2]).sort()).toEqual(GROUPS);
    expect(new Set(rows.map((l) => l.split(',')[6]))).toEqual(new Set(['1/4', '2/4', '3/4', '4/4']));
    const v = runCli(['history', 'verify', '--file', join(dir, 'record.sqlite')]);
    expect(v.stdout).toMatch(/: 8 entries, the chain holds\n$/);
  });
});
