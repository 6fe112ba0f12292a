/**
 * Forecasts of a fitted regression with ARIMA errors, h steps past the end, with prediction intervals
 * mean ± z·σ·√v (z the normal quantile of the level). The regression part continues the intercept and
 * drift; other regressors need their future values. Source: Box, Jenkins, Reinsel & Ljung (2015), ch. 5;
 * Durbin & Koopman (2012), §4.11; as R's predict.Arima and forecast::forecast.Arima compute them.
 *
 *   forecastArima(fit, 12, { levels: [0.8, 0.95] }) → mean, se, lower/upper per level
 */
import type { ArimaFit } from './fit-arima.js';
import { kalmanForecast } from './kalman-forecast.js';
import { normalQuantile } from './normal-quantile.js';

export interface ArimaForecast {
  mean: Float64Array;
  se: Float64Array;
  levels: number[];
  lower: Float64Array[];
  upper: Float64Array[];
}

export function forecastArima(
  fit: ArimaFit,
  horizon: number,
  options: { levels?: number[]; xreg?: Float64Array[] } = {},
): ArimaForecast {
  const { mean: m, variance } = kalmanForecast(horizon, fit.state, fit.covariance, fit.phi, fit.theta, fit.delta);
  const mean = Float64Array.from(m);
  const n = fit.residuals.length;
  const narma = fit.spec.p + fit.spec.q + fit.spec.P + fit.spec.Q;
  let j = narma;
  let extra = 0;
  for (const name of fit.names.slice(narma)) {
    const b = fit.coef[j++];
    for (let h = 0; h < horizon; h++) {
      if (name === 'intercept') mean[h] += b;
      else if (name === 'drift') mean[h] += b * (n + h + 1);
      else {
        const col = options.xreg?.[extra];
        mean[h] += b * (col ? col[h] : Number.NaN);
      }
    }
    if (name !== 'intercept' && name !== 'drift') extra++;
  }
  const se = variance.map((v) => Math.sqrt(v * fit.sigma2));
  const levels = options.levels ?? [0.8, 0.95];
  const lower = levels.map((l) => {
    const z = normalQuantile(0.5 + l / 2);
    return mean.map((v, h) => v - z * se[h]);
  });
  const upper = levels.map((l) => {
    const z = normalQuantile(0.5 + l / 2);
    return mean.map((v, h) => v + z * se[h]);
  });
  return { mean, se, levels, lower, upper };
}
