/**
 * Page furniture, written once every page exists (the document buffers its pages): the brief's title and
 * organisation at the head of each page, and at the foot when it was generated, the short data fingerprint
 * and "Page X of Y". Marked as pagination artifacts so a screen reader does not read them on every page.
 */
import type { BriefView } from '../../document/view.js';
import { WORDS } from '../../document/words.js';
import { type Flow, lineHeight, rule } from './layout.js';
import { artifact } from './tags.js';
import { drawText, lineBlock, measureText, textWidth } from './text.js';
import type { TextStyle } from './theme.js';

/** Smallest size furniture text shrinks to before it wraps. */
const MIN_SIZE = 6;
const SEPARATION = 12;

export function drawFurniture(flow: Flow, view: BriefView): void {
  const { doc, geo, theme } = flow;
  const range = doc.bufferedPageRange();
  const foot = WORDS.pageFoot(view.generatedAt, view.fingerprint);
  for (let i = 0; i < range.count; i++) {
    doc.switchToPage(range.start + i);
    // Furniture sits below the body's bottom margin; with that margin at zero pdfkit never breaks the page.
    const margins = doc.page.margins;
    const bottom = margins.bottom;
    margins.bottom = 0;
    artifact(
      doc,
      () => {
        const head = pair(doc, flow, theme.furniture, view.title, view.organisation, geo.margin, 'top');
        rule(doc, geo.left, geo.margin + Math.max(14, head + 3), geo.column, theme.rule, 0.5);
        const page = WORDS.pageOf(i + 1, range.count);
        const feet = pair(doc, flow, theme.furniture, foot, page, geo.height - geo.margin, 'bottom');
        rule(doc, geo.left, geo.height - geo.margin - Math.max(14, feet + 3), geo.column, theme.rule, 0.5);
      },
      'Pagination',
    );
    margins.bottom = bottom;
  }
}

/**
 * Two texts on one line, the first at the left, the second at the right; the first shrinks (and at the
 * smallest size wraps) to leave the second its room. Anchored at the line's top or bottom edge; returns the
 * height taken.
 */
function pair(
  doc: PDFKit.PDFDocument,
  flow: Flow,
  s: TextStyle,
  left: string,
  right: string,
  edge: number,
  anchor: 'top' | 'bottom',
): number {
  const { geo } = flow;
  const rightWidth = right ? textWidth(doc, right, s.face, s.size) : 0;
  const room = geo.column - (right ? rightWidth + SEPARATION : 0);
  let size = s.size;
  while (size > MIN_SIZE && textWidth(doc, left, s.face, size) > room) size = Math.max(MIN_SIZE, size - 0.5);
  const block = measureText(doc, left, { ...s, size }, room);
  const leftHeight = block.height;
  drawText(doc, block, geo.left, anchor === 'top' ? edge : edge - leftHeight);
  if (right) {
    const h = lineHeight(doc, s);
    drawText(doc, lineBlock(doc, right, s), geo.right - rightWidth, anchor === 'top' ? edge : edge - h);
    return Math.max(leftHeight, h);
  }
  return leftHeight;
}
