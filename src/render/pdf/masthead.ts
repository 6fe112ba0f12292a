/**
 * The masthead and contents blocks of the PDF brief: an accent rule, the logo, the organisation, the title
 * and a byline of labelled facts; and, for a brief of several series, the numbered list of what it holds.
 */
import type { ContentsBlock, Fact, MastheadBlock } from '../../document/blocks.js';
import { drawSvg } from './charts.js';
import { ensure, type Flow, heading, lineHeight, paragraph, rule, space } from './layout.js';
import { artifact, group, leaf, type Struct } from './tags.js';
import { drawText, lineBlock, measureText, textWidth } from './text.js';

/** Largest logo box, in points (the HTML brief's 12 rem by 3 rem at print size). */
const LOGO_WIDTH = 126;
const LOGO_HEIGHT = 32;
const BYLINE_GAP = 22;

export function drawMasthead(flow: Flow, root: Struct, view: MastheadBlock): void {
  const { doc, geo, theme } = flow;
  const top = flow.y;
  artifact(doc, () => rule(doc, geo.left, top + 1.5, geo.column, theme.accent, 3));
  flow.y = top + 3 + 14;
  if (view.logo) drawLogo(flow, root, view);
  if (view.organisation) paragraph(flow, root, view.organisation, theme.organisation, { spaceAfter: 3 });
  heading(flow, root, 1, view.title, theme.title, 40, 10);
  drawByline(flow, root, view.byline);
  space(flow, 26);
}

/** Labelled facts side by side, wrapping onto further lines; each as a list item (Lbl, LBody). */
function drawByline(flow: Flow, root: Struct, items: Fact[]): void {
  const { doc, geo, theme } = flow;
  const labelStyle = { ...theme.byline, colour: theme.muted };
  const lh = lineHeight(doc, theme.byline);
  const list = group(doc, root, 'L');
  let x = geo.left;
  let rowTop = flow.y;
  let rowHeight = 0;
  for (const item of items) {
    const lw = textWidth(doc, item.label, labelStyle.face, labelStyle.size);
    const vw = textWidth(doc, item.value, theme.byline.face, theme.byline.size);
    const width = Math.min(geo.column, Math.max(lw, vw));
    if (x > geo.left && x + width > geo.right) {
      x = geo.left;
      rowTop += rowHeight + 6;
      rowHeight = 0;
    }
    const labelBlock = measureText(doc, item.label, labelStyle, width);
    const valueBlock = measureText(doc, item.value, theme.byline, width);
    const labelHeight = labelBlock.height;
    const valueHeight = valueBlock.height;
    const li = group(doc, list, 'LI');
    const left = x;
    const y = rowTop;
    leaf(doc, li, 'Lbl', () => drawText(doc, labelBlock, left, y));
    leaf(doc, li, 'LBody', () => drawText(doc, valueBlock, left, y + labelHeight));
    li.end();
    rowHeight = Math.max(rowHeight, labelHeight + valueHeight, 2 * lh);
    x += width + BYLINE_GAP;
  }
  list.end();
  flow.y = rowTop + rowHeight;
}

function drawLogo(flow: Flow, root: Struct, view: MastheadBlock): void {
  const { doc, geo } = flow;
  const logo = view.logo;
  if (!logo) return;
  const comma = logo.dataUri.indexOf(',');
  const bytes = Buffer.from(logo.dataUri.slice(comma + 1), 'base64');
  const alt = logo.alt;
  const x = geo.left;
  const y = flow.y;
  let height = LOGO_HEIGHT;
  if (logo.mime === 'image/svg+xml') {
    const svg = bytes.toString('utf8');
    const [w, h] = svgSize(svg);
    const k = Math.min(LOGO_WIDTH / w, LOGO_HEIGHT / h);
    height = h * k;
    leaf(doc, root, 'Figure', () => drawSvg(doc, svg, x, y, w * k, height), {
      alt,
      bbox: [x, y, x + w * k, y + height],
    });
  } else {
    // pdfkit's openImage (untyped) reads the size; image() then embeds the same bytes.
    const image = (doc as unknown as { openImage(src: Buffer): { width: number; height: number } }).openImage(bytes);
    const k = Math.min(LOGO_WIDTH / image.width, LOGO_HEIGHT / image.height);
    height = image.height * k;
    leaf(doc, root, 'Figure', () => doc.image(bytes, x, y, { width: image.width * k, height }), {
      alt,
      bbox: [x, y, x + image.width * k, y + height],
    });
  }
  flow.y = y + height + 10;
}

/** An SVG's own size from its width and height, else its viewBox; 4 : 1 when it states neither. */
function svgSize(svg: string): [number, number] {
  const root = /<svg\b[^>]*>/i.exec(svg)?.[0] ?? '';
  const attr = (name: string) => Number.parseFloat(new RegExp(`\\s${name}="([^"]*)"`).exec(root)?.[1] ?? '');
  const box =
    /\sviewBox="([^"]*)"/
      .exec(root)?.[1]
      ?.split(/[\s,]+/)
      .map(Number) ?? [];
  const w = attr('width') || box[2];
  const h = attr('height') || box[3];
  return w > 0 && h > 0 ? [w, h] : [LOGO_WIDTH, LOGO_WIDTH / 4];
}

/** "In this brief": the series and the back matter, in order, numbered in a column of their own. */
export function drawContents(flow: Flow, root: Struct, view: ContentsBlock): void {
  const { doc, geo, theme } = flow;
  const sect = group(doc, root, 'TOC');
  const entries = view.entries.map((e) => (e.note ? `${e.text} — ${e.note}` : e.text));
  const numberWidth = 16;
  const width = geo.column - numberWidth - 6;
  const blocks = entries.map((text) => measureText(doc, text, theme.body, width));
  // The list is kept whole with its heading when it fits on a page (after an overview, it moves on whole).
  const listHeight = blocks.reduce((sum, b) => sum + b.height + 1, 0);
  const keep = listHeight <= geo.bodyBottom - geo.bodyTop - 60 ? listHeight : 30;
  heading(flow, sect, 2, view.title, { ...theme.h3, colour: theme.ink }, keep, 4);
  entries.forEach((_, i) => {
    const block = blocks[i];
    const height = block.height;
    ensure(flow, height);
    const y = flow.y;
    leaf(doc, sect, 'TOCI', () => {
      const label = `${i + 1}.`;
      const lx = geo.left + numberWidth - textWidth(doc, label, theme.body.face, theme.body.size);
      drawText(doc, lineBlock(doc, label, { ...theme.body, colour: theme.muted }), lx, y);
      drawText(doc, block, geo.left + numberWidth + 6, y);
    });
    flow.y = y + height + 1;
  });
  sect.end();
  space(flow, 10);
}
