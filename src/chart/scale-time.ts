/**
 * Calendar ticks for a time axis in UTC: whole years, quarters, months, weeks, days or hours, chosen for
 * about `count` ticks between two instants.
 *
 * Source: d3-time's `utcTicks` / `utcTickInterval` (Mike Bostock, d3-time 3.1, src/ticks.js, ISC licence),
 * the rule vega's time axes use: the target step (stop − start) / count is placed in the ladder of
 * intervals 1, 3, 6, 12 hours, 1, 2 days, 1 week, 1, 3 months, 1 year (durations: a month 30 days, a year
 * 365), and the nearer rung by ratio is taken; past a year, whole years in d3-array's 1-2-5 steps. Every
 * interval is aligned to the calendar, as d3's `every` aligns them: quarters start in January, April, July
 * and October, two-day steps on even days since 1970-01-01, years on multiples of the step. One deliberate
 * difference: weeks start on Monday (ISO 8601, as our weekly periods do), where d3 starts them on Sunday.
 * Steps finer than an hour are never needed (hourly data is the finest we read) and are not offered.
 *
 *   timeTicks(Date.UTC(2015, 0), Date.UTC(2026, 8), 15) → 1 January of each year 2015…2026 (unit "year")
 *   timeTicks(Date.UTC(2023, 9), Date.UTC(2026, 9), 15)  → every quarter, October 2023 … October 2026
 */
import { tickStep } from './scale-linear.js';

const HOUR = 3_600_000;
const DAY = 24 * HOUR;
const WEEK = 7 * DAY;
const MONTH = 30 * DAY;
const YEAR = 365 * DAY;

export type TimeUnit = 'hour' | 'day' | 'week' | 'month' | 'year';

export interface TimeInterval {
  unit: TimeUnit;
  step: number;
}

const LADDER: readonly [TimeUnit, number, number][] = [
  ['hour', 1, HOUR],
  ['hour', 3, 3 * HOUR],
  ['hour', 6, 6 * HOUR],
  ['hour', 12, 12 * HOUR],
  ['day', 1, DAY],
  ['day', 2, 2 * DAY],
  ['week', 1, WEEK],
  ['month', 1, MONTH],
  ['month', 3, 3 * MONTH],
  ['year', 1, YEAR],
];

/** The interval d3's rule picks for about `count` ticks from start to stop (UTC milliseconds). */
export function timeTickInterval(start: number, stop: number, count: number): TimeInterval {
  const target = Math.abs(stop - start) / count;
  // bisector.right: the first rung whose duration exceeds the target.
  let i = 0;
  while (i < LADDER.length && LADDER[i][2] <= target) i++;
  if (i === LADDER.length) {
    return { unit: 'year', step: Math.max(1, Math.round(tickStep(start / YEAR, stop / YEAR, count))) };
  }
  if (i === 0) return { unit: 'hour', step: 1 };
  const [unit, step] = LADDER[target / LADDER[i - 1][2] < LADDER[i][2] / target ? i - 1 : i];
  return { unit, step };
}

/** The first instant ≥ t on the interval's calendar grid. */
function ceilTo(t: number, { unit, step }: TimeInterval): number {
  const d = new Date(t);
  switch (unit) {
    case 'hour': {
      const h = Math.ceil(t / HOUR);
      // Hours of the day divisible by the step (0, 3, 6, … for a three-hour step).
      let at = h * HOUR;
      while (new Date(at).getUTCHours() % step !== 0) at += HOUR;
      return at;
    }
    case 'day': {
      let day = Math.ceil(t / DAY);
      while (day % step !== 0) day++;
      return day * DAY;
    }
    case 'week': {
      let day = Math.ceil(t / DAY);
      // 1970-01-01 was a Thursday: day numbers ≡ 4 (mod 7) are Mondays.
      while ((((day - 4) % 7) + 7) % 7 !== 0) day++;
      return day * DAY;
    }
    case 'month': {
      let y = d.getUTCFullYear();
      let m = d.getUTCMonth();
      if (Date.UTC(y, m, 1) < t) m++;
      while (m % step !== 0) m++;
      y += Math.floor(m / 12);
      m %= 12;
      return Date.UTC(y, m, 1);
    }
    case 'year': {
      let y = d.getUTCFullYear();
      if (Date.UTC(y, 0, 1) < t) y++;
      while (y % step !== 0) y++;
      return Date.UTC(y, 0, 1);
    }
  }
}

/** The next grid instant after a grid instant t. */
function next(t: number, { unit, step }: TimeInterval): number {
  const d = new Date(t);
  switch (unit) {
    case 'hour': {
      // Stay on hours of the day divisible by the step across midnight (as d3's field-based `every` does).
      let at = t + HOUR;
      while (new Date(at).getUTCHours() % step !== 0) at += HOUR;
      return at;
    }
    case 'day':
      return t + step * DAY;
    case 'week':
      return t + step * WEEK;
    case 'month':
      return Date.UTC(d.getUTCFullYear(), d.getUTCMonth() + step, 1);
    case 'year':
      return Date.UTC(d.getUTCFullYear() + step, 0, 1);
  }
}

/** Tick instants from start to stop inclusive on the chosen interval's grid, with the interval. */
export function timeTicks(start: number, stop: number, count: number): { values: number[]; interval: TimeInterval } {
  const lo = Math.min(start, stop);
  const hi = Math.max(start, stop);
  const interval = timeTickInterval(lo, hi, count);
  const values: number[] = [];
  if (!Number.isFinite(lo) || !Number.isFinite(hi)) return { values, interval };
  for (let t = ceilTo(lo, interval); t <= hi && values.length < 1000; t = next(t, interval)) values.push(t);
  return { values, interval };
}

/**
 * Which calendar field a tick label shows, the finest one at which the instant is not a round value (as
 * vega's multi-format time labels decide): "hour" when the time of day is not midnight, "day" when it is
 * not the first of a month, "month" when not January, else "year".
 */
export function timeLabelUnit(t: number): 'hour' | 'day' | 'month' | 'year' {
  const d = new Date(t);
  if (d.getUTCHours() !== 0 || d.getUTCMinutes() !== 0) return 'hour';
  if (d.getUTCDate() !== 1) return 'day';
  if (d.getUTCMonth() !== 0) return 'month';
  return 'year';
}

/** A value → px map for UTC instants from [t0, t1] onto [r0, r1]. */
export function timeScale(t0: number, t1: number, r0: number, r1: number): (t: number) => number {
  if (t0 === t1) return () => (r0 + r1) / 2;
  const k = (r1 - r0) / (t1 - t0);
  return (t) => r0 + (t - t0) * k;
}
