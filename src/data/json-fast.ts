/**
 * The usual JSON data file, a top-level array of flat records ([{"date": "2024-01", "value": 12.5}, …]),
 * read straight from its bytes into the kept rows' typed arrays (kept-rows.ts): no parsed object per
 * record, no string per cell. Only the keys the job names are decoded.
 *
 * It follows RFC 8259's grammar for what it reads (strings with their escapes checked, numbers, null, true,
 * false) and takes a record's cells as json.ts does: a key used twice in a record keeps its last value, a
 * missing key is null, true and false are their JSON text. Anything else (nested values, a record that is
 * not an object, text that is not JSON, a cell that does not read) gives null, and load.ts reads the file
 * by the general path, which words the problem. test/data/fast-path.test.ts checks that both agree.
 */
import type { DataSpec } from '../vocabulary/settings.js';
import { bomAt, isPlainText, jsonNumber, jsonNumberEnd } from './bytes.js';
import { groupIndex, type KeptRows, keepRow, keptRows } from './kept-rows.js';
import { MAX_MAGNITUDE, parseNumber } from './numbers.js';

/** The kinds of value a needed cell can hold. */
const Token = { None: 0, Text: 1, Number: 2, Null: 3, True: 4, False: 5 } as const;
type Token = (typeof Token)[keyof typeof Token];

/** One needed cell of the record being read: its kind and byte range (a string's without its quotes). */
interface NeededCell {
  token: Token;
  s: number;
  e: number;
  escaped: boolean;
}

const DATE = 0;
const VALUE = 1;
const FILTER = 2;
const GROUP = 3;

export function readJsonFast(bytes: Buffer, spec: DataSpec): KeptRows | null {
  if (!isPlainText(bytes)) return null;
  const len = bytes.length;
  let i = bomAt(bytes, 0);
  if (bomAt(bytes, i) !== 0) return null;
  const names = [spec.dateColumn, spec.valueColumn, spec.filter?.column ?? null, spec.groupBy];
  const encoded = names.map((n) => (n === null ? null : Buffer.from(n, 'utf8')));
  const seen = [false, false, spec.filter === null, spec.groupBy === null];
  const wanted = spec.filter ? new Set(spec.filter.values.map((v) => v.trim())) : null;
  const cells: NeededCell[] = names.map(() => ({ token: Token.None, s: 0, e: 0, escaped: false }));
  const read: NeededCell = { token: Token.None, s: 0, e: 0, escaped: false };

  i = space(bytes, i);
  if (bytes[i] !== 91) return null;
  let capacity = 0;
  for (let k = i; k < len; k++) if (bytes[k] === 123) capacity++;
  const rows = keptRows(capacity, spec.groupBy !== null);
  i = space(bytes, i + 1);
  if (bytes[i] === 93) return null; // an empty array: the general path says so
  for (;;) {
    if (bytes[i] !== 123) return null;
    for (const c of cells) c.token = Token.None;
    i = space(bytes, i + 1);
    if (bytes[i] !== 125) {
      for (;;) {
        if (bytes[i] !== 34) return null;
        const keyEnd = stringEnd(bytes, i);
        if (keyEnd < 0) return null;
        const slots = slotsOf(bytes, i, keyEnd, names, encoded);
        i = space(bytes, keyEnd);
        if (bytes[i] !== 58) return null;
        i = space(bytes, i + 1);
        const end = valueEnd(bytes, i, slots !== 0 ? read : null);
        if (end < 0) return null;
        // A key can serve two roles (a filter on the group column): each gets the cell.
        for (let slot = 0; slots !== 0 && slot < cells.length; slot++) {
          if ((slots & (1 << slot)) === 0) continue;
          Object.assign(cells[slot], read);
          seen[slot] = true;
        }
        i = space(bytes, end);
        if (bytes[i] === 44) {
          i = space(bytes, i + 1);
          continue;
        }
        if (bytes[i] === 125) break;
        return null;
      }
    }
    if (!keepRecord(bytes, rows, cells, wanted, spec.decimal)) return null;
    i = space(bytes, i + 1);
    if (bytes[i] === 44) {
      i = space(bytes, i + 1);
      continue;
    }
    if (bytes[i] === 93) break;
    return null;
  }
  if (space(bytes, i + 1) !== len) return null;
  // A named key in no record at all is a missing column.
  if (seen.includes(false)) return null;
  return rows;
}

/** Counts the record and keeps it when the filter does; false where the general path would stop. */
function keepRecord(
  bytes: Buffer,
  rows: KeptRows,
  cells: NeededCell[],
  wanted: Set<string> | null,
  decimal: '.' | ',',
): boolean {
  rows.rowCount++;
  if (wanted !== null && !wanted.has(cellText(bytes, cells[FILTER]))) return true;
  let group = -1;
  if (rows.group !== null) {
    group = groupIndex(rows, cellText(bytes, cells[GROUP]));
    if (group < 0) return false;
  }
  const date = cells[DATE];
  if (date.token !== Token.Text) return false;
  const value = cellValue(bytes, cells[VALUE], decimal);
  if (value === undefined) return false;
  return keepRow(rows, stringOf(bytes, date), value, group);
}

