/**
 * The flow of the PDF brief: a cursor moving down the body text block, page breaks that never leave a
 * heading or a lone line at a page's foot, and paragraphs measured before they are set so nothing runs past
 * the column or the bottom margin (text.ts measures and sets them). Every page break goes through pdfkit's
 * continueOnNewPage, which carries open tagged content over to the new page.
 */
import { sharedFont } from './fonts.js';
import { leaf, type Struct } from './tags.js';
import { type DrawOptions, drawLines, measureText, type TextBlock } from './text.js';
import type { Geometry, TextStyle, Theme } from './theme.js';

export interface Flow {
  doc: PDFKit.PDFDocument;
  geo: Geometry;
  theme: Theme;
  /** Top of the next thing to set. */
  y: number;
}

/** Slack for rounding when comparing positions. */
const EPSILON = 0.01;

/** Height of one line of s (pdfkit's line height of the face, with the style's gap). */
export function lineHeight(_doc: PDFKit.PDFDocument, s: TextStyle): number {
  const f = sharedFont(s.face);
  return ((f.ascender - f.descender + f.lineGap) * s.size) / 1000 + s.lineGap;
}

/** Height of text set in s across width. */
export function textHeight(doc: PDFKit.PDFDocument, s: TextStyle, text: string, width: number): number {
  return measureText(doc, text, s, width).height;
}

/**
 * Sets a measured block at the cursor, line by line: a line that would run past the bottom margin starts a
 * new page (inside a structure element's closure, pdfkit carries the element over).
 */
export function setBlock(flow: Flow, b: TextBlock, x: number, options: DrawOptions = {}): void {
  const bottom = flow.geo.bodyBottom + EPSILON;
  for (let i = 0; i < b.lines.length; ) {
    if (flow.y + b.lineHeight > bottom && !atPageTop(flow)) newPage(flow);
    let j = i + 1;
    while (j < b.lines.length && flow.y + (j - i + 1) * b.lineHeight <= bottom) j++;
    drawLines(flow.doc, b, x, flow.y, options, i, j);
    flow.y += (j - i) * b.lineHeight;
    i = j;
  }
}

export function room(flow: Flow): number {
  return flow.geo.bodyBottom - flow.y;
}

export function atPageTop(flow: Flow): boolean {
  return flow.y <= flow.geo.bodyTop + EPSILON;
}

export function newPage(flow: Flow): void {
  flow.doc.continueOnNewPage();
  flow.y = flow.geo.bodyTop;
}

/** Starts a new page unless height fits below the cursor (or the page is still empty). */
export function ensure(flow: Flow, height: number): void {
  if (height > room(flow) + EPSILON && !atPageTop(flow)) newPage(flow);
}

/** Vertical space, dropped at the top of a page. */
export function space(flow: Flow, height: number): void {
  if (!atPageTop(flow)) flow.y = Math.min(flow.y + height, flow.geo.bodyBottom);
}

export interface ParagraphOptions {
  tag?: string;
  indent?: number;
  width?: number;
  /** Height of what must follow on the same page (a heading keeps its first lines). */
  keep?: number;
  spaceAfter?: number;
}

/**
 * Sets a paragraph at the cursor. A short one (up to three lines) moves whole to the next page when it does
 * not fit; a longer one is split line by line across the page break (setBlock), leaving at least two lines.
 */
export function paragraph(
  flow: Flow,
  parent: Struct,
  text: string,
  s: TextStyle,
  options: ParagraphOptions = {},
): void {
  const { doc, geo } = flow;
  const x = geo.left + (options.indent ?? 0);
  const width = options.width ?? geo.column - (options.indent ?? 0);
  const block = measureText(doc, text, s, width);
  const height = block.height;
  const line = block.lineHeight;
  // Three lines or fewer move whole; a longer paragraph needs two lines here and splits.
  ensure(flow, (height <= 3 * line + EPSILON ? height : 2 * line) + (options.keep ?? 0));
  leaf(doc, parent, options.tag ?? 'P', () => setBlock(flow, block, x));
  space(flow, options.spaceAfter ?? 0);
}

/** A heading kept together with `keep` points of what follows it. */
export function heading(
  flow: Flow,
  parent: Struct,
  level: 1 | 2 | 3 | 4,
  text: string,
  s: TextStyle,
  keep: number,
  spaceAfter: number,
): void {
  const height = textHeight(flow.doc, s, text, flow.geo.column);
  ensure(flow, height + spaceAfter + keep);
  paragraph(flow, parent, text, s, { tag: `H${level}` });
  space(flow, spaceAfter);
}

/** A horizontal rule across width from x, as decoration. */
export function rule(
  doc: PDFKit.PDFDocument,
  x: number,
  y: number,
  width: number,
  colour: string,
  thickness: number,
): void {
  doc
    .save()
    .moveTo(x, y)
    .lineTo(x + width, y)
    .lineWidth(thickness)
    .strokeColor(colour)
    .stroke()
    .restore();
}
