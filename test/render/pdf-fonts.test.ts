/**
 * The PDF's direct shaping path (src/render/pdf/shape.ts, reading the font tables itself in opentype.ts)
 * must give exactly what fontkit's full OpenType shaping gives for Source Sans 3 — the same glyphs (the
 * 'liga' ligatures included) and the same advances (the 'kern' pairs included) — for every pair of ASCII
 * characters, every pair drawn from the rest of its character set, and random words. fontkit, pdfkit's own
 * shaper, is the reference; the table reader is also checked against fontkit's cmap and metrics for every
 * font the PDF embeds.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { BriefDocument } from '../../src/render/pdf/document.js';
import { docFont, fontName, registerFonts, type Slot, sharedFont, svgFont } from '../../src/render/pdf/fonts.js';
import { descriptorFields } from '../../src/render/pdf/opentype.js';
import { DIRECT, directShape } from '../../src/render/pdf/shape.js';

interface Fontkit {
  layout(text: string): {
    glyphs: { id: number; advanceWidth: number }[];
    positions: { xAdvance: number; yAdvance: number; xOffset: number; yOffset: number }[];
  };
  glyphForCodePoint(cp: number): { id: number; advanceWidth: number };
  characterSet: number[];
  unitsPerEm: number;
  ascent: number;
  descent: number;
  lineGap: number;
}

/** What fontkit gives of the tables a font descriptor reads (embed.ts). */
interface DescriptorKit {
  'OS/2'?: { sFamilyClass?: number };
  post: { isFixedPitch?: number };
  head: { macStyle: { italic?: boolean } };
  bbox: { minX: number; minY: number; maxX: number; maxY: number };
  italicAngle: number;
  capHeight?: number;
  xHeight?: number;
  ascent: number;
}

const FACES = ['Regular', 'Semibold', 'It', 'Bold'] as const;
const doc = new BriefDocument({ autoFirstPage: false });
registerFonts(doc);
const fontkitOf = (slot: Slot): Fontkit => docFont(doc, slot).embedded.font as unknown as Fontkit;

/** Every character of DIRECT, from its ranges. */
const DIRECT_CHARS = (() => {
  const out: string[] = [];
  for (let cp = 0x20; cp < 0x2200; cp++) if (DIRECT.test(String.fromCharCode(cp))) out.push(String.fromCharCode(cp));
  return out;
})();
const ASCII = DIRECT_CHARS.filter((c) => c < '\u007f');
const REST = DIRECT_CHARS.filter((c) => c >= '\u007f');

function expectSameAsFontkit(face: (typeof FACES)[number], text: string): void {
  const font = sharedFont(face);
  const direct = directShape(font, text);
  const reference = fontkitOf(face).layout(text);
  expect(direct, text).not.toBeNull();
  expect(
    direct?.glyphs.map((g) => g.id),
    text,
  ).toEqual(reference.glyphs.map((g) => g.id));
  expect(direct?.advances, text).toEqual(reference.positions.map((p) => p.xAdvance * font.scale));
  expect(reference.positions.every((p) => p.xOffset === 0 && p.yOffset === 0 && p.yAdvance === 0)).toBe(true);
}

describe('direct shaping of Source Sans 3', () => {
  it.each(FACES)('matches fontkit for every pair of ASCII characters in %s', (face) => {
    let checked = 0;
    for (const a of ASCII)
      for (const b of ASCII) {
        expectSameAsFontkit(face, a + b);
        checked++;
      }
    expect(checked).toBe(95 * 95);
  });

  it.each(FACES)('matches fontkit for pairs with the rest of the character set in %s', (face) => {
    for (const a of REST)
      for (const b of [...'AaTVfiy.,1 ', ...REST.slice(0, 40)]) expectSameAsFontkit(face, a + b + a);
  });

  it.each(FACES)('matches fontkit for random words in %s', (face) => {
    fc.assert(
      fc.property(fc.array(fc.constantFrom(...DIRECT_CHARS), { minLength: 1, maxLength: 14 }), (chars) =>
        expectSameAsFontkit(face, chars.join('')),
      ),
      { numRuns: 1500, seed: 20_251_202 },
    );
  });

  it('applies kerning and the f-f ligature as the font says (checked values from fontkit)', () => {
    const font = sharedFont('Regular');
    const to = directShape(font, 'To');
    const t = fontkitOf('Regular').glyphForCodePoint(0x54);
    expect(to?.advances[0]).toBeLessThan(t.advanceWidth * font.scale);
    const off = directShape(font, 'off');
    expect(off?.glyphs).toHaveLength(2);
    // The ligature glyph stands for both letters, so "off" is extracted as "off".
    expect(off?.glyphs[1].codePoints).toEqual([0x66, 0x66]);
  });

  it('leaves text with other characters to fontkit', () => {
    expect(directShape(sharedFont('Regular'), 'αβγ')).toBeNull();
    expect(directShape(sharedFont('Regular'), 'e\u0301')).toBeNull();
  });
});

describe('font tables read directly', () => {
  const SLOTS: Slot[] = [...FACES, 'HebrewRegular', 'HebrewBold', 'ArabicRegular', 'ArabicBold', 'Emoji'];
  it.each(SLOTS)('agree with fontkit on the cmap, advances and vertical metrics of %s', (slot) => {
    const kit = fontkitOf(slot);
    const t = sharedFont(slot).tables;
    expect(t.unitsPerEm).toBe(kit.unitsPerEm);
    expect([t.ascender, t.descender, t.lineGap]).toEqual([kit.ascent, kit.descent, kit.lineGap]);
    const set = kit.characterSet;
    expect(set.length).toBeGreaterThan(50);
    for (const cp of set) {
      const g = kit.glyphForCodePoint(cp);
      expect(t.glyphOf(cp), cp.toString(16)).toBe(g.id);
      expect(t.advance(g.id)).toBe(g.advanceWidth);
    }
    expect(t.glyphOf(0x10ffff)).toBe(0);
  });

  // The font descriptor's fields (embed.ts), read from the file against fontkit's decoded tables (pdfkit's
  // source of them before).
  it.each(SLOTS)('agree with fontkit on the font descriptor fields of %s', (slot) => {
    const kit = fontkitOf(slot) as unknown as DescriptorKit;
    const d = descriptorFields(sharedFont(slot).bytes);
    expect(d.familyClass).toBe(kit['OS/2']?.sFamilyClass ?? 0);
    expect(d.fixedPitch).toBe(Boolean(kit.post.isFixedPitch));
    expect(d.italic).toBe(Boolean(kit.head.macStyle.italic));
    expect(d.bbox).toEqual([kit.bbox.minX, kit.bbox.minY, kit.bbox.maxX, kit.bbox.maxY]);
    expect(d.italicAngle).toBe(kit.italicAngle);
    expect(d.capHeight).toBe(kit.capHeight);
    expect(d.xHeight).toBe(kit.xHeight);
    expect(d.ascent).toBe(kit.ascent);
  });

  it('labels a glyph shared by several characters with the lowest of them', () => {
    const t = sharedFont('Regular').tables;
    expect(t.glyphOf(0xa0)).toBe(t.glyphOf(0x20));
    expect(t.lowestCodePoint(t.glyphOf(0xa0))).toBe(0x20);
  });
});

describe('font names', () => {
  it('maps every SVG font request to a registered Source Sans face, never a standard font', () => {
    expect(svgFont('Helvetica', false, false)).toBe(fontName('Regular'));
    expect(svgFont("'Source Sans 3', Arial, sans-serif", true, false)).toBe(fontName('Semibold'));
    expect(svgFont('serif', false, true)).toBe(fontName('It'));
  });
});
