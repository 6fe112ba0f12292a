/**
 * Words of a text for the PDF, each shaped once per process (shape.ts): a word runs up to and including the
 * spaces after it; a line feed ends one with a forced break.
 *
 * Text that Source Sans 3 cannot show takes a slower path: each character goes to the first font that has it
 * (Source Sans, else Noto Sans Hebrew or Arabic, else the emoji font; a character none has is written as its
 * code, "[U+1F9FF]"; default-ignorable characters the font lacks are left out), the Unicode Bidirectional
 * Algorithm (UAX #9, by bidi-js) gives each character its embedding level in a left-to-right paragraph, a
 * word splits into runs of one font and one level, fontkit shapes the right-to-left runs (Arabic joining forms
 * included) and mirrored characters are swapped in the others (rule L4).
 *
 * A word that does not fit may break after a hyphen or dash inside it (the break opportunities of UAX #14
 * for these characters: HY before a letter, BA, B2), never at a no-break space or hyphen; a word wider than
 * the whole line breaks between characters.
 * Source: Unicode Standard Annex #9, Unicode Bidirectional Algorithm (revision 48, 2023), §3.3 and L4;
 * Unicode Standard Annex #14, Unicode Line Breaking Algorithm (revision 51, 2023), §6.1.
 */
import { createRequire } from 'node:module';
import type { Bidi } from 'bidi-js';
import { docFont, type Face, type SharedFont, type Slot, shape, sharedFont } from './fonts.js';
import { DIRECT, type Shaped, WORDS_KEPT, WordCache } from './shape.js';

export interface Seg {
  font: SharedFont;
  shaped: Shaped;
  level: number;
}

export interface Word {
  segs: Seg[];
  /** 1/1000 em, trailing spaces included. */
  width: number;
  /** Width of the trailing spaces. */
  tail: number;
  /** The word's text (for breaking it). */
  text: string;
  /** A forced line break follows. */
  hard: boolean;
}

const RTL =
  /[\u0590-\u08ff\ufb1d-\ufdff\ufe70-\ufefc\u200f\u202b\u202e\u2067]|[\u{10800}-\u{10fff}\u{1e800}-\u{1efff}]/u;
/** Default-ignorable characters (drawn only when the run's font has them, as fontkit needs ZWJ and ZWNJ). */
const IGNORABLE: [number, number][] = [
  [0x00ad, 0x00ad],
  [0x034f, 0x034f],
  [0x061c, 0x061c],
  [0x115f, 0x1160],
  [0x17b4, 0x17b5],
  [0x180b, 0x180f],
  [0x200b, 0x200f],
  [0x202a, 0x202e],
  [0x2060, 0x206f],
  [0xfe00, 0xfe0f],
  [0xfeff, 0xfeff],
  [0xe0000, 0xe0fff],
];

function ignorable(cp: number): boolean {
  for (const [a, b] of IGNORABLE) if (cp >= a && cp <= b) return true;
  return false;
}
const MARK = /^\p{M}$/u;
const HEBREW = /^[\u0590-\u05ff\ufb1d-\ufb4f]$/u;
const ARABIC = /^[\u0600-\u06ff\u0750-\u077f\u0870-\u08ff\ufb50-\ufdff\ufe70-\ufeff]$/u;
/** Fonts whose runs fontkit shapes (right-to-left scripts with joining and marks). */
const SHAPED_BY_FONTKIT = new Set<Slot>(['HebrewRegular', 'HebrewBold', 'ArabicRegular', 'ArabicBold']);

let bidi: Bidi | undefined;

/**
 * bidi-js, loaded the first time a text needs it (most briefs never do). It is a CommonJS module whose export
 * is its factory (typed as an ES default export).
 */
function bidiFactory(): Bidi {
  const m = createRequire(import.meta.url)('bidi-js') as { default?: () => Bidi } & (() => Bidi);
  return (typeof m.default === 'function' ? m.default : m)();
}

function fallbacks(face: Face): Slot[] {
  const bold = face === 'Semibold' || face === 'Bold';
  return [bold ? 'HebrewBold' : 'HebrewRegular', bold ? 'ArabicBold' : 'ArabicRegular', 'Emoji'];
}

function covers(slot: Slot, cp: number): boolean {
  return sharedFont(slot).tables.glyphOf(cp) !== 0;
}
export function isSpaces(s: Seg): boolean {
  return s.shaped.glyphs.every((g) => g.codePoints.length === 1 && g.codePoints[0] === 0x20);
}

/** A control character other than the line feed. */
// biome-ignore lint/suspicious/noControlCharactersInRegex: control characters are what it looks for.
const CONTROL = /[\x00-\x09\x0b-\x1f\x7f]/;

