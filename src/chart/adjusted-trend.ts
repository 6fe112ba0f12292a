/** The seasonally adjusted series as a thin line with the trend as a bold line, its provisional end dashed. */
import type { TopLevelSpec } from 'vega-lite';
import type { SeriesBrief } from '../vocabulary/brief.js';
import { lineWithTrendSpec } from './line-with-trend.js';
import type { ChartOptions } from './options.js';
import { PALETTE } from './theme.js';

export function adjustedTrendSpec(series: SeriesBrief, options: ChartOptions): TopLevelSpec {
  return lineWithTrendSpec(
    series,
    { values: series.components.adjusted, name: 'seasonally adjusted', colour: PALETTE.adjusted },
    options,
  );
}
