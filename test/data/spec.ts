/** A data spec as the job loader resolves one, with only the given fields changed: for loader tests. */
import type { DataSpec } from '../../src/vocabulary/settings.js';

export function spec(over: Partial<DataSpec> = {}): DataSpec {
  return {
    file: '/nowhere/x.csv',
    fileAsWritten: 'data/x.csv',
    format: 'csv',
    dateColumn: 'date',
    valueColumn: 'value',
    filter: null,
    groupBy: null,
    decimal: '.',
    delimiter: ',',
    ...over,
  };
}
