/**
 * A query's result, or a workbook sheet's cells, as the loader's Table: columns of cells, each row named as
 * the source names it (a result's row number; a sheet's row number as the sheet shows it), and a hash of
 * the rows read for the provenance of a database, where no file's bytes stand for the data.
 */
import { createHash } from 'node:crypto';
import type { Place } from '../errors.js';
import type { Cell, Table } from './csv.js';

export interface ColumnTable {
  columns: string[];
  /** cells[j][i]: column j of row i. */
  cells: Cell[][];
  /** The row number the source shows for row i (a sheet's row); absent: i + 1, the result's row. */
  rowNumbers?: Int32Array;
}

/** A Table over columns of cells; `where` names the source in messages (file, or file and sheet). */
export function columnTable(t: ColumnTable, where: string, rowWord: string): Table {
  const rowOf = (i: number) => (t.rowNumbers ? t.rowNumbers[i] : i + 1);
  return {
    columns: t.columns,
    rowCount: t.cells.length > 0 ? t.cells[0].length : (t.rowNumbers?.length ?? 0),
    cells: t.cells,
    placeOf: (i: number, field?: string): Place => ({ file: where, row: rowOf(i), ...(field ? { field } : {}) }),
    nameOf: (i: number) => `${rowWord} ${rowOf(i)}`,
    headerPlace: (field?: string): Place => ({ file: where, ...(field ? { field } : {}) }),
  };
}

/**
 * SHA-256 of the query text and the rows it returned, in order. The query and the column names come first
 * (each preceded by its length), then the rows in blocks of BLOCK rows; within a block, column by column:
 * each cell's kind (0 empty, 1 number, 2 text) as a byte, the numbers as float64 in the machine's byte order
 * (little-endian on x86 and ARM; 0 for a cell that is not a number), the texts' lengths in UTF-16 units as uint32, then the texts themselves
 * (UTF-8). The kinds and lengths make it unambiguous (1 and "1" differ; no text can imitate a boundary),
 * and no row is ever turned into a string of its own, which for a million rows cost more than the reading.
 */
export function rowsHash(query: string, t: ColumnTable): string {
  const h = createHash('sha256');
  h.update(`${query.length}:${query}\n${t.columns.map((c) => `${c.length}:${c}`).join('')}\n`);
  const n = t.cells.length > 0 ? t.cells[0].length : 0;
  const kinds = new Uint8Array(BLOCK);
  const numbers = new Float64Array(BLOCK);
  const lengths = new Uint32Array(BLOCK);
  const texts: string[] = [];
  for (let start = 0; start < n; start += BLOCK) {
    const end = Math.min(n, start + BLOCK);
    const size = end - start;
    for (const column of t.cells) {
      texts.length = 0;
      for (let i = start; i < end; i++) {
        const c = column[i];
        const k = i - start;
        if (c === null) {
          kinds[k] = 0;
          numbers[k] = 0;
          lengths[k] = 0;
        } else if (typeof c === 'number') {
          kinds[k] = 1;
          numbers[k] = c;
          lengths[k] = 0;
        } else {
          kinds[k] = 2;
          numbers[k] = 0;
          lengths[k] = c.length;
          texts.push(c);
        }
      }
      h.update(kinds.subarray(0, size));
      h.update(new Uint8Array(numbers.buffer, 0, size * 8));
      h.update(new Uint8Array(lengths.buffer, 0, size * 4));
      h.update(texts.join(''));
    }
  }
  return h.digest('hex');
}

const BLOCK = 8192;

/**
 * A table packed to cross between threads cheaply: a column of numbers as one Float64Array, a column of
 * text as one string joined by NUL (which neither PostgreSQL text nor XML can hold), each with a byte per
 * cell saying empty (0), number (1) or text (2). A million cells cross as a few buffers rather than a
 * million values cloned one by one.
 */
export interface PackedTable {
  columns: string[];
  rows: number;
  kinds: Uint8Array[];
  numbers: Float64Array[];
  texts: string[];
  rowNumbers?: Int32Array;
}

export function packTable(t: ColumnTable): { packed: PackedTable; transfer: ArrayBuffer[] } {
  const rows = t.cells.length > 0 ? t.cells[0].length : (t.rowNumbers?.length ?? 0);
  const kinds: Uint8Array[] = [];
  const numbers: Float64Array[] = [];
  const texts: string[] = [];
  for (const column of t.cells) {
    const kind = new Uint8Array(rows);
    const number = new Float64Array(rows);
    const text: string[] = [];
    for (let i = 0; i < rows; i++) {
      const c = column[i];
      if (c === null) continue;
      if (typeof c === 'number') {
        kind[i] = 1;
        number[i] = c;
      } else {
        kind[i] = 2;
        text.push(c);
      }
    }
    kinds.push(kind);
    numbers.push(number);
    texts.push(text.join('\0'));
  }
  const packed = { columns: t.columns, rows, kinds, numbers, texts, rowNumbers: t.rowNumbers };
  return { packed, transfer: packedBuffers(packed) };
}

/** The buffers of a packed table, to be moved rather than copied to the other thread. */
export function packedBuffers(p: PackedTable): ArrayBuffer[] {
  const out = [...p.kinds.map((k) => k.buffer as ArrayBuffer), ...p.numbers.map((x) => x.buffer as ArrayBuffer)];
  if (p.rowNumbers) out.push(p.rowNumbers.buffer as ArrayBuffer);
  return out;
}

export function unpackTable(p: PackedTable): ColumnTable {
  const cells: Cell[][] = p.columns.map((_, j) => {
    const kind = p.kinds[j];
    const number = p.numbers[j];
    const text = p.texts[j] === '' && !kind.includes(2) ? [] : p.texts[j].split('\0');
    const out = new Array<Cell>(p.rows);
    let t = 0;
    for (let i = 0; i < p.rows; i++) out[i] = kind[i] === 0 ? null : kind[i] === 1 ? number[i] : text[t++];
    return out;
  });
  return { columns: p.columns, cells, ...(p.rowNumbers ? { rowNumbers: p.rowNumbers } : {}) };
}
