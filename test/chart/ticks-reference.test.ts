/**
 * Our chart scenes against vega, a general-purpose reference library, drawing the vega-lite spec of the
 * same chart (the public description of it, src/chart/*-spec builders): the value axis of every chart
 * kind that has one carries the tick values vega computes, and the time axes tick the same instants,
 * read from vega's scenegraph (the axis tick items' data) and from our scene's y-axis labels and x-axis
 * tick lines.
 *
 * Differences by design, and so not compared: the comparisons chart has no value axis (its value labels
 * stand in for one, the spec sets axis: null); weekly time ticks start on Monday in ours (ISO 8601, as our
 * weekly periods do) and on Sunday in vega (d3-time's utcWeek), checked against d3-time in scales.test.ts.
 */
import * as vega from 'vega';
import { compile } from 'vega-lite';
import { describe, expect, it } from 'vitest';
import { CHARTS, type ChartKind } from '../../src/chart/index.js';
import { installFontMetrics } from '../../src/chart/svg.js';
import { periodBounds, yoyBars } from '../../src/chart/yoy-bars.js';
import type { SeriesBrief } from '../../src/vocabulary/brief.js';
import { findGroup, type GroupMark, type LineMark, type Scene, type TextMark } from '../../src/vocabulary/scene.js';
import { sampleSeries } from './sample.js';

interface VegaItem {
  datum?: Record<string, unknown>;
  x?: number;
  items?: VegaMark[];
}
interface VegaMark {
  role?: string;
  marktype?: string;
  items?: VegaItem[];
}

/** Tick values (numbers or instants) and x positions of vega's axis on a scale. */
async function vegaAxes(kind: ChartKind, series: SeriesBrief) {
  installFontMetrics();
  const spec = CHARTS.find((c) => c.id === kind)?.spec?.(series, { locale: 'en-GB' });
  const view = new vega.View(vega.parse(compile(spec as never).spec), { renderer: 'none' });
  await view.runAsync();
  const found = new Map<string, { values: number[]; xs: number[] }>();
  const visit = (mark: VegaMark) => {
    for (const item of mark.items ?? []) {
      const d = item.datum;
      if (mark.role === 'axis' && d && d.ticks === true) {
        for (const m of item.items ?? [])
          if (m.role === 'axis-tick')
            found.set(String(d.scale), {
              // In axis order: vega keeps a thinned axis's items in the order its overlap pass left them.
              values: (m.items ?? []).map((i) => Number(i.datum?.value)).sort((a, b) => a - b),
              xs: (m.items ?? []).map((i) => Number(i.x)).sort((a, b) => a - b),
            });
      }
      for (const m of item.items ?? []) visit(m);
    }
  };
  // vega types its scenegraph loosely; the walk above reads only roles, items and data.
  visit((view.scenegraph() as unknown as { root: VegaMark }).root);
  const width = view.width();
  const xDomain = (view.scale('x') as unknown as { domain: () => unknown[] }).domain().map(Number);
  view.finalize();
  return { y: found.get('y'), x: found.get('x'), width, xDomain };
}

function axisGroup(scene: Scene, name: string): GroupMark {
  const plot = findGroup(scene.marks, 'plot');
  const g = plot && findGroup(plot.marks, name);
  if (!g) throw new Error(`scene has no ${name}`);
  return g;
}

/** Our value axis: the numbers its labels print (en-GB: "," groups, "−" is minus) and its tick count. */
function ourYTicks(scene: Scene): { values: number[]; tickCount: number } {
  const g = axisGroup(scene, 'y-axis');
  const labels = g.marks.filter((m): m is TextMark => m.type === 'text' && !m.angle);
  const values = labels.map((l) => Number(l.text.replace(/,/g, '').replace('−', '-').replace('+', ''))).reverse();
  // Lines: the axis line first, then one tick per value.
  const tickCount = g.marks.filter((m) => m.type === 'line').length - 1;
  return { values: values.sort((a, b) => a - b), tickCount };
}

/** Our bottom axis: tick x positions (1 px lines on the half pixel) and the plot width (the axis line). */
function ourXTicks(scene: Scene): { xs: number[]; width: number } {
  const lines = axisGroup(scene, 'x-axis').marks.filter((m): m is LineMark => m.type === 'line');
  const [axis, ...ticks] = lines;
  return { xs: ticks.map((t) => t.x1 - 0.5), width: axis.x2 };
}

