/**
 * The chart stage: every chart of one series, in reading order, as labelled static SVG (and PNG on demand).
 * Ids inside each SVG start with the series id and the chart id, so a page holding several series stays valid.
 */
import type { TopLevelSpec } from 'vega-lite';
import type { Chart, SeriesBrief } from '../brief/model.js';
import { adjustedTrendSpec } from './adjusted-trend.js';
import { adjustedTrendAlt, comparisonsAlt, observedTrendAlt, remainderAlt, seasonalProfileAlt, yoyAlt } from './alt.js';
import { comparisonsSpec } from './comparisons.js';
import { observedTrendSpec } from './observed-trend.js';
import type { ChartOptions } from './options.js';
import { svgToPng } from './png.js';
import { remainderSpec } from './remainder.js';
import { seasonalProfileSpec } from './seasonal-profile.js';
import { renderSvg } from './svg.js';
import { yoyBarsSpec } from './yoy-bars.js';

export type ChartKind = 'observed-trend' | 'adjusted-trend' | 'seasonal-profile' | 'remainder' | 'yoy' | 'comparisons';

export interface ChartDefinition {
  id: ChartKind;
  title: (label: string) => string;
  caption: string;
  spec: (series: SeriesBrief, options: ChartOptions) => TopLevelSpec;
  alt: (series: SeriesBrief, locale: string) => string;
}

/** Reading order: the series and its trend, the season removed, the season itself, what is left, growth, comparisons. */
export const CHARTS: readonly ChartDefinition[] = [
  {
    id: 'observed-trend',
    title: (label) => `${label}: values and trend`,
    caption:
      'The thin line shows each period’s value; the bold line is the trend, dashed where it is still provisional.',
    spec: observedTrendSpec,
    alt: observedTrendAlt,
  },
  {
    id: 'adjusted-trend',
    title: (label) => `${label}: seasonally adjusted, with trend`,
    caption:
      'The thin line is the series with its usual seasonal pattern taken out; the bold line is the trend, dashed where provisional.',
    spec: adjustedTrendSpec,
    alt: adjustedTrendAlt,
  },
  {
    id: 'seasonal-profile',
    title: (label) => `${label}: typical seasonal effect`,
    caption: 'Each bar shows how far that season usually sits above or below the trend.',
    spec: seasonalProfileSpec,
    alt: seasonalProfileAlt,
  },
  {
    id: 'remainder',
    title: (label) => `${label}: remainder and unusual values`,
    caption:
      'Each stem is what trend and season leave unexplained; diamonds mark unusual values, labelled with their period.',
    spec: remainderSpec,
    alt: remainderAlt,
  },
  {
    id: 'yoy',
    title: (label) => `${label}: trend against a year earlier`,
    caption:
      'Each bar is the trend’s change on the same period a year before: filled bars are rises, outlined bars falls.',
    spec: yoyBarsSpec,
    alt: yoyAlt,
  },
  {
    id: 'comparisons',
    title: (label) => `${label}: comparisons`,
    caption: 'Each panel sets the current span beside its baseline; the label over the current bar gives the change.',
    spec: comparisonsSpec,
    alt: comparisonsAlt,
  },
];

/** Renders one chart of a series. */
export async function buildChart(definition: ChartDefinition, series: SeriesBrief, locale: string): Promise<Chart> {
  const title = definition.title(series.label);
  const alt = definition.alt(series, locale);
  const { svg, width, height } = await renderSvg(definition.spec(series, { locale }), {
    idPrefix: `${series.id}-${definition.id}`,
    title,
    desc: alt,
  });
  return { id: definition.id, title, alt, caption: definition.caption, svg, width, height };
}

/**
 * All charts of a series in reading order. The comparisons chart is left out when the job asks for no
 * comparisons, rather than drawn empty.
 */
export async function buildCharts(series: SeriesBrief, locale: string): Promise<Chart[]> {
  const charts: Chart[] = [];
  // One after another: vega's id counters are process-wide, and the renders are CPU-bound anyway.
  for (const definition of CHARTS) {
    if (definition.id === 'comparisons' && series.analysis.comparisons.length === 0) continue;
    charts.push(await buildChart(definition, series, locale));
  }
  return charts;
}

/** The chart as a PNG at twice its size, for email. */
export function chartPng(chart: Chart): Buffer {
  return svgToPng(chart.svg);
}
