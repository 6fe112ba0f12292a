/**
 * The series of one brief built on two threads: this one and a worker (series-service.ts). Each series is
 * independent and costs about the same (a decomposition, its firmness and sensitivity re-runs, six charts),
 * so both threads take the next unclaimed series from a shared counter until none is left; the worker
 * starts while this thread is already at work, so its start-up is hidden behind the first series. The brief
 * is the same whichever thread built which series: every step is a pure function of the job and the data,
 * and the charts' ids are renumbered per chart.
 *
 * Errors keep their order: as when building one after another, the brief fails with the error of the first
 * series (in the job's order) that failed.
 *
 * A caller that renders as it goes (build.ts BriefProgress) has its `start` run here while the worker starts
 * up, and is handed each series in the job's order as soon as it and every one before it are in, from this
 * thread's own builds and the worker's messages alike, so a series can be drawn while later ones are built.
 */
import type { Worker } from 'node:worker_threads';
import { errorFromThread, type ThreadError } from '../errors.js';
import type { SeriesBrief } from '../vocabulary/brief.js';
import type { Job } from '../vocabulary/settings.js';
import { seriesWorker, takeSeriesWorker } from './early-worker.js';
import { buildSeriesWithCharts, type SeriesWork } from './series.js';

/** What the worker is given. */
export interface ShareData {
  job: Job;
  work: SeriesWork[];
  period: string | null;
  locale: string;
  /** Int32Array over a SharedArrayBuffer: [0] the next series to claim. */
  claims: SharedArrayBuffer;
}

/** What the worker sends back, one message per series. */
export type ShareMessage =
  | { index: number; series: SeriesBrief }
  | { index: number; error: ThreadError }
  | { index: number; failure: string };

type Outcome = { series: SeriesBrief } | { error: unknown };

/** The caller's progress hooks (build.ts BriefProgress), or null without them. */
export interface ShareHooks {
  /** Run here while the worker starts up, before this thread claims its first series. */
  start: (() => Promise<void>) | null;
  /** Each built series, in the job's order, as soon as it and all before it are built. */
  ready: ((s: SeriesBrief) => void) | null;
}

export async function buildSeriesShared(
  job: Job,
  work: SeriesWork[],
  period: string | null,
  locale: string,
  hooks: ShareHooks = { start: null, ready: null },
): Promise<SeriesBrief[]> {
  const claims = new SharedArrayBuffer(4);
  const next = new Int32Array(claims);
  const outcomes: (Outcome | undefined)[] = new Array(work.length);
  // Series handed to `ready` so far; it stops at the first that failed (the brief fails with it).
  let released = 0;
  const release = (): void => {
    if (!hooks.ready) return;
    for (let o = outcomes[released]; o && 'series' in o; o = outcomes[released]) {
      released++;
      hooks.ready(o.series);
    }
  };
  // Only this series' own group crosses over, not every group of its data file.
  const slim = work.map((w) => ({ spec: w.spec, g: w.g, data: { ...w.data, groups: [] } }));
  const data: ShareData = { job, work: slim, period, locale, claims };
  let worker: Worker | null = null;
  try {
    // The worker the command line started early, if it is still there; else one of our own.
    worker = takeSeriesWorker();
    if (worker) worker.postMessage(data);
    else worker = seriesWorker({ workerData: data });
  } catch {
    // No second thread (the data could not be handed over): every series is built here.
  }
  const finished = new Promise<void>((resolve) => {
    if (!worker) return resolve();
    worker.on('message', (m: ShareMessage) => {
      if ('series' in m) outcomes[m.index] = { series: m.series };
      else if ('error' in m) outcomes[m.index] = { error: errorFromThread(m.error) };
      release();
      // Anything else the worker met is left undelivered and built again here, so it fails (or not) as
      // it would have without a second thread.
    });
    // A worker that cannot start or dies leaves its series undelivered; they are built here below.
    worker.on('error', () => resolve());
    worker.on('exit', () => resolve());
  });
  // The worker takes a while to start: the caller's own start-up runs in that time.
  await hooks.start?.();
  for (let i = Atomics.add(next, 0, 1); i < work.length; i = Atomics.add(next, 0, 1)) {
    outcomes[i] = await settle(() => buildSeriesWithCharts(job, work[i], period, locale, true));
    release();
    // Let the worker's finished series in (its messages wait for this thread to yield).
    if (hooks.ready) await new Promise((resolve) => setImmediate(resolve));
  }
  await finished;
  const series: SeriesBrief[] = [];
  for (let i = 0; i < work.length; i++) {
    if (!outcomes[i]) outcomes[i] = await settle(() => buildSeriesWithCharts(job, work[i], period, locale, true));
    const o = outcomes[i] as Outcome;
    if ('error' in o) throw o.error;
    release();
    series.push(o.series);
  }
  return series;
}

async function settle(build: () => Promise<SeriesBrief>): Promise<Outcome> {
  try {
    return { series: await build() };
  } catch (error) {
    return { error };
  }
}
