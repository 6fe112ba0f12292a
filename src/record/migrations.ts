/**
 * The record's schema, one list of versioned steps for SQLite and PostgreSQL alike. A record is brought up
 * to the newest step it lacks when opened for writing; a record whose schema is newer than this tool's list
 * was written by a newer trendbrief and is refused (its entries may hold what this version cannot keep).
 * Steps are only ever added, never edited.
 */
import type { Db, Query } from './db.js';

export interface Migration {
  version: number;
  /** Statements run on both databases, in order. */
  both: string[];
  sqlite?: string[];
  postgres?: string[];
}

export const SCHEMA_TABLE = 'trendbrief_record_schema';
export const ENTRIES = 'trendbrief_record_entries';

export const MIGRATIONS: Migration[] = [
  {
    version: 1,
    both: [
      `CREATE TABLE ${ENTRIES} (
        seq BIGINT NOT NULL PRIMARY KEY,
        kind TEXT NOT NULL,
        brief TEXT NOT NULL,
        grp TEXT NOT NULL,
        series TEXT NOT NULL,
        period TEXT NOT NULL,
        issue INTEGER NOT NULL,
        reason TEXT NOT NULL,
        recorded_at TEXT NOT NULL,
        tool_version TEXT NOT NULL,
        run TEXT NOT NULL,
        shard TEXT NOT NULL,
        job_sha256 TEXT NOT NULL,
        data_sha256 TEXT NOT NULL,
        message TEXT NOT NULL,
        recipient TEXT NOT NULL,
        status TEXT NOT NULL,
        body TEXT NOT NULL,
        prev_hash TEXT NOT NULL,
        hash TEXT NOT NULL
      )`,
      `CREATE INDEX trendbrief_record_by_brief ON ${ENTRIES} (brief, grp, series, period)`,
      `CREATE INDEX trendbrief_record_by_run ON ${ENTRIES} (run)`,
      `CREATE INDEX trendbrief_record_by_message ON ${ENTRIES} (message)`,
    ],
    // Append-only in the database itself: updates and deletes are refused.
    sqlite: [
      `CREATE TRIGGER trendbrief_record_no_update BEFORE UPDATE ON ${ENTRIES} BEGIN SELECT RAISE(ABORT, 'the trendbrief record is append-only'); END`,
      `CREATE TRIGGER trendbrief_record_no_delete BEFORE DELETE ON ${ENTRIES} BEGIN SELECT RAISE(ABORT, 'the trendbrief record is append-only'); END`,
    ],
    postgres: [
      `CREATE FUNCTION trendbrief_record_refuse() RETURNS trigger LANGUAGE plpgsql AS $$ BEGIN RAISE EXCEPTION 'the trendbrief record is append-only'; END $$`,
      `CREATE TRIGGER trendbrief_record_no_change BEFORE UPDATE OR DELETE ON ${ENTRIES} FOR EACH ROW EXECUTE FUNCTION trendbrief_record_refuse()`,
    ],
  },
];

export const SCHEMA_VERSION = MIGRATIONS[MIGRATIONS.length - 1].version;

/** The record's schema version (0 for an empty database) and the tool version that last migrated it. */
export async function schemaOf(
  db: Db | Query,
  dialect: Db['dialect'],
): Promise<{ version: number; toolVersion: string }> {
  const found =
    dialect === 'sqlite'
      ? await db.all(`SELECT name FROM sqlite_master WHERE type = 'table' AND name = ?`, [SCHEMA_TABLE])
      : await db.all('SELECT to_regclass(?) IS NOT NULL AS name', [SCHEMA_TABLE]).then((r) => r.filter((x) => x.name));
  if (found.length === 0) return { version: 0, toolVersion: '' };
  const rows = await db.all(`SELECT version, tool_version FROM ${SCHEMA_TABLE} ORDER BY version DESC LIMIT 1`);
  if (rows.length === 0) return { version: 0, toolVersion: '' };
  return { version: Number(rows[0].version), toolVersion: String(rows[0].tool_version) };
}

/** Applies the steps the record lacks, each in the write lock; returns the version found before. */
export async function migrate(db: Db, toolVersion: string, now: string): Promise<number> {
  return db.locked(async (q) => {
    await q.run(
      `CREATE TABLE IF NOT EXISTS ${SCHEMA_TABLE} (version INTEGER NOT NULL PRIMARY KEY, tool_version TEXT NOT NULL, applied_at TEXT NOT NULL)`,
    );
    const { version } = await schemaOf(q, db.dialect);
    if (version > SCHEMA_VERSION) return version;
    for (const m of MIGRATIONS) {
      if (m.version <= version) continue;
      for (const sql of [...m.both, ...((db.dialect === 'sqlite' ? m.sqlite : m.postgres) ?? [])]) await q.run(sql);
      await q.run(`INSERT INTO ${SCHEMA_TABLE} (version, tool_version, applied_at) VALUES (?, ?, ?)`, [
        m.version,
        toolVersion,
        now,
      ]);
    }
    return version;
  });
}
