/**
 * A one-row legend above the plot: a symbol (a line sample, a square, a circle or a diamond of the
 * specs' legend symbol size, 160 px²) and its label per entry, entries 16 px apart, labels cut at 320 px
 * (the specs' legend config in theme.ts).
 */

import { type GroupMark, type Mark, oneLine, type Stroke, type SymbolShape } from '../vocabulary/scene.js';
import { fitText, textWidth } from './font-metrics.js';
import { LABEL_SIZE, PALETTE } from './theme.js';

export const LEGEND_HEIGHT = 14;
/** From the legend's bottom to the plot's top. */
export const LEGEND_OFFSET = 6;
const SYMBOL_SIZE = 160;
const SYMBOL_BOX = 15;
const LABEL_OFFSET = 4;
const COLUMN_PADDING = 16;
const LABEL_LIMIT = 320;

export interface LegendEntry {
  label: string;
  shape: SymbolShape;
  fill: string | null;
  stroke?: Stroke;
  fillOpacity?: number;
}

/** The legend's marks at (x, y), its top left corner, and the width it takes. */
export function legend(entries: readonly LegendEntry[], x: number, y: number): { group: GroupMark; width: number } {
  const marks: Mark[] = [];
  let at = 0;
  const mid = SYMBOL_BOX / 2;
  for (const e of entries) {
    if (at > 0) at += COLUMN_PADDING;
    if (e.shape === 'square' && e.fillOpacity !== undefined) {
      // A shaded area's swatch: the square as a rectangle, so its opacity applies as the area's does.
      const side = Math.sqrt(SYMBOL_SIZE);
      marks.push({
        type: 'rect',
        x: at + mid - side / 2,
        y: mid - side / 2,
        width: side,
        height: side,
        fill: e.fill,
        fillOpacity: e.fillOpacity,
        ...(e.stroke ? { stroke: e.stroke } : {}),
      });
    } else {
      marks.push({
        type: 'symbol',
        shape: e.shape,
        x: at + mid,
        y: mid,
        size: SYMBOL_SIZE,
        fill: e.fill,
        ...(e.stroke ? { stroke: e.stroke } : {}),
      });
    }
    const label = fitText(oneLine(e.label), LABEL_SIZE, LABEL_LIMIT);
    marks.push({
      type: 'text',
      x: at + SYMBOL_BOX + LABEL_OFFSET,
      y: mid,
      text: label,
      anchor: 'start',
      baseline: 'middle',
      size: LABEL_SIZE,
      weight: 'normal',
      fill: PALETTE.ink,
    });
    at += SYMBOL_BOX + LABEL_OFFSET + textWidth(label, LABEL_SIZE);
  }
  return { group: { type: 'group', name: 'legend', x, y, marks }, width: at };
}
