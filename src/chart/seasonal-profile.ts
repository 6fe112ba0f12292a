/** One bar per season: how far that season usually sits above or below the trend, around a zero line. */
import type { TopLevelSpec } from 'vega-lite';
import type { SeriesBrief } from '../vocabulary/brief.js';
import { type ChartOptions, orNull } from './options.js';
import { chartConfig, FIT, PALETTE } from './theme.js';

export function seasonalProfileSpec(series: SeriesBrief, options: ChartOptions): TopLevelSpec {
  const seasons = [...series.analysis.seasonalProfile.seasons].sort((a, b) => a.season - b.season);
  const rows = seasons.map((s) => ({ label: s.label, effect: orNull(s.effect) }));
  return {
    $schema: 'https://vega.github.io/schema/vega-lite/v6.json',
    ...FIT,
    config: chartConfig(options.locale),
    data: { values: rows },
    layer: [
      {
        name: 'seasons',
        mark: { type: 'bar', color: PALETTE.season },
        encoding: {
          // sort: null keeps the cycle's order (January first) instead of sorting labels alphabetically.
          x: { field: 'label', type: 'nominal', sort: null, axis: { title: null, labelAngle: 0 } },
          y: { field: 'effect', type: 'quantitative', axis: { title: series.unit || null } },
        },
      },
      {
        name: 'zero',
        mark: { type: 'rule', color: PALETTE.ink, strokeWidth: 1.25 },
        encoding: { y: { datum: 0, type: 'quantitative' } },
      },
    ],
  };
}
