/**
 * MSTL: STL for several seasonal periods.
 * Source: Bandara, Hyndman & Bergmeir (2021), "MSTL: A Seasonal-Trend Decomposition Algorithm for Time
 * Series with Multiple Seasonal Patterns", arXiv:2107.13462; computed as R's forecast::mstl does. Periods
 * are taken in ascending order; on each of `iterations` passes every seasonal component is put back and
 * re-estimated by STL with its own period and seasonal window (default 7 + 4·i for the i-th period, i = 1,
 * 2, …: 11, 15, 19, …). The trend is that of the last STL fit; the remainder is what is left.
 *
 *   mstl(hourly, { periods: [24, 168] }) → trend, seasonals {24, 168}, remainder
 */
import { type StlOptions, type StlSettings, stl } from './stl.js';

export interface MstlOptions extends Omit<StlOptions, 'period' | 'seasonalWindow'> {
  periods: number[];
  seasonalWindows?: (number | 'periodic')[];
  /** Trend window of each period's STL fit; by default each fit takes STL's default for its period. */
  trendWindows?: number[];
  /** Low-pass window of each period's STL fit; by default the smallest odd integer ≥ that period. */
  lowpassWindows?: number[];
  iterations?: number;
}

export interface MstlResult {
  trend: Float64Array;
  /** The sum of the seasonal components. */
  seasonal: Float64Array;
  seasonals: Map<number, Float64Array>;
  remainder: Float64Array;
  weights: Float64Array;
  periods: number[];
  seasonalWindows: (number | 'periodic')[];
  iterations: number;
  /** Settings of the last STL fit (its trend is the trend). */
  last: StlSettings;
}

export function defaultMstlWindows(count: number): number[] {
  return Array.from({ length: count }, (_, i) => 7 + 4 * (i + 1));
}

export function mstl(values: Float64Array, options: MstlOptions): MstlResult {
  const n = values.length;
  const periods = [...options.periods].sort((a, b) => a - b);
  const windows = options.seasonalWindows ?? defaultMstlWindows(periods.length);
  const iterations = Math.max(1, options.iterations ?? 2);
  const deseas = Float64Array.from(values);
  const seasonals: Float64Array[] = periods.map(() => new Float64Array(n));
  let fit: ReturnType<typeof stl> | null = null;
  for (let pass = 0; pass < iterations; pass++) {
    for (let i = 0; i < periods.length; i++) {
      const s = seasonals[i];
      for (let t = 0; t < n; t++) deseas[t] += s[t];
      const { trendWindows, lowpassWindows, ...rest } = options;
      fit = stl(deseas, {
        ...rest,
        period: periods[i],
        seasonalWindow: windows[i],
        trendWindow: trendWindows?.[i],
        lowpassWindow: lowpassWindows?.[i],
      });
      seasonals[i] = fit.seasonal;
      for (let t = 0; t < n; t++) deseas[t] -= fit.seasonal[t];
    }
  }
  if (fit === null) throw new RangeError('mstl needs at least one seasonal period');
  const seasonal = new Float64Array(n);
  for (const s of seasonals) for (let t = 0; t < n; t++) seasonal[t] += s[t];
  const remainder = new Float64Array(n);
  for (let t = 0; t < n; t++) remainder[t] = deseas[t] - fit.trend[t];
  return {
    trend: fit.trend,
    seasonal,
    seasonals: new Map(periods.map((p, i) => [p, seasonals[i]])),
    remainder,
    weights: fit.weights,
    periods,
    seasonalWindows: windows,
    iterations,
    last: fit.settings,
  };
}
