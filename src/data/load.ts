/**
 * The data stage: one data file in, one regular series per group out. Reads the CSV or JSON file, keeps the
 * rows the filter names, splits them by the group column (groups in first-seen order), reads dates and
 * values, settles the frequency (the job's, or inferred from the dates), and lays each group on a regular
 * calendar index from its first to its last period. Periods without a row, and rows without a value,
 * become NaN and are listed as gaps; rows out of date order are placed by date with a note; two rows for
 * one period are an error, since summing or averaging them is the job's decision, not ours.
 * Every problem is a BriefError naming the file, the row and the column, with a fix.
 */
import { readFileSync } from 'node:fs';
import { BriefError } from '../errors.js';
import { closest } from '../suggest.js';
import { type Frequency, isoWeekOf, isoWeeksInYear, startOf } from '../vocabulary/period-index.js';
import type { DataSpec } from '../vocabulary/settings.js';
import { asBuffer } from './bytes.js';
import { type Cell, type NeededColumn, readCsv, requireColumns, type Table } from './csv.js';
import { readCsvFast } from './csv-fast.js';
import {
  ACCEPTED_FORMATS,
  type DateKind,
  daysInMonth,
  fitsFrequency,
  inferFrequencyOf,
  isLeapYear,
  KIND_EXAMPLES,
  KIND_FREQUENCY,
  type ParsedPeriod,
  parsePeriod,
} from './dates.js';
import { sha256Hex } from './hash.js';
import { readJson } from './json.js';
import { readJsonFast } from './json-fast.js';
import { assemble } from './kept-rows.js';
import { MAX_MAGNITUDE, parseNumber } from './numbers.js';
import { type LoadedGroup, pad2, periodOrdinal, periodTexts, placedGroup, placeRows } from './place.js';
import { readSource } from './sources.js';

export { type LoadedGroup, periodOrdinal, periodTexts };

export interface LoadedData {
  /** The path as written in the job. */
  file: string;
  /** SHA-256 hex of the file's bytes; for a database, of the query and the rows read (result-table.ts). */
  sha256: string;
  /** A workbook's sheet, as "sheet NAME"; absent for other sources. */
  source?: string;
  /** Data rows in the file (header and blank lines not counted), before any filter. */
  rows: number;
  frequency: Frequency;
  groups: LoadedGroup[];
  /**
   * Groups whose own rows are wrong (two rows in one period, no usable value), each with its error, in the
   * order first seen: in a file of many groups, one bad group fails its own brief only. Absent or empty
   * when every group loaded; a file whose every group is wrong fails as a whole instead.
   */
  failedGroups?: { key: string; error: BriefError }[];
}

/**
 * Reads and loads the source the spec names: a CSV or JSON file here, a workbook, a SQLite file or a
 * PostgreSQL query through sources.ts. `period` is the reporting period, for a query's parameters.
 */
export function loadData(spec: DataSpec, frequencyHint: Frequency | null, period: string | null = null): LoadedData {
  if (spec.format !== 'csv' && spec.format !== 'json') {
    const read = readSource(spec, period);
    const loaded = loadTable(read.table, spec, frequencyHint, read.sha256);
    return read.source === undefined ? loaded : { ...loaded, source: read.source };
  }
  let bytes: Buffer;
  try {
    bytes = readFileSync(spec.file);
  } catch (e) {
    throw unreadable(e, spec);
  }
  return loadDataFromBytes(bytes, spec, frequencyHint);
}

/** The same from bytes already read; spec.file is not opened, messages name spec.fileAsWritten. */
export function loadDataFromBytes(bytes: Uint8Array, spec: DataSpec, frequencyHint: Frequency | null): LoadedData {
  return loadDataFast(bytes, spec, frequencyHint) ?? loadDataGeneral(bytes, spec, frequencyHint);
}

/**
 * The usual file read from its bytes into typed arrays (csv-fast.ts, json-fast.ts), or null whenever that
 * reading meets anything but plainly good data; then the general path reads it and words the problem.
 */
