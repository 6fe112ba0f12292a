/**
 * runTasks (src/cli/batch.ts) caps each pool worker's heap; a brief too big for the cap ends its worker,
 * and the brief is built again on the main thread. Checked with the built pool (dist/, which `npm test`
 * builds first: the pool runs dist/cli/worker.js) and a cap far too small for an HTML brief: a worker with
 * that cap dies of it, yet every brief of the batch is written. With a cap too small for a worker even to
 * start, Piscina gives up starting workers and would leave the queued briefs waiting for ever: they too are
 * built on the main thread.
 */
import { existsSync, mkdirSync, mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { Piscina } from 'piscina';
import { describe, expect, it } from 'vitest';
import type { BatchTask, TaskResult } from '../../src/cli/batch.js';
import { ROOT } from './run.js';

const BATCH = new URL('../../dist/cli/batch.js', import.meta.url);
const WORKER = new URL('../../dist/cli/worker.js', import.meta.url);
// Small enough that an HTML brief does not fit (measured: with the chart stack without vega one still fitted
// in 16 MB, and 12 MB sometimes did), large enough for a worker to start (6 MB is not).
const TINY = { maxOldGenerationSizeMb: 10, maxYoungGenerationSizeMb: 2 };
const UNSTARTABLE = { maxOldGenerationSizeMb: 4, maxYoungGenerationSizeMb: 1 };

describe('runTasks with a heap cap', () => {
  const out = mkdtempSync(join(tmpdir(), 'tb-fallback-'));
  const task = (i: number): BatchTask => {
    mkdirSync(join(out, String(i)), { recursive: true });
    return {
      jobFile: join(ROOT, 'examples/water-deliveries/job.yaml'),
      group: null,
      outDir: join(out, String(i)),
      options: { formats: ['html'], period: null, pdfEngine: null, overrides: {} },
      smtp: null,
    };
  };

  it('a worker with the tiny cap dies on an HTML brief', async () => {
    expect(existsSync(WORKER)).toBe(true);
    const pool = new Piscina({ filename: WORKER.href, maxThreads: 1, minThreads: 1, resourceLimits: TINY });
    try {
      await expect(pool.run(task(9))).rejects.toMatchObject({ code: 'ERR_WORKER_OUT_OF_MEMORY' });
    } finally {
      await pool.destroy();
    }
  }, 60_000);

  it('builds on the main thread every brief whose worker died', async () => {
    const { runTasks } = (await import(BATCH.href)) as {
      runTasks: (t: BatchTask[], d: (r: TaskResult) => void, n: number, l: typeof TINY) => Promise<TaskResult[]>;
    };
    const seen: TaskResult[] = [];
    const results = await runTasks([0, 1, 2, 3].map(task), (r) => seen.push(r), 2, TINY);
    expect(results).toHaveLength(4);
    expect(seen).toHaveLength(4);
    for (const r of results) {
      expect(r.error).toBeNull();
      expect(r.files).toHaveLength(1);
      expect(existsSync(r.files[0])).toBe(true);
    }
  }, 120_000);

  it('builds every brief on the main thread when no worker can start (no brief left waiting)', async () => {
    const { runTasks } = (await import(BATCH.href)) as {
      runTasks: (t: BatchTask[], d: (r: TaskResult) => void, n: number, l: typeof TINY) => Promise<TaskResult[]>;
    };
    const results = await runTasks([4, 5, 6, 7, 8].map(task), () => {}, 2, UNSTARTABLE);
    expect(results).toHaveLength(5);
    for (const r of results) {
      expect(r.error).toBeNull();
      expect(existsSync(r.files[0])).toBe(true);
    }
  }, 120_000);
});
