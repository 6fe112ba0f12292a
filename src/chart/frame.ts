/**
 * The frame of a single-view chart (all but the comparisons): the whole figure CHART_WIDTH × CHART_HEIGHT,
 * padding 4 px, an optional legend row on top, the value axis on the left sized to its widest label and
 * its title, a time or band axis at the bottom, and the plot in what is left. The value domain is widened
 * to include zero or a centre line where asked, padded by pixels where asked, then made nice, and ticked
 * for one tick per 40 px of plot height, as the vega-lite specs ask of vega (scale-linear.ts).
 */

import type { GroupMark, Mark, Scene } from '../vocabulary/scene.js';
import {
  BOTTOM_AXIS_EXTENT,
  bandTicks,
  bottomAxis,
  gridLines,
  LABEL_PADDING,
  labelsWidth,
  TICK_SIZE,
  TITLE_EXTENT,
  TITLE_PADDING,
  valueAxis,
} from './axes.js';
import { formatTick, formatTimeTick } from './format.js';
import { LEGEND_HEIGHT, LEGEND_OFFSET, type LegendEntry, legend } from './legend.js';
import { type BandScale, bandScale } from './scale-band.js';
import { linearScale, niceDomain, padDomain, stepDecimals, tickStep, ticks } from './scale-linear.js';
import { timeLabelUnit, timeScale, timeTicks } from './scale-time.js';
import { CHART_HEIGHT, CHART_WIDTH } from './theme.js';

export const PADDING = 4;
/** Above the plot when there is no legend: room for the top label, centred on its tick. */
const TOP_ROOM = 6;
/** Right of the plot: the padding and half of a bar's outline or a line's cap. */
const RIGHT_ROOM = PADDING + 2;
/** One tick per this many px of axis, as the specs' tickCount (ceil(height / 40), ceil(width / 40)). */
export const TICK_SPACING = 40;

export type XAxis =
  | {
      kind: 'time';
      domain: [number, number];
      /** Last instant that may carry a tick (the start of the last bar, so no label names the period after it). */
      ticksTo?: number;
    }
  | { kind: 'band'; labels: readonly string[] };

export interface FrameSpec {
  legend: readonly LegendEntry[] | null;
  /** Values the value domain must cover (non-finite ones are skipped). */
  values: readonly ArrayLike<number>[];
  /** Values the domain must include besides (0 for bars, the remainder's centre line). */
  include?: readonly number[];
  /** A fixed domain, used as given (no data, no nice). */
  fixed?: [number, number];
  /** Pixels kept free inside each end of the value range, before the domain is made nice. */
  padding?: number;
  /** Draw the value axis (false: no axis, no gridlines). */
  axis: boolean;
  title: string | null;
  /** "+" before positive tick labels. */
  signed?: boolean;
  grid: boolean;
  x: XAxis;
  locale: string;
}

export interface Frame {
  plotLeft: number;
  plotTop: number;
  plotWidth: number;
  plotHeight: number;
  y: (value: number) => number;
  yDomain: [number, number];
  /** The value axis's tick values, gridlines included, labelled or not. */
  yTicks: number[];
  /** Time → px (time axes only; the identity map for band axes). */
  x: (t: number) => number;
  band: BandScale | null;
  /** The scene: legend, then the plot holding gridlines, axes and the given data groups in order. */
  scene: (data: Mark[], overlay?: Mark[]) => Scene;
}

/** The finite extent of several value lists, or null when none is finite. */
export function extentOf(
  lists: readonly ArrayLike<number>[],
  include: readonly number[] = [],
): [number, number] | null {
  let lo = Number.POSITIVE_INFINITY;
  let hi = Number.NEGATIVE_INFINITY;
  for (const list of [...lists, include])
    for (let i = 0; i < list.length; i++) {
      const v = list[i];
      if (!Number.isFinite(v)) continue;
      if (v < lo) lo = v;
      if (v > hi) hi = v;
    }
  return lo <= hi ? [lo, hi] : null;
}

