/**
 * Writing a brief's files: together or not at all, never over an input, never leaving a temporary behind.
 *
 * `writeFiles` takes a set of files already produced in memory and
 *   1. refuses a target that is one of the job's inputs (same path, same real path or same inode) or a folder;
 *   2. writes every file to a temporary name beside its target (`.NAME.PID.RAND.tmp`), flushed to disk;
 *   3. keeps a hard link to each file it will replace, then renames the temporaries over the targets;
 *   4. on any failure before the last rename, removes the temporaries and puts every earlier file back, so
 *      the folder holds last run's set or this run's, never a mix.
 * It returns each file's path, size and SHA-256, for whoever records what was written.
 *
 * A signal (Ctrl-C, kill) during a write removes the temporaries before the process ends as the signal asks;
 * `sweepStaleTemporaries` removes those of processes that died without the chance (kill -9, power loss).
 */
import { createHash, randomBytes } from 'node:crypto';
import {
  copyFileSync,
  linkSync,
  lstatSync,
  mkdirSync,
  readdirSync,
  realpathSync,
  renameSync,
  type Stats,
  statSync,
  unlinkSync,
} from 'node:fs';
import { open } from 'node:fs/promises';
import { basename, dirname, join, resolve } from 'node:path';
import { isMainThread } from 'node:worker_threads';
import { BriefError } from '../errors.js';

export interface OutputFile {
  path: string;
  /**
   * The file's bytes; pieces in order for a large file, never joined in memory; or a function that makes
   * the pieces as they are written (the JSON of a long series: hundreds of megabytes that need never be
   * held at once). Such a function is called once, while the file goes to its temporary name.
   */
  bytes: Buffer | string | readonly Buffer[] | (() => Iterable<Buffer>);
}

/** A file's bytes as one Buffer (for a mail message, which is never written in pieces). */
export function bytesOf(f: Pick<OutputFile, 'bytes'>): Buffer {
  const b = f.bytes;
  return typeof b === 'string'
    ? Buffer.from(b, 'utf8')
    : Buffer.isBuffer(b)
      ? b
      : typeof b === 'function'
        ? Buffer.concat([...b()])
        : Buffer.concat(b);
}

/** A file's bytes as pieces to write, made now when they are made on demand. */
function piecesOf(f: OutputFile): Iterable<Buffer> {
  const b = f.bytes;
  return typeof b === 'string'
    ? [Buffer.from(b, 'utf8')]
    : Buffer.isBuffer(b)
      ? [b]
      : typeof b === 'function'
        ? b()
        : b;
}

export interface WrittenFile {
  path: string;
  size: number;
  /** SHA-256 of the bytes written, hex. */
  sha256: string;
}

/** A file the job reads, which no output may replace. */
export interface InputFile {
  path: string;
  /** What it is to the job, for the message: "data file", "logo", "template", "job file". */
  role: string;
}

export function ensureFolder(dir: string): void {
  try {
    mkdirSync(dir, { recursive: true });
  } catch (e) {
    throw new BriefError(
      'out-unwritable',
      `cannot create the output folder ${dir}: ${(e as NodeJS.ErrnoException).code ?? 'error'}`,
      'choose a writable folder with --out',
      { file: dir },
    );
  }
  if (!statSync(dir).isDirectory()) {
    throw new BriefError(
      'out-not-folder',
      `the output path ${dir} is a file, not a folder`,
      'choose a folder with --out',
      { file: dir },
    );
  }
}

/** Writes the files as one set (see the header); returns what was written, in the order given. */
export async function writeFiles(files: OutputFile[], inputs: InputFile[] = []): Promise<WrittenFile[]> {
  checkTargets(files, inputs);
  const release = holdSignals();
  const temps: string[] = [];
  const backups = new Map<string, string>();
  try {
    const written: WrittenFile[] = [];
    for (const f of files) {
      const tmp = temporaryName(f.path);
      temps.push(tmp);
      live.add(tmp);
      const { size, sha256 } = await writeFlushed(tmp, f, f.path);
      written.push({ path: f.path, size, sha256 });
    }
    // The earlier files are kept under temporary names until every new one is in place.
    for (const f of files) {
      if (!lstatSync(f.path, { throwIfNoEntry: false })) continue;
      const backup = temporaryName(f.path);
      live.add(backup);
      backups.set(f.path, backup);
      keepCopy(f.path, backup);
    }
    const done: string[] = [];
    try {
      for (const [i, f] of files.entries()) {
        renameSync(temps[i], f.path);
        live.delete(temps[i]);
        done.push(f.path);
      }
    } catch (e) {
      for (const path of done) {
        const backup = backups.get(path);
        if (backup) renameQuietly(backup, path);
        else removeQuietly(path);
      }
      throw failure(files[done.length].path, e);
    }
    return written;
  } finally {
    for (const t of [...temps, ...backups.values()]) {
      if (live.has(t)) removeQuietly(t);
      live.delete(t);
    }
    release();
  }
}

