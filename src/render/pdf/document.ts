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
 *   (object headers, dictionaries, the cross-reference table) are pushed a few thousand at a time. A
 *   marked-content operator for an element's content (a tag and its MCID) is written without pdfkit's
 *   general dictionary converter.
 * - Compression: the document's zlib level (pdfkit always uses zlib's default); same stream contents.
 * - The text setter's graphics state (text.ts): anything written to a page but marked-content operators,
 *   and a change of page, makes the fill colour and font last set unknown.
 * - XMP (ISO 16684-1): pdfkit copies the Info strings into its XML unescaped; they are escaped here.
 * - Fonts (`adoptFont`): the brief's fonts are pdfkit's embedded font objects whose measuring, encoding and
 *   embedding are replaced on those objects (fonts.ts shapes a word once per process; embed.ts writes
 *   subsets that keep glyph numbers). The text setter and the chart drawer reach pdfkit's page font
 *   resources and its colour parser only through the methods below.
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
  _refEnd(ref: unknown): void;
  _write(data: unknown): void;
  _addInfo(): void;
  _font: EmbeddedFont | null;
  _registeredFonts: Record<string, unknown>;
  _fontFamilies: Record<string, EmbeddedFont>;
  _normalizeColor(colour: string): number[] | null;
  _fillColor?: [string, number | undefined];
  push(chunk: unknown, encoding?: BufferEncoding): boolean;
  page: PDFKit.PDFPage & {
    dictionary: object;
    fonts: Record<string, unknown>;
    markings: { tag: string; options?: object; structContent?: unknown }[];
  };
}

/**
 * pdfkit's embedded font (an untyped internal): what fonts.ts and embed.ts read, and the three methods a
 * brief's font replaces (on that font object only, see `adoptFont`).
 */
export interface EmbeddedFont {
  id: string;
  font: object & { stream?: { buffer?: unknown } };
  ref(): unknown;
  unicode: number[][];
  layout(text: string, features?: unknown): { glyphs: unknown[]; positions: unknown[] };
  /** pdfkit's measuring and shaping of a word, for its own text (svg-to-pdfkit's, the chart drawer's). */
  layoutCached?: (text: string) => unknown;
  /** pdfkit's encoding of a text into character codes and positions. */
  encode?: (text: string, features?: unknown) => [string[], unknown[]];
  /** pdfkit's writing of the font into the file when the document ends. */
  embed?: () => void;
}

export type FontHooks = Required<Pick<EmbeddedFont, 'layoutCached' | 'encode' | 'embed'>>;

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

/** What of pdfkit's structure element (internal members) the table rows use. */
interface StructureInternals {
  dictionary: ReferenceInternals;
  _children: unknown[];
  _flushChild(child: unknown): void;
}

type StructureClass = new (document: unknown, type: string) => PDFKit.PDFStructureElement & StructureInternals;

/** pdfkit's structure element class, found as the reference class is, from its document's `struct`. */
const PdfkitStructure = (() => {
  const el = (PdfkitDocument.prototype as unknown as { struct(this: object, type: string): object }).struct.call(
    { ref: (data: object) => ({ data }) },
    'P',
  );
  return Object.getPrototypeOf(el).constructor as StructureClass;
})();

for (const [name, proto] of [
  ['_write', PdfkitDocument.prototype],
  ['_addInfo', PdfkitDocument.prototype],
  ['_normalizeColor', PdfkitDocument.prototype],
  ['markContent', PdfkitDocument.prototype],
  ['endMarkedContent', PdfkitDocument.prototype],
  ['_refEnd', PdfkitDocument.prototype],
  ['markStructureContent', PdfkitDocument.prototype],
  ['getStructParentTree', PdfkitDocument.prototype],
  ['_flushChild', PdfkitStructure.prototype],
  ['write', PdfkitReference.prototype],
  ['finalize', PdfkitReference.prototype],
] as const) {
  if (typeof (proto as unknown as Record<string, unknown>)[name] !== 'function')
    throw new Error(`pdfkit no longer has ${name}: review src/render/pdf/document.ts`);
}

/**
 * Text (operators, lines of the file) is written as Latin-1 bytes straight into buffers, so it leaves the
 * JavaScript heap at once: a document keeps every page until it ends, and strings kept that long are
 * copied by minor garbage collections until they are promoted, where bytes outside the heap cost the
 * collector nothing. A page's operators go into buffers of 16 KiB (a page of a table is about 20 KiB), the
 * file's own lines into buffers of 64 KiB.
 */
const PAGE_CHUNK = 1 << 14;
const FILE_CHUNK = 1 << 16;

/** Lines of Latin-1 text (each followed by a line feed) gathered into buffers of `size` bytes. */
class Latin1Lines {
  private buf: Buffer | null = null;
  private at = 0;

  constructor(
    private readonly size: number,
    private readonly emit: (bytes: Buffer) => void,
  ) {}

