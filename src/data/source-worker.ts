/**
 * The thread that reads a workbook or runs a PostgreSQL query for read-sync.ts. Both libraries are
 * asynchronous and the data stage is not, so the main thread waits on a shared flag while this thread reads,
 * then takes the result from the message port. exceljs and pg are loaded here only.
 */
import type { MessagePort } from 'node:worker_threads';
import { workerData } from 'node:worker_threads';
import { BriefError } from '../errors.js';
import type { DataSpec } from '../vocabulary/settings.js';
import { QueryError } from './query-error.js';
import { type ColumnTable, type PackedTable, packedBuffers, packTable } from './result-table.js';

export interface SourceRequest {
  kind: 'xlsx' | 'postgres';
  spec: DataSpec;
  parameters: string[];
}

export interface SerialError {
  brief: boolean;
  code: string;
  message: string;
  hint: string;
  place: BriefError['place'];
  exitCode: 1 | 2;
  offset: number | null;
  stack?: string;
}

const { request, port, flag } = workerData as { request: SourceRequest; port: MessagePort; flag: Int32Array };

async function run(): Promise<ColumnTable | { packed: PackedTable }> {
  if (request.kind === 'xlsx') {
    const { readWorkbook } = await import('./xlsx.js');
    return readWorkbook(request.spec);
  }
  const { readPostgres } = await import('./postgres.js');
  return readPostgres(request.spec, request.parameters);
}

function serialise(e: unknown): SerialError {
  if (e instanceof BriefError) {
    return {
      brief: true,
      code: e.code,
      message: e.message,
      hint: e.hint,
      place: e.place,
      exitCode: e.exitCode,
      offset: e instanceof QueryError ? e.offset : null,
    };
  }
  const err = e instanceof Error ? e : new Error(String(e));
  return {
    brief: false,
    code: 'internal',
    message: err.message,
    hint: '',
    place: {},
    exitCode: 1,
    offset: null,
    stack: err.stack,
  };
}

/**
 * An error thrown outside run()'s promises (a library's stream failing with no listener) would end this
 * thread before it sets the flag, and the main thread would wait out its whole timeout. It is reported like
 * any other failure instead; one arriving after the result was posted changes nothing.
 */
let finished = false;
process.on('uncaughtException', (e) => finish({ ok: false, error: serialise(e) }));
process.on('unhandledRejection', (e) => finish({ ok: false, error: serialise(e) }));

run().then(
  (table) => {
    const { packed, transfer } =
      'packed' in table ? { packed: table.packed, transfer: packedBuffers(table.packed) } : packTable(table);
    const sheet = (table as { sheet?: string }).sheet;
    finish({ ok: true, table: packed, sheet }, transfer);
  },
  (e) => finish({ ok: false, error: serialise(e) }),
);

function finish(message: unknown, transfer: ArrayBuffer[] = []): void {
  if (finished) return;
  finished = true;
  try {
    port.postMessage(message, transfer);
  } catch (e) {
    port.postMessage({ ok: false, error: serialise(e) });
  }
  Atomics.store(flag, 0, 1);
  Atomics.notify(flag, 0);
}
