/**
 * Whether to take a seasonal difference: yes when the strength of seasonality of an STL decomposition
 * (with MSTL's default seasonal window, 11) is above 0.64, at most once. Strength is
 * max(0, 1 − Var(R)/Var(S + R)) (Wang, Smith & Hyndman 2006, Data Mining and Knowledge Discovery 13(3),
 * 335–364; Hyndman & Athanasopoulos, FPP 3rd ed., §4.3). The 0.64 threshold is forecast::nsdiffs's default
 * test ("seas"); missing values are filled by straight lines before the decomposition.
 *
 *   seasonalDifferences(strongly seasonal monthly values, 12) → 1
 */
import { mstl } from '../decompose/mstl.js';
import { isConstant } from './kpss.js';

export function seasonalStrengthForTest(values: Float64Array, period: number): number {
  const x = fillLinear(values);
  const fit = mstl(x, { periods: [period] });
  const r = fit.remainder;
  const s = fit.seasonal;
  const sr = new Float64Array(r.length);
  for (let t = 0; t < r.length; t++) sr[t] = r[t] + s[t];
  return Math.max(0, Math.min(1, 1 - variance(r) / variance(sr)));
}

export function seasonalDifferences(values: Float64Array, period: number): number {
  const x = values;
  if (period <= 1 || x.length < 2 * period || isConstant(x.filter((v) => !Number.isNaN(v)))) return 0;
  return seasonalStrengthForTest(x, period) > 0.64 ? 1 : 0;
}

function variance(x: Float64Array): number {
  let n = 0;
  let m = 0;
  for (const v of x) {
    if (Number.isNaN(v)) continue;
    n++;
    m += v;
  }
  m /= n;
  let s = 0;
  for (const v of x) if (!Number.isNaN(v)) s += (v - m) ** 2;
  return s / (n - 1);
}

/** Missing values filled by straight lines between their neighbours; ends held flat. */
export function fillLinear(values: Float64Array): Float64Array {
  const x = Float64Array.from(values);
  const n = x.length;
  let last = -1;
  for (let t = 0; t < n; t++) {
    if (Number.isNaN(x[t])) continue;
    if (last < 0) for (let u = 0; u < t; u++) x[u] = x[t];
    else for (let u = last + 1; u < t; u++) x[u] = x[last] + ((x[t] - x[last]) * (u - last)) / (t - last);
    last = t;
  }
  if (last >= 0) for (let u = last + 1; u < n; u++) x[u] = x[last];
  return x;
}
