/**
 * Strength of trend and of seasonality, each between 0 and 1.
 * Source: Wang, Smith & Hyndman (2006), "Characteristic-based clustering for time series data", Data
 * Mining and Knowledge Discovery 13(3), 335–364; as in Hyndman & Athanasopoulos, Forecasting: Principles
 * and Practice, 3rd ed., §4.3:
 *
 *   F_T = max(0, 1 − Var(R) / Var(T + R)),   F_S = max(0, 1 − Var(R) / Var(S + R)).
 *
 * Only points where both parts are defined count. For a multiplicative decomposition pass the logs of the
 * components (log T + log S + log R = log Y).
 *
 *   trend [1, 2, 3, 4], remainder [0.1, −0.1, 0.1, −0.1] → Var(R) = 0.0133, Var(T+R) = 1.4533 → F_T = 0.991
 */
export function componentStrength(component: ArrayLike<number>, remainder: ArrayLike<number>): number {
  // Typed arrays, not growing lists: on a long series those were tens of megabytes of garbage a call.
  let count = 0;
  for (let i = 0; i < remainder.length; i++) if (!Number.isNaN(component[i]) && !Number.isNaN(remainder[i])) count++;
  const sum = new Float64Array(count);
  const rem = new Float64Array(count);
  for (let i = 0, m = 0; i < remainder.length; i++) {
    const c = component[i];
    const r = remainder[i];
    if (Number.isNaN(c) || Number.isNaN(r)) continue;
    sum[m] = c + r;
    rem[m++] = r;
  }
  if (count < 2) return Number.NaN;
  const total = variance(sum);
  if (total === 0) return 0;
  return Math.max(0, 1 - variance(rem) / total);
}

/** Sample variance (n − 1 denominator). */
export function variance(values: ArrayLike<number>): number {
  const n = values.length;
  let mean = 0;
  for (let i = 0; i < n; i++) mean += values[i];
  mean /= n;
  let ss = 0;
  for (let i = 0; i < n; i++) ss += (values[i] - mean) * (values[i] - mean);
  return ss / (n - 1);
}
