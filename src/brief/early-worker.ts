/**
 * The second thread of a many-series brief (share.ts), started as soon as the job file is read. A worker
 * takes about a fifth of a second to load its modules; started then (cli/batch.ts planTasks, for one job of
 * PARALLEL_SERIES or more series), that happens while this thread reads the data and loads the PDF engine,
 * instead of after. It waits, unreferenced (it never keeps the process alive), until share.ts takes it and
 * sends it its work; a run that turns out to need no second thread (a job split into groups, which goes to
 * the worker pool) drops it. Started any earlier, before the job says how many series it has, it cost a
 * one-series brief about 30 ms on two cores (measured on examples/water-deliveries).
 */
import { availableParallelism } from 'node:os';
import { isMainThread, Worker, type WorkerOptions } from 'node:worker_threads';
import { BriefError } from '../errors.js';
import { threadEntry } from '../thread-entry.js';

/** The worker's entry module (absent when the code runs from its TypeScript sources, as under vitest). */
export const SERIES_WORKER = new URL('./series-worker.js', import.meta.url);

/** A new second series thread (thread-entry.ts says where it starts); throws where there is none. */
export function seriesWorker(options: WorkerOptions = {}): Worker {
  const entry = threadEntry('series', SERIES_WORKER);
  if (!entry) throw new Error('no series thread is built');
  return new Worker(entry, options);
}

/**
 * How many threads build one brief's series: TRENDBRIEF_SERIES_THREADS (1 or 2) when set, else two on a
 * machine of four or more cores and one below that. On the 2-core benchmark machine a second thread gave
 * the same wall time within the noise (medians 0.88–0.94 s either way over four sets of alternating runs,
 * at 12 and at 36 series, idle and with one core busy) and about 10% more CPU time (bench/BRIEFS.md): V8's
 * own compiler and garbage-collector threads already use the second core of a one-thread run.
 */
export function seriesThreads(): 1 | 2 {
  const v = process.env.TRENDBRIEF_SERIES_THREADS;
  if (v === undefined || v === '') return availableParallelism() >= 4 ? 2 : 1;
  if (v === '1' || v === '2') return Number(v) as 1 | 2;
  throw new BriefError(
    'bad-series-threads',
    `TRENDBRIEF_SERIES_THREADS is "${v}", not 1 or 2`,
    'set it to 1 (one thread) or 2 (two threads for a brief of six or more series), or unset it',
  );
}

/** A second thread only from the main thread (a batch worker is one of a pool already), when asked for. */
export function canShareSeries(): boolean {
  return isMainThread && seriesThreads() === 2 && threadEntry('series', SERIES_WORKER) !== null;
}

let waiting: Worker | null = null;

/** Starts the worker now, if a second thread could be used at all; at most one waits. */
export function startSeriesWorkerEarly(): void {
  if (waiting || !canShareSeries()) return;
  try {
    const w = seriesWorker();
    w.unref();
    // A worker that fails or ends before it is taken is forgotten; share.ts then starts one of its own.
    const forget = () => {
      if (waiting === w) waiting = null;
    };
    w.once('error', forget);
    w.once('exit', forget);
    waiting = w;
  } catch {
    waiting = null;
  }
}

/** The waiting worker, now kept alive by the caller's listeners, or null. */
export function takeSeriesWorker(): Worker | null {
  const w = waiting;
  waiting = null;
  w?.ref();
  return w;
}

/** Ends a waiting worker that this run will not use. */
export function dropSeriesWorker(): void {
  const w = waiting;
  waiting = null;
  if (w) void w.terminate();
}
