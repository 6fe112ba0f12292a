import { fileURLToPath } from 'node:url';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { loadData, loadDataFromBytes, periodOrdinal, periodTexts } from '../../src/data/load.js';
import type { BriefError } from '../../src/errors.js';
import { type Frequency, isoOf, ordinalOf } from '../../src/vocabulary/period-index.js';
import type { DataSpec } from '../../src/vocabulary/settings.js';
import { errorOf } from '../support/error-of.js';
import { spec } from './spec.js';

const fixture = (name: string) => fileURLToPath(new URL(`./files/${name}`, import.meta.url));
const enc = (s: string): Uint8Array => new TextEncoder().encode(s);

const fromFile = (name: string, over: Partial<DataSpec>, hint: Frequency | null = null) =>
  loadData(spec({ file: fixture(name), fileAsWritten: `data/${name}`, ...over }), hint);
const fromText = (text: string, over: Partial<DataSpec> = {}, hint: Frequency | null = null) =>
  loadDataFromBytes(enc(text), spec(over), hint);

/** A located one-line message: the file, the row, the column and a hint after the dash. */
function expectLocated(e: BriefError, row: number, column: string): void {
  const line = e.oneLine();
  expect(line.startsWith(`data/x.csv: row ${row}, column "${column}": `), line).toBe(true);
  expect(line).toContain(' — ');
  expect(e.hint.length).toBeGreaterThan(10);
  expect(line).not.toContain('\n');
}

describe('loadData — regular series', () => {
  it('sorts rows, turns missing months and NA into NaN and lists them as gaps', () => {
    const d = fromFile('monthly-gaps.csv', { dateColumn: 'month', valueColumn: 'delivered' });
    expect(d.file).toBe('data/monthly-gaps.csv');
    // Expected digest from GNU coreutils: `sha256sum test/data/files/monthly-gaps.csv`.
    expect(d.sha256).toBe('a505012d38dff4869828fac204940373d900dc568d8a10483b3e65dc187ef8a7');
    expect(d.rows).toBe(4);
    expect(d.frequency).toBe('monthly');
    expect(d.groups).toHaveLength(1);
    const g = d.groups[0];
    expect(g.key).toBeNull();
    // Month ordinals count from year 0 (calendar.ts): 2024 × 12 + 0 = 24288 for January 2024.
    expect(g.series.index).toEqual({ frequency: 'monthly', start: 24288, length: 5 });
    expect(Array.from(g.series.values)).toEqual([100, Number.NaN, 130, Number.NaN, 150]);
    expect(g.dates).toEqual(['2024-01-01', '2024-02-01', '2024-03-01', '2024-04-01', '2024-05-01']);
    expect(g.gaps).toEqual(['2024-02-01', '2024-04-01']);
    expect(g.notes).toContain('rows were not in date order; sorted');
    expect(g.notes).toContain('1 period had no row and is treated as missing');
    expect(g.notes).toContain('1 row had an empty or NA value, treated as missing');
  });

  it('reads a BOM, ";" fields, decimal commas, a quoted field and the Unicode minus', () => {
    const d = fromFile('bom-semicolon.csv', { delimiter: ';', decimal: ',' });
    expect(d.frequency).toBe('daily');
    expect(Array.from(d.groups[0].series.values)).toEqual([1234.5, 2.5, -3]);
    expect(d.groups[0].notes).toEqual([]);
    // Day ordinals count from 1970-01-01: 2024-01-01 is day 19723 (54 years, 13 leap days: 54 × 365 + 13).
    expect(d.groups[0].series.index.start).toBe(19723);
  });

  it('lays ISO weeks across a 53-week year without a gap (ISO 8601: 2020 has 53 weeks)', () => {
    const d = fromFile('iso-weeks.csv', { dateColumn: 'week' });
    expect(d.frequency).toBe('weekly');
    expect(d.groups[0].dates).toEqual(['2020-12-21', '2020-12-28', '2021-01-04', '2021-01-11']);
    expect(d.groups[0].gaps).toEqual([]);
  });

  it('converts offsets to UTC, so the change to summer time leaves no gap and no duplicate', () => {
    // EU summer time began 2024-03-31 at 01:00 UTC (last Sunday of March; common practice): local 02:00
    // was skipped, so 01:00+01:00 and 03:00+02:00 are consecutive hours, 00:00Z and 01:00Z.
    const d = fromFile('summer-time.csv', { dateColumn: 'time', valueColumn: 'load' });
    expect(d.frequency).toBe('hourly');
    expect(d.groups[0].dates).toEqual(['2024-03-30T23:00Z', '2024-03-31T00:00Z', '2024-03-31T01:00Z']);
    expect(Array.from(d.groups[0].series.values)).toEqual([5, 6, 7]);
  });

  it('reads JSON records with numbers, numeric strings and null', () => {
    const d = fromFile('quarters.json', { format: 'json', dateColumn: 'quarter', valueColumn: 'revenue' });
    expect(d.frequency).toBe('quarterly');
    expect(Array.from(d.groups[0].series.values)).toEqual([10.5, Number.NaN, 12.25]);
    expect(d.groups[0].dates).toEqual(['2023-07-01', '2023-10-01', '2024-01-01']);
    expect(d.groups[0].gaps).toEqual(['2023-10-01']);
  });

  it('reads date-times all at midnight as dates, with a note', () => {
    const d = fromText('date,value\n2024-01-01 00:00:00,1\n2024-02-01 00:00:00,2\n');
    expect(d.frequency).toBe('monthly');
    expect(d.groups[0].notes[0]).toContain('midnight');
  });

  it('uses the frequency the job gives: month-start dates as days leave the days between as gaps', () => {
    const d = fromText('date,value\n2024-01-01,1\n2024-01-05,2\n', {}, 'daily');
    expect(d.groups[0].gaps).toEqual(['2024-01-02', '2024-01-03', '2024-01-04']);
    // Dates anywhere in their week fall in that ISO week; 2024-12-30 (a Monday) is in 2025-W01.
    const w = fromText('date,value\n2024-12-23,1\n2024-12-31,2\n', {}, 'weekly');
    expect(w.groups[0].dates).toEqual(['2024-12-23', '2024-12-30']);
  });
});

