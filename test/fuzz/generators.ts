/**
 * fast-check generators for the fuzz properties: data specs as a job would resolve them, CSV- and JSON-ish
 * text built from dates and numbers in every form the loader accepts (and some it refuses), and random
 * breakage applied on top (cut, insert, repeat, swap a delimiter, a stray quote, NUL, BOM, CR).
 */
import fc from 'fast-check';
import type { DataSpec } from '../../src/vocabulary/settings.js';

/** How every fuzzed data file is named in messages. */
export const FILE = 'data/fuzz.csv';

const DELIMITERS = [',', ';', '\t', '|'];

/** A data spec like the job loader makes; the columns are mostly the ones the generated text uses. */
export function dataSpec(format: 'csv' | 'json'): fc.Arbitrary<DataSpec> {
  return fc.record({
    file: fc.constant(`/nonexistent/${FILE}`),
    fileAsWritten: fc.constant(FILE),
    format: fc.constant(format),
    dateColumn: fc.oneof({ weight: 8, arbitrary: fc.constant('date') }, fc.constantFrom('month', 'Date')),
    valueColumn: fc.oneof({ weight: 8, arbitrary: fc.constant('value') }, fc.constantFrom('amount', '')),
    // Mostly no filter and no groups, as most jobs; sometimes ones the text may or may not have.
    filter: fc.oneof(
      { weight: 4, arbitrary: fc.constant(null) },
      fc.record({
        column: fc.constantFrom('zone', 'nothing'),
        values: fc.constantFrom<string[]>(['A'], ['A', 'B'], ['C']),
      }),
    ),
    groupBy: fc.oneof({ weight: 4, arbitrary: fc.constant(null) }, fc.constantFrom('zone', 'missing')),
    decimal: fc.constantFrom<'.' | ','>('.', ','),
    delimiter: fc.constantFrom(',', ',', ',', ';', '\t', '|', 'tab', '\\t', ''),
  });
}

const pad = (n: number, w = 2): string => String(n).padStart(w, '0');

/** A date written in one of the forms of a kind, at step k from a start. */
const dateKind = fc.constantFrom('month', 'date', 'quarter', 'week', 'hour', 'slash', 'junk');

function writeDate(kind: string, year: number, k: number): string {
  switch (kind) {
    case 'month':
      return `${year + Math.floor(k / 12)}-${pad((k % 12) + 1)}`;
    case 'date': {
      const d = new Date(Date.UTC(year, 0, 1 + k));
      return d.toISOString().slice(0, 10);
    }
    case 'quarter':
      return `${year + Math.floor(k / 4)}-Q${(k % 4) + 1}`;
    case 'week':
      return `${year + Math.floor(k / 52)}-W${pad((k % 52) + 1)}`;
    case 'hour': {
      const d = new Date(Date.UTC(year, 0, 1, k));
      return `${d.toISOString().slice(0, 10)} ${pad(d.getUTCHours())}:00`;
    }
    case 'slash':
      return `${pad((k % 28) + 1)}/${pad((k % 12) + 1)}/${year}`;
    default:
      return `day ${k}`;
  }
}

/** A value cell: mostly plain numbers, sometimes grouped, missing, infinite, huge or text. */
const valueCell = fc.oneof(
  {
    weight: 10,
    arbitrary: fc.double({ min: -1e6, max: 1e6, noNaN: true }).map((v) => String(Math.round(v * 10) / 10)),
  },
  { weight: 2, arbitrary: fc.integer({ min: 1000, max: 9_999_999 }).map((v) => v.toLocaleString('en-US')) },
  { weight: 2, arbitrary: fc.integer({ min: 0, max: 99_999 }).map((v) => `${Math.floor(v / 10)},${v % 10}`) },
  {
    weight: 2,
    arbitrary: fc.constantFrom(
      '',
      'NA',
      'n/a',
      'NaN',
      'null',
      'Infinity',
      '-inf',
      '1e300',
      '1e999',
      '12a',
      '5%',
      '−3',
      '+7',
      '"4"',
      ' 8 ',
    ),
  },
  { weight: 1, arbitrary: fc.string({ maxLength: 6 }) },
);

interface Rows {
  header: string[];
  rows: string[][];
}

/** Values that always read: plain, grouped or missing. */
const cleanValue = fc.oneof(
  { weight: 8, arbitrary: fc.integer({ min: -99_999, max: 99_999 }).map((v) => String(v / 10)) },
  { weight: 1, arbitrary: fc.integer({ min: 1000, max: 9_999_999 }).map((v) => v.toLocaleString('en-US')) },
  { weight: 1, arbitrary: fc.constantFrom('', 'NA') },
);

/**
 * Rows of dates and values. Half the cases are clean (valid dates one or two steps apart, readable values)
 * and so mostly load; the other half mix in every kind of trouble: bad dates, repeats, steps back, junk.
 */
