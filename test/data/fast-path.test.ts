/**
 * The fast readers (src/data/csv-fast.ts, json-fast.ts) against the general path of load.ts, which reads
 * every file through csv-parse or JSON.parse and a table of cells: whenever the fast path returns a
 * result, the general path must return the same one, value for value (NaN and the sign of zero included),
 * with the same dates, gaps, notes, row count and frequency. Where the fast path declines (null), the
 * loader uses the general path, so the messages for bad files are the general path's by construction.
 *
 * The files are generated: clean ones in every shape the fast path reads (delimiters, quoting, blanks,
 * CRLF, byte-order marks, blank lines, groups, filters, every date form, decimal marks, missing and
 * grouped numbers, non-ASCII text), and the fuzz generators' broken ones (test/fuzz/generators.ts).
 * Seeded, so every run tests the same files.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { type LoadedData, loadDataFast, loadDataGeneral } from '../../src/data/load.js';
import { BriefError } from '../../src/errors.js';
import type { Frequency } from '../../src/vocabulary/period-index.js';
import type { DataSpec } from '../../src/vocabulary/settings.js';
import { csvCase, dataSpec, jsonText } from '../fuzz/generators.js';
import { spec } from './spec.js';

const enc = (s: string): Uint8Array => new TextEncoder().encode(s);

/** Everything a caller can read of a result, with the lazily made dates made. */
function plain(d: LoadedData) {
  return {
    ...d,
    groups: d.groups.map((g) => ({
      key: g.key,
      index: g.series.index,
      values: Array.from(g.series.values),
      dates: [...g.dates],
      gaps: g.gaps,
      notes: g.notes,
    })),
  };
}

function general(bytes: Uint8Array, spec: DataSpec, hint: Frequency | null): LoadedData | BriefError {
  try {
    return loadDataGeneral(bytes, spec, hint);
  } catch (e) {
    if (e instanceof BriefError) return e;
    throw e;
  }
}

/** Compares both paths on one file; true when the fast path gave a result. */
function agree(bytes: Uint8Array, spec: DataSpec, hint: Frequency | null): boolean {
  const fast = loadDataFast(bytes, spec, hint);
  if (fast === null) return false;
  const ref = general(bytes, spec, hint);
  if (ref instanceof BriefError)
    throw new Error(`the fast path read a file the general path refuses: ${ref.oneLine()}`);
  expect(plain(fast)).toEqual(plain(ref));
  // The sign of zero too (toEqual compares numbers with Object.is; checked here on the typed arrays themselves).
  for (let j = 0; j < fast.groups.length; j++) {
    const a = fast.groups[j].series.values;
    const b = ref.groups[j].series.values;
    for (let i = 0; i < a.length; i++)
      if (!Object.is(a[i], b[i])) throw new Error(`value ${i} differs: ${a[i]} ${b[i]}`);
  }
  return true;
}

const pad = (n: number, w = 2): string => String(n).padStart(w, '0');

type Kind = 'month' | 'date' | 'quarter' | 'week' | 'hour' | 'midnight';

function dateText(kind: Kind, k: number, variant: number): string {
  switch (kind) {
    case 'month':
      return `${2001 + Math.floor(k / 12)}-${pad((k % 12) + 1)}`;
    case 'quarter':
      return variant % 2 ? `${2001 + Math.floor(k / 4)}Q${(k % 4) + 1}` : `${2001 + Math.floor(k / 4)}-Q${(k % 4) + 1}`;
    case 'week':
      return `${2001 + Math.floor(k / 52)}-W${pad((k % 52) + 1)}`;
    case 'date':
      return new Date(Date.UTC(2001, 0, 1 + k)).toISOString().slice(0, 10);
    case 'midnight':
      return `${new Date(Date.UTC(2001, 0, 1 + k)).toISOString().slice(0, 10)} 00:00`;
    case 'hour': {
      const iso = new Date(Date.UTC(2001, 0, 1, k)).toISOString();
      return [`${iso.slice(0, 16)}`, `${iso.slice(0, 10)} ${iso.slice(11, 16)}`, `${iso.slice(0, 16)}Z`, iso][
        variant % 4
      ];
    }
  }
}

