/**
 * The remainder as stems from the centre line (0 for an additive model, 1 for a multiplicative one, where the
 * remainder is a ratio), with unusual values (diagnostics.outliers) drawn as larger diamonds in another colour
 * and labelled with their period.
 */
import type { TopLevelSpec } from 'vega-lite';
import type { SeriesBrief } from '../vocabulary/brief.js';
import { ordinalAt } from '../vocabulary/period-index.js';
import { textWidth } from './font-metrics.js';
import { formatPeriod } from './format.js';
import { type ChartOptions, orNull } from './options.js';
import { CHART_WIDTH, chartConfig, FIT, LABEL_SIZE, PALETTE, TIME_AXIS } from './theme.js';

export const USUAL = 'within the usual range';
export const UNUSUAL = 'unusual value';
/** More labels than this crowd the strip; the largest by score keep theirs, every one keeps its diamond. */
export const MAX_LABELS = 10;
/** Width of the plot area, about: the figure less the vertical axis. */
const PLOT_WIDTH = CHART_WIDTH - 60;
const LABEL_GAP = 6;

/** The remainder's neutral value: no departure from trend and season. */
export function remainderCentre(series: SeriesBrief): number {
  return series.settings.model === 'multiplicative' ? 1 : 0;
}

/**
 * Keeps the labels, largest score first, that do not overlap one already kept on the same side of the centre
 * line, up to MAX_LABELS; positions are estimated from the index (equal spacing of periods) across a plot
 * `plotWidth` px wide (the spec's estimate of it unless the caller knows better).
 */
export function spreadLabels<T extends { index: number; text: string }>(
  candidates: T[],
  length: number,
  plotWidth = PLOT_WIDTH,
): T[] {
  const kept: { item: T; left: number; right: number }[] = [];
  const step = plotWidth / Math.max(1, length - 1);
  for (const item of candidates) {
    if (kept.length >= MAX_LABELS) break;
    const half = textWidth(item.text, LABEL_SIZE) / 2 + LABEL_GAP / 2;
    const x = item.index * step;
    const left = x - half;
    const right = x + half;
    if (kept.some((k) => left < k.right && right > k.left)) continue;
    kept.push({ item, left, right });
  }
  return kept.map((k) => k.item);
}

export function remainderSpec(series: SeriesBrief, options: ChartOptions): TopLevelSpec {
  const { dates, remainder } = series.components;
  const centre = remainderCentre(series);
  const outliers = series.diagnostics.outliers.filter((o) => o.index >= 0 && o.index < dates.length);
  const unusual = new Set(outliers.map((o) => o.index));
  const rows = dates.map((date, i) => ({
    date,
    value: orNull(remainder[i]),
    kind: unusual.has(i) ? UNUSUAL : USUAL,
  }));
  const candidates = [...outliers]
    .sort((a, b) => Math.abs(b.score) - Math.abs(a.score) || a.index - b.index)
    .filter((o) => Number.isFinite(remainder[o.index]))
    .map((o) => ({
      index: o.index,
      date: dates[o.index],
      value: remainder[o.index],
      text: formatPeriod(ordinalAt(series.periodIndex, o.index), series.frequency, options.locale),
    }));
  const above = spreadLabels(
    candidates.filter((r) => r.value >= centre),
    dates.length,
  );
  const below = spreadLabels(
    candidates.filter((r) => r.value < centre),
    dates.length,
  );

  const domain = unusual.size > 0 ? [USUAL, UNUSUAL] : [USUAL];
  const x = { field: 'date', type: 'temporal', scale: { type: 'utc' }, axis: TIME_AXIS } as const;
  const y = {
    field: 'value',
    type: 'quantitative',
    // Room above and below the extreme points for their labels.
    scale: { zero: false, padding: 18 },
    axis: { title: centre === 1 ? 'ratio to trend × season' : series.unit || null },
  } as const;
  const text = (name: string, values: typeof candidates, dy: number, baseline: 'bottom' | 'top') =>
    ({
      name,
      data: { values },
      mark: { type: 'text', dy, baseline, align: 'center', color: PALETTE.ink },
      encoding: { x, y, text: { field: 'text', type: 'nominal' } },
    }) as const;

  return {
    $schema: 'https://vega.github.io/schema/vega-lite/v6.json',
    ...FIT,
    config: chartConfig(options.locale),
    layer: [
      {
        name: 'centre',
        mark: { type: 'rule', color: PALETTE.ink, strokeWidth: 1.25 },
        encoding: { y: { datum: centre, type: 'quantitative' } },
      },
      {
        name: 'stems',
        data: { values: rows },
        mark: { type: 'rule', color: PALETTE.remainder, strokeWidth: 1, opacity: 0.55 },
        encoding: { x, y, y2: { datum: centre } },
      },
      {
        name: 'points',
        data: { values: rows },
        mark: { type: 'point', filled: true, opacity: 1 },
        encoding: {
          x,
          y,
          shape: {
            field: 'kind',
            type: 'nominal',
            scale: { domain, range: ['circle', 'diamond'].slice(0, domain.length) },
          },
          color: {
            field: 'kind',
            type: 'nominal',
            scale: { domain, range: [PALETTE.remainder, PALETTE.unusual].slice(0, domain.length) },
          },
          size: { condition: { test: `datum.kind === '${UNUSUAL}'`, value: 110 }, value: 14 },
        },
      },
      ...(above.length > 0 ? [text('labels_above', above, -9, 'bottom')] : []),
      ...(below.length > 0 ? [text('labels_below', below, 9, 'top')] : []),
    ],
  };
}
