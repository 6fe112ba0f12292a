/**
 * Reading cells straight from a file's bytes, for the fast readers (csv-fast.ts, json-fast.ts): whether the
 * bytes are text the general path would read at all, the trimmed text of a byte range, and the usual
 * number cell without making a string.
 *
 * Decimal digits become a double exactly as Number() would make them while the digits fit a double's
 * integer range: with at most 15 digits the digit string m and 10^f (f ≤ 22) are both exact doubles, so the
 * one rounding of m / 10^f is the correctly rounded value of the decimal (Clinger, "How to Read Floating
 * Point Numbers Accurately", PLDI 1990, the fast path of §4). Longer numbers go through Number().
 *
 *   plainDecimal(bytesOf('-12.5'), 0, 5, 46) → -12.5
 */
import { isUtf8 } from 'node:buffer';

/** 10^0 … 10^22, every one an exact double. */
const POW10 = Array.from({ length: 23 }, (_, i) => 10 ** i);

export function asBuffer(bytes: Uint8Array): Buffer {
  return Buffer.isBuffer(bytes) ? bytes : Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength);
}

/**
 * Whether csv.decodeText would accept the bytes: not UTF-16, not a ZIP or legacy spreadsheet, no NUL and
 * valid UTF-8. (When it would not, the general path says why.)
 */
export function isPlainText(bytes: Buffer): boolean {
  const b0 = bytes[0];
  const b1 = bytes[1];
  if ((b0 === 0xff && b1 === 0xfe) || (b0 === 0xfe && b1 === 0xff)) return false;
  if (b0 === 0x50 && b1 === 0x4b && bytes[2] === 3 && bytes[3] === 4) return false;
  if (b0 === 0xd0 && b1 === 0xcf && bytes[2] === 0x11 && bytes[3] === 0xe0) return false;
  if (bytes.indexOf(0) !== -1) return false;
  return isUtf8(bytes);
}

/** Length of the UTF-8 byte-order mark at `at`, or 0. */
export function bomAt(bytes: Buffer, at: number): number {
  return bytes[at] === 0xef && bytes[at + 1] === 0xbb && bytes[at + 2] === 0xbf ? 3 : 0;
}

/** The ASCII characters String.prototype.trim removes (ECMA-262 WhiteSpace and LineTerminator). */
export function isAsciiSpace(c: number): boolean {
  return c === 32 || (c >= 9 && c <= 13);
}

/** The text of bytes[s, e) as String.prototype.trim leaves it. */
export function trimmedText(bytes: Buffer, s: number, e: number): string {
  let a = s;
  let b = e;
  while (a < b && isAsciiSpace(bytes[a])) a++;
  while (b > a && isAsciiSpace(bytes[b - 1])) b--;
  if (a === b) return '';
  const text = bytes.toString('utf8', a, b);
  // Other white space (no-break spaces, U+FEFF, …) is not ASCII: only then can trim() find more.
  return bytes[a] >= 0x80 || bytes[b - 1] >= 0x80 ? text.trim() : text;
}

/** Whether bytes[s, e) is empty once trimmed, without making a string when it plainly is or is not. */
export function isBlank(bytes: Buffer, s: number, e: number): boolean {
  let a = s;
  let b = e;
  while (a < b && isAsciiSpace(bytes[a])) a++;
  while (b > a && isAsciiSpace(bytes[b - 1])) b--;
  if (a === b) return true;
  if (bytes[a] < 0x80 && bytes[b - 1] < 0x80) return false;
  return bytes.toString('utf8', a, b).trim() === '';
}

/** Whether bytes[s1, e1) and bytes[s2, e2) hold the same bytes. */
export function sameBytes(bytes: Buffer, s1: number, e1: number, s2: number, e2: number): boolean {
  if (e1 - s1 !== e2 - s2) return false;
  for (let i = 0; i < e1 - s1; i++) if (bytes[s1 + i] !== bytes[s2 + i]) return false;
  return true;
}

/**
 * numbers.parseNumber's plain case read from bytes: an optional '-', then digits with at most one decimal
 * mark (`mark`, a character code), at most 15 digits in all. Undefined for anything else, which the caller
 * reads through parseNumber. bytes[s, e) is already trimmed and not empty.
 */
export function plainDecimal(bytes: Buffer, s: number, e: number, mark: number): number | undefined {
  let i = s;
  const negative = bytes[i] === 45;
  if (negative) i++;
  if (i === e || e - i > 16) return undefined;
  let m = 0;
  let digits = 0;
  let fraction = 0;
  let marks = 0;
  for (; i < e; i++) {
    const c = bytes[i];
    if (c >= 48 && c <= 57) {
      m = m * 10 + (c - 48);
      digits++;
      fraction += marks;
    } else if (c === mark && marks === 0) marks = 1;
    else return undefined;
  }
  if (digits === 0 || digits > 15) return undefined;
  const v = m / POW10[fraction];
  return negative ? -v : v;
}

/**
 * A JSON number token at bytes[s…] (RFC 8259 §6): its end, or −1 when the bytes there are not one.
 * The value is Number() of its text, which is what JSON.parse gives.
 */
export function jsonNumberEnd(bytes: Buffer, s: number): number {
  let i = s;
  if (bytes[i] === 45) i++;
  if (bytes[i] === 48) i++;
  else if (bytes[i] >= 49 && bytes[i] <= 57) while (bytes[i] >= 48 && bytes[i] <= 57) i++;
  else return -1;
  if (bytes[i] === 46) {
    i++;
    const at = i;
    while (bytes[i] >= 48 && bytes[i] <= 57) i++;
    if (i === at) return -1;
  }
  if (bytes[i] === 101 || bytes[i] === 69) {
    i++;
    if (bytes[i] === 43 || bytes[i] === 45) i++;
    const at = i;
    while (bytes[i] >= 48 && bytes[i] <= 57) i++;
    if (i === at) return -1;
  }
  return i;
}

/** The value of a JSON number token bytes[s, e). */
export function jsonNumber(bytes: Buffer, s: number, e: number): number {
  return plainDecimal(bytes, s, e, 46) ?? Number(bytes.toString('latin1', s, e));
}