/** Value cells that read under both decimal marks: plain, missing, signed, long, padded. */
const anyMarkValue = fc.constantFrom(
  '',
  'NA',
  'n/a',
  'NaN',
  'null',
  '-0',
  '0.000',
  '+7',
  '−3',
  '1e3',
  '999999999999999',
  ' 8 ',
  '\u00a08',
);
/** Forms that read under one decimal mark only: grouped thousands, fractions without a whole part, … */
const pointValue = fc.constantFrom(
  '-.5',
  '5.',
  '1,234.5',
  '1 234.5',
  '12,34,567',
  '0.1234567890123456789',
  '123456789012.3456',
  '-0.000000000000000000001',
);
const commaValue = fc.constantFrom(
  '-,5',
  '5,',
  '1.234,5',
  '1 234,5',
  '12,5',
  '123456789012,3456',
  '-0,000000000000000000001',
);

function valueText(decimal: '.' | ','): fc.Arbitrary<string> {
  return fc.oneof(
    {
      weight: 30,
      arbitrary: fc.integer({ min: -999_999, max: 999_999 }).map((v) => String(v / 100).replace('.', decimal)),
    },
    {
      weight: 4,
      arbitrary: fc.double({ min: -1e6, max: 1e6, noNaN: true }).map((v) => String(v).replace('.', decimal)),
    },
    { weight: 3, arbitrary: anyMarkValue },
    { weight: 2, arbitrary: decimal === '.' ? pointValue : commaValue },
  );
}

interface CleanCase {
  text: string;
  spec: DataSpec;
  hint: Frequency | null;
}

const KIND_FREQUENCY: Record<Kind, Frequency> = {
  month: 'monthly',
  quarter: 'quarterly',
  week: 'weekly',
  date: 'daily',
  hour: 'hourly',
  midnight: 'daily',
};

/** CSV files the fast path is meant to read, in every shape it reads, with now and then a problem. */
const cleanCsv: fc.Arbitrary<CleanCase> = fc
  .record({
    kind: fc.constantFrom<Kind>('month', 'date', 'quarter', 'week', 'hour', 'midnight'),
    variant: fc.nat(7),
    count: fc.integer({ min: 1, max: 60 }),
    steps: fc.array(fc.constantFrom(1, 1, 1, 1, 2, 3), { minLength: 60, maxLength: 60 }),
    values: fc.array(fc.tuple(valueText('.'), valueText(',')), { minLength: 60, maxLength: 60 }),
    // Now and then one cell that reads under neither mark: both paths must then refuse the file.
    bad: fc.oneof({ weight: 6, arbitrary: fc.constant(null) }, fc.nat(59)),
    groups: fc.array(fc.constantFrom('North', 'Zürich', 'São Paulo', 'b'), { minLength: 60, maxLength: 60 }),
    shuffle: fc.boolean(),
    delimiter: fc.constantFrom(',', ';', '\t', '|'),
    decimal: fc.constantFrom<'.' | ','>('.', ','),
    quoting: fc.constantFrom('none', 'all', 'some', 'blanks'),
    spaces: fc.boolean(),
    crlf: fc.boolean(),
    bom: fc.boolean(),
    trailingNewline: fc.boolean(),
    blankLines: fc.array(fc.nat(60), { maxLength: 3 }),
    extra: fc.boolean(),
    grouped: fc.boolean(),
    filter: fc.option(fc.constantFrom(['North'], ['Zürich', 'b'], ['North', 'b', 'São Paulo'], ['nowhere']), {
      freq: 2,
    }),
    useHint: fc.boolean(),
    order: fc.constantFrom(0, 1, 2),
  })
  .map((r) => {
    const names = ['date', 'value', 'zone'];
    if (r.extra) names.push('note');
    // Column order varies: the date need not come first.
    const order = [
      [0, 1, 2],
      [1, 0, 2],
      [2, 1, 0],
    ][r.order].concat(r.extra ? [3] : []);
    const lines: string[][] = [];
    let k = 0;
    for (let i = 0; i < r.count; i++) {
      const zone = r.grouped || r.filter ? r.groups[i] : 'A';
      const value = r.bad === i ? '12a' : r.values[i][r.decimal === '.' ? 0 : 1];
      lines.push([dateText(r.kind, k, r.variant), value, zone, 'à noter']);
      // Grouped data repeats each date for every group only when the groups differ; step on otherwise.
      k += r.steps[i];
    }
    if (r.shuffle) lines.reverse();
    const quote = (f: string, j: number): string => {
      const inside = f.includes(r.delimiter) || f.includes('"');
      if (r.quoting === 'all' || (r.quoting === 'some' && j % 2 === 0) || inside) return `"${f}"`;
      if (r.quoting === 'blanks') return ` "${f}" `;
      return r.spaces ? ` ${f} ` : f;
    };
    const row = (cells: string[]): string =>
      order
        .map((j) => cells[j])
        .map(quote)
        .join(r.delimiter);
    const body = [row(names), ...lines.map(row)];
    for (const at of r.blankLines) body.splice(Math.min(at, body.length), 0, at % 2 ? '' : r.delimiter.repeat(3));
    const nl = r.crlf ? '\r\n' : '\n';
    const text = (r.bom ? '\uFEFF' : '') + body.join(nl) + (r.trailingNewline ? nl : '');
    return {
      text,
      spec: spec({
        delimiter: r.delimiter === '\t' ? 'tab' : r.delimiter,
        decimal: r.decimal,
        groupBy: r.grouped ? 'zone' : null,
        filter: r.filter ? { column: 'zone', values: [...r.filter] } : null,
      }),
      hint: r.useHint ? KIND_FREQUENCY[r.kind] : null,
    };
  });