describe('loadData — groups and filters', () => {
  it('splits by the group column in first-seen order', () => {
    const d = fromFile('groups.csv', { groupBy: 'region', valueColumn: 'sales' });
    expect(d.frequency).toBe('monthly');
    expect(d.groups.map((g) => g.key)).toEqual(['North', 'South', 'East']);
    expect(Array.from(d.groups[0].series.values)).toEqual([10, 11, 12]);
    expect(Array.from(d.groups[1].series.values)).toEqual([20, 21]);
    expect(d.groups[2].dates).toEqual(['2024-03-01']);
  });

  it('keeps only the rows the filter names; the row count stays that of the file', () => {
    const d = fromFile('groups.csv', { valueColumn: 'sales', filter: { column: 'region', values: ['South'] } });
    expect(d.rows).toBe(6);
    expect(d.groups).toHaveLength(1);
    expect(Array.from(d.groups[0].series.values)).toEqual([20, 21]);
  });

  it('refuses a filter that keeps nothing, listing the values found', () => {
    const e = errorOf(() =>
      fromFile('groups.csv', { valueColumn: 'sales', filter: { column: 'region', values: ['south'] } }),
    );
    expect(e.code).toBe('data-filter-empty');
    expect(e.oneLine()).toBe(
      'data/groups.csv: row 1, column "region": no row has "south" in the filter column; values found: "North", "South", "East" — did you mean "South"? Filter values are matched exactly',
    );
  });

  it('refuses two rows for one period, naming both and the column that tells them apart', () => {
    const e = errorOf(() => fromFile('groups.csv', { valueColumn: 'sales' }));
    expect(e.code).toBe('data-duplicate');
    expect(e.oneLine()).toContain(
      'data/groups.csv: row 3, column "date": row 2 and row 3 both fall in monthly period 2024-01',
    );
    expect(e.hint).toContain('"region"');
  });
});

