/**
 * Classical decomposition, additive (Y = T + S + R) or multiplicative (Y = T·S·R).
 * Source: Hyndman & Athanasopoulos, Forecasting: Principles and Practice, 3rd ed., §3.4; computed as R's
 * stats::decompose does (Kendall & Stuart, The Advanced Theory of Statistics, vol. 3, 1983): the trend is the
 * centred moving average of order = period (2×m for even m); each season's index is the mean of its
 * detrended values (NaN skipped); indices are normalised to sum 0 (additive) or average 1 (multiplicative).
 * Optionally the final trend is a Henderson filter of the seasonally adjusted series, with Musgrave end
 * weights, so it has a value up to the last observation.
 */

import { hendersonSmooth } from './henderson.js';
import { centredMovingAverage } from './moving-average.js';

export interface ClassicalOptions {
  model: 'additive' | 'multiplicative';
  /** When set, the final trend is a Henderson filter of this (odd) length applied to the adjusted series. */
  hendersonLength?: number | null;
}

export interface Decomposition {
  trend: Float64Array;
  seasonal: Float64Array;
  remainder: Float64Array;
  /** The seasonal indices of one cycle, starting at the series' first point. */
  figure: Float64Array;
}

export function classicalDecomposition(values: Float64Array, period: number, options: ClassicalOptions): Decomposition {
  const n = values.length;
  const mult = options.model === 'multiplicative';
  const movingTrend = centredMovingAverage(values, period);
  const figure = seasonalFigure(values, movingTrend, period, mult);
  const seasonal = new Float64Array(n);
  // A cycle counter rather than i % period: the remainder of a division per point is slow on long series.
  for (let i = 0, s = 0; i < n; i++) {
    seasonal[i] = figure[s];
    if (++s === period) s = 0;
  }

  let trend = movingTrend;
  if (options.hendersonLength) {
    const adjusted = new Float64Array(n);
    for (let i = 0; i < n; i++) adjusted[i] = mult ? values[i] / seasonal[i] : values[i] - seasonal[i];
    trend = hendersonSmooth(adjusted, options.hendersonLength);
  }
  const remainder = new Float64Array(n);
  if (mult) for (let i = 0; i < n; i++) remainder[i] = values[i] / (seasonal[i] * trend[i]);
  else for (let i = 0; i < n; i++) remainder[i] = values[i] - seasonal[i] - trend[i];
  return { trend, seasonal, remainder, figure };
}

/** Mean detrended value of each position in the cycle, normalised (sum 0, or mean 1). */
export function seasonalFigure(
  values: Float64Array,
  trend: Float64Array,
  period: number,
  multiplicative: boolean,
): Float64Array {
  const sums = new Float64Array(period);
  const counts = new Float64Array(period);
  for (let i = 0, s = 0; i < values.length; i++) {
    const d = multiplicative ? values[i] / trend[i] : values[i] - trend[i];
    if (!Number.isNaN(d)) {
      sums[s] += d;
      counts[s] += 1;
    }
    if (++s === period) s = 0;
  }
  const figure = new Float64Array(period);
  let total = 0;
  for (let s = 0; s < period; s++) {
    figure[s] = counts[s] > 0 ? sums[s] / counts[s] : Number.NaN;
    total += figure[s];
  }
  const centre = total / period;
  for (let s = 0; s < period; s++) figure[s] = multiplicative ? figure[s] / centre : figure[s] - centre;
  return figure;
}
