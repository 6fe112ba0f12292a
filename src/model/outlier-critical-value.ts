/**
 * The critical |t| for automatic outlier detection in a series of n observations, by the rule of Ljung
 * (1993), "On outlier detection in time series", JRSS B 55(2), 559–567: with a = √(2 ln n),
 * b = a − (ln ln n + ln 4π)/(2a) and p = 2 − √(1 + α), the value b + (−ln(−½ ln p))/a. With α = 0.05 it
 * gives the defaults X-13ARIMA-SEATS prints (US Census Bureau, Reference Manual v1.1 (2017), §7.11; from
 * memory: 3.85 for 120 and 3.89 for 144 observations). Below 12 observations the rule is not used (NaN):
 * too short to search.
 *
 *   outlierCriticalValue(120) → 3.848;  outlierCriticalValue(144) → 3.887
 */
export function outlierCriticalValue(n: number, alpha = 0.05): number {
  if (!(n >= 12)) return Number.NaN;
  const a = Math.sqrt(2 * Math.log(n));
  const b = a - (Math.log(Math.log(n)) + Math.log(4 * Math.PI)) / (2 * a);
  const p = 2 - Math.sqrt(1 + alpha);
  return b + -Math.log(-0.5 * Math.log(p)) / a;
}
