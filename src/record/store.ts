/**
 * Opening the record and writing to it. Appends run in one transaction under the record's write lock:
 * the entries of one brief go in together or not at all, numbered after the last entry and chained to its
 * hash. A brief recorded again for the same series and period becomes the next issue, with its reason.
 */
import { BriefError } from '../errors.js';
import type { RecordSpec } from '../vocabulary/settings.js';
import { entryHash, GENESIS } from './chain.js';
import type { Db, Query, Row } from './db.js';
import { ENTRIES, migrate, SCHEMA_VERSION, schemaOf } from './migrations.js';
import type { Entry, NewEntry } from './types.js';

/** Where a record is: an SQLite file, or a PostgreSQL connection string from the named variable. */
export type RecordPlace = { store: 'sqlite'; file: string } | { store: 'postgres'; env: string };

export interface EntryFilter {
  kind?: Entry['kind'];
  brief?: string;
  group?: string;
  run?: string;
  message?: string;
}

export interface RecordStore {
  /** The file, or host:port/database, for messages. */
  where: string;
  append(entries: NewEntry[]): Promise<Entry[]>;
  /** Entries in order of seq. */
  entries(filter?: EntryFilter): Promise<Entry[]>;
  close(): Promise<void>;
}

export function placeOf(spec: RecordSpec): RecordPlace | null {
  if (spec.store === 'none') return null;
  return spec.store === 'sqlite'
    ? { store: 'sqlite', file: spec.file }
    : { store: 'postgres', env: spec.connectionEnv };
}

/**
 * Opens the record; `write` creates or migrates it. Every failure is one BriefError line: unreadable,
 * locked, refused, or written by a newer trendbrief.
 */
export async function openRecord(
  place: RecordPlace,
  options: { toolVersion: string; write: boolean; env?: NodeJS.ProcessEnv },
): Promise<RecordStore> {
  const db = await connect(place, options.write, options.env ?? process.env);
  try {
    const found = options.write
      ? await migrate(db, options.toolVersion, new Date().toISOString())
      : (await schemaOf(db, db.dialect)).version;
    if (found > SCHEMA_VERSION) {
      const { toolVersion } = await schemaOf(db, db.dialect);
      throw new BriefError(
        'record-newer',
        `the record ${db.where} was written by trendbrief ${toolVersion} (record schema ${found}); this trendbrief ${options.toolVersion} knows schema ${SCHEMA_VERSION}`,
        'update trendbrief to read or add to this record',
        { file: place.store === 'sqlite' ? place.file : undefined },
      );
    }
    if (found === 0 && !options.write) {
      throw new BriefError(
        'record-empty',
        `${db.where} holds no trendbrief record`,
        'render a brief first, or name the right record',
        {},
      );
    }
  } catch (e) {
    await db.close();
    throw e instanceof BriefError ? e : explain(e, db.where, place);
  }
  return storeOn(db, place);
}

function storeOn(db: Db, place: RecordPlace): RecordStore {
  const guard = async <T>(f: () => Promise<T>): Promise<T> => {
    try {
      return await f();
    } catch (e) {
      throw e instanceof BriefError ? e : explain(e, db.where, place);
    }
  };
  return {
    where: db.where,
    append: (entries) => guard(() => db.locked((q) => appendIn(q, entries))),
    entries: (filter = {}) => guard(() => readEntries(db, filter)),
    close: () => db.close(),
  };
}

async function connect(place: RecordPlace, write: boolean, env: NodeJS.ProcessEnv): Promise<Db> {
  if (place.store === 'sqlite') {
    const { openSqlite } = await import('./sqlite.js');
    try {
      return await openSqlite(place.file, !write);
    } catch (e) {
      if (e instanceof BriefError) throw e;
      throw explain(e, place.file, place);
    }
  }
  const url = (env[place.env] ?? '').trim();
  if (url === '') {
    throw new BriefError(
      'record-no-connection',
      `the record is kept in PostgreSQL, but ${place.env} is not set`,
      `set ${place.env} to a connection string such as postgres://user@host:5432/briefs`,
      {},
    );
  }
  const { openPostgres } = await import('./postgres.js');
  try {
    return await openPostgres(url);
  } catch (e) {
    throw explain(e, hostOf(url), place);
  }
}

/** host:port/db of a connection string, without its password. */
function hostOf(url: string): string {
  try {
    const u = new URL(url);
    return `${u.hostname}:${u.port || '5432'}${u.pathname}`;
  } catch {
    return 'the PostgreSQL server';
  }
}

