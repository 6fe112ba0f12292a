/**
 * The record in an SQLite file (better-sqlite3). WAL journal with full sync, so a crash loses at most the
 * entry being written and never half of it; a busy timeout, so processes writing at once wait their turn.
 */
import { existsSync, mkdirSync } from 'node:fs';
import { dirname } from 'node:path';
import type Database from 'better-sqlite3';
import { BriefError } from '../errors.js';
import { type Db, type Param, type Query, type Row, recordWaitMs } from './db.js';

export async function openSqlite(file: string, readOnly: boolean): Promise<Db> {
  const { default: Sqlite } = await import('better-sqlite3');
  if (readOnly && !existsSync(file)) {
    throw new BriefError(
      'record-missing',
      `there is no record at ${file}`,
      'render a brief first, or name the right file',
      { file },
    );
  }
  // The record's folder is made when missing (record.file may name one of its own).
  if (!readOnly) mkdirSync(dirname(file), { recursive: true });
  const db: Database.Database = new Sqlite(file, {
    readonly: readOnly,
    fileMustExist: readOnly,
    timeout: recordWaitMs(),
  });
  if (!readOnly) {
    db.pragma('journal_mode = WAL');
    db.pragma('synchronous = FULL');
  }
  // A query over a file that is not SQLite fails here rather than later, in the middle of a run.
  db.prepare('SELECT count(*) FROM sqlite_master').get();
  const q: Query = {
    all: async (sql: string, params: Param[] = []) => db.prepare(sql).all(...params) as Row[],
    run: async (sql: string, params: Param[] = []) => {
      db.prepare(sql).run(...params);
    },
  };
  let queue: Promise<unknown> = Promise.resolve();
  return {
    dialect: 'sqlite',
    where: file,
    ...q,
    locked<T>(fn: (q: Query) => Promise<T>): Promise<T> {
      // One transaction at a time on this connection; BEGIN IMMEDIATE takes the file's write lock.
      const next = queue.then(async () => {
        db.exec('BEGIN IMMEDIATE');
        try {
          const out = await fn(q);
          db.exec('COMMIT');
          return out;
        } catch (e) {
          if (db.inTransaction) db.exec('ROLLBACK');
          throw e;
        }
      });
      queue = next.catch(() => undefined);
      return next;
    },
    async close() {
      db.close();
    },
  };
}
