/**
 * Atomic output: every file is written to a temporary name beside its target and renamed over it, so a
 * reader never sees half a file and a failed run leaves earlier outputs as they were. A batch of files is
 * only written once every one of them has been produced in memory.
 */
import { randomBytes } from 'node:crypto';
import { mkdirSync, renameSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { basename, dirname, join } from 'node:path';
import { BriefError } from '../errors.js';

export interface OutputFile {
  path: string;
  bytes: Buffer | string;
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

export function writeAtomic(file: OutputFile): void {
  const tmp = join(dirname(file.path), `.${basename(file.path)}.${process.pid}.${randomBytes(4).toString('hex')}.tmp`);
  try {
    writeFileSync(tmp, file.bytes);
    renameSync(tmp, file.path);
  } catch (e) {
    rmSync(tmp, { force: true });
    const code = (e as NodeJS.ErrnoException).code ?? 'error';
    throw new BriefError(
      'out-unwritable',
      `cannot write ${file.path} (${code})`,
      'check that the output folder is writable and has space',
      { file: file.path },
      1,
    );
  }
}

/** Writes every file atomically; on the first failure the ones not yet renamed are never touched. */
export function writeAll(files: OutputFile[]): void {
  for (const f of files) writeAtomic(f);
}
