/**
 * Reading a delimited text file into a table of trimmed string cells with a header row, and the checks
 * every data file shares: text that is not UTF-8, an empty file, a header without rows, a missing column
 * (with the columns found and the closest name), a wrong delimiter and ragged rows. Each failure is a
 * BriefError naming the file, the row (its 1-based line; the header is row 1 in a file that starts with
 * it) and a fix.
 *
 * Files whose quoting goes beyond whole quoted fields (quotes inside values, line breaks inside quotes)
 * go through csv-parse, which knows all of RFC 4180. The usual exported series, unquoted or with every
 * field simply quoted, is split directly: there a line is a record and the delimiter splits fields, so the
 * result is the same (the tests check this against csv-parse) at a fraction of the cost on a million rows.
 */

import { createRequire } from 'node:module';
import type { parse as Parse } from 'csv-parse/sync';
import { BriefError, type Place } from '../errors.js';
import { closest } from '../suggest.js';
import { firstInvalidUtf8 } from '../utf8.js';

let parser: typeof Parse | undefined;

/** csv-parse, loaded on first use: most files are split directly, and a worker thread reads none. */
function csvParse(): typeof Parse {
  parser ??= (createRequire(import.meta.url)('csv-parse/sync') as { parse: typeof Parse }).parse;
  return parser;
}

/** A cell as read: text from CSV; text, a number or null (absent or JSON null) from JSON. */
export type Cell = string | number | null;

export interface Table {
  /** Header names, trimmed. */
  columns: string[];
  /** Number of data rows. */
  rowCount: number;
  /** Cells by column: cells[j][i] is column j of data row i (columns keep a million rows cheaper than rows). */
  cells: Cell[][];
  /** Where data row i (0-based) sits in the file, for messages. */
  placeOf(i: number, field?: string): Place;
  /** How messages name data row i: "row 14" or "record 3 (line 14)". */
  nameOf(i: number): string;
  /** The place of the header (CSV) or of the whole array (JSON), for column errors. */
  headerPlace(field?: string): Place;
}

export interface CsvOptions {
  /** The path as written in the job, for messages. */
  file: string;
  /** Field delimiter; ',' when empty. */
  delimiter?: string;
  /** The job's decimal mark, only to sharpen the hint for ragged rows. */
  decimal?: '.' | ',';
}

/** A column the loader needs and what it is for ("date column", "filter column"). */
export interface NeededColumn {
  name: string;
  role: string;
}

const CANDIDATE_DELIMITERS: readonly string[] = [',', ';', '\t', '|'];

export function readCsv(bytes: Uint8Array, options: CsvOptions): Table {
  const file = options.file;
  const delimiter = options.delimiter ? options.delimiter : ',';
  const text = decodeText(bytes, file);
  if (text.trim() === '') {
    throw new BriefError('data-empty', 'the file is empty', 'export the data again with a header row and data rows', {
      file,
    });
  }
  const simple = /\r(?!\n)/.test(text) ? null : splitSimple(text, delimiter);
  const parsed = simple ?? splitWithCsvParse(bytes, delimiter, file);
  const { columns, cells, lines } = parsed;
  const headerLine = parsed.headerLine;
  if (columns.length === 1) checkDelimiter(columns[0], delimiter, file, headerLine);
  if (parsed.ragged) {
    const r = parsed.ragged;
    throw new BriefError(
      'data-ragged',
      `this row has ${r.count} field${r.count === 1 ? '' : 's'} but the header has ${columns.length}`,
      raggedHint(delimiter, options.decimal, r.count > columns.length),
      { file, row: r.line },
    );
  }
  if (lines.length === 0) {
    throw new BriefError(
      'data-no-rows',
      'the file has a header but no data rows',
      'add the data rows below the header',
      {
        file,
        row: headerLine,
      },
    );
  }
  return {
    columns,
    rowCount: lines.length,
    cells,
    placeOf: (i, field) => (field === undefined ? { file, row: lines[i] } : { file, row: lines[i], field }),
    nameOf: (i) => `row ${lines[i]}`,
    headerPlace: (field) => (field === undefined ? { file, row: headerLine } : { file, row: headerLine, field }),
  };
}

