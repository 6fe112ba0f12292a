/**
 * Shaping one word in one font: the glyphs to draw and how far each moves the pen, in units of 1/1000 em
 * (the unit of PDF glyph widths).
 *
 * Two paths. The direct one, for Latin text in a font whose kerning and ligatures opentype.ts reads exactly:
 * glyphs from the cmap, the 'liga' ligatures, advances from hmtx plus the 'kern' pair adjustments. For the
 * characters in DIRECT (checked against fontkit for Source Sans 3 in test/render/pdf-text.test.ts) that is
 * exactly what fontkit's full OpenType shaping gives, at a small fraction of its cost. Everything else (other
 * scripts, combining marks, Hebrew and Arabic with their joining forms and marks) goes to fontkit, which
 * returns right-to-left scripts in visual order.
 *
 * Glyph records carry the characters they stand for, which pdfkit writes into the font's ToUnicode map so
 * text can be extracted. A glyph shared by several characters (space and no-break space) is labelled with
 * the lowest of them, whatever text reached it first, so the map never depends on earlier documents.
 */
import type { FontTables } from './opentype.js';

export interface GlyphRec {
  id: number;
  /** Advance in font units (pdfkit's glyph.advanceWidth). */
  advanceWidth: number;
  codePoints: number[];
  /** The glyph number as the 4 hex digits of its character code in the PDF (set on first use). */
  hex?: string;
}

export interface Shaped {
  glyphs: GlyphRec[];
  /** Pen advance after each glyph, 1/1000 em, kerning included. */
  advances: number[];
  /** Offsets of each glyph from its pen position (x, y pairs, 1/1000 em, y up), or null when all are zero. */
  offsets: number[] | null;
  /** Sum of the advances. */
  width: number;
  /** The word's TJ array elements (glyph codes and kerning), the same in every document; set on first use. */
  tj?: string;
  /** The document font that last noted this word's glyphs as drawn. */
  mark?: number;
  /** The word without its trailing spaces, for the end of a line. */
  trimmed?: Shaped;
}

/** Characters the direct path handles (those fontkit's default Latin features only kern and ligate). */
export const DIRECT =
  /^[\u0020-\u007e\u00a0-\u00ac\u00ae-\u017f\u2010-\u2015\u2018-\u201e\u2020-\u2022\u2026\u2030\u2032\u2033\u2039\u203a\u20ac\u2122\u2212]*$/;

/** The parts of a fontkit font used here. */
export interface FontkitFont {
  layout(text: string): {
    glyphs: { id: number; advanceWidth: number; codePoints: number[] }[];
    positions: { xAdvance: number; yAdvance: number; xOffset: number; yOffset: number }[];
  };
}

/** A font as the shaper sees it: its tables, and fontkit on demand. */
export interface ShapingFont {
  tables: FontTables;
  /** 1000 / unitsPerEm. */
  scale: number;
  fontkit(): FontkitFont;
  /** Glyph records of single characters, by glyph id. */
  records: Map<number, GlyphRec>;
  /** Glyph records of ligatures, by glyph id (kept apart: a ligature glyph may also be a character's). */
  ligatureRecords: Map<number, GlyphRec>;
}

function record(font: ShapingFont, gid: number, cp: number): GlyphRec {
  let rec = font.records.get(gid);
  if (rec === undefined) {
    rec = {
      id: gid,
      advanceWidth: font.tables.advance(gid),
      codePoints: [font.tables.lowestCodePoint(gid) ?? cp],
    };
    font.records.set(gid, rec);
  }
  return rec;
}

/** The direct path, or null when a character is outside DIRECT or missing from the font. */
export function directShape(font: ShapingFont, text: string): Shaped | null {
  const t = font.tables;
  if (!t.simple || !DIRECT.test(text)) return null;
  const glyphs: GlyphRec[] = [];
  for (let i = 0; i < text.length; i++) {
    const cp = text.charCodeAt(i);
    const gid = t.glyphOf(cp);
    if (gid === 0) return null;
    glyphs.push(record(font, gid, cp));
  }
  ligate(font, glyphs);
  const advances: number[] = new Array(glyphs.length);
  let width = 0;
  for (let i = 0; i < glyphs.length; i++) {
    let a = glyphs[i].advanceWidth;
    if (i + 1 < glyphs.length) a += t.kern(glyphs[i].id, glyphs[i + 1].id);
    a *= font.scale;
    advances[i] = a;
    width += a;
  }
  return { glyphs, advances, offsets: null, width };
}

