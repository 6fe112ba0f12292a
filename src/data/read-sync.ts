/**
 * Runs an asynchronous reader (a workbook, a PostgreSQL query) on a worker thread and waits for it here, so
 * the data stage stays one synchronous call for every kind of source and nothing above it changes. The wait
 * is Atomics.wait on a shared flag the worker sets once it has posted the result; the result is then taken
 * from the port without the event loop (receiveMessageOnPort).
 */
import { existsSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { MessageChannel, receiveMessageOnPort, Worker } from 'node:worker_threads';
import { BriefError } from '../errors.js';
import { QueryError } from './query-error.js';
import { type PackedTable, unpackTable } from './result-table.js';
import type { SerialError, SourceRequest } from './source-worker.js';

/** The worker's built file; run from the TypeScript sources (vitest), the one `npm run build` wrote to dist/. */
function workerFile(): URL {
  const beside = new URL('./source-worker.js', import.meta.url);
  if (existsSync(fileURLToPath(beside))) return beside;
  const built = new URL('../../dist/data/source-worker.js', import.meta.url);
  if (existsSync(fileURLToPath(built))) return built;
  throw new Error('dist/data/source-worker.js is missing: run npm run build');
}

export function readInWorker<T>(request: SourceRequest, waitSeconds: number): T {
  const flag = new Int32Array(new SharedArrayBuffer(4));
  const { port1, port2 } = new MessageChannel();
  const worker = new Worker(workerFile(), { workerData: { request, port: port2, flag }, transferList: [port2] });
  worker.unref();
  try {
    const state = Atomics.wait(flag, 0, 0, waitSeconds * 1000);
    const got = receiveMessageOnPort(port1);
    if (state === 'timed-out' || !got) {
      throw new BriefError(
        'data-source-timeout',
        `reading the data took longer than ${waitSeconds} s`,
        'check that the source is reachable; for a database, raise timeout in the job',
        { file: request.spec.fileAsWritten },
      );
    }
    const message = got.message as { ok: true; table: PackedTable; sheet?: string } | { ok: false; error: SerialError };
    if (message.ok) {
      const t = unpackTable(message.table);
      return (message.sheet === undefined ? t : { ...t, sheet: message.sheet }) as T;
    }
    throw revive(message.error);
  } finally {
    port1.close();
    void worker.terminate();
  }
}

function revive(e: SerialError): Error {
  if (!e.brief) {
    const err = new Error(e.message);
    if (e.stack) err.stack = e.stack;
    return err;
  }
  if (e.code.startsWith('data-query')) return new QueryError(e.code, e.message, e.hint, e.place, e.offset);
  return new BriefError(e.code, e.message, e.hint, e.place, e.exitCode);
}
