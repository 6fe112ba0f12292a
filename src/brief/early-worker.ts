/**
 * The second thread of a many-series brief (share.ts), started as soon as the job file is read. A worker
 * takes about a fifth of a second to load its modules; started then (cli/batch.ts planTasks, for one job of
 * PARALLEL_SERIES or more series), that happens while this thread reads the data and loads the PDF engine,
 * instead of after. It waits, unreferenced (it never keeps the process alive), until share.ts takes it and
 * sends it its work; a run that turns out to need no second thread (a job split into groups, which goes to
 * the worker pool) drops it. Started any earlier, before the job says how many series it has, it cost a
 * one-series brief about 30 ms on two cores (measured on examples/water-deliveries).
 */
import { existsSync } from 'node:fs';
import { availableParallelism } from 'node:os';
import { fileURLToPath } from 'node:url';
import { isMainThread, Worker } from 'node:worker_threads';

/** The worker's built file (absent when the code runs from its TypeScript sources, as under vitest). */
export const SERIES_WORKER = new URL('./series-worker.js', import.meta.url);

/** A second thread only from the main thread (a batch worker is one of a pool already), with a core for it. */
export function canShareSeries(): boolean {
  return isMainThread && availableParallelism() > 1 && existsSync(fileURLToPath(SERIES_WORKER));
}

let waiting: Worker | null = null;

/** Starts the worker now, if a second thread could be used at all; at most one waits. */
export function startSeriesWorkerEarly(): void {
  if (waiting || !canShareSeries()) return;
  try {
    const w = new Worker(SERIES_WORKER);
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
