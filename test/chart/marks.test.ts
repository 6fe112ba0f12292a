/**
 * One mark per data point where the chart promises it, counted in the SVG the brief carries: each layer of a
 * chart's scene is a named group, which the SVG writer gives that name as its class (scene-svg.ts). Expected
 * counts follow from how the synthetic series in sample.ts is built, worked out in the comments.
 */
import { describe, expect, it } from 'vitest';
import type { ChartKind } from '../../src/chart/index.js';
import { buildChart, CHARTS } from '../../src/chart/index.js';
import { PALETTE } from '../../src/chart/theme.js';
import type { SeriesBrief } from '../../src/vocabulary/brief.js';
import { sampleSeries } from './sample.js';
import { childElements, findAll, parseXml, sceneGroup, textOf, type XmlElement } from './xml.js';

async function svgOf(kind: ChartKind, series: SeriesBrief, locale = 'en-GB'): Promise<XmlElement> {
  const definition = CHARTS.find((c) => c.id === kind)!;
  return parseXml((await buildChart(definition, series, locale)).svg);
}

/** The drawn items of a kind (path, rect, line, circle; any by default) of every group of a named layer. */
function items(root: XmlElement, layer: string, kind?: string): XmlElement[] {
  return sceneGroup(root, layer).flatMap((g) =>
    g.children.filter((c): c is XmlElement => typeof c === 'object' && c.name !== 'g' && (!kind || c.name === kind)),
  );
}

function texts(root: XmlElement): string[] {
  return findAll(root, (e) => e.name === 'text').map(textOf);
}

describe('seasonal profile', () => {
  it('draws exactly one bar per season of a monthly series (12)', async () => {
    const root = await svgOf('seasonal-profile', sampleSeries());
    expect(items(root, 'seasons', 'rect')).toHaveLength(12);
    expect(texts(root)).toEqual(expect.arrayContaining(['Jan', 'Jul', 'Dec']));
  });

  it('draws exactly one bar per season of a quarterly series (4)', async () => {
    const root = await svgOf('seasonal-profile', sampleSeries({ frequency: 'quarterly', period: 4, length: 28 }));
    expect(items(root, 'seasons')).toHaveLength(4);
  });
});

describe('observed and trend', () => {
  it('draws the trend in two pieces, the provisional one dashed and named in the legend', async () => {
    const root = await svgOf('observed-trend', sampleSeries({ provisionalCount: 6 }));
    const trend = items(root, 'trend', 'path');
    expect(trend).toHaveLength(2);
    const dashes = trend.map((p) => p.attrs['stroke-dasharray'] ?? '');
    // Solid has no dash pattern; the provisional piece dashes 6 on, 4 off, at the same width.
    expect(dashes).toEqual(['', '6,4']);
    expect(trend[0].attrs['stroke-width']).toBe(trend[1].attrs['stroke-width']);
    // The provisional piece starts at the last final value: 6 provisional points plus 1 → 7 vertices, 6 segments.
    const d = trend[1].attrs.d;
    expect(d.match(/L/g)).toHaveLength(6);
    expect(texts(root)).toContain('trend (provisional)');
    expect(items(root, 'context')).toHaveLength(1);
  });

  it('has no dashed piece and no legend entry when nothing is provisional', async () => {
    const root = await svgOf('observed-trend', sampleSeries({ provisionalCount: 0 }));
    expect(items(root, 'trend')).toHaveLength(1);
    expect(texts(root)).not.toContain('trend (provisional)');
  });

  it('breaks the observed line at a missing value instead of bridging it', async () => {
    const series = sampleSeries();
    series.components.observed[10] = Number.NaN;
    const root = await svgOf('observed-trend', series);
    const d = items(root, 'context')[0].attrs.d;
    // 48 points with index 10 missing: a run of 10 (0–9) and one of 37 (11–47), two "M" moves.
    expect(d.match(/M/g)).toHaveLength(2);
    expect(d.match(/L/g)).toHaveLength(9 + 36);
  });
});

