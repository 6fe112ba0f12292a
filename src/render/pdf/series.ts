/**
 * The two blocks of a series' part that the PDF draws its own way: the series' heading (the label, its
 * unit after it in a lighter face) and the headline beside its accent bar.
 */
import { ensure, type Flow, space } from './layout.js';
import { artifact, leaf, type Struct } from './tags.js';
import { drawText, measureText, textWidth } from './text.js';
import type { TextStyle } from './theme.js';

const HEADLINE_INDENT = 11;

/**
 * The series label as H2, its unit after it in the regular face and the muted colour: on the label's last
 * line when it fits there, else on the lines below.
 */
export function seriesHeading(flow: Flow, sect: Struct, text: string, unitText: string): void {
  const { doc, geo, theme } = flow;
  const label = measureText(doc, text, theme.h2, geo.column);
  const unitStyle: TextStyle = { ...theme.h2, face: 'Regular', colour: theme.muted };
  const unit = unitText ? `(${unitText})` : '';
  const last = label.lines.length > 0 ? (label.lines[label.lines.length - 1].width * theme.h2.size) / 1000 : 0;
  const gap = textWidth(doc, ' ', 'Regular', theme.h2.size);
  const sameLine =
    unit !== '' && label.lines.length > 0 && last + gap + textWidth(doc, unit, 'Regular', theme.h2.size) <= geo.column;
  const unitBlock = unit && !sameLine ? measureText(doc, unit, unitStyle, geo.column) : null;
  const height = Math.max(label.height, label.lineHeight) + (unitBlock ? unitBlock.height : 0);
  ensure(flow, height + 120);
  const top = flow.y;
  leaf(doc, sect, 'H2', () => {
    drawText(doc, label, geo.left, top);
    if (sameLine) {
      const y = top + label.height - label.lineHeight;
      drawText(doc, measureText(doc, unit, unitStyle), geo.left + last + gap, y);
    } else if (unitBlock) drawText(doc, unitBlock, geo.left, top + label.height);
  });
  flow.y = top + height;
  space(flow, 9);
}

/** The headline: larger text beside a bar in the accent colour, never split across pages. */
export function drawHeadline(flow: Flow, sect: Struct, text: string): void {
  const { doc, geo, theme } = flow;
  const width = geo.column - HEADLINE_INDENT;
  const block = measureText(doc, text, theme.headline, width);
  const height = block.height;
  ensure(flow, height);
  const top = flow.y;
  artifact(doc, () => {
    doc
      .save()
      .rect(geo.left, top + 1, 3, height - 2)
      .fill(theme.accent)
      .restore();
  });
  leaf(doc, sect, 'P', () => drawText(doc, block, geo.left + HEADLINE_INDENT, top));
  flow.y = top + height;
  space(flow, 18);
}
