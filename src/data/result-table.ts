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
 * SHA-256 of the query text and the rows it returned, in order: the query, then the column names, then each
 * row's cells, each cell typed (n: number, s: text, -: empty) so 1 and "1" differ; fields end in a unit
 * separator (0x1f) and rows in a record separator (0x1e), characters a cell is unlikely to hold and that
 * the type prefix keeps unambiguous anyway since each field's length is written.
 */
export function rowsHash(query: string, t: ColumnTable): string {
  const h = createHash('sha256');
  h.update(`query\x1f${query.length}\x1f${query}\x1e`);
  h.update(`${t.columns.map((c) => `${c.length}:${c}`).join('\x1f')}\x1e`);
  const n = t.cells.length > 0 ? t.cells[0].length : 0;
  const parts: string[] = [];
  for (let i = 0; i < n; i++) {
    let row = '';
    for (let j = 0; j < t.cells.length; j++) {
      const c = t.cells[j][i];
      row += c === null ? '-\x1f' : typeof c === 'number' ? `n${c}\x1f` : `s${c.length}:${c}\x1f`;
    }
    parts.push(row);
    // Hash in chunks: a million rows as one string would double the memory the rows take.
    if (parts.length === 4096) {
      h.update(`${parts.join('\x1e')}\x1e`);
      parts.length = 0;
    }
  }
  if (parts.length > 0) h.update(`${parts.join('\x1e')}\x1e`);
  return h.digest('hex');
}
