/**
 * Axes as scene marks: a value axis on the left (ticks, labels, title, optional gridlines), a time or band
 * axis along the bottom. Geometry follows the vega-lite defaults the specs use (ticks 5 px, labels 2 px
 * past them, the title 4 px past the labels; 1 px lines drawn on the half pixel so they print crisp), and
 * labels that would overlap are thinned the way vega's "parity" strategy thins them: every other one goes,
 * again until none overlap.
 */

import { type GroupMark, type LineMark, type Mark, oneLine, type Stroke, type TextMark } from '../vocabulary/scene.js';
import { fitText, textWidth } from './font-metrics.js';
import type { BandScale } from './scale-band.js';
import { LABEL_SIZE, PALETTE } from './theme.js';

export const TICK_SIZE = 5;
export const LABEL_PADDING = 2;
export const TITLE_PADDING = 4;
/** The room a rotated axis title takes across: one line of 12 px type and a hair. */
export const TITLE_EXTENT = LABEL_SIZE + 1;
/** Least gap between neighbouring labels, px (the specs' labelSeparation). */
export const LABEL_SEPARATION = 8;
/** From the axis line to the bottom of its labels: tick, padding, one line of type. */
export const BOTTOM_AXIS_EXTENT = TICK_SIZE + LABEL_PADDING + LABEL_SIZE;

const INK_LINE: Stroke = { colour: PALETTE.ink, width: 1 };
const GRID_LINE: Stroke = { colour: PALETTE.grid, width: 1 };

/** A 1 px line's coordinate on the half pixel, so it covers one row of device pixels at 1:1. */
export function crisp(v: number): number {
  return Math.round(v) + 0.5;
}

/**
 * Which of a row of labels to keep, given each one's extent along the axis in axis order: all when none
 * overlap (with `separation` between them), else every other one, repeatedly, as vega's parity strategy.
 * The first label always stays.
 */
export function thinLabels(extents: readonly [number, number][], separation = LABEL_SEPARATION): boolean[] {
  let kept = extents.map((_, i) => i);
  const overlaps = (ids: number[]) => {
    for (let k = 1; k < ids.length; k++) {
      const a = extents[ids[k - 1]];
      const b = extents[ids[k]];
      if (Math.min(a[1], b[1]) + separation > Math.max(a[0], b[0])) return true;
    }
    return false;
  };
  while (kept.length >= 3 && overlaps(kept)) kept = kept.filter((_, k) => k % 2 === 0);
  // Two labels left that still collide: keep the first.
  if (kept.length === 2 && overlaps(kept)) kept = [kept[0]];
  const show = extents.map(() => false);
  for (const i of kept) show[i] = true;
  return show;
}

function text(
  x: number,
  y: number,
  value: string,
  anchor: TextMark['anchor'],
  baseline: TextMark['baseline'],
): TextMark {
  return { type: 'text', x, y, text: value, anchor, baseline, size: LABEL_SIZE, weight: 'normal', fill: PALETTE.ink };
}

export interface ValueAxisInput {
  /** Tick values, ascending. */
  ticks: readonly number[];
  labels: readonly string[];
  y: (v: number) => number;
  plotWidth: number;
  plotHeight: number;
  title: string | null;
  grid: boolean;
}

/** The widest label of a value axis, px. */
export function labelsWidth(labels: readonly string[]): number {
  let w = 0;
  for (const l of labels) w = Math.max(w, textWidth(l, LABEL_SIZE));
  return w;
}

/** Gridlines under the data, one per tick, across the plot. */
export function gridLines(input: ValueAxisInput): GroupMark {
  const marks: Mark[] = input.ticks.map(
    (v): LineMark => ({
      type: 'line',
      x1: 0,
      y1: crisp(input.y(v)),
      x2: input.plotWidth,
      y2: crisp(input.y(v)),
      stroke: GRID_LINE,
    }),
  );
  return { type: 'group', name: 'y-grid', x: 0, y: 0, marks };
}

