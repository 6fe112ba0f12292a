/**
 * The PDF's fonts: the Source Sans 3 TrueType files the charts are laid out with, registered under our own
 * names so no PDF standard-14 font (Helvetica and kin, which are never embedded) can be picked by accident.
 * TrueType only: pdfkit's subsetting fails on WOFF2 files.
 *
 * Speed: pdfkit shapes every distinct word with fontkit's full OpenType engine and caches the result per
 * document; a brief's tables are thousands of distinct numbers, each shaped once. For text made only of
 * characters that Source Sans 3 neither substitutes nor kerns (digits, separators, signs; checked against
 * fontkit in test/render/pdf-fonts.test.ts) the glyphs are looked up directly, and the parsed fonts and their
 * shaped words are kept for the process, so a second brief costs no new parsing (without carrying anything
 * of the first into its file: test/render/pdf-process.test.ts).
 */
import { readFileSync } from 'node:fs';
import { FACES, type Face, sourceSansFile } from '../../chart/fonts.js';

export type { Face };

/** The name a face is registered under in a document. */
export function fontName(face: Face): string {
  return `tb-${face}`;
}

/** Characters whose glyphs fontkit's shaping leaves as the cmap gives them, advance unchanged. */
export const PLAIN_TEXT = /^[0-9,.\u2212+%()\u2013/: -]+$/;

interface Glyph {
  id: number;
  advanceWidth: number;
  codePoints: number[];
}
interface Position {
  xAdvance: number;
  yAdvance: number;
  xOffset: number;
  yOffset: number;
  advanceWidth: number;
}
interface Run {
  glyphs: Glyph[];
  positions: Position[];
  advanceWidth: number;
}
/** The parts of fontkit's font and pdfkit's embedded font used here (both untyped internals). */
interface FontkitFont {
  layout(text: string): unknown;
  glyphForCodePoint(cp: number): Glyph;
  characterSet?: number[];
}
interface EmbeddedFont {
  font?: FontkitFont;
  scale?: number;
  layoutRun?: (text: string) => Run;
  layoutCached?: (text: string) => Run;
}

interface Shared {
  source: Buffer | FontkitFont;
  runs: Map<string, Run>;
}

/** Shaped words kept per face; cleared when a long-running process has gathered this many (a batch worker
 * meets about a thousand new numbers a brief; each run costs about a kilobyte). */
const RUN_LIMIT = 20_000;

let shared: Map<Face, Shared> | undefined;

function sharedFonts(): Map<Face, Shared> {
  if (shared === undefined)
    shared = new Map(FACES.map((f) => [f, { source: readFileSync(sourceSansFile(f)), runs: new Map() }]));
  return shared;
}

/**
 * Registers every face and makes the regular face current, replacing pdfkit's Helvetica default before any
 * text is drawn (an unused font is never written to the file).
 */
export function registerFonts(doc: PDFKit.PDFDocument): void {
  for (const [face, s] of sharedFonts()) {
    doc.registerFont(fontName(face), s.source as Buffer);
    doc.font(fontName(face));
    const embedded = (doc as unknown as { _font?: EmbeddedFont })._font;
    if (embedded?.font && typeof embedded.font.layout === 'function' && s.source !== embedded.font) {
      settleGlyphs(embedded.font);
      s.source = embedded.font;
    }
    if (embedded) fastLayout(embedded, s.runs);
  }
  doc.font(fontName('Regular'));
}

/**
 * fontkit keeps one glyph object per glyph, labelled with the characters it was first reached from, and
 * pdfkit writes that label into the file's ToUnicode map. A few glyphs serve several characters (space and
 * no-break space, the hyphens); reaching every glyph once, in code point order, before any text fixes each
 * label to its lowest character, so a shared font gives every document the same map whatever came before.
 */
function settleGlyphs(font: FontkitFont): void {
  const all = [...(font.characterSet ?? [])].sort((a, b) => a - b);
  for (const cp of all) font.glyphForCodePoint(cp);
}

/** Replaces the font's per-document word cache by the shared one, with the direct path for plain text. */
function fastLayout(e: EmbeddedFont, runs: Map<string, Run>): void {
  const font = e.font;
  const scale = e.scale;
  const shape = e.layoutRun;
  if (!font || typeof font.glyphForCodePoint !== 'function' || typeof scale !== 'number' || typeof shape !== 'function')
    return;
  e.layoutCached = (text: string): Run => {
    let run = runs.get(text);
    if (run === undefined) {
      run = PLAIN_TEXT.test(text) ? plainRun(font, scale, text) : shape.call(e, text);
      if (runs.size >= RUN_LIMIT) runs.clear();
      runs.set(text, run);
    }
    return run;
  };
}

/** A run built glyph by glyph from the cmap, scaled to 1000 units per em as pdfkit's own runs are. */
export function plainRun(font: FontkitFont, scale: number, text: string): Run {
  const glyphs: Glyph[] = [];
  const positions: Position[] = [];
  let advanceWidth = 0;
  for (const ch of text) {
    const g = font.glyphForCodePoint(ch.codePointAt(0) as number);
    const w = g.advanceWidth * scale;
    glyphs.push(g);
    positions.push({ xAdvance: w, yAdvance: 0, xOffset: 0, yOffset: 0, advanceWidth: w });
    advanceWidth += w;
  }
  return { glyphs, positions, advanceWidth };
}

/**
 * svg-to-pdfkit's font choice for chart text: whatever family the SVG names (the charts name "Source Sans
 * 3"), draw it with our registered faces, so its default fallback to Helvetica never happens.
 */
export function svgFont(_family: string, bold: boolean, italic: boolean): string {
  if (italic) return fontName('It');
  return fontName(bold ? 'Semibold' : 'Regular');
}
