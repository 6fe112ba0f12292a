/**
 * The chart stage: every chart of one series, in reading order, as a scene (scene.ts) drawn by our own
 * builders (scenes/), written as labelled static SVG (scene-svg.ts) and PNG on demand. Ids inside each SVG
 * start with the series id and the chart id, so a page holding several series stays valid.
 *
 * The scene builders are the one place that decides what a chart shows. Each chart's public vega-lite spec
 * (chartSpec, chartSpecOf below) is generated from its scene (scene-spec.ts), so the spec draws the very
 * marks the brief draws, dense summaries, the recent detail and event marks included. The brief never draws
 * the specs — vega costs tens of milliseconds a chart where a scene costs about one — so nothing here may
 * import vega or vega-lite at run time, not even through another module (test/chart/imports.test.ts).
 */
import type { TopLevelSpec } from 'vega-lite';
import type { Chart, SeriesBrief } from '../vocabulary/brief.js';
import type { Scene } from '../vocabulary/scene.js';
import { adjustedTrendAlt, comparisonsAlt, observedTrendAlt, remainderAlt, seasonalProfileAlt, yoyAlt } from './alt.js';
import { RECENT } from './dense.js';
import { isDense, lineCaption, recentAlt, recentScene, remainderCaption } from './dense-charts.js';
import type { ChartOptions } from './options.js';
import { sceneSpec } from './scene-spec.js';
import { sceneToSvg } from './scene-svg.js';
import { adjustedTrendScene } from './scenes/adjusted-trend.js';
import { comparisonsScene } from './scenes/comparisons.js';
import { observedTrendScene } from './scenes/observed-trend.js';
import { remainderScene } from './scenes/remainder.js';
import { seasonalProfileScene } from './scenes/seasonal-profile.js';
import { yoyBarsScene } from './scenes/yoy-bars.js';

export type ChartKind =
  | 'observed-trend'
  | 'recent'
  | 'adjusted-trend'
  | 'seasonal-profile'
  | 'remainder'
  | 'yoy'
  | 'comparisons';

export interface ChartDefinition {
  id: ChartKind;
  title: (label: string, series: SeriesBrief) => string;
  /** What the marks are, in words true of this series' chart (a dense series is drawn as summaries). */
  caption: (series: SeriesBrief, scene: Scene) => string;
  /** Whether the series has this chart (the recent detail only for a dense series). */
  shown?: (series: SeriesBrief) => boolean;
  /** The chart as drawn in the brief. */
  scene: (series: SeriesBrief, options: ChartOptions) => Scene;
  alt: (series: SeriesBrief, locale: string) => string;
}

/** Reading order: the series and its trend, the season removed, the season itself, what is left, growth, comparisons. */
export const CHARTS: readonly ChartDefinition[] = [
  {
    id: 'observed-trend',
    title: (label) => `${label}: values and trend`,
    caption: (s) => lineCaption(s, 'value'),
    scene: observedTrendScene,
    alt: observedTrendAlt,
  },
  {
    id: 'recent',
    title: (label, s) => `${label}: ${RECENT[s.frequency].words}`,
    caption: () =>
      'The thin line shows each period’s value; the bold line is the trend, dashed where it is still provisional.',
    shown: (s) => isDense(s),
    scene: recentScene,
    alt: recentAlt,
  },
  {
    id: 'adjusted-trend',
    title: (label) => `${label}: seasonally adjusted, with trend`,
    caption: (s) => lineCaption(s, 'adjusted'),
    scene: adjustedTrendScene,
    alt: adjustedTrendAlt,
  },
  {
    id: 'seasonal-profile',
    title: (label) => `${label}: typical seasonal effect`,
    caption: () => 'Each bar shows how far that season usually sits above or below the trend.',
    scene: seasonalProfileScene,
    alt: seasonalProfileAlt,
  },
  {
    id: 'remainder',
    title: (label) => `${label}: remainder and unusual values`,
    caption: remainderCaption,
    scene: remainderScene,
    alt: remainderAlt,
  },
  {
    id: 'yoy',
    title: (label) => `${label}: trend against a year earlier`,
    caption: () =>
      'Each bar is the trend’s change on the same period a year before: filled bars are rises, outlined bars falls.',
    scene: yoyBarsScene,
    alt: yoyAlt,
  },
  {
    id: 'comparisons',
    title: (label) => `${label}: comparisons`,
    caption: () =>
      'Each panel sets the current span beside its baseline; the label over the current bar gives the change.',
    scene: comparisonsScene,
    alt: comparisonsAlt,
  },
];

