/**
 * The few OpenType tables the PDF's direct text path needs, read straight from the font file: the character
 * map (cmap formats 4 and 12), the advance widths (hhea, hmtx), the vertical metrics (hhea), the pair
 * kerning of the 'kern' feature (GPOS lookup type 2, formats 1 and 2, also wrapped in extension lookups of
 * type 9) and the standard ligatures of the 'liga' feature (GSUB lookup type 4, also inside type 7), both
 * from the Latin script's default language system (else the default script's).
 * Source: the OpenType specification 1.9 (Microsoft, 2022), chapters "cmap", "hhea", "hmtx", "GPOS", "GSUB"
 * and "OpenType Layout Common Table Formats" (coverage and class definition tables).
 *
 * Pairs are resolved as fontkit (pdfkit's shaper) resolves them: within a lookup the first subtable that
 * covers the pair decides; a format-2 subtable decides as soon as it covers the first glyph, its class pair
 * value possibly zero. test/render/pdf-text.test.ts checks the result against fontkit.
 * Reading the tables takes a fraction of a millisecond; fontkit's general decoder takes tens of
 * milliseconds for the same lookups, and its shaping engine much longer per word.
 *
 * Example: in Source Sans 3 Regular, kern(glyphOf('T'), glyphOf('o')) is −19 (units of 1/1000 em).
 */

export interface Ligature {
  /** The glyphs that must follow the first one. */
  rest: number[];
  glyph: number;
}

export interface FontTables {
  unitsPerEm: number;
  ascender: number;
  descender: number;
  lineGap: number;
  /** The glyph for a code point, 0 (.notdef) when the font has none. */
  glyphOf(cp: number): number;
  /** Advance width in font units. */
  advance(gid: number): number;
  /** The lowest code point the cmap maps to this glyph (several may share one glyph). */
  lowestCodePoint(gid: number): number | undefined;
  /** x-advance adjustment of `left` when `right` follows, in font units. */
  kern(left: number, right: number): number;
  /** Ligatures starting with this glyph, in the font's order of preference. */
  ligatures(first: number): Ligature[] | undefined;
  /** False when the kern or liga lookups hold anything this reader does not apply exactly (then the
   * direct path must not be used for this font). */
  simple: boolean;
}

interface Cmap {
  format: 4 | 12;
  offset: number;
}

