/**
 * KPSS statistic for level stationarity and the number of first differences it asks for. The statistic is
 * Σ Sₜ² / (n² s²(l)), Sₜ the partial sums of the deviations from the mean and s²(l) the Newey–West long-run
 * variance with Bartlett weights and l = ⌊3√n / 13⌋ lags; the series is differenced while the statistic
 * exceeds the 5% critical value 0.463 (at most twice).
 * Source: Kwiatkowski, Phillips, Schmidt & Shin (1992), Journal of Econometrics 54, 159–178 (statistic and
 * Table 1 critical values); the lag rule and the loop are those of Hyndman & Khandakar (2008), Journal of
 * Statistical Software 27(3), §3.2, as forecast::ndiffs applies them (urca::ur.kpss, type "mu").
 *
 *   kpssStatistic(white noise) ≈ small (< 0.463);  kpssStatistic(a random walk) large
 */
export function kpssStatistic(x: Float64Array, lags: number = Math.trunc((3 * Math.sqrt(x.length)) / 13)): number {
  const n = x.length;
  let mean = 0;
  for (let t = 0; t < n; t++) mean += x[t];
  mean /= n;
  const e = new Float64Array(n);
  for (let t = 0; t < n; t++) e[t] = x[t] - mean;
  let s = 0;
  let eta = 0;
  let s2 = 0;
  for (let t = 0; t < n; t++) {
    s += e[t];
    eta += s * s;
    s2 += e[t] * e[t];
  }
  eta /= n * n;
  s2 /= n;
  let extra = 0;
  for (let l = 1; l <= lags; l++) {
    let c = 0;
    for (let t = l; t < n; t++) c += e[t] * e[t - l];
    extra += (1 - l / (lags + 1)) * c;
  }
  return eta / (s2 + (2 / n) * extra);
}

/** The 5% critical value of the level test (KPSS 1992, Table 1). */
export const KPSS_CRITICAL_5 = 0.463;

/** Number of first differences (0, 1 or 2) by repeated KPSS tests; missing values are dropped. */
export function kpssDifferences(values: Float64Array, maxD = 2): number {
  let x = values.filter((v) => !Number.isNaN(v));
  let d = 0;
  while (d < maxD && x.length > 1 && !isConstant(x) && kpssStatistic(x) > KPSS_CRITICAL_5) {
    d++;
    const dx = new Float64Array(x.length - 1);
    for (let t = 1; t < x.length; t++) dx[t - 1] = x[t] - x[t - 1];
    x = dx;
  }
  return d;
}

export function isConstant(x: Float64Array): boolean {
  for (let t = 1; t < x.length; t++) if (x[t] !== x[0]) return false;
  return true;
}
