/**
 * A file of holiday dates the job names, in place of (or beside) a country's public holidays: the same
 * days-and-names shape as calendar/holidays.ts. Two forms:
 * - a plain list, one date a line, optionally followed by a comma, semicolon or tab and the holiday's name;
 *   blank lines and lines starting with # are skipped:
 *       2026-12-25, Christmas Day
 *       2026-12-28
 * - a CSV with a header (the first line does not start with a date): the dates in the column `date` (or
 *   the one the job names), the names in `name` if there is one; read by data/csv.ts, so quoting, delimiters
 *   and ragged rows get the data file's messages.
 * Dates are written YYYY-MM-DD (ISO 8601), the one form no reader can take for another day. A date that
 * is not one, is not a day of the calendar, lies outside 1900–2100 or is listed twice stops the run with
 * the file and row (its 1-based line) named and a fix. The file must be an ordinary file of at most 4 MiB.
 *
 *   parseHolidayFile("2026-12-25, Christmas Day\n2026-12-28\n", 'holidays.csv')
 *     → days {2026-12-25, 2026-12-28}, names {2026-12-25 → "Christmas Day"}, years 2026–2026
 */
import type { HolidayCalendar } from '../calendar/holidays.js';
import { BriefError, type Place } from '../errors.js';
import { FileTooLarge, NotRegularFile, readRegularFile } from '../read-file.js';
import { decodeText, readCsv } from './csv.js';

export interface HolidayFile extends HolidayCalendar {
  /** The first and last year the file holds a date in. */
  years: { from: number; to: number };
}

export interface HolidayFileOptions {
  /** Column of the dates in a file with a header; `date` (any case) when not given. */
  dateColumn?: string;
  /** Column of the names; `name` (any case) if the header has one. */
  nameColumn?: string;
}

/** Larger than any list of holidays: 4 MiB hold some 200,000 dated lines. */
export const HOLIDAY_FILE_MAX_BYTES = 4 * 1024 * 1024;
const YEARS = { from: 1900, to: 2100 };
const DAY = 86_400_000;

/** Reads `path` (`asWritten` is how the job wrote it, for messages) and parses it. */
export function readHolidayFile(path: string, asWritten: string, options: HolidayFileOptions = {}): HolidayFile {
  let bytes: Buffer;
  try {
    bytes = readRegularFile(path, HOLIDAY_FILE_MAX_BYTES);
  } catch (e) {
    const file = { file: asWritten };
    if (e instanceof NotRegularFile) {
      throw new BriefError(
        'holiday-file-not-file',
        `the holiday file is ${e.kind}, not an ordinary file`,
        'point the job at a CSV or text file of dates',
        file,
      );
    }
    if (e instanceof FileTooLarge) {
      throw new BriefError(
        'holiday-file-too-large',
        `the holiday file holds ${e.size} bytes, more than the ${e.limit} a list of holidays needs`,
        'check that the job names the holiday file, not a data file; keep one date a line',
        file,
      );
    }
    const code = (e as NodeJS.ErrnoException).code;
    throw new BriefError(
      'holiday-file-unreadable',
      code === 'ENOENT' ? 'the holiday file does not exist' : `the holiday file cannot be read (${code ?? 'error'})`,
      'check the path: it is relative to the job file',
      file,
    );
  }
  return parseHolidayFile(bytes, asWritten, options);
}

/** The same from bytes already read. */
export function parseHolidayFile(bytes: Uint8Array, asWritten: string, options: HolidayFileOptions = {}): HolidayFile {
  const text = decodeText(bytes, asWritten);
  const lines = text.split(/\r\n|\n|\r/);
  const first = lines.findIndex((l) => l.trim() !== '' && !l.trim().startsWith('#'));
  if (first === -1) throw empty(asWritten);
  const rows = /^\s*"?\d/.test(lines[first])
    ? plainRows(lines)
    : headedRows(bytes, asWritten, options, [',', ';', '\t', '|'].find((d) => lines[first].includes(d)) ?? ',');
  const days = new Set<number>();
  const names = new Map<number, string>();
  const rowOf = new Map<number, number>();
  let from = Number.POSITIVE_INFINITY;
  let to = Number.NEGATIVE_INFINITY;
  for (const r of rows) {
    const place = { file: asWritten, ...r.place };
    const day = parseDay(r.date, place);
    const seen = rowOf.get(day);
    if (seen !== undefined) {
      throw new BriefError(
        'holiday-file-duplicate',
        `${r.date.trim()} is listed twice (rows ${seen} and ${r.place.row})`,
        'keep one row for each date; two holidays on one day go on one row, their names together',
        place,
      );
    }
    rowOf.set(day, r.place.row ?? 0);
    days.add(day);
    if (r.name) names.set(day, r.name);
    const y = new Date(day * DAY).getUTCFullYear();
    from = Math.min(from, y);
    to = Math.max(to, y);
  }
  if (days.size === 0) throw empty(asWritten);
  const sorted = [...days].sort((a, b) => a - b);
  return {
    days: new Set(sorted),
    names: new Map(sorted.filter((d) => names.has(d)).map((d) => [d, names.get(d) as string])),
    years: { from, to },
  };
}

