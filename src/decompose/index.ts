/**
 * Runs the decomposition a job asked for, with settings already resolved (job/resolve.ts). Multiplicative
 * STL and MSTL work on logarithms and transform back, so Y = T·S·R exactly (Cleveland et al. 1990, §3.6;
 * Hyndman & Athanasopoulos, FPP 3rd ed., §3.6). A Henderson final trend, when asked for, smooths the
 * seasonally adjusted series with Musgrave end weights; the remainder is then what the trend leaves.
 */
import type { DecompositionSettings } from '../vocabulary/brief.js';
import { classicalDecomposition } from './classical.js';
import { hendersonSmooth } from './henderson.js';
import { mstl } from './mstl.js';
import type { DecomposeOutput } from './output.js';
import { stl } from './stl.js';
import { decomposeWithoutSeason } from './without-season.js';

export function runDecomposition(values: Float64Array, s: DecompositionSettings): DecomposeOutput {
  if (!s.seasonalAdjustment.applied) return decomposeWithoutSeason(values, s);
  const n = values.length;
  const mult = s.model === 'multiplicative';
  let trend: Float64Array;
  let seasonal: Float64Array;
  let seasonals: Map<number, Float64Array> | null = null;
  let weights: Float64Array | null = null;

  if (s.method === 'classical') {
    const c = classicalDecomposition(values, s.period, {
      model: s.model,
      hendersonLength: s.trendFilter === 'henderson' ? s.hendersonLength : null,
    });
    const adjusted = adjust(values, c.seasonal, mult);
    const provisionalCount = s.trendFilter === 'henderson' && s.hendersonLength ? (s.hendersonLength - 1) / 2 : 0;
    return {
      trend: c.trend,
      seasonal: c.seasonal,
      remainder: c.remainder,
      adjusted,
      seasonals,
      weights,
      provisionalCount,
    };
  }

  const input = mult ? values.map(Math.log) : values;
  // The fit's own remainder (of the logarithms, for a multiplicative model) is not the one returned: its
  // array takes the returned remainder instead of a new one.
  let spare: Float64Array;
  if (s.method === 'stl') {
    const f = stl(input, { ...stlLoess(s), period: s.period, seasonalWindow: s.seasonalWindows[0] });
    trend = f.trend;
    seasonal = f.seasonal;
    weights = s.robust ? f.weights : null;
    spare = f.remainder;
  } else {
    // Each period's STL fit has its own windows (settings.trendWindows, lowpassWindows), as forecast::mstl does.
    // Jumps follow each fit's windows.
    const f = mstl(input, {
      ...sharedLoess(s),
      periods: s.periods,
      seasonalWindows: s.seasonalWindows,
      trendWindows: s.trendWindows,
      lowpassWindows: s.lowpassWindows,
      iterations: s.iterations,
    });
    trend = f.trend;
    seasonal = f.seasonal;
    seasonals = f.seasonals;
    weights = s.robust ? f.weights : null;
    spare = f.remainder;
  }
  if (mult) {
    // In place: the fit's arrays are ours, and a million-point series would otherwise hold both copies.
    expInPlace(trend);
    expInPlace(seasonal);
    if (seasonals) for (const v of seasonals.values()) if (v !== seasonal) expInPlace(v);
  }
  const adjusted = adjust(values, seasonal, mult);
  let provisionalCount = Math.floor(s.trendWindow / 2);
  if (s.hendersonLength) {
    // Where the observation is missing, let the loess trend stand in so the filter has a full window.
    const filled = adjusted.map((v, i) => (Number.isNaN(v) ? trend[i] : v));
    trend = hendersonSmooth(filled, s.hendersonLength);
    provisionalCount = (s.hendersonLength - 1) / 2;
  }
  const remainder = spare.length === n ? spare : new Float64Array(n);
  for (let i = 0; i < n; i++) remainder[i] = mult ? adjusted[i] / trend[i] : adjusted[i] - trend[i];
  return { trend, seasonal, remainder, adjusted, seasonals, weights, provisionalCount };
}

function expInPlace(v: Float64Array): void {
  for (let i = 0; i < v.length; i++) v[i] = Math.exp(v[i]);
}

function adjust(values: Float64Array, seasonal: Float64Array, mult: boolean): Float64Array {
  const out = new Float64Array(values.length);
  for (let i = 0; i < values.length; i++) out[i] = mult ? values[i] / seasonal[i] : values[i] - seasonal[i];
  return out;
}

/** The loess settings every STL fit of these settings shares: degrees, robustness and passes. */
export function sharedLoess(s: DecompositionSettings) {
  return {
    seasonalDegree: s.seasonalDegree,
    trendDegree: s.trendDegree,
    lowpassDegree: s.lowpassDegree,
    robust: s.robust,
    inner: s.inner,
    outer: s.outer,
  };
}

/** Those of the one fit of an STL decomposition: the shared ones with its trend and low-pass windows and jumps. */
export function stlLoess(s: DecompositionSettings) {
  return {
    ...sharedLoess(s),
    trendWindow: s.trendWindow,
    lowpassWindow: s.lowpassWindow,
    seasonalJump: s.seasonalJump,
    trendJump: s.trendJump,
    lowpassJump: s.lowpassJump,
  };
}