/** A tab counts as a space (as pdfkit has it); other control characters but the line feed show nothing. */
function withoutControls(text: string): string {
  // Looked for by the regular-expression engine: a loop over every character of every paragraph ran
  // interpreted in a fresh process (about 3 ms of a one-series brief).
  if (!CONTROL.test(text)) return text;
  let out = '';
  for (const ch of text) {
    const c = ch.charCodeAt(0);
    if (c === 0x09) out += ' ';
    else if ((c >= 0x20 && c !== 0x7f) || c === 0x0a) out += ch;
  }
  return out;
}

/** The text's words: up to and including the spaces after them, a line feed ending one with a hard break. */
export function words(doc: PDFKit.PDFDocument, text: string, face: Face): Word[] {
  const out: Word[] = [];
  const clean = withoutControls(text);
  const paragraphs = clean.split('\n');
  paragraphs.forEach((p, i) => {
    const list = needsFallback(p, face) ? complexWords(doc, p, face) : plainWords(p, face);
    if (i < paragraphs.length - 1) {
      if (list.length === 0) list.push({ segs: [], width: 0, tail: 0, text: '', hard: true });
      else list[list.length - 1].hard = true;
    }
    // One at a time: spreading a list of a million words as arguments overflows the call stack.
    for (const w of list) out.push(w);
  });
  return out;
}

/** Whether the text needs more than its own face in one direction (most text needs only that). */
function needsFallback(text: string, face: Face): boolean {
  if (DIRECT.test(text)) return false;
  if (RTL.test(text)) return true;
  for (const ch of text) if (!covers(face, ch.codePointAt(0) as number)) return true;
  return false;
}

function spaceSplit(text: string): string[] {
  const parts: string[] = [];
  let start = 0;
  for (let i = 0; i < text.length; i++) {
    if (text.charCodeAt(i) === 0x20 && (i + 1 >= text.length || text.charCodeAt(i + 1) !== 0x20)) {
      parts.push(text.slice(start, i + 1));
      start = i + 1;
    }
  }
  if (start < text.length) parts.push(text.slice(start));
  return parts;
}

function trailingSpaces(text: string): number {
  let n = 0;
  while (n < text.length && text.charCodeAt(text.length - 1 - n) === 0x20) n++;
  return n;
}

/** Words of a text its own face shows left to right (DIRECT characters, no line feed). */
export function plainWords(text: string, face: Face): Word[] {
  const font = sharedFont(face);
  return spaceSplit(text).map((part) => {
    const shaped = shape(font, part);
    const n = trailingSpaces(part);
    let tail = 0;
    for (let k = shaped.advances.length - n; k < shaped.advances.length; k++) tail += shaped.advances[k];
    return { segs: [{ font, shaped, level: 0 }], width: shaped.width, tail, text: part, hard: false };
  });
}

interface Char {
  text: string;
  slot: Slot;
  level: number;
}

/** Words of a text with other scripts or directions: fonts by coverage, levels by UAX #9. */
function complexWords(doc: PDFKit.PDFDocument, text: string, face: Face): Word[] {
  let levels: Uint8Array | null = null;
  if (RTL.test(text)) {
    bidi ??= bidiFactory();
    levels = bidi.getEmbeddingLevels(text, 'ltr').levels;
  }
  const chars: Char[] = [];
  let prev: Slot = face;
  for (let i = 0; i < text.length; ) {
    const cp = text.codePointAt(i) as number;
    const ch = String.fromCodePoint(cp);
    const level = levels ? levels[i] : 0;
    i += ch.length;
    let slot: Slot | null = null;
    if ((MARK.test(ch) || ignorable(cp)) && covers(prev, cp)) slot = prev;
    else if (ignorable(cp)) continue;
    else if (covers(face, cp)) slot = face;
    else {
      const [hebrew, arabic, emoji] = fallbacks(face);
      const f = HEBREW.test(ch) ? hebrew : ARABIC.test(ch) ? arabic : emoji;
      slot = covers(f, cp) ? f : null;
    }
    if (slot === null) {
      // No font has it: its code, in the text's own face.
      for (const c of `[U+${cp.toString(16).toUpperCase().padStart(4, '0')}]`)
        chars.push({ text: c, slot: face, level });
      prev = face;
      continue;
    }
    chars.push({ text: level % 2 === 1 && !SHAPED_BY_FONTKIT.has(slot) ? mirrored(ch) : ch, slot, level });
    prev = slot;
  }
  const out: Word[] = [];
  let word: Char[] = [];
  const flush = (): void => {
    if (word.length > 0) out.push(makeWord(doc, word));
    word = [];
  };
  for (let k = 0; k < chars.length; k++) {
    word.push(chars[k]);
    if (chars[k].text === ' ' && (k + 1 >= chars.length || chars[k + 1].text !== ' ')) flush();
  }
  flush();
  return out;
}

