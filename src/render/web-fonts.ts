/**
 * The HTML brief in the PDF's type: each Source Sans 3 face the stylesheet uses, cut to the characters the
 * page holds (with the PDF's subsetter, src/render/pdf/subset.ts, keeping a browser's tables too) and
 * embedded as a data: URL @font-face, so the self-contained file looks the same wherever it is opened.
 * Characters: every printable ASCII character (markup and escapes are ASCII, so this is the simple superset)
 * and every other code point in the file.
 */
import { readFileSync } from 'node:fs';
import { type Face, sourceSansFile } from '../chart/fonts.js';
import { readFontTables } from './pdf/opentype.js';
import { glyphClosure, subsetFont, WEB_TABLES } from './pdf/subset.js';

/** The faces the stylesheet asks for, as CSS weight and style. */
const FACES: [Face, number, 'normal' | 'italic'][] = [
  ['Regular', 400, 'normal'],
  ['It', 400, 'italic'],
  ['Semibold', 600, 'normal'],
  ['Bold', 700, 'normal'],
];

const files = new Map<Face, { bytes: Buffer; glyphOf: (cp: number) => number }>();

function face(f: Face): { bytes: Buffer; glyphOf: (cp: number) => number } {
  let got = files.get(f);
  if (got === undefined) {
    const bytes = readFileSync(sourceSansFile(f));
    got = { bytes, glyphOf: readFontTables(bytes).glyphOf };
    files.set(f, got);
  }
  return got;
}

/** The <style> by character set, in UTF-8: a batch of similar briefs subsets each face once. */
const cache = new Map<string, Buffer>();

/** The <style> of @font-face rules for the code points given, in UTF-8. */
function styleFor(codePoints: Iterable<number>): Buffer {
  const wanted = new Set<number>(codePoints);
  for (let cp = 0x20; cp < 0x7f; cp++) wanted.add(cp);
  const key = String.fromCodePoint(...[...wanted].sort((a, b) => a - b));
  let style = cache.get(key);
  if (style === undefined) {
    style = Buffer.from(`<style>\n${faceRules(wanted)}\n</style>\n`, 'utf8');
    if (cache.size >= 64) cache.clear();
    cache.set(key, style);
  }
  return style;
}

function faceRules(wanted: Set<number>): string {
  return FACES.map(([f, weight, style]) => {
    const { bytes, glyphOf } = face(f);
    const gids = new Set<number>();
    for (const cp of wanted) {
      const g = glyphOf(cp);
      if (g !== 0) gids.add(g);
    }
    const map = [...wanted].map((cp): [number, number] => [cp, glyphOf(cp)]).filter(([, g]) => g !== 0);
    const keep = glyphClosure(
      bytes,
      [...gids].sort((a, b) => a - b),
    );
    const font = subsetFont(bytes, keep, WEB_TABLES, { cmap: cmapOf(map), post: postOf(bytes) });
    return `@font-face{font-family:"Source Sans 3";font-weight:${weight};font-style:${style};src:url(data:font/ttf;base64,${font.toString('base64')}) format("truetype")}`;
  }).join('\n');
}

/** The page with its fonts: a <style> of @font-face rules before </head>. */
export function withFonts(html: string): string {
  const { head, style } = placeFonts(html);
  return html.slice(0, head) + style.toString('utf8') + html.slice(head);
}

/**
 * The same page as UTF-8 pieces, the <style> the cached bytes: a brief's fonts are most of its HTML (about
 * 250 of 360 kB), and a batch of briefs with the same characters neither copies nor encodes them again.
 */
export function withFontsPieces(html: string): Buffer[] {
  const { head, style } = placeFonts(html);
  return [Buffer.from(html.slice(0, head), 'utf8'), style, Buffer.from(html.slice(head), 'utf8')];
}

/** The style for the page's characters, and where it goes: before </head>, else first. */
function placeFonts(html: string): { head: number; style: Buffer } {
  return { head: Math.max(0, html.search(/<\/head>/i)), style: styleFor(charactersBeyondAscii(html)) };
}

/**
 * The page's characters beyond ASCII, as code points (a pair of surrogates is one; a lone surrogate is
 * itself), found by the regular-expression engine: a page is some 100,000 characters, few of them beyond
 * ASCII, and a loop over every one took 4 ms in a fresh process and about 1 ms in a batch, the search
 * 0.3 ms. Without the u flag: with it, the engine is slower than the loop.
 */
export function charactersBeyondAscii(html: string): Set<number> {
  const cps = new Set<number>();
  BEYOND_ASCII.lastIndex = 0;
  for (let m = BEYOND_ASCII.exec(html); m !== null; m = BEYOND_ASCII.exec(html)) {
    const cp = html.codePointAt(m.index) as number;
    cps.add(cp);
    if (cp > 0xffff) BEYOND_ASCII.lastIndex = m.index + 2;
  }
  return cps;
}

/** A UTF-16 code unit beyond ASCII (a surrogate included). */
const BEYOND_ASCII = /[\u0080-\uffff]/g;

/**
 * A character map of only the characters kept: one format 12 subtable (Windows, Unicode full repertoire),
 * a group per run of consecutive code points with consecutive glyphs. The OpenType specification 1.9, cmap.
 */
function cmapOf(map: [number, number][]): Buffer {
  map.sort((a, b) => a[0] - b[0]);
  const groups: [number, number, number][] = [];
  for (const [cp, g] of map) {
    const last = groups[groups.length - 1];
    if (last && cp === last[1] + 1 && g === last[2] + (cp - last[0])) last[1] = cp;
    else groups.push([cp, cp, g]);
  }
  const sub = Buffer.alloc(16 + 12 * groups.length);
  sub.writeUInt16BE(12, 0);
  sub.writeUInt32BE(sub.length, 4);
  sub.writeUInt32BE(groups.length, 12);
  groups.forEach(([start, end, g], i) => {
    sub.writeUInt32BE(start, 16 + 12 * i);
    sub.writeUInt32BE(end, 20 + 12 * i);
    sub.writeUInt32BE(g, 24 + 12 * i);
  });
  const head = Buffer.alloc(12);
  head.writeUInt16BE(1, 2);
  head.writeUInt16BE(3, 4);
  head.writeUInt16BE(10, 6);
  head.writeUInt32BE(12, 8);
  return Buffer.concat([head, sub]);
}

/** The font's post table as version 3 (no glyph names: the kept part is its fixed 32-byte header). */
function postOf(bytes: Buffer): Buffer {
  const n = bytes.readUInt16BE(4);
  for (let i = 0; i < n; i++) {
    const rec = 12 + 16 * i;
    if (bytes.toString('latin1', rec, rec + 4) !== 'post') continue;
    const post = Buffer.from(bytes.subarray(bytes.readUInt32BE(rec + 8), bytes.readUInt32BE(rec + 8) + 32));
    post.writeUInt32BE(0x00030000, 0);
    return post;
  }
  throw new Error('font has no post table');
}