/** JSON files of flat records in the shapes the fast path reads: spacing, key order, escapes, extra keys. */
const cleanJson: fc.Arbitrary<CleanCase> = fc
  .record({
    kind: fc.constantFrom<Kind>('month', 'date', 'quarter', 'hour'),
    variant: fc.nat(7),
    count: fc.integer({ min: 1, max: 40 }),
    values: fc.array(
      fc.oneof(
        { weight: 40, arbitrary: fc.integer({ min: -99_999, max: 99_999 }).map((v) => v / 10) },
        { weight: 4, arbitrary: fc.double({ min: -1e15, max: 1e15, noNaN: true }) },
        { weight: 4, arbitrary: fc.constantFrom<unknown>(null, '12.5', 'NA', '1,234', -0, '', ' 7 ', 1e15) },
        // Values no reading accepts (JSON.stringify writes NaN as null): both paths must refuse them.
        { weight: 1, arbitrary: fc.constantFrom<unknown>(true, 1e16, '12a', -1.7976931348623157e308) },
      ),
      { minLength: 40, maxLength: 40 },
    ),
    groups: fc.array(fc.constantFrom<unknown>('North', 'Zürich', 7, 'b'), { minLength: 40, maxLength: 40 }),
    grouped: fc.boolean(),
    filter: fc.option(fc.constantFrom(['North', 'b'], ['7', 'b', 'Zürich'], ['nowhere']), { freq: 2 }),
    indent: fc.constantFrom(0, 1, 2, '\t'),
    escapeDates: fc.boolean(),
    extra: fc.constantFrom('none', 'none', 'flag', 'text', 'nested'),
    dropValue: fc.option(fc.nat(39)),
    duplicateKey: fc.boolean(),
    useHint: fc.boolean(),
  })
  .map((r) => {
    const records: string[] = [];
    for (let i = 0; i < r.count; i++) {
      const rec: Record<string, unknown> = {};
      if (r.extra === 'text') rec.note = 'a "quoted" word, café\n';
      rec.date = dateText(r.kind, i, r.variant);
      if (r.dropValue !== i) rec.value = r.values[i];
      if (r.grouped || r.filter) rec.zone = r.groups[i];
      if (r.extra === 'flag') rec.estimated = i % 2 === 0;
      if (r.extra === 'nested') rec.more = { a: [1, 2] };
      let json = JSON.stringify(rec, null, r.indent);
      if (r.escapeDates) json = json.replace(/"date": ?"(\d)/, (m, d) => m.replace(`"${d}`, `"\\u003${d}`));
      if (r.duplicateKey) json = json.replace(/\}$/, ', "value": 1.5}');
      records.push(json);
    }
    return {
      text: `[${records.join(r.indent === 0 ? ',' : ',\n')}]`,
      spec: spec({
        format: 'json',
        fileAsWritten: 'data/x.json',
        groupBy: r.grouped ? 'zone' : null,
        filter: r.filter ? { column: 'zone', values: [...r.filter] } : null,
      }),
      hint: r.useHint ? KIND_FREQUENCY[r.kind] : null,
    };
  });

