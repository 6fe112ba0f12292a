/**
 * Tables of the PDF brief: column widths from the cells' measured widths, text a step smaller when the
 * columns do not fit, cells that wrap rather than run over, and rows that continue on the next page under
 * a repeated header. Every cell is measured once, at a reference size, and scaled: a font's advance widths
 * are linear in its size, so trying a smaller size costs no new measuring.
 */
import type { Table } from '../../document/view.js';
import { WORDS } from '../../document/words.js';
import type { Face } from './fonts.js';
import { ensure, type Flow, lineHeight, newPage, rule } from './layout.js';
import { artifact, beginCell, endCell, group, leaf, type Struct, tableRow } from './tags.js';
import { drawPlainLine, drawText, lineBlock, measureText, type PlainLine, plainLine, textWidth } from './text.js';
import type { TextStyle } from './theme.js';

export interface TableOptions {
  /** Text sizes to try, largest first. */
  sizes: number[];
  /** Show the header row (a list of facts has none). */
  header?: boolean;
  /** Fixed column shares of the width instead of widths from the content. */
  fractions?: number[];
  /** Colour of the first column's cells (the row labels). */
  labelColour?: string;
  /** Vertical padding of a row, in points. */
  padY?: number;
  spaceAfter?: number;
  /** Keep the whole table on one page when it fits on one. */
  keepTogether?: boolean;
}

const REFERENCE = 10;
/** Space between two columns, in points. */
const GUTTER = 9;
/** Added to measured widths so a word exactly as wide as its column is not broken by rounding. */
const SLACK = 0.5;
/** A table starts only where its caption, header and first rows fit. */
const FIRST_ROWS = 3;

/**
 * The rows before which a long table turns the page. Rows fill each page in order; then, if that leaves
 * the last page fewer than FIRST_ROWS rows (a widow), the last turn moves up so the last page gets
 * FIRST_ROWS, provided the page before keeps at least as many and the moved rows fit. Each new page
 * starts at `top` and repeats the continued caption and the header (`repeated`, added in that order,
 * as the drawing adds them, so the sums round the same way).
 */
export function pageBreaks(
  heights: readonly number[],
  startY: number,
  page: { top: number; repeated: readonly number[]; bottom: number },
): Set<number> {
  const turns: number[] = [];
  const fresh = (): number => {
    let y = page.top;
    for (const h of page.repeated) y += h;
    return y;
  };
  let y = startY;
  for (let r = 0; r < heights.length; r++) {
    if (y + heights[r] > page.bottom + 0.01) {
      turns.push(r);
      y = fresh();
    }
    y += heights[r];
  }
  const n = heights.length;
  const last = turns.length - 1;
  if (last >= 0 && n - turns[last] < FIRST_ROWS) {
    const previous = last > 0 ? turns[last - 1] : 0;
    const moved = Math.max(n - FIRST_ROWS, previous + FIRST_ROWS);
    if (moved < turns[last]) {
      let end = fresh();
      for (let r = moved; r < n; r++) end += heights[r];
      if (end <= page.bottom + 0.01) turns[last] = moved;
    }
  }
  return new Set(turns);
}

interface Measure {
  /** Natural width at the reference size of each header cell and each body cell (row-major). */
  head: Float64Array;
  body: Float64Array;
  /** Per column: widest body cell, widest header, widest single word anywhere. */
  maxBody: Float64Array;
  maxHead: Float64Array;
  minWord: Float64Array;
  /** Each header cell and body cell (row-major) as a plain line, where it is plain text (text.ts). */
  headLine: (PlainLine | null)[];
  bodyLine: (PlainLine | null)[];
}

interface Layout {
  size: number;
  widths: number[];
}

