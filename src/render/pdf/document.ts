/**
 * The brief's pdfkit document: a subclass of pdfkit's PDFDocument, and the one place where pdfkit's own
 * behaviour is changed. Every change is an override on these two subclasses (the document and its object
 * references), so it applies to our documents only: pdfkit's prototypes are never touched, and any other
 * pdfkit document in the process is written as pdfkit writes it (test/render/pdf-document.test.ts).
 *
 * What is changed, and why:
 * - Speed (measured on bench/brief-12.yaml, bench/PDF.md): pdfkit turns every content operator into bytes by a
 *   loop over its characters and keeps one small array per operator; a brief writes hundreds of thousands.
 *   A reference keeps its operators as text and turns them into bytes at once, natively (Node's latin1
 *   keeps the low byte of each UTF-16 unit, as pdfkit's own conversion does), and the file's own lines
 *   (object headers, dictionaries, the cross-reference table) are pushed a few thousand at a time. An object
 *   whose dictionary holds only names, integers, references and arrays or dictionaries of those (the
 *   structure tree's elements, most of a tagged brief's objects) is written without pdfkit's general
 *   converter, as it would write it. A marked-content operator for an element's content (a tag and its
 *   MCID, tens of thousands in a brief's tables) likewise.
 * - Compression: the document's zlib level (pdfkit always uses zlib's default); same stream contents.
 * - The text setter's graphics state (text.ts): anything written to a page but marked-content operators,
 *   and a change of page, makes the fill colour and font last set unknown.
 * - XMP (ISO 16684-1): pdfkit copies the Info strings into its XML unescaped; they are escaped here.
 *
 * Bytes: the same as pdfkit's at zlib's default level (test/render/pdf-document.test.ts draws one document
 * both ways). The pdfkit internals this relies on are checked by name when the module loads, so an upgrade
 * that renames one fails loudly here rather than writing a different file.
 */
import { deflateSync } from 'node:zlib';
import PDFDocument from 'pdfkit';
import { escapeXml } from './metadata.js';

/** What of pdfkit's document (internal members) the overrides use. */
interface DocumentInternals {
  _offset: number;
  _offsets: unknown[];
  _waiting: number;
  _security?: unknown;
  _write(data: unknown): void;
  _refEnd(ref: unknown): void;
  _addInfo(): void;
  push(chunk: unknown, encoding?: BufferEncoding): boolean;
  page: PDFKit.PDFPage & { markings: { tag: string; options?: object; structContent?: unknown }[] };
}

/** What of pdfkit's reference (internal members) the overrides use. */
interface ReferenceInternals {
  id: number;
  gen: number;
  offset: number;
  data: Record<string, unknown>;
  compress: boolean;
  buffer: Uint8Array[];
  document: BriefDocument;
  write(chunk: unknown): void;
  finalize(): void;
}

type DocumentClass = new (options?: PDFKit.PDFDocumentOptions) => PDFKit.PDFDocument & DocumentInternals;
type ReferenceClass = new (document: unknown, id: number, data?: object) => ReferenceInternals;

const PdfkitDocument = PDFDocument as unknown as DocumentClass;

/**
 * pdfkit does not export its reference class; its document's `ref` makes one, called here on a stand-in
 * holding only what that method reads, so no document is made and nothing is changed.
 */
const PdfkitReference = (() => {
  const ref = (PdfkitDocument.prototype as unknown as { ref(this: object, data: object): object }).ref.call(
    { _offsets: [], _waiting: 0, compress: false },
    {},
  );
  return Object.getPrototypeOf(ref).constructor as ReferenceClass;
})();

for (const [name, proto] of [
  ['_write', PdfkitDocument.prototype],
  ['_refEnd', PdfkitDocument.prototype],
  ['_addInfo', PdfkitDocument.prototype],
  ['markContent', PdfkitDocument.prototype],
  ['endMarkedContent', PdfkitDocument.prototype],
  ['write', PdfkitReference.prototype],
  ['finalize', PdfkitReference.prototype],
] as const) {
  if (typeof (proto as unknown as Record<string, unknown>)[name] !== 'function')
    throw new Error(`pdfkit no longer has ${name}: review src/render/pdf/document.ts`);
}

/** Operators (and lines of the file) kept as text before they are turned into bytes. */
const BATCH = 2048;

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

class BriefReference extends PdfkitReference {
  /** Operators written since the last conversion. */
  private pending: string[] = [];

  override write(chunk: unknown): void {
    if (typeof chunk === 'string') {
      // Turned into bytes every so many operators too: a document keeps every page until it ends, and
      // bytes outside the JavaScript heap cost the garbage collector nothing to keep.
      if (this.pending.push(chunk) >= BATCH) this.flush();
      return;
    }
    this.flush();
    super.write(chunk);
  }

  private flush(): void {
    if (this.pending.length === 0) return;
    const text = `${this.pending.join('\n')}\n`;
    this.pending = [];
    super.write(Buffer.from(text, 'latin1'));
  }

