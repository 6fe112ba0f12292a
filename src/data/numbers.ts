/**
 * Reading the value column: a cell's text as a number under the job's decimal mark.
 * Accepted: plain numbers (1234.5, -3, 1.5e3), thousands separators in groups of three (with decimal '.':
 * 1,234.5 and 1 234.5; with decimal ',': 1.234,5 and 1 234,5; the space may also be U+00A0, the narrow
 * U+202F or the thin U+2009 that typesetting locales use) or in the Indian 12,34,567 grouping, a leading
 * '-', '+' or Unicode minus U+2212, and surrounding white space. Empty cells and NA, N/A, NaN, null (any case) are missing values and give NaN.
 * Everything else is a problem the loader reports with its row and column: other text, infinities, and
 * magnitudes above 1e15 (beyond that, doubles no longer hold every integer and the column is most likely
 * an identifier or a date).
 *
 *   parseNumber('1 234,5', ',') → 1234.5;  parseNumber('NA', '.') → NaN;  parseNumber('12a', '.') → { problem, hint }
 */

/** Why a cell is not a number, and how to fix it. */
export interface NumberProblem {
  problem: string;
  hint: string;
}

export type Decimal = '.' | ',';

export const MAX_MAGNITUDE = 1e15;

const MISSING = new Set(['na', 'n/a', 'nan', 'null']);

/** The number a cell holds, NaN for a missing value, or the problem that stops it being read. */
export function parseNumber(text: string, decimal: Decimal): number | NumberProblem {
  const fast = plainNumber(text, decimal);
  if (fast !== undefined) return checkMagnitude(fast, text);
  return slowNumber(text, decimal);
}

/**
 * The cheap path for the usual cell: an optional '-' then digits with at most one decimal mark.
 * Undefined when the cell needs the full reading.
 */
function plainNumber(s: string, decimal: Decimal): number | undefined {
  const n = s.length;
  if (n === 0) return Number.NaN;
  const mark = decimal === '.' ? 46 : 44;
  let i = s.charCodeAt(0) === 45 ? 1 : 0;
  if (i === n) return undefined;
  let marks = 0;
  let digitsSeen = 0;
  for (; i < n; i++) {
    const c = s.charCodeAt(i);
    if (c >= 48 && c <= 57) digitsSeen++;
    else if (c === mark && marks === 0) marks++;
    else return undefined;
  }
  if (digitsSeen === 0) return undefined;
  return Number(decimal === '.' || marks === 0 ? s : s.replace(',', '.'));
}

function checkMagnitude(v: number, text: string): number | NumberProblem {
  if (Math.abs(v) > MAX_MAGNITUDE) {
    return {
      problem: `"${text}" is too large to be a value (more than 1e15 in size)`,
      hint: 'check that the value column holds measurements, not identifiers or dates',
    };
  }
  return v;
}

function isGroupSpace(c: number): boolean {
  return c === 32 || c === 0xa0 || c === 0x202f || c === 0x2009;
}

function slowNumber(text: string, decimal: Decimal): number | NumberProblem {
  const s = text.trim();
  if (s === '') return Number.NaN;
  const lower = s.toLowerCase();
  if (MISSING.has(lower)) return Number.NaN;
  let i = 0;
  let negative = false;
  const c0 = s.charCodeAt(0);
  if (c0 === 45 || c0 === 0x2212) {
    negative = true;
    i = 1;
  } else if (c0 === 43) i = 1;
  const body = lower.slice(i);
  if (body === 'inf' || body === 'infinity' || body === '∞') {
    return {
      problem: `"${text}" is not a finite number`,
      hint: 'leave the cell empty or write NA for a missing value',
    };
  }
  const mark = decimal === '.' ? 46 : 44;
  const groupMark = decimal === '.' ? 44 : 46;
  let clean = negative ? '-' : '';
  let groupSep = -1; // the separator used, once one is seen
  const groups: number[] = []; // digits in each group before the decimal mark
  let run = 0;
  let digitsSeen = 0;
  let seenMark = false;
  let bad = false;
  for (; i < s.length; i++) {
    const c = s.charCodeAt(i);
    if (c >= 48 && c <= 57) {
      clean += s[i];
      digitsSeen++;
      if (!seenMark) run++;
    } else if (!seenMark && (c === groupMark || isGroupSpace(c))) {
      const kind = c === groupMark ? groupMark : 32;
      if (groupSep !== -1 && groupSep !== kind) bad = true;
      groupSep = kind;
      groups.push(run);
      run = 0;
    } else if (c === mark && !seenMark) {
      seenMark = true;
      clean += '.';
    } else if ((c === 101 || c === 69) && groupSep === -1 && digitsSeen > 0) {
      // An exponent: the rest must be an optionally signed integer.
      const exp = s.slice(i + 1);
      if (!/^[+-]?\d{1,3}$/.test(exp)) bad = true;
      clean += `e${exp}`;
      break;
    } else {
      bad = true;
      break;
    }
  }
  if (groupSep !== -1) {
    groups.push(run);
    if (!validGrouping(groups)) bad = true;
  }
  if (bad || digitsSeen === 0) return notANumber(text, s, decimal);
  return checkMagnitude(Number(clean), text);
}

/**
 * Thousands grouping: a first group of one to three digits, then groups of three (common practice), or the
 * Indian lakh–crore grouping 12,34,567: a first group of one or two, then twos, then a last three (CLDR
 * en-IN and hi number patterns, from memory).
 */
function validGrouping(groups: readonly number[]): boolean {
  const n = groups.length;
  const first = groups[0];
  if (first < 1 || first > 3) return false;
  if (groups[n - 1] !== 3) return false;
  let western = true;
  let indian = first <= 2 && n >= 3;
  for (let g = 1; g < n - 1; g++) {
    if (groups[g] !== 3) western = false;
    if (groups[g] !== 2) indian = false;
  }
  return western || indian;
}

function notANumber(text: string, s: string, decimal: Decimal): NumberProblem {
  const problem = `"${text}" is not a number`;
  if (s.endsWith('%')) return { problem, hint: 'write the number without the % sign' };
  // One other mark between digits (it was not valid grouping), or both marks in the wrong order, read as
  // the other decimal convention.
  const other = decimal === '.' ? ',' : '.';
  const loneOther = new RegExp(`^[-+\u2212]?\\d+\\${other}\\d+$`).test(s);
  if (loneOther || (s.includes(other) && s.includes(decimal))) {
    const written = decimal === '.' ? 'a decimal comma' : 'a decimal point';
    return {
      problem,
      hint: `it looks like ${written}, but the job's locale sets the decimal mark to "${decimal}"; set the decimal mark to "${other}" for this data`,
    };
  }
  const example = decimal === '.' ? '1234.5' : '1234,5';
  return { problem, hint: `write plain numbers like ${example}; the job's locale sets the decimal mark` };
}
