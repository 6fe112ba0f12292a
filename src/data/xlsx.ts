/**
 * An Excel workbook (.xlsx) read with exceljs's streaming reader, on the thread of source-worker.ts: the
 * sheet's XML is parsed as it is unzipped, row by row, and only the cells of the table are kept, so a large
 * sheet is never held twice (once as the library's model and again as ours). What is read:
 *   - the sheet by name, or by position in the workbook's own order (1 is the first);
 *   - an optional range (B3:E200) and header row; the header is the first row that is not empty;
 *   - header cells left blank (as the cells a merged header spans are) are named by their column letter,
 *     "column C", so a job can still name them;
 *   - rows with no value in the table's columns are skipped (empty trailing rows, spacer rows);
 *   - formulas by the value the spreadsheet application stored with them (nothing is recalculated);
 *   - dates in the date column as the application stores them: a serial number of days (the 1900 date
 *     system, whose serial 60 is the 29 February 1900 that never was, or the 1904 system, as the workbook
 *     says), formatted as a date or not, or text such as 2026-09.
 * Serials become ISO text (2026-09-01, or 2026-09-01T14:00 when any date of the column has a time of day)
 * and go through the same date reader as a CSV file.
 * Source of the date systems: ECMA-376 Part 1 (5th ed., 2016), §18.17.4 "Dates and Times".
 */
import { BriefError } from '../errors.js';
import type { DataSpec } from '../vocabulary/settings.js';
import type { Cell } from './csv.js';
import type { ColumnTable } from './result-table.js';

/** A sheet's table, the sheet's name and where messages should say it was. */
export interface SheetTable extends ColumnTable {
  sheet: string;
}

interface Range {
  c1: number;
  r1: number;
  c2: number;
  r2: number;
}

const DAY_MS = 86_400_000;
/** 1899-12-30 and 1904-01-01, the day each date system counts from (serial 0 in the 1904 system). */
const EPOCH_1900 = Date.UTC(1899, 11, 30);
const EPOCH_1904 = Date.UTC(1904, 0, 1);
/** How many rows that are not empty are searched for the header. */
const HEADER_SEARCH = 100;
/** Days from 1899-12-30 to 1904-01-01. */
const SYSTEM_GAP_DAYS = 1462;

export async function readWorkbook(spec: DataSpec): Promise<SheetTable> {
  const ExcelJS = (await import('exceljs')).default;
  const file = spec.fileAsWritten;
  const reader = new ExcelJS.stream.xlsx.WorkbookReader(spec.file, {
    sharedStrings: 'cache',
    styles: 'cache',
    hyperlinks: 'ignore',
    worksheets: 'emit',
    entries: 'ignore',
  });
  const range = spec.range ? parseRange(spec.range) : null;
  let wanted: string | null = null;
  try {
    const facts = await workbookFacts(spec.file);
    wanted = chooseSheet(spec.sheet ?? null, facts.sheets, file);
    for await (const ws of reader as unknown as AsyncIterable<WorksheetReader>) {
      // A sheet not read is skipped unparsed: the reader drains its entry when the loop moves on.
      if (ws.name !== wanted) {
        releaseSkipped(ws);
        continue;
      }
      // exceljs takes only date1904="1" for the 1904 system, but the schema's boolean may be written "true"
      // (LibreOffice does): its formatted dates are then 1462 days early, the gap between the two systems.
      const theirs = Boolean(
        (reader as unknown as { properties?: { model?: { date1904?: boolean } } }).properties?.model?.date1904,
      );
      const shift = facts.date1904 && !theirs ? SYSTEM_GAP_DAYS * DAY_MS : 0;
      return await readSheet(ws, spec, range, facts.date1904, shift, `${file}, sheet "${wanted}"`, wanted);
    }
  } catch (e) {
    if (e instanceof BriefError) throw e;
    throw new BriefError(
      'data-xlsx-unreadable',
      `the workbook cannot be read (${(e as Error).message})`,
      'check that the file is an Excel workbook (.xlsx); open and save it again in a spreadsheet application',
      { file },
    );
  }
  throw new BriefError(
    'data-xlsx-sheet',
    `the sheet "${wanted}" was not found in the workbook's parts`,
    'open and save the workbook again in a spreadsheet application',
    { file },
  );
}

/**
 * The workbook's date system and its sheets in their own order, from xl/workbook.xml (ECMA-376 Part 1,
 * §18.2.28 workbookPr, §18.2.19 sheet). The whole file is opened as a ZIP archive, but only this part is
 * inflated.
 */
