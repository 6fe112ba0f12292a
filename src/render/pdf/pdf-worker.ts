/** The PDF's own thread (thread.ts) started from the command line's modules: pdf-service.ts does the work. */
import { parentPort } from 'node:worker_threads';
import { servePdf } from './pdf-service.js';

if (parentPort) servePdf(parentPort);