export function loadDataFast(bytes: Uint8Array, spec: DataSpec, frequencyHint: Frequency | null): LoadedData | null {
  const buf = asBuffer(bytes);
  const rows =
    spec.format === 'json' ? readJsonFast(buf, spec) : readCsvFast(buf, spec, normaliseDelimiter(spec.delimiter));
  const done = rows === null ? null : assemble(rows, spec, frequencyHint);
  if (rows === null || done === null) return null;
  const file = spec.fileAsWritten;
  return { file, sha256: sha256Hex(bytes), rows: rows.rowCount, frequency: done.frequency, groups: done.groups };
}

/** Every file through a table of cells, with every check and its message (the reference for the fast path). */
export function loadDataGeneral(bytes: Uint8Array, spec: DataSpec, frequencyHint: Frequency | null): LoadedData {
  const file = spec.fileAsWritten;
  const table =
    spec.format === 'json'
      ? readJson(bytes, { file })
      : readCsv(bytes, { file, delimiter: normaliseDelimiter(spec.delimiter), decimal: spec.decimal });
  return loadTable(table, spec, frequencyHint, sha256Hex(bytes));
}

/**
 * A table of cells, from any source (a CSV or JSON file, a workbook's sheet, a query's result), to the
 * series of each group; `sha256` is what the provenance shows (a file's bytes, or a query's rows).
 */
export function loadTable(table: Table, spec: DataSpec, frequencyHint: Frequency | null, sha256: string): LoadedData {
  const file = spec.fileAsWritten;

  const needed: NeededColumn[] = [
    { name: spec.dateColumn, role: 'date column' },
    { name: spec.valueColumn, role: 'value column' },
  ];
  if (spec.filter) needed.push({ name: spec.filter.column, role: 'filter column' });
  if (spec.groupBy !== null) needed.push({ name: spec.groupBy, role: 'group column' });
  const at = requireColumns(table, needed);
  const dateAt = at[0];
  const valueAt = at[1];

  const kept = filterRows(table, spec, spec.filter ? at[2] : -1);
  const groups = splitGroups(table, kept, spec.groupBy, spec.groupBy !== null ? at[at.length - 1] : -1);
  const dates = parseDates(table, kept, dateAt, spec.dateColumn);
  const frequency = settleFrequency(table, kept, dates, frequencyHint, spec.dateColumn);
  const midnightNote =
    dates.kind === 'datetime' && frequency !== 'hourly'
      ? 'every date-time is at midnight, so they were read as dates'
      : null;

  const loaded: LoadedGroup[] = [];
  const failedGroups: { key: string; error: BriefError }[] = [];
  for (const [key, rows] of groups) {
    let group: LoadedGroup;
    try {
      group = layOut(table, rows, dates.utcMs, frequency, valueAt, spec, key);
    } catch (e) {
      if (key === null || !(e instanceof BriefError)) throw e;
      failedGroups.push({ key, error: e });
      continue;
    }
    if (midnightNote) group.notes.unshift(midnightNote);
    loaded.push(group);
  }
  if (loaded.length === 0 && failedGroups.length > 0) throw failedGroups[0].error;
  const done: LoadedData = { file, sha256, rows: table.rowCount, frequency, groups: loaded };
  if (failedGroups.length > 0) done.failedGroups = failedGroups;
  return done;
}

function unreadable(e: unknown, spec: DataSpec): BriefError {
  const code = (e as { code?: string }).code;
  const file = spec.fileAsWritten;
  if (code === 'ENOENT') {
    return new BriefError(
      'data-file-missing',
      'the data file does not exist',
      "check the path in the job; it is relative to the job file's folder",
      { file },
    );
  }
  if (code === 'EISDIR') {
    return new BriefError('data-file-missing', 'the data path is a folder', 'name the data file itself', { file });
  }
  return new BriefError(
    'data-file-unreadable',
    `the data file cannot be read (${code ?? 'unknown error'})`,
    'check the file permissions',
    { file },
  );
}

