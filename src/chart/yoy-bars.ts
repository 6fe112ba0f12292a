/**
 * The trend's year-over-year change, in percent, for each of the last 36 periods — for daily and hourly data
 * the last 36 weeks, one bar a week (the week's last period), since a day's bar says nothing a week's does
 * not. Rises are filled bars and
 * falls outlined bars on either side of a marked zero line, so the sign reads without colour; the stretch
 * computed from the provisional trend sits on a light band labelled "provisional".
 */
import type { TopLevelSpec } from 'vega-lite';
import { trendYoYSeries } from '../analyse/yoy-series.js';
import type { SeriesBrief } from '../vocabulary/brief.js';
import { type Frequency, ordinalAt, startOf, yearLag } from '../vocabulary/period-index.js';
import { provisionalRange } from './line-with-trend.js';
import type { ChartOptions } from './options.js';
import { chartConfig, FIT, PALETTE, TIME_AXIS } from './theme.js';

export const YOY_PERIODS = 36;
export const RISE = 'rise';
export const FALL = 'fall';
export const NO_YOY_TEXT = 'The series is too short for a change on a year earlier.';
/** Each bar covers the middle 80 % of its period, leaving a gap between neighbours. */
export const YOY_INSET = 0.1;

/** Periods back to the same period a year earlier, as analysis.trendYoY uses (12 monthly, 4 quarterly). */
export function yoyLag(series: SeriesBrief): number {
  return yearLag(series.frequency);
}

export interface YoYBar {
  index: number;
  date: string;
  ordinal: number;
  percent: number;
}

/** Periods a bar stands for: a week of days or hours, else one period. */
export function yoyStride(frequency: Frequency): number {
  return frequency === 'daily' ? 7 : frequency === 'hourly' ? 168 : 1;
}

/** The last 36 bars' year-over-year change of the trend; NaN where it cannot be computed. */
export function yoyBars(series: SeriesBrief): YoYBar[] {
  const { dates, trend } = series.components;
  const percent = trendYoYSeries(trend, yoyLag(series));
  const stride = yoyStride(series.frequency);
  const out: YoYBar[] = [];
  for (let k = YOY_PERIODS - 1; k >= 0; k--) {
    const i = dates.length - 1 - k * stride;
    if (i >= 0) out.push({ index: i, date: dates[i], ordinal: ordinalAt(series.periodIndex, i), percent: percent[i] });
  }
  return out;
}

/** From the start of the first period a bar covers to the end of its last. */
export function periodBounds(frequency: Frequency, ordinal: number): [number, number] {
  return [startOf(frequency, ordinal - yoyStride(frequency) + 1), startOf(frequency, ordinal + 1)];
}

/** The bars with a change, each inset from its period's bounds (epoch ms), for the spec and the scene alike. */
export function yoyBarRows(
  series: SeriesBrief,
  bars: YoYBar[] = yoyBars(series),
): { start: number; end: number; percent: number }[] {
  return bars
    .filter((b) => Number.isFinite(b.percent))
    .map((b) => {
      const [start, end] = periodBounds(series.frequency, b.ordinal);
      const inset = (end - start) * YOY_INSET;
      return { start: start + inset, end: end - inset, percent: b.percent };
    });
}

export function yoyBarsSpec(series: SeriesBrief, options: ChartOptions): TopLevelSpec {
  const bars = yoyBars(series);
  const rows = yoyBarRows(series, bars).map((r) => ({ ...r, sign: r.percent < 0 ? FALL : RISE }));
  const empty = rows.length === 0;
  // The axis spans all 36 periods even where the trend is undefined, so gaps show as gaps.
  const domain =
    bars.length > 0
      ? [
          periodBounds(series.frequency, bars[0].ordinal)[0],
          periodBounds(series.frequency, bars[bars.length - 1].ordinal)[1],
        ]
      : [0, 1];
  const provisional = provisionalRange(series);
  const bandStart = provisional ? Math.max(provisional.from, bars[0]?.index ?? 0) : Number.NaN;
  const band =
    provisional && bars.length > 0 && bandStart <= bars[bars.length - 1].index
      ? [{ start: periodBounds(series.frequency, ordinalAt(series.periodIndex, bandStart))[0], end: domain[1] }]
      : [];
  // domainMin/domainMax rather than domain: vega-lite 6 reports a conflict between x and x2 for the latter.
  const x = {
    field: 'start',
    type: 'temporal',
    scale: { type: 'utc', domainMin: domain[0], domainMax: domain[1] },
    axis: TIME_AXIS,
  } as const;

  return {
    $schema: 'https://vega.github.io/schema/vega-lite/v6.json',
    ...FIT,
    config: chartConfig(options.locale),
    layer: [
      {
        name: 'provisional_band',
        data: { values: band },
        mark: { type: 'rect', color: PALETTE.grid, opacity: 0.45 },
        encoding: { x, x2: { field: 'end' } },
      },
      {
        name: 'provisional_label',
        data: { values: band },
        mark: { type: 'text', align: 'left', baseline: 'top', dx: 4, dy: 2, y: 0, color: PALETTE.ink },
        encoding: { x, text: { value: 'provisional' } },
      },
      {
        name: 'yoy',
        data: { values: rows },
        mark: { type: 'bar', strokeWidth: 1.5 },
        encoding: {
          x,
          x2: { field: 'end' },
          y2: { datum: 0 },
          y: {
            field: 'percent',
            type: 'quantitative',
            // With no bars there is no range to label: a fixed domain keeps vega from inventing one.
            ...(empty ? { scale: { domain: [-1, 1] } } : {}),
            axis: empty
              ? null
              : {
                  title: '% on a year earlier',
                  // A leading "+" on rises; the label itself is already in the locale's number format.
                  labelExpr: "datum.value > 0 ? '+' + datum.label : datum.label",
                },
          },
          fill: { field: 'sign', type: 'nominal', scale: { domain: [RISE, FALL], range: [PALETTE.rise, 'white'] } },
          stroke: {
            field: 'sign',
            type: 'nominal',
            scale: { domain: [RISE, FALL], range: [PALETTE.rise, PALETTE.fall] },
          },
        },
      },
      ...(empty
        ? [
            {
              name: 'no_change_possible',
              data: { values: [{}] },
              mark: {
                type: 'text',
                x: { expr: 'width / 2' },
                y: { expr: 'height / 2' },
                dy: -12,
                align: 'center',
                color: PALETTE.ink,
              },
              encoding: { text: { value: NO_YOY_TEXT } },
            } as const,
          ]
        : []),
      {
        name: 'zero',
        data: { values: [{}] },
        mark: { type: 'rule', color: PALETTE.ink, strokeWidth: 1.25 },
        encoding: { y: { datum: 0, type: 'quantitative' } },
      },
    ],
  };
}