/** The value domain and its ticks for a plot `plotHeight` px high. */
export function valueDomain(
  spec: Pick<FrameSpec, 'values' | 'include' | 'fixed' | 'padding'>,
  plotHeight: number,
): { domain: [number, number]; ticks: number[]; step: number } {
  const count = Math.ceil(plotHeight / TICK_SPACING);
  let domain: [number, number];
  if (spec.fixed) domain = spec.fixed;
  else {
    const extent = extentOf(spec.values, spec.include) ?? [0, 1];
    // A flat series: one unit either side, so the line sits mid-plot with labelled ticks around it.
    let [lo, hi] = extent[0] === extent[1] ? [extent[0] - 1, extent[1] + 1] : extent;
    if (spec.padding) [lo, hi] = padDomain(lo, hi, plotHeight, spec.padding);
    domain = niceDomain(lo, hi);
  }
  return { domain, ticks: ticks(domain[0], domain[1], count), step: tickStep(domain[0], domain[1], count) };
}

export function frame(spec: FrameSpec): Frame {
  const W = CHART_WIDTH;
  const H = CHART_HEIGHT;
  const plotTop = PADDING + (spec.legend ? LEGEND_HEIGHT + LEGEND_OFFSET : TOP_ROOM);
  const plotHeight = H - PADDING - BOTTOM_AXIS_EXTENT - plotTop;

  const { domain, ticks: yTicks, step } = valueDomain(spec, plotHeight);
  const decimals = stepDecimals(step);
  const labels = spec.axis ? yTicks.map((v) => formatTick(v, decimals, spec.locale, spec.signed)) : [];
  const left = spec.axis
    ? PADDING + (spec.title ? TITLE_EXTENT + TITLE_PADDING : 0) + labelsWidth(labels) + LABEL_PADDING + TICK_SIZE
    : PADDING + 2;
  const plotWidth = W - left - RIGHT_ROOM;
  const y = linearScale(domain[0], domain[1], plotHeight, 0);

  let x: (t: number) => number = (t) => t;
  let band: BandScale | null = null;
  let xAxis: GroupMark;
  if (spec.x.kind === 'time') {
    const [t0, t1] = spec.x.domain;
    x = timeScale(t0, t1, 0, plotWidth);
    const count = Math.ceil(plotWidth / TICK_SPACING);
    const values = timeTicks(t0, t1, count).values.filter(
      (t) => t <= (spec.x.kind === 'time' ? (spec.x.ticksTo ?? t1) : t1),
    );
    // The first label carries its year when it names a month or a day, so no axis starts "Oct" alone.
    const ticksX = values.map((t, i) => ({
      x: x(t),
      label: formatTimeTick(t, timeLabelUnit(t), spec.locale, i === 0),
    }));
    xAxis = bottomAxis(ticksX, plotWidth, plotHeight, {
      flush: true,
      line: true,
      tickMarks: true,
      leftRoom: left - PADDING,
    });
  } else {
    band = bandScale(spec.x.labels.length, 0, plotWidth);
    xAxis = bottomAxis(bandTicks(band, spec.x.labels), plotWidth, plotHeight, {
      flush: false,
      line: true,
      tickMarks: true,
    });
  }

  const axisInput = { ticks: yTicks, labels, y, plotWidth, plotHeight, title: spec.title, grid: spec.grid };
  const under: Mark[] = [];
  if (spec.axis && spec.grid) under.push(gridLines(axisInput));
  under.push(xAxis);
  if (spec.axis) under.push(valueAxis(axisInput));

  const legendGroup = spec.legend ? legend(spec.legend, left, PADDING).group : null;
  return {
    plotLeft: left,
    plotTop,
    plotWidth,
    plotHeight,
    y,
    yDomain: domain,
    yTicks,
    x,
    band,
    scene: (data, overlay = []) => ({
      width: W,
      height: H,
      background: 'white',
      marks: [
        ...(legendGroup ? [legendGroup] : []),
        { type: 'group', name: 'plot', x: left, y: plotTop, marks: [...under, ...data] },
        ...overlay,
      ],
    }),
  };
}