export function readFontTables(buffer: Uint8Array): FontTables {
  const view = new DataView(buffer.buffer, buffer.byteOffset, buffer.byteLength);
  const u16 = (o: number) => view.getUint16(o);
  const i16 = (o: number) => view.getInt16(o);
  const u32 = (o: number) => view.getUint32(o);
  const tables = tableDirectory(buffer, view);
  const need = (tag: string): number => {
    const o = tables.get(tag);
    if (o === undefined) throw new Error(`font has no ${tag} table`);
    return o;
  };
  const head = need('head');
  const hhea = need('hhea');
  const hmtx = need('hmtx');
  const numberOfHMetrics = u16(hhea + 34);
  const cmap = findCmap(view, need('cmap'));

  const glyphOf = (cp: number): number => {
    if (cmap === null) return 0;
    const o = cmap.offset;
    if (cmap.format === 12) {
      let lo = 0;
      let hi = u32(o + 12) - 1;
      while (lo <= hi) {
        const mid = (lo + hi) >> 1;
        const g = o + 16 + 12 * mid;
        if (cp < u32(g)) hi = mid - 1;
        else if (cp > u32(g + 4)) lo = mid + 1;
        else return u32(g + 8) + cp - u32(g);
      }
      return 0;
    }
    if (cp > 0xffff) return 0;
    const segX2 = u16(o + 6);
    const ends = o + 14;
    const starts = ends + segX2 + 2;
    const deltas = starts + segX2;
    const rangeOffsets = deltas + segX2;
    let lo = 0;
    let hi = segX2 / 2 - 1;
    while (lo < hi) {
      const mid = (lo + hi) >> 1;
      if (u16(ends + 2 * mid) < cp) lo = mid + 1;
      else hi = mid;
    }
    const start = u16(starts + 2 * lo);
    if (cp < start || cp > u16(ends + 2 * lo)) return 0;
    const rangeOffset = u16(rangeOffsets + 2 * lo);
    const delta = u16(deltas + 2 * lo);
    if (rangeOffset === 0) return (cp + delta) & 0xffff;
    const g = u16(rangeOffsets + 2 * lo + rangeOffset + 2 * (cp - start));
    return g === 0 ? 0 : (g + delta) & 0xffff;
  };

  let lowest: Map<number, number> | undefined;
  const lowestCodePoint = (gid: number): number | undefined => {
    if (lowest === undefined) lowest = reverseCmap(view, cmap, glyphOf);
    return lowest.get(gid);
  };

  const gpos = tables.has('GPOS') ? readKerning(view, tables.get('GPOS') as number) : { pairs: [], simple: true };
  const gsub = tables.has('GSUB')
    ? readLigatures(view, tables.get('GSUB') as number)
    : { ligatures: new Map(), simple: true };
  const kernCache = new Map<number, number>();

  return {
    unitsPerEm: u16(head + 18),
    ascender: i16(hhea + 4),
    descender: i16(hhea + 6),
    lineGap: i16(hhea + 8),
    glyphOf,
    advance: (gid) => u16(hmtx + 4 * (gid < numberOfHMetrics ? gid : numberOfHMetrics - 1)),
    lowestCodePoint,
    kern(left, right) {
      const key = left * 65536 + right;
      let v = kernCache.get(key);
      if (v === undefined) {
        v = 0;
        for (const lookup of gpos.pairs) v += pairValue(view, lookup, left, right);
        kernCache.set(key, v);
      }
      return v;
    },
    ligatures: (first) => gsub.ligatures.get(first),
    simple: gpos.simple && gsub.simple,
  };
}

/** Where each table starts, by tag (the table directory after the sfnt header: 16-byte records from 12). */
function tableDirectory(buffer: Uint8Array, view: DataView): Map<string, number> {
  const tables = new Map<string, number>();
  const numTables = view.getUint16(4);
  for (let i = 0; i < numTables; i++) {
    const rec = 12 + 16 * i;
    tables.set(
      String.fromCharCode(buffer[rec], buffer[rec + 1], buffer[rec + 2], buffer[rec + 3]),
      view.getUint32(rec + 8),
    );
  }
  return tables;
}

/** The Windows Unicode subtable: full repertoire (3, 10) in format 12, else BMP (3, 1) in format 4. */
function findCmap(view: DataView, cmap: number): Cmap | null {
  const count = view.getUint16(cmap + 2);
  let best: Cmap | null = null;
  for (let i = 0; i < count; i++) {
    const rec = cmap + 4 + 8 * i;
    const platform = view.getUint16(rec);
    const encoding = view.getUint16(rec + 2);
    const offset = cmap + view.getUint32(rec + 4);
    const format = view.getUint16(offset);
    if (platform === 3 && encoding === 10 && format === 12) return { format: 12, offset };
    if (((platform === 3 && encoding === 1) || platform === 0) && format === 4 && best === null)
      best = { format: 4, offset };
  }
  return best;
}

/** Every code point of the cmap, lowest first, so the first one seen for a glyph is kept. */
function reverseCmap(view: DataView, cmap: Cmap | null, glyphOf: (cp: number) => number): Map<number, number> {
  const out = new Map<number, number>();
  if (cmap === null) return out;
  const add = (cp: number) => {
    const g = glyphOf(cp);
    if (g !== 0 && !out.has(g)) out.set(g, cp);
  };
  const o = cmap.offset;
  if (cmap.format === 12) {
    const n = view.getUint32(o + 12);
    for (let i = 0; i < n; i++) {
      const g = o + 16 + 12 * i;
      const end = view.getUint32(g + 4);
      for (let cp = view.getUint32(g); cp <= end; cp++) add(cp);
    }
    return out;
  }
  const segX2 = view.getUint16(o + 6);
  for (let i = 0; i < segX2 / 2; i++) {
    const end = view.getUint16(o + 14 + 2 * i);
    const start = view.getUint16(o + 16 + segX2 + 2 * i);
    for (let cp = start; cp <= end && cp !== 0xffff; cp++) add(cp);
  }
  return out;
}

