import { describe, expect, it } from 'vitest';
import { requireColumns } from '../../src/data/csv.js';
import { readJson, recordLines } from '../../src/data/json.js';
import { errorOf } from '../support/error-of.js';

const enc = (s: string): Uint8Array => new TextEncoder().encode(s);
const FILE = 'data/x.json';
const read = (s: string) => readJson(enc(s), { file: FILE });

describe('readJson — records', () => {
  it('reads an array of records into columns in first-seen key order; absent keys are null', () => {
    const t = read(
      '\ufeff[\n  {"date": "2024-01", "value": 12.5},\n  {"date": "2024-02", "value": "13", "note": "x"},\n  {"date": "2024-03"}\n]\n',
    );
    expect(t.columns).toEqual(['date', 'value', 'note']);
    expect(t.rowCount).toBe(3);
    expect(t.cells).toEqual([
      ['2024-01', '2024-02', '2024-03'],
      [12.5, '13', null],
      [null, 'x', null],
    ]);
    // Records start on lines 2, 3 and 4.
    expect(t.placeOf(2, 'value')).toEqual({ file: FILE, line: 4, field: 'value' });
    expect(t.nameOf(1)).toBe('record 2 (line 3)');
  });

  it('keeps other JSON values as their JSON text, so messages can quote them', () => {
    expect(read('[{"v": true, "w": [1]}]').cells).toEqual([['true'], ['[1]']]);
  });

  it('finds the line of every top-level element, skipping strings with brackets and escapes', () => {
    // Line 1 "[", line 2 the first record (its string holds "},{" and an escaped quote), line 4 the second.
    const text = '[\n{"a": "},{ \\" ["},\n\n  {"a": 2}, {"a": 3}\n]';
    expect(recordLines(text)).toEqual([2, 4, 4]);
    expect(JSON.parse(text)).toHaveLength(3);
  });
});

describe('readJson — errors', () => {
  it('invalid JSON, located by the line and column of the parser position', () => {
    // Position 20 is the "}" after the trailing comma on line 2 ("  {"a": 1, ..." starts at offset 2).
    const e = errorOf(() => read('[\n  {"a": 1, "b": 2,}\n]'));
    expect(e.code).toBe('data-json-syntax');
    expect(e.place).toEqual({ file: FILE, line: 2, column: 19 });
    expect(e.oneLine()).toMatch(/^data\/x\.json:2:19: the file is not valid JSON: .+ — fix the JSON here/);
    expect(errorOf(() => read('[1,\n2\n')).place.line).toBe(2);
  });

  it('an empty file, an empty array, and a top-level value that is not an array', () => {
    expect(errorOf(() => read(' \n')).code).toBe('data-empty');
    expect(errorOf(() => read('[]')).code).toBe('data-no-rows');
    const e = errorOf(() => read('{"data": [{"a": 1}]}'));
    expect(e.code).toBe('data-json-shape');
    expect(e.message).toContain('under "data"');
    expect(e.hint).toContain('top-level array');
  });

  it('a record that is not an object, at its own line', () => {
    const e = errorOf(() => read('[\n{"a": 1},\n[1, 2]\n]'));
    expect(e.oneLine()).toContain(
      'data/x.json:3: record 2 is an array, not an object — write each record as an object',
    );
  });

  it('a missing column lists the keys found and suggests the closest', () => {
    const e = errorOf(() =>
      requireColumns(read('[{"month": "2024-01", "sales": 1}]'), [{ name: 'Sales', role: 'value column' }]),
    );
    expect(e.oneLine()).toBe(
      'data/x.json: column "Sales": there is no value column "Sales"; columns found: "month", "sales" — did you mean "sales"? Column names are matched exactly, including case',
    );
  });
});
