/**
 * The layout shared by the two line charts: a thin context line (observed or seasonally adjusted values) under
 * the bold trend, whose provisional end is dashed and named in the legend, so the difference never rests on
 * colour alone.
 */
import type { TopLevelSpec } from 'vega-lite';
import type { SeriesBrief } from '../vocabulary/brief.js';
import { type ChartOptions, orNull } from './options.js';
import { chartConfig, FIT, PALETTE, TIME_AXIS } from './theme.js';

export const TREND_NAME = 'trend';
export const PROVISIONAL_NAME = 'trend (provisional)';

/** The provisional stretch of the trend as an index range [from, n), or null when every value is final. */
export function provisionalRange(series: SeriesBrief): { from: number; count: number } | null {
  const n = series.components.trend.length;
  const { provisionalFrom, provisionalCount } = series.analysis.firmness;
  if (!Number.isInteger(provisionalFrom) || !(provisionalCount > 0) || provisionalFrom >= n) return null;
  const from = Math.max(0, provisionalFrom);
  return { from, count: n - from };
}

interface Context {
  values: number[];
  /** Legend name of the context line. */
  name: string;
  colour: string;
}

interface Row {
  date: string;
  value: number | null;
  series: string;
}

export function lineWithTrendSpec(series: SeriesBrief, context: Context, options: ChartOptions): TopLevelSpec {
  const { dates, trend } = series.components;
  const provisional = provisionalRange(series);
  const contextRows: Row[] = dates.map((date, i) => ({ date, value: orNull(context.values[i]), series: context.name }));
  const trendRows: Row[] = [];
  const cut = provisional ? provisional.from : dates.length;
  for (let i = 0; i < cut; i++) trendRows.push({ date: dates[i], value: orNull(trend[i]), series: TREND_NAME });
  // The dashed stretch starts at the last final value so the two pieces join without a gap.
  for (let i = Math.max(0, cut - 1); i < dates.length && provisional; i++) {
    trendRows.push({ date: dates[i], value: orNull(trend[i]), series: PROVISIONAL_NAME });
  }

  const domain = [context.name, TREND_NAME, ...(provisional ? [PROVISIONAL_NAME] : [])];
  const pick = <T>(values: [T, T, T]) => values.slice(0, domain.length);
  const legendEncoding = {
    color: {
      field: 'series',
      type: 'nominal',
      scale: { domain, range: pick([context.colour, PALETTE.trend, PALETTE.trend]) },
    },
    strokeDash: {
      field: 'series',
      type: 'nominal',
      scale: {
        domain,
        range: pick([
          [1, 0],
          [1, 0],
          [6, 4],
        ]),
      },
    },
    strokeWidth: {
      field: 'series',
      // Ordinal with an explicit domain: a width scale on an unordered field draws a vega-lite warning. The
      // scale type is named, or vega-lite makes it a point scale that spreads the widths evenly from the
      // first to the last (1.25, 2, 2.75) instead of taking them as listed.
      type: 'ordinal',
      sort: domain,
      scale: { type: 'ordinal', domain, range: pick([1.25, 2.75, 2.75]) },
    },
  } as const;
  const x = { field: 'date', type: 'temporal', scale: { type: 'utc' }, axis: TIME_AXIS } as const;
  const y = {
    field: 'value',
    type: 'quantitative',
    scale: { zero: false },
    axis: { title: series.unit || null },
  } as const;

  return {
    $schema: 'https://vega.github.io/schema/vega-lite/v6.json',
    ...FIT,
    config: chartConfig(options.locale),
    layer: [
      {
        name: 'context',
        data: { values: contextRows },
        mark: { type: 'line', strokeCap: 'round', strokeJoin: 'round' },
        encoding: { x, y, ...legendEncoding },
      },
      {
        name: 'trend',
        data: { values: trendRows },
        mark: { type: 'line', strokeCap: 'butt', strokeJoin: 'round' },
        encoding: { x, y, ...legendEncoding },
      },
    ],
  };
}
