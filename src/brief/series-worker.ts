/** The second thread of share.ts started from the command line's modules: series-service.ts does the work. */
import { parentPort, workerData } from 'node:worker_threads';
import { serveSeries } from './series-service.js';
import type { ShareData } from './share.js';

if (parentPort) await serveSeries(parentPort, workerData as ShareData | null);
