/**
 * Reading a JSON data file: an array of records (objects), one per observation, whose values are numbers,
 * strings or null, e.g. [{"month": "2024-01", "sales": 12.5}, ...]. The columns are the keys in the order
 * first seen; a record without a key has null there. Invalid JSON is reported at the line and column the
 * parser names; a record that is not an object at its own line.
 */
import { BriefError, type Place } from '../errors.js';
import { type Cell, decodeText, type Table } from './csv.js';

export interface JsonOptions {
  /** The path as written in the job, for messages. */
  file: string;
}

export function readJson(bytes: Uint8Array, options: JsonOptions): Table {
  const file = options.file;
  const text = decodeText(bytes, file);
  if (text.trim() === '') {
    throw new BriefError('data-empty', 'the file is empty', 'write the data as a JSON array of records', { file });
  }
  let data: unknown;
  try {
    data = JSON.parse(text);
  } catch (e) {
    throw syntaxError(e, text, file);
  }
  if (!Array.isArray(data)) {
    const obj = data !== null && typeof data === 'object' ? (data as Record<string, unknown>) : null;
    const under = obj ? Object.keys(obj).find((k) => Array.isArray(obj[k])) : undefined;
    throw new BriefError(
      'data-json-shape',
      under !== undefined
        ? `the file holds an object whose records are under "${under}", not an array of records`
        : 'the file does not hold an array of records',
      'write the data as a top-level array: [{"date": "2024-01", "value": 12.5}, ...]',
      { file, line: 1 },
    );
  }
  if (data.length === 0) {
    throw new BriefError('data-no-rows', 'the array of records is empty', 'add one record per observation', {
      file,
      line: 1,
    });
  }
  let lines: number[] | null = null;
  const lineOf = (i: number): number => {
    lines ??= recordLines(text);
    return lines[i] ?? 1;
  };
  const placeOf = (i: number, field?: string): Place =>
    field === undefined ? { file, line: lineOf(i) } : { file, line: lineOf(i), field };

  const index = new Map<string, number>();
  const columns: string[] = [];
  for (let i = 0; i < data.length; i++) {
    const rec = data[i];
    if (rec === null || typeof rec !== 'object' || Array.isArray(rec)) {
      throw new BriefError(
        'data-json-shape',
        `record ${i + 1} is ${rec === null ? 'null' : Array.isArray(rec) ? 'an array' : `a ${typeof rec}`}, not an object`,
        'write each record as an object of named values: {"date": "2024-01", "value": 12.5}',
        placeOf(i),
      );
    }
    for (const key in rec) {
      if (!index.has(key)) {
        index.set(key, columns.length);
        columns.push(key);
      }
    }
  }
  const cells: Cell[][] = columns.map(() => new Array<Cell>(data.length).fill(null));
  for (let i = 0; i < data.length; i++) {
    const rec = data[i] as Record<string, unknown>;
    for (const key in rec) cells[index.get(key)!][i] = cellOf(rec[key]);
  }
  return {
    columns,
    rowCount: data.length,
    cells,
    placeOf,
    nameOf: (i) => `record ${i + 1} (line ${lineOf(i)})`,
    headerPlace: (field) => (field === undefined ? { file } : { file, field }),
  };
}

/** Numbers, strings and null stay as they are; anything else keeps its JSON text so messages can quote it. */
function cellOf(v: unknown): Cell {
  if (v === null || v === undefined) return null;
  if (typeof v === 'number' || typeof v === 'string') return v;
  return JSON.stringify(v);
}

/** JSON.parse names a character position ("at position 41") or, in newer engines, a line and column. */
function syntaxError(e: unknown, text: string, file: string): BriefError {
  const message = e instanceof Error ? e.message : String(e);
  const place: Place = { file };
  const lc = /line (\d+) column (\d+)/.exec(message);
  // Node 20 names no position for an unexpected character ("Unexpected token 'x', ..."): find it.
  const named = /position (\d+)/.exec(message);
  const offset = named ? Number(named[1]) : /end of JSON input/.test(message) ? null : errorOffset(text);
  if (lc) {
    place.line = Number(lc[1]);
    place.column = Number(lc[2]);
  } else if (/end of JSON input/.test(message)) {
    place.line = text.trimEnd().split('\n').length;
  } else if (offset !== null) {
    // A position past the last text (end of input) is shown at the end of the last non-blank line.
    const at = Math.min(offset, text.trimEnd().length);
    let line = 1;
    let lineStart = 0;
    for (let i = 0; i < at && i < text.length; i++) {
      if (text.charCodeAt(i) === 10) {
        line++;
        lineStart = i + 1;
      }
    }
    place.line = line;
    place.column = at - lineStart + 1;
  }
  // Keep the engine's description but drop its restatement of the position and of the text (which may
  // be cut short, "...text...", and hold line breaks); control characters are shown escaped: one line.
  const what = message
    .replace(/, (\.\.\.)?".*"(\.\.\.)? is not valid JSON$/s, '')
    .replace(/( in JSON)? at position \d+( \(line \d+ column \d+\))?/, '')
    .replace(/[\p{Cc}\u2028\u2029]/gu, (c) => JSON.stringify(c).slice(1, -1))
    .trim();
  return new BriefError(
    'data-json-syntax',
    `the file is not valid JSON: ${what || 'unexpected text'}`,
    'fix the JSON here; a common cause is a trailing comma or a missing quote',
    place,
  );
}

/**
 * Offset of the character JSON.parse stops at, when its message does not say: the shortest prefix that
 * fails for a reason other than ending too soon ends with it (parsing runs left to right, so every
 * longer prefix fails there too).
 */
function errorOffset(text: string): number {
  const failsInside = (k: number): boolean => {
    try {
      JSON.parse(text.slice(0, k));
      return false;
    } catch (e) {
      const m = e instanceof Error ? e.message : '';
      if (/end of JSON input/.test(m)) return false;
      const p = /position (\d+)/.exec(m);
      return p === null || Number(p[1]) < k;
    }
  };
  let lo = 1;
  let hi = text.length;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (failsInside(mid)) hi = mid;
    else lo = mid + 1;
  }
  return lo - 1;
}

/**
 * The 1-based line on which each element of the top-level array starts, found by one scan that skips
 * strings; only run when a message needs a line.
 */
export function recordLines(text: string): number[] {
  const out: number[] = [];
  let line = 1;
  let depth = 0;
  let expectValue = false;
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    if (c === 10) {
      line++;
      continue;
    }
    if (c === 32 || c === 9 || c === 13 || c === 0xfeff) continue;
    if (depth === 1 && expectValue && c !== 44 && c !== 93) {
      out.push(line);
      expectValue = false;
    }
    if (c === 34) {
      // Skip the string, minding escapes; strings hold no raw newlines in valid JSON.
      for (i++; i < text.length; i++) {
        const d = text.charCodeAt(i);
        if (d === 92) i++;
        else if (d === 34) break;
      }
    } else if (c === 91 || c === 123) {
      depth++;
      if (depth === 1) expectValue = true;
    } else if (c === 93 || c === 125) depth--;
    else if (c === 44 && depth === 1) expectValue = true;
  }
  return out;
}
