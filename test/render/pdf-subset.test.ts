/**
 * The PDF's font subsets (src/render/pdf/subset.ts) keep every glyph's number: read back by fontkit (pdfkit's
 * font parser, the reference here), a subset has as many glyphs as the font, the kept glyphs have exactly
 * the font's outlines and advances, the others are empty, and a composite glyph brings its components
 * (fontkit's own reading of the composite records says which they are).
 */
import { readFileSync } from 'node:fs';
import PDFDocument from 'pdfkit';
import { describe, expect, it } from 'vitest';
import { sourceSansFile } from '../../src/chart/fonts.js';
import { fallbackFile } from '../../src/render/pdf/fonts.js';
import { glyphClosure, subsetFont } from '../../src/render/pdf/subset.js';

interface Glyph {
  path: { toSVG(): string };
  advanceWidth: number;
  _decode(): { numberOfContours: number; components?: { glyphID: number }[] } | null;
}
interface Font {
  numGlyphs: number;
  glyphForCodePoint(cp: number): { id: number };
  getGlyph(id: number): Glyph;
}

/** A font file parsed by fontkit, through pdfkit. */
function parse(bytes: Buffer): Font {
  const doc = new PDFDocument({ autoFirstPage: false });
  doc.font(bytes);
  return (doc as unknown as { _font: { font: Font } })._font.font;
}

describe('font subsets that keep glyph numbers', () => {
  it.each([
    ['Source Sans 3 Regular', sourceSansFile('Regular'), 'Aé12%fi'],
    ['Noto Sans Arabic', fallbackFile('ArabicRegular'), 'مياه'],
    ['Symbola (emoji subset)', fallbackFile('Emoji'), '💧🌧'],
  ])('%s: kept glyphs as in the font, the rest empty', (_, file, text) => {
    const bytes = readFileSync(file);
    const font = parse(bytes);
    const used = [...text].map((c) => font.glyphForCodePoint(c.codePointAt(0) as number).id);
    const keep = glyphClosure(bytes, used);
    const sub = parse(subsetFont(bytes, keep));
    expect(sub.numGlyphs).toBe(font.numGlyphs);
    for (const g of used) expect(keep).toContain(g);
    expect(keep).toContain(0);
    for (let gid = 0; gid < font.numGlyphs; gid += gid < 64 ? 1 : 37) {
      const original = font.getGlyph(gid);
      const copy = sub.getGlyph(gid);
      expect(copy.advanceWidth).toBe(original.advanceWidth);
      expect(copy.path.toSVG()).toBe(keep.includes(gid) ? original.path.toSVG() : '');
    }
    for (const gid of keep) expect(sub.getGlyph(gid).path.toSVG()).toBe(font.getGlyph(gid).path.toSVG());
  });

  it('brings the components of composite glyphs', () => {
    const bytes = readFileSync(sourceSansFile('Regular'));
    const font = parse(bytes);
    const composites: number[] = [];
    for (const ch of 'éÅñŽ') {
      const id = font.glyphForCodePoint(ch.codePointAt(0) as number).id;
      const decoded = font.getGlyph(id)._decode();
      if (decoded && decoded.numberOfContours < 0) composites.push(id);
    }
    expect(composites.length).toBeGreaterThan(0);
    const keep = glyphClosure(bytes, composites);
    for (const id of composites)
      for (const c of font.getGlyph(id)._decode()?.components ?? []) expect(keep).toContain(c.glyphID);
  });
});
