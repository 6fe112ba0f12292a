/**
 * Workbooks and databases into the same table the CSV reader makes, then through the same loader
 * (load.ts loadTable), so date and value columns, filter, group_by, gaps and every message about a row
 * work as for a file. The provenance's hash: a workbook's file bytes; a database's query and rows read.
 */
import { readFileSync } from 'node:fs';
import { BriefError } from '../errors.js';
import type { DataSpec } from '../vocabulary/settings.js';
import type { Table } from './csv.js';
import { sha256Hex } from './hash.js';
import { parameterValues } from './parameters.js';
import { readInWorker } from './read-sync.js';
import { type ColumnTable, columnTable, rowsHash } from './result-table.js';
import { readSqlite } from './sqlite.js';
import type { SheetTable } from './xlsx.js';

/** A workbook's or a query's rows as a table, the hash its provenance records, and the sheet read. */
export interface SourceTable {
  table: Table;
  sha256: string;
  /** 'sheet NAME' for a workbook; absent for a query. */
  source?: string;
}

export function readSource(spec: DataSpec, period: string | null): SourceTable {
  const where = spec.fileAsWritten;
  if (spec.format === 'xlsx') {
    let bytes: Buffer;
    try {
      bytes = readFileSync(spec.file);
    } catch (e) {
      throw new BriefError(
        'data-file-missing',
        `the workbook cannot be read (${(e as { code?: string }).code ?? 'unknown error'})`,
        "check the path in the job; it is relative to the job file's folder",
        { file: where },
      );
    }
    const t = readInWorker<SheetTable>({ kind: 'xlsx', spec, parameters: [] }, 1800);
    const table = columnTable(t, `${where}, sheet "${t.sheet}"`, 'row');
    if (table.rowCount === 0) {
      throw new BriefError(
        'data-empty',
        'the sheet has a header but no rows of data below it',
        'check the sheet, range and header_row in the job',
        { file: `${where}, sheet "${t.sheet}"` },
      );
    }
    return { table, sha256: sha256Hex(bytes), source: `sheet ${t.sheet}` };
  }
  const parameters = parameterValues(spec.parameters ?? [], period, where);
  const timeout = spec.timeoutSeconds ?? 60;
  const t: ColumnTable =
    spec.format === 'sqlite'
      ? readSqlite(spec, parameters)
      : readInWorker<ColumnTable>({ kind: 'postgres', spec, parameters }, timeout + 60);
  const table = columnTable(t, where, 'result row');
  if (table.rowCount === 0) {
    throw new BriefError(
      'data-empty',
      `the query returned no rows${parameters.length > 0 ? ` for the parameters ${parameters.map((p) => `"${p}"`).join(', ')}` : ''}`,
      'check the query and its conditions; run it in the database to see what it returns',
      { file: where },
    );
  }
  return { table, sha256: rowsHash(spec.query ?? '', t) };
}