export function drawTable(flow: Flow, parent: Struct, table: Table, options: TableOptions): void {
  const { doc, geo, theme } = flow;
  const n = table.headers.length;
  const showHeader = options.header !== false;
  const m = measure(doc, table, showHeader);
  const layout = chooseLayout(m, n, geo.column, options);
  const { size, widths } = layout;
  const x0: number[] = [];
  for (let c = 0, x = geo.left; c < n; c++) {
    x0.push(x);
    x += widths[c] + GUTTER;
  }
  const padY = options.padY ?? 2.5;
  const bodyStyle: TextStyle = { face: 'Regular', size, colour: theme.ink, lineGap: -0.06 * size };
  const headStyle: TextStyle = { ...bodyStyle, face: 'Semibold' };
  const captionStyle: TextStyle = { face: 'Regular', size: size + 0.5, colour: theme.muted, lineGap: 0 };
  const line = lineHeight(doc, bodyStyle);
  const scale = size / REFERENCE;

  const linesOf = (text: string, natural: number, c: number, s: TextStyle): number => {
    if (natural * scale <= widths[c]) return 1;
    return Math.max(1, measureText(doc, text, s, widths[c]).lines.length);
  };
  const headLines = showHeader ? table.headers.map((h, c) => linesOf(h, m.head[c], c, headStyle)) : [];
  const headHeight = showHeader ? Math.max(...headLines) * line + 2 * padY : 0;
  const captionHeight = table.caption ? captionHeightOf(doc, captionStyle, table.caption, geo.column) : 0;
  const rowLines = (r: number): number[] =>
    table.rows[r].map((cell, c) => linesOf(cell, m.body[r * n + c], c, bodyStyle));

  const el = group(doc, parent, 'Table');
  const leading = options.keepTogether ? table.rows.length : FIRST_ROWS;
  const firstRows = table.rows.slice(0, leading).map((_, r) => Math.max(...rowLines(r)) * line + 2 * padY);
  ensure(flow, captionHeight + headHeight + firstRows.reduce((a, b) => a + b, 0));
  if (table.caption) {
    const top = flow.y;
    leaf(doc, el, 'Caption', () =>
      drawText(doc, measureText(doc, table.caption, captionStyle, geo.column), geo.left, top),
    );
    flow.y += captionHeight;
  }

  const drawCell = (
    text: string,
    natural: number,
    plain: PlainLine | null,
    c: number,
    y: number,
    lines: number,
    s: TextStyle,
  ): void => {
    const right = table.numeric[c] === true;
    if (lines === 1) {
      const x = right ? x0[c] + widths[c] - natural * scale : x0[c];
      if (plain !== null && plain.face === s.face) drawPlainLine(doc, plain, s, x, y);
      else drawText(doc, lineBlock(doc, text, s), x, y);
    } else {
      drawText(doc, measureText(doc, text, s, widths[c]), x0[c], y, {
        width: widths[c],
        align: right ? 'right' : 'left',
      });
    }
  };
  const headRow = (into: Struct | null): void => {
    const top = flow.y + padY;
    const maxLines = Math.max(...headLines);
    const draw = (c: number) =>
      drawCell(
        table.headers[c],
        m.head[c],
        m.headLine[c],
        c,
        top + (maxLines - headLines[c]) * line,
        headLines[c],
        headStyle,
      );
    if (into) {
      const tr = tableRow(doc, group(doc, into, 'THead'));
      for (let c = 0; c < n; c++) {
        const cell = beginCell(doc, tr, 'TH', 'Column');
        draw(c);
        endCell(doc, cell);
      }
      tr.end();
    } else {
      artifact(
        doc,
        () => {
          for (let c = 0; c < n; c++) draw(c);
        },
        'Pagination',
      );
    }
    flow.y += headHeight;
    artifact(doc, () => rule(doc, geo.left, flow.y, geo.column, theme.muted, 0.6));
  };
  if (showHeader) headRow(el);

  const tbody = group(doc, el, 'TBody');
  const labelStyle: TextStyle = { ...bodyStyle, colour: options.labelColour ?? theme.ink };
  let rules: number[] = [];
  const flushRules = (): void => {
    if (rules.length === 0) return;
    const ys = rules;
    artifact(doc, () => {
      doc.save().lineWidth(0.5).strokeColor(theme.faint);
      for (const y of ys) doc.moveTo(geo.left, y).lineTo(geo.right, y);
      doc.stroke().restore();
    });
    rules = [];
  };
  const lineCounts = table.rows.map((_, r) => rowLines(r));
  const heights = lineCounts.map((lines) => Math.max(...lines) * line + 2 * padY);
  const continuedHeight = table.caption
    ? captionHeightOf(doc, captionStyle, WORDS.continued(table.caption), geo.column)
    : 0;
  const breaks = pageBreaks(heights, flow.y, {
    top: geo.bodyTop,
    repeated: [continuedHeight, headHeight],
    bottom: geo.bodyBottom,
  });
  for (let r = 0; r < table.rows.length; r++) {
    const lines = lineCounts[r];
    const height = heights[r];
    if (breaks.has(r)) {
      flushRules();
      newPage(flow);
      if (table.caption) {
        const continued = WORDS.continued(table.caption);
        const top = flow.y;
        artifact(
          doc,
          () => drawText(doc, measureText(doc, continued, captionStyle, geo.column), geo.left, top),
          'Pagination',
        );
        flow.y += captionHeightOf(doc, captionStyle, continued, geo.column);
      }
      if (showHeader) headRow(null);
    }
    const top = flow.y + padY;
    const tr = tableRow(doc, tbody);
    const row = table.rows[r];
    for (let c = 0; c < n; c++) {
      const i = r * n + c;
      const cell = c === 0 ? beginCell(doc, tr, 'TH', 'Row') : beginCell(doc, tr, 'TD');
      drawCell(row[c], m.body[i], m.bodyLine[i], c, top, lines[c], c === 0 ? labelStyle : bodyStyle);
      endCell(doc, cell);
    }
    tr.end();
    flow.y += height;
    rules.push(flow.y);
  }
  flushRules();
  tbody.end();
  el.end();
  flow.y += options.spaceAfter ?? 12;
}

function captionHeightOf(doc: PDFKit.PDFDocument, s: TextStyle, caption: string, width: number): number {
  return measureText(doc, caption, s, width).height + 3;
}

