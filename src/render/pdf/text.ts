/**
 * Text of the PDF brief, measured and set here rather than by pdfkit's line wrapper: a text is cut into
 * words (words.ts), lines filled greedily, and each line written as one positioned text object with the
 * words' kerning in TJ arrays whose codes are worked out once per process. A text is measured once per
 * document and drawn from the same measurement.
 *
 * A line with right-to-left runs is put in visual order: its trailing white space takes the paragraph's
 * level (rule L1), then from the highest level down to the lowest odd one every sequence of runs at that
 * level or above is reversed (rule L2). All runs of a line share the baseline of the text's own face.
 * Source: Unicode Standard Annex #9, Unicode Bidirectional Algorithm (revision 48, 2023), §3.4.
 */
import { BriefDocument } from './document.js';
import { type DocFont, docFont, type Face, glyphHex, shape, sharedFont } from './fonts.js';
import { DIRECT, type Shaped, WORDS_KEPT, WordCache } from './shape.js';
import type { TextStyle } from './theme.js';
import { isSpaces, plainWords, type Seg, splitAtHyphen, splitInside, type Word, words } from './words.js';

export interface Line {
  segs: Seg[];
  /** 1/1000 em, trailing spaces left out. */
  width: number;
}

export interface TextBlock {
  lines: Line[];
  size: number;
  /** Widest line, in points. */
  width: number;
  height: number;
  /** Distance from one baseline to the next, in points. */
  lineHeight: number;
  /** Top of the line box to the baseline, in points. */
  ascent: number;
  colour: string;
}

/** Characters that need the slow path: anything right-to-left, and the bidi controls. */

const blocks = new WeakMap<PDFKit.PDFDocument, Map<string, TextBlock>>();

/** The text in style s, in lines no wider than width (points; no wrapping without it). */
export function measureText(doc: PDFKit.PDFDocument, text: string, s: TextStyle, width?: number): TextBlock {
  let memo = blocks.get(doc);
  if (memo === undefined) {
    memo = new Map();
    blocks.set(doc, memo);
  }
  const key = `${s.face}\u0000${s.size}\u0000${s.lineGap}\u0000${s.colour}\u0000${width ?? ''}\u0000${text}`;
  let b = memo.get(key);
  if (b === undefined) {
    b = layout(doc, text, s, width);
    memo.set(key, b);
  }
  return b;
}

/** The text on one line (no wrapping), measured afresh: for the many short texts drawn once (table cells). */
export function lineBlock(doc: PDFKit.PDFDocument, text: string, s: TextStyle): TextBlock {
  if (text.indexOf(' ') < 0 && text !== '' && DIRECT.test(text)) {
    // One word of plain text (most table cells): its one line, built without the general machinery.
    const font = sharedFont(s.face);
    const shaped = shape(font, text);
    const k = s.size / 1000;
    return {
      lines: [{ segs: [{ font, shaped, level: 0 }], width: shaped.width }],
      size: s.size,
      width: shaped.width * k,
      height: (font.ascender - font.descender + font.lineGap) * k + s.lineGap,
      lineHeight: (font.ascender - font.descender + font.lineGap) * k + s.lineGap,
      ascent: font.ascender * k,
      colour: s.colour,
    };
  }
  return layout(doc, text, s);
}

/**
 * A short text of one face on one line, as the table cells need it, worked out once per process: its width
 * (as textWidth sums it), its widest space-separated piece (as a table's narrowest column needs it) and its
 * one line (as lineBlock lays it out), all in 1/1000 em. Only for plain text (DIRECT, so no line feed and no
 * control character), not empty; null otherwise.
 */
export interface PlainLine {
  face: Face;
  /** The sum of its words' widths, trailing spaces included. */
  sum: number;
  /** The widest piece between single spaces. */
  widest: number;
  lines: Line[];
  /** Laid out as one word (lineBlock's own path, whose ascent is reckoned a little differently). */
  single: boolean;
}

/**
 * Kept per face as shaped words are (shape.ts WordCache): a table's cells are mostly figures new with each
 * brief, and kept in one map up to 50,000 per face they were most of a batch worker's growing heap.
 */
const plainLines = new Map<Face, WordCache<PlainLine>>();

