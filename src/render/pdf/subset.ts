/**
 * A TrueType subset that keeps every glyph's number: the glyphs a document drew (with the components of
 * composite glyphs, and .notdef) keep their outlines, every other glyph is left empty. Because the numbers do
 * not change, the PDF can use them as character codes directly (CIDToGIDMap Identity), so a word's codes are
 * the same in every document and are worked out once per process; and the subset is a matter of copying
 * bytes. The tables kept are those a PDF reader needs for an embedded TrueType CIDFont (ISO 32000-1 §9.9,
 * as pdfkit's own subsets): head, hhea, maxp, hmtx, loca, glyf, cvt, fpgm and prep.
 * Source: the OpenType specification 1.9 (Microsoft, 2022), "Organization of an OpenType font" (table
 * directory and checksums) and the glyf, loca, head and maxp chapters (composite glyph records).
 *
 * Example: a subset of Source Sans 3 for the glyphs of "12" still has its 2,478 glyph slots; only three of
 * them (.notdef, one, two) have outlines.
 */

const KEEP = ['cvt ', 'fpgm', 'glyf', 'head', 'hhea', 'hmtx', 'loca', 'maxp', 'prep'];

/**
 * The tables a browser also needs to take a font file (its character map, names, OS/2 metrics and post
 * table); glyph substitutions and positioning are left out, so no ligature can stand for glyphs that were
 * not kept.
 */
export const WEB_TABLES = [...KEEP, 'cmap', 'name', 'OS/2', 'post'];

interface Tables {
  view: DataView;
  bytes: Uint8Array;
  dir: Map<string, { offset: number; length: number }>;
}

function readDirectory(bytes: Uint8Array): Tables {
  const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  const dir = new Map<string, { offset: number; length: number }>();
  for (let i = 0; i < view.getUint16(4); i++) {
    const rec = 12 + 16 * i;
    const tag = String.fromCharCode(bytes[rec], bytes[rec + 1], bytes[rec + 2], bytes[rec + 3]);
    dir.set(tag, { offset: view.getUint32(rec + 8), length: view.getUint32(rec + 12) });
  }
  return { view, bytes, dir };
}

/** Glyph byte ranges [start, end) inside the glyf table, by glyph id. */
function glyphRange(t: Tables, gid: number): [number, number] {
  const head = t.dir.get('head');
  const loca = t.dir.get('loca');
  if (!head || !loca) throw new Error('font has no head or loca table');
  const long = t.view.getInt16(head.offset + 50) === 1;
  if (long) return [t.view.getUint32(loca.offset + 4 * gid), t.view.getUint32(loca.offset + 4 * gid + 4)];
  return [2 * t.view.getUint16(loca.offset + 2 * gid), 2 * t.view.getUint16(loca.offset + 2 * gid + 2)];
}

const ARG_WORDS = 0x0001;
const HAS_SCALE = 0x0008;
const MORE = 0x0020;
const XY_SCALE = 0x0040;
const TWO_BY_TWO = 0x0080;

/** The glyphs to keep: those asked for, .notdef, and every component of a composite glyph among them. */
export function glyphClosure(bytes: Uint8Array, used: Iterable<number>): number[] {
  const t = readDirectory(bytes);
  const glyf = t.dir.get('glyf');
  if (!glyf) throw new Error('font has no glyf table');
  const keep = new Set<number>([0]);
  const queue = [...used];
  while (queue.length > 0) {
    const gid = queue.pop() as number;
    if (keep.has(gid) && gid !== 0) continue;
    keep.add(gid);
    const [start, end] = glyphRange(t, gid);
    if (end <= start) continue;
    let p = glyf.offset + start;
    if (t.view.getInt16(p) >= 0) continue;
    p += 10;
    for (;;) {
      const flags = t.view.getUint16(p);
      const component = t.view.getUint16(p + 2);
      if (!keep.has(component)) queue.push(component);
      p += 4 + (flags & ARG_WORDS ? 4 : 2);
      if (flags & HAS_SCALE) p += 2;
      else if (flags & XY_SCALE) p += 4;
      else if (flags & TWO_BY_TWO) p += 8;
      if (!(flags & MORE)) break;
    }
  }
  return [...keep].sort((a, b) => a - b);
}