function mirrored(ch: string): string {
  return bidi?.getMirroredCharacter(ch) ?? ch;
}

/** A word from its characters: runs of one font and level, each shaped in its direction. */
function makeWord(doc: PDFKit.PDFDocument, chars: Char[]): Word {
  const segs: Seg[] = [];
  let width = 0;
  let text = '';
  for (let i = 0; i < chars.length; ) {
    let j = i;
    let run = '';
    while (j < chars.length && chars[j].slot === chars[i].slot && chars[j].level === chars[i].level)
      run += chars[j++].text;
    const seg = shapeRun(doc, chars[i].slot, run, chars[i].level);
    segs.push(seg);
    width += seg.shaped.width;
    text += run;
    i = j;
  }
  let tail = 0;
  const last = segs[segs.length - 1];
  if (last && isSpaces(last)) tail = last.shaped.width;
  else if (last) {
    const n = trailingSpaces(text);
    const adv = last.shaped.advances;
    // A left-to-right run keeps its trailing spaces at the end; a reversed one at the start.
    if (last.level % 2 === 0) for (let k = adv.length - n; k < adv.length; k++) tail += adv[Math.max(0, k)];
  }
  return { segs, width, tail, text, hard: false };
}

const rtlShaped = new WeakMap<SharedFont, WordCache<Shaped>>();

function shapeRun(doc: PDFKit.PDFDocument, slot: Slot, text: string, level: number): Seg {
  const font = docFont(doc, slot).shared;
  if (level % 2 === 0) return { font, shaped: shape(font, text), level };
  let cache = rtlShaped.get(font);
  if (cache === undefined) {
    cache = new WordCache<Shaped>(WORDS_KEPT);
    rtlShaped.set(font, cache);
  }
  let shaped = cache.get(text);
  if (shaped === undefined) {
    // fontkit reverses right-to-left runs itself; a left-to-right font's run is shaped reversed.
    shaped = SHAPED_BY_FONTKIT.has(slot) ? shape(font, text) : shape(font, [...text].reverse().join(''));
    cache.set(text, shaped);
  }
  return { font, shaped, level };
}

/** The word split after its last hyphen or dash that leaves a head no wider than room (1/1000 em). */
export function splitAtHyphen(doc: PDFKit.PDFDocument, w: Word, room: number, face: Face): [Word, Word] | null {
  const t = w.text;
  for (let i = t.length - 2; i > 0; i--) {
    const c = t[i];
    const next = t[i + 1];
    const breakable =
      (c === '-' && /\p{L}/u.test(next) && /[\p{L}\p{N}]/u.test(t[i - 1])) ||
      ((c === '\u2010' || c === '\u2013' || c === '\u2014') && next !== ' ');
    if (!breakable) continue;
    const head = rewords(doc, t.slice(0, i + 1), face);
    if (head.width - head.tail > room) continue;
    const rest = rewords(doc, t.slice(i + 1), face);
    rest.hard = w.hard;
    return [head, rest];
  }
  return null;
}

/** A word wider than the line, split after as many characters as fit (at least one). */
export function splitInside(doc: PDFKit.PDFDocument, w: Word, max: number, face: Face): [Word, Word] | null {
  const cps = [...w.text];
  if (cps.length < 2) return null;
  let lo = 1;
  let hi = cps.length - 1;
  while (lo < hi) {
    const mid = (lo + hi + 1) >> 1;
    const head = rewords(doc, cps.slice(0, mid).join(''), face);
    if (head.width - head.tail <= max) lo = mid;
    else hi = mid - 1;
  }
  const head = rewords(doc, cps.slice(0, lo).join(''), face);
  const rest = rewords(doc, cps.slice(lo).join(''), face);
  rest.hard = w.hard;
  return [head, rest];
}

/** A piece of a word as one word again (its parts shaped afresh). */
function rewords(doc: PDFKit.PDFDocument, text: string, face: Face): Word {
  const list = needsFallback(text, face) ? complexWords(doc, text, face) : plainWords(text, face);
  if (list.length === 1) return list[0];
  const segs = list.flatMap((x) => x.segs);
  return {
    segs,
    width: list.reduce((a, x) => a + x.width, 0),
    tail: list.length > 0 ? list[list.length - 1].tail : 0,
    text,
    hard: false,
  };
}
