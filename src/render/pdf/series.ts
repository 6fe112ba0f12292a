/**
 * One series of the PDF brief, in the HTML brief's order: heading, headline, key figures, the context and
 * seasonal statements, the charts, then comparisons, unusual periods, and firmness and sensitivity.
 */
import type { Statement } from '../../brief/model.js';
import { LABELS, type SeriesView } from '../view.js';
import { drawChart } from './charts.js';
import { drawKeyFigures } from './key-figures.js';
import { ensure, type Flow, heading, paragraph, space } from './layout.js';
import { drawTable } from './tables.js';
import { artifact, group, leaf, type Struct } from './tags.js';
import { drawText, measureText, textWidth } from './text.js';
import type { TextStyle } from './theme.js';

const HEADLINE_INDENT = 11;

export function drawSeries(flow: Flow, root: Struct, s: SeriesView): void {
  const { doc, theme } = flow;
  const sect = group(doc, root, 'Sect');
  doc.outline.addItem(s.label);
  seriesHeading(flow, sect, s);
  if (s.headline) drawHeadline(flow, sect, s.headline.text);
  drawKeyFigures(flow, sect, s.keyFigures);
  space(flow, 6);
  for (const st of ofKind(s.statements, 'context', 'seasonal', 'history'))
    paragraph(flow, sect, st.text, theme.body, { spaceAfter: 6 });
  if (s.charts.length > 0) {
    space(flow, 10);
    for (const chart of s.charts) drawChart(flow, sect, chart);
  }

  subsection(flow, sect, LABELS.comparisons, (part) => {
    for (const st of ofKind(s.statements, 'comparison')) paragraph(flow, part, st.text, theme.body, { spaceAfter: 6 });
    drawTable(flow, part, s.comparisons, { sizes: theme.tableSizes, keepTogether: true });
  });
  subsection(flow, sect, LABELS.unusual, (part) => {
    if (s.unusualSummary) paragraph(flow, part, s.unusualSummary, theme.body, { spaceAfter: 6 });
    if (s.unusual) drawTable(flow, part, s.unusual, { sizes: theme.tableSizes, keepTogether: true });
  });
  subsection(flow, sect, LABELS.firmness, (part) => {
    if (s.firmness) paragraph(flow, part, s.firmness.text, theme.body, { spaceAfter: 6 });
    if (s.sensitivity) paragraph(flow, part, s.sensitivity.text, theme.body, { spaceAfter: 6 });
    if (s.revisions) drawTable(flow, part, s.revisions, { sizes: theme.tableSizes });
    if (s.firmnessPublished) paragraph(flow, part, s.firmnessPublished.text, theme.body, { spaceAfter: 6 });
    if (s.publishedRevisions) drawTable(flow, part, s.publishedRevisions, { sizes: theme.tableSizes });
  });
  sect.end();
}

/** An H3 section; the heading keeps the first lines of what follows. */
function subsection(flow: Flow, parent: Struct, title: string, body: (part: Struct) => void): void {
  const part = group(flow.doc, parent, 'Sect');
  space(flow, 16);
  heading(flow, part, 3, title, flow.theme.h3, 3 * 14, 5);
  body(part);
  part.end();
}

/**
 * The series label as H2, its unit after it in the regular face and the muted colour: on the label's last
 * line when it fits there, else on the lines below.
 */
function seriesHeading(flow: Flow, sect: Struct, s: SeriesView): void {
  const { doc, geo, theme } = flow;
  const label = measureText(doc, s.label, theme.h2, geo.column);
  const unitStyle: TextStyle = { ...theme.h2, face: 'Regular', colour: theme.muted };
  const unit = s.unit ? `(${s.unit})` : '';
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
function drawHeadline(flow: Flow, sect: Struct, text: string): void {
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

function ofKind(list: Statement[], ...kinds: Statement['kind'][]): Statement[] {
  return list.filter((x) => kinds.includes(x.kind));
}