function checksum(b: Uint8Array): number {
  const padded = b.length % 4 === 0 ? b : Buffer.concat([b, Buffer.alloc(4 - (b.length % 4))]);
  const v = new DataView(padded.buffer, padded.byteOffset, padded.byteLength);
  let sum = 0;
  for (let i = 0; i < padded.length; i += 4) sum = (sum + v.getUint32(i)) >>> 0;
  return sum;
}

/**
 * The subset font file for the glyphs kept (glyphClosure's result), with the tables named; a table in
 * `replace` is written as given instead of the font's own.
 */
export function subsetFont(
  bytes: Uint8Array,
  keep: number[],
  tables: readonly string[] = KEEP,
  replace: Record<string, Uint8Array> = {},
): Buffer {
  const t = readDirectory(bytes);
  const table = (tag: string): Uint8Array | null => {
    const d = t.dir.get(tag);
    return d ? bytes.subarray(d.offset, d.offset + d.length) : null;
  };
  const glyfIn = t.dir.get('glyf');
  const maxp = table('maxp');
  if (!glyfIn || !maxp) throw new Error('font has no glyf or maxp table');
  const numGlyphs = new DataView(maxp.buffer, maxp.byteOffset).getUint16(4);
  const kept = new Set(keep);
  const pieces: Uint8Array[] = [];
  const loca = Buffer.alloc(4 * (numGlyphs + 1));
  let offset = 0;
  for (let gid = 0; gid < numGlyphs; gid++) {
    loca.writeUInt32BE(offset, 4 * gid);
    if (!kept.has(gid)) continue;
    const [start, end] = glyphRange(t, gid);
    if (end <= start) continue;
    const g = bytes.subarray(glyfIn.offset + start, glyfIn.offset + end);
    pieces.push(g);
    offset += g.length;
    const pad = (4 - (g.length % 4)) % 4;
    if (pad) {
      pieces.push(Buffer.alloc(pad));
      offset += pad;
    }
  }
  loca.writeUInt32BE(offset, 4 * numGlyphs);
  const head = Buffer.from(table('head') as Uint8Array);
  head.writeInt16BE(1, 50);
  head.writeUInt32BE(0, 8);
  const out = new Map<string, Uint8Array>();
  for (const tag of tables) {
    if (tag === 'glyf') out.set(tag, Buffer.concat(pieces));
    else if (tag === 'loca') out.set(tag, loca);
    else if (tag === 'head') out.set(tag, head);
    else if (replace[tag] !== undefined) out.set(tag, replace[tag]);
    else {
      const b = table(tag);
      if (b) out.set(tag, b);
    }
  }
  const tags = [...out.keys()].sort();
  const n = tags.length;
  let entrySelector = 0;
  while (2 ** (entrySelector + 1) <= n) entrySelector++;
  const searchRange = 16 * 2 ** entrySelector;
  const header = Buffer.alloc(12 + 16 * n);
  header.writeUInt32BE(0x00010000, 0);
  header.writeUInt16BE(n, 4);
  header.writeUInt16BE(searchRange, 6);
  header.writeUInt16BE(entrySelector, 8);
  header.writeUInt16BE(16 * n - searchRange, 10);
  const body: Uint8Array[] = [];
  let at = header.length;
  tags.forEach((tag, i) => {
    const data = out.get(tag) as Uint8Array;
    const rec = 12 + 16 * i;
    header.write(tag, rec, 'latin1');
    header.writeUInt32BE(checksum(data), rec + 4);
    header.writeUInt32BE(at, rec + 8);
    header.writeUInt32BE(data.length, rec + 12);
    body.push(data);
    const pad = (4 - (data.length % 4)) % 4;
    if (pad) body.push(Buffer.alloc(pad));
    at += data.length + pad;
  });
  const file = Buffer.concat([header, ...body]);
  // head.checkSumAdjustment makes the whole file sum to 0xB1B0AFBA.
  const headAt = header.readUInt32BE(12 + 16 * tags.indexOf('head') + 8);
  file.writeUInt32BE((0xb1b0afba - checksum(file)) >>> 0, headAt + 8);
  return file;
}