/** Replaces each ligature's components by the ligature glyph, first match in the font's order. */
function ligate(font: ShapingFont, glyphs: GlyphRec[]): void {
  for (let i = 0; i < glyphs.length; i++) {
    const options = font.tables.ligatures(glyphs[i].id);
    if (options === undefined) continue;
    for (const lig of options) {
      if (i + lig.rest.length >= glyphs.length) continue;
      let match = true;
      for (let k = 0; k < lig.rest.length && match; k++) match = glyphs[i + 1 + k].id === lig.rest[k];
      if (!match) continue;
      let rec = font.ligatureRecords.get(lig.glyph);
      if (rec === undefined) {
        const codePoints = glyphs.slice(i, i + 1 + lig.rest.length).flatMap((g) => g.codePoints);
        rec = { id: lig.glyph, advanceWidth: font.tables.advance(lig.glyph), codePoints };
        font.ligatureRecords.set(lig.glyph, rec);
      }
      glyphs.splice(i, 1 + lig.rest.length, rec);
      break;
    }
  }
}

/** fontkit's full shaping (script and direction found from the text; right-to-left comes back reversed). */
export function fontkitShape(font: ShapingFont, text: string): Shaped {
  const run = font.fontkit().layout(text);
  const glyphs: GlyphRec[] = [];
  const advances: number[] = [];
  let offsets: number[] | null = null;
  let width = 0;
  run.glyphs.forEach((g, i) => {
    const p = run.positions[i];
    // A character's own glyph is labelled as the direct path labels it; a substituted one (a joining form,
    // a ligature) with the characters fontkit shaped it from.
    const own = g.codePoints.length === 1 && font.tables.glyphOf(g.codePoints[0]) === g.id;
    glyphs.push(
      own
        ? record(font, g.id, g.codePoints[0])
        : { id: g.id, advanceWidth: g.advanceWidth, codePoints: [...g.codePoints] },
    );
    const a = p.xAdvance * font.scale;
    advances.push(a);
    width += a;
    if (p.xOffset !== 0 || p.yOffset !== 0) {
      offsets ??= new Array(2 * run.glyphs.length).fill(0);
      offsets[2 * i] = p.xOffset * font.scale;
      offsets[2 * i + 1] = p.yOffset * font.scale;
    }
  });
  return { glyphs, advances, offsets, width };
}

/**
 * What a process keeps of something made per word (a shaped word, pdfkit's run of it), in two generations:
 * the words met since the last turn, and those of the generation before, which are moved up when met
 * again. When the newer one holds `limit` words it becomes the older and the oldest are let go, so at most
 * twice `limit` are kept and the words every brief uses stay. A 12-series brief meets about 6,600 words in
 * its text font, a one-series brief about 1,800 (bench/brief-12.yaml, examples/water-deliveries); in a batch
 * most words (figures, dates) are new with each brief. Kept in maps of up to 50,000 (shaped words, pdfkit's
 * runs, table cells), they grew a batch worker's live heap after a full collection from 11 to 47 MB over 300
 * one-series briefs (`--trace-gc`), towards the worker's heap cap (cli/batch.ts); with this, it levels off
 * near 31 MB.
 */
export class WordCache<V> {
  private now = new Map<string, V>();
  private before = new Map<string, V>();

  constructor(private readonly limit: number) {}

  get(word: string): V | undefined {
    const v = this.now.get(word);
    if (v !== undefined) return v;
    const old = this.before.get(word);
    if (old !== undefined) this.set(word, old);
    return old;
  }

  set(word: string, v: V): void {
    if (this.now.size >= this.limit) {
      this.before = this.now;
      this.now = new Map();
    }
    this.now.set(word, v);
  }

  /** Words kept, both generations. */
  get size(): number {
    return this.now.size + this.before.size;
  }
}

/** Shaped words kept per font: a 12-series brief's words fit in one generation. */
export const WORDS_KEPT = 8192;

export function shapeCached(font: ShapingFont, cache: WordCache<Shaped>, text: string): Shaped {
  let s = cache.get(text);
  if (s === undefined) {
    s = directShape(font, text) ?? fontkitShape(font, text);
    cache.set(text, s);
  }
  return s;
}