export interface Split {
  columns: string[];
  headerLine: number;
  cells: string[][];
  lines: number[];
  ragged: { line: number; count: number } | null;
}

/**
 * Lines and fields of a file whose quoting is simple: every quote encloses a whole field that holds no
 * quote and no line break. Blank lines and rows of empty fields are skipped. Fields are sliced straight
 * into their columns, with no array per row. Null when the file needs the full CSV rules.
 */
export function splitSimple(text: string, delimiter: string): Split | null {
  const out: Split = { columns: [], headerLine: 0, cells: [], lines: [], ragged: null };
  const len = text.length;
  const quotes = text.includes('"');
  const scratch: string[] = [];
  let pos = text.charCodeAt(0) === 0xfeff ? 1 : 0;
  let lineNo = 0;
  let width = -1;
  let cells: string[][] = [];
  while (pos < len) {
    let end = text.indexOf('\n', pos);
    if (end === -1) end = len;
    lineNo++;
    const stop = end > pos && text.charCodeAt(end - 1) === 13 ? end - 1 : end;
    const count = scanLine(text, pos, stop, delimiter, quotes, scratch);
    pos = end + 1;
    if (count === -1) return null;
    let empty = true;
    for (let j = 0; j < count; j++) if (scratch[j] !== '') empty = false;
    if (empty) continue;
    if (width === -1) {
      width = count;
      out.columns = scratch.slice(0, count);
      out.headerLine = lineNo;
      cells = out.columns.map(() => []);
      out.cells = cells;
      continue;
    }
    if (count !== width) {
      out.ragged = { line: lineNo, count };
      break;
    }
    for (let j = 0; j < width; j++) cells[j].push(scratch[j]);
    out.lines.push(lineNo);
  }
  return out;
}

/** The trimmed fields of text[start, stop) into `into`; their count, or −1 when the quoting is not simple. */
function scanLine(
  text: string,
  start: number,
  stop: number,
  delimiter: string,
  quotes: boolean,
  into: string[],
): number {
  const dl = delimiter.length;
  // Blanks around a quoted field are space, and tab unless tab separates the fields.
  const tab = delimiter === '\t' ? -1 : 9;
  let count = 0;
  let p = start;
  for (;;) {
    let q: number;
    let v: string;
    let a = p;
    if (quotes) while (a < stop && isBlank(text.charCodeAt(a), tab)) a++;
    if (quotes && a < stop && text.charCodeAt(a) === 34) {
      const close = text.indexOf('"', a + 1);
      if (close === -1 || close >= stop) return -1;
      v = text.slice(a + 1, close);
      let b = close + 1;
      while (b < stop && isBlank(text.charCodeAt(b), tab)) b++;
      if (b === stop) q = stop;
      else if (text.startsWith(delimiter, b)) q = b;
      else return -1;
    } else {
      q = text.indexOf(delimiter, p);
      if (q === -1 || q > stop) q = stop;
      v = text.slice(p, q);
      if (quotes && v.includes('"')) return -1;
    }
    // trim() only when an end could be white space: most cells have none, and this runs per cell.
    if (v.length > 0 && (needsTrim(v.charCodeAt(0)) || needsTrim(v.charCodeAt(v.length - 1)))) v = v.trim();
    into[count++] = v;
    if (q === stop) return count;
    p = q + dl;
  }
}

function isBlank(c: number, tab: number): boolean {
  return c === 32 || c === tab;
}

function needsTrim(c: number): boolean {
  return c <= 32 || c >= 0x80;
}