/** Lookup indices of the features with this tag in the Latin (else default) script's default system. */
function featureLookups(view: DataView, table: number, tag: string): number[] {
  const scriptList = table + view.getUint16(table + 4);
  const featureList = table + view.getUint16(table + 6);
  const scripts = new Map<string, number>();
  for (let i = 0; i < view.getUint16(scriptList); i++) {
    const rec = scriptList + 2 + 6 * i;
    scripts.set(tagAt(view, rec), scriptList + view.getUint16(rec + 4));
  }
  const script = scripts.get('latn') ?? scripts.get('DFLT');
  if (script === undefined) return [];
  const langSysOffset = view.getUint16(script);
  if (langSysOffset === 0) return [];
  const langSys = script + langSysOffset;
  const indices: number[] = [];
  const required = view.getUint16(langSys + 2);
  if (required !== 0xffff) indices.push(required);
  for (let i = 0; i < view.getUint16(langSys + 4); i++) indices.push(view.getUint16(langSys + 6 + 2 * i));
  const lookups = new Set<number>();
  for (const f of indices) {
    const rec = featureList + 2 + 6 * f;
    if (tagAt(view, rec) !== tag) continue;
    const feature = featureList + view.getUint16(rec + 4);
    for (let i = 0; i < view.getUint16(feature + 2); i++) lookups.add(view.getUint16(feature + 4 + 2 * i));
  }
  return [...lookups].sort((a, b) => a - b);
}

/** Subtables of a lookup as [type, offset], extension subtables unwrapped. */
function subtables(view: DataView, table: number, index: number, extension: number): [number, number][] {
  const lookupList = table + view.getUint16(table + 8);
  const lookup = lookupList + view.getUint16(lookupList + 2 + 2 * index);
  const type = view.getUint16(lookup);
  const out: [number, number][] = [];
  for (let i = 0; i < view.getUint16(lookup + 4); i++) {
    const sub = lookup + view.getUint16(lookup + 6 + 2 * i);
    if (type === extension) out.push([view.getUint16(sub + 2), sub + view.getUint32(sub + 4)]);
    else out.push([type, sub]);
  }
  return out;
}

function tagAt(view: DataView, o: number): string {
  return String.fromCharCode(view.getUint8(o), view.getUint8(o + 1), view.getUint8(o + 2), view.getUint8(o + 3));
}

function coverageIndex(view: DataView, coverage: number, glyph: number): number {
  const format = view.getUint16(coverage);
  const count = view.getUint16(coverage + 2);
  let lo = 0;
  let hi = count - 1;
  if (format === 1) {
    while (lo <= hi) {
      const mid = (lo + hi) >> 1;
      const g = view.getUint16(coverage + 4 + 2 * mid);
      if (glyph < g) hi = mid - 1;
      else if (glyph > g) lo = mid + 1;
      else return mid;
    }
    return -1;
  }
  while (lo <= hi) {
    const mid = (lo + hi) >> 1;
    const r = coverage + 4 + 6 * mid;
    if (glyph < view.getUint16(r)) hi = mid - 1;
    else if (glyph > view.getUint16(r + 2)) lo = mid + 1;
    else return view.getUint16(r + 4) + glyph - view.getUint16(r);
  }
  return -1;
}