function normaliseDelimiter(d: string): string {
  if (d === '\\t' || d.toLowerCase() === 'tab') return '\t';
  return d === '' ? ',' : d;
}

/** Cell text for comparisons: numbers as JavaScript writes them, null as empty. */
function textOf(c: Cell): string {
  return c === null ? '' : typeof c === 'number' ? String(c) : c;
}

function filterRows(table: Table, spec: DataSpec, filterAt: number): number[] {
  const n = table.rowCount;
  if (!spec.filter) {
    const all = new Array<number>(n);
    for (let i = 0; i < n; i++) all[i] = i;
    return all;
  }
  const wanted = new Set(spec.filter.values.map((v) => v.trim()));
  const kept: number[] = [];
  for (let i = 0; i < n; i++) if (wanted.has(textOf(table.cells[filterAt][i]))) kept.push(i);
  if (kept.length === 0) {
    const found = distinctValues(table, filterAt, 10);
    const near = spec.filter.values.map((v) => closest(v, found)).find((v) => v !== null);
    throw new BriefError(
      'data-filter-empty',
      `no row has ${quoteList(spec.filter.values)} in the filter column; values found: ${quoteList(found)}${found.length === 10 ? ', …' : ''}`,
      near ? `did you mean "${near}"? Filter values are matched exactly` : 'use one of the values found in the filter',
      table.headerPlace(spec.filter.column),
    );
  }
  return kept;
}

function distinctValues(table: Table, at: number, limit: number): string[] {
  const seen = new Set<string>();
  for (const cell of table.cells[at]) {
    seen.add(textOf(cell));
    if (seen.size >= limit) break;
  }
  return [...seen];
}

function quoteList(values: readonly string[]): string {
  return values.map((v) => `"${v}"`).join(', ');
}

function splitGroups(
  table: Table,
  kept: number[],
  groupBy: string | null,
  groupAt: number,
): Map<string | null, number[]> {
  const groups = new Map<string | null, number[]>();
  if (groupBy === null) {
    groups.set(null, kept);
    return groups;
  }
  for (const i of kept) {
    const key = textOf(table.cells[groupAt][i]);
    if (key === '') {
      throw new BriefError(
        'data-group-empty',
        'the group column is empty in this row',
        'fill in the group, or leave the row out with a filter',
        table.placeOf(i, groupBy),
      );
    }
    let list = groups.get(key);
    if (!list) {
      list = [];
      groups.set(key, list);
    }
    list.push(i);
  }
  return groups;
}

/** The dates of the kept rows: their instants by table row, and the one written kind they share. */
interface DateColumn {
  kind: DateKind;
  utcMs: Float64Array;
}

function parseDates(table: Table, kept: number[], dateAt: number, column: string): DateColumn {
  const utcMs = new Float64Array(table.rowCount);
  let kind: DateKind | null = null;
  let first = -1;
  for (const i of kept) {
    const cell = table.cells[dateAt][i];
    const p = typeof cell === 'string' ? parsePeriod(cell) : null;
    if (p === null) {
      const { problem, hint } = dateProblem(textOf(cell), typeof cell === 'number');
      throw new BriefError('data-date', problem, hint, table.placeOf(i, column));
    }
    if (kind === null) {
      kind = p.kind;
      first = i;
    } else if (p.kind !== kind) {
      const was = textOf(table.cells[dateAt][first]);
      throw new BriefError(
        'data-date-mixed',
        `"${textOf(cell)}" is ${KIND_EXAMPLES[p.kind]}, but ${table.nameOf(first)} has "${was}", ${KIND_EXAMPLES[kind]}`,
        'write every date of the column in the same format',
        table.placeOf(i, column),
      );
    }
    utcMs[i] = p.utcMs;
  }
  return { kind: kind ?? 'date', utcMs };
}

const DATE_SHAPE = /^(\d{4})-(\d{2})-(\d{2})$/;
const MONTH_SHAPE = /^(\d{4})-(\d{2})$/;
const WEEK_SHAPE = /^(\d{4})-?[Ww](\d{2})(?:-?\d)?$/;

