/**
 * Dense series: more periods than a chart has room to show one by one. A daily series of five years is
 * 1,800 values across some 600 px, an hourly one of a century a million: drawn point by point, the line is
 * a solid block. Such a series is drawn as calendar summaries instead — for each week, month, quarter or
 * year its mean, lowest and highest value — with the latest stretch shown period by period in a chart of
 * its own (RECENT). The unit is the finest calendar unit coarser than the data that leaves at most
 * MAX_BUCKETS summaries, so each is at least two or three pixels wide.
 *
 *   daily, 2022-01-01 … 2026-09-30 (1,734 days) → weeks (248 of them)
 *   hourly, 137 years → years
 */
import { type Frequency, startOf, type TimeIndex } from '../vocabulary/period-index.js';

export type BucketUnit = 'week' | 'month' | 'quarter' | 'year';

/** Series of these frequencies with more periods than DENSE_FROM are drawn as summaries. */
export const DENSE_FROM = 400;
export const MAX_BUCKETS = 260;
/** Opacity of the band of each summary's range. */
export const BAND_OPACITY = 0.35;

/** Calendar units tried, finest first, for each dense frequency. */
const UNITS: Record<Frequency, readonly BucketUnit[]> = {
  hourly: ['week', 'month', 'quarter', 'year'],
  daily: ['week', 'month', 'quarter', 'year'],
  weekly: ['month', 'quarter', 'year'],
  monthly: [],
  quarterly: [],
};

/** The recent stretch shown period by period beside a dense series' summary. */
export const RECENT: Record<Frequency, { periods: number; words: string }> = {
  hourly: { periods: 14 * 24, words: 'the last 14 days, hour by hour' },
  daily: { periods: 13 * 7, words: 'the last 13 weeks, day by day' },
  weekly: { periods: 104, words: 'the last 104 weeks, week by week' },
  monthly: { periods: 0, words: '' },
  quarterly: { periods: 0, words: '' },
};

/** A period of a frequency, as its adjective ("daily value", "an hourly value"). */
export const PERIOD_ADJECTIVE: Record<Frequency, string> = {
  hourly: 'hourly',
  daily: 'daily',
  weekly: 'weekly',
  monthly: 'monthly',
  quarterly: 'quarterly',
};

const DAY = 86_400_000;

/** Key of the bucket holding instant t: consecutive buckets have consecutive keys. */
function bucketKey(t: number, unit: BucketUnit): number {
  if (unit === 'week') return Math.floor((Math.floor(t / DAY) - 4) / 7); // weeks from Monday 1970-01-05
  const d = new Date(t);
  const months = d.getUTCFullYear() * 12 + d.getUTCMonth();
  return unit === 'month' ? months : unit === 'quarter' ? Math.floor(months / 3) : d.getUTCFullYear();
}

/** Start instant of a bucket key. */
function bucketStart(key: number, unit: BucketUnit): number {
  switch (unit) {
    case 'week':
      return (key * 7 + 4) * DAY;
    case 'month':
      return Date.UTC(Math.floor(key / 12), key % 12, 1);
    case 'quarter':
      return Date.UTC(Math.floor(key / 4), (key % 4) * 3, 1);
    case 'year':
      return Date.UTC(key, 0, 1);
  }
}

/** The summary unit of a series, or null when it is drawn period by period. */
export function denseUnit(frequency: Frequency, times: ArrayLike<number>): BucketUnit | null {
  const n = times.length;
  if (n <= DENSE_FROM) return null;
  for (const unit of UNITS[frequency]) {
    if (bucketKey(times[n - 1], unit) - bucketKey(times[0], unit) + 1 <= MAX_BUCKETS) return unit;
  }
  const units = UNITS[frequency];
  return units.length > 0 ? units[units.length - 1] : null;
}

export interface Buckets {
  unit: BucketUnit;
  /** Each bucket's start and end (the next one's start), UTC ms, clipped to the data's first and last instants. */
  start: Float64Array;
  end: Float64Array;
  mean: Float64Array;
  min: Float64Array;
  max: Float64Array;
  /** Finite values in the bucket; mean, min and max are NaN where it is 0 (the mean also under half the fullest's). */
  count: Int32Array;
}

