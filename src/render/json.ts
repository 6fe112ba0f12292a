/**
 * The Brief model as JSON: NaN becomes null (JSON.stringify's own rule), chart SVG and scenes are left out (the HTML
 * and PDF carry it), keys in the model's order, so two runs with SOURCE_DATE_EPOCH set give the same bytes.
 *
 * Lists of numbers (the components, one value a period) are written on one line each, and made as bytes
 * piece by piece while the file is written: a million hourly periods make eight such lists, which indented
 * one value a line would be over a quarter of a gigabyte of text, held as one string, and which even on one
 * line are 170 MB that need never be in memory at once.
 */
import type { Brief } from '../vocabulary/brief.js';

/**
 * Keys of the model that only later stages read: the periods' ordinals (vocabulary/period-index.ts), which
 * the JSON gives as the ISO labels beside them.
 */
const MODEL_ONLY = new Set(['periodIndex', 'ordinals']);

/** Lists at least this long are written on one line. */
const INLINE_FROM = 8;

type Item = number | string | null;

/** A long list of numbers (null for undefined) or of strings (the periods' dates). */
function isPlainList(v: unknown): v is Item[] {
  if (!Array.isArray(v) || v.length < INLINE_FROM) return false;
  const strings = typeof v[0] === 'string';
  for (const x of v) if (strings ? typeof x !== 'string' : typeof x !== 'number' && x !== null) return false;
  return true;
}

/** Values per piece of a long list. */
const PIECE = 4096;

/**
 * A list as JSON bytes, "[1,2.5,null]", in pieces of a few thousand values, each made only when the one
 * before has been taken, so the text of a million values is never held at once. Each piece is
 * JSON.stringify of a slice of the list (numbers in their shortest round-trip form, NaN and ±∞ as null,
 * strings escaped), without its brackets: the serialiser writes numbers straight into its output, where
 * String() of each value made a string per number that the collector moved to the old generation before
 * it died — hundreds of megabytes of heap for the lists of a million hourly periods.
 */
function* listBytes(list: readonly Item[]): Generator<Buffer> {
  yield Buffer.from('[');
  for (let from = 0; from < list.length; from += PIECE) {
    const text = JSON.stringify(list.slice(from, from + PIECE));
    // Between pieces a comma takes the place of "][".
    yield Buffer.from(from === 0 ? text.slice(1, -1) : `,${text.slice(1, -1)}`, 'utf8');
  }
  yield Buffer.from(']');
}

/**
 * The brief as JSON bytes, in pieces made as they are taken (a long series' components are hundreds of
 * megabytes): the brief must not change until the last piece is taken.
 */
export function* renderJsonPieces(brief: Brief): Generator<Buffer> {
  const plain = {
    ...brief,
    series: brief.series.map((s) => ({ ...s, charts: s.charts.map(({ svg: _svg, scene: _scene, ...rest }) => rest) })),
  };
  const lists: Item[][] = [];
  // A placeholder no text of the brief can contain (JSON escapes control characters in strings).
  const mark = (k: number) => `\u0000list${k}\u0000`;
  const skeleton = JSON.stringify(
    plain,
    (key, value) => {
      if (MODEL_ONLY.has(key)) return undefined;
      if (!isPlainList(value)) return value;
      lists.push(value);
      return mark(lists.length - 1);
    },
    2,
  );
  const found = [...skeleton.matchAll(/"\\u0000list(\d+)\\u0000"/g)];
  // A text of the brief that is itself such a placeholder (a NUL-framed label): plain JSON instead.
  if (found.length !== lists.length || found.some((m, k) => Number(m[1]) !== k)) {
    yield Buffer.from(
      `${JSON.stringify(plain, (key, value) => (MODEL_ONLY.has(key) ? undefined : value), 2)}\n`,
      'utf8',
    );
    return;
  }
  let at = 0;
  for (const m of found) {
    yield Buffer.from(skeleton.slice(at, m.index), 'utf8');
    yield* listBytes(lists[Number(m[1])]);
    at = (m.index ?? 0) + m[0].length;
  }
  yield Buffer.from(`${skeleton.slice(at)}\n`, 'utf8');
}

/** The brief as JSON bytes. */
export function renderJsonBytes(brief: Brief): Buffer {
  return Buffer.concat([...renderJsonPieces(brief)]);
}

/** The brief as JSON text. */
export function renderJson(brief: Brief): string {
  return renderJsonBytes(brief).toString('utf8');
}
