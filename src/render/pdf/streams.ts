/**
 * Speed: pdfkit turns every content operator into bytes as it is written, by a loop over its characters,
 * and keeps one small array per operator until the stream is compressed; a brief writes hundreds of
 * thousands of operators. Here the operators of a stream are kept as text and turned into bytes at once,
 * natively, just before pdfkit's own code next needs bytes (a binary chunk, or the end of the stream). The
 * bytes are the same: pdfkit keeps the low byte of each UTF-16 unit and ends each operator with a line
 * feed, and Node's latin1 encoding keeps the same byte (test/render/pdf-streams.test.ts).
 *
 * A document may also ask for its own zlib level (pdfkit always uses zlib's default); the stream's contents
 * stay the same, only the compressed bytes differ.
 *
 * pdfkit's stream objects are internal, so the change is made once to their shared prototype, found
 * through the document's root object, and to the document's own line writer; both stay for the process.
 */

import { deflateSync } from 'node:zlib';

interface StreamRef {
  write(chunk: unknown): unknown;
  finalize(): unknown;
  /** pdfkit's: whether the stream is to be compressed, and its chunks so far. */
  compress?: boolean;
  buffer?: Uint8Array[];
  document?: object;
  data?: unknown;
  id?: number;
  gen?: number;
  offset?: number;
  /** Operators written since the last conversion. */
  tbPending?: string[];
}

const PATCHED = Symbol.for('trendbrief.pdfStreams');

interface DocState {
  _security?: unknown;
  _offset: number;
  _write(data: string): void;
  _refEnd(ref: unknown): void;
}

/** A reference to another object, as pdfkit's references are (an id, a generation, the document). */
function isReference(v: object): v is { id: number; gen: number } {
  const r = v as { id?: unknown; gen?: unknown; document?: unknown; data?: unknown };
  return typeof r.id === 'number' && typeof r.gen === 'number' && r.document !== undefined && r.data !== undefined;
}

/**
 * pdfkit's PDFObject.convert for names, integers, references, arrays and plain dictionaries (a string is a
 * name, written as it is, as pdfkit writes it); null for anything else.
 */
function simple(v: unknown): string | null {
  if (typeof v === 'string') return `/${v}`;
  if (typeof v === 'number') return Number.isInteger(v) && Math.abs(v) < 1e15 ? `${v}` : null;
  if (v === null || typeof v !== 'object') return null;
  if (Array.isArray(v)) {
    const items: string[] = [];
    for (const e of v) {
      const c = simple(e);
      if (c === null) return null;
      items.push(c);
    }
    return `[${items.join(' ')}]`;
  }
  if (isReference(v)) return `${v.id} ${v.gen} R`;
  if (Object.getPrototypeOf(v) !== Object.prototype) return null;
  const out = ['<<'];
  for (const key in v) {
    const val = (v as Record<string, unknown>)[key];
    if (val === undefined) continue;
    const c = simple(val);
    if (c === null) return null;
    out.push(`/${key} ${c}`);
  }
  out.push('>>');
  return out.join('\n');
}

interface FileState {
  _offset: number;
  /** Lines of the file not yet pushed. */
  tbLines?: string[];
}

interface FileProto {
  _write?: (this: FileState, data: unknown) => unknown;
  push?: (this: FileState, chunk: unknown, encoding?: BufferEncoding) => boolean;
  [PATCHED]?: true;
}

/** Operators (and lines of the file) kept as text before they are turned into bytes. */
const BATCH = 2048;

/** Where a document keeps the zlib level asked for its streams. */
const LEVEL = Symbol.for('trendbrief.deflateLevel');

export interface StreamOptions {
  /**
   * zlib level for the document's streams; pdfkit uses zlib's default (6). Level 2 compresses a brief's
   * content about 2.5 times as fast, for streams about a sixth larger (the file a few per cent larger, as
   * most of it is the uncompressed structure tree).
   */
  deflateLevel?: number;
}

