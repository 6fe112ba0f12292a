import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { readCsv, requireColumns, splitSimple, splitWithCsvParse } from '../../src/data/csv.js';
import { firstInvalidUtf8 } from '../../src/utf8.js';
import { errorOf } from '../support/error-of.js';

const enc = (s: string): Uint8Array => new TextEncoder().encode(s);
const FILE = 'data/x.csv';
const read = (s: string | Uint8Array, delimiter = ',', decimal: '.' | ',' = '.') =>
  readCsv(typeof s === 'string' ? enc(s) : s, { file: FILE, delimiter, decimal });

describe('readCsv — tables', () => {
  it('reads a header and rows, trimming cells and numbering rows by line (header = row 1)', () => {
    const t = read('date, value\n2024-01 ,  5\n\n2024-02,6\n');
    expect(t.columns).toEqual(['date', 'value']);
    expect(t.rowCount).toBe(2);
    expect(t.cells).toEqual([
      ['2024-01', '2024-02'],
      ['5', '6'],
    ]);
    // The blank line 3 is skipped but still counted.
    expect(t.placeOf(0, 'value')).toEqual({ file: FILE, row: 2, field: 'value' });
    expect(t.placeOf(1)).toEqual({ file: FILE, row: 4 });
    expect(t.nameOf(1)).toBe('row 4');
  });

  it('strips a UTF-8 byte-order mark and reads CRLF line ends', () => {
    const t = read('\ufeffdate,value\r\n2024-01,5\r\n');
    expect(t.columns).toEqual(['date', 'value']);
    expect(t.cells[1]).toEqual(['5']);
  });

  it('uses the given delimiter', () => {
    expect(read('date;value\n2024-01;1,5\n', ';').cells[1]).toEqual(['1,5']);
    expect(read('date\tvalue\n2024-01\t7\n', '\t').cells[1]).toEqual(['7']);
  });

  it('follows RFC 4180 quoting: delimiters, doubled quotes and line breaks inside quotes', () => {
    const t = read('date,note,value\n2024-01,"a, b",1\n2024-02,"say ""hi""",2\n2024-03,"two\nlines",3\n2024-04,x,4\n');
    expect(t.cells[1]).toEqual(['a, b', 'say "hi"', 'two\nlines', 'x']);
    // The record starting on line 4 spans lines 4–5, so the next one is on line 6.
    expect(t.placeOf(2).row).toBe(4);
    expect(t.placeOf(3).row).toBe(6);
  });

  it('counts lines the same way with CRLF line ends inside and outside quotes', () => {
    const t = read('a,b\r\n\r\n1,"x\r\ny"\r\n  \r\n2, "z" \r\n3,4');
    expect(t.cells).toEqual([
      ['1', '2', '3'],
      ['x\r\ny', 'z', '4'],
    ]);
    expect([0, 1, 2].map((i) => t.placeOf(i).row)).toEqual([3, 6, 7]);
  });

  it('skips rows whose fields are all empty (spreadsheet exports end with such rows)', () => {
    expect(read('date,value\n2024-01,5\n,\n , \n').rowCount).toBe(1);
  });
});

describe('readCsv — errors name the file, the row and a fix', () => {
  it('an empty file', () => {
    for (const s of ['', '  \n\n']) {
      const e = errorOf(() => read(s));
      expect(e.code).toBe('data-empty');
      expect(e.oneLine()).toMatch(/^data\/x\.csv: the file is empty — export/);
    }
  });

  it('a header without rows', () => {
    const e = errorOf(() => read('date,value\n\n'));
    expect(e.code).toBe('data-no-rows');
    expect(e.oneLine()).toBe(
      'data/x.csv: row 1: the file has a header but no data rows — add the data rows below the header',
    );
  });

  it('a ragged row, named by its line', () => {
    const e = errorOf(() => read('date,value\n2024-01,5\n2024-02\n2024-03,6\n'));
    expect(e.code).toBe('data-ragged');
    expect(e.oneLine()).toContain('data/x.csv: row 3: this row has 1 field but the header has 2 — fill in');
    const more = errorOf(() => read('date,value\n2024-01,5\n2024-02,1,5\n', ',', ','));
    expect(more.place.row).toBe(3);
    expect(more.hint).toContain('decimal comma');
  });

  it('a wrong delimiter: one column although the header holds ";" or a tab', () => {
    const e = errorOf(() => read('date;value\n2024-01;5\n'));
    expect(e.code).toBe('data-delimiter');
    expect(e.oneLine()).toContain('data/x.csv: row 1: only one column was found');
    expect(e.hint).toBe('set the data delimiter to ";" in the job');
    expect(errorOf(() => read('date\tvalue\n2024-01\t5\n')).hint).toContain('"\\t"');
    // The ragged row a decimal comma causes must not hide the real cause.
    expect(errorOf(() => read('date;value\n2024-01;1,5\n')).code).toBe('data-delimiter');
  });

  it('a file that is not text', () => {
    const nul = errorOf(() => read(new Uint8Array([0x64, 0x0a, 0x31, 0x00, 0x32])));
    expect(nul.code).toBe('data-not-text');
    expect(nul.oneLine()).toContain('data/x.csv:2: the file contains NUL bytes');
    // "café" in Latin-1: 0xE9 is not followed by continuation bytes, so it is not UTF-8.
    const latin1 = errorOf(() => read(new Uint8Array([...enc('date,value\n2024-01,caf'), 0xe9, 0x0a])));
    expect(latin1.oneLine()).toContain('data/x.csv:2: byte 0xE9 is not valid UTF-8 text — save the file as UTF-8');
    expect(errorOf(() => read(new Uint8Array([0xff, 0xfe, 0x64, 0x00]))).message).toContain('UTF-16');
    // A ZIP archive starts with "PK\x03\x04" (PKWARE APPNOTE, local file header signature).
    expect(errorOf(() => read(new Uint8Array([0x50, 0x4b, 3, 4, 0, 0]))).message).toContain('spreadsheet');
  });

  it('an unclosed quote (through csv-parse)', () => {
    const e = errorOf(() => read('date,value\n2024-01,"5\n2024-02,6\n'));
    expect(e.code).toBe('data-csv-syntax');
    expect(e.oneLine()).toContain('data/x.csv: row');
    expect(e.hint).toContain('closing "');
  });
});

