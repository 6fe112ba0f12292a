/**
 * The scene shared by the two line charts (line-with-trend.ts is their spec): a thin context line under
 * the bold trend, whose provisional end is dashed and named in the legend, so the difference never rests
 * on colour alone. The dashed stretch starts at the last final value, so the two pieces join.
 */
import type { SeriesBrief } from '../../vocabulary/brief.js';
import type { Mark, PathMark, Scene, Stroke } from '../../vocabulary/scene.js';
import { BAND_OPACITY, bucketise, denseUnit, instantsOf, PERIOD_ADJECTIVE, sliceMeans, UNIT_WORDS } from '../dense.js';
import { frame } from '../frame.js';
import type { LegendEntry } from '../legend.js';
import { PROVISIONAL_NAME, provisionalRange, TREND_NAME } from '../line-with-trend.js';
import type { ChartOptions } from '../options.js';
import { PALETTE } from '../theme.js';

export const CONTEXT_WIDTH = 1.25;
export const TREND_WIDTH = 2.75;
export const PROVISIONAL_DASH: readonly [number, number] = [6, 4];

interface Context {
  values: readonly number[];
  name: string;
  colour: string;
  /** Events marked on the chart (steps in the level and named events): index and label. */
  events?: readonly { at: number; label: string }[];
}

/** An event's mark: a dotted rule across the plot, a small open diamond at its top, the label beside it. */
export const EVENT_COLOUR = PALETTE.ink;
export const EVENT_NAME = 'step in level or named event';
const EVENT_RULE: Stroke = { colour: EVENT_COLOUR, width: 1, dash: [2, 3], opacity: 0.7 };

/** Polylines through the finite points of [from, to), broken where a value is missing. */
export function polylines(
  xs: ArrayLike<number>,
  values: ArrayLike<number>,
  y: (v: number) => number,
  from = 0,
  to = values.length,
): number[][] {
  const segments: number[][] = [];
  let current: number[] | null = null;
  for (let i = from; i < to; i++) {
    const v = values[i];
    if (!Number.isFinite(v) || !Number.isFinite(xs[i])) {
      current = null;
      continue;
    }
    if (current === null) {
      current = [];
      segments.push(current);
    }
    current.push(xs[i], y(v));
  }
  return segments;
}

/**
 * The chart of one context line and the trend. `from` draws only the periods from that index on (the
 * recent detail of a dense series). A dense series (dense.ts) is drawn as calendar summaries: each
 * bucket's range as a light band, its mean as the thin line, the trend as means of short runs.
 */