/** Refuses, before anything is written, a set that would replace an input, a folder or itself. */
function checkTargets(files: OutputFile[], inputs: InputFile[]): void {
  const seen = new Set<string>();
  const ids = new Map<string, InputFile>();
  const paths = new Map<string, InputFile>();
  for (const input of inputs) {
    paths.set(resolve(input.path), input);
    const real = realOrNull(input.path);
    if (real) paths.set(real, input);
    const st = statOrNull(input.path);
    if (st) ids.set(`${st.dev}:${st.ino}`, input);
  }
  for (const f of files) {
    const target = resolve(f.path);
    if (seen.has(target)) throw new Error(`internal: ${target} is written twice in one set`);
    seen.add(target);
    const st = statOrNull(target);
    const real = join(realOrNull(dirname(target)) ?? dirname(target), basename(target));
    const input = paths.get(target) ?? paths.get(real) ?? (st ? ids.get(`${st.dev}:${st.ino}`) : undefined);
    if (input) {
      throw new BriefError(
        'out-over-input',
        `this is the job's own ${input.role}: the brief must not be written over it`,
        'choose another --out folder, or change brief.title so the file names differ',
        { file: f.path },
      );
    }
    if (st?.isDirectory()) {
      throw new BriefError(
        'out-is-folder',
        `a folder is in the way of the output file ${f.path}`,
        'move or rename the folder, or choose another --out folder',
        { file: f.path },
      );
    }
  }
}

// ---- Temporaries and signals -------------------------------------------------------------------------------

/** Temporaries of this thread that exist right now. */
const live = new Set<string>();
/** Output folders whose temporaries of this process a signal also removes (those of worker threads). */
const folders = new Map<string, number>();
const SIGNALS = ['SIGINT', 'SIGTERM', 'SIGHUP'] as const;
let holders = 0;

/** `.NAME.PID.RAND.tmp` beside `path`: hidden, and naming the process that owns it. */
export function temporaryName(path: string): string {
  return join(dirname(path), `.${basename(path)}.${process.pid}.${randomBytes(4).toString('hex')}.tmp`);
}

const TEMPORARY = /^\..+\.(\d+)\.[0-9a-f]{8}\.tmp$/;

function onSignal(signal: NodeJS.Signals): void {
  for (const t of live) removeQuietly(t);
  live.clear();
  for (const dir of folders.keys()) sweep(dir, (pid) => pid === process.pid);
  for (const s of SIGNALS) process.removeListener(s, onSignal);
  // With our listeners gone the signal takes its usual course (the process ends, reporting the signal).
  process.kill(process.pid, signal);
}

/**
 * While a write is in progress the signals that end a run clean up first. Listeners are only present for
 * that time: with one present, Node no longer ends the process at once, and a long computation elsewhere
 * would hold up Ctrl-C. Removal waits a turn of the event loop so a signal that arrived during the last
 * synchronous step is still handled, not lost.
 */
function holdSignals(): () => void {
  if (!isMainThread) return () => {};
  if (holders++ === 0) for (const s of SIGNALS) process.on(s, onSignal);
  return () => {
    setImmediate(() => {
      if (--holders === 0) for (const s of SIGNALS) process.removeListener(s, onSignal);
    });
  };
}

/**
 * For a run whose files are written by worker threads (which see no signals): until the returned function
 * is called, a signal removes every temporary of this process in these folders before the process ends.
 */
export function cleanUpOnSignal(dirs: Iterable<string>): () => void {
  const list = [...new Set(dirs)].map((d) => resolve(d));
  for (const d of list) folders.set(d, (folders.get(d) ?? 0) + 1);
  const release = holdSignals();
  return () => {
    for (const d of list) {
      const n = (folders.get(d) ?? 1) - 1;
      if (n === 0) folders.delete(d);
      else folders.set(d, n);
    }
    release();
  };
}

/**
 * Removes temporaries left in `dir` by processes that no longer run (a kill -9, a power cut). A temporary
 * names its process; one of this process's own number older than this process was left by an earlier
 * process that had the same number. Returns the names removed.
 */