/** load.ts's textOf of a cell: a string as it is, a number as JavaScript writes it, null or missing as ''. */
function cellText(bytes: Buffer, c: NeededCell): string {
  switch (c.token) {
    case Token.Text:
      return stringOf(bytes, c);
    case Token.Number:
      return String(jsonNumber(bytes, c.s, c.e));
    case Token.True:
      return 'true';
    case Token.False:
      return 'false';
    default:
      return '';
  }
}

function cellValue(bytes: Buffer, c: NeededCell, decimal: '.' | ','): number | undefined {
  switch (c.token) {
    case Token.None:
    case Token.Null:
      return Number.NaN;
    case Token.Number: {
      const v = jsonNumber(bytes, c.s, c.e);
      return Math.abs(v) <= MAX_MAGNITUDE ? v : undefined;
    }
    default: {
      const v = parseNumber(cellText(bytes, c), decimal);
      return typeof v === 'number' ? v : undefined;
    }
  }
}

function stringOf(bytes: Buffer, c: NeededCell): string {
  return c.escaped ? JSON.parse(bytes.toString('utf8', c.s - 1, c.e + 1)) : bytes.toString('utf8', c.s, c.e);
}

/** JSON white space (RFC 8259 §2): space, tab, LF, CR. */
function space(bytes: Buffer, at: number): number {
  let i = at;
  for (;;) {
    const c = bytes[i];
    if (c === 32 || c === 10 || c === 13 || c === 9) i++;
    else return i;
  }
}

/** The end (after the closing quote) of the string starting at the quote at `at`; −1 if it is not valid. */
function stringEnd(bytes: Buffer, at: number): number {
  const len = bytes.length;
  for (let i = at + 1; i < len; i++) {
    const c = bytes[i];
    if (c === 34) return i + 1;
    if (c < 0x20) return -1;
    if (c === 92) {
      const x = bytes[++i];
      if (x === 117) {
        for (let k = 1; k <= 4; k++) if (!isHex(bytes[i + k])) return -1;
        i += 4;
      } else if (!(x === 34 || x === 92 || x === 47 || x === 98 || x === 102 || x === 110 || x === 114 || x === 116))
        return -1;
    }
  }
  return -1;
}

function isHex(c: number | undefined): boolean {
  return c !== undefined && ((c >= 48 && c <= 57) || (c >= 65 && c <= 70) || (c >= 97 && c <= 102));
}

/** The needed columns the key bytes[at, end) (the string with its quotes) names, as bits by slot; 0 for none. */
function slotsOf(bytes: Buffer, at: number, end: number, names: (string | null)[], encoded: (Buffer | null)[]): number {
  let escaped = false;
  for (let i = at + 1; i < end - 1; i++) if (bytes[i] === 92) escaped = true;
  const key = escaped ? (JSON.parse(bytes.toString('utf8', at, end)) as string) : null;
  let slots = 0;
  for (let slot = 0; slot < names.length; slot++) {
    const name = encoded[slot];
    if (name === null) continue;
    if (key !== null ? key === names[slot] : equalBytes(bytes, at + 1, end - 1, name)) slots |= 1 << slot;
  }
  return slots;
}

function equalBytes(bytes: Buffer, s: number, e: number, name: Buffer): boolean {
  if (e - s !== name.length) return false;
  for (let k = 0; k < name.length; k++) if (bytes[s + k] !== name[k]) return false;
  return true;
}

/**
 * The end of the value at `at`, recorded into `cell` when the column is needed; −1 for a nested value or
 * text that is not a JSON value.
 */
function valueEnd(bytes: Buffer, at: number, cell: NeededCell | null): number {
  const c = bytes[at];
  let token: Token;
  let end: number;
  let escaped = false;
  if (c === 34) {
    end = stringEnd(bytes, at);
    if (end < 0) return -1;
    token = Token.Text;
    if (cell !== null) for (let i = at + 1; i < end - 1; i++) if (bytes[i] === 92) escaped = true;
  } else if (c === 45 || (c >= 48 && c <= 57)) {
    end = jsonNumberEnd(bytes, at);
    if (end < 0) return -1;
    token = Token.Number;
  } else if (word(bytes, at, 'null')) {
    end = at + 4;
    token = Token.Null;
  } else if (word(bytes, at, 'true')) {
    end = at + 4;
    token = Token.True;
  } else if (word(bytes, at, 'false')) {
    end = at + 5;
    token = Token.False;
  } else return -1;
  if (cell !== null) {
    cell.token = token;
    cell.s = token === Token.Text ? at + 1 : at;
    cell.e = token === Token.Text ? end - 1 : end;
    cell.escaped = escaped;
  }
  return end;
}

function word(bytes: Buffer, at: number, w: string): boolean {
  for (let k = 0; k < w.length; k++) if (bytes[at + k] !== w.charCodeAt(k)) return false;
  return true;
}