export function plainLine(text: string, face: Face): PlainLine | null {
  let memo = plainLines.get(face);
  if (memo === undefined) {
    memo = new WordCache<PlainLine>(WORDS_KEPT);
    plainLines.set(face, memo);
  }
  let p = memo.get(text);
  if (p !== undefined) return p;
  if (text === '' || !DIRECT.test(text)) return null;
  const font = sharedFont(face);
  if (text.indexOf(' ') < 0) {
    const shaped = shape(font, text);
    p = {
      face,
      sum: shaped.width,
      widest: shaped.width,
      lines: [{ segs: [{ font, shaped, level: 0 }], width: shaped.width }],
      single: true,
    };
  } else {
    const all = plainWords(text, face);
    const segs: Seg[] = [];
    let sum = 0;
    for (const w of all) {
      sum += w.width;
      for (const seg of w.segs) segs.push(seg);
    }
    let widest = 0;
    for (const piece of text.split(' ')) widest = Math.max(widest, shape(font, piece).width);
    const tail = all.length > 0 ? all[all.length - 1].tail : 0;
    p = { face, sum, widest, lines: [{ segs, width: sum - tail }], single: false };
  }
  memo.set(text, p);
  return p;
}

/** Draws a plain line (plainLine) in style s, its top at y: what drawText of lineBlock draws for it. */
export function drawPlainLine(doc: PDFKit.PDFDocument, p: PlainLine, s: TextStyle, x: number, y: number): void {
  const font = sharedFont(s.face);
  const ascent = p.single ? font.ascender * (s.size / 1000) : (font.ascender * s.size) / 1000;
  const segs = p.lines[0].segs;
  const shaped = segs.length === 1 ? trimmed(segs[0].shaped) : null;
  if (shaped === null || shaped.glyphs.length === 0 || shaped.offsets !== null || !(doc instanceof BriefDocument)) {
    drawLineList(doc, p.lines, s.size, 0, ascent, s.colour, x, y, {}, 0, 1);
    return;
  }
  // One run of glyphs (most cells): the operators drawLineList writes for it, put together at once.
  const g = doc.textState;
  const fill = colour(s.colour);
  let out = g.colour === fill ? 'BT' : `${fill} rg\nBT`;
  g.colour = fill;
  out += `\n1 0 0 -1 ${num(x)} ${num(y + ascent)} Tm`;
  const f = docFont(doc, segs[0].font.slot);
  doc.useFontOnPage(f.embedded);
  const tf = `/${f.embedded.id} ${num(s.size)} Tf`;
  if (g.font !== tf) out += `\n${tf}`;
  g.font = tf;
  if (shaped.mark !== f.mark) {
    shaped.mark = f.mark;
    for (const glyph of shaped.glyphs) glyphHex(f, glyph);
  }
  doc.addTextContent(`${out}\n[${tjOf(shaped, segs[0].font.scale)}] TJ\nET`);
}

/** Width of text set on one line in face at size, in points (what pdfkit's widthOfString gives). */
export function textWidth(doc: PDFKit.PDFDocument, text: string, face: Face, size: number): number {
  if (text.indexOf(' ') < 0 && DIRECT.test(text)) return (shape(sharedFont(face), text).width * size) / 1000;
  let w = 0;
  for (const word of words(doc, text, face)) w += word.width;
  return (w * size) / 1000;
}

function layout(doc: PDFKit.PDFDocument, text: string, s: TextStyle, width?: number): TextBlock {
  const primary = sharedFont(s.face);
  const all = words(doc, text, s.face);
  const max = width === undefined ? Number.POSITIVE_INFINITY : (width * 1000) / s.size;
  const lines: Line[] = [];
  let segs: Seg[] = [];
  let used = 0;
  let tail = 0;
  let bidiLine = false;
  const close = (): void => {
    lines.push(finishLine(segs, used - tail, bidiLine));
    segs = [];
    used = 0;
    tail = 0;
    bidiLine = false;
  };
  const queue = all.slice().reverse();
  while (queue.length > 0) {
    const w = queue.pop() as Word;
    const fits = used + w.width - w.tail <= max + 1e-6;
    if (!fits) {
      const split =
        splitAtHyphen(doc, w, max - used, s.face) ?? (segs.length === 0 ? splitInside(doc, w, max, s.face) : null);
      if (split) {
        queue.push(split[1], split[0]);
        continue;
      }
      if (segs.length > 0) {
        close();
        queue.push(w);
        continue;
      }
    }
    for (const seg of w.segs) {
      segs.push(seg);
      if (seg.level !== 0) bidiLine = true;
    }
    used += w.width;
    tail = w.tail;
    if (w.hard) close();
  }
  if (segs.length > 0 || lines.length === 0) close();
  // An empty text has no lines (pdfkit gives it no height either).
  if (text === '') lines.length = 0;
  const lineHeight = ((primary.ascender - primary.descender + primary.lineGap) * s.size) / 1000 + s.lineGap;
  let widest = 0;
  for (const l of lines) widest = Math.max(widest, (l.width * s.size) / 1000);
  return {
    lines,
    size: s.size,
    width: widest,
    height: lines.length * lineHeight,
    lineHeight,
    ascent: (primary.ascender * s.size) / 1000,
    colour: s.colour,
  };
}

