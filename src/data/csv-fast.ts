/**
 * The usual CSV file read straight from its bytes into the kept rows' typed arrays (kept-rows.ts), without
 * the file as one string, a string per cell or a table of them: a million rows take a few typed arrays
 * instead of several hundred megabytes.
 *
 * It reads what csv.splitSimple reads (LF or CRLF lines, a one-character delimiter, fields unquoted or
 * wholly quoted with no quote inside, blank lines and rows of empty fields skipped, cells trimmed) by the
 * same rules, and only the columns the job names. Anything else (a lone CR, quotes inside values, a
 * ragged row, a missing column, a cell that does not read) gives null, and load.ts reads the file by the
 * general path, which words the problem. test/data/fast-path.test.ts checks that both give the same
 * result on generated files.
 */
import type { DataSpec } from '../vocabulary/settings.js';
import { bomAt, isAsciiSpace, isBlank, isPlainText, plainDecimal, sameBytes, trimmedText } from './bytes.js';
import { groupIndex, type KeptRows, keepRow, keptRows } from './kept-rows.js';
import { parseNumber } from './numbers.js';

/** Byte ranges of one record's fields (inside their quotes, not yet trimmed). */
interface Fields {
  start: number[];
  end: number[];
  count: number;
  /** Where the next record starts. */
  next: number;
}

export function readCsvFast(bytes: Buffer, spec: DataSpec, delimiter: string): KeptRows | null {
  if (delimiter.length !== 1) return null;
  const d = delimiter.charCodeAt(0);
  if (d !== 9 && (d < 33 || d > 126 || d === 34)) return null;
  if (!isPlainText(bytes)) return null;
  const len = bytes.length;
  let pos = bomAt(bytes, 0);
  if (bomAt(bytes, pos) !== 0) return null;

  const f: Fields = { start: [], end: [], count: 0, next: 0 };
  // The header: the first record with a field that is not blank.
  let columns: string[] | null = null;
  while (pos < len && columns === null) {
    if (!scanRecord(bytes, pos, d, f)) return null;
    pos = f.next;
    if (!blankRecord(bytes, f)) columns = f.start.slice(0, f.count).map((s, j) => trimmedText(bytes, s, f.end[j]));
  }
  if (columns === null || columns.length === 1) return null;
  const width = columns.length;
  const at = (name: string): number => {
    const i = columns.indexOf(name);
    return i !== -1 && columns.indexOf(name, i + 1) === -1 ? i : -1;
  };
  const dateAt = at(spec.dateColumn);
  const valueAt = at(spec.valueColumn);
  const filterAt = spec.filter ? at(spec.filter.column) : -2;
  const groupAt = spec.groupBy !== null ? at(spec.groupBy) : -2;
  if (dateAt < 0 || valueAt < 0 || filterAt === -1 || groupAt === -1) return null;
  const wanted = spec.filter ? new Set(spec.filter.values.map((v) => v.trim())) : null;
  const mark = spec.decimal === ',' ? 44 : 46;

  let capacity = 1;
  for (let i = pos; i < len; i++) if (bytes[i] === 10) capacity++;
  const rows = keptRows(capacity, groupAt >= 0);
  // The last filter and group cells, so that runs of one value are compared, not decoded again.
  let filterS = 0;
  let filterE = -1;
  let kept = false;
  let groupS = 0;
  let groupE = -1;
  let group = -1;
  while (pos < len) {
    if (!scanRecord(bytes, pos, d, f)) return null;
    pos = f.next;
    if (blankRecord(bytes, f)) continue;
    if (f.count !== width) return null;
    rows.rowCount++;
    if (wanted !== null) {
      const s = f.start[filterAt];
      const e = f.end[filterAt];
      if (!sameBytes(bytes, s, e, filterS, filterE)) {
        kept = wanted.has(trimmedText(bytes, s, e));
        filterS = s;
        filterE = e;
      }
      if (!kept) continue;
    }
    if (groupAt >= 0) {
      const s = f.start[groupAt];
      const e = f.end[groupAt];
      if (!sameBytes(bytes, s, e, groupS, groupE)) {
        group = groupIndex(rows, trimmedText(bytes, s, e));
        groupS = s;
        groupE = e;
      }
      if (group < 0) return null;
    }
    const value = cellNumber(bytes, f.start[valueAt], f.end[valueAt], mark, spec.decimal);
    if (value === undefined) return null;
    if (!keepRow(rows, trimmedText(bytes, f.start[dateAt], f.end[dateAt]), value, group)) return null;
  }
  return rows;
}