interface Row {
  date: string;
  name: string;
  place: Place;
}

/** One date a line, then maybe a delimiter and a name (quotes around the name are taken off). */
function plainRows(lines: string[]): Row[] {
  const rows: Row[] = [];
  lines.forEach((line, i) => {
    const t = line.trim();
    if (t === '' || t.startsWith('#')) return;
    const cut = t.search(/[,;\t]/);
    const date = unquote(cut === -1 ? t : t.slice(0, cut));
    const name = cut === -1 ? '' : unquote(t.slice(cut + 1));
    rows.push({ date, name, place: { row: i + 1 } });
  });
  return rows;
}

function unquote(s: string): string {
  const t = s.trim();
  return t.length >= 2 && t.startsWith('"') && t.endsWith('"') ? t.slice(1, -1).replace(/""/g, '"').trim() : t;
}

/** A CSV with a header: the date column (and the name column, if any) of every row. */
function headedRows(bytes: Uint8Array, file: string, options: HolidayFileOptions, delimiter: string): Row[] {
  const table = readCsv(bytes, { file, delimiter });
  const find = (want: string, exact: boolean) =>
    table.columns.findIndex((c) => (exact ? c === want : c.toLowerCase() === want.toLowerCase()));
  const dateAt = find(options.dateColumn ?? 'date', options.dateColumn !== undefined);
  if (dateAt === -1) {
    const shown = table.columns.map((c) => `"${c}"`).join(', ');
    throw new BriefError(
      'holiday-file-column',
      `the holiday file has no column "${options.dateColumn ?? 'date'}"; columns found: ${shown}`,
      options.dateColumn
        ? 'name the column of dates as the header writes it'
        : 'call the column of dates "date", or write one date a line with no header',
      table.headerPlace(),
    );
  }
  const nameAt = find(options.nameColumn ?? 'name', options.nameColumn !== undefined);
  if (options.nameColumn !== undefined && nameAt === -1) {
    throw new BriefError(
      'holiday-file-column',
      `the holiday file has no column "${options.nameColumn}"`,
      'name the column of holiday names as the header writes it, or leave it out',
      table.headerPlace(),
    );
  }
  const rows: Row[] = [];
  for (let i = 0; i < table.rowCount; i++) {
    const cell = table.cells[dateAt][i];
    const name = nameAt === -1 ? '' : String(table.cells[nameAt][i] ?? '').trim();
    rows.push({ date: String(cell ?? ''), name, place: table.placeOf(i, table.columns[dateAt]) });
  }
  return rows;
}

function parseDay(text: string, place: Place): number {
  const t = text.trim();
  const m = /^(\d{4})-(\d{2})-(\d{2})$/.exec(t);
  if (!m) {
    throw new BriefError(
      'holiday-file-date',
      t === '' ? 'this row has no date' : `"${t}" is not a date written YYYY-MM-DD`,
      'write each holiday as year-month-day, such as 2026-12-25',
      place,
    );
  }
  const [y, mo, d] = [+m[1], +m[2], +m[3]];
  const ms = Date.UTC(y, mo - 1, d);
  const back = new Date(ms);
  if (back.getUTCMonth() !== mo - 1 || back.getUTCDate() !== d) {
    throw new BriefError(
      'holiday-file-date',
      `${t} is not a day of the calendar`,
      'check the month and the day',
      place,
    );
  }
  if (y < YEARS.from || y > YEARS.to) {
    throw new BriefError(
      'holiday-file-date',
      `${t} lies outside the years ${YEARS.from}–${YEARS.to}`,
      'check the year (four digits, such as 2026)',
      place,
    );
  }
  return ms / DAY;
}

function empty(file: string): BriefError {
  return new BriefError(
    'holiday-file-empty',
    'the holiday file holds no dates',
    'write one holiday a line as YYYY-MM-DD, or leave holidays out of the job',
    { file },
  );
}
