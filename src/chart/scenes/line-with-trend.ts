/**
 * The scene shared by the two line charts (line-with-trend.ts is their spec): a thin context line under
 * the bold trend, whose provisional end is dashed and named in the legend, so the difference never rests
 * on colour alone. The dashed stretch starts at the last final value, so the two pieces join.
 */
import type { SeriesBrief } from '../../brief/model.js';
import { frame } from '../frame.js';
import type { LegendEntry } from '../legend.js';
import { PROVISIONAL_NAME, provisionalRange, TREND_NAME } from '../line-with-trend.js';
import type { ChartOptions } from '../options.js';
import type { Mark, PathMark, Scene, Stroke } from '../scene.js';
import { PALETTE } from '../theme.js';

export const CONTEXT_WIDTH = 1.25;
export const TREND_WIDTH = 2.75;
export const PROVISIONAL_DASH: readonly [number, number] = [6, 4];

interface Context {
  values: number[];
  name: string;
  colour: string;
}

/** Polylines through the finite points of [from, to), broken where a value is missing. */
export function polylines(
  xs: readonly number[],
  values: readonly number[],
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

export function lineWithTrendScene(series: SeriesBrief, context: Context, options: ChartOptions): Scene {
  const { dates, trend } = series.components;
  const provisional = provisionalRange(series);
  const times = dates.map((d) => Date.parse(d));
  const t0 = times.length > 0 ? times[0] : 0;
  const t1 = times.length > 0 ? times[times.length - 1] : 1;

  const contextStroke: Stroke = { colour: context.colour, width: CONTEXT_WIDTH, cap: 'round', join: 'round' };
  const trendStroke: Stroke = { colour: PALETTE.trend, width: TREND_WIDTH, cap: 'butt', join: 'round' };
  const dashedStroke: Stroke = { ...trendStroke, dash: PROVISIONAL_DASH };
  const entries: LegendEntry[] = [
    { label: context.name, shape: 'stroke', fill: null, stroke: contextStroke },
    { label: TREND_NAME, shape: 'stroke', fill: null, stroke: trendStroke },
    ...(provisional ? [{ label: PROVISIONAL_NAME, shape: 'stroke' as const, fill: null, stroke: dashedStroke }] : []),
  ];

  const cut = provisional ? provisional.from : dates.length;
  const f = frame({
    legend: entries,
    values: [context.values, trend],
    axis: true,
    title: series.unit || null,
    grid: true,
    x: { kind: 'time', domain: t0 <= t1 ? [t0, t1] : [t1, t0] },
    locale: options.locale,
  });
  const xs = times.map(f.x);
  const path = (segments: number[][], stroke: Stroke): PathMark => ({ type: 'path', segments, stroke });
  const trendMarks: Mark[] = [path(polylines(xs, trend, f.y, 0, cut), trendStroke)];
  if (provisional) trendMarks.push(path(polylines(xs, trend, f.y, Math.max(0, cut - 1), dates.length), dashedStroke));
  return f.scene([
    { type: 'group', name: 'context', x: 0, y: 0, marks: [path(polylines(xs, context.values, f.y), contextStroke)] },
    { type: 'group', name: 'trend', x: 0, y: 0, marks: trendMarks },
  ]);
}
