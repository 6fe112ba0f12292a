/**
 * The public vega-lite spec is generated from the scene the brief draws (src/chart/scene-spec.ts), so the
 * two cannot drift apart. Checked against vega itself, a reference library: the spec drawn by vega and the
 * scene drawn by our SVG writer, both turned into pixels by resvg with the same fonts, give the same picture
 * for every chart of series of each frequency, dense daily data (summaries, bands and the recent detail) and
 * a chart with event marks. "The same" allows 0.1% of pixels to differ by more than a fifth of the colour
 * range: antialiasing where vega writes a coordinate to more decimals than our 0.01 px (measured: at most
 * 0.01% on these charts).
 */
import { Resvg } from '@resvg/resvg-js';
import { describe, expect, it } from 'vitest';
import { FONT_NAME, sourceSansFiles } from '../../src/chart/fonts.js';
import { buildCharts, chartSpec, chartSpecOf } from '../../src/chart/index.js';
import { sceneSpec } from '../../src/chart/scene-spec.js';
import { renderChartSpec } from '../../src/chart/spec-svg.js';
import type { Chart, SeriesBrief } from '../../src/vocabulary/brief.js';
import { sampleSeries } from './sample.js';

function pixels(svg: string): { data: Buffer; width: number; height: number } {
  const resvg = new Resvg(svg, {
    background: 'white',
    font: { fontFiles: sourceSansFiles(), loadSystemFonts: false, defaultFontFamily: FONT_NAME },
  });
  const image = resvg.render();
  return { data: image.pixels, width: image.width, height: image.height };
}

/** Share of pixels whose colour differs by more than `tolerance` (0–255) in any channel. */
function differing(a: Buffer, b: Buffer, tolerance: number): number {
  let k = 0;
  for (let i = 0; i < a.length; i += 4) {
    if (
      Math.abs(a[i] - b[i]) > tolerance ||
      Math.abs(a[i + 1] - b[i + 1]) > tolerance ||
      Math.abs(a[i + 2] - b[i + 2]) > tolerance
    )
      k++;
  }
  return k / (a.length / 4);
}

async function vegaPicture(chart: Chart) {
  const drawn = await renderChartSpec(chartSpecOf(chart), { idPrefix: 'x', title: chart.title, desc: chart.alt });
  expect(drawn.warnings, chart.id).toEqual([]);
  return pixels(drawn.svg);
}

/** A step in the level and a named one-off, as the effects work reports them (only what the chart reads). */
function withEvents(series: SeriesBrief): SeriesBrief {
  const events = [
    { at: 20, label: null, kind: 'step', estimate: 4 },
    { at: 33, label: 'Depot closed', kind: 'one-off', estimate: -6 },
  ];
  return { ...series, effects: { events } as unknown as SeriesBrief['effects'] };
}

const flat = (n: number) => Array.from({ length: n }, () => 100);

const SERIES: [string, SeriesBrief][] = [
  ['monthly, events', withEvents(sampleSeries({ spikes: [5, 30] }))],
  ['monthly, multiplicative', sampleSeries({ model: 'multiplicative', length: 60, spikes: [12] })],
  ['quarterly', sampleSeries({ frequency: 'quarterly', period: 4, length: 28 })],
  ['weekly', sampleSeries({ frequency: 'weekly', period: 52, length: 260, spikes: [100, 200] })],
  ['hourly', sampleSeries({ frequency: 'hourly', period: 24, length: 1000, comparisonLabels: [] })],
  [
    'daily, dense',
    sampleSeries({
      frequency: 'daily',
      period: 7,
      length: 2000,
      trend: flat(2000),
      spikes: [1500],
      comparisonLabels: [],
    }),
  ],
];

describe.each(SERIES)('%s: vega draws the spec as the brief draws the scene', (name, series) => {
  it('every chart the brief has', async () => {
    const charts = await buildCharts(series, 'en-GB');
    const ids = charts.map((c) => c.id);
    if (name.startsWith('daily')) expect(ids).toContain('recent');
    for (const chart of charts) {
      const ours = pixels(chart.svg);
      const theirs = await vegaPicture(chart);
      expect([theirs.width, theirs.height]).toEqual([ours.width, ours.height]);
      expect(differing(ours.data, theirs.data, 51), chart.id).toBeLessThan(0.001);
    }
  });
});

describe('the generated spec', () => {
  it('is the chart of its kind: chartSpec gives the spec of the scene the brief draws', async () => {
    const series = withEvents(sampleSeries({ spikes: [5] }));
    const charts = await buildCharts(series, 'en-GB');
    for (const chart of charts) {
      expect(chartSpec(chart.id as never, series, 'en-GB')).toEqual(chartSpecOf(chart));
    }
  });

  it('names its layers after the scene groups, and carries the event labels and dense bands', async () => {
    const [observed] = await buildCharts(withEvents(sampleSeries()), 'en-GB');
    const text = JSON.stringify(chartSpecOf(observed));
    expect(text).toContain('"description":"plot/events"');
    expect(text).toContain('Depot closed');
    const dense = sampleSeries({
      frequency: 'daily',
      period: 7,
      length: 2000,
      trend: flat(2000),
      comparisonLabels: [],
    });
    const [summary] = await buildCharts(dense, 'en-GB');
    expect(JSON.stringify(chartSpecOf(summary))).toContain('"type":"geoshape"');
  });

  it('would notice a mark left out: dropping one layer changes the picture', async () => {
    const [chart] = await buildCharts(sampleSeries({ spikes: [5, 30] }), 'en-GB');
    const spec = chartSpecOf(chart) as unknown as { layer: { description: string }[] };
    const trend = spec.layer.findIndex((l) => l.description === 'plot/trend');
    expect(trend).toBeGreaterThanOrEqual(0);
    spec.layer.splice(trend, 1);
    const drawn = await renderChartSpec(spec as never, { idPrefix: 'x', title: 't', desc: 'd' });
    expect(differing(pixels(chart.svg).data, pixels(drawn.svg).data, 51)).toBeGreaterThan(0.001);
  });

  it('refuses a clipped group, which no vega-lite layer can draw', () => {
    const scene = {
      width: 10,
      height: 10,
      background: 'white',
      marks: [{ type: 'group' as const, name: 'plot', x: 0, y: 0, clip: { width: 5, height: 5 }, marks: [] }],
    };
    expect(() => sceneSpec(scene)).toThrow(/clipped/);
  });
});
