/**
 * The trend's year-over-year change, in percent, for each of the last 36 periods — for daily and hourly data
 * the last 36 weeks, one bar a week (the week's last period), since a day's bar says nothing a week's does
 * not. Rises are filled bars and
 * falls outlined bars on either side of a marked zero line, so the sign reads without colour; the stretch
 * computed from the provisional trend sits on a light band labelled "provisional".
 */
import { trendYoYSeries } from '../analyse/yoy-series.js';
import type { SeriesBrief } from '../vocabulary/brief.js';
import { type Frequency, ordinalAt, startOf, yearLag } from '../vocabulary/period-index.js';

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
