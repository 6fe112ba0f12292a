/** --shard from batch schedulers' environments (the variables each documents; see src/cli/scheduler.ts). */
import { describe, expect, it } from 'vitest';
import { schedulerShard } from '../../src/cli/scheduler.js';
import { BriefError } from '../../src/errors.js';

describe('schedulerShard', () => {
  it('is nothing outside a scheduler', () => {
    expect(schedulerShard({})).toEqual({ shard: null, run: null, from: null });
  });

  it('reads a Slurm array, offset and stepped (--array=10-16:2 → tasks 10, 12, 14, 16)', () => {
    const env = {
      SLURM_ARRAY_TASK_ID: '14',
      SLURM_ARRAY_TASK_MIN: '10',
      SLURM_ARRAY_TASK_STEP: '2',
      SLURM_ARRAY_TASK_COUNT: '4',
      SLURM_ARRAY_JOB_ID: '81234',
    };
    expect(schedulerShard(env)).toEqual({ shard: [3, 4], run: 'slurm-81234', from: 'Slurm' });
  });

  it('reads a Kubernetes indexed Job (0-based) with the count given', () => {
    const env = { JOB_COMPLETION_INDEX: '0', TRENDBRIEF_SHARD_COUNT: '8', TRENDBRIEF_RUN: 'nightly-2026-10-01' };
    expect(schedulerShard(env)).toEqual({ shard: [1, 8], run: 'nightly-2026-10-01', from: 'Kubernetes' });
  });

  it('reads GNU parallel (1-based PARALLEL_SEQ)', () => {
    const r = schedulerShard({ PARALLEL_SEQ: '4', PARALLEL_PID: '5150', TRENDBRIEF_SHARD_COUNT: '4' });
    expect(r.shard).toEqual([4, 4]);
    expect(r.run).toMatch(/^parallel-.+-5150$/);
  });

  it('says what is missing or wrong in one line', () => {
    const fail = (env: NodeJS.ProcessEnv) => {
      try {
        schedulerShard(env);
      } catch (e) {
        return (e as BriefError).oneLine();
      }
      return 'no error';
    };
    expect(fail({ JOB_COMPLETION_INDEX: '2' })).toBe(
      "JOB_COMPLETION_INDEX gives this shard's number but not how many shards there are — set TRENDBRIEF_SHARD_COUNT to the number of shards (or pass --shard K/N)",
    );
    expect(fail({ JOB_COMPLETION_INDEX: '8', TRENDBRIEF_SHARD_COUNT: '8' })).toBe(
      'Kubernetes puts this shard at 9 of 8 — check the shard count against the scheduler',
    );
    expect(fail({ PARALLEL_SEQ: 'x' })).toMatch(/^PARALLEL_SEQ is "x", not a whole number/);
    expect(BriefError).toBeDefined();
  });
});