/** Natural widths at the reference size: every cell once, words only when a cell holds a space. */
function measure(doc: PDFKit.PDFDocument, table: Table, header: boolean): Measure {
  const n = table.headers.length;
  const head = new Float64Array(n);
  const body = new Float64Array(table.rows.length * n);
  const maxBody = new Float64Array(n);
  const maxHead = new Float64Array(n);
  const minWord = new Float64Array(n);
  const headLine: (PlainLine | null)[] = new Array(n).fill(null);
  const bodyLine: (PlainLine | null)[] = new Array(table.rows.length * n);
  const widest = (text: string, whole: number, face: Face): number => {
    if (!text.includes(' ')) return whole;
    let w = 0;
    for (const word of text.split(' ')) w = Math.max(w, textWidth(doc, word, face, REFERENCE));
    return w;
  };
  // Plain text (most cells) is measured once per process (text.ts), with the same sums as textWidth's.
  if (header) {
    for (let c = 0; c < n; c++) {
      const p = plainLine(table.headers[c], 'Semibold');
      headLine[c] = p;
      head[c] = p ? (p.sum * REFERENCE) / 1000 : textWidth(doc, table.headers[c], 'Semibold', REFERENCE);
      maxHead[c] = head[c];
      minWord[c] = p ? (p.widest * REFERENCE) / 1000 : widest(table.headers[c], head[c], 'Semibold');
    }
  }
  for (let r = 0; r < table.rows.length; r++) {
    const row = table.rows[r];
    for (let c = 0; c < n; c++) {
      const text = row[c] ?? '';
      const p = plainLine(text, 'Regular');
      bodyLine[r * n + c] = p;
      const w = p ? (p.sum * REFERENCE) / 1000 : textWidth(doc, text, 'Regular', REFERENCE);
      body[r * n + c] = w;
      if (w > maxBody[c]) maxBody[c] = w;
      const word = p ? (p.widest * REFERENCE) / 1000 : widest(text, w, 'Regular');
      if (word > minWord[c]) minWord[c] = word;
    }
  }
  return { head, body, maxBody, maxHead, minWord, headLine, bodyLine };
}

/**
 * Widths in the manner of an automatic table layout: every column at its widest when that fits; else body
 * cells kept on one line and headers wrapped; else every cell wrapped at word boundaries. The first size at
 * which body cells stay whole wins; failing that, the first at which words stay whole; failing that, the
 * smallest size, where a word wider than its column breaks inside (pdfkit breaks it; nothing is dropped).
 */
function chooseLayout(m: Measure, n: number, width: number, options: TableOptions): Layout {
  const avail = width - GUTTER * (n - 1);
  if (options.fractions) {
    const total = options.fractions.reduce((a, b) => a + b, 0);
    return { size: options.sizes[0], widths: options.fractions.map((f) => (avail * f) / total) };
  }
  let wordsWhole: Layout | null = null;
  for (const size of options.sizes) {
    const k = size / REFERENCE;
    const max = Array.from(m.maxBody, (b, c) => Math.max(b, m.maxHead[c]) * k + SLACK);
    const keep = Array.from(m.maxBody, (b, c) => Math.max(b, m.minWord[c]) * k + SLACK);
    const min = Array.from(m.minWord, (w) => w * k + SLACK);
    if (sum(max) <= avail) return { size, widths: spread(max, max, avail) };
    if (sum(keep) <= avail) return { size, widths: spread(keep, max, avail) };
    if (wordsWhole === null && sum(min) <= avail) wordsWhole = { size, widths: spread(min, max, avail) };
  }
  if (wordsWhole) return wordsWhole;
  const size = options.sizes[options.sizes.length - 1];
  return {
    size,
    widths: capped(
      Array.from(m.minWord, (w) => w * (size / REFERENCE) + SLACK),
      avail,
    ),
  };
}

/**
 * Widths when the widest words cannot all fit: every column whose widest word fits in an equal share of
 * what is left keeps it whole; the columns with over-long words share the rest equally (water-filling).
 */
function capped(min: number[], avail: number): number[] {
  const sorted = [...min].sort((a, b) => a - b);
  let rest = avail;
  let left = min.length;
  let cap = Number.POSITIVE_INFINITY;
  for (const w of sorted) {
    if (w * left <= rest) {
      rest -= w;
      left--;
    } else {
      cap = rest / left;
      break;
    }
  }
  return min.map((w) => Math.min(w, cap));
}

/** from plus the room left over, shared in proportion to how much more each column would like (to). */
function spread(from: number[], to: number[], avail: number): number[] {
  const extra = avail - sum(from);
  const want = to.map((t, c) => Math.max(0, t - from[c]));
  const totalWant = sum(want);
  if (totalWant > 0 && extra <= totalWant) return from.map((f, c) => f + (extra * want[c]) / totalWant);
  // Everything fits at its widest: the rest is shared in proportion to the widths themselves.
  const base = from.map((f, c) => f + want[c]);
  const left = avail - sum(base);
  const totalBase = sum(base);
  return base.map((b) => b + (totalBase > 0 ? (left * b) / totalBase : left / base.length));
}

function sum(a: number[]): number {
  let s = 0;
  for (const v of a) s += v;
  return s;
}
