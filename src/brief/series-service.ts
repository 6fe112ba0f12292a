/**
 * The second thread of share.ts: claims series from the shared counter, builds each and sends it back. Its
 * entry is series-worker.ts when the command line runs from its modules, or the one-script build's
 * `threadMain` (cli/main.ts) when it runs from dist/bundle/main.cjs with its code cache.
 */
import type { MessagePort } from 'node:worker_threads';
import { BriefError, errorForThread } from '../errors.js';
import { buildSeriesWithCharts } from './series.js';
import type { ShareData, ShareMessage } from './share.js';

export async function serveSeries(port: MessagePort, given: ShareData | null): Promise<void> {
  // Started with its work, or early (early-worker.ts), to be sent it once the job is read.
  const data = given ?? (await new Promise<ShareData>((resolve) => port.once('message', (m: ShareData) => resolve(m))));
  const { job, work, period, locale, claims } = data;
  const next = new Int32Array(claims);
  const send = (m: ShareMessage) => port.postMessage(m);

  for (let index = Atomics.add(next, 0, 1); index < work.length; index = Atomics.add(next, 0, 1)) {
    try {
      send({ index, series: await buildSeriesWithCharts(job, work[index], period, locale, true) });
    } catch (e) {
      if (e instanceof BriefError) send({ index, error: errorForThread(e) });
      else send({ index, failure: e instanceof Error ? e.message : String(e) });
    }
  }
}