describe('requireColumns', () => {
  const t = () => read('Date,delivered,region\n2024-01,5,North\n');

  it('returns column indexes', () => {
    expect(requireColumns(t(), [{ name: 'region', role: 'group column' }])).toEqual([2]);
  });

  it('names the missing column, lists the columns found and suggests the closest', () => {
    const e = errorOf(() => requireColumns(t(), [{ name: 'delivred', role: 'value column' }]));
    expect(e.code).toBe('data-column-missing');
    expect(e.oneLine()).toBe(
      'data/x.csv: row 1, column "delivred": there is no value column "delivred"; columns found: "Date", "delivered", "region" — did you mean "delivered"? Column names are matched exactly, including case',
    );
    expect(errorOf(() => requireColumns(t(), [{ name: 'date', role: 'date column' }])).hint).toContain('"Date"');
    expect(errorOf(() => requireColumns(t(), [{ name: 'zzz', role: 'date column' }])).hint).toContain('name one of');
  });

  it('refuses a needed column named twice in the header', () => {
    const e = errorOf(() =>
      requireColumns(read('date,value,value\n1,2,3\n'), [{ name: 'value', role: 'value column' }]),
    );
    expect(e.code).toBe('data-column-twice');
    expect(e.message).toContain('columns 2 and 3');
  });
});

describe('firstInvalidUtf8 — Unicode Standard Table 3-7', () => {
  it('accepts well-formed sequences and finds ill-formed ones', () => {
    expect(firstInvalidUtf8(enc('a é € 😀'))).toBe(-1);
    expect(firstInvalidUtf8(new Uint8Array([0x61, 0xc0, 0x80]))).toBe(1); // overlong two-byte form
    expect(firstInvalidUtf8(new Uint8Array([0xed, 0xa0, 0x80]))).toBe(0); // a UTF-16 surrogate
    expect(firstInvalidUtf8(new Uint8Array([0x61, 0x62, 0xe2, 0x82]))).toBe(2); // truncated
  });
});

describe('the direct split agrees with csv-parse (property)', () => {
  // Quotes and line breaks are rarer than other characters, so that most files keep simple quoting.
  const char = fc.oneof(
    { arbitrary: fc.constantFrom('a', 'b', '1', '.', ' ', ',', ';', '\t', 'é'), weight: 80 },
    { arbitrary: fc.constantFrom('"', '\n'), weight: 1 },
  );
  const field = fc.array(char, { maxLength: 5 }).map((cs) => cs.join(''));
  const table = fc
    .integer({ min: 1, max: 4 })
    .chain((width) =>
      fc.record({
        rows: fc.array(fc.array(field, { minLength: width, maxLength: width }), { minLength: 1, maxLength: 8 }),
        ragged: fc.option(fc.tuple(fc.nat(8), fc.array(field, { minLength: 1, maxLength: 5 }))),
        quoteAll: fc.boolean(),
        crlf: fc.boolean(),
        trailing: fc.boolean(),
        delimiter: fc.constantFrom(',', ';', '\t'),
      }),
    )
    .map((t) => {
      const rows = [...t.rows];
      if (t.ragged) rows.splice(Math.min(t.ragged[0], rows.length), 0, t.ragged[1]);
      return { ...t, rows };
    });

  it('gives the same columns, cells, lines and ragged row whenever it accepts the file', () => {
    let accepted = 0;
    fc.assert(
      fc.property(table, ({ rows, quoteAll, crlf, trailing, delimiter }) => {
        const encode = (f: string) => {
          const special = /["\n\t,;]/.test(f) || f.trim() !== f;
          return quoteAll || special ? `"${f.replaceAll('"', '""')}"` : f;
        };
        const nl = crlf ? '\r\n' : '\n';
        const text = rows.map((r) => r.map(encode).join(delimiter)).join(nl) + (trailing ? nl : '');
        const direct = splitSimple(text, delimiter);
        if (direct === null) return;
        accepted++;
        expect(direct).toEqual(splitWithCsvParse(enc(text), delimiter, FILE));
      }),
      { numRuns: 400 },
    );
    // The property must have compared something: most generated files have simple quoting.
    expect(accepted).toBeGreaterThan(200);
  });
});
