/**
 * The key figures of a series: a grid of three columns, each figure under a hairline with its label, its
 * value large and its note, tagged as a list (label as Lbl, value and note as LBody). A row of the grid never
 * splits across pages.
 */
import type { KeyFigure } from '../../document/view.js';
import { ensure, type Flow, rule, space } from './layout.js';
import { artifact, group, leaf, type Struct } from './tags.js';
import { drawText, measureText } from './text.js';

const COLUMNS = 3;
const GAP_X = 16;
const GAP_Y = 12;
const PAD_TOP = 5;

export function drawKeyFigures(flow: Flow, parent: Struct, figures: KeyFigure[]): void {
  if (figures.length === 0) return;
  const { doc, geo, theme } = flow;
  const width = (geo.column - GAP_X * (COLUMNS - 1)) / COLUMNS;
  const list = group(doc, parent, 'L');
  for (let start = 0; start < figures.length; start += COLUMNS) {
    const row = figures.slice(start, start + COLUMNS);
    const parts = row.map((f) => ({
      label: measureText(doc, f.label, theme.figureLabel, width),
      value: measureText(doc, f.value, theme.figureValue, width),
      note: f.note ? measureText(doc, f.note, theme.figureLabel, width) : null,
    }));
    const height = PAD_TOP + Math.max(...parts.map((p) => p.label.height + 2 + p.value.height + (p.note?.height ?? 0)));
    ensure(flow, height);
    const top = flow.y;
    artifact(doc, () => {
      for (let i = 0; i < row.length; i++) rule(doc, geo.left + i * (width + GAP_X), top, width, theme.rule, 0.75);
    });
    parts.forEach((p, i) => {
      const x = geo.left + i * (width + GAP_X);
      const item = group(doc, list, 'LI');
      leaf(doc, item, 'Lbl', () => drawText(doc, p.label, x, top + PAD_TOP));
      const valueTop = top + PAD_TOP + p.label.height + 2;
      leaf(doc, item, 'LBody', () => {
        drawText(doc, p.value, x, valueTop);
        if (p.note) drawText(doc, p.note, x, valueTop + p.value.height);
      });
      item.end();
    });
    flow.y = top + height;
    space(flow, GAP_Y);
  }
  list.end();
}