describe('loadData — errors name the file, the row and the column, with a fix', () => {
  it('a value that is not a number (the message of the brief, word for word)', () => {
    const e = errorOf(() => fromText('date,delivered\n2024-01,5\n2024-02,12a\n', { valueColumn: 'delivered' }));
    expect(e.code).toBe('data-number');
    expect(e.oneLine()).toBe(
      `data/x.csv: row 3, column "delivered": "12a" is not a number — write plain numbers like 1234.5; the job's locale sets the decimal mark`,
    );
  });

  it('infinities and huge values', () => {
    expectLocated(
      errorOf(() => fromText('date,value\n2024-01,Infinity\n')),
      2,
      'value',
    );
    expectLocated(
      errorOf(() => fromText('date,value\n2024-01,1\n2024-02,1e16\n')),
      3,
      'value',
    );
  });

  it('a cell that is not a date, an impossible date, an empty date', () => {
    const e = errorOf(() => fromText('date,value\n2024-01-01,1\n05/03/2024,2\n'));
    expect(e.code).toBe('data-date');
    expectLocated(e, 3, 'date');
    expect(e.hint).toContain('2024-03-05');
    const feb = errorOf(() => fromText('date,value\n2024-02-28,1\n2024-02-30,2\n'));
    expectLocated(feb, 3, 'date');
    expect(feb.message).toBe('"2024-02-30" is not a real date: 2024-02 has 29 days (a leap year)');
    const w53 = errorOf(() => fromText('date,value\n2021-W52,1\n2021-W53,2\n'));
    expect(w53.message).toBe('"2021-W53" is not a real week: ISO year 2021 has 52 weeks');
    expectLocated(
      errorOf(() => fromText('date,value\n,1\n')),
      2,
      'date',
    );
  });

  it('mixed date formats in one column, quoting both', () => {
    const e = errorOf(() => fromText('date,value\n2024-01,1\n2024-02-01,2\n'));
    expect(e.code).toBe('data-date-mixed');
    expectLocated(e, 3, 'date');
    expect(e.message).toBe('"2024-02-01" is a date like 2024-03-05, but row 2 has "2024-01", a month like 2024-03');
  });

  it('a date that does not fit the frequency the job gives', () => {
    const e = errorOf(() => fromText('date,value\n2024-01,1\n', {}, 'daily'));
    expect(e.code).toBe('data-date-frequency');
    expectLocated(e, 2, 'date');
    expect(e.hint).toContain('monthly');
    const hour = errorOf(() => fromText('date,value\n2024-01-01T00:00Z,1\n2024-01-01T13:00Z,2\n', {}, 'daily'));
    expectLocated(hour, 3, 'date');
  });

  it('two dates in one period of the job frequency', () => {
    const e = errorOf(() => fromText('date,value\n2024-03-01,1\n2024-03-15,2\n', {}, 'monthly'));
    expectLocated(e, 3, 'date');
    expect(e.message).toBe('row 2 and row 3 both fall in monthly period 2024-03 ("2024-03-01" and "2024-03-15")');
    const w = errorOf(() => fromText('date,value\n2024-12-30,1\n2025-01-03,2\n', {}, 'weekly'));
    expect(w.message).toContain('weekly period 2025-W01');
  });

  it('a file or group with no usable values', () => {
    const e = errorOf(() => fromText('date,value\n2024-01,NA\n2024-02,\n'));
    expect(e.code).toBe('data-no-values');
    expectLocated(e, 2, 'value');
    // In a file of several groups, a group without values fails alone: the others load.
    const loaded = fromText('date,g,value\n2024-01,a,1\n2024-01,b,NA\n', { groupBy: 'g' });
    expect(loaded.groups.map((x) => x.key)).toEqual(['a']);
    expect(loaded.failedGroups?.map((f) => f.key)).toEqual(['b']);
    expect(loaded.failedGroups?.[0].error.message).toContain('group "b"');
    // When every group is wrong, the file fails as a whole.
    const g = errorOf(() => fromText('date,g,value\n2024-01,a,NA\n2024-01,b,NA\n', { groupBy: 'g' }));
    expect(g.message).toContain('group "a"');
  });

  it('a date far from the others (a mistyped year) instead of a huge index', () => {
    const e = errorOf(() => fromText('date,value\n2024-01-01T00:00,1\n2024-01-01T01:00,2\n2204-01-01T02:00,3\n'));
    expect(e.code).toBe('data-span');
    expectLocated(e, 4, 'date');
  });

  it('a missing column, an empty group, a file that does not exist', () => {
    const e = errorOf(() => fromText('Date,value\n2024-01,1\n'));
    expect(e.code).toBe('data-column-missing');
    expect(e.oneLine()).toContain('data/x.csv: row 1, column "date": there is no date column "date"');
    expect(e.hint).toContain('"Date"');
    expectLocated(
      errorOf(() => fromText('date,g,value\n2024-01,,1\n', { groupBy: 'g' })),
      2,
      'g',
    );
    const missing = errorOf(() => loadData(spec({ file: fixture('no-such-file.csv') }), null));
    expect(missing.oneLine()).toBe(
      "data/x.csv: the data file does not exist — check the path in the job; it is relative to the job file's folder",
    );
  });

  it('JSON errors give the line of the record', () => {
    const e = errorOf(() =>
      loadDataFromBytes(
        enc('[\n{"date": "2024-01", "value": 1},\n{"date": 2024, "value": 2}\n]'),
        spec({ format: 'json', fileAsWritten: 'data/x.json' }),
        null,
      ),
    );
    expect(e.oneLine()).toMatch(/^data\/x\.json:3: column "date": 2024 is a number, not a date — /);
  });
});

describe('periodTexts and periodOrdinal agree with calendar.ts (property)', () => {
  const frequencies: Frequency[] = ['hourly', 'daily', 'weekly', 'monthly', 'quarterly'];
  it('periodTexts = isoOf for every period', () => {
    fc.assert(
      fc.property(fc.constantFrom(...frequencies), fc.integer({ min: 0, max: 10_000 }), (f, k) => {
        // Ordinals near 2000 for each frequency, so that years stay in the supported range.
        const base = { hourly: 262_968, daily: 10_957, weekly: 1_565, monthly: 24_000, quarterly: 8_000 }[f];
        const texts = periodTexts(f, base + k, 30);
        for (let s = 0; s < 30; s++) expect(texts[s]).toBe(isoOf(f, base + k + s));
      }),
      { numRuns: 200 },
    );
  });

  it('periodOrdinal = ordinalOf for any instant', () => {
    fc.assert(
      fc.property(
        fc.constantFrom(...frequencies),
        fc.integer({ min: -30_000_000_000_000, max: 250_000_000_000_000 }),
        (f, ms) => {
          expect(periodOrdinal(f, ms)).toBe(ordinalOf(f, ms));
        },
      ),
      { numRuns: 500 },
    );
  });
});
