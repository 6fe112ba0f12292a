/**
 * The Brief model as JSON: NaN becomes null (JSON.stringify's own rule), chart SVG and scenes are left out (the HTML
 * and PDF carry it), keys in the model's order, so two runs with SOURCE_DATE_EPOCH set give the same bytes.
 *
 * Lists of numbers (the components, one value a period) are written on one line each, and put together as
 * bytes piece by piece: a million hourly periods make eight such lists, which indented one value a line
 * would be over a quarter of a gigabyte of text, held as one string.
 */
import type { Brief } from '../brief/model.js';

/** Lists at least this long are written on one line. */
const INLINE_FROM = 8;
/** Values encoded per piece. */
const PIECE = 65_536;

type Item = number | string | null;

/** A long list of numbers (null for undefined) or of strings (the periods' dates). */
function isPlainList(v: unknown): v is Item[] {
  if (!Array.isArray(v) || v.length < INLINE_FROM) return false;
  const strings = typeof v[0] === 'string';
  for (const x of v) if (strings ? typeof x !== 'string' : typeof x !== 'number' && x !== null) return false;
  return true;
}

/** A list as JSON bytes, "[1,2.5,null]", encoded in pieces. */
function listBytes(list: readonly Item[]): Buffer[] {
  const out: Buffer[] = [Buffer.from('[')];
  const texts: string[] = [];
  for (let from = 0; from < list.length; from += PIECE) {
    const to = Math.min(list.length, from + PIECE);
    texts.length = 0;
    for (let i = from; i < to; i++) {
      const v = list[i];
      // A finite number's JSON is its String (ECMA-262 Number::toString in both); NaN and ±∞ are null.
      texts.push(
        typeof v === 'number' ? (Number.isFinite(v) ? String(v) : 'null') : v === null ? 'null' : JSON.stringify(v),
      );
    }
    out.push(Buffer.from((from === 0 ? '' : ',') + texts.join(','), 'utf8'));
  }
  out.push(Buffer.from(']'));
  return out;
}

/** The brief as JSON bytes, in pieces (a long series' components are hundreds of megabytes). */
export function renderJsonPieces(brief: Brief): Buffer[] {
  const plain = {
    ...brief,
    series: brief.series.map((s) => ({ ...s, charts: s.charts.map(({ svg: _svg, scene: _scene, ...rest }) => rest) })),
  };
  const lists: Item[][] = [];
  // A placeholder no text of the brief can contain (JSON escapes control characters in strings).
  const mark = (k: number) => `\u0000list${k}\u0000`;
  const skeleton = JSON.stringify(
    plain,
    (_key, value) => {
      if (!isPlainList(value)) return value;
      lists.push(value);
      return mark(lists.length - 1);
    },
    2,
  );
  const parts: Buffer[] = [];
  const found = [...skeleton.matchAll(/"\\u0000list(\d+)\\u0000"/g)];
  // A text of the brief that is itself such a placeholder (a NUL-framed label): plain JSON instead.
  if (found.length !== lists.length || found.some((m, k) => Number(m[1]) !== k))
    return [Buffer.from(`${JSON.stringify(plain, null, 2)}\n`, 'utf8')];
  let at = 0;
  for (const m of found) {
    parts.push(Buffer.from(skeleton.slice(at, m.index), 'utf8'), ...listBytes(lists[Number(m[1])]));
    at = (m.index ?? 0) + m[0].length;
  }
  parts.push(Buffer.from(`${skeleton.slice(at)}\n`, 'utf8'));
  return parts;
}

/** The brief as JSON bytes. */
export function renderJsonBytes(brief: Brief): Buffer {
  return Buffer.concat(renderJsonPieces(brief));
}

/** The brief as JSON text. */
export function renderJson(brief: Brief): string {
  return renderJsonBytes(brief).toString('utf8');
}
