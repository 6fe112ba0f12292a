/**
 * The rows a fast reader (csv-fast.ts, json-fast.ts) keeps, in typed arrays rather than as cells: each kept
 * row's instant, value and group, and no text but the group names. From them it makes what the general
 * path of load.ts makes from a table of cells, by the same steps in the same order: dates of one written
 * kind, the frequency (the job's, checked, or inferred), groups in first-seen order, each laid on its
 * regular index.
 *
 * A fast reader is only ever right or silent: at the first thing that is not plainly fine (a date that does
 * not parse, two rows in one period, a group with no values, …) it gives up (null) and the general path
 * reads the file again, so that every message stays the general path's own, word for word.
 */

import type { Frequency } from '../vocabulary/period-index.js';
import type { DataSpec } from '../vocabulary/settings.js';
import {
  type DateKind,
  fitsFrequency,
  inferFrequencyOf,
  KIND_FREQUENCY,
  type ParsedPeriod,
  parsePeriod,
} from './dates.js';
import { type LoadedGroup, periodOrdinal, placedGroup, placeRows } from './place.js';

export interface KeptRows {
  /** Data rows (or records) in the file, kept or not. */
  rowCount: number;
  /** Rows kept by the filter so far. */
  n: number;
  utcMs: Float64Array;
  values: Float64Array;
  /** Group index of each kept row, or null when the job does not split the data. */
  group: Int32Array | null;
  /** Group names by index, in first-seen order. */
  keys: string[];
  ids: Map<string, number>;
  kind: DateKind | null;
}

export function keptRows(capacity: number, grouped: boolean): KeptRows {
  return {
    rowCount: 0,
    n: 0,
    utcMs: new Float64Array(capacity),
    values: new Float64Array(capacity),
    group: grouped ? new Int32Array(capacity) : null,
    keys: [],
    ids: new Map(),
    kind: null,
  };
}

/** The group index of a name, a new one when first seen; −1 for an empty name (an error in the general path). */
export function groupIndex(rows: KeptRows, name: string): number {
  if (name === '') return -1;
  let id = rows.ids.get(name);
  if (id === undefined) {
    id = rows.keys.length;
    rows.keys.push(name);
    rows.ids.set(name, id);
  }
  return id;
}

/**
 * Keeps one row: its date text (already trimmed), value and group index. False when the date does not
 * parse or is of another written kind than the first kept row's.
 */
export function keepRow(rows: KeptRows, date: string, value: number, group: number): boolean {
  const p = parsePeriod(date);
  if (p === null) return false;
  if (rows.kind === null) rows.kind = p.kind;
  else if (p.kind !== rows.kind) return false;
  const k = rows.n;
  rows.utcMs[k] = p.utcMs;
  rows.values[k] = value;
  if (rows.group !== null) rows.group[k] = group;
  rows.n = k + 1;
  return true;
}

/** What load.ts returns, less the file's name and hash; null where the general path would stop. */
export function assemble(
  rows: KeptRows,
  spec: DataSpec,
  hint: Frequency | null,
): { frequency: Frequency; groups: LoadedGroup[] } | null {
  const n = rows.n;
  if (n === 0 || rows.kind === null) return null;
  const kind = rows.kind;
  const utcMs = rows.utcMs.subarray(0, n);
  let frequency: Frequency;
  if (hint === null) frequency = inferFrequencyOf(kind, utcMs);
  else {
    const p: ParsedPeriod = { kind, utcMs: 0, frequency: KIND_FREQUENCY[kind] };
    for (let k = 0; k < n; k++) {
      p.utcMs = utcMs[k];
      if (!fitsFrequency(p, hint)) return null;
    }
    frequency = hint;
  }
  const midnight = kind === 'datetime' && frequency !== 'hourly';
  // Each row's period ordinal over its instant: nothing reads the instants after this.
  const ordinalOf = utcMs;
  for (let k = 0; k < n; k++) ordinalOf[k] = periodOrdinal(frequency, utcMs[k]);
  const groups: LoadedGroup[] = [];
  for (const [key, members] of groupMembers(rows, spec.groupBy !== null)) {
    const count = members === null ? n : members.length;
    let ordinals = ordinalOf;
    let values = rows.values.subarray(0, n);
    if (members !== null) {
      ordinals = new Float64Array(count);
      values = new Float64Array(count);
      for (let k = 0; k < count; k++) {
        ordinals[k] = ordinalOf[members[k]];
        values[k] = rows.values[members[k]];
      }
    }
    const placed = placeRows(ordinals, values);
    if (!placed.ok || placed.missing === count) return null;
    const group = placedGroup(key, frequency, placed, count);
    if (midnight) group.notes.unshift('every date-time is at midnight, so they were read as dates');
    groups.push(group);
  }
  return { frequency, groups };
}

/**
 * The kept rows of each group in file order, groups in first-seen order (a stable counting sort); one
 * group of every row (null) when the data is not split.
 */
function groupMembers(rows: KeptRows, grouped: boolean): [string | null, Int32Array | null][] {
  if (!grouped || rows.group === null) return [[null, null]];
  const n = rows.n;
  const g = rows.group;
  const count = rows.keys.length;
  const start = new Int32Array(count + 1);
  for (let k = 0; k < n; k++) start[g[k] + 1]++;
  for (let j = 0; j < count; j++) start[j + 1] += start[j];
  const order = new Int32Array(n);
  const fill = start.slice(0, count);
  for (let k = 0; k < n; k++) order[fill[g[k]]++] = k;
  return rows.keys.map((key, j) => [key, order.subarray(start[j], start[j + 1])]);
}
