/**
 * The regression columns of one-off events at period T of a series of n values: an additive outlier (a
 * pulse, 1 at T), a level shift (0 before T, 1 from T on: the level after the step is the series' own), a
 * temporary change (δ^(t−T) from T on, decaying at rate δ; δ = 0.7 by default, the value of Chen & Liu
 * 1993) and a ramp (0 before T, rising linearly to 1 at `until`, 1 after). Source: Chen & Liu (1993),
 * "Joint estimation of model parameters and outlier effects in time series", JASA 88(421), 284–297, §2;
 * the ramp as in US Census Bureau, X-13ARIMA-SEATS Reference Manual v1.1 (2017), §4.3 (table 4.1).
 *
 *   outlierColumn('LS', 2, 5) → [0, 0, 1, 1, 1];  outlierColumn('TC', 1, 4, { rate: 0.5 }) → [0, 1, 0.5, 0.25]
 */
export type OutlierType = 'AO' | 'LS' | 'TC' | 'RAMP';

export function outlierColumn(
  type: OutlierType,
  at: number,
  n: number,
  o: { rate?: number; until?: number } = {},
): Float64Array {
  const col = new Float64Array(n);
  switch (type) {
    case 'AO':
      if (at >= 0 && at < n) col[at] = 1;
      break;
    case 'LS':
      for (let t = Math.max(0, at); t < n; t++) col[t] = 1;
      break;
    case 'TC': {
      const rate = o.rate ?? 0.7;
      let v = 1;
      for (let t = at; t < n; t++) {
        if (t >= 0) col[t] = v;
        v *= rate;
      }
      break;
    }
    case 'RAMP': {
      const until = o.until ?? at;
      for (let t = Math.max(0, at); t < n; t++) col[t] = t >= until ? 1 : (t - at) / (until - at);
      break;
    }
  }
  return col;
}
