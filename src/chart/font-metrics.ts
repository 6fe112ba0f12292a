/**
 * Text widths from the Source Sans 3 TrueType files, so the charts lay out labels, legends and truncation
 * for the font the PNG and PDF actually draw (svg.ts hands the same widths to vega for the specs, where
 * without a canvas vega would guess 0.8 em a character, far too wide for Source Sans). Reads the advance widths of the tables cmap (formats 4 and 12), head, hhea and hmtx, as laid
 * down in the OpenType specification (Microsoft, version 1.9). Kerning is ignored, which overstates a width
 * by a few percent at most: labels err towards more room, never less.
 *
 *   advanceWidth(regular, 'Jan', 12) → width in px of "Jan" at 12 px
 */
import { readFileSync } from 'node:fs';
import { sourceSansFile } from './fonts.js';

export interface FontMetrics {
  unitsPerEm: number;
  /** Advance width in font units by code point. */
  advance: Map<number, number>;
  /** Used for characters the font lacks (emoji): a full em keeps room for the fallback glyph. */
  missing: number;
}

export function readFontMetrics(bytes: Uint8Array): FontMetrics {
  const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  const tables = new Map<string, number>();
  const numTables = view.getUint16(4);
  for (let i = 0; i < numTables; i++) {
    const at = 12 + 16 * i;
    const tag = String.fromCharCode(bytes[at], bytes[at + 1], bytes[at + 2], bytes[at + 3]);
    tables.set(tag, view.getUint32(at + 8));
  }
  const table = (tag: string) => {
    const at = tables.get(tag);
    if (at === undefined) throw new Error(`font has no ${tag} table`);
    return at;
  };
  const unitsPerEm = view.getUint16(table('head') + 18);
  const numberOfHMetrics = view.getUint16(table('hhea') + 34);
  const hmtx = table('hmtx');
  const glyphAdvance = (glyph: number) => view.getUint16(hmtx + 4 * Math.min(glyph, numberOfHMetrics - 1));

  const advance = new Map<number, number>();
  for (const [cp, glyph] of readCmap(view, table('cmap'))) {
    if (glyph !== 0) advance.set(cp, glyphAdvance(glyph));
  }
  return { unitsPerEm, advance, missing: unitsPerEm };
}

/** Code point → glyph index from the best Unicode subtable: format 12 (full range) or else format 4 (BMP). */
function readCmap(view: DataView, cmap: number): Map<number, number> {
  const count = view.getUint16(cmap + 2);
  let format4 = -1;
  let format12 = -1;
  for (let i = 0; i < count; i++) {
    const platform = view.getUint16(cmap + 4 + 8 * i);
    const encoding = view.getUint16(cmap + 6 + 8 * i);
    const at = cmap + view.getUint32(cmap + 8 + 8 * i);
    const unicode = platform === 0 || (platform === 3 && (encoding === 1 || encoding === 10));
    if (!unicode) continue;
    const format = view.getUint16(at);
    if (format === 12) format12 = at;
    if (format === 4) format4 = at;
  }
  const map = new Map<number, number>();
  if (format12 >= 0) {
    const groups = view.getUint32(format12 + 12);
    for (let g = 0; g < groups; g++) {
      const at = format12 + 16 + 12 * g;
      const start = view.getUint32(at);
      const end = view.getUint32(at + 4);
      const glyph = view.getUint32(at + 8);
      for (let cp = start; cp <= end; cp++) map.set(cp, glyph + cp - start);
    }
    return map;
  }
  if (format4 < 0) throw new Error('font has no Unicode cmap subtable');
  const segments = view.getUint16(format4 + 6) / 2;
  const ends = format4 + 14;
  const starts = ends + 2 * segments + 2;
  const deltas = starts + 2 * segments;
  const offsets = deltas + 2 * segments;
  for (let s = 0; s < segments; s++) {
    const end = view.getUint16(ends + 2 * s);
    const start = view.getUint16(starts + 2 * s);
    const delta = view.getInt16(deltas + 2 * s);
    const offsetAt = offsets + 2 * s;
    const rangeOffset = view.getUint16(offsetAt);
    for (let cp = start; cp <= end && cp !== 0xffff; cp++) {
      let glyph: number;
      if (rangeOffset === 0) glyph = (cp + delta) & 0xffff;
      else {
        const raw = view.getUint16(offsetAt + rangeOffset + 2 * (cp - start));
        glyph = raw === 0 ? 0 : (raw + delta) & 0xffff;
      }
      map.set(cp, glyph);
    }
  }
  return map;
}

/** Width in px of a text at a font size, summing advances. */
export function advanceWidth(metrics: FontMetrics, text: string, fontSize: number): number {
  let units = 0;
  for (const ch of text) units += metrics.advance.get(ch.codePointAt(0) ?? 0) ?? metrics.missing;
  return (units / metrics.unitsPerEm) * fontSize;
}

let regularMetrics: FontMetrics | undefined;
let boldMetrics: FontMetrics | undefined;

/** Source Sans 3 Regular's metrics, read once per process. */
export function regularFontMetrics(): FontMetrics {
  regularMetrics ??= readFontMetrics(readFileSync(sourceSansFile('Regular')));
  return regularMetrics;
}

/** Source Sans 3 Bold's metrics, read once per process. */
export function boldFontMetrics(): FontMetrics {
  boldMetrics ??= readFontMetrics(readFileSync(sourceSansFile('Bold')));
  return boldMetrics;
}

/** Width in px of a text set in Source Sans 3 (Regular, or Bold when `bold`). */
export function textWidth(text: string, fontSize: number, bold = false): number {
  return advanceWidth(bold ? boldFontMetrics() : regularFontMetrics(), text, fontSize);
}

const ELLIPSIS = '\u2026';

/**
 * The text cut to fit `limit` px, ending in "…" when cut (whole characters, so a surrogate pair is never
 * split); the text itself when it fits.
 */
export function fitText(text: string, fontSize: number, limit: number, bold = false): string {
  if (textWidth(text, fontSize, bold) <= limit) return text;
  const chars = Array.from(text);
  const room = limit - textWidth(ELLIPSIS, fontSize, bold);
  const metrics = bold ? boldFontMetrics() : regularFontMetrics();
  let width = 0;
  let n = 0;
  for (; n < chars.length; n++) {
    const w = advanceWidth(metrics, chars[n], fontSize);
    if (width + w > room) break;
    width += w;
  }
  return `${chars.slice(0, n).join('').trimEnd()}${ELLIPSIS}`;
}
