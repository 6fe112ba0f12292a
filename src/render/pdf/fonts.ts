/**
 * The PDF's fonts: the Source Sans 3 TrueType files the charts are laid out with, and for what Source Sans 3
 * lacks, Noto Sans Hebrew and Noto Sans Arabic (SIL Open Font License 1.1) and an emoji subset of Symbola
 * (free for any use), kept in the package's fonts/ folder (fonts/README.md says where they come from). All are
 * registered under our own names so no PDF standard-14 font (Helvetica and kin, which are never embedded)
 * can be picked by accident; a font no text used is never written to the file. TrueType only: pdfkit's
 * subsetting fails on WOFF2 files.
 *
 * Each font file is read and parsed once per process, and its recent shaped words are kept (shape.ts
 * WordCache), so a second brief costs no new parsing and little new shaping — without carrying anything of
 * the first into its file (test/render/pdf-process.test.ts).
 */
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { FACES, type Face, sourceSansFile } from '../../chart/fonts.js';
import { PACKAGE_ROOT } from '../../package-root.js';
import { BriefDocument, type EmbeddedFont as PdfkitFont } from './document.js';
import { type Embeddable, embedFont } from './embed.js';
import { type FontTables, readFontTables } from './opentype.js';
import {
  type FontkitFont,
  type GlyphRec,
  type Shaped,
  type ShapingFont,
  shapeCached,
  WORDS_KEPT,
  WordCache,
} from './shape.js';

export type { Face };

/** The fonts text can be set in: the Source Sans faces, then the fallbacks. */
export type Slot = Face | 'HebrewRegular' | 'HebrewBold' | 'ArabicRegular' | 'ArabicBold' | 'Emoji';

const FALLBACK_FILES: Record<Exclude<Slot, Face>, string> = {
  HebrewRegular: 'NotoSansHebrew-Regular.ttf',
  HebrewBold: 'NotoSansHebrew-Bold.ttf',
  ArabicRegular: 'NotoSansArabic-Regular.ttf',
  ArabicBold: 'NotoSansArabic-Bold.ttf',
  Emoji: 'Symbola-emoji.ttf',
};

/** The package's fonts/ folder. */
const FONT_DIR = new URL('fonts/', PACKAGE_ROOT);

export function fallbackFile(slot: Exclude<Slot, Face>): string {
  return fileURLToPath(new URL(FALLBACK_FILES[slot], FONT_DIR));
}

function fileOf(slot: Slot): string {
  return (FACES as readonly string[]).includes(slot)
    ? sourceSansFile(slot as Face)
    : fallbackFile(slot as Exclude<Slot, Face>);
}

/** The name a face is registered under in a document. */
export function fontName(slot: Slot): string {
  return `tb-${slot}`;
}

/** pdfkit's embedded font, with the fields this module reads of it. */
export interface EmbeddedFont extends PdfkitFont {
  font: FontkitFont;
  layout(text: string, features?: unknown): { glyphs: GlyphRec[]; positions: unknown[] };
}

/** A font as shared by every document of the process. */
export interface SharedFont extends ShapingFont {
  slot: Slot;
  bytes: Buffer;
  /** Ascender and descender, 1/1000 em (pdfkit's). */
  ascender: number;
  descender: number;
  lineGap: number;
  shaped: WordCache<Shaped>;
  /** fontkit's parse of the file, from the first document that embedded it. */
  parsed?: FontkitFont;
}

const shared = new Map<Slot, SharedFont>();

export function sharedFont(slot: Slot): SharedFont {
  let s = shared.get(slot);
  if (s === undefined) {
    const bytes = readFileSync(fileOf(slot));
    const tables: FontTables = readFontTables(bytes);
    const scale = 1000 / tables.unitsPerEm;
    const font: SharedFont = {
      slot,
      bytes,
      tables,
      scale,
      ascender: tables.ascender * scale,
      descender: tables.descender * scale,
      lineGap: tables.lineGap * scale,
      shaped: new WordCache<Shaped>(WORDS_KEPT),
      records: new Map<number, GlyphRec>(),
      ligatureRecords: new Map<number, GlyphRec>(),
      fontkit: () => {
        if (font.parsed === undefined) throw new Error(`font ${slot} used for shaping before it was embedded`);
        return font.parsed;
      },
    };
    s = font;
    shared.set(slot, s);
  }
  return s;
}

export function shape(font: SharedFont, text: string): Shaped {
  return shapeCached(font, font.shaped, text);
}

/** A font in one document: pdfkit's embedded font, and the glyphs drawn so far (first record wins). */
export interface DocFont {
  shared: SharedFont;
  embedded: EmbeddedFont;
  used: Map<number, GlyphRec>;
  /** Unique to this document's font: words drawn in it carry it once their glyphs are noted. */
  mark: number;
}

let marks = 0;