  override finalize(): void {
    this.flush();
    const d = this.document;
    if (!d._security && this.buffer.length === 0) {
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
    // Compressed here at the document's level; pdfkit then writes the bytes as they are (the stream's
    // /Filter is already FlateDecode).
    const chunks = this.buffer;
    if (d.deflateLevel !== undefined && this.compress && chunks.length > 0) {
      this.buffer = [deflateSync(chunks.length === 1 ? chunks[0] : Buffer.concat(chunks), { level: d.deflateLevel })];
      this.compress = false;
    }
    super.finalize();
  }
}

export interface BriefDocumentOptions extends PDFKit.PDFDocumentOptions {
  /**
   * zlib level for the document's streams; pdfkit uses zlib's default (6). Level 2 compresses a brief's
   * content about 2.5 times as fast, for streams about a sixth larger.
   */
  deflateLevel?: number;
}

/** The fill colour and font the page's content has last set (text.ts); null when unknown. */
export interface TextState {
  colour: string | null;
  font: string | null;
}

// pdfkit's constructor already writes the file's header, makes references and may add a page, all
// through these overrides, before a field initialiser would run: so the fields are declared only, and
// set where first needed.
export class BriefDocument extends PdfkitDocument {
  declare deflateLevel: number | undefined;
  declare private state: TextState | undefined;
  /** Lines of the file not yet pushed. */
  declare private lines: string[] | undefined;

  constructor(options: BriefDocumentOptions = {}) {
    const { deflateLevel, ...rest } = options;
    super(rest);
    this.deflateLevel = deflateLevel;
  }

  /** The text setter's graphics state for the current page. */
  get textState(): TextState {
    if (this.state === undefined) this.state = { colour: null, font: null };
    return this.state;
  }

  private forgetTextState(): void {
    if (this.state === undefined) return;
    this.state.colour = null;
    this.state.font = null;
  }

  /** pdfkit's ref, making our reference. */
  override ref(data?: object): PDFKit.PDFKitReference {
    const ref = new BriefReference(this, this._offsets.length + 1, data);
    this._offsets.push(null);
    this._waiting++;
    return ref as unknown as PDFKit.PDFKitReference;
  }

  /**
   * pdfkit writes the file a line at a time, each a chunk pushed through the document's stream; here the
   * lines are gathered and pushed a few thousand at a time. The running offset (from which the
   * cross-reference table is made) still moves at every line: a line of text is one byte per character.
   */
  override _write(data: unknown): void {
    if (typeof data === 'string') {
      const line = `${data}\n`;
      if (this.lines === undefined) this.lines = [];
      this._offset += line.length;
      if (this.lines.push(line) >= BATCH) this.flushLines();
      return;
    }
    this.flushLines();
    super._write(data);
  }

  private flushLines(): void {
    if (this.lines === undefined || this.lines.length === 0) return;
    const text = this.lines.join('');
    this.lines = [];
    super.push(Buffer.from(text, 'latin1'));
  }

  /** The end of the file (pdfkit pushes null) comes after the lines still gathered. */
  override push(chunk: unknown, encoding?: BufferEncoding): boolean {
    if (chunk === null) this.flushLines();
    return super.push(chunk, encoding);
  }

  override addContent(data: unknown): this {
    if (typeof data !== 'string' || !(data === 'EMC' || data.endsWith(' BDC') || data.endsWith(' BMC')))
      this.forgetTextState();
    super.addContent(data);
    return this;
  }

  /** Writes to the page without forgetting the text state (for text.ts, which keeps it). */
  addTextContent(data: string): void {
    super.addContent(data);
  }

  override addPage(options?: PDFKit.PDFDocumentOptions): this {
    this.forgetTextState();
    super.addPage(options);
    return this;
  }

  override switchToPage(n?: number): PDFKit.PDFPage {
    this.forgetTextState();
    return super.switchToPage(n);
  }

  /**
   * An element's content (a tag and only its MCID) is marked as pdfkit marks it, without its general
   * dictionary converter; every other kind goes to pdfkit.
   */
  override markContent(tag: string, options?: PDFKit.Mixins.MarkingOptions): this {
    const mcid = (options as { mcid?: unknown } | undefined)?.mcid;
    if (tag === 'Artifact' || tag === 'Span' || typeof mcid !== 'number' || Object.keys(options as object).length !== 1)
      return super.markContent(tag, options);
    // As pdfkit: content of a structure element closes any marked content still open (pdfkit tests the
    // MCID for truth, so not for the first content of a page, which may be content carried over).
    if (mcid) {
      let toClose = 0;
      for (const m of this.page.markings) if (toClose || m.structContent || m.tag === 'Artifact') toClose++;
      while (toClose--) this.endMarkedContent();
    }
    this.page.markings.push({ tag, options: options as object });
    this.addContent(`/${tag} <<\n/MCID ${mcid}\n>> BDC`);
    return this;
  }

  /** pdfkit's XMP Info entries, with the Info strings escaped for XML. */
  override _addInfo(): void {
    const info = this.info as unknown as Record<string, unknown>;
    this.info = Object.fromEntries(
      Object.entries(info).map(([k, v]) => [k, typeof v === 'string' ? escapeXml(v) : v]),
    ) as PDFKit.DocumentInfo;
    try {
      super._addInfo();
    } finally {
      this.info = info as PDFKit.DocumentInfo;
    }
  }
}
