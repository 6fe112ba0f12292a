/**
 * Reading a file the job names (the job itself, a template, the logo) only when it is an ordinary file. A
 * named pipe would be read until something writes to it, perhaps for ever; a link to /dev/zero or
 * /dev/urandom would be read until memory runs out. The file is opened without waiting (O_NONBLOCK, so
 * opening a pipe with no writer returns at once) and checked on the open descriptor, so what is checked is
 * what is read.
 */
import { closeSync, constants, fstatSync, openSync, readFileSync } from 'node:fs';

export class NotRegularFile extends Error {
  readonly code = 'ENOTREG';
  /** What the path is instead, in words: "a folder", "a named pipe", "a device", "a socket". */
  readonly kind: string;
  constructor(path: string, kind: string) {
    super(`${path} is ${kind}, not an ordinary file`);
    this.kind = kind;
  }
}

/** A file larger than the caller's limit, refused before it is read. */
export class FileTooLarge extends Error {
  readonly code = 'EFBIG';
  readonly size: number;
  readonly limit: number;
  constructor(path: string, size: number, limit: number) {
    super(`${path} holds ${size} bytes, more than ${limit}`);
    this.size = size;
    this.limit = limit;
  }
}

/** The file's bytes; `maxBytes` refuses a larger ordinary file before reading it (FileTooLarge). */
export function readRegularFile(path: string, maxBytes = Number.POSITIVE_INFINITY): Buffer {
  const fd = openSync(path, constants.O_RDONLY | constants.O_NONBLOCK | (constants.O_NOCTTY ?? 0));
  try {
    const st = fstatSync(fd);
    if (!st.isFile()) {
      const kind = st.isDirectory()
        ? 'a folder'
        : st.isFIFO()
          ? 'a named pipe'
          : st.isSocket()
            ? 'a socket'
            : st.isCharacterDevice() || st.isBlockDevice()
              ? 'a device'
              : 'not a file';
      throw new NotRegularFile(path, kind);
    }
    if (st.size > maxBytes) throw new FileTooLarge(path, st.size, maxBytes);
    return readFileSync(fd);
  } finally {
    closeSync(fd);
  }
}
