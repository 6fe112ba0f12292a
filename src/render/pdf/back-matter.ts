/**
 * The end of the PDF brief, as in the HTML brief: the cautions in their own box ("Read with care"), then
 * Appendix A (each series' settings, published sources and data read, and this run's provenance) and
 * Appendix B (every period of every series, each series from a new page).
 */
import type { Statement } from '../../brief/model.js';
import { type BriefView, LABELS, type Table } from '../view.js';
import { ensure, type Flow, heading, newPage, paragraph, rule, space, textHeight } from './layout.js';
import { drawTable } from './tables.js';
import { artifact, group, leaf, type Struct } from './tags.js';
import { drawText, lineBlock, measureText } from './text.js';

/** The note above each data table; the HTML brief's data partial says the same. */
const BOX_PAD = 10;
const BULLET_INDENT = 11;

export function drawCautions(flow: Flow, root: Struct, cautions: Statement[]): void {
  if (cautions.length === 0) return;
  const { doc, geo, theme } = flow;
  const title = LABELS.cautions;
  const titleStyle = { ...theme.h3, colour: theme.cautionInk };
  const inner = geo.column - 2 * BOX_PAD;
  const titleHeight = textHeight(doc, titleStyle, title, inner);
  const items = cautions.map((c) => textHeight(doc, theme.body, c.text, inner - BULLET_INDENT));
  const height = BOX_PAD + titleHeight + 5 + items.reduce((a, b) => a + b + 3, 0) + BOX_PAD - 3;
  space(flow, 24);
  if (height > geo.bodyBottom - geo.bodyTop) {
    // Too long for one page (never with the built-in cautions): a plain list that may break.
    heading(flow, root, 2, title, titleStyle, 40, 5);
    for (const c of cautions) paragraph(flow, root, `• ${c.text}`, theme.body, { spaceAfter: 3 });
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
      drawText(doc, measureText(doc, c.text, theme.body, inner - BULLET_INDENT), x + BULLET_INDENT, itemTop),
    );
    li.end();
    y += items[i] + 3;
  });
  list.end();
  aside.end();
  flow.y = top + height;
  space(flow, 24);
}

export function drawMethodAppendix(flow: Flow, root: Struct, view: BriefView): void {
  const { doc, theme } = flow;
  const sect = group(doc, root, 'Sect');
  appendixHeading(flow, sect, view.labels.methodAppendix);
  for (const s of view.series) {
    const part = group(doc, sect, 'Sect');
    space(flow, 8);
    heading(flow, part, 3, s.label, theme.h3, 60, 5);
    drawTable(flow, part, s.method, { sizes: theme.tableSizes, fractions: [0.4, 0.6], labelColour: theme.muted });
    facts(
      flow,
      part,
      view.labels.sources,
      s.sources.map((x) => [x.method, x.source]),
    );
    facts(
      flow,
      part,
      view.labels.dataRead,
      s.dataInfo.map((x) => [x.label, x.value]),
    );
    part.end();
  }
  const run = group(doc, sect, 'Sect');
  space(flow, 8);
  heading(flow, run, 3, view.labels.thisRun, theme.h3, 60, 5);
  facts(flow, run, null, [
    ['Job file', view.jobFile],
    ['Job SHA-256', view.jobSha256],
    ['Data fingerprint', view.fingerprint],
    ['Tool', `trendbrief ${view.toolVersion}`],
    ['Generated', view.generatedAt],
  ]);
  run.end();
  sect.end();
}

export function drawDataAppendix(flow: Flow, root: Struct, view: BriefView): void {
  const { doc, theme } = flow;
  newPage(flow);
  const sect = group(doc, root, 'Sect');
  appendixHeading(flow, sect, view.labels.dataAppendix);
  view.series.forEach((s, i) => {
    if (i > 0) newPage(flow);
    const part = group(doc, sect, 'Sect');
    heading(flow, part, 3, s.label, theme.h3, 60, 5);
    paragraph(flow, part, view.labels.dataNote, { ...theme.small, lineGap: 0 }, { spaceAfter: 8 });
    drawTable(flow, part, s.dataTable, { sizes: theme.dataTableSizes, padY: 1.2 });
    part.end();
  });
  sect.end();
}

function appendixHeading(flow: Flow, sect: Struct, title: string): void {
  const { doc, geo, theme } = flow;
  space(flow, 20);
  ensure(flow, 120);
  if (flow.y > geo.bodyTop + 0.01) {
    const y = flow.y;
    artifact(doc, () => rule(doc, geo.left, y, geo.column, theme.rule, 0.75));
    flow.y += 8;
  }
  doc.outline.addItem(title);
  heading(flow, sect, 2, title, theme.h2, 60, 8);
}

/** Label and value pairs (the HTML brief's definition lists), as a two-column table without a header. */
function facts(flow: Flow, parent: Struct, title: string | null, rows: string[][]): void {
  const { theme } = flow;
  if (title) heading(flow, parent, 4, title, theme.h4, 30, 3);
  const table: Table = { caption: '', headers: ['', ''], numeric: [false, false], rows };
  drawTable(flow, parent, table, {
    sizes: theme.tableSizes,
    header: false,
    fractions: [0.4, 0.6],
    labelColour: theme.muted,
    spaceAfter: 10,
  });
}