export function sweepStaleTemporaries(dir: string): string[] {
  const startedMs = Date.now() - process.uptime() * 1000;
  return sweep(dir, (pid, st) => (pid === process.pid ? st.mtimeMs < startedMs - 1000 : !alive(pid)));
}

function sweep(dir: string, stale: (pid: number, st: Stats) => boolean): string[] {
  let names: string[];
  try {
    names = readdirSync(dir);
  } catch {
    return [];
  }
  const removed: string[] = [];
  for (const name of names) {
    const m = TEMPORARY.exec(name);
    if (!m) continue;
    const path = join(dir, name);
    const st = lstatSync(path, { throwIfNoEntry: false });
    if (!st?.isFile() || live.has(path) || !stale(Number(m[1]), st)) continue;
    if (removeQuietly(path)) removed.push(name);
  }
  return removed;
}

function alive(pid: number): boolean {
  try {
    process.kill(pid, 0);
    return true;
  } catch (e) {
    // EPERM: the process exists but belongs to someone else.
    return (e as NodeJS.ErrnoException).code === 'EPERM';
  }
}

// ---- Small steps -----------------------------------------------------------------------------------------

/** Writes the file's pieces to tmp and flushes it; its size and SHA-256, taken from the pieces as they go. */
async function writeFlushed(tmp: string, f: OutputFile, target: string): Promise<{ size: number; sha256: string }> {
  const hash = createHash('sha256');
  let size = 0;
  try {
    const handle = await open(tmp, 'wx', 0o666);
    try {
      // Pieces made on demand are made here, one at a time, before the temporary is renamed: a failure
      // while making them is a failure of the write, and leaves nothing behind.
      for (const p of piecesOf(f)) {
        await handle.writeFile(p);
        hash.update(p);
        size += p.length;
      }
      await handle.sync();
    } finally {
      await handle.close();
    }
  } catch (e) {
    // A fault in making the pieces is no fault of the disk's: it goes up as it is (the caller still
    // removes the temporary).
    if (!(e instanceof BriefError) && (e as NodeJS.ErrnoException).code === undefined) throw e;
    throw failure(target, e);
  }
  return { size, sha256: hash.digest('hex') };
}

/** A second name for the file about to be replaced: a hard link, or a copy where links are not allowed. */
function keepCopy(path: string, backup: string): void {
  try {
    linkSync(path, backup);
  } catch {
    try {
      copyFileSync(path, backup);
    } catch (e) {
      throw failure(path, e);
    }
  }
}

const REASONS: Record<string, [string, string]> = {
  ENOSPC: ['the disk is full', 'free some space, or choose another --out folder'],
  EDQUOT: ['the disk quota is used up', 'free some space, or choose another --out folder'],
  EFBIG: ['the file is larger than the file-size limit', 'raise the limit (ulimit -f) or choose fewer formats'],
  EACCES: ['permission denied', 'choose a folder you can write to with --out'],
  EPERM: ['permission denied', 'choose a folder you can write to with --out'],
  EROFS: ['the file system is read-only', 'choose a writable folder with --out'],
  ENAMETOOLONG: ['the file name is too long', 'shorten brief.title or the --out path'],
};

function failure(target: string, e: unknown): BriefError {
  if (e instanceof BriefError) return e;
  const code = (e as NodeJS.ErrnoException).code ?? 'error';
  const [reason, hint] = REASONS[code] ?? [code, 'check that the output folder is writable and has space'];
  return new BriefError(
    'out-unwritable',
    `cannot write ${basename(target)} (${reason}); no file of this brief was changed`,
    hint,
    { file: target },
    1,
  );
}

/** Clean-up never throws: a failure to tidy must not hide the failure being reported. */
function removeQuietly(path: string): boolean {
  try {
    unlinkSync(path);
    return true;
  } catch {
    return false;
  }
}

function renameQuietly(from: string, to: string): void {
  try {
    renameSync(from, to);
  } catch {
    // The earlier file is still under its temporary name; the next run's sweep would remove it, so say so.
    process.stderr.write(`trendbrief: could not put back ${to}; the earlier file is kept as ${from}\n`);
    live.delete(from);
  }
}

function statOrNull(path: string): Stats | null {
  try {
    return statSync(path);
  } catch {
    return null;
  }
}

function realOrNull(path: string): string | null {
  try {
    return realpathSync(path);
  } catch {
    return null;
  }
}
