/**
 * Speed: pdfkit turns every content operator into bytes as it is written, by a loop over its characters,
 * and keeps one small array per operator until the stream is compressed; a brief writes hundreds of
 * thousands of operators. Here the operators of a stream are kept as text and turned into bytes at once,
 * natively, just before pdfkit's own code next needs bytes (a binary chunk, or the end of the stream). The
 * bytes are the same: pdfkit keeps the low byte of each UTF-16 unit and ends each operator with a line
 * feed, and Node's latin1 encoding keeps the same byte (test/render/pdf-streams.test.ts).
 *
 * pdfkit's stream objects are internal, so the change is made once to their shared prototype, found
 * through the document's root object, and to the document's own line writer; both stay for the process.
 */

interface StreamRef {
  write(chunk: unknown): unknown;
  finalize(): unknown;
  /** Operators written since the last conversion. */
  tbPending?: string[];
}

const PATCHED = Symbol.for('trendbrief.pdfStreams');

export function batchStreamWrites(doc: PDFKit.PDFDocument): void {
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
      this.tbPending.push(chunk);
      return;
    }
    flush(this);
    return write.call(this, chunk);
  };
  proto.finalize = function (this: StreamRef) {
    flush(this);
    return finalize.call(this);
  };
  proto[PATCHED] = true;

  // The file itself (object headers, dictionaries) goes the same way, a line at a time; a Buffer made
  // natively also spares the stream's copy of a plain byte array into one.
  const file = Object.getPrototypeOf(doc) as { _write?: (data: unknown) => unknown; [PATCHED]?: true };
  const writeFile = file._write;
  if (file[PATCHED] || typeof writeFile !== 'function') return;
  file._write = function (this: unknown, data: unknown) {
    return writeFile.call(this, typeof data === 'string' ? Buffer.from(`${data}\n`, 'latin1') : data);
  };
  file[PATCHED] = true;
}