export function lineWithTrendScene(series: SeriesBrief, context: Context, options: ChartOptions, from = 0): Scene {
  const { dates, trend } = series.components;
  const n = dates.length;
  const all = instantsOf(series.periodIndex);
  const times = from > 0 ? all.subarray(from) : all;
  const provisional = provisionalRange(series);
  const t0 = times.length > 0 ? times[0] : 0;
  const t1 = times.length > 0 ? times[times.length - 1] : 1;
  const unit = from === 0 ? denseUnit(series.frequency, times) : null;
  const buckets = unit ? bucketise(times, context.values, unit) : null;

  const contextStroke: Stroke = { colour: context.colour, width: CONTEXT_WIDTH, cap: 'round', join: 'round' };
  const trendStroke: Stroke = {
    colour: options.accent ?? PALETTE.trend,
    width: TREND_WIDTH,
    cap: 'butt',
    join: 'round',
  };
  const dashedStroke: Stroke = { ...trendStroke, dash: PROVISIONAL_DASH };
  const provisionalShown = provisional !== null && provisional.from < n;
  // A recent detail that lies wholly in the provisional stretch has no solid trend to name.
  const settledShown = !provisional || provisional.from > from + 1;
  const entries: LegendEntry[] = [
    ...(buckets
      ? [
          {
            label: `range of ${PERIOD_ADJECTIVE[series.frequency]} values in a ${UNIT_WORDS[buckets.unit].one}`,
            shape: 'square' as const,
            fill: context.colour,
            fillOpacity: BAND_OPACITY,
          },
          {
            label: `${UNIT_WORDS[buckets.unit].adjective} mean`,
            shape: 'stroke' as const,
            fill: null,
            stroke: contextStroke,
          },
        ]
      : [{ label: context.name, shape: 'stroke' as const, fill: null, stroke: contextStroke }]),
    ...(settledShown ? [{ label: TREND_NAME, shape: 'stroke' as const, fill: null, stroke: trendStroke }] : []),
    ...(provisionalShown
      ? [{ label: PROVISIONAL_NAME, shape: 'stroke' as const, fill: null, stroke: dashedStroke }]
      : []),
  ];
  const events = (context.events ?? []).filter((e) => e.at >= from && e.at < n);
  if (events.length > 0) {
    entries.push({ label: EVENT_NAME, shape: 'diamond', fill: 'white', stroke: { colour: EVENT_COLOUR, width: 1.25 } });
  }

  const cut = provisional ? Math.max(from, provisional.from) : n;
  const f = frame({
    legend: entries,
    values: buckets ? [buckets.min, buckets.max, trend.slice(from)] : [context.values.slice(from), trend.slice(from)],
    axis: true,
    title: series.unit || null,
    grid: true,
    x: { kind: 'time', domain: t0 <= t1 ? [t0, t1] : [t1, t0] },
    locale: options.locale,
  });
  const path = (segments: number[][], stroke: Stroke): PathMark => ({ type: 'path', segments, stroke });
  const trendMarks: Mark[] = [];
  const contextMarks: Mark[] = [];
  if (buckets) {
    const mid = Array.from(buckets.start, (s0, j) => f.x((s0 + buckets.end[j]) / 2));
    contextMarks.push(
      {
        type: 'area',
        segments: bandSegments(mid, buckets.min, buckets.max, f.y),
        fill: context.colour,
        fillOpacity: BAND_OPACITY,
      },
      path(polylines(mid, Array.from(buckets.mean), f.y), contextStroke),
    );
    // The trend through means of runs about a pixel and a half long; its provisional stretch on its own.
    const slices = Math.round(f.plotWidth / 1.5);
    const settled = sliceMeans(all, trend, Math.max(1, Math.round((slices * cut) / n)), 0, cut);
    trendMarks.push(path(polylines(settled.t.map(f.x), settled.v, f.y), trendStroke));
    if (provisionalShown) {
      const start = Math.max(0, cut - 1);
      const tail = sliceMeans(all, trend, Math.max(1, Math.round((slices * (n - start)) / n)), start, n);
      trendMarks.push(path(polylines(tail.t.map(f.x), tail.v, f.y), dashedStroke));
    }
  } else {
    const xs: number[] = new Array(n);
    for (let i = from; i < n; i++) xs[i] = f.x(all[i]);
    contextMarks.push(path(polylines(xs, context.values, f.y, from, n), contextStroke));
    trendMarks.push(path(polylines(xs, trend, f.y, from, cut), trendStroke));
    if (provisionalShown) trendMarks.push(path(polylines(xs, trend, f.y, Math.max(from, cut - 1), n), dashedStroke));
  }
  const eventMarks: Mark[] = [];
  events.forEach((e, k) => {
    const x = f.x(all[e.at]);
    // Labels alternate between two rows so that two events close together do not print over each other.
    const row = 10 + 14 * (k % 2);
    const nearEnd = x > f.plotWidth - 150;
    eventMarks.push(
      { type: 'line', x1: x, y1: 0, x2: x, y2: f.plotHeight, stroke: EVENT_RULE },
      {
        type: 'symbol',
        shape: 'diamond',
        x,
        y: row - 4,
        size: 49,
        fill: 'white',
        stroke: { colour: EVENT_COLOUR, width: 1.25 },
      },
      {
        type: 'text',
        x: nearEnd ? x - 7 : x + 7,
        y: row,
        text: e.label.length > 32 ? `${e.label.slice(0, 31)}…` : e.label,
        anchor: nearEnd ? 'end' : 'start',
        baseline: 'alphabetic',
        size: 12,
        weight: 'normal',
        fill: EVENT_COLOUR,
      },
    );
  });
  return f.scene([
    { type: 'group', name: 'context', x: 0, y: 0, marks: contextMarks },
    { type: 'group', name: 'trend', x: 0, y: 0, marks: trendMarks },
    ...(eventMarks.length > 0 ? [{ type: 'group' as const, name: 'events', x: 0, y: 0, marks: eventMarks }] : []),
  ]);
}

/** The band between two lines as polygons, one per run of points where both are finite. */
export function bandSegments(
  xs: readonly number[],
  low: ArrayLike<number>,
  high: ArrayLike<number>,
  y: (v: number) => number,
): number[][] {
  const segments: number[][] = [];
  let run: number[] = [];
  const close = () => {
    if (run.length >= 1) {
      const polygon: number[] = [];
      for (const i of run) polygon.push(xs[i], y(high[i]));
      for (let k = run.length - 1; k >= 0; k--) polygon.push(xs[run[k]], y(low[run[k]]));
      // One point alone: a hair-wide sliver, so a lone summary still shows its range.
      if (run.length === 1) polygon.splice(2, 0, xs[run[0]] + 1, y(high[run[0]]), xs[run[0]] + 1, y(low[run[0]]));
      segments.push(polygon);
    }
    run = [];
  };
  for (let i = 0; i < xs.length; i++) {
    if (Number.isFinite(low[i]) && Number.isFinite(high[i]) && Number.isFinite(xs[i])) run.push(i);
    else close();
  }
  close();
  return segments;
}
