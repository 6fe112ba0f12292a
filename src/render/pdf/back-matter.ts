/**
 * The cautions block of the PDF brief: its title and items in a box of their own, kept on one page.
 */
import { ensure, type Flow, heading, paragraph, space, textHeight } from './layout.js';
import { artifact, group, leaf, type Struct } from './tags.js';
import { drawText, lineBlock, measureText } from './text.js';

const BOX_PAD = 10;
const BULLET_INDENT = 11;

export function drawCautions(flow: Flow, root: Struct, title: string, cautions: string[]): void {
  if (cautions.length === 0) return;
  const { doc, geo, theme } = flow;
  const titleStyle = { ...theme.h3, colour: theme.cautionInk };
  const inner = geo.column - 2 * BOX_PAD;
  const titleHeight = textHeight(doc, titleStyle, title, inner);
  const items = cautions.map((c) => textHeight(doc, theme.body, c, inner - BULLET_INDENT));
  const height = BOX_PAD + titleHeight + 5 + items.reduce((a, b) => a + b + 3, 0) + BOX_PAD - 3;
  space(flow, 24);
  if (height > geo.bodyBottom - geo.bodyTop) {
    // Too long for one page (never with the built-in cautions): a plain list that may break.
    heading(flow, root, 2, title, titleStyle, 40, 5);
    for (const c of cautions) paragraph(flow, root, `• ${c}`, theme.body, { spaceAfter: 3 });
    return;
  }
  ensure(flow, height);
  const top = flow.y;
  artifact(doc, () => {
    doc
      .save()
      .roundedRect(geo.left, top, geo.column, height, 3)
      .lineWidth(0.75)
      .fillAndStroke(theme.cautionGround, theme.cautionEdge)
      .restore();
  });
  doc.outline.addItem(title);
  const aside = group(doc, root, 'Sect');
  const x = geo.left + BOX_PAD;
  leaf(doc, aside, 'H2', () => drawText(doc, measureText(doc, title, titleStyle, inner), x, top + BOX_PAD));
  let y = top + BOX_PAD + titleHeight + 5;
  const list = group(doc, aside, 'L');
  cautions.forEach((c, i) => {
    const li = group(doc, list, 'LI');
    const itemTop = y;
    leaf(doc, li, 'Lbl', () =>
      drawText(doc, lineBlock(doc, '•', { ...theme.body, colour: theme.cautionInk }), x + 1, itemTop),
    );
    leaf(doc, li, 'LBody', () =>
      drawText(doc, measureText(doc, c, theme.body, inner - BULLET_INDENT), x + BULLET_INDENT, itemTop),
    );
    li.end();
    y += items[i] + 3;
  });
  list.end();
  aside.end();
  flow.y = top + height;
  space(flow, 24);
}