/** A line's runs in visual order (UAX #9 L1 for its trailing spaces, then L2). */
function finishLine(segs: Seg[], width: number, bidiLine: boolean): Line {
  if (!bidiLine) return { segs, width };
  const out = segs.slice();
  // L1: white space at the end of the line takes the paragraph's level.
  for (let i = out.length - 1; i >= 0 && isSpaces(out[i]); i--) out[i] = { ...out[i], level: 0 };
  let highest = 0;
  let lowestOdd = Number.POSITIVE_INFINITY;
  for (const s of out) {
    highest = Math.max(highest, s.level);
    if (s.level % 2 === 1) lowestOdd = Math.min(lowestOdd, s.level);
  }
  for (let level = highest; level >= lowestOdd; level--) {
    for (let i = 0; i < out.length; ) {
      if (out[i].level < level) {
        i++;
        continue;
      }
      let j = i;
      while (j < out.length && out[j].level >= level) j++;
      const rev = out.slice(i, j).reverse();
      for (let k = 0; k < rev.length; k++) out[i + k] = rev[k];
      i = j;
    }
  }
  return { segs: out, width };
}

export interface DrawOptions {
  /** Width of the box the lines are aligned in (points); needed for right and centre. */
  width?: number;
  align?: 'left' | 'right' | 'center';
}

/** Draws lines [from, to) of the block with the first one's top at y. */
export function drawLines(
  doc: PDFKit.PDFDocument,
  b: TextBlock,
  x: number,
  y: number,
  options: DrawOptions = {},
  from = 0,
  to = b.lines.length,
): void {
  drawLineList(doc, b.lines, b.size, b.lineHeight, b.ascent, b.colour, x, y, options, from, to);
}

function drawLineList(
  doc: PDFKit.PDFDocument,
  lines: Line[],
  size: number,
  lineHeight: number,
  ascent: number,
  hex: string,
  x: number,
  y: number,
  options: DrawOptions,
  from: number,
  to: number,
): void {
  if (from >= to) return;
  const k = size / 1000;
  const brief = doc instanceof BriefDocument ? doc : null;
  const g = brief === null ? { colour: null, font: null } : brief.textState;
  const fill = colour(hex);
  let out = g.colour === fill ? 'BT' : `${fill} rg\nBT`;
  g.colour = fill;
  let current: DocFont | null = null;
  for (let li = from; li < to; li++) {
    const line = lines[li];
    const n = line.segs.length;
    if (n === 0) continue;
    const free = options.width === undefined ? 0 : options.width - line.width * k;
    const dx = options.align === 'right' ? free : options.align === 'center' ? free / 2 : 0;
    let penX = x + dx;
    const baseline = y + (li - from) * lineHeight + ascent;
    out += `\n1 0 0 -1 ${num(penX)} ${num(baseline)} Tm`;
    let tj = '';
    for (let si = 0; si < n; si++) {
      const seg = line.segs[si];
      // Spaces that end a line take no room and are not drawn.
      const shaped = si === n - 1 && seg.level % 2 === 0 ? trimmed(seg.shaped) : seg.shaped;
      if (shaped.glyphs.length === 0) continue;
      const f = docFont(doc, seg.font.slot);
      if (f !== current) {
        if (tj) out += `\n[${tj}] TJ`;
        tj = '';
        (doc as BriefDocument).useFontOnPage(f.embedded);
        const tf = `/${f.embedded.id} ${num(size)} Tf`;
        if (g.font !== tf) out += `\n${tf}`;
        g.font = tf;
        current = f;
      }
      if (shaped.mark !== f.mark) {
        shaped.mark = f.mark;
        for (const g of shaped.glyphs) glyphHex(f, g);
      }
      if (shaped.offsets === null) {
        const piece = tjOf(shaped, seg.font.scale);
        tj = tj ? `${tj} ${piece}` : piece;
        penX += shaped.width * k;
        continue;
      }
      // Glyphs placed off their pen position (marks) each get their own text matrix.
      if (tj) out += `\n[${tj}] TJ`;
      tj = '';
      const { glyphs, advances, offsets } = shaped;
      for (let i = 0; i < glyphs.length; i++) {
        const h = glyphHex(f, glyphs[i]);
        if (offsets[2 * i] !== 0 || offsets[2 * i + 1] !== 0) {
          out += `\n1 0 0 -1 ${num(penX + offsets[2 * i] * k)} ${num(baseline - offsets[2 * i + 1] * k)} Tm\n<${h}> Tj`;
        } else out += `\n1 0 0 -1 ${num(penX)} ${num(baseline)} Tm\n<${h}> Tj`;
        penX += advances[i] * k;
      }
      out += `\n1 0 0 -1 ${num(penX)} ${num(baseline)} Tm`;
    }
    if (tj) out += `\n[${tj}] TJ`;
  }
  if (brief === null) doc.addContent(`${out}\nET`);
  else brief.addTextContent(`${out}\nET`);
}

