/**
 * What a dense series (dense.ts) changes in its charts: the captions say what the summaries are, the
 * recent stretch gets a chart of its own drawn period by period, and the remainder's caption says which
 * unusual values carry a label — every caption is true of the marks drawn.
 */
import type { SeriesBrief } from '../vocabulary/brief.js';
import { ordinalAt } from '../vocabulary/period-index.js';
import { findGroup, type Mark, type Scene } from '../vocabulary/scene.js';
import { denseUnit, instantsOf, PERIOD_ADJECTIVE, RECENT, UNIT_WORDS } from './dense.js';
import { formatCount, formatPeriod, formatValue } from './format.js';
import type { ChartOptions } from './options.js';
import { lineWithTrendScene } from './scenes/line-with-trend.js';
import { PALETTE } from './theme.js';

/** Whether the series is drawn as calendar summaries, and with which unit. */
export function summaryUnit(series: SeriesBrief) {
  return denseUnit(series.frequency, instantsOf(series.periodIndex));
}

export function isDense(series: SeriesBrief): boolean {
  return summaryUnit(series) !== null;
}

/** First index of the recent detail. */
export function recentFrom(series: SeriesBrief): number {
  return Math.max(0, series.components.dates.length - RECENT[series.frequency].periods);
}

const PROVISIONAL_WORDS = 'the bold line is the trend, dashed where it is still provisional.';

/** The caption of the observed (or adjusted) chart. */
export function lineCaption(series: SeriesBrief, line: 'value' | 'adjusted'): string {
  const unit = summaryUnit(series);
  if (unit === null)
    return line === 'value'
      ? `The thin line shows each period’s value; ${PROVISIONAL_WORDS}`
      : `The thin line is the series with its usual seasonal pattern taken out; ${PROVISIONAL_WORDS}`;
  const one = UNIT_WORDS[unit].one;
  const what = line === 'value' ? `${PERIOD_ADJECTIVE[series.frequency]} values` : 'seasonally adjusted values';
  const detail = line === 'value' ? ` The next chart shows ${RECENT[series.frequency].words}.` : '';
  return `Too many periods to draw one by one: the light band spans the lowest to the highest of the ${what} in each ${one}, the thin line is the ${one}’s mean; ${PROVISIONAL_WORDS}${detail}`;
}

/** The latest stretch of a dense series, period by period, with its trend. */
export function recentScene(series: SeriesBrief, options: ChartOptions): Scene {
  return lineWithTrendScene(
    series,
    { values: series.components.observed, name: 'observed', colour: PALETTE.observed },
    options,
    recentFrom(series),
  );
}

export function recentAlt(series: SeriesBrief, locale: string): string {
  const { dates, observed, trend } = series.components;
  const from = recentFrom(series);
  const last = dates.length - 1;
  if (last < from) return `Line chart of ${series.label}: no data.`;
  return `Line chart of ${series.label}, ${RECENT[series.frequency].words}, from ${formatPeriod(ordinalAt(series.periodIndex, from), series.frequency, locale)} to ${formatPeriod(ordinalAt(series.periodIndex, last), series.frequency, locale)}: the last value was ${formatValue(observed[last], locale, series.unit)} against a trend of ${formatValue(trend[last], locale, series.unit)}.`;
}

function count(marks: readonly Mark[], test: (m: Mark) => boolean): number {
  let k = 0;
  for (const m of marks) {
    if (m.type === 'group') k += count(m.marks, test);
    else if (test(m)) k++;
  }
  return k;
}

/** The remainder chart's caption, from its scene: how many unusual values it marks and how many it labels. */
export function remainderCaption(series: SeriesBrief, scene?: Scene): string {
  const unit = summaryUnit(series);
  const head =
    unit === null
      ? 'Each stem is what trend and season leave unexplained'
      : `Each bar spans the lowest to the highest of what trend and season leave unexplained in a ${UNIT_WORDS[unit].one}`;
  const marks = scene?.marks ?? [];
  const diamonds =
    count(marks, (m) => m.type === 'symbol' && m.shape === 'diamond') - (scene ? legendDiamonds(scene) : 0);
  const above = findGroup(marks, 'labels-above')?.marks.length ?? 0;
  const below = findGroup(marks, 'labels-below')?.marks.length ?? 0;
  const labelled = above + below;
  if (diamonds <= 0) return `${head}; no value stands out as unusual.`;
  if (labelled >= diamonds) return `${head}; diamonds mark unusual values, labelled with their period.`;
  if (labelled === 0) return `${head}; diamonds mark unusual values (listed in the table of unusual periods).`;
  return `${head}; diamonds mark unusual values, and ${formatCount(labelled, 'en')} of the ${formatCount(diamonds, 'en')} (the furthest out, where a label has room) carry their period.`;
}

function legendDiamonds(scene: Scene): number {
  const plot = findGroup(scene.marks, 'plot');
  const outside = scene.marks.filter((m) => m !== plot);
  return count(outside, (m) => m.type === 'symbol' && m.shape === 'diamond');
}