const docFonts = new WeakMap<PDFKit.PDFDocument, Map<Slot, DocFont>>();

/** The document as the brief's (fonts are adopted through it, document.ts). */
function briefDocument(doc: PDFKit.PDFDocument): BriefDocument {
  if (!(doc instanceof BriefDocument)) throw new Error('the PDF text setter draws on a BriefDocument only');
  return doc;
}

/**
 * The slot's font in this document, embedded on first use (document.ts `adoptFont`): selecting it there
 * changes nothing for pdfkit's own text.
 */
export function docFont(doc: PDFKit.PDFDocument, slot: Slot): DocFont {
  let fonts = docFonts.get(doc);
  if (fonts === undefined) {
    fonts = new Map();
    docFonts.set(doc, fonts);
  }
  let f = fonts.get(slot);
  if (f === undefined) {
    const s = sharedFont(slot);
    const entry = { shared: s, used: new Map(), mark: ++marks } as Omit<DocFont, 'embedded'> as DocFont;
    const embedded = briefDocument(doc).adoptFont(
      fontName(slot),
      s.parsed ?? s.bytes,
      (start) => slot === 'Regular' && (start === s.parsed || start.stream?.buffer === s.bytes),
      (e) => ({
        layoutCached: pdfkitLayout(s),
        // pdfkit's own text (svg-to-pdfkit's) encodes with the same codes, and the font is written by embed.ts.
        encode: (text, features) => {
          const { glyphs, positions } = (e as EmbeddedFont).layout(text, features);
          return [glyphs.map((g) => glyphHex(entry, g)), positions];
        },
        embed: () => embedFont(e as unknown as Embeddable, s.bytes, entry.used, slot),
      }),
    ) as EmbeddedFont;
    entry.embedded = embedded;
    if (s.parsed === undefined) s.parsed = embedded.font;
    f = entry;
    fonts.set(slot, f);
  }
  return f;
}

/** The character code of a glyph (its glyph number, as the subset keeps numbers), noting it as drawn. */
export function glyphHex(f: DocFont, g: GlyphRec): string {
  if (!f.used.has(g.id)) {
    f.used.set(g.id, g);
    // svg-to-pdfkit reads the characters of each code back from pdfkit's table (indexed by code).
    f.embedded.unicode[g.id] = g.codePoints;
  }
  let h = g.hex;
  if (h === undefined) {
    h = `0000${g.id.toString(16)}`.slice(-4);
    g.hex = h;
  }
  return h;
}

/** The font a document starts with (pdfkit's option `font`): the regular face, as parsed for the process. */
export function defaultFont(): Buffer | FontkitFont {
  const s = sharedFont('Regular');
  return s.parsed ?? s.bytes;
}

/**
 * Registers the Source Sans faces and makes the regular face current, replacing pdfkit's Helvetica default
 * before any text is drawn (an unused font is never written to the file).
 */
export function registerFonts(doc: PDFKit.PDFDocument): void {
  for (const face of FACES) docFont(doc, face);
  doc.font(fontName('Regular'));
}

interface PdfkitRun {
  glyphs: GlyphRec[];
  positions: { xAdvance: number; yAdvance: number; xOffset: number; yOffset: number; advanceWidth: number }[];
  advanceWidth: number;
}

const pdfkitRuns = new WeakMap<SharedFont, WordCache<PdfkitRun>>();

/**
 * pdfkit's own text (what svg-to-pdfkit and the chart drawer set) measures and encodes words through its
 * font's layoutCached; it is given the same shaped words, in pdfkit's form, kept as the words are (WordCache).
 */
function pdfkitLayout(s: SharedFont): (text: string) => PdfkitRun {
  let runs = pdfkitRuns.get(s);
  if (runs === undefined) {
    runs = new WordCache<PdfkitRun>(WORDS_KEPT);
    pdfkitRuns.set(s, runs);
  }
  const cache = runs;
  return (text: string): PdfkitRun => {
    let run = cache.get(text);
    if (run === undefined) {
      const w = shape(s, text);
      run = {
        glyphs: w.glyphs,
        positions: w.glyphs.map((g, i) => ({
          xAdvance: w.advances[i],
          yAdvance: 0,
          xOffset: w.offsets ? w.offsets[2 * i] : 0,
          yOffset: w.offsets ? w.offsets[2 * i + 1] : 0,
          advanceWidth: g.advanceWidth * s.scale,
        })),
        advanceWidth: w.width,
      };
      cache.set(text, run);
    }
    return run;
  };
}

/**
 * svg-to-pdfkit's font choice for chart text: whatever family the SVG names (the charts name "Source Sans
 * 3"), draw it with our registered faces, so its default fallback to Helvetica never happens.
 */
export function svgFont(_family: string, bold: boolean, italic: boolean): string {
  if (italic) return fontName('It');
  return fontName(bold ? 'Semibold' : 'Regular');
}
