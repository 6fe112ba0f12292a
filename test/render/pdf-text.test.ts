/**
 * The PDF's own text setting (src/render/pdf/text.ts): right-to-left runs put in visual order as the Unicode
 * Bidirectional Algorithm says (bidi-js's own reordering, getReorderedString, is the reference: UAX #9 rules
 * L1–L4), Arabic letters in their joining forms (the Unicode Standard's ArabicShaping.txt: meem, yeh and heh
 * join on both sides, alef only to the right), fallback fonts for what Source Sans 3 lacks, a code in
 * brackets for what no font has, and lines that keep to their width. The PDFs are read back by poppler.
 */
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import bidiModule from 'bidi-js';
import { afterAll, describe, expect, it } from 'vitest';
import { BriefDocument } from '../../src/render/pdf/document.js';
import { docFont, registerFonts } from '../../src/render/pdf/fonts.js';
import { drawText, measureText, type TextBlock } from '../../src/render/pdf/text.js';
import type { TextStyle } from '../../src/render/pdf/theme.js';
import { normalise, pdfFonts, pdfText } from './files-pdf/poppler.js';

type Factory = () => import('bidi-js').Bidi;
const m = bidiModule as unknown as { default?: Factory };
const bidi = (typeof m.default === 'function' ? m.default : (bidiModule as unknown as Factory))();
const STYLE: TextStyle = { face: 'Regular', size: 10, colour: '#1f2328', lineGap: 0 };
const dir = mkdtempSync(join(tmpdir(), 'tb-pdf-text-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

function newDoc(): PDFKit.PDFDocument {
  const doc = new BriefDocument({ size: 'A4', autoFirstPage: false, compress: false });
  registerFonts(doc);
  doc.addPage();
  return doc;
}

/** The characters of a line in the order they are drawn, left to right. */
function visual(b: TextBlock, line = 0): string {
  return b.lines[line].segs
    .flatMap((s) => s.shaped.glyphs.map((g) => String.fromCodePoint(...g.codePoints)))
    .join('')
    .trimEnd();
}

async function pdfOf(doc: PDFKit.PDFDocument): Promise<string> {
  const chunks: Buffer[] = [];
  doc.on('data', (c: Buffer) => chunks.push(c));
  const done = new Promise<void>((resolve) => doc.on('end', () => resolve()));
  doc.end();
  await done;
  const file = join(dir, `t${Math.random().toString(36).slice(2)}.pdf`);
  writeFileSync(file, Buffer.concat(chunks));
  return file;
}

describe('bidirectional text', () => {
  const CASES = [
    'winter שלום cold',
    'abc (שלום) def',
    'Label מים 💧 — Zone',
    'Zone <i>א</i>',
    'مياه 123 x',
    'שלום עולם',
    'a אבג ד, e',
    'total (מים, 12.5%) now',
  ];
  it.each(CASES)('draws "%s" in the visual order UAX #9 gives', (text) => {
    const doc = newDoc();
    const b = measureText(doc, text, STYLE);
    expect(b.lines).toHaveLength(1);
    const levels = bidi.getEmbeddingLevels(text, 'ltr');
    expect(visual(b)).toBe(bidi.getReorderedString(text, levels).trimEnd());
  });

  it('keeps plain left-to-right text in one run per word', () => {
    const b = measureText(newDoc(), 'Letters handled, thousand letters', STYLE);
    expect(b.lines[0].segs).toHaveLength(4);
    expect(b.lines[0].segs.every((s) => s.level === 0 && s.font.slot === 'Regular')).toBe(true);
  });

  it('reorders each line on its own when a paragraph wraps', () => {
    const doc = newDoc();
    const text = 'one two שלום עולם three four';
    const b = measureText(doc, text, STYLE, 60);
    expect(b.lines.length).toBeGreaterThan(1);
    // Every character is drawn once, whatever the lines.
    const drawn = b.lines.map((_, i) => visual(b, i)).join(' ');
    expect([...drawn.replace(/ /g, '')].sort().join('')).toBe([...text.replace(/ /g, '')].sort().join(''));
  });
});

describe('fonts for other scripts', () => {
  it('sets Arabic in its joining forms and Hebrew in the Hebrew font', () => {
    const doc = newDoc();
    const b = measureText(doc, 'مياه שלום', STYLE);
    const arabic = b.lines[0].segs.find((s) => s.font.slot === 'ArabicRegular');
    const hebrew = b.lines[0].segs.find((s) => s.font.slot === 'HebrewRegular');
    expect(hebrew).toBeDefined();
    const font = docFont(doc, 'ArabicRegular').embedded.font as unknown as { getGlyph(id: number): { name: string } };
    // Visual order, right to left read as left to right: heh isolated (after alef, which joins only to the
    // right), alef final, yeh medial, meem initial (Unicode presentation forms FE8E, FEF4, FEE3).
    expect(arabic?.shaped.glyphs.map((g) => font.getGlyph(g.id).name)).toEqual([
      'uni0647',
      'uniFE8E',
      'uniFEF4',
      'uniFEE3',
    ]);
    // Each form is extracted as the letter it stands for.
    expect(arabic?.shaped.glyphs.map((g) => g.codePoints)).toEqual([[0x647], [0x627], [0x64a], [0x645]]);
  });

  it('uses the bold fallbacks for bold text', () => {
    const b = measureText(newDoc(), 'מים مياه', { ...STYLE, face: 'Semibold' });
    const slots = b.lines[0].segs.map((s) => s.font.slot);
    expect(slots).toContain('HebrewBold');
    expect(slots).toContain('ArabicBold');
  });

  it('writes Hebrew, Arabic and emoji so pdftotext reads them back, and a code for what no font has', async () => {
    const doc = newDoc();
    const text = 'Water מים and مياه 💧 then \u{1FAE8} end';
    const b = measureText(doc, text, STYLE, 400);
    drawText(doc, b, 72, 72);
    const file = await pdfOf(doc);
    const read = normalise(pdfText(file).replace(/[\u200e\u200f\u202a-\u202e]/g, ''));
    for (const word of ['Water', 'מים', 'مياه', '💧', '[U+1FAE8]', 'end']) expect(read).toContain(word);
    const names = pdfFonts(file).map((f) => f.name.split('+')[1]);
    expect(names).toEqual(
      expect.arrayContaining(['SourceSans3-Regular', 'NotoSansHebrew-Regular', 'NotoSansArabic-Regular', 'Symbola']),
    );
    // Faces no text used are not written.
    expect(names).not.toContain('SourceSans3-Bold');
  });

  it('sets a text of 200,000 words (a megabyte) without overflowing the call stack', () => {
    // Once "Maximum call stack size exceeded": the words were spread as arguments of one push.
    const text = 'abcd efg '.repeat(100_000).trim();
    const b = measureText(newDoc(), text, STYLE, 400);
    const words = b.lines.reduce((n, l) => n + l.segs.length, 0);
    expect(b.lines.length).toBeGreaterThan(1000);
    expect(words).toBeGreaterThanOrEqual(200_000);
  });

  it('sets a tab as a space and leaves other control characters out', () => {
    const b = measureText(newDoc(), 'a\tb\u0007c\r', STYLE);
    expect(visual(b)).toBe('a bc');
  });

  it('drops default-ignorable characters the font lacks instead of drawing a missing glyph', () => {
    const b = measureText(newDoc(), 'a\u200bb\ufe0f', STYLE);
    expect(b.lines[0].segs.flatMap((s) => s.shaped.glyphs.map((g) => g.id)).includes(0)).toBe(false);
  });
});

describe('line breaking', () => {
  it('fills lines greedily within the width and breaks after hyphens when a word does not fit', () => {
    const doc = newDoc();
    const text = 'The first estimate of the year-on-year change later moved by 0.1 points on average.';
    for (const width of [60, 90, 140, 230]) {
      const b = measureText(doc, text, STYLE, width);
      for (const l of b.lines) expect((l.width * STYLE.size) / 1000).toBeLessThanOrEqual(width + 1e-6);
      const joined = b.lines.map((_, i) => visual(b, i)).join(' ');
      expect(joined.replace(/- /g, '-').replace(/ +/g, ' ')).toBe(text);
    }
  });

  it('breaks a word wider than the line between characters, losing none', () => {
    const b = measureText(newDoc(), 'a9f2c61e0b7d4a8c3e5f1b2d', STYLE, 40);
    expect(b.lines.length).toBeGreaterThan(1);
    expect(b.lines.map((_, i) => visual(b, i)).join('')).toBe('a9f2c61e0b7d4a8c3e5f1b2d');
  });

  it('keeps no-break spaces and hyphens together and ends a line at a line feed', () => {
    const doc = newDoc();
    expect(measureText(doc, 'North\u2011East\u00a0Water\nsecond', STYLE, 1000).lines).toHaveLength(2);
    const text = 'aa North\u2011East\u00a0Water';
    const b = measureText(doc, text, STYLE, measureText(doc, text, STYLE).width - 1);
    // The only break allowed is the plain space (the glyphs are labelled with the plain hyphen and space).
    expect(b.lines.map((_, i) => visual(b, i))).toEqual(['aa', 'North-East Water']);
  });
});