  /** Adds text and a line feed; a line longer than a buffer goes out whole. */
  add(text: string): void {
    const need = text.length + 1;
    if (this.buf === null || need > this.size - this.at) {
      this.flush();
      if (need > this.size) {
        this.emit(Buffer.from(`${text}\n`, 'latin1'));
        return;
      }
      this.buf = Buffer.allocUnsafe(this.size);
    }
    const buf = this.buf as Buffer;
    this.at += buf.write(text, this.at, 'latin1');
    buf[this.at++] = 0x0a;
  }

  flush(): void {
    if (this.buf === null || this.at === 0) return;
    const out = this.buf.subarray(0, this.at);
    this.buf = null;
    this.at = 0;
    this.emit(out);
  }
}

class BriefReference extends PdfkitReference {
  /** Operators written since the last conversion (made on the first). */
  private text: Latin1Lines | undefined;

  override write(chunk: unknown): void {
    if (typeof chunk === 'string') {
      if (this.text === undefined) this.text = new Latin1Lines(PAGE_CHUNK, (bytes) => super.write(bytes));
      this.text.add(chunk);
      return;
    }
    this.flush();
    super.write(chunk);
  }

  private flush(): void {
    this.text?.flush();
  }

  override finalize(): void {
    this.flush();
    const d = this.document;
    if (this.buffer.length === 0 && !d._security) {
      // An object without a stream (a structure element, tens of thousands in a brief's tables): its
      // dictionary written here in one line when it holds only names, numbers, references, arrays and
      // dictionaries of those, as pdfkit's converter writes them; anything else goes to pdfkit.
      const text = plainValue(this.data);
      if (text !== null) {
        this.offset = d._offset;
        d._write(`${this.id} ${this.gen} obj\n${text}\nendobj`);
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

/**
 * A value as pdfkit's PDFObject.convert writes it, for names (strings), finite numbers, booleans, null,
 * references, arrays and plain dictionaries of those; null for anything else (text strings, dates, bytes,
 * trees), which pdfkit converts itself.
 */
function plainValue(v: unknown): string | null {
  switch (typeof v) {
    case 'string':
      return `/${v}`;
    case 'number':
      // pdfkit's PDFObject.number: six decimals, and an error (from pdfkit) past ±1e21.
      return v > -1e21 && v < 1e21 ? `${Math.round(v * 1e6) / 1e6}` : null;
    case 'boolean':
      return `${v}`;
    case 'object': {
      if (v === null) return 'null';
      if (v instanceof PdfkitReference) return `${v.id} ${v.gen} R`;
      if (Array.isArray(v)) {
        let out = '[';
        for (let i = 0; i < v.length; i++) {
          const e = plainValue(v[i] === undefined ? null : v[i]);
          if (e === null) return null;
          out += i === 0 ? e : ` ${e}`;
        }
        return `${out}]`;
      }
      const proto = Object.getPrototypeOf(v);
      if (proto !== Object.prototype && proto !== null) return null;
      let out = '<<';
      for (const key in v) {
        const val = (v as Record<string, unknown>)[key];
        if (val === undefined) continue;
        const e = plainValue(val);
        if (e === null) return null;
        out += `\n/${key} ${e}`;
      }
      return `${out}\n>>`;
    }
    default:
      return null;
  }
}

/**
 * A table row (TR) whose cells are made by BriefDocument's beginCell and endCell: each cell's structure
 * element is written as soon as its content is, and the row lists it among its kids as pdfkit lists a
 * structure element's (its reference, in order).
 */
export class TableRow extends PdfkitStructure {
  constructor(document: BriefDocument) {
    super(document, 'TR');
  }

  override _flushChild(child: unknown): void {
    if (child instanceof PdfkitReference) (this.dictionary.data.K as unknown[]).push(child);
    else super._flushChild(child);
  }
}

/** A cell begun (beginCell) and not yet ended. */
export interface OpenCell {
  ref: ReferenceInternals;
  mcid: number;
  /** The page's entry in the parent tree. */
  parents: unknown[];
  /** The start of its dictionary (see CELLS). */
  head: string;
  row: TableRow;
}

/**
 * The kinds of cell: each one's data (what pdfkit's element would start with; read by nobody once the cell
 * is written, so shared) and the start of its dictionary as pdfkit's converter writes it.
 */
const CELLS: Record<string, { data: object; head: string }> = {
  TD: { data: { S: 'TD' }, head: '<<\n/S /TD' },
  TH: { data: { S: 'TH' }, head: '<<\n/S /TH' },
  'TH Row': { data: { S: 'TH' }, head: '<<\n/S /TH\n/A <<\n/O /Table\n/Scope /Row\n>>' },
  'TH Column': { data: { S: 'TH' }, head: '<<\n/S /TH\n/A <<\n/O /Table\n/Scope /Column\n>>' },
  'TD Row': { data: { S: 'TD' }, head: '<<\n/S /TD\n/A <<\n/O /Table\n/Scope /Row\n>>' },
  'TD Column': { data: { S: 'TD' }, head: '<<\n/S /TD\n/A <<\n/O /Table\n/Scope /Column\n>>' },
};

export interface BriefDocumentOptions extends Omit<PDFKit.PDFDocumentOptions, 'font'> {
  /** The font the document starts with (a file's bytes or fontkit's parse), in place of Helvetica. */
  font?: object;
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
  declare private lines: Latin1Lines | undefined;

  constructor(options: BriefDocumentOptions = {}) {
    const { deflateLevel, ...rest } = options;
    super(rest as PDFKit.PDFDocumentOptions);
    this.deflateLevel = deflateLevel;
    // pdfkit passes its options to every page it adds, and a page given a font selects it anew (making a
    // new font object each time): the starting font is for the document's start only.
    delete (this.options as { font?: unknown }).font;
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
      if (this.lines === undefined) this.lines = new Latin1Lines(FILE_CHUNK, (bytes) => super.push(bytes));
      this.lines.add(data);
      this._offset += data.length + 1;
      return;
    }
    this.flushLines();
    super._write(data);
  }

  private flushLines(): void {
    this.lines?.flush();
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
   * An element's content (a tag and only its MCID, tens of thousands in a brief's tables) is marked as
   * pdfkit marks it, without its general dictionary converter; every other kind goes to pdfkit.
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

  /**
   * A table cell (TH or TD, with a header's scope) in `row`, its content what is drawn until endCell: the
   * same objects, marked content and parent-tree entries, in the same order, as pdfkit makes for
   * `row.add(doc.struct(type, { scope }, draw))` (tests draw a table both ways), without a structure
   * element object and a closure for each of the tens of thousands of cells of a brief's tables. A cell's
   * content never starts a page.
   */
  beginCell(row: TableRow, type: 'TH' | 'TD', scope?: 'Column' | 'Row'): OpenCell {
    const kind = CELLS[scope === undefined ? type : `${type} ${scope}`];
    const ref = this.ref(kind.data) as unknown as ReferenceInternals;
    const parents = (this as unknown as { getStructParentTree(): { get(key: number): unknown[] } })
      .getStructParentTree()
      .get((this.page as unknown as { structParentTreeKey: number }).structParentTreeKey);
    const mcid = parents.length;
    parents.push(null);
    this.markContent(type, { mcid } as PDFKit.Mixins.MarkingOptions);
    return { ref, mcid, parents, head: kind.head, row };
  }

  /**
   * Ends the cell's content and writes its element: the dictionary pdfkit writes for it (its type and
   * scope, parent, MCID and page), in one line.
   */
  endCell(cell: OpenCell): void {
    this.endMarkedContent();
    const { ref, mcid, parents, row } = cell;
    parents[mcid] = ref;
    ref.offset = this._offset;
    this._write(
      `${ref.id} ${ref.gen} obj\n${cell.head}\n/P ${row.dictionary}\n/K [${mcid}]\n/Pg ${this.page.dictionary}\n>>\nendobj`,
    );
    this._refEnd(ref);
    row._children.push(ref);
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

  /**
   * The font registered under `name` (from `src`, on first use) as pdfkit's embedded font object, made the
   * way pdfkit makes it (by selecting it) with the current font put back, so nothing changes for pdfkit's
   * own text. When the document's starting font is this font (`same`), that object is named instead, so
   * pdfkit finds it without comparing. `hooks` replace its measuring, encoding and embedding: fonts.ts
   * shapes words once per process and embed.ts writes subsets that keep glyph numbers.
   */
  adoptFont(
    name: string,
    src: object,
    same: (font: EmbeddedFont['font']) => boolean,
    hooks: (font: EmbeddedFont) => FontHooks,
  ): EmbeddedFont {
    const previous = this._font;
    if (!this._registeredFonts[name]) this.registerFont(name, src as Buffer);
    let font: EmbeddedFont;
    if (previous !== null && same(previous.font)) {
      font = previous;
      this._fontFamilies[name] = font;
    } else {
      this.font(name);
      font = this._font as EmbeddedFont;
      if (previous) this._font = previous;
    }
    Object.assign(font, hooks(font));
    return font;
  }

  /** Puts the font in the current page's resources, as pdfkit does when its own text uses a font. */
  useFontOnPage(font: EmbeddedFont): void {
    const fonts = this.page.fonts;
    if (fonts[font.id] == null) fonts[font.id] = font.ref();
  }

  /** pdfkit's reading of a colour (hex, CSS name): its components, or null for one it does not know. */
  colourComponents(colour: string): number[] | null {
    return this._normalizeColor(colour);
  }

  /** Remembers a fill colour set by the chart drawer's own operators, as pdfkit's fillColor does. */
  rememberFillColour(colour: string): void {
    this._fillColor = [colour, undefined];
  }
}
