/**
 * One plain sentence per chart for screen readers and the email's alt text: what is drawn, over which
 * periods, and the figure a reader would look for first. Numbers go through Intl for the brief's locale.
 */
import type { SeriesBrief } from '../vocabulary/brief.js';
import { ordinalAt } from '../vocabulary/period-index.js';
import { spanText } from './comparisons.js';
import { formatCount, formatPercent, formatPeriod, formatSigned, formatValue } from './format.js';
import { provisionalRange } from './line-with-trend.js';
import { remainderCentre } from './remainder.js';
import { yoyBars } from './yoy-bars.js';

function span(series: SeriesBrief, locale: string): string {
  const n = series.components.dates.length;
  if (n === 0) return '';
  const at = (i: number) => formatPeriod(ordinalAt(series.periodIndex, i), series.frequency, locale);
  return ` from ${at(0)} to ${at(n - 1)}`;
}

function firstLastFinite(values: number[]): [number, number] | null {
  let first = -1;
  let last = -1;
  for (let i = 0; i < values.length; i++) {
    if (!Number.isFinite(values[i])) continue;
    if (first < 0) first = i;
    last = i;
  }
  return first < 0 ? null : [first, last];
}

function movement(from: number, to: number): string {
  if (to > from) return 'rose';
  if (to < from) return 'fell';
  return 'held';
}

function provisionalClause(series: SeriesBrief, locale: string): string {
  const p = provisionalRange(series);
  if (!p) return '';
  return p.count === 1
    ? '; the last value of the trend is provisional'
    : `; the last ${formatCount(p.count, locale)} values of the trend are provisional`;
}

function trendClause(series: SeriesBrief, locale: string): string {
  const { trend } = series.components;
  const ends = firstLastFinite(trend);
  if (!ends) return 'the trend is not defined';
  const [a, b] = [trend[ends[0]], trend[ends[1]]];
  const verb = movement(a, b);
  return verb === 'held'
    ? `the trend held at ${formatValue(a, locale, series.unit)}`
    : `the trend ${verb} from ${formatValue(a, locale)} to ${formatValue(b, locale, series.unit)}`;
}

export function observedTrendAlt(series: SeriesBrief, locale: string): string {
  return `Line chart of ${series.label}${span(series, locale)}: ${trendClause(series, locale)}${provisionalClause(series, locale)}.`;
}

export function adjustedTrendAlt(series: SeriesBrief, locale: string): string {
  const { adjusted, trend } = series.components;
  const ends = firstLastFinite(adjusted);
  const last = ends
    ? `; the adjusted series ended at ${formatValue(adjusted[ends[1]], locale, series.unit)} against a trend of ${formatValue(trend[ends[1]], locale, series.unit)}`
    : '';
  return `Line chart of ${series.label} with the usual seasonal pattern removed${span(series, locale)}, drawn with its trend: ${trendClause(series, locale)}${last}${provisionalClause(series, locale)}.`;
}

export function seasonalProfileAlt(series: SeriesBrief, locale: string): string {
  const { seasons, peak, trough } = series.analysis.seasonalProfile;
  const head = `Bar chart of the typical seasonal effect on ${series.label} in each of its ${formatCount(seasons.length, locale)} seasons`;
  if (!Number.isFinite(peak.effect) || !Number.isFinite(trough.effect)) return `${head}: no effect could be estimated.`;
  // Peak and trough come from the analysis so the sentence agrees with the brief's text.
  return `${head}: highest in ${peak.label} (${formatSigned(peak.effect, locale, series.unit)}) and lowest in ${trough.label} (${formatSigned(trough.effect, locale, series.unit)}).`;
}

export function remainderAlt(series: SeriesBrief, locale: string): string {
  const outliers = series.diagnostics.outliers;
  const centre = remainderCentre(series);
  const head = `Chart of what trend and season leave unexplained in ${series.label}${span(series, locale)}, as stems from ${formatCount(centre, locale)}`;
  if (outliers.length === 0) return `${head}: no value stands out as unusual.`;
  const largest = outliers.reduce((a, b) => (Math.abs(b.score) > Math.abs(a.score) ? b : a));
  const count = outliers.length === 1 ? 'one unusual value' : `${formatCount(outliers.length, locale)} unusual values`;
  return `${head}: ${count}, the largest in ${formatPeriod(ordinalAt(series.periodIndex, largest.index), series.frequency, locale)} at ${formatValue(Math.abs(largest.score), locale)} robust standard deviations ${largest.score < 0 ? 'below' : 'above'} the usual.`;
}

export function yoyAlt(series: SeriesBrief, locale: string): string {
  const bars = yoyBars(series);
  const finite = bars.filter((b) => Number.isFinite(b.percent));
  const head = `Bar chart of the trend's change on a year earlier for ${series.label}`;
  if (finite.length === 0) return `${head}: the series is too short for a year-over-year change.`;
  const first = finite[0];
  const last = finite[finite.length - 1];
  const rises = finite.filter((b) => b.percent >= 0).length;
  const falls = finite.length - rises;
  return `${head}, ${formatCount(finite.length, locale)} periods from ${formatPeriod(ordinalAt(series.periodIndex, first.index), series.frequency, locale)} to ${formatPeriod(ordinalAt(series.periodIndex, last.index), series.frequency, locale)}: ${formatPercent(first.percent, locale)} at the start and ${formatPercent(last.percent, locale)} at the end, with ${formatCount(rises, locale)} ${rises === 1 ? 'rise' : 'rises'} and ${formatCount(falls, locale)} ${falls === 1 ? 'fall' : 'falls'}.`;
}

export function comparisonsAlt(series: SeriesBrief, locale: string): string {
  const parts = series.analysis.comparisons.map(
    (c) =>
      `${c.label}, ${formatValue(c.raw.current, locale, series.unit)} in ${spanText(c.current, series.frequency, locale)} against ${formatValue(c.raw.baseline, locale, series.unit)} in ${spanText(c.baseline, series.frequency, locale)} (${formatPercent(c.raw.percent, locale)})`,
  );
  if (parts.length === 0) return `Bar chart of comparisons for ${series.label}: none were asked for.`;
  return `Bar chart setting ${series.label} beside its baseline: ${parts.join('; ')}.`;
}