/** Why a date cell was refused, and what to write instead. */
export function dateProblem(text: string, isNumber: boolean): { problem: string; hint: string } {
  const formats = `write dates as ${ACCEPTED_FORMATS}`;
  const t = text.trim();
  if (t === '') return { problem: 'the date is empty', hint: 'give every row a date, or remove the row' };
  if (isNumber) {
    return {
      problem: `${t} is a number, not a date`,
      hint: `${formats}; spreadsheet date serials must be exported as dates`,
    };
  }
  const d = DATE_SHAPE.exec(t);
  if (d) {
    const [y, m, day] = [Number(d[1]), Number(d[2]), Number(d[3])];
    if (m < 1 || m > 12) return { problem: `"${t}" has no month ${m}`, hint: 'months run from 01 to 12' };
    if (day < 1 || day > daysInMonth(y, m)) {
      const leap = m === 2 ? (isLeapYear(y) ? ' (a leap year)' : ' (not a leap year)') : '';
      return {
        problem: `"${t}" is not a real date: ${y}-${d[2]} has ${daysInMonth(y, m)} days${leap}`,
        hint: 'check the day and the month',
      };
    }
  }
  const month = MONTH_SHAPE.exec(t);
  if (month && (Number(month[2]) < 1 || Number(month[2]) > 12)) {
    return { problem: `"${t}" has no month ${Number(month[2])}`, hint: 'months run from 01 to 12' };
  }
  const w = WEEK_SHAPE.exec(t);
  if (w) {
    const weeks = isoWeeksInYear(Number(w[1]));
    return {
      problem: `"${t}" is not a real week: ISO year ${w[1]} has ${weeks} weeks`,
      hint: 'ISO weeks run from W01 to W52, or W53 in long years',
    };
  }
  if (/^\d{1,2}[./]\d{1,2}[./]\d{2,4}$/.test(t)) {
    return {
      problem: `"${t}" is not an ISO date`,
      hint: `${formats}; the order of day and month in "${t}" cannot be told apart`,
    };
  }
  return { problem: `"${t}" is not a date`, hint: formats };
}

function settleFrequency(
  table: Table,
  kept: number[],
  dates: DateColumn,
  hint: Frequency | null,
  column: string,
): Frequency {
  if (hint === null) {
    const list = new Float64Array(kept.length);
    for (let k = 0; k < kept.length; k++) list[k] = dates.utcMs[kept[k]];
    return inferFrequencyOf(dates.kind, list);
  }
  // One record reused for every row: this runs once per row.
  const p: ParsedPeriod = { kind: dates.kind, utcMs: 0, frequency: KIND_FREQUENCY[dates.kind] };
  for (const i of kept) {
    p.utcMs = dates.utcMs[i];
    if (!fitsFrequency(p, hint)) {
      const what = p.kind === 'datetime' ? 'a date and time not at midnight' : KIND_EXAMPLES[p.kind];
      throw new BriefError(
        'data-date-frequency',
        `"${textOf(table.cells[table.columns.indexOf(column)][i])}" is ${what}, which does not fit ${hint} data`,
        `change the job's frequency to ${p.frequency}, or leave it out to infer it from the dates`,
        table.placeOf(i, column),
      );
    }
  }
  return hint;
}

function layOut(
  table: Table,
  rows: number[],
  utcMs: Float64Array,
  frequency: Frequency,
  valueAt: number,
  spec: DataSpec,
  key: string | null,
): LoadedGroup {
  const n = rows.length;
  const ordinals = new Float64Array(n);
  const values = new Float64Array(n);
  for (let k = 0; k < n; k++) {
    const i = rows[k];
    ordinals[k] = periodOrdinal(frequency, utcMs[i]);
    values[k] = cellValue(table, i, valueAt, spec);
  }
  const p = placeRows(ordinals, values);
  if (!p.ok) {
    throw p.problem === 'span'
      ? spanError(table, rows, ordinals, frequency, spec.dateColumn, p.length)
      : duplicateError(table, rows[p.first], rows[p.second], frequency, p.ordinal, spec);
  }
  if (p.missing === n) {
    throw new BriefError(
      'data-no-values',
      `${key === null ? 'the file' : `group "${key}"`} has no usable values: every value cell is empty or NA`,
      'check that the value column is the one holding the measurements',
      table.placeOf(rows[0], spec.valueColumn),
    );
  }
  return placedGroup(key, frequency, p, n);
}