/** The same through csv-parse, for files with quotes; line numbers come from the byte offsets it reports. */
export function splitWithCsvParse(bytes: Uint8Array, delimiter: string, file: string): Split {
  const out: Split = { columns: [], headerLine: 0, cells: [], lines: [], ragged: null };
  let buf = Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  if (buf[0] === 0xef && buf[1] === 0xbb && buf[2] === 0xbf) buf = buf.subarray(3);
  // Newlines before `cursor` are already counted in `newlines`.
  let cursor = 0;
  let newlines = 0;
  let width = -1;
  const onRecord = (record: string[], ctx: { bytes: number }): null => {
    if (out.ragged) return null;
    let end = ctx.bytes;
    if (end > 0 && buf[end - 1] === 10) end--;
    for (let p = buf.indexOf(10, cursor); p !== -1 && p < end; p = buf.indexOf(10, p + 1)) newlines++;
    cursor = Math.max(cursor, end);
    let inside = 0;
    let empty = true;
    for (let f = 0; f < record.length; f++) {
      const raw = record[f];
      for (let p = raw.indexOf('\n'); p !== -1; p = raw.indexOf('\n', p + 1)) inside++;
      const v = raw.trim();
      record[f] = v;
      if (v !== '') empty = false;
    }
    if (empty) return null;
    const line = newlines + 1 - inside;
    if (width === -1) {
      width = record.length;
      out.columns = record;
      out.headerLine = line;
      out.cells = record.map(() => []);
    } else if (record.length !== width) {
      out.ragged = { line, count: record.length };
    } else {
      for (let j = 0; j < width; j++) out.cells[j].push(record[j]);
      out.lines.push(line);
    }
    return null;
  };
  try {
    csvParse()(buf, {
      delimiter,
      relax_column_count: true,
      relax_quotes: true,
      trim: true,
      skip_empty_lines: true,
      on_record: onRecord,
    });
  } catch (e) {
    const first = buf.subarray(0, Math.max(0, buf.indexOf(10))).toString('utf8');
    throw quotedDelimiterError(first, delimiter, file) ?? csvSyntaxError(e, file);
  }
  return out;
}

/**
 * A quoted header, "a";"b", read with another delimiter fails as text after a closing quote: name the
 * delimiter it does use instead.
 */
function quotedDelimiterError(header: string, delimiter: string, file: string): BriefError | null {
  for (const d of CANDIDATE_DELIMITERS) {
    if (d === delimiter) continue;
    const sep = d === '|' ? '\\|' : d;
    if (new RegExp(`^\\s*"[^"]*"(\\s*${sep}\\s*"[^"]*")+\\s*$`).test(header)) {
      const value = d === '\t' ? '"\\t"' : `"${d}"`;
      return new BriefError(
        'data-delimiter',
        `the quoted fields of the header are separated by ${delimiterName(d)}, not by ${delimiterName(delimiter)}`,
        `set the data delimiter to ${value} in the job`,
        { file, row: 1 },
      );
    }
  }
  return null;
}

function csvSyntaxError(e: unknown, file: string): BriefError {
  const err = e as { code?: string; lines?: number; message?: string };
  const place: Place = typeof err.lines === 'number' ? { file, row: err.lines } : { file };
  switch (err.code) {
    case 'CSV_QUOTE_NOT_CLOSED':
      return new BriefError(
        'data-csv-syntax',
        'a quoted value is opened but never closed',
        'add the closing " or remove the stray quote (the quote may start several rows earlier)',
        place,
      );
    case 'CSV_INVALID_CLOSING_QUOTE':
    case 'CSV_NON_TRIMABLE_CHAR_AFTER_CLOSING_QUOTE':
      return new BriefError(
        'data-csv-syntax',
        'unexpected text after a closing quote',
        'a quote inside a quoted value must be doubled (""), and the value must end right after its closing quote',
        place,
      );
    default:
      return new BriefError(
        'data-csv-syntax',
        `the file cannot be read as CSV (${err.code ?? 'unknown problem'})`,
        'check the quoting near this row',
        place,
      );
  }
}

function raggedHint(delimiter: string, decimal: '.' | ',' | undefined, tooMany: boolean): string {
  if (tooMany && delimiter === ',' && decimal === ',') {
    return 'numbers with a decimal comma split into two fields in a comma-separated file: quote them ("12,5") or separate fields with ";"';
  }
  const shown = delimiterName(delimiter);
  return tooMany
    ? `a value probably contains the delimiter ${shown}: quote it, or check the delimiter set in the job`
    : 'fill in the missing fields (leave them empty between delimiters, but keep the delimiters)';
}

function delimiterName(d: string): string {
  return d === '\t' ? 'tab' : `"${d}"`;
}