/** One line for each way a record fails to open or to take an entry. */
export function explain(e: unknown, where: string, place: RecordPlace): BriefError {
  const err = e as { code?: string; message?: string };
  const code = err.code ?? '';
  const text = String(err.message ?? e).split('\n')[0];
  const file = place.store === 'sqlite' ? { file: place.file } : {};
  // Extended codes too: SQLITE_BUSY_RECOVERY, SQLITE_BUSY_SNAPSHOT, SQLITE_LOCKED_SHAREDCACHE and the like.
  if (code.startsWith('SQLITE_BUSY') || code.startsWith('SQLITE_LOCKED') || code === '55P03')
    return new BriefError(
      'record-locked',
      `the record ${where} is locked by another process`,
      'wait for it to finish, then run again',
      file,
      1,
    );
  if (
    code === 'ECONNREFUSED' ||
    code === 'ENOTFOUND' ||
    code === 'ETIMEDOUT' ||
    code === '28P01' ||
    code === '3D000' ||
    code === '28000'
  )
    return new BriefError(
      'record-refused',
      `the record's database at ${where} refused the connection (${code === '28P01' ? 'password' : code === '3D000' ? 'no such database' : code})`,
      `check the connection string in ${place.store === 'postgres' ? place.env : 'the environment'} and that the server is running`,
      {},
      1,
    );
  if (code === 'SQLITE_NOTADB' || code === 'SQLITE_CORRUPT')
    return new BriefError(
      'record-unreadable',
      `${where} is not a trendbrief record (not an SQLite database)`,
      'point record.file at the record, or move the file away',
      file,
      2,
    );
  if (code === 'ENOTDIR' || code === 'EEXIST')
    return new BriefError(
      'record-unreadable',
      `cannot make the folder of the record ${where}: a file stands in its path`,
      'choose another record.file, or move that file away',
      file,
      1,
    );
  if (code.startsWith('SQLITE_CANTOPEN') || code === 'EACCES' || code === 'SQLITE_READONLY' || code === 'SQLITE_PERM')
    return new BriefError(
      'record-unreadable',
      `cannot open the record ${where} (${code})`,
      'check that the file and its folder exist and are writable',
      file,
      1,
    );
  return new BriefError(
    'record-failed',
    `the record ${where} failed: ${text}${code ? ` (${code})` : ''}`,
    'run again with --debug for details',
    file,
    1,
  );
}

async function appendIn(q: Query, entries: NewEntry[]): Promise<Entry[]> {
  const last = await q.all(`SELECT seq, hash FROM ${ENTRIES} ORDER BY seq DESC LIMIT 1`);
  let seq = last.length ? Number(last[0].seq) : 0;
  let prevHash = last.length ? String(last[0].hash) : GENESIS;
  const recordedAt = new Date().toISOString();
  const out: Entry[] = [];
  for (const n of entries) {
    let issue = 0;
    let reason = n.reason;
    if (n.kind === 'publication') {
      const before = await q.all(
        `SELECT issue, job_sha256, data_sha256 FROM ${ENTRIES} WHERE kind = 'publication' AND brief = ? AND grp = ? AND series = ? AND period = ? ORDER BY issue DESC LIMIT 1`,
        [n.brief, n.group, n.series, n.period],
      );
      issue = before.length ? Number(before[0].issue) + 1 : 1;
      if (before.length) {
        const why = reissueReason(before[0], n);
        reason = reason ? `${reason} (${why})` : why;
      }
    }
    const e: Omit<Entry, 'hash'> = { ...n, reason, seq: ++seq, issue, recordedAt, prevHash };
    const entry: Entry = { ...e, hash: entryHash(e) };
    await q.run(
      `INSERT INTO ${ENTRIES} (seq, kind, brief, grp, series, period, issue, reason, recorded_at, tool_version, run, shard, job_sha256, data_sha256, message, recipient, status, body, prev_hash, hash) VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)`,
      [
        entry.seq,
        entry.kind,
        entry.brief,
        entry.group,
        entry.series,
        entry.period,
        entry.issue,
        entry.reason,
        entry.recordedAt,
        entry.toolVersion,
        entry.run,
        entry.shard,
        entry.jobSha256,
        entry.dataSha256,
        entry.message,
        entry.recipient,
        entry.status,
        entry.body,
        entry.prevHash,
        entry.hash,
      ],
    );
    out.push(entry);
    prevHash = entry.hash;
  }
  return out;
}

/** Why a series and period was published again, from what changed since the issue before. */
function reissueReason(before: Row, n: NewEntry): string {
  const issue = Number(before.issue);
  const data = before.data_sha256 !== n.dataSha256;
  const job = before.job_sha256 !== n.jobSha256;
  if (data && job) return `job and data changed since issue ${issue}`;
  if (data) return `data changed since issue ${issue}`;
  if (job) return `job changed since issue ${issue}`;
  return `same job and data as issue ${issue}`;
}

async function readEntries(db: Db, f: EntryFilter): Promise<Entry[]> {
  const where: string[] = [];
  const params: string[] = [];
  const add = (column: string, v: string | undefined) => {
    if (v === undefined) return;
    where.push(`${column} = ?`);
    params.push(v);
  };
  add('kind', f.kind);
  add('brief', f.brief);
  add('grp', f.group);
  add('run', f.run);
  add('message', f.message);
  const rows = await db.all(
    `SELECT * FROM ${ENTRIES}${where.length ? ` WHERE ${where.join(' AND ')}` : ''} ORDER BY seq`,
    params,
  );
  return rows.map(toEntry);
}

function toEntry(r: Row): Entry {
  const s = (k: string) => String(r[k]);
  return {
    seq: Number(r.seq),
    kind: s('kind') as Entry['kind'],
    brief: s('brief'),
    group: s('grp'),
    series: s('series'),
    period: s('period'),
    issue: Number(r.issue),
    reason: s('reason'),
    recordedAt: s('recorded_at'),
    toolVersion: s('tool_version'),
    run: s('run'),
    shard: s('shard'),
    jobSha256: s('job_sha256'),
    dataSha256: s('data_sha256'),
    message: s('message'),
    recipient: s('recipient'),
    status: s('status'),
    body: s('body'),
    prevHash: s('prev_hash'),
    hash: s('hash'),
  };
}