// The fill colour and font the page's content has last set (TextState) let a run of texts in one style
// (the cells of a table) set them once: both stay in force across text objects (ISO 32000-1 §8.4 and
// §9.3). The brief's document (document.ts) forgets them when anything else is written or the page
// changes; any other document gets both set for every text.

/** A word's TJ elements: its glyph codes, with the kerning as adjustments (in 1/1000 em, leftward). */
function tjOf(s: Shaped, scale: number): string {
  if (s.tj !== undefined) return s.tj;
  const parts: string[] = [];
  let hex = '';
  for (let i = 0; i < s.glyphs.length; i++) {
    const g = s.glyphs[i];
    hex += g.hex ?? `0000${g.id.toString(16)}`.slice(-4);
    const adjust = g.advanceWidth * scale - s.advances[i];
    if (adjust > 0.0005 || adjust < -0.0005) {
      parts.push(`<${hex}>`, num(adjust));
      hex = '';
    }
  }
  if (hex) parts.push(`<${hex}>`);
  s.tj = parts.join(' ');
  return s.tj;
}

/** The word without the spaces that end it. */
function trimmed(s: Shaped): Shaped {
  if (s.trimmed !== undefined) return s.trimmed;
  const g = s.glyphs;
  let n = 0;
  while (n < g.length && g[g.length - 1 - n].codePoints.length === 1 && g[g.length - 1 - n].codePoints[0] === 0x20) n++;
  if (n === 0) {
    s.trimmed = s;
    return s;
  }
  const cut = g.length - n;
  const advances = s.advances.slice(0, cut);
  s.trimmed = {
    glyphs: g.slice(0, cut),
    advances,
    offsets: s.offsets ? s.offsets.slice(0, 2 * cut) : null,
    width: advances.reduce((a, v) => a + v, 0),
  };
  return s.trimmed;
}

/** Draws a whole block with its top at y. */
export function drawText(doc: PDFKit.PDFDocument, b: TextBlock, x: number, y: number, options: DrawOptions = {}): void {
  drawLines(doc, b, x, y, options);
}

const colours = new Map<string, string>();

/** "#rrggbb" as PDF RGB components (what pdfkit's fillColor writes for it, as one operator). */
function colour(hex: string): string {
  let c = colours.get(hex);
  if (c === undefined) {
    const m = /^#?([0-9a-f]{2})([0-9a-f]{2})([0-9a-f]{2})$/i.exec(hex);
    const v = m ? [m[1], m[2], m[3]].map((h) => num(Number.parseInt(h, 16) / 255)) : ['0', '0', '0'];
    c = v.join(' ');
    colours.set(hex, c);
  }
  return c;
}

/** A number as pdfkit writes one, to three decimals. */
function num(n: number): string {
  const r = Math.round(n * 1000) / 1000;
  return Object.is(r, -0) ? '0' : String(r);
}
