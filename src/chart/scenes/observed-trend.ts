/** Observed values as a thin line with the trend as a bold line, its provisional end dashed. */
import type { SeriesBrief } from '../../brief/model.js';
import type { ChartOptions } from '../options.js';
import type { Scene } from '../scene.js';
import { PALETTE } from '../theme.js';
import { lineWithTrendScene } from './line-with-trend.js';

export function observedTrendScene(series: SeriesBrief, options: ChartOptions): Scene {
  return lineWithTrendScene(
    series,
    { values: series.components.observed, name: 'observed', colour: PALETTE.observed },
    options,
  );
}