/** Draws one chart of a series: its scene, and the scene as SVG. */
export async function buildChart(
  definition: ChartDefinition,
  series: SeriesBrief,
  locale: string,
  id: string = definition.id,
  accent?: string,
): Promise<Chart> {
  const title = definition.title(series.label, series);
  const alt = definition.alt(series, locale);
  const scene = definition.scene(series, { locale, ...(accent ? { accent } : {}) });
  const svg = sceneToSvg(scene, { idPrefix: `${series.id}-${id}`, title, desc: alt });
  return {
    id,
    title,
    alt,
    caption: definition.caption(series, scene),
    svg,
    width: scene.width,
    height: scene.height,
    scene,
  };
}

/**
 * All charts of a series in reading order. The comparisons chart is left out when the job asks for no
 * comparisons, rather than drawn empty.
 */
export async function buildCharts(series: SeriesBrief, locale: string, accent?: string): Promise<Chart[]> {
  const charts: Chart[] = [];
  for (const definition of CHARTS) {
    if (definition.id === 'comparisons' && series.analysis.comparisons.length === 0) continue;
    // The trend's change over a year needs two years of data: with less there is nothing to draw.
    if (definition.id === 'yoy' && !series.analysis.headlineSpan.yearly) continue;
    if (definition.shown && !definition.shown(series)) continue;
    // Unadjusted (no identifiable seasonality), the adjusted series is the data and there is no season.
    const adjusted = series.settings.seasonalAdjustment?.applied ?? true;
    if (!adjusted && definition.id === 'adjusted-trend') continue;
    if (!adjusted && definition.id === 'remainder') {
      const caption =
        'Each stem is what the trend leaves unexplained; diamonds mark unusual values, labelled with their period.';
      charts.push(await buildChart({ ...definition, caption: () => caption }, series, locale, definition.id, accent));
      continue;
    }
    if (definition.id === 'seasonal-profile') {
      charts.push(...(await seasonalCharts(definition, series, locale, accent)));
      continue;
    }
    charts.push(await buildChart(definition, series, locale, definition.id, accent));
  }
  return charts;
}

const CYCLE_WORDS: Record<string, string> = {
  month: 'the year',
  quarter: 'the year',
  'iso-week': 'the year',
  weekday: 'the week',
  hour: 'the day',
};

/**
 * One seasonal profile chart per seasonal pattern, each in its own terms (weekdays of the week, months of
 * the year): with several periods the title says which cycle the bars span.
 */
async function seasonalCharts(
  definition: ChartDefinition,
  series: SeriesBrief,
  locale: string,
  accent?: string,
): Promise<Chart[]> {
  // Only patterns the combined test finds identifiable are drawn: the words name no peak for the others.
  const tests = series.diagnostics.identifiableSeasonality ?? [];
  const identifiable = (period: number) =>
    tests.find((t) => t.period === period)?.verdict !== 'probably-none' &&
    tests.find((t) => t.period === period)?.verdict !== 'none';
  const all = series.analysis.seasonalProfiles ?? [series.analysis.seasonalProfile];
  const profiles = all.filter((p) => identifiable(p.period));
  if (profiles.length === 0) return [];
  if (all.length <= 1) return [await buildChart(definition, series, locale, definition.id, accent)];
  const out: Chart[] = [];
  for (const [i, profile] of profiles.entries()) {
    const within = CYCLE_WORDS[profile.naming] ?? `a cycle of ${profile.period} periods`;
    const one: ChartDefinition = {
      ...definition,
      title: (label) => `${label}: typical seasonal effect within ${within}`,
    };
    const view: SeriesBrief = { ...series, analysis: { ...series.analysis, seasonalProfile: profile } };
    out.push(
      await buildChart(one, view, locale, i === 0 ? definition.id : `${definition.id}-${profile.period}`, accent),
    );
  }
  return out;
}

/**
 * A chart's vega-lite spec, for anyone who wants to restyle a chart of the brief: generated from the scene
 * the brief draws for that kind (the first seasonal pattern's, for a series with several), so vega draws the
 * same marks at the same places.
 */
export function chartSpec(kind: ChartKind, series: SeriesBrief, locale: string, accent?: string): TopLevelSpec {
  const definition = CHARTS.find((c) => c.id === kind);
  if (!definition) throw new Error(`no chart of kind "${kind}"`);
  const scene = definition.scene(series, { locale, ...(accent ? { accent } : {}) });
  return sceneSpec(scene, definition.alt(series, locale));
}

/**
 * The vega-lite spec of a chart of a built brief: its scene as drawn, its alt text as the description. A
 * chart read back from the brief's JSON has no scene (the JSON leaves scenes out): build the brief again.
 */
export function chartSpecOf(chart: Chart): TopLevelSpec {
  if (!chart.scene) throw new Error(`chart "${chart.id}" carries no scene`);
  return sceneSpec(chart.scene, chart.alt);
}