describe('remainder', () => {
  it('draws one point and one stem per value, the unusual ones as diamonds in their own colour, labelled', async () => {
    const root = await svgOf('remainder', sampleSeries({ spikes: [5, 20] }), 'en-US');
    const points = items(root, 'points');
    expect(points).toHaveLength(48);
    expect(items(root, 'stems', 'line')).toHaveLength(48);
    const unusual = points.filter((p) => p.attrs.fill === PALETTE.unusual);
    expect(unusual).toHaveLength(2);
    // A diamond is a path of four vertices (M and three L, closed); the usual values are circles.
    for (const p of unusual) {
      expect(p.name).toBe('path');
      expect(p.attrs.d).toMatch(/^M[^ML]+(L[^ML]+){3}Z$/);
    }
    for (const p of points.filter((q) => q.attrs.fill !== PALETTE.unusual)) expect(p.name).toBe('circle');
    // Index 5 of a series starting January 2021 is June 2021, index 20 is September 2022.
    const month = new Intl.DateTimeFormat('en-US', { month: 'short', year: 'numeric', timeZone: 'UTC' });
    const labels = findAll(root, (e) => e.name === 'text').map(textOf);
    expect(labels).toContain(month.format(Date.UTC(2021, 5, 1)));
    expect(labels).toContain(month.format(Date.UTC(2022, 8, 1)));
  });

  it('labels only one of two unusual values in neighbouring weeks, so labels never overprint', async () => {
    // 260 weeks across about 580 px put neighbours 2.2 px apart, far less than a date label's width.
    const series = sampleSeries({ frequency: 'weekly', period: 52, length: 260, spikes: [100, 101, 200] });
    const root = await svgOf('remainder', series);
    expect(items(root, 'points').filter((p) => p.attrs.fill === PALETTE.unusual)).toHaveLength(3);
    expect(childElements(sceneGroup(root, 'labels-above')[0], 'text')).toHaveLength(2);
  });

  it('centres the stems on 1 for a multiplicative model, where the remainder is a ratio', async () => {
    const series = sampleSeries({ model: 'multiplicative', spikes: [] });
    series.components.remainder = series.components.remainder.map((r) => 1 + r / 100);
    const root = await svgOf('remainder', series);
    expect(texts(root)).toContain('ratio to trend × season');
    expect(items(root, 'points')).toHaveLength(48);
  });
});

describe('year-over-year bars', () => {
  // Trend 100 + i up to i = 35, then 90. Lag 12: for i = 12…35 the change is (100 + i)/(88 + i) − 1 > 0,
  // e.g. i = 12: 112/100 − 1 = 12 %; for i = 36…47 it is 90/(88 + i) − 1 < 0, e.g. i = 36: 90/124 − 1 = −27.4 %.
  // The last 36 periods are i = 12…47: 24 rises and 12 falls.
  const trend = Array.from({ length: 48 }, (_, i) => (i < 36 ? 100 + i : 90));

  it('draws one bar per period of the last 36, rises filled and falls outlined', async () => {
    const root = await svgOf('yoy', sampleSeries({ trend }));
    const bars = items(root, 'yoy', 'rect');
    expect(bars).toHaveLength(36);
    const falls = bars.filter((b) => b.attrs.fill === 'white');
    expect(falls).toHaveLength(12);
    for (const b of falls) expect(b.attrs.stroke).toBe(PALETTE.fall);
    expect(bars.filter((b) => b.attrs.fill === PALETTE.rise)).toHaveLength(24);
  });

  it('leaves a period without a trend value blank rather than drawing a zero bar', async () => {
    // A centred trend ends six periods early: 36 − 6 = 30 bars.
    const cut = trend.map((v, i) => (i >= 42 ? Number.NaN : v));
    const bars = items(await svgOf('yoy', sampleSeries({ trend: cut })), 'yoy', 'rect');
    expect(bars).toHaveLength(30);
  });

  it('marks the provisional stretch with a labelled band', async () => {
    const root = await svgOf('yoy', sampleSeries({ trend, provisionalCount: 6 }));
    expect(items(root, 'provisional-band', 'rect')).toHaveLength(1);
    expect(texts(root)).toContain('provisional');
    const none = await svgOf('yoy', sampleSeries({ trend, provisionalCount: 0 }));
    expect(items(none, 'provisional-band', 'rect')).toHaveLength(0);
    expect(texts(none)).not.toContain('provisional');
  });
});

describe('comparisons', () => {
  it('draws a baseline and a current bar per comparison, with values and the change', async () => {
    const root = await svgOf('comparisons', sampleSeries({ comparisonLabels: ['A', 'B', 'C'] }), 'en-GB');
    expect(items(root, 'comparison-bars', 'rect')).toHaveLength(6);
    const t = texts(root);
    // Comparisons after the first in sample.ts: raw 1000 + 10·i against 950; i = 1: 1010/950 − 1 = +6.3 %,
    // i = 2: 1020/950 − 1 = +7.4 % (one decimal, en-GB groups thousands with a comma: CLDR, common practice).
    expect(t).toEqual(expect.arrayContaining(['A', 'B', 'C', '1,010', '1,020', '950', '+6.3%', '+7.4%']));
  });

  it('writes numbers the locale’s way (de-DE: "." groups thousands, "," marks decimals; CLDR)', async () => {
    const t = texts(await svgOf('comparisons', sampleSeries({ comparisonLabels: ['A', 'B'] }), 'de-DE'));
    expect(t).toContain('1.010');
    expect(t.some((s) => /^\+6,3\s?%$/.test(s))).toBe(true);
  });
});
