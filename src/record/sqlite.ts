/**
 * The record in an SQLite file (better-sqlite3). WAL journal with full sync, so a crash loses at most the
 * entry being written and never half of it; a busy timeout, so processes writing at once wait their turn.
 *
 * Switching a new file to WAL needs the file to itself, and the switch answers SQLITE_BUSY at once instead
 * of waiting out the busy timeout: eight processes opening one new file together, 30 times, gave 4 and 8
 * such failures in two sets of 240 opens (measured with better-sqlite3 12, timeout 5 s;
 * test/record/store.test.ts repeats it). Shards of one run open a new record together, so a refused switch
 * is tried again with growing pauses, within the same wait as any other lock; a file already in WAL (every
 * open after the first) is left as it is.
 */
import { existsSync, mkdirSync } from 'node:fs';
import { dirname } from 'node:path';
import { setTimeout as sleep } from 'node:timers/promises';
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
  const wait = recordWaitMs();
  const db: Database.Database = new Sqlite(file, {
    readonly: readOnly,
    fileMustExist: readOnly,
    timeout: wait,
  });
  if (!readOnly) {
    try {
      await walJournal(db, wait);
      db.pragma('synchronous = FULL');
    } catch (e) {
      db.close();
      throw e;
    }
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

/**
 * Puts the file in WAL mode, trying again while SQLite refuses the switch as busy, for up to `waitMs`. A
 * switch answered without an error keeps SQLite's answer, as a single attempt would: a file system where WAL
 * cannot be used leaves the record in its rollback journal at once, not after the wait.
 */
export async function walJournal(db: Database.Database, waitMs: number): Promise<void> {
  const until = Date.now() + waitMs;
  for (let pause = 5; ; pause = Math.min(2 * pause, 200)) {
    try {
      if (db.pragma('journal_mode', { simple: true }) !== 'wal') db.pragma('journal_mode = WAL');
      return;
    } catch (e) {
      if (!String((e as { code?: string }).code).startsWith('SQLITE_BUSY') || Date.now() >= until) throw e;
    }
    await sleep(pause);
  }
}
