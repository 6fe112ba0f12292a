/** The seasonally adjusted series as a thin line with the trend as a bold line, its provisional end dashed. */
import type { SeriesBrief } from '../../vocabulary/brief.js';
import type { Scene } from '../../vocabulary/scene.js';
import type { ChartOptions } from '../options.js';
import { PALETTE } from '../theme.js';
import { lineWithTrendScene } from './line-with-trend.js';

export function adjustedTrendScene(series: SeriesBrief, options: ChartOptions): Scene {
  return lineWithTrendScene(
    series,
    { values: series.components.adjusted, name: 'seasonally adjusted', colour: PALETTE.adjusted },
    options,
  );
}
