/**
 * The overview block of the PDF brief: one row per series across the column — the label, four cells of a
 * value over a muted note, and the sparkline — tagged as a table with row headers. A row never splits;
 * the header row is repeated (as decoration) on a page the table continues on.
 */
import type { OverviewBlock } from '../../document/blocks.js';
import { drawScene } from './charts.js';
import { ensure, type Flow, newPage, rule } from './layout.js';
import { artifact, group, leaf, type Struct } from './tags.js';
import { drawText, measureText } from './text.js';
import type { TextStyle } from './theme.js';

/** Shares of the column: label, latest value, trend, revision, unusual periods, sparkline. */
const SHARES = [0.22, 0.17, 0.18, 0.12, 0.13, 0.18];
const GUTTER = 8;
const PAD_Y = 5;
/** CSS px to pt. */
const PX = 0.75;

/** The table measured: every cell's text set in its column, each row's height, and the whole height. */
function measureOverview(flow: Flow, block: OverviewBlock) {
  const { doc, geo, theme } = flow;
  const widths = SHARES.map((f) => f * geo.column - GUTTER);
  const head: TextStyle = { face: 'Semibold', size: 8, colour: theme.muted, lineGap: -0.5 };
  const label: TextStyle = { face: 'Semibold', size: 9.5, colour: theme.ink, lineGap: -0.5 };
  const value: TextStyle = { face: 'Semibold', size: 9.5, colour: theme.ink, lineGap: -0.5 };
  const note: TextStyle = { face: 'Regular', size: 7.5, colour: theme.muted, lineGap: -0.5 };
  const heads = block.headers.map((h, c) => measureText(doc, h, head, widths[c]));
  const headHeight = Math.max(...heads.map((h) => h.height)) + PAD_Y;
  const rows = block.rows.map((row) => {
    const name = measureText(doc, row.label, label, widths[0]);
    const cells = row.cells.map((cell, i) => ({
      value: measureText(doc, cell.value, value, widths[i + 1]),
      note: cell.note ? measureText(doc, cell.note, note, widths[i + 1]) : null,
    }));
    const spark = row.spark;
    const k = spark ? Math.min(1, widths[5] / (spark.width * PX)) * PX : 0;
    const sparkHeight = spark ? spark.height * k : 0;
    const height =
      2 * PAD_Y + Math.max(name.height, sparkHeight, ...cells.map((c) => c.value.height + (c.note?.height ?? 0)));
    return { row, name, cells, k, height };
  });
  return { heads, headHeight, rows, height: headHeight + rows.reduce((a, r) => a + r.height, 0) };
}

/** The height the overview's table takes, for keeping it on one page with its heading. */
export function overviewHeight(flow: Flow, block: OverviewBlock): number {
  return measureOverview(flow, block).height;
}

export function drawOverview(flow: Flow, parent: Struct, block: OverviewBlock): void {
  const { doc, geo, theme } = flow;
  const xs: number[] = [];
  for (let c = 0, x = geo.left; c < SHARES.length; c++) {
    xs.push(x);
    x += SHARES[c] * geo.column;
  }
  const { heads, headHeight, rows } = measureOverview(flow, block);
  const table = group(doc, parent, 'Table');
  const headRow = (tagged: boolean): void => {
    const top = flow.y;
    const draw = (c: number) => drawText(doc, heads[c], xs[c], top);
    if (tagged) {
      const tr = group(doc, group(doc, table, 'THead'), 'TR');
      for (let c = 0; c < heads.length; c++) leaf(doc, tr, 'TH', () => draw(c), { scope: 'Column' });
      tr.end();
    } else
      artifact(
        doc,
        () => {
          for (let c = 0; c < heads.length; c++) draw(c);
        },
        'Pagination',
      );
    flow.y = top + headHeight;
    const y = flow.y;
    artifact(doc, () => rule(doc, geo.left, y, geo.column, theme.muted, 0.6));
  };
  ensure(flow, headHeight + (rows[0]?.height ?? 0));
  headRow(true);
  const body = group(doc, table, 'TBody');
  for (const r of rows) {
    if (flow.y + r.height > geo.bodyBottom + 0.01) {
      newPage(flow);
      headRow(false);
    }
    const top = flow.y + PAD_Y;
    const tr = group(doc, body, 'TR');
    leaf(doc, tr, 'TH', () => drawText(doc, r.name, xs[0], top), { scope: 'Row' });
    r.cells.forEach((c, i) => {
      leaf(doc, tr, 'TD', () => {
        drawText(doc, c.value, xs[i + 1], top);
        if (c.note) drawText(doc, c.note, xs[i + 1], top + c.value.height);
      });
    });
    const spark = r.row.spark;
    if (spark?.scene) {
      const scene = spark.scene;
      const x = xs[5];
      const w = spark.width * r.k;
      const h = spark.height * r.k;
      const td = group(doc, tr, 'TD');
      leaf(doc, td, 'Figure', () => drawScene(doc, scene, x, top, r.k), {
        alt: spark.alt,
        bbox: [x, top, x + w, top + h],
      });
      td.end();
    } else group(doc, tr, 'TD').end();
    tr.end();
    flow.y += r.height;
    const y = flow.y;
    artifact(doc, () => rule(doc, geo.left, y, geo.column, theme.faint, 0.5));
  }
  body.end();
  table.end();
  flow.y += 12;
}