const SERIES: [string, SeriesBrief][] = [
  ['monthly, 48 months', sampleSeries()],
  ['monthly, spikes, no provisional end', sampleSeries({ spikes: [5, 30], provisionalCount: 0 })],
  ['monthly, multiplicative', multiplicative()],
  ['quarterly, 28 quarters', sampleSeries({ frequency: 'quarterly', period: 4, length: 28 })],
  ['weekly, five years', sampleSeries({ frequency: 'weekly', period: 52, length: 260, spikes: [100, 200] })],
  ['daily, 120 days', sampleSeries({ frequency: 'daily', period: 7, length: 120, comparisonLabels: [] })],
  ['hourly, 1,000 hours', sampleSeries({ frequency: 'hourly', period: 24, length: 1000, comparisonLabels: [] })],
  ['falling trend', sampleSeries({ trend: Array.from({ length: 48 }, (_, i) => (i < 36 ? 100 + i : 90)) })],
];

function multiplicative(): SeriesBrief {
  const s = sampleSeries({ model: 'multiplicative', spikes: [12] });
  s.components.remainder = s.components.remainder.map((r) => 1 + r / 100);
  return s;
}

const WITH_VALUE_AXIS: ChartKind[] = ['observed-trend', 'adjusted-trend', 'seasonal-profile', 'remainder', 'yoy'];
const TIME_AXIS: ChartKind[] = ['observed-trend', 'adjusted-trend', 'remainder', 'yoy'];

describe.each(SERIES)('against vega: %s', (_, series) => {
  it.each(WITH_VALUE_AXIS)('%s: the value axis has vega’s tick values', async (kind) => {
    const scene = CHARTS.find((c) => c.id === kind)?.scene(series, { locale: 'en-GB' }) as Scene;
    const theirs = await vegaAxes(kind, series);
    if (theirs.y === undefined) {
      // vega draws no value axis only for a year-over-year chart with nothing to draw; nor do we.
      expect(kind).toBe('yoy');
      expect(() => axisGroup(scene, 'y-axis')).toThrow();
      return;
    }
    const ours = ourYTicks(scene);
    expect(ours.tickCount).toBe(theirs.y.values.length);
    // Every tick is labelled in ours (none thinned at these spacings), so the labels are the tick values.
    expect(ours.values.length).toBe(ours.tickCount);
    const step = theirs.y.values.length > 1 ? theirs.y.values[1] - theirs.y.values[0] : 1;
    ours.values.forEach((v, i) => {
      expect(Math.abs(v - (theirs.y?.values[i] ?? Number.NaN))).toBeLessThan(step * 1e-6);
    });
  });

  it.each(TIME_AXIS)('%s: the time axis ticks the instants vega ticks', async (kind) => {
    const scene = CHARTS.find((c) => c.id === kind)?.scene(series, { locale: 'en-GB' }) as Scene;
    const theirs = await vegaAxes(kind, series);
    // The year-over-year axis ends at the end of its last bar; a tick there would name the period after
    // it, so ours stop at the last bar's start.
    const bars = yoyBars(series);
    const ticksTo =
      kind === 'yoy' && bars.length > 0
        ? periodBounds(series.frequency, bars[bars.length - 1].ordinal)[0]
        : Number.POSITIVE_INFINITY;
    const ticks = (theirs.x?.values ?? []).filter((t) => t <= ticksTo);
    const sundays =
      ticks.length > 1 && ticks.every((t) => new Date(t).getUTCDay() === 0 && new Date(t).getUTCDate() !== 1);
    const ours = ourXTicks(scene);
    if (sundays) {
      // vega's weeks start on Sunday; ours on Monday, one day later.
      expect(ours.xs.length).toBeGreaterThan(0);
      return;
    }
    expect(ours.xs.length).toBe(ticks.length);
    const [t0, t1] = theirs.xDomain;
    // Ours sit on whole pixels (crisp lines): within a pixel of where vega's instant falls on our plot.
    ticks.forEach((t, i) => {
      expect(Math.abs(ours.xs[i] - ((t - t0) / (t1 - t0)) * ours.width)).toBeLessThanOrEqual(1);
    });
  });
});

describe('against vega: the seasonal profile’s band axis', () => {
  it('puts a tick at the centre of each season’s band, where vega puts it', async () => {
    const series = sampleSeries();
    const scene = CHARTS.find((c) => c.id === 'seasonal-profile')?.scene(series, { locale: 'en-GB' }) as Scene;
    const theirs = await vegaAxes('seasonal-profile', series);
    const ours = ourXTicks(scene);
    expect(ours.xs.length).toBe(12);
    // The same fractions of the plot width, within 1.5 px: both round tick positions to whole pixels
    // (half a pixel each), and the plots differ by a few pixels in width, which scales the rest.
    ours.xs.forEach((x, i) => {
      expect(
        Math.abs(x / ours.width - (theirs.x?.xs[i] ?? Number.NaN) / theirs.width) * ours.width,
      ).toBeLessThanOrEqual(1.5);
    });
  });
});
