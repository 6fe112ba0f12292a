/**
 * Each comparison as a pair of bars, baseline then current, in raw values, each labelled with its value and
 * the current bar with its change. Comparisons differ in scale (a month against a year to date), so each has
 * its own panel with its bars drawn relative to the panel's largest value; the value labels stand in for a
 * vertical axis, which would otherwise differ from panel to panel.
 */
import type { TopLevelSpec } from 'vega-lite';
import type { Comparison, PeriodSpan, SeriesBrief } from '../vocabulary/brief.js';
import type { Frequency } from '../vocabulary/period-index.js';
import { formatPercent, formatSpanLabel, formatValue } from './format.js';
import type { ChartOptions } from './options.js';
import { CHART_WIDTH, chartConfig, PALETTE } from './theme.js';

export const BASELINE = 'baseline';
export const CURRENT = 'current';
const SPACING = 16;
const PADDING = 4;
const SLACK = 16;
const PANEL_HEIGHT = 140;
/** Room over the tallest bar, as a share of it, for the two label lines. */
const HEADROOM = 0.3;

/** "Sept 2026", "Jul–Sept 2026", or "Oct 25 – Sept 26" for a span across years. */
export function spanText(span: PeriodSpan, frequency: Frequency, locale: string): string {
  return formatSpanLabel(span.ordinals, frequency, locale);
}

/** Panel titles must be distinct for the facet; a repeated label gets its position appended. */
export function panelTitles(comparisons: Comparison[]): string[] {
  const seen = new Set<string>();
  return comparisons.map((c, i) => {
    const title = seen.has(c.label) ? `${c.label} (${i + 1})` : c.label;
    seen.add(title);
    return title;
  });
}

/** The two values of a comparison over the larger magnitude of the pair (NaN stays null: no bar). */
export function relativeHeights(current: number, baseline: number): [number | null, number | null] {
  const scale = Math.max(
    Number.isFinite(current) ? Math.abs(current) : 0,
    Number.isFinite(baseline) ? Math.abs(baseline) : 0,
  );
  const rel = (v: number) => (Number.isFinite(v) ? (scale > 0 ? v / scale : 0) : null);
  return [rel(current), rel(baseline)];
}

export function comparisonsSpec(series: SeriesBrief, options: ChartOptions): TopLevelSpec {
  const { locale } = options;
  const comparisons = series.analysis.comparisons;
  const titles = panelTitles(comparisons);
  const rows = comparisons.flatMap((c, i) => {
    const [current, baseline] = relativeHeights(c.raw.current, c.raw.baseline);
    return [
      {
        panel: titles[i],
        role: BASELINE,
        span: spanText(c.baseline, series.frequency, locale),
        height: baseline,
        text: formatValue(c.raw.baseline, locale),
        change: '',
      },
      {
        panel: titles[i],
        role: CURRENT,
        span: spanText(c.current, series.frequency, locale),
        height: current,
        text: formatValue(c.raw.current, locale),
        change: formatPercent(c.raw.percent, locale),
      },
    ];
  });
  const lowest = Math.min(0, ...rows.map((r) => r.height ?? 0));
  const n = Math.max(1, comparisons.length);
  // SLACK: the span labels under the outer bars reach a little past their panels.
  const panelWidth = Math.floor((CHART_WIDTH - 2 * PADDING - SLACK - SPACING * (n - 1)) / n);
  const domain = [lowest < 0 ? lowest - HEADROOM : 0, 1 + HEADROOM];
  const y = { field: 'height', type: 'quantitative' as const, axis: null, scale: { domain, nice: false } };
  // Data order: baseline, then current; the span under each bar names its periods.
  const x = {
    field: 'span',
    type: 'nominal',
    sort: null,
    axis: { title: null, labelAngle: 0, labelOverlap: false, domain: false, ticks: false, labelLimit: panelWidth / 2 },
  } as const;

  return {
    $schema: 'https://vega.github.io/schema/vega-lite/v6.json',
    config: chartConfig(locale),
    data: { values: rows },
    facet: {
      column: { field: 'panel', type: 'nominal', sort: titles, header: { title: null, labelOrient: 'top' } },
    },
    spacing: SPACING,
    resolve: { scale: { x: 'independent' } },
    spec: {
      width: panelWidth,
      height: PANEL_HEIGHT,
      layer: [
        {
          name: 'comparison_bars',
          mark: { type: 'bar', strokeWidth: 1.5, stroke: PALETTE.current },
          encoding: {
            x,
            y,
            fill: {
              field: 'role',
              type: 'nominal',
              scale: { domain: [BASELINE, CURRENT], range: [PALETTE.baseline, PALETTE.current] },
            },
          },
        },
        {
          name: 'comparison_values',
          mark: { type: 'text', baseline: 'bottom', dy: -4, color: PALETTE.ink },
          encoding: { x, y, text: { field: 'text', type: 'nominal' } },
        },
        {
          name: 'comparison_changes',
          mark: { type: 'text', baseline: 'bottom', dy: -19, fontWeight: 'bold', color: PALETTE.ink },
          encoding: { x, y, text: { field: 'change', type: 'nominal' } },
        },
        {
          name: 'zero',
          mark: { type: 'rule', color: PALETTE.ink, strokeWidth: 1.25 },
          encoding: { y: { datum: 0, type: 'quantitative' } },
        },
      ],
    },
  };
}
