/**
 * Observed values as a thin line with the trend as a bold line, its provisional end dashed; steps in the
 * level (named or found) and every event the job named are marked where they start, with their labels.
 */
import type { SeriesBrief } from '../../vocabulary/brief.js';
import type { Scene } from '../../vocabulary/scene.js';
import type { ChartOptions } from '../options.js';
import { PALETTE } from '../theme.js';
import { lineWithTrendScene } from './line-with-trend.js';

export function observedTrendScene(series: SeriesBrief, options: ChartOptions): Scene {
  return lineWithTrendScene(
    series,
    {
      values: series.components.observed,
      name: 'observed',
      colour: PALETTE.observed,
      events: (series.effects?.events ?? [])
        .filter((e) => e.label !== null || e.kind === 'step' || e.kind === 'ramp')
        .map((e) => ({ at: e.at, label: e.label ?? (e.estimate > 0 ? 'step up' : 'step down') })),
    },
    options,
  );
}
