/**
 * The PostgreSQL test harness itself: the server the setup starts is a real PostgreSQL on loopback that
 * checks passwords, and each createDatabase() is a separate, droppable database.
 */
import pg from 'pg';
import { afterAll, beforeAll, expect, it } from 'vitest';
import { createDatabase, describePostgres, type TestDatabase, waitForPostgres } from './postgres.js';

describePostgres('the PostgreSQL test server', () => {
  let db: TestDatabase;
  beforeAll(async () => {
    db = await createDatabase('harness');
  });
  afterAll(async () => {
    await db?.drop();
  });

  it('is a real server on loopback, in a database of its own', async () => {
    await db.exec('create table t (x int); insert into t values (1), (2)');
    const client = new pg.Client({ connectionString: db.url });
    await client.connect();
    try {
      const r = await client.query(
        "select current_database() as db, inet_server_addr()::text as addr, current_setting('server_version_num')::int as v, (select sum(x) from t)::int as s",
      );
      expect(r.rows[0].db).toBe(db.name);
      expect(r.rows[0].addr).toBe('127.0.0.1/32');
      expect(r.rows[0].v).toBeGreaterThanOrEqual(120000);
      expect(r.rows[0].s).toBe(3);
    } finally {
      await client.end();
    }
  });

  it('refuses a wrong password', async () => {
    const url = new URL(await waitForPostgres());
    url.password = 'not-the-password';
    const client = new pg.Client({ connectionString: url.toString() });
    await expect(client.connect()).rejects.toThrow(/password authentication failed/);
    await client.end().catch(() => undefined);
  });
});
