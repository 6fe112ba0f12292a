/**
 * Laying one group's rows on its regular calendar index, shared by every way of reading a file: the
 * ordinal of each row's period, the slot of each row from the first period to the last (NaN where no row
 * or no value), and the group as later stages receive it, with its gaps and notes. Problems (a row far
 * from the others, two rows in one period) come back as data for the caller to word, since only the caller
 * knows the rows' places in the file.
 *
 *   placeRows([24290, 24288], [3, 1]) → { lo: 24288, length: 3, values: [1, NaN, 3], sorted: false, … }
 */
import { type Frequency, ordinalOf, type Series, startOf } from '../vocabulary/period-index.js';
import { civilFromDays } from './dates.js';

export interface LoadedGroup {
  /** The value of the group column, or null when the job does not split the data. */
  key: string | null;
  series: Series;
  /** ISO text of every period of the series (calendar.isoOf); made when first read. */
  dates: string[];
  /** ISO text of every period whose value is missing (no row, or an empty or NA cell). */
  gaps: string[];
  /** Plain sentences about what loading did (sorting, missing values). */
  notes: string[];
}

const DAY_MS = 86_400_000;

/**
 * calendar.ordinalOf without its Date for the frequencies that are plain arithmetic, since this runs once
 * per row; the tests check both agree.
 */
export function periodOrdinal(frequency: Frequency, utcMs: number): number {
  switch (frequency) {
    case 'hourly':
      return Math.floor(utcMs / 3_600_000);
    case 'daily':
      return Math.floor(utcMs / DAY_MS);
    case 'weekly':
      // Day 0 (1970-01-01) is a Thursday, three days after the Monday that starts week ordinal 0.
      return Math.floor((Math.floor(utcMs / DAY_MS) + 3) / 7);
    default:
      return ordinalOf(frequency, utcMs);
  }
}

export type Placement =
  | {
      ok: true;
      /** Ordinal of the first period. */
      lo: number;
      length: number;
      /** One slot per period; NaN where no row or no value. */
      values: Float64Array;
      /** Whether the rows came in date order. */
      sorted: boolean;
      /** Rows whose value is missing. */
      missing: number;
    }
  | { ok: false; problem: 'span'; length: number }
  | { ok: false; problem: 'duplicate'; first: number; second: number; ordinal: number };

/**
 * The rows (ordinals and values, in file order) on a regular index. A span far longer than the rows could
 * fill (over 50 periods a row, plus 1000) is refused before any slot is made: one mistyped year would
 * otherwise ask for millions of slots.
 */
export function placeRows(ordinals: Float64Array, values: Float64Array): Placement {
  const n = ordinals.length;
  let lo = Number.POSITIVE_INFINITY;
  let hi = Number.NEGATIVE_INFINITY;
  let sorted = true;
  let missing = 0;
  for (let k = 0; k < n; k++) {
    const o = ordinals[k];
    if (o < lo) lo = o;
    if (o > hi) hi = o;
    if (k > 0 && o < ordinals[k - 1]) sorted = false;
    if (Number.isNaN(values[k])) missing++;
  }
  const length = hi - lo + 1;
  if (length > 50 * n + 1000) return { ok: false, problem: 'span', length };
  const out = new Float64Array(length).fill(Number.NaN);
  // One byte a slot; which row took a slot is looked up only when a second row wants it.
  const taken = new Uint8Array(length);
  for (let k = 0; k < n; k++) {
    const o = ordinals[k];
    const slot = o - lo;
    if (taken[slot] !== 0)
      return { ok: false, problem: 'duplicate', first: ordinals.indexOf(o), second: k, ordinal: o };
    taken[slot] = 1;
    out[slot] = values[k];
  }
  return { ok: true, lo, length, values: out, sorted, missing };
}

/**
 * The group a placement makes: gaps and notes now, the text of every period only when something reads
 * it (a million hourly periods as text take far more memory than their values).
 */
export function placedGroup(
  key: string | null,
  frequency: Frequency,
  p: Extract<Placement, { ok: true }>,
  rows: number,
): LoadedGroup {
  const { lo, length, values } = p;
  const gaps: string[] = [];
  for (let s = 0; s < length; s++) if (Number.isNaN(values[s])) gaps.push(periodTexts(frequency, lo + s, 1)[0]);
  const notes: string[] = [];
  if (!p.sorted) notes.push('rows were not in date order; sorted');
  const noRow = length - rows;
  if (noRow > 0)
    notes.push(`${noRow} ${plural(noRow, 'period')} had no row and ${noRow === 1 ? 'is' : 'are'} treated as missing`);
  if (p.missing > 0) {
    notes.push(`${p.missing} ${plural(p.missing, 'row')} had an empty or NA value, treated as missing`);
  }
  let dates: string[] | null = null;
  return {
    key,
    series: { index: { frequency, start: lo, length }, values },
    get dates(): string[] {
      dates ??= periodTexts(frequency, lo, length);
      return dates;
    },
    set dates(v: string[]) {
      dates = v;
    },
    gaps,
    notes,
  };
}

function plural(n: number, word: string): string {
  return n === 1 ? word : `${word}s`;
}

export function pad2(v: number): string {
  return v < 10 ? `0${v}` : String(v);
}

function dayText(days: number): string {
  const { y, m, d } = civilFromDays(days);
  return `${y}-${pad2(m)}-${pad2(d)}`;
}

/**
 * calendar.isoOf for `length` periods from `start`, by date arithmetic instead of a Date per period (a
 * year of hours is 8760 periods); the tests check it against isoOf.
 */
export function periodTexts(frequency: Frequency, start: number, length: number): string[] {
  const out = new Array<string>(length);
  switch (frequency) {
    case 'monthly':
    case 'quarterly':
    case 'weekly':
      for (let s = 0; s < length; s++) out[s] = dayText(Math.floor(startOf(frequency, start + s) / DAY_MS));
      return out;
    case 'daily':
      for (let s = 0; s < length; s++) out[s] = dayText(start + s);
      return out;
    case 'hourly': {
      let day = Number.NaN;
      let text = '';
      for (let s = 0; s < length; s++) {
        const o = start + s;
        const d = Math.floor(o / 24);
        if (d !== day) {
          day = d;
          text = dayText(d);
        }
        out[s] = `${text}T${pad2(o - d * 24)}:00Z`;
      }
      return out;
    }
  }
}