export function batchStreamWrites(doc: PDFKit.PDFDocument, options: StreamOptions = {}): void {
  if (options.deflateLevel !== undefined) (doc as unknown as Record<symbol, number>)[LEVEL] = options.deflateLevel;
  const root = (doc as unknown as { _root?: object })._root;
  const proto = root ? (Object.getPrototypeOf(root) as StreamRef & { [PATCHED]?: true }) : null;
  if (!proto || proto[PATCHED] || typeof proto.write !== 'function' || typeof proto.finalize !== 'function') return;
  const write = proto.write;
  const finalize = proto.finalize;
  const flush = (ref: StreamRef): void => {
    const pending = ref.tbPending;
    if (pending === undefined || pending.length === 0) return;
    ref.tbPending = [];
    write.call(ref, Buffer.from(`${pending.join('\n')}\n`, 'latin1'));
  };
  proto.write = function (this: StreamRef, chunk: unknown) {
    if (typeof chunk === 'string') {
      if (this.tbPending === undefined) this.tbPending = [];
      // Turned into bytes every so many operators too: a document keeps every page until it ends, and
      // bytes outside the JavaScript heap cost the garbage collector nothing to keep.
      if (this.tbPending.push(chunk) >= BATCH) flush(this);
      return;
    }
    flush(this);
    return write.call(this, chunk);
  };
  proto.finalize = function (this: StreamRef) {
    flush(this);
    // An object without a stream whose dictionary holds only names, integers, references and arrays or
    // dictionaries of those (the structure tree's elements, most of a tagged brief's objects) is written
    // here, as pdfkit's PDFObject.convert would write it, without its general converter.
    const d = this.document as DocState | undefined;
    if (d && !d._security && Array.isArray(this.buffer) && this.buffer.length === 0) {
      const text = simple(this.data);
      if (text !== null) {
        this.offset = d._offset;
        d._write(`${this.id} ${this.gen} obj`);
        d._write(text);
        d._write('endobj');
        d._refEnd(this);
        return;
      }
    }
    // Compressed here when the document asked for its own level; pdfkit then writes the bytes as they
    // are (the stream's /Filter is already FlateDecode).
    const chunks = this.buffer;
    const level = (this.document as Record<symbol, number> | undefined)?.[LEVEL];
    if (level !== undefined && this.compress && Array.isArray(chunks) && chunks.length > 0) {
      this.buffer = [deflateSync(chunks.length === 1 ? chunks[0] : Buffer.concat(chunks), { level })];
      this.compress = false;
    }
    return finalize.call(this);
  };
  proto[PATCHED] = true;

  // The file itself (object headers, dictionaries, the cross-reference table) is written by pdfkit a line
  // at a time, each line a chunk pushed through the document's stream. Here the lines are gathered and
  // pushed a few thousand at a time, as bytes made natively. pdfkit's running file offset (from which the
  // cross-reference table is made) still moves at every line: a line of text is one byte per character.
  const file = Object.getPrototypeOf(doc) as FileProto;
  const writeFile = file._write;
  const push = file.push;
  if (file[PATCHED] || typeof writeFile !== 'function' || typeof push !== 'function') return;
  const flushFile = (d: FileState): void => {
    const lines = d.tbLines;
    if (lines === undefined || lines.length === 0) return;
    d.tbLines = [];
    push.call(d, Buffer.from(lines.join(''), 'latin1'));
  };
  file._write = function (this: FileState, data: unknown) {
    if (typeof data === 'string') {
      const line = `${data}\n`;
      if (this.tbLines === undefined) this.tbLines = [];
      this._offset += line.length;
      if (this.tbLines.push(line) >= BATCH) flushFile(this);
      return;
    }
    flushFile(this);
    return writeFile.call(this, data);
  };
  // The end of the file (pdfkit pushes null) comes after the lines still gathered.
  file.push = function (this: FileState, chunk: unknown, encoding?: BufferEncoding) {
    if (chunk === null) flushFile(this);
    return push.call(this, chunk, encoding);
  };
  file[PATCHED] = true;
}