/** One column although the header holds another usual delimiter: the job names the wrong one. */
function checkDelimiter(only: string, delimiter: string, file: string, line: number): void {
  for (const d of CANDIDATE_DELIMITERS) {
    if (d !== delimiter && only.includes(d)) {
      const value = d === '\t' ? '"\\t"' : `"${d}"`;
      throw new BriefError(
        'data-delimiter',
        `only one column was found, with fields separated by ${delimiterName(delimiter)}, but the header contains ${delimiterName(d)}`,
        `set the data delimiter to ${value} in the job`,
        { file, row: line },
      );
    }
  }
}

/**
 * The index of each needed column, or a located error listing the columns found and the closest name.
 * A needed name that appears twice is an error too: which of the two is meant cannot be guessed.
 */
export function requireColumns(table: Table, needed: readonly NeededColumn[]): number[] {
  return needed.map(({ name, role }) => {
    const at = table.columns.indexOf(name);
    if (at === -1) {
      const near = closest(name, table.columns);
      const hint = near
        ? `did you mean "${near}"? Column names are matched exactly, including case`
        : `name one of the columns found as the ${role} in the job`;
      throw new BriefError(
        'data-column-missing',
        `there is no ${role} "${name}"; columns found: ${listColumns(table.columns)}`,
        hint,
        table.headerPlace(name),
      );
    }
    const again = table.columns.indexOf(name, at + 1);
    if (again !== -1) {
      throw new BriefError(
        'data-column-twice',
        `the header names "${name}" twice (columns ${at + 1} and ${again + 1})`,
        'rename one of the two columns so the job can name the one it means',
        table.headerPlace(name),
      );
    }
    return at;
  });
}

function listColumns(columns: readonly string[]): string {
  const shown = columns.slice(0, 12).map((c) => `"${c}"`);
  return columns.length > 12 ? `${shown.join(', ')} and ${columns.length - 12} more` : shown.join(', ');
}

/**
 * The text of a data file: UTF-8 with any byte-order mark removed. Spreadsheets, UTF-16 files, files with
 * NUL bytes and bytes that are not UTF-8 are refused with a located message.
 */
export function decodeText(bytes: Uint8Array, file: string): string {
  const b0 = bytes[0];
  const b1 = bytes[1];
  if ((b0 === 0xff && b1 === 0xfe) || (b0 === 0xfe && b1 === 0xff)) {
    throw notText('the file is saved as UTF-16 text', 'save it as UTF-8 (CSV UTF-8 in most spreadsheet programs)', {
      file,
    });
  }
  if (b0 === 0x50 && b1 === 0x4b && bytes[2] === 3 && bytes[3] === 4) {
    throw notText(
      'the file is a ZIP archive, most likely a spreadsheet workbook (.xlsx or .ods), not CSV or JSON text',
      'export the sheet as CSV (UTF-8) and point the job at that file',
      { file },
    );
  }
  if (b0 === 0xd0 && b1 === 0xcf && bytes[2] === 0x11 && bytes[3] === 0xe0) {
    throw notText(
      'the file is a legacy binary spreadsheet (.xls), not CSV or JSON text',
      'export the sheet as CSV (UTF-8) and point the job at that file',
      { file },
    );
  }
  const nul = bytes.indexOf(0);
  if (nul !== -1) {
    throw notText(
      'the file contains NUL bytes, so it is not a text file',
      'export the data as CSV (UTF-8) or JSON text',
      { file, line: lineAt(bytes, nul) },
    );
  }
  let text: string;
  try {
    text = new TextDecoder('utf-8', { fatal: true }).decode(bytes);
  } catch {
    const at = firstInvalidUtf8(bytes);
    const byte = bytes[at].toString(16).toUpperCase().padStart(2, '0');
    throw notText(
      `byte 0x${byte} is not valid UTF-8 text`,
      'save the file as UTF-8; it is probably in a legacy encoding such as Latin-1 or Windows-1252',
      { file, line: lineAt(bytes, at) },
    );
  }
  return text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
}

function notText(message: string, hint: string, place: Place): BriefError {
  return new BriefError('data-not-text', message, hint, place);
}

function lineAt(bytes: Uint8Array, offset: number): number {
  let line = 1;
  for (let i = 0; i < offset; i++) if (bytes[i] === 10) line++;
  return line;
}