async function workbookFacts(path: string): Promise<{ date1904: boolean; sheets: string[] }> {
  const JSZip = (await import('jszip')).default;
  const { readFile } = await import('node:fs/promises');
  const zip = await JSZip.loadAsync(await readFile(path));
  const part = zip.file('xl/workbook.xml');
  if (!part) throw new Error('no xl/workbook.xml in the archive');
  const xml = await part.async('string');
  const pr = /<(?:\w+:)?workbookPr\b[^>]*>/.exec(xml)?.[0] ?? '';
  const date1904 = /\bdate1904\s*=\s*["'](?:1|true)["']/.test(pr);
  const sheets = [...xml.matchAll(/<(?:\w+:)?sheet\b[^>]*\bname\s*=\s*"([^"]*)"/g)].map((m) => unescapeXml(m[1]));
  if (sheets.length === 0) throw new Error('the workbook lists no sheets');
  return { date1904, sheets };
}

function unescapeXml(s: string): string {
  return s.replace(/&(lt|gt|quot|apos|amp|#\d+|#x[0-9a-fA-F]+);/g, (_, e: string) => {
    if (e[0] === '#') return String.fromCodePoint(e[1] === 'x' ? Number.parseInt(e.slice(2), 16) : Number(e.slice(1)));
    return { lt: '<', gt: '>', quot: '"', apos: "'", amp: '&' }[e] as string;
  });
}

interface WorksheetReader extends AsyncIterable<RowLike> {
  name: string;
  /** What the sheet's rows are read from: the zip entry, or a file stream when the sheet was spooled. */
  iterator?: unknown;
}

/**
 * A sheet the loop skips. When a workbook stores its sheets before the shared strings (LibreOffice does),
 * exceljs 4.4 spools each sheet to a temporary file and, once the loop moves past a sheet, removes that
 * file while the sheet's read stream may still be opening it. The stream then fails with ENOENT and, with
 * no one listening, the error would end the thread. The skipped sheet's stream gets a listener and is
 * closed, so that race ends quietly; a sheet that is read is not affected.
 */
export function releaseSkipped(ws: Pick<WorksheetReader, 'iterator'>): void {
  const stream = ws.iterator as { on?: unknown; destroy?: unknown } | undefined;
  if (!stream || typeof stream.on !== 'function' || typeof stream.destroy !== 'function') return;
  (stream as NodeJS.ReadableStream).on('error', () => {});
  (stream as { destroy(): void }).destroy();
}

interface RowLike {
  number: number;
  values: unknown[];
}

function chooseSheet(sheet: string | number | null, names: string[], file: string): string {
  const found = names.map((n) => `"${n}"`).join(', ');
  if (sheet === null) return names[0];
  if (typeof sheet === 'number') {
    if (sheet >= 1 && sheet <= names.length) return names[sheet - 1];
    throw new BriefError(
      'data-xlsx-sheet',
      `the workbook has ${names.length} sheet${names.length === 1 ? '' : 's'}, so there is no sheet ${sheet}; sheets found: ${found}`,
      'give the sheet by its name, or a number from 1 to the number of sheets',
      { file },
    );
  }
  if (names.includes(sheet)) return sheet;
  const near = names.find((n) => n.trim().toLowerCase() === sheet.trim().toLowerCase());
  throw new BriefError(
    'data-xlsx-sheet',
    `there is no sheet "${sheet}"; sheets found: ${found}`,
    near ? `did you mean "${near}"? Sheet names are matched exactly` : 'name one of the sheets found',
    { file },
  );
}

/** "B3:E200" → 1-based columns and rows, corners in either order. */
export function parseRange(text: string): Range {
  const m = /^\$?([A-Za-z]{1,3})\$?(\d+):\$?([A-Za-z]{1,3})\$?(\d+)$/.exec(text.trim());
  if (!m) throw new Error(`not a range: ${text}`);
  const a = columnNumber(m[1]);
  const b = columnNumber(m[3]);
  const r1 = Number(m[2]);
  const r2 = Number(m[4]);
  return { c1: Math.min(a, b), c2: Math.max(a, b), r1: Math.min(r1, r2), r2: Math.max(r1, r2) };
}

function columnNumber(letters: string): number {
  let n = 0;
  for (const ch of letters.toUpperCase()) n = n * 26 + (ch.charCodeAt(0) - 64);
  return n;
}

export function columnLetters(n: number): string {
  let s = '';
  for (let k = n; k > 0; k = Math.floor((k - 1) / 26)) s = String.fromCharCode(65 + ((k - 1) % 26)) + s;
  return s;
}

async function readSheet(
  ws: WorksheetReader,
  spec: DataSpec,
  range: Range | null,
  date1904: boolean,
  shift: number,
  where: string,
  sheet: string,
): Promise<SheetTable> {
  let header = null as string[] | null;
  let c1 = range?.c1 ?? 1;
  let c2 = range?.c2 ?? 0;
  const firstRow = range?.r1 ?? 1;
  const lastRow = range?.r2 ?? Number.POSITIVE_INFINITY;
  const headerRow = spec.headerRow ?? null;
  let cells: Cell[][] = [];
  let dateAt = -1;
  /** The columns the job reads (date, value, filter, group). */
  let needed: boolean[] = [];
  /** Whether a date cell of the date column was a serial or a formatted date (read as an instant). */
  let instants = false;
  let timeOfDay = false;
  const rowNumbers: number[] = [];
  const setHeader = (values: unknown[]) => {
    if (!range) {
      // Without a range the table spans the header's cells, from the first filled to the last.
      c1 = firstFilled(values);
      c2 = values.length - 1;
    }
    const names: string[] = [];
    for (let c = c1; c <= c2; c++) {
      const v = plain(values[c]);
      const name = v === null ? '' : (v instanceof Date ? v.toISOString().slice(0, 10) : String(v)).trim();
      names.push(name === '' ? `column ${columnLetters(c)}` : name);
    }
    header = names;
    cells = names.map(() => []);
    dateAt = names.indexOf(spec.dateColumn);
    const used = [spec.dateColumn, spec.valueColumn, spec.filter?.column, spec.groupBy];
    needed = names.map((name) => used.includes(name));
  };
  const addRow = (values: unknown[], r: number, names: string[]) => {
    if (isEmptyRow(values, c1, c2)) return;
    for (let c = c1; c <= c2; c++) {
      const j = c - c1;
      if (needed[j] && unstoredFormula(values[c])) {
        throw new BriefError(
          'data-xlsx-formula',
          'the cell holds a formula with no stored value (the workbook was saved by a program that does not calculate)',
          'open the workbook in a spreadsheet application and save it, so every formula keeps its value',
          { file: where, row: r, field: names[j] },
        );
      }
      const v = plain(values[c]);
      if (j === dateAt && (typeof v === 'number' || v instanceof Date)) {
        const ms = v instanceof Date ? v.getTime() + shift : serialToUtcMs(v, date1904, where, r, names[j]);
        instants = true;
        if (ms % DAY_MS !== 0) timeOfDay = true;
        cells[j].push(ms);
      } else {
        cells[j].push(v instanceof Date ? v.toISOString().slice(0, 10) : v);
      }
    }
    rowNumbers.push(r);
  };
  // Without a range or header row, the header is the first row that names the date column (a title or a
  // note above the table is common), looked for in the first HEADER_SEARCH rows that are not empty; failing
  // that, the first row that is not empty, and the rows held meanwhile are its data.
  const searching = range === null && headerRow === null;
  let held: { r: number; values: unknown[] }[] = [];
  const settle = () => {
    setHeader(held[0].values);
    for (const h of held.slice(1)) addRow(h.values, h.r, header as string[]);
    held = [];
  };
  for await (const row of ws) {
    const r = row.number;
    if (r < firstRow || (headerRow !== null && r < headerRow)) continue;
    if (r > lastRow) break;
    const values = row.values;
    if (header !== null) {
      addRow(values, r, header);
      continue;
    }
    if (searching) {
      if (isEmptyRow(values, 1, values.length - 1)) continue;
      if (
        values.some((v) => {
          const p = plain(v);
          return typeof p === 'string' && p.trim() === spec.dateColumn;
        })
      ) {
        held = [];
        setHeader(values);
        continue;
      }
      held.push({ r, values });
      if (held.length >= HEADER_SEARCH) settle();
      continue;
    }
    if (headerRow !== null && r !== headerRow) break;
    if (!range) {
      if (isEmptyRow(values, 1, values.length - 1)) break;
    } else if (isEmptyRow(values, c1, c2)) {
      continue;
    }
    setHeader(values);
  }
  if (header === null && held.length > 0) settle();
  if (header === null) {
    throw new BriefError(
      'data-empty',
      headerRow !== null ? `row ${headerRow} of the sheet holds no header` : 'the sheet (or range) is empty',
      'check the sheet, range and header_row in the job',
      { file: where },
    );
  }
  if (instants) {
    // One written form for the whole column: dates, or date-times when any has a time of day.
    const column = cells[dateAt];
    for (let i = 0; i < column.length; i++) {
      const v = column[i];
      if (typeof v === 'number') column[i] = isoText(v, timeOfDay);
    }
  }
  return { columns: header, cells, rowNumbers: Int32Array.from(rowNumbers), sheet };
}

/** 2026-09-01, or 2026-09-01T14:00 (to the minute; seconds are written when not zero). */
function isoText(ms: number, withTime: boolean): string {
  const rounded = Math.round(ms / 1000) * 1000;
  const iso = new Date(rounded).toISOString();
  if (!withTime) return iso.slice(0, 10);
  return iso.slice(17, 19) === '00' ? iso.slice(0, 16) : iso.slice(0, 19);
}

/**
 * A serial day number to its instant in UTC. 1900 system: serial 1 is 1900-01-01 and serial 60 the
 * nonexistent 1900-02-29 (kept for compatibility with Lotus 1-2-3), so serials from 61 count from
 * 1899-12-30 and those below 60 from 1899-12-31. 1904 system: serial 0 is 1904-01-01.
 * ECMA-376 Part 1, §18.17.4.1. E.g. 45536 → 2024-09-01 (1900 system); 44074 → 2024-09-01 (1904 system).
 */
export function serialToUtcMs(serial: number, date1904: boolean, where: string, row: number, column: string): number {
  const limit = date1904 ? 2_957_003 : 2_958_465; // 9999-12-31
  if (!(serial >= (date1904 ? 0 : 1)) || serial > limit || (!date1904 && Math.floor(serial) === 60)) {
    throw new BriefError(
      'data-date',
      Math.floor(serial) === 60 && !date1904
        ? 'the date serial 60 is 29 February 1900, a day that never was'
        : `${serial} is not a date serial the workbook's date system can hold`,
      'check the date column; dates are best stored as dates or as text such as 2026-09',
      { file: where, row, field: column },
    );
  }
  const base = date1904 ? EPOCH_1904 : serial < 60 ? EPOCH_1900 + DAY_MS : EPOCH_1900;
  return Math.round(base + serial * DAY_MS);
}

/** A formula cell the file holds no value for: nothing to read, since nothing here calculates. */
function unstoredFormula(v: unknown): boolean {
  if (v === null || typeof v !== 'object' || v instanceof Date) return false;
  const o = v as Record<string, unknown>;
  return ('formula' in o || 'sharedFormula' in o) && (o.result === undefined || o.result === null);
}

function firstFilled(values: unknown[]): number {
  for (let c = 1; c < values.length; c++) if (plain(values[c]) !== null) return c;
  return 1;
}

function isEmptyRow(values: unknown[], c1: number, c2: number): boolean {
  for (let c = c1; c <= c2 && c < values.length; c++) {
    const v = plain(values[c]);
    if (v !== null && v !== '') return false;
  }
  return true;
}

/**
 * A cell's value as we read it: a number, text, a Date (a formatted date, which exceljs turns into an
 * instant) or null. Formulas give their stored result; rich text its plain text; a hyperlink its text;
 * #N/A, the spreadsheet's usual mark of a missing value, is empty; other error values stay as text
 * (#DIV/0!), for the value reader to refuse with the row.
 */
function plain(v: unknown): string | number | Date | null {
  if (v === null || v === undefined) return null;
  if (typeof v === 'number' || typeof v === 'string') return typeof v === 'string' && v.trim() === '' ? null : v;
  if (typeof v === 'boolean') return v ? 'TRUE' : 'FALSE';
  if (v instanceof Date) return v;
  if (typeof v === 'object') {
    const o = v as Record<string, unknown>;
    if ('result' in o || 'formula' in o || 'sharedFormula' in o) return plain(o.result);
    if (Array.isArray(o.richText)) return (o.richText as { text: string }[]).map((p) => p.text).join('');
    if ('text' in o) return plain(o.text);
    if ('error' in o) return o.error === '#N/A' ? null : String(o.error);
  }
  return String(v);
}
