/**
 * Test helper for the PostgreSQL tests: the server started by test/support/postgres-setup.ts (vitest's
 * globalSetup), a fresh database per test file, and the rule for a missing server: the tests skip with a
 * message, unless TRENDBRIEF_REQUIRE_POSTGRES=1 or CI=true, where they fail.
 *
 *   describePostgres('reading a query', () => {
 *     let db: TestDatabase;
 *     beforeAll(async () => { db = await createDatabase(); await db.exec('create table …'); });
 *     afterAll(() => db.drop());
 *     it('…', async () => { … db.url … });
 *   });
 */
import { existsSync, readFileSync } from 'node:fs';
import pg from 'pg';
import { describe, it } from 'vitest';

/** CI sets one of these: a missing or failed server then fails the database tests instead of skipping them. */
export const postgresRequired = process.env.TRENDBRIEF_REQUIRE_POSTGRES === '1' || process.env.CI === 'true';

function status(): string {
  const file = process.env.TRENDBRIEF_TEST_POSTGRES_STATUS;
  if (!file)
    return 'absent: the PostgreSQL test setup did not run (test/support/postgres-setup.ts in vitest.config.ts)';
  return existsSync(file) ? readFileSync(file, 'utf8') : 'failed: the status file is gone';
}

/** Why there is no server, known when the tests are collected; null when one is ready or starting. */
export function postgresAbsence(): string | null {
  const s = status();
  return s.startsWith('absent: ') ? s.slice('absent: '.length) : null;
}

/** The superuser's connection string once the server accepts connections; throws with the reason otherwise. */
export async function waitForPostgres(timeoutMs = 120_000): Promise<string> {
  const until = Date.now() + timeoutMs;
  for (;;) {
    const s = status();
    if (s === 'ready') return process.env.TRENDBRIEF_TEST_POSTGRES_URL as string;
    if (s !== 'starting') throw new Error(`no PostgreSQL server for the tests: ${s}`);
    if (Date.now() > until) throw new Error('the PostgreSQL test server did not start in time');
    await new Promise((r) => setTimeout(r, 100));
  }
}

export interface TestDatabase {
  /** Connection string of this database, as the superuser. */
  url: string;
  name: string;
  /** Runs SQL (several statements allowed) in this database. */
  exec(sql: string): Promise<void>;
  /** Drops the database (closing any connection left open to it). */
  drop(): Promise<void>;
}

let counter = 0;

/** A new, empty database on the test server, so test files running side by side never share tables. */
export async function createDatabase(prefix = 'test'): Promise<TestDatabase> {
  const admin = await waitForPostgres();
  const name = `${prefix}_${process.pid}_${Date.now().toString(36)}_${counter++}`
    .toLowerCase()
    .replace(/[^a-z0-9_]/g, '_');
  await withClient(admin, (c) => c.query(`create database "${name}"`));
  const url = new URL(admin);
  url.pathname = `/${name}`;
  return {
    url: url.toString(),
    name,
    exec: (sql) => withClient(url.toString(), (c) => c.query(sql)).then(() => undefined),
    drop: () =>
      withClient(admin, (c) => c.query(`drop database if exists "${name}" with (force)`)).then(() => undefined),
  };
}

async function withClient<T>(connectionString: string, run: (c: pg.Client) => Promise<T>): Promise<T> {
  const client = new pg.Client({ connectionString });
  await client.connect();
  try {
    return await run(client);
  } finally {
    await client.end();
  }
}

/**
 * describe() for tests that need the server: skipped with a warning when there is none, or a failing test
 * in its place when a server is required (CI). A server that fails to start fails the tests through
 * waitForPostgres().
 */
export function describePostgres(name: string, body: () => void): void {
  const absent = postgresAbsence();
  if (absent === null) {
    describe(name, body);
    return;
  }
  if (postgresRequired) {
    describe(name, () => {
      it('needs a PostgreSQL server because TRENDBRIEF_REQUIRE_POSTGRES=1 or CI=true', () => {
        throw new Error(`${absent}; install Debian's postgresql package or set TRENDBRIEF_TEST_POSTGRES_URL`);
      });
    });
    return;
  }
  console.warn(
    `PostgreSQL tests skipped (${name}): ${absent}; set TRENDBRIEF_REQUIRE_POSTGRES=1 to make this a failure`,
  );
  describe.skip(name, body);
}