function classOf(view: DataView, classDef: number, glyph: number): number {
  const format = view.getUint16(classDef);
  if (format === 1) {
    const i = glyph - view.getUint16(classDef + 2);
    return i >= 0 && i < view.getUint16(classDef + 4) ? view.getUint16(classDef + 6 + 2 * i) : 0;
  }
  let lo = 0;
  let hi = view.getUint16(classDef + 2) - 1;
  while (lo <= hi) {
    const mid = (lo + hi) >> 1;
    const r = classDef + 4 + 6 * mid;
    if (glyph < view.getUint16(r)) hi = mid - 1;
    else if (glyph > view.getUint16(r + 2)) lo = mid + 1;
    else return view.getUint16(r + 4);
  }
  return 0;
}

const X_ADVANCE = 0x0004;
/** Device and variation tables, which fontkit applies only to variable fonts. */
const DEVICE = 0x00f0;

function valueSize(format: number): number {
  let n = 0;
  for (let f = format; f; f >>= 1) n += f & 1;
  return 2 * n;
}

interface PairSubtable {
  format: 1 | 2;
  offset: number;
  coverage: number;
  /** Byte offset of the x advance inside the first value record, or −1 when it has none. */
  xAdvanceAt: number;
  recordSize: number;
}

function readKerning(view: DataView, gpos: number): { pairs: PairSubtable[][]; simple: boolean } {
  let simple = true;
  const pairs: PairSubtable[][] = [];
  for (const index of featureLookups(view, gpos, 'kern')) {
    const lookup: PairSubtable[] = [];
    for (const [type, sub] of subtables(view, gpos, index, 9)) {
      if (type !== 2) {
        simple = false;
        continue;
      }
      const format = view.getUint16(sub);
      const vf1 = view.getUint16(sub + 4);
      const vf2 = view.getUint16(sub + 6);
      if ((vf1 & ~(X_ADVANCE | DEVICE)) !== 0 || (vf2 & ~DEVICE) !== 0 || (format !== 1 && format !== 2)) {
        simple = false;
        continue;
      }
      lookup.push({
        format,
        offset: sub,
        coverage: sub + view.getUint16(sub + 2),
        xAdvanceAt: vf1 & X_ADVANCE ? 0 : -1,
        recordSize: valueSize(vf1) + valueSize(vf2),
      });
    }
    pairs.push(lookup);
  }
  return { pairs, simple };
}

function pairValue(view: DataView, lookup: PairSubtable[], left: number, right: number): number {
  for (const st of lookup) {
    const index = coverageIndex(view, st.coverage, left);
    if (index < 0) continue;
    const o = st.offset;
    if (st.format === 1) {
      const set = o + view.getUint16(o + 10 + 2 * index);
      const size = 2 + st.recordSize;
      let lo = 0;
      let hi = view.getUint16(set) - 1;
      while (lo <= hi) {
        const mid = (lo + hi) >> 1;
        const rec = set + 2 + size * mid;
        const second = view.getUint16(rec);
        if (right < second) hi = mid - 1;
        else if (right > second) lo = mid + 1;
        else return st.xAdvanceAt < 0 ? 0 : view.getInt16(rec + 2 + st.xAdvanceAt);
      }
      continue;
    }
    const class1 = classOf(view, o + view.getUint16(o + 8), left);
    const class2 = classOf(view, o + view.getUint16(o + 10), right);
    const class2Count = view.getUint16(o + 14);
    if (class2 >= class2Count) return 0;
    const rec = o + 16 + st.recordSize * (class1 * class2Count + class2);
    return st.xAdvanceAt < 0 ? 0 : view.getInt16(rec + st.xAdvanceAt);
  }
  return 0;
}

function readLigatures(view: DataView, gsub: number): { ligatures: Map<number, Ligature[]>; simple: boolean } {
  const ligatures = new Map<number, Ligature[]>();
  let simple = true;
  for (const index of featureLookups(view, gsub, 'liga')) {
    for (const [type, sub] of subtables(view, gsub, index, 7)) {
      if (type !== 4 || view.getUint16(sub) !== 1) {
        simple = false;
        continue;
      }
      const coverage = sub + view.getUint16(sub + 2);
      const sets = view.getUint16(sub + 4);
      for (const first of coveredGlyphs(view, coverage)) {
        const i = coverageIndex(view, coverage, first);
        if (i < 0 || i >= sets) continue;
        const set = sub + view.getUint16(sub + 6 + 2 * i);
        const list = ligatures.get(first) ?? [];
        for (let k = 0; k < view.getUint16(set); k++) {
          const lig = set + view.getUint16(set + 2 + 2 * k);
          const count = view.getUint16(lig + 2);
          const rest: number[] = [];
          for (let c = 1; c < count; c++) rest.push(view.getUint16(lig + 2 + 2 * c));
          list.push({ rest, glyph: view.getUint16(lig) });
        }
        ligatures.set(first, list);
      }
    }
  }
  return { ligatures, simple };
}

