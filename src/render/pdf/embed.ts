/**
 * How a font is written into the PDF when the document ends: as pdfkit writes a TrueType font (a Type0 font
 * over a CIDFontType2 with Identity-H encoding, a font descriptor and a ToUnicode map; ISO 32000-1 §9.7 and
 * §9.10.3), but from subset.ts's subset that keeps glyph numbers, with the character codes equal to the glyph
 * numbers (CIDToGIDMap Identity), the widths of the glyphs drawn only, and a CIDSet for PDF/A-1 as pdfkit
 * writes one. The subset of a set of glyphs is kept for the process, compressed, so a batch of similar
 * briefs builds and compresses it once.
 */
import { deflateSync } from 'node:zlib';
import { descriptorFields } from './opentype.js';
import { glyphClosure, subsetFont } from './subset.js';

/** What embedding reads of pdfkit's embedded font and of fontkit's parse (both untyped internals). */
export interface Embeddable {
  id: string;
  document: {
    ref(data?: object): PdfRef;
    subset?: number;
  };
  font: {
    postscriptName?: string;
  };
  scale: number;
  ascender: number;
  descender: number;
  dictionary: PdfRef;
}

interface PdfRef {
  data: Record<string, unknown>;
  write(chunk: Uint8Array | string): void;
  end(chunk?: Uint8Array | string): void;
}

export interface UsedGlyph {
  id: number;
  advanceWidth: number;
  codePoints: number[];
}

/** Subset font programs by font and glyph set, already compressed (zlib's default level, as pdfkit's). */
const subsets = new Map<string, { length: number; deflated: Buffer }>();

export function embedFont(e: Embeddable, bytes: Uint8Array, used: Map<number, UsedGlyph>, key: string): void {
  const gids = [...used.keys()].sort((a, b) => a - b);
  const keep = glyphClosure(bytes, gids);
  const cacheKey = `${key}:${keep.join(',')}`;
  let program = subsets.get(cacheKey);
  if (program === undefined) {
    const raw = subsetFont(bytes, keep);
    program = { length: raw.length, deflated: deflateSync(raw) };
    if (subsets.size >= 200) subsets.clear();
    subsets.set(cacheKey, program);
  }
  const doc = e.document;
  const font = e.font;
  // Written as compressed already (a stream whose dictionary names its filter is not compressed again);
  // Length1 is the program's own length, which the PDF format asks of embedded TrueType fonts.
  const fontFile = doc.ref({ Filter: 'FlateDecode', Length1: program.length });
  fontFile.end(program.deflated);

  // The descriptor's fields from the font file itself, as fontkit gives them (opentype.ts descriptorFields).
  const d = descriptorFields(bytes);
  const familyClass = d.familyClass >> 8;
  let flags = 0;
  if (d.fixedPitch) flags |= 1 << 0;
  if (1 <= familyClass && familyClass <= 7) flags |= 1 << 1;
  flags |= 1 << 2;
  if (familyClass === 10) flags |= 1 << 3;
  if (d.italic) flags |= 1 << 6;
  const tag = [1, 2, 3, 4, 5, 6].map((i) => String.fromCharCode((e.id.charCodeAt(i) || 73) + 17)).join('');
  const name = `${tag}+${(font.postscriptName ?? 'Font').replaceAll(' ', '_')}`;
  const [minX, minY, maxX, maxY] = d.bbox;
  const descriptor = doc.ref({
    Type: 'FontDescriptor',
    FontName: name,
    Flags: flags,
    FontBBox: [minX * e.scale, minY * e.scale, maxX * e.scale, maxY * e.scale],
    ItalicAngle: d.italicAngle,
    Ascent: e.ascender,
    Descent: e.descender,
    CapHeight: (d.capHeight || d.ascent) * e.scale,
    XHeight: (d.xHeight || 0) * e.scale,
    StemV: 0,
    FontFile2: fontFile,
  });
  if (doc.subset === 1) {
    // PDF/A-1 wants the set of glyphs the subset holds.
    const max = keep[keep.length - 1];
    const set = new Uint8Array(Math.ceil((max + 1) / 8));
    for (const g of keep) set[g >> 3] |= 0x80 >> (g % 8);
    const ref = doc.ref();
    ref.write(set);
    ref.end();
    descriptor.data.CIDSet = ref;
  }
  descriptor.end();

  // Widths of the glyphs drawn, in runs of consecutive numbers: [first [w w …] first [w …] …].
  const widths: unknown[] = [];
  for (let i = 0; i < gids.length; ) {
    let j = i + 1;
    while (j < gids.length && gids[j] === gids[j - 1] + 1) j++;
    widths.push(
      gids[i],
      gids.slice(i, j).map((g) => (used.get(g) as UsedGlyph).advanceWidth * e.scale),
    );
    i = j;
  }
  const descendant = doc.ref({
    Type: 'Font',
    Subtype: 'CIDFontType2',
    BaseFont: name,
    CIDSystemInfo: { Registry: new String('Adobe'), Ordering: new String('Identity'), Supplement: 0 },
    FontDescriptor: descriptor,
    W: widths,
    CIDToGIDMap: 'Identity',
  });
  descendant.end();
  e.dictionary.data = {
    Type: 'Font',
    Subtype: 'Type0',
    BaseFont: name,
    Encoding: 'Identity-H',
    DescendantFonts: [descendant],
    ToUnicode: toUnicode(doc, gids, used),
  };
  e.dictionary.end();
}

function hex4(n: number): string {
  return `0000${n.toString(16)}`.slice(-4);
}

/** UTF-16BE of the code points, as hex. */
function utf16(codePoints: number[]): string {
  let out = '';
  for (let v of codePoints) {
    if (v > 0xffff) {
      v -= 0x10000;
      out += hex4(((v >>> 10) & 0x3ff) | 0xd800);
      v = 0xdc00 | (v & 0x3ff);
    }
    out += hex4(v);
  }
  return out;
}

/** The ToUnicode CMap (Adobe Technical Note #5411): each glyph drawn, mapped to its characters. */
function toUnicode(doc: Embeddable['document'], gids: number[], used: Map<number, UsedGlyph>): PdfRef {
  const blocks: string[] = [];
  for (let i = 0; i < gids.length; i += 100) {
    const chunk = gids.slice(i, i + 100);
    blocks.push(`${chunk.length} beginbfchar`);
    for (const g of chunk) {
      const cps = (used.get(g) as UsedGlyph).codePoints;
      // A glyph that stands for no character (fontkit may insert one) maps to U+FFFD.
      blocks.push(`<${hex4(g)}> <${utf16(cps.length > 0 ? cps : [0xfffd])}>`);
    }
    blocks.push('endbfchar');
  }
  const cmap = doc.ref();
  cmap.end(`/CIDInit /ProcSet findresource begin
12 dict begin
begincmap
/CIDSystemInfo <<
  /Registry (Adobe)
  /Ordering (UCS)
  /Supplement 0
>> def
/CMapName /Adobe-Identity-UCS def
/CMapType 2 def
1 begincodespacerange
<0000><ffff>
endcodespacerange
${blocks.join('\n')}
endcmap
CMapName currentdict /CMap defineresource pop
end
end`);
  return cmap;
}
