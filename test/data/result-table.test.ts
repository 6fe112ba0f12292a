/**
 * The table of a query's result: its hash tells apart what must differ (a number from its text, where one
 * text ends and the next begins, an empty cell from an empty text, the order of rows, the query), and a
 * table packed for the trip from the worker thread comes back the same (fast-check property).
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import type { Cell } from '../../src/data/csv.js';
import { packTable, rowsHash, unpackTable } from '../../src/data/result-table.js';

const table = (...cells: Cell[][]) => ({ columns: cells.map((_, j) => `c${j}`), cells });

describe('rowsHash', () => {
  it('is the same for the same query and rows, and is SHA-256 hex', () => {
    expect(rowsHash('q', table([1, 'a', null]))).toBe(rowsHash('q', table([1, 'a', null])));
    expect(rowsHash('q', table([1]))).toMatch(/^[0-9a-f]{64}$/);
  });
  it('tells apart what differs', () => {
    const h = (q: string, ...cells: Cell[][]) => rowsHash(q, table(...cells));
    expect(h('q', [1])).not.toBe(h('q', ['1']));
    expect(h('q', ['ab', 'c'])).not.toBe(h('q', ['a', 'bc']));
    expect(h('q', [null])).not.toBe(h('q', ['']));
    expect(h('q', [1, 2])).not.toBe(h('q', [2, 1]));
    expect(h('q', [1])).not.toBe(h('r', [1]));
    expect(h('q', ['a'], ['b'])).not.toBe(h('q', ['ab'], ['']));
    expect(rowsHash('q', { columns: ['a'], cells: [[1]] })).not.toBe(rowsHash('q', { columns: ['b'], cells: [[1]] }));
  });
  it('covers rows past the first block of 8,192', () => {
    const a = Array.from({ length: 10_000 }, (_, i) => i);
    const b = [...a];
    b[9_999] = -1;
    expect(rowsHash('q', table(a))).not.toBe(rowsHash('q', table(b)));
  });
});

describe('packTable', () => {
  it('comes back the same', () => {
    const cell = fc.oneof(
      fc.constant(null),
      fc.double({ noNaN: true }),
      fc.string({ unit: 'grapheme' }).filter((s) => !s.includes('\0')),
    );
    fc.assert(
      fc.property(
        fc.integer({ min: 0, max: 30 }),
        fc.integer({ min: 1, max: 4 }),
        fc.array(cell, { maxLength: 120 }),
        (rows, cols, pool) => {
          const cells: Cell[][] = Array.from({ length: cols }, (_, j) =>
            Array.from({ length: rows }, (_, i) => (pool.length > 0 ? pool[(i * cols + j) % pool.length] : null)),
          );
          const t = {
            columns: cells.map((_, j) => `c${j}`),
            cells,
            rowNumbers: Int32Array.from({ length: rows }, (_, i) => i + 5),
          };
          const back = unpackTable(packTable(t).packed);
          expect(back.columns).toEqual(t.columns);
          expect(back.cells).toEqual(t.cells);
          expect(Array.from(back.rowNumbers ?? [])).toEqual(Array.from(t.rowNumbers));
        },
      ),
    );
  });
});
