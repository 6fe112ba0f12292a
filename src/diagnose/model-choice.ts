/**
 * Additive or multiplicative? A multiplicative model suits a series whose seasonal swing grows in
 * proportion to its level; an additive one a swing that stays the same size (Hyndman & Athanasopoulos,
 * Forecasting: Principles and Practice, 3rd ed., §3.2). Zero or negative values force additive.
 *
 * The rule (ours, stated in every brief): take a classical additive decomposition; for each complete cycle
 * measure the level (mean trend) and the swing (largest minus smallest detrended value); regress
 * log swing on log level. The slope is the swing's elasticity to the level: about 1 when the swing is
 * proportional, about 0 when it is constant. Multiplicative when the elasticity exceeds 0.5 and the level
 * moved by at least 10% between cycles (otherwise the data cannot tell the two apart and additive, the
 * simpler model, is kept). Fewer than three complete cycles: additive.
 *
 *   levels 100, 200, 400 with swings 20, 40, 80 → elasticity 1.0 → multiplicative
 */
import { centredMovingAverage } from '../decompose/moving-average.js';

export interface ModelChoice {
  model: 'additive' | 'multiplicative';
  reason: string;
  /** Elasticity of the seasonal swing to the level (NaN when not measured). */
  elasticity: number;
}

export const ELASTICITY_THRESHOLD = 0.5;
export const MIN_LEVEL_CHANGE = 1.1;

export function chooseModel(values: Float64Array, period: number, format: (v: number) => string = String): ModelChoice {
  for (let i = 0; i < values.length; i++) {
    if (values[i] <= 0) {
      return {
        model: 'additive',
        reason: 'additive, because the series has zero or negative values, which a multiplicative model cannot hold',
        elasticity: Number.NaN,
      };
    }
  }
  const trend = centredMovingAverage(values, period);
  const levels: number[] = [];
  const swings: number[] = [];
  for (let start = 0; start + period <= values.length; start += period) {
    let lo = Number.POSITIVE_INFINITY;
    let hi = Number.NEGATIVE_INFINITY;
    let level = 0;
    let complete = true;
    for (let i = start; i < start + period; i++) {
      const d = values[i] - trend[i];
      if (Number.isNaN(d)) {
        complete = false;
        break;
      }
      lo = Math.min(lo, d);
      hi = Math.max(hi, d);
      level += trend[i];
    }
    if (complete && hi > lo) {
      levels.push(level / period);
      swings.push(hi - lo);
    }
  }
  if (levels.length < 3) {
    return {
      model: 'additive',
      reason:
        'additive, because fewer than three complete years are available to tell whether the seasonal swing follows the level',
      elasticity: Number.NaN,
    };
  }
  const lowLevel = Math.min(...levels);
  const highLevel = Math.max(...levels);
  const elasticity = slope(levels.map(Math.log), swings.map(Math.log));
  const atLow = swings[levels.indexOf(lowLevel)];
  const atHigh = swings[levels.indexOf(highLevel)];
  const evidence = `the yearly level ranged from ${format(lowLevel)} to ${format(highLevel)} and the seasonal swing was ${format(atLow)} and ${format(atHigh)} in those years`;
  if (highLevel / lowLevel < MIN_LEVEL_CHANGE) {
    return {
      model: 'additive',
      reason: `additive, because the level changed too little to tell the models apart (${evidence})`,
      elasticity,
    };
  }
  if (elasticity > ELASTICITY_THRESHOLD) {
    return {
      model: 'multiplicative',
      reason: `multiplicative, because the seasonal swing grows with the level (${evidence}; elasticity ${elasticity.toFixed(2)})`,
      elasticity,
    };
  }
  return {
    model: 'additive',
    reason: `additive, because the seasonal swing stays about the same size as the level changes (${evidence}; elasticity ${elasticity.toFixed(2)})`,
    elasticity,
  };
}

/** Least-squares slope of y on x. */
function slope(x: number[], y: number[]): number {
  const n = x.length;
  const mx = x.reduce((a, b) => a + b, 0) / n;
  const my = y.reduce((a, b) => a + b, 0) / n;
  let sxy = 0;
  let sxx = 0;
  for (let i = 0; i < n; i++) {
    sxy += (x[i] - mx) * (y[i] - my);
    sxx += (x[i] - mx) ** 2;
  }
  return sxx > 0 ? sxy / sxx : Number.NaN;
}
