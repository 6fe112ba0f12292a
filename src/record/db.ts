/**
 * The little the record needs of a database, the same for SQLite and PostgreSQL: queries with `?`
 * placeholders, and a transaction that holds the record's write lock (SQLite: BEGIN IMMEDIATE; PostgreSQL:
 * a transaction-scoped advisory lock), so appends from many processes are taken one at a time.
 */
export type Param = string | number | null;
export type Row = Record<string, unknown>;

export interface Query {
  all(sql: string, params?: Param[]): Promise<Row[]>;
  run(sql: string, params?: Param[]): Promise<void>;
}

export interface Db extends Query {
  dialect: 'sqlite' | 'postgres';
  /** Where the record is, for messages: the file, or host:port/database. */
  where: string;
  /** Runs fn inside one transaction holding the write lock; commits, or rolls back on a throw. */
  locked<T>(fn: (q: Query) => Promise<T>): Promise<T>;
  close(): Promise<void>;
}

/** Milliseconds a writer waits for another to finish before giving up (TRENDBRIEF_RECORD_WAIT_MS). */
export function recordWaitMs(env: NodeJS.ProcessEnv = process.env): number {
  const v = Number(env.TRENDBRIEF_RECORD_WAIT_MS);
  return Number.isInteger(v) && v >= 0 ? v : 15_000;
}