const rows: fc.Arbitrary<Rows> = fc
  .record({
    clean: fc.boolean(),
    kind: dateKind,
    cleanKind: fc.constantFrom('month', 'date', 'quarter', 'week', 'hour'),
    year: fc.integer({ min: 1899, max: 2101 }),
    start: fc.integer({ min: 0, max: 40 }),
    count: fc.integer({ min: 0, max: 40 }),
    values: fc.array(valueCell, { minLength: 40, maxLength: 40 }),
    cleanValues: fc.array(cleanValue, { minLength: 40, maxLength: 40 }),
    zones: fc.array(fc.constantFrom('A', 'B', '', 'C'), { minLength: 40, maxLength: 40 }),
    extraColumn: fc.boolean(),
    headerName: fc.constantFrom('date', 'date', 'Date', 'datum', ''),
    steps: fc.array(fc.integer({ min: -2, max: 3 }), { minLength: 40, maxLength: 40 }),
    cleanSteps: fc.array(fc.constantFrom(1, 1, 1, 2), { minLength: 40, maxLength: 40 }),
  })
  .map((r) => {
    const kind = r.clean ? r.cleanKind : r.kind;
    const values = r.clean ? r.cleanValues : r.values;
    const steps = r.clean ? r.cleanSteps : r.steps;
    const header = [r.clean ? 'date' : r.headerName, 'value', ...(r.extraColumn ? ['zone'] : [])];
    const out: string[][] = [];
    let k = r.start;
    for (let i = 0; i < r.count; i++) {
      const zone = r.clean ? 'A' : r.zones[i];
      out.push([writeDate(kind, r.year, Math.max(0, k)), values[i], ...(r.extraColumn ? [zone] : [])]);
      // Mostly one step on; sometimes a gap, a repeat or a step back (out of order, duplicates).
      k += steps[i] === 0 ? 1 : steps[i];
    }
    return { header, rows: out };
  });

/** One random change to a text: each keeps the loader's job hard without making the text pure noise. */
const breakage = fc.oneof(
  fc.record({ op: fc.constant('cut' as const), at: fc.nat(), length: fc.integer({ min: 1, max: 20 }) }),
  fc.record({
    op: fc.constant('insert' as const),
    at: fc.nat(),
    text: fc.constantFrom(
      '"',
      '""',
      ',',
      ';',
      '\t',
      '\n',
      '\r',
      '\r\n',
      '\u0000',
      '\uFEFF',
      '\uFFFD',
      '\\',
      ' ',
      '\n\n',
      'x',
    ),
  }),
  fc.record({ op: fc.constant('repeat-line' as const), at: fc.nat() }),
  fc.record({ op: fc.constant('truncate' as const), at: fc.nat() }),
  fc.record({ op: fc.constant('swap-delimiter' as const), to: fc.constantFrom(...DELIMITERS) }),
);

type Breakage = typeof breakage extends fc.Arbitrary<infer B> ? B : never;

function applyBreakage(text: string, b: Breakage): string {
  if (text.length === 0) return text;
  switch (b.op) {
    case 'cut': {
      const at = b.at % text.length;
      return text.slice(0, at) + text.slice(at + b.length);
    }
    case 'insert': {
      const at = b.at % (text.length + 1);
      return text.slice(0, at) + b.text + text.slice(at);
    }
    case 'repeat-line': {
      const lines = text.split('\n');
      const at = b.at % lines.length;
      lines.splice(at, 0, lines[at]);
      return lines.join('\n');
    }
    case 'truncate':
      return text.slice(0, b.at % (text.length + 1));
    case 'swap-delimiter':
      return text.replaceAll(',', b.to);
  }
}

/** The delimiter a spec asks for, as the loader reads it. */
function delimiterOf(spec: DataSpec): string {
  return spec.delimiter === 'tab' || spec.delimiter === '\\t' ? '\t' : spec.delimiter || ',';
}

/**
 * CSV text for a spec: mostly with the delimiter the spec names, quoted or not, LF or CRLF, with or without
 * BOM, then zero to three breakages.
 */
export function csvText(spec: DataSpec): fc.Arbitrary<string> {
  return fc
    .record({
      rows,
      delimiter: fc.oneof({ weight: 6, arbitrary: fc.constant(delimiterOf(spec)) }, fc.constantFrom(...DELIMITERS)),
      quoteAll: fc.boolean(),
      crlf: fc.boolean(),
      bom: fc.boolean(),
      breakages: fc.oneof(fc.constant([]), fc.array(breakage, { minLength: 1, maxLength: 3 })),
    })
    .map((r) => {
      const q = (s: string): string => (r.quoteAll ? `"${s.replaceAll('"', '""')}"` : s);
      const lines = [r.rows.header, ...r.rows.rows].map((row) => row.map(q).join(r.delimiter));
      let text = (r.bom ? '\uFEFF' : '') + lines.join(r.crlf ? '\r\n' : '\n') + '\n';
      for (const b of r.breakages) text = applyBreakage(text, b);
      return text;
    });
}

/** A spec and a CSV text written for it. */
export const csvCase: fc.Arbitrary<[string, DataSpec]> = dataSpec('csv').chain((spec) =>
  csvText(spec).map((text): [string, DataSpec] => [text, spec]),
);

/** JSON text: an array of records (numbers as numbers or strings, some nulls, some keys missing), then breakage. */
export const jsonText: fc.Arbitrary<string> = fc
  .record({
    rows,
    numeric: fc.boolean(),
    wrap: fc.constantFrom('array', 'array', 'array', 'object', 'scalar'),
    dropKey: fc.option(fc.nat({ max: 40 })),
    breakages: fc.array(breakage, { maxLength: 2 }),
  })
  .map((r) => {
    const records = r.rows.rows.map((row, i) => {
      const rec: Record<string, unknown> = {};
      r.rows.header.forEach((name, j) => {
        if (r.dropKey === i && j === 1) return;
        const cell = row[j];
        const n = Number(cell);
        rec[name] = r.numeric && j === 1 && cell !== '' && Number.isFinite(n) ? n : cell === '' ? null : cell;
      });
      return rec;
    });
    const body = r.wrap === 'array' ? records : r.wrap === 'object' ? { rows: records } : (records.length as unknown);
    let text = JSON.stringify(body, null, records.length % 2 === 0 ? 2 : undefined);
    for (const b of r.breakages) text = applyBreakage(text, b);
    return text;
  });
