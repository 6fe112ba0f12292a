/**
 * The decomposition of a series whose seasonality is not identifiable (diagnose/identifiable-seasonality.ts):
 * no seasonal component (0, or 1 for a multiplicative model), the seasonally adjusted series is the data as
 * they are, and the trend is the method's own trend smoother applied to the unadjusted data — what X-11
 * practice reports when a series is left unadjusted (Lothian & Morry 1978; Ladiray & Quenneville 2001).
 *
 * - classical: the centred moving average of order `period` (2×period when even), as in classical.ts;
 * - STL and MSTL: one loess smooth with the trend window, degree and jump of the STL fit (Cleveland et al.
 *   1990, §2.2, step 6, with no seasonal to remove), on logarithms for a multiplicative model; robust
 *   settings add the paper's outer passes of bisquare weights (§2.3);
 * - a Henderson final trend, when asked for, smooths the data with Musgrave end weights instead.
 *
 *   a straight line with noise → a trend that follows the line, seasonal all 0, adjusted = data
 */
import type { DecompositionSettings } from '../vocabulary/brief.js';
import { hendersonSmooth } from './henderson.js';
import { loessSmooth } from './loess.js';
import { centredMovingAverage } from './moving-average.js';
import type { DecomposeOutput } from './output.js';
import { robustnessWeights } from './stl.js';

export function decomposeWithoutSeason(values: Float64Array, s: DecompositionSettings): DecomposeOutput {
  const n = values.length;
  const mult = s.model === 'multiplicative';
  let trend: Float64Array;
  let provisionalCount: number;
  let weights: Float64Array | null = null;
  if (s.hendersonLength) {
    trend = hendersonSmooth(values, s.hendersonLength);
    provisionalCount = (s.hendersonLength - 1) / 2;
  } else if (s.method === 'classical') {
    trend = centredMovingAverage(values, s.period);
    provisionalCount = 0;
  } else {
    const y = new Float64Array(n);
    const present = new Uint8Array(n);
    const rw = new Float64Array(n);
    for (let i = 0; i < n; i++) {
      const v = mult ? Math.log(values[i]) : values[i];
      present[i] = Number.isFinite(v) ? 1 : 0;
      y[i] = present[i] ? v : 0;
      rw[i] = present[i];
    }
    trend = new Float64Array(n);
    const window = s.trendWindow % 2 === 1 ? s.trendWindow : s.trendWindow + 1;
    loessSmooth(y, n, Math.max(3, window), s.trendDegree, s.trendJump, rw, trend);
    for (let pass = 0; pass < (s.robust ? s.outer : 0); pass++) {
      robustnessWeights(y, trend, present, rw);
      loessSmooth(y, n, Math.max(3, window), s.trendDegree, s.trendJump, rw, trend);
    }
    if (s.robust) weights = rw;
    if (mult) for (let i = 0; i < n; i++) trend[i] = Math.exp(trend[i]);
    provisionalCount = Math.floor(s.trendWindow / 2);
  }
  const none = () => new Float64Array(n).fill(mult ? 1 : 0);
  const seasonal = none();
  const adjusted = Float64Array.from(values);
  const remainder = new Float64Array(n);
  for (let i = 0; i < n; i++) remainder[i] = mult ? values[i] / trend[i] : values[i] - trend[i];
  const seasonals = s.method === 'mstl' ? new Map(s.periods.map((p, i) => [p, i === 0 ? seasonal : none()])) : null;
  return { trend, seasonal, remainder, adjusted, seasonals, weights, provisionalCount };
}