function cellValue(table: Table, i: number, valueAt: number, spec: DataSpec): number {
  const cell = table.cells[valueAt][i];
  if (cell === null) return Number.NaN;
  if (typeof cell === 'number') {
    if (Math.abs(cell) <= MAX_MAGNITUDE) return cell;
    throw new BriefError(
      'data-number',
      `${cell} is too large to be a value (more than 1e15 in size)`,
      'check that the value column holds measurements, not identifiers or dates',
      table.placeOf(i, spec.valueColumn),
    );
  }
  const v = parseNumber(cell, spec.decimal);
  if (typeof v === 'number') return v;
  throw new BriefError('data-number', v.problem, v.hint, table.placeOf(i, spec.valueColumn));
}

/** How a period reads in messages: 2024-03, 2024-Q1, 2024-W09, 2024-03-05 or 2024-03-05T13:00Z. */
export function periodLabel(frequency: Frequency, ordinal: number): string {
  switch (frequency) {
    case 'monthly':
      return `${Math.floor(ordinal / 12)}-${pad2((ordinal % 12) + 1)}`;
    case 'quarterly':
      return `${Math.floor(ordinal / 4)}-Q${(ordinal % 4) + 1}`;
    case 'weekly': {
      const w = isoWeekOf(startOf('weekly', ordinal));
      return `${w.year}-W${pad2(w.week)}`;
    }
    default:
      return periodTexts(frequency, ordinal, 1)[0];
  }
}

function duplicateError(
  table: Table,
  firstRow: number,
  secondRow: number,
  frequency: Frequency,
  ordinal: number,
  spec: DataSpec,
): BriefError {
  const dateAt = table.columns.indexOf(spec.dateColumn);
  const a = textOf(table.cells[dateAt][firstRow]);
  const b = textOf(table.cells[dateAt][secondRow]);
  const written = a === b ? `"${a}"` : `"${a}" and "${b}"`;
  // A column whose values differ between the two rows probably tells the series apart.
  const valueAt = table.columns.indexOf(spec.valueColumn);
  const apart = table.columns.find(
    (_, j) => j !== dateAt && j !== valueAt && textOf(table.cells[j][firstRow]) !== textOf(table.cells[j][secondRow]),
  );
  const hint = apart
    ? `the file seems to hold several series: split it by "${apart}" with a group column, keep one with a filter, or aggregate the rows first`
    : 'aggregate the rows to one per period first, or keep one series with a filter';
  return new BriefError(
    'data-duplicate',
    `${table.nameOf(firstRow)} and ${table.nameOf(secondRow)} both fall in ${frequency} period ${periodLabel(frequency, ordinal)} (${written})`,
    hint,
    table.placeOf(secondRow, spec.dateColumn),
  );
}

function spanError(
  table: Table,
  rows: number[],
  ordinals: Float64Array,
  frequency: Frequency,
  column: string,
  length: number,
): BriefError {
  const order = Float64Array.from(ordinals).sort();
  const median = order[order.length >> 1];
  let far = 0;
  for (let k = 1; k < ordinals.length; k++) {
    if (Math.abs(ordinals[k] - median) > Math.abs(ordinals[far] - median)) far = k;
  }
  const from = periodLabel(frequency, order[0]);
  const to = periodLabel(frequency, order[order.length - 1]);
  return new BriefError(
    'data-span',
    `the dates run from ${from} to ${to}, ${length} ${frequency} periods for only ${rows.length} rows; this row lies far from the others`,
    'check this row for a mistyped year',
    table.placeOf(rows[far], column),
  );
}