/** Mean, lowest and highest finite value of each calendar bucket, from sorted instants. */
export function bucketise(times: ArrayLike<number>, values: ArrayLike<number>, unit: BucketUnit): Buckets {
  const n = times.length;
  const first = n > 0 ? bucketKey(times[0], unit) : 0;
  const k = n > 0 ? bucketKey(times[n - 1], unit) - first + 1 : 0;
  const b: Buckets = {
    unit,
    start: new Float64Array(k),
    end: new Float64Array(k),
    mean: new Float64Array(k).fill(Number.NaN),
    min: new Float64Array(k).fill(Number.NaN),
    max: new Float64Array(k).fill(Number.NaN),
    count: new Int32Array(k),
  };
  const sum = new Float64Array(k);
  for (let j = 0; j < k; j++) {
    b.start[j] = Math.max(bucketStart(first + j, unit), times[0]);
    b.end[j] = Math.min(bucketStart(first + j + 1, unit), times[n - 1]);
  }
  // Instants are sorted: walk the buckets alongside instead of working out each key from a Date.
  let j = 0;
  let next = k > 1 ? bucketStart(first + 1, unit) : Number.POSITIVE_INFINITY;
  for (let i = 0; i < n; i++) {
    while (times[i] >= next) {
      j++;
      next = j + 1 < k ? bucketStart(first + j + 1, unit) : Number.POSITIVE_INFINITY;
    }
    const v = values[i];
    if (!Number.isFinite(v)) continue;
    if (b.count[j] === 0 || v < b.min[j]) b.min[j] = v;
    if (b.count[j] === 0 || v > b.max[j]) b.max[j] = v;
    sum[j] += v;
    b.count[j]++;
  }
  // A bucket cut short by the data's ends (a week of which the data hold two days) keeps its range, but its
  // mean is left out when it holds under half the periods of the fullest: it would read as a jump.
  let full = 0;
  for (let m = 0; m < k; m++) full = Math.max(full, b.count[m]);
  for (let m = 0; m < k; m++) if (b.count[m] > 0 && 2 * b.count[m] >= full) b.mean[m] = sum[m] / b.count[m];
  return b;
}

/**
 * Means of `values` over about `slices` runs of equal length, each at the mean of its instants: a smooth
 * line (the trend) drawn with a point every pixel or two rather than one a period. `from`/`to` bound the
 * runs (the provisional stretch is drawn on its own); a run with no finite value is NaN.
 */
export function sliceMeans(
  times: ArrayLike<number>,
  values: ArrayLike<number>,
  slices: number,
  from = 0,
  to = values.length,
): { t: number[]; v: number[] } {
  const length = to - from;
  const step = Math.max(1, Math.ceil(length / Math.max(1, slices)));
  const t: number[] = [];
  const v: number[] = [];
  for (let a = from; a < to; a += step) {
    const b = Math.min(to, a + step);
    let sv = 0;
    let st = 0;
    let c = 0;
    for (let i = a; i < b; i++) {
      if (!Number.isFinite(values[i])) continue;
      sv += values[i];
      st += times[i];
      c++;
    }
    t.push(c > 0 ? st / c : (times[a] + times[b - 1]) / 2);
    v.push(c > 0 ? sv / c : Number.NaN);
  }
  return { t, v };
}

const timesCache = new WeakMap<TimeIndex, Float64Array>();

/** The periods' start instants (UTC ms) of a series' period index, worked out once per index. */
export function instantsOf(index: TimeIndex): Float64Array {
  let t = timesCache.get(index);
  if (t === undefined) {
    t = new Float64Array(index.length);
    for (let i = 0; i < index.length; i++) t[i] = startOf(index.frequency, index.start + i);
    timesCache.set(index, t);
  }
  return t;
}

/** Words for a summary unit: "a week", "a month". */
export const UNIT_WORDS: Record<BucketUnit, { one: string; adjective: string }> = {
  week: { one: 'week', adjective: 'weekly' },
  month: { one: 'month', adjective: 'monthly' },
  quarter: { one: 'quarter', adjective: 'quarterly' },
  year: { one: 'year', adjective: 'yearly' },
};