const hint = fc.constantFrom<Frequency | null>(null, null, 'monthly', 'daily', 'weekly', 'hourly', 'quarterly');

describe('fast and general paths of the data loader give the same result (property)', () => {
  it('on clean CSV files in every shape the fast path reads', () => {
    let read = 0;
    fc.assert(
      fc.property(cleanCsv, (c) => {
        if (agree(enc(c.text), c.spec, c.hint)) read++;
      }),
      { seed: 20261201, numRuns: 600 },
    );
    // Most clean files are read by the fast path; otherwise the comparison proves little.
    expect(read).toBeGreaterThan(300);
  });

  it('on clean JSON files', () => {
    let read = 0;
    fc.assert(
      fc.property(cleanJson, (c) => {
        if (agree(enc(c.text), c.spec, c.hint)) read++;
      }),
      { seed: 20261202, numRuns: 400 },
    );
    expect(read).toBeGreaterThan(150);
  });

  it('on the fuzz generators’ broken CSV and JSON files', () => {
    let read = 0;
    fc.assert(
      fc.property(csvCase, hint, ([text, s], h) => {
        if (agree(enc(text), s, h)) read++;
      }),
      { seed: 20261203, numRuns: 600 },
    );
    fc.assert(
      fc.property(jsonText, dataSpec('json'), hint, (text, s, h) => {
        if (agree(enc(text), s, h)) read++;
      }),
      { seed: 20261204, numRuns: 400 },
    );
    // Broken files rarely load at all; the point here is that the fast path accepts none the general refuses.
    expect(read).toBeGreaterThan(10);
  });
});

describe('fast path — what it leaves to the general path', () => {
  // Each of these needs the general path's full rules or its message; the fast path must decline.
  const declines: [string, string, Partial<DataSpec>][] = [
    ['a quote inside a value', 'date,value\n2024-01,"1""5"\n', {}],
    ['a line break inside quotes', 'date,value,note\n2024-01,1,"a\nb"\n', {}],
    ['a lone carriage return', 'date,value\r2024-01,1\r', {}],
    ['a ragged row', 'date,value\n2024-01,1,2\n', {}],
    ['a missing column', 'date,amount\n2024-01,1\n', {}],
    ['a value that is not a number', 'date,value\n2024-01,12a\n', {}],
    ['two rows in one month', 'date,value\n2024-01,1\n2024-01,2\n', {}],
    ['mixed date forms', 'date,value\n2024-01,1\n2024-02-01,2\n', {}],
    ['no usable value', 'date,value\n2024-01,NA\n', {}],
    ['an empty group', 'date,g,value\n2024-01,,1\n', { groupBy: 'g' }],
    ['a two-character delimiter', 'date::value\n2024-01::1\n', { delimiter: '::' }],
    ['a second byte-order mark', '\uFEFF\uFEFFdate,value\n2024-01,1\n', {}],
    ['Latin-1 bytes', 'date,value\n2024-01,1\n', {}],
  ];
  it.each(declines)('%s', (name, text, over) => {
    const bytes = name === 'Latin-1 bytes' ? Uint8Array.from([...enc(text), 0xe9, 10]) : enc(text);
    expect(loadDataFast(bytes, spec(over), null)).toBeNull();
  });

  it('reads the usual file: the same numbers as the general path, hand-checked', () => {
    // 2024-01 is month ordinal 2024 × 12 + 0 = 24288 (calendar.ts); February has no row, so it is a gap.
    const text = 'date;value\r\n"2024-01";"1,5"\r\n2024-03; 2 \r\n';
    const d = loadDataFast(enc(text), spec({ delimiter: ';', decimal: ',' }), null);
    expect(d).not.toBeNull();
    expect(d?.groups[0].series.index).toEqual({ frequency: 'monthly', start: 24288, length: 3 });
    expect(Array.from(d?.groups[0].series.values ?? [])).toEqual([1.5, Number.NaN, 2]);
    expect(d?.groups[0].gaps).toEqual(['2024-02-01']);
  });
});
