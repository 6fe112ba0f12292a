/**
 * The PDF's direct glyph path for plain text (digits, separators, signs) must give exactly what fontkit's
 * full OpenType shaping gives for Source Sans 3: the same glyphs and the same advances, for every string of
 * up to three such characters. fontkit, pdfkit's own shaper, is the reference.
 */
import PDFDocument from 'pdfkit';
import { describe, expect, it } from 'vitest';
import { fontName, PLAIN_TEXT, plainRun, registerFonts, svgFont } from '../../src/render/pdf/fonts.js';

interface Shaped {
  glyphs: { id: number; advanceWidth: number }[];
  positions: { xAdvance: number; yAdvance: number; xOffset: number; yOffset: number }[];
}
interface FontkitFont {
  layout(text: string): Shaped;
  glyphForCodePoint(cp: number): { id: number; advanceWidth: number; codePoints: number[] };
}

function fontkitFont(
  doc: PDFKit.PDFDocument,
  face: 'Regular' | 'Semibold' | 'It' | 'Bold',
): { font: FontkitFont; scale: number } {
  doc.font(fontName(face));
  const embedded = (doc as unknown as { _font: { font: FontkitFont; scale: number } })._font;
  return { font: embedded.font, scale: embedded.scale };
}

const PLAIN = '0123456789,.\u2212+%()\u2013/: -';

describe('plain text glyphs', () => {
  const doc = new PDFDocument({ autoFirstPage: false });
  registerFonts(doc);

  it.each(['Regular', 'Semibold', 'It', 'Bold'] as const)('match fontkit shaping in Source Sans 3 %s', (face) => {
    const { font, scale } = fontkitFont(doc, face);
    let checked = 0;
    for (const a of PLAIN)
      for (const b of PLAIN)
        for (const c of ['', ...PLAIN]) {
          const text = a + b + c;
          expect(PLAIN_TEXT.test(text)).toBe(true);
          const shaped = font.layout(text);
          const run = plainRun(font, scale, text);
          expect(
            run.glyphs.map((g) => g.id),
            text,
          ).toEqual(shaped.glyphs.map((g) => g.id));
          expect(run.positions.map((p) => p.xAdvance)).toEqual(shaped.positions.map((p) => p.xAdvance * scale));
          expect(shaped.positions.every((p) => p.xOffset === 0 && p.yOffset === 0 && p.yAdvance === 0)).toBe(true);
          checked++;
        }
    // 22 characters: 22² pairs and 22³ triples.
    expect(checked).toBe(22 ** 2 + 22 ** 3);
  });

  it('leaves out the asterisk, which the font kerns against a full stop', () => {
    const { font } = fontkitFont(doc, 'Regular');
    const shaped = font.layout('1.*').positions.map((p) => p.xAdvance);
    const plain = [...'1.*'].map((ch) => font.glyphForCodePoint(ch.codePointAt(0) as number).advanceWidth);
    expect(shaped).not.toEqual(plain);
    expect(PLAIN_TEXT.test('1.*')).toBe(false);
  });

  it('keeps letters on the shaping path (kerning applies to them)', () => {
    expect(PLAIN_TEXT.test('Jan 2015')).toBe(false);
    expect(PLAIN_TEXT.test('−1,234.5%')).toBe(true);
  });

  it('maps every SVG font request to a registered Source Sans face, never a standard font', () => {
    expect(svgFont('Helvetica', false, false)).toBe(fontName('Regular'));
    expect(svgFont("'Source Sans 3', Arial, sans-serif", true, false)).toBe(fontName('Semibold'));
    expect(svgFont('serif', false, true)).toBe(fontName('It'));
  });
});
