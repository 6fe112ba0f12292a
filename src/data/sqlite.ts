/**
 * A SQLite database file read with better-sqlite3 (pinned to version 12): opened read-only, so nothing is
 * ever written to it, and its lock held only while the one query runs (no transaction is left open), so a
 * program writing to the database is never shut out for longer than the read; in WAL mode readers and
 * writers do not block each other at all. While a writer holds the lock we wait for it up to the job's
 * timeout. better-sqlite3 is loaded only when a job reads SQLite.
 */
import { createRequire } from 'node:module';
import type BetterSqlite3 from 'better-sqlite3';
import { BriefError } from '../errors.js';
import type { DataSpec } from '../vocabulary/settings.js';
import type { Cell } from './csv.js';
import { QueryError } from './query-error.js';
import type { ColumnTable } from './result-table.js';

type Database = BetterSqlite3.Database;

/** Runs the job's query on its SQLite file; the result as columns of cells. */
export function readSqlite(spec: DataSpec, parameters: string[]): ColumnTable {
  const Sqlite = createRequire(import.meta.url)('better-sqlite3') as typeof BetterSqlite3;
  const file = spec.fileAsWritten;
  const query = spec.query ?? '';
  let db: Database;
  try {
    db = new Sqlite(spec.file, {
      readonly: true,
      fileMustExist: true,
      timeout: Math.round((spec.timeoutSeconds ?? 60) * 1000),
    });
  } catch (e) {
    throw new BriefError(
      'data-sqlite-open',
      `the SQLite database cannot be opened (${(e as Error).message})`,
      'check that the file is a SQLite database and can be read',
      { file },
    );
  }
  try {
    // A file that is not a database opens without complaint; the first read finds out.
    let statement: BetterSqlite3.Statement;
    try {
      statement = db.prepare(query);
    } catch (e) {
      throw sqliteError(e as SqliteError, file);
    }
    if (!statement.reader) {
      throw new QueryError(
        'data-query-not-select',
        'the query returns no rows: it is not a SELECT',
        'write a query that selects the date and value columns; the database is opened read-only',
        { file },
        null,
      );
    }
    statement.raw(true);
    const columns = statement.columns().map((c) => c.name);
    const cells: Cell[][] = columns.map(() => []);
    // Row by row into the columns: all() would hold every row as an array besides (twice the memory).
    let i = 0;
    try {
      for (const row of statement.iterate(...parameters.map(bind)) as IterableIterator<unknown[]>) {
        for (let j = 0; j < columns.length; j++) {
          const v = row[j];
          cells[j].push(
            typeof v === 'number' || typeof v === 'string' || v === null ? v : cellOf(v, i, columns[j], file),
          );
        }
        i++;
      }
    } catch (e) {
      if (e instanceof BriefError) throw e;
      throw sqliteError(e as SqliteError, file);
    }
    return { columns, cells };
  } finally {
    db.close();
  }
}

/** Parameters are bound as text: SQLite compares dates written as text (2026-09-30) as text. */
function bind(value: string): string {
  return value;
}

function cellOf(v: unknown, i: number, column: string, file: string): Cell {
  if (v === null || v === undefined) return null;
  if (typeof v === 'number') return v;
  if (typeof v === 'string') return v;
  throw new BriefError(
    'data-sqlite-blob',
    'the cell holds binary data (a BLOB), not a date, number or text',
    'select a column of numbers or text, or cast it in the query',
    { file, row: i + 1, field: column },
  );
}

interface SqliteError extends Error {
  code?: string;
}

function sqliteError(e: SqliteError, file: string): BriefError {
  const code = e.code ?? '';
  if (code === 'SQLITE_BUSY' || code === 'SQLITE_LOCKED') {
    return new BriefError(
      'data-query-timeout',
      'the SQLite database stayed locked by a writer for longer than the timeout',
      'run again when the writer has finished, or raise timeout in the job',
      { file },
    );
  }
  if (code === 'SQLITE_NOTADB' || code === 'SQLITE_CORRUPT') {
    return new BriefError('data-sqlite-open', `the file is not a SQLite database (${e.message})`, 'check the file', {
      file,
    });
  }
  if (code === 'SQLITE_RANGE') {
    return new QueryError(
      'data-query-parameters',
      `the query's parameters do not match the job's parameters list (${e.message})`,
      'write one ? in the query for each entry of parameters:, in the same order',
      { file },
      null,
    );
  }
  // A syntax error, a missing table or column: SQLite's own words, at the query in the job.
  return new QueryError('data-query', `SQLite: ${e.message}`, 'correct the query in the job', { file }, null);
}