function blankRecord(bytes: Buffer, f: Fields): boolean {
  for (let j = 0; j < f.count; j++) if (!isBlank(bytes, f.start[j], f.end[j])) return false;
  return true;
}

/** A value cell as numbers.parseNumber reads it; undefined where that finds a problem. */
function cellNumber(bytes: Buffer, s: number, e: number, mark: number, decimal: '.' | ','): number | undefined {
  let a = s;
  let b = e;
  while (a < b && isAsciiSpace(bytes[a])) a++;
  while (b > a && isAsciiSpace(bytes[b - 1])) b--;
  if (a === b) return Number.NaN;
  const plain = plainDecimal(bytes, a, b, mark);
  if (plain !== undefined) return plain;
  const v = parseNumber(trimmedText(bytes, a, b), decimal);
  return typeof v === 'number' ? v : undefined;
}

/** The fields of the record at pos; false where the general path would not split it this way. */
function scanRecord(bytes: Buffer, pos: number, d: number, f: Fields): boolean {
  const len = bytes.length;
  let count = 0;
  let fieldStart = pos;
  let i = pos;
  for (; i < len; i++) {
    const c = bytes[i];
    if (c === d) {
      f.start[count] = fieldStart;
      f.end[count++] = i;
      fieldStart = i + 1;
    } else if (c === 10 || c === 13 || c === 34) break;
  }
  if (i < len && bytes[i] === 34) return scanQuotedRecord(bytes, pos, d, f);
  f.start[count] = fieldStart;
  f.end[count++] = i;
  f.count = count;
  return lineEnd(bytes, i, f);
}

/** Where the record ending at `stop` (LF, CRLF or the end) lets the next start; false for a lone CR. */
function lineEnd(bytes: Buffer, stop: number, f: Fields): boolean {
  if (stop === bytes.length) f.next = stop;
  else if (bytes[stop] === 10) f.next = stop + 1;
  else if (bytes[stop + 1] === 10) f.next = stop + 2;
  else return false;
  return true;
}

/**
 * A record with a quote, by csv.scanLine's rules: a field may be wholly quoted, with blanks (space, and
 * tab unless tab is the delimiter) around the quotes; a quote anywhere else is beyond simple quoting.
 */
function scanQuotedRecord(bytes: Buffer, pos: number, d: number, f: Fields): boolean {
  const len = bytes.length;
  let stop = pos;
  while (stop < len && bytes[stop] !== 10 && bytes[stop] !== 13) stop++;
  if (!lineEnd(bytes, stop, f)) return false;
  const tab = d === 9 ? -1 : 9;
  let count = 0;
  let p = pos;
  for (;;) {
    let q: number;
    let a = p;
    while (a < stop && (bytes[a] === 32 || bytes[a] === tab)) a++;
    if (a < stop && bytes[a] === 34) {
      let close = a + 1;
      while (close < stop && bytes[close] !== 34) close++;
      if (close >= stop) return false;
      let b = close + 1;
      while (b < stop && (bytes[b] === 32 || bytes[b] === tab)) b++;
      if (b === stop) q = stop;
      else if (bytes[b] === d) q = b;
      else return false;
      f.start[count] = a + 1;
      f.end[count++] = close;
    } else {
      q = p;
      while (q < stop && bytes[q] !== d) {
        if (bytes[q] === 34) return false;
        q++;
      }
      f.start[count] = p;
      f.end[count++] = q;
    }
    if (q === stop) break;
    p = q + 1;
  }
  f.count = count;
  return true;
}
