/**
 * The record in an SQLite file (better-sqlite3). WAL journal with full sync, so a crash loses at most the
 * entry being written and never half of it; a busy timeout, so processes writing at once wait their turn.
 */
import type Database from 'better-sqlite3';
import type { Db, Param, Query, Row } from './db.js';

/** Milliseconds a writer waits for another to finish before giving up. */
const BUSY_MS = 15_000;

export async function openSqlite(file: string, readOnly: boolean): Promise<Db> {
  const { default: Sqlite } = await import('better-sqlite3');
  const db: Database.Database = new Sqlite(file, { readonly: readOnly, fileMustExist: readOnly, timeout: BUSY_MS });
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
