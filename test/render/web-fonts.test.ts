/**
 * The HTML brief carries the PDF's font (src/render/web-fonts.ts): each Source Sans 3 face the stylesheet
 * uses, as a data: URL, cut to the characters of the page. Read back with fontkit (pdfkit's font parser, the
 * same reader test/render/pdf-subset.test.ts uses): every character of the page maps to the glyph the full
 * font has, with its outline; a character the page lacks is not mapped; and the file is a fraction of the
 * full font's size.
 */
import { readFileSync } from 'node:fs';
import PDFDocument from 'pdfkit';
import { describe, expect, it } from 'vitest';
import { type Face, sourceSansFile } from '../../src/chart/fonts.js';
import { renderHtml, renderHtmlPieces } from '../../src/render/html.js';
import { charactersBeyondAscii, withFonts, withFontsPieces } from '../../src/render/web-fonts.js';
import { exampleBriefs } from './files-pdf/examples.js';

interface Font {
  glyphForCodePoint(cp: number): { id: number; path: { commands: unknown[] } };
}

/** A font file parsed by fontkit, through pdfkit. */
function parse(bytes: Buffer): Font {
  const doc = new PDFDocument({ autoFirstPage: false });
  doc.font(bytes);
  return (doc as unknown as { _font: { font: Font } })._font.font;
}

const FACE_OF: Record<string, Face> = {
  '400normal': 'Regular',
  '400italic': 'It',
  '600normal': 'Semibold',
  '700normal': 'Bold',
};

describe('the HTML brief’s fonts', async () => {
  const [brief] = await exampleBriefs('water-deliveries');
  const html = renderHtml(brief);
  const rules = [
    ...html.matchAll(
      /@font-face\{font-family:"Source Sans 3";font-weight:(\d+);font-style:(\w+);src:url\(data:font\/ttf;base64,([A-Za-z0-9+/=]+)\) format\("truetype"\)\}/g,
    ),
  ];
  // The page's characters outside ASCII (ASCII is always kept), from its text and its charts' labels.
  const page = [...new Set([...html].filter((c) => (c.codePointAt(0) as number) >= 0x80))];

  it('embeds the four faces the stylesheet uses, each once', () => {
    expect(rules.map((r) => `${r[1]}${r[2]}`).sort()).toEqual(Object.keys(FACE_OF).sort());
    expect(page.length).toBeGreaterThan(3);
  });

  it.each(Object.entries(FACE_OF))('%s: every character of the page, drawn as the full font draws it', (key, face) => {
    const rule = rules.find((r) => `${r[1]}${r[2]}` === key);
    const bytes = Buffer.from(rule?.[3] ?? '', 'base64');
    const full = readFileSync(sourceSansFile(face));
    expect(bytes.length).toBeLessThan(full.length / 4);
    const subset = parse(bytes);
    const original = parse(full);
    const chars = [...page, 'A', 'z', '0', '%', '&'];
    for (const c of chars) {
      const cp = c.codePointAt(0) as number;
      const want = original.glyphForCodePoint(cp);
      const got = subset.glyphForCodePoint(cp);
      if (want.id === 0) continue;
      expect(got.id, c).toBe(want.id);
      expect(got.path.commands.length, c).toBe(want.path.commands.length);
    }
    // Characters the page does not hold are not in the subset (Cyrillic Zhe, and the Euro sign).
    for (const c of ['Ж', '€'].filter((x) => !page.includes(x))) {
      expect(original.glyphForCodePoint(c.codePointAt(0) as number).id).toBeGreaterThan(0);
      expect(subset.glyphForCodePoint(c.codePointAt(0) as number).id).toBe(0);
    }
  });

  it('is the same file when written as pieces, the fonts’ bytes shared by briefs of the same characters', async () => {
    const pieces = renderHtmlPieces(brief);
    expect(Buffer.concat(pieces).equals(Buffer.from(html, 'utf8'))).toBe(true);
    expect(pieces[1].toString('utf8')).toMatch(/^<style>\n@font-face/);
    expect(renderHtmlPieces(brief)[1]).toBe(pieces[1]);
    const [other] = await exampleBriefs('clinic-visits');
    expect(Buffer.concat(renderHtmlPieces(other)).equals(Buffer.from(renderHtml(other), 'utf8'))).toBe(true);
    // A page without a head gets its fonts first, as the string does.
    const bare = '<p>Zürich – 3 °C</p>';
    expect(withFonts(bare).startsWith('<style>')).toBe(true);
    expect(Buffer.concat(withFontsPieces(bare)).equals(Buffer.from(withFonts(bare), 'utf8'))).toBe(true);
  });

  it('finds the page’s characters beyond ASCII as code points, as iterating the string does', () => {
    const pages = [html, '<p>Zürich – 3 °C, 😀 and 𝐀, a lone \ud800 and \udc00, end\ud83d</p>', 'plain ASCII only', ''];
    for (const p of pages) {
      // String iteration reads a pair of surrogates as one code point and a lone surrogate as itself.
      const expected = new Set([...p].map((c) => c.codePointAt(0) as number).filter((cp) => cp >= 0x80));
      expect([...charactersBeyondAscii(p)].sort((a, b) => a - b)).toEqual([...expected].sort((a, b) => a - b));
    }
    expect(charactersBeyondAscii('é😀')).toEqual(new Set([0xe9, 0x1f600]));
  });
});
