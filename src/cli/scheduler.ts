/**
 * `--shard` and the run's name from a batch scheduler's environment, when not given on the command line:
 *
 *   Kubernetes indexed Job   JOB_COMPLETION_INDEX (0-based, set by the Job controller) and
 *                            TRENDBRIEF_SHARD_COUNT (the Job's completions; Kubernetes does not expose it)
 *   Slurm job array          SLURM_ARRAY_TASK_ID, _MIN, _STEP and _COUNT; the run is SLURM_ARRAY_JOB_ID
 *   GNU parallel             PARALLEL_SEQ (1-based job number) and TRENDBRIEF_SHARD_COUNT; the run is
 *                            named after PARALLEL_PID and the host
 *
 * TRENDBRIEF_RUN names the run anywhere (all shards of one run must share it for `history index`).
 */
import { hostname } from 'node:os';
import { usage } from './args.js';

export interface SchedulerShard {
  /** [K, N], 1 ≤ K ≤ N, or null outside a scheduler. */
  shard: [number, number] | null;
  /** The run's name from the scheduler, or null. */
  run: string | null;
  /** Which scheduler said so, for messages: "Slurm", "Kubernetes", "GNU parallel", or null. */
  from: string | null;
}

export function schedulerShard(env: NodeJS.ProcessEnv = process.env): SchedulerShard {
  const run = env.TRENDBRIEF_RUN?.trim() || null;
  const whole = (name: string): number | null => {
    const v = env[name];
    if (v === undefined || v.trim() === '') return null;
    const n = Number(v);
    if (!Number.isInteger(n) || n < 0)
      throw usage('render', `${name} is "${v}", not a whole number`, `fix ${name} in the job's environment`);
    return n;
  };
  const count = (from: string): number => {
    const n = whole('TRENDBRIEF_SHARD_COUNT');
    if (n === null || n < 1)
      throw usage(
        'render',
        `${from} gives this shard's number but not how many shards there are`,
        'set TRENDBRIEF_SHARD_COUNT to the number of shards (or pass --shard K/N)',
      );
    return n;
  };
  const checked = (k: number, n: number, from: string): [number, number] => {
    if (k < 1 || k > n)
      throw usage('render', `${from} puts this shard at ${k} of ${n}`, 'check the shard count against the scheduler');
    return [k, n];
  };
  const slurmId = whole('SLURM_ARRAY_TASK_ID');
  if (slurmId !== null) {
    const min = whole('SLURM_ARRAY_TASK_MIN') ?? 0;
    const step = whole('SLURM_ARRAY_TASK_STEP') ?? 1;
    const n = whole('SLURM_ARRAY_TASK_COUNT') ?? count('SLURM_ARRAY_TASK_ID');
    const k = (slurmId - min) / Math.max(step, 1) + 1;
    const job = env.SLURM_ARRAY_JOB_ID?.trim();
    return {
      shard: checked(Number.isInteger(k) ? k : -1, n, 'Slurm'),
      run: run ?? (job ? `slurm-${job}` : null),
      from: 'Slurm',
    };
  }
  const index = whole('JOB_COMPLETION_INDEX');
  if (index !== null) {
    const n = count('JOB_COMPLETION_INDEX');
    return { shard: checked(index + 1, n, 'Kubernetes'), run, from: 'Kubernetes' };
  }
  const seq = whole('PARALLEL_SEQ');
  if (seq !== null) {
    const n = count('PARALLEL_SEQ');
    const pid = env.PARALLEL_PID?.trim();
    return {
      shard: checked(seq, n, 'GNU parallel'),
      run: run ?? (pid ? `parallel-${hostname()}-${pid}` : null),
      from: 'GNU parallel',
    };
  }
  return { shard: null, run, from: null };
}
