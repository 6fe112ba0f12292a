/**
 * The key figures of a series: a grid of three columns, each figure under a hairline with its label, its
 * value large and its note, tagged as a list (label as Lbl, value and note as LBody). A row of the grid never
 * splits across pages.
 */
import type { KeyFigure } from '../view.js';
import { ensure, type Flow, rule, setStyle, space, textHeight } from './layout.js';
import { artifact, group, leaf, type Struct } from './tags.js';

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
      label: textHeight(doc, theme.figureLabel, f.label, width),
      value: textHeight(doc, theme.figureValue, f.value, width),
      note: f.note ? textHeight(doc, theme.figureLabel, f.note, width) : 0,
    }));
    const height = PAD_TOP + Math.max(...parts.map((p) => p.label + 2 + p.value + p.note));
    ensure(flow, height);
    const top = flow.y;
    artifact(doc, () => {
      for (let i = 0; i < row.length; i++) rule(doc, geo.left + i * (width + GAP_X), top, width, theme.rule, 0.75);
    });
    row.forEach((f, i) => {
      const x = geo.left + i * (width + GAP_X);
      const item = group(doc, list, 'LI');
      leaf(doc, item, 'Lbl', () => {
        setStyle(doc, theme.figureLabel);
        doc.text(f.label, x, top + PAD_TOP, { width, lineGap: theme.figureLabel.lineGap });
      });
      const valueTop = top + PAD_TOP + parts[i].label + 2;
      leaf(doc, item, 'LBody', () => {
        setStyle(doc, theme.figureValue);
        doc.text(f.value, x, valueTop, { width, lineGap: theme.figureValue.lineGap });
        if (f.note) {
          setStyle(doc, theme.figureLabel);
          doc.text(f.note, x, valueTop + parts[i].value, { width, lineGap: theme.figureLabel.lineGap });
        }
      });
      item.end();
    });
    flow.y = top + height;
    space(flow, GAP_Y);
  }
  list.end();
}