function coveredGlyphs(view: DataView, coverage: number): number[] {
  const format = view.getUint16(coverage);
  const count = view.getUint16(coverage + 2);
  const out: number[] = [];
  for (let i = 0; i < count; i++) {
    if (format === 1) out.push(view.getUint16(coverage + 4 + 2 * i));
    else {
      const r = coverage + 4 + 6 * i;
      for (let g = view.getUint16(r); g <= view.getUint16(r + 2); g++) out.push(g);
    }
  }
  return out;
}

/**
 * What a PDF font descriptor (ISO 32000-1 §9.8) takes from the font file, read as fontkit reads it for pdfkit
 * but without decoding whole tables: fontkit decodes the post table with every glyph's name to give
 * isFixedPitch and italicAngle, 35–40 ms in a fresh process (a one-series brief's profile). Source: the
 * OpenType specification 1.9, chapters "head" (xMin…yMax at 36–42, macStyle at 44, bit 1 italic), "hhea"
 * (ascender at 4), "OS/2" (sFamilyClass at 30; sxHeight and sCapHeight at 86 and 88 from version 2) and
 * "post" (italicAngle, a signed 16.16 number at 4; isFixedPitch at 12). test/render/pdf-fonts.test.ts holds
 * every field to fontkit's for every font the PDF embeds.
 */
export interface DescriptorFields {
  /** OS/2 sFamilyClass (0 without an OS/2 table). */
  familyClass: number;
  fixedPitch: boolean;
  italic: boolean;
  /** head's xMin, yMin, xMax, yMax, in font units. */
  bbox: [number, number, number, number];
  /** Degrees counter-clockwise from the vertical. */
  italicAngle: number;
  /** OS/2 sCapHeight, or hhea's ascender without an OS/2 table; undefined for OS/2 before version 2. */
  capHeight: number | undefined;
  /** OS/2 sxHeight, or 0 without an OS/2 table; undefined for OS/2 before version 2. */
  xHeight: number | undefined;
  /** hhea's ascender. */
  ascent: number;
}

export function descriptorFields(buffer: Uint8Array): DescriptorFields {
  const view = new DataView(buffer.buffer, buffer.byteOffset, buffer.byteLength);
  const tables = tableDirectory(buffer, view);
  const head = tables.get('head');
  const hhea = tables.get('hhea');
  if (head === undefined || hhea === undefined) throw new Error('font has no head or hhea table');
  const os2 = tables.get('OS/2');
  const post = tables.get('post');
  const ascent = view.getInt16(hhea + 4);
  const os2Version = os2 === undefined ? -1 : view.getUint16(os2);
  return {
    familyClass: os2 === undefined ? 0 : view.getInt16(os2 + 30),
    fixedPitch: post !== undefined && view.getUint32(post + 12) !== 0,
    italic: (view.getUint16(head + 44) & 0b10) !== 0,
    bbox: [view.getInt16(head + 36), view.getInt16(head + 38), view.getInt16(head + 40), view.getInt16(head + 42)],
    italicAngle: post === undefined ? 0 : view.getInt32(post + 4) / 65536,
    capHeight: os2 === undefined ? ascent : os2Version >= 2 ? view.getInt16(os2 + 88) : undefined,
    xHeight: os2 === undefined ? 0 : os2Version >= 2 ? view.getInt16(os2 + 86) : undefined,
    ascent,
  };
}
