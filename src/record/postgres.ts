/**
 * The record in a PostgreSQL database (node-postgres), for a team or many machines. Every append runs in
 * one transaction holding a transaction-scoped advisory lock, so shards on many machines append one at a
 * time and the chain stays a single line; the schema is migrated under a session lock for the same reason.
 */
import { type Db, type Param, type Query, type Row, recordWaitMs } from './db.js';

/** The advisory lock key of the record (any fixed 64-bit number; this one spells "tbrecord"). */
export const LOCK_KEY = '8386391235902989312';

export async function openPostgres(url: string): Promise<Db> {
  const { default: pg } = await import('pg');
  const client = new pg.Client({ connectionString: url, connectionTimeoutMillis: 10_000 });
  await client.connect();
  // A connection that dies later (a server restart) must surface as a failed query, not a crash.
  client.on('error', () => undefined);
  // A writer waits this long for another's lock, then fails as a locked record.
  await client.query(`SET lock_timeout = ${recordWaitMs()}`);
  const q: Query = {
    all: async (sql: string, params: Param[] = []) => (await client.query(numbered(sql), params)).rows as Row[],
    run: async (sql: string, params: Param[] = []) => {
      await client.query(numbered(sql), params);
    },
  };
  const where = `${client.host}:${client.port}/${client.database ?? ''}`;
  let queue: Promise<unknown> = Promise.resolve();
  return {
    dialect: 'postgres',
    where,
    ...q,
    locked<T>(fn: (q: Query) => Promise<T>): Promise<T> {
      const next = queue.then(async () => {
        await client.query('BEGIN');
        try {
          await client.query(`SELECT pg_advisory_xact_lock(${LOCK_KEY})`);
          const out = await fn(q);
          await client.query('COMMIT');
          return out;
        } catch (e) {
          await client.query('ROLLBACK').catch(() => undefined);
          throw e;
        }
      });
      queue = next.catch(() => undefined);
      return next;
    },
    async close() {
      await client.end().catch(() => undefined);
    },
  };
}

/** `?` placeholders → `$1, $2, …` (the record's SQL holds no `?` inside strings). */
function numbered(sql: string): string {
  let n = 0;
  return sql.replace(/\?/g, () => `$${++n}`);
}