/** The left axis: its line, ticks, labels centred on their ticks and the title read bottom to top. */
export function valueAxis(input: ValueAxisInput): GroupMark {
  const { ticks, labels, y, plotHeight } = input;
  const marks: Mark[] = [{ type: 'line', x1: 0.5, y1: 0, x2: 0.5, y2: plotHeight, stroke: INK_LINE }];
  for (const v of ticks) {
    const at = crisp(y(v));
    marks.push({ type: 'line', x1: -TICK_SIZE, y1: at, x2: 0.5, y2: at, stroke: INK_LINE });
  }
  // Labels are stacked bottom to top; thinned on their vertical extents.
  const half = LABEL_SIZE / 2;
  const show = thinLabels(ticks.map((v) => [-y(v) - half, -y(v) + half]));
  ticks.forEach((v, i) => {
    if (show[i]) marks.push(text(-(TICK_SIZE + LABEL_PADDING), y(v), labels[i], 'end', 'middle'));
  });
  if (input.title) {
    const x = -(TICK_SIZE + LABEL_PADDING + labelsWidth(labels) + TITLE_PADDING);
    const title = fitText(oneLine(input.title), LABEL_SIZE, plotHeight);
    marks.push({ ...text(x, plotHeight / 2, title, 'middle', 'bottom'), angle: -90 });
  }
  return { type: 'group', name: 'y-axis', x: 0, y: 0, marks };
}

export interface BottomAxisTick {
  x: number;
  label: string;
  /** Lines of a label that needs two (comparisons' spans); label is ignored then. */
  lines?: string[];
}

/**
 * The bottom axis: its line, ticks and labels under them. With `flush`, a label whose tick sits within a
 * pixel of an end of the axis is aligned to that end instead of centred, so it never pokes past the plot.
 */
export function bottomAxis(
  ticks: readonly BottomAxisTick[],
  plotWidth: number,
  plotHeight: number,
  options: { flush: boolean; line: boolean; tickMarks: boolean; name?: string; leftRoom?: number },
): GroupMark {
  const marks: Mark[] = [];
  if (options.line)
    marks.push({ type: 'line', x1: 0, y1: crisp(plotHeight), x2: plotWidth, y2: crisp(plotHeight), stroke: INK_LINE });
  if (options.tickMarks)
    for (const t of ticks)
      marks.push({
        type: 'line',
        x1: crisp(t.x),
        y1: plotHeight,
        x2: crisp(t.x),
        y2: plotHeight + TICK_SIZE,
        stroke: INK_LINE,
      });
  // A centred label that would reach past the figure's left edge (`leftRoom` px left of the plot) starts
  // at its tick instead.
  const room = options.leftRoom ?? Number.POSITIVE_INFINITY;
  const anchors = ticks.map((t): TextMark['anchor'] =>
    options.flush && (t.x <= 1 || t.x - textWidth(t.label, LABEL_SIZE) / 2 < -room)
      ? 'start'
      : options.flush && t.x >= plotWidth - 1
        ? 'end'
        : 'middle',
  );
  const extents = ticks.map((t, i): [number, number] => {
    const w = Math.max(...(t.lines ?? [t.label]).map((l) => textWidth(l, LABEL_SIZE)));
    const a = anchors[i];
    return a === 'start' ? [t.x, t.x + w] : a === 'end' ? [t.x - w, t.x] : [t.x - w / 2, t.x + w / 2];
  });
  const show = thinLabels(extents);
  const top = plotHeight + (options.tickMarks ? TICK_SIZE : 0) + LABEL_PADDING;
  ticks.forEach((t, i) => {
    if (!show[i]) return;
    const lines = t.lines ?? [t.label];
    lines.forEach((line, k) => {
      marks.push(text(t.x, top + k * (LABEL_SIZE + 2), line, anchors[i], 'top'));
    });
  });
  return { type: 'group', name: options.name ?? 'x-axis', x: 0, y: 0, marks };
}

/** Ticks of a band axis: one per band, at its centre. */
export function bandTicks(band: BandScale, labels: readonly string[]): BottomAxisTick[] {
  return labels.map((label, i) => ({ x: band.centre(i), label }));
}
