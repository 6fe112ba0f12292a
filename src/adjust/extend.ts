/**
 * Forecast extension: the series is extended by model forecasts before it is decomposed, so that the
 * trend filter near the end sees (forecast) data on both sides; components are then kept only up to the
 * last observation. Two models, chosen per series by its longest seasonal period:
 * - up to 24 (quarterly, monthly, daily with a weekly cycle): a seasonal ARIMA chosen automatically
 *   (model/auto-arima.ts), on logarithms for a multiplicative decomposition;
 * - longer periods (weekly with 52, daily with 365, hourly with 168): a non-seasonal ARIMA on the
 *   seasonally adjusted series plus each season's last value (the seasonal naive forecast of the seasonal
 *   component), because seasonal ARIMA with such periods is slow and poorly determined.
 * For the revision study a series cut at an earlier period is extended with the same orders, the
 * coefficients re-estimated on the shorter series (not re-selected). Where calendar effects and events
 * were estimated first by a seasonal ARIMA with regressors of the same period, the series they leave (the
 * linearised series) is extended with that model's orders, its coefficients re-estimated from the
 * regression's, instead of a second search: the regression's ARIMA part is the model of exactly that
 * series, as in regARIMA practice (Findley et al. 1998, §2).
 * Source: Dagum (1988), The X-11-ARIMA/88 Seasonal Adjustment Method, Statistics Canada (extension by ARIMA
 * forecasts to reduce end revisions); Findley, Monsell, Bell, Otto & Chen (1998), Journal of Business &
 * Economic Statistics 16(2), 127–152, §2; for the model on the adjusted series Hyndman & Athanasopoulos,
 * Forecasting: Principles and Practice, 3rd ed., §5.7 (forecasting with decomposition).
 *
 *   extendSeries(monthly, { periods: [12], horizon: 12, multiplicative: false }) → 12 more values, "ARIMA(0,1,1)(0,1,1)12"
 */
import { autoArima } from '../model/auto-arima.js';
import { type ArimaFit, ArimaFitError, type ArimaSpec, fitArima } from '../model/fit-arima.js';
import { forecastArima } from '../model/forecast-arima.js';
import { isStable } from '../model/stable.js';

export interface ExtensionOptions {
  periods: number[];
  horizon: number;
  multiplicative: boolean;
  /** Seasonally adjusted values (same scale as the series), needed for the long-period model. */
  seasonal?: Float64Array;
  /** Force a model kind (for the study that compares them); by default chosen by the longest period. */
  kind?: ExtensionModel['kind'];
  /** Orders (and start coefficients) to re-estimate instead of selecting a model. */
  reuse?: ExtensionModel;
  /** With `reuse`: keep its coefficients as they are (no estimation at all). */
  fixed?: boolean;
  /** With `reuse`: estimate in full (from its coefficients), not by the quick fit of the revision study. */
  full?: boolean;
}

export interface ExtensionModel {
  kind: 'seasonal-arima' | 'arima-on-adjusted';
  spec: ArimaSpec;
  coef: Float64Array;
  log: boolean;
}

export interface Extension {
  /** The series followed by `added` forecasts (the series alone when the extension was skipped). */
  values: Float64Array;
  added: number;
  model: ExtensionModel | null;
  /** "ARIMA(0,1,1)(0,1,1)12 on logarithms", or null when skipped. */
  description: string | null;
  /** Why the extension was skipped, in one plain sentence; null when it was not. */
  skipped: string | null;
}

/** The longest seasonal period a seasonal ARIMA extends directly. */
export const SEASONAL_ARIMA_MAX_PERIOD = 24;

export function extendSeries(values: Float64Array, o: ExtensionOptions): Extension {
  const n = values.length;
  const longest = Math.max(1, ...o.periods);
  const kind =
    o.reuse?.kind ?? o.kind ?? (longest <= SEASONAL_ARIMA_MAX_PERIOD ? 'seasonal-arima' : 'arima-on-adjusted');
  const skip = (why: string): Extension => ({ values, added: 0, model: null, description: null, skipped: why });
  let positive = true;
  let observed = 0;
  let lo = Number.POSITIVE_INFINITY;
  let hi = Number.NEGATIVE_INFINITY;
  for (const v of values) {
    if (Number.isNaN(v)) continue;
    observed++;
    if (!(v > 0)) positive = false;
    if (v < lo) lo = v;
    if (v > hi) hi = v;
  }
  // Tested on the series itself: its seasonally adjusted values carry rounding noise a model would fit.
  if (observed > 0 && lo === hi) return skip('the series is constant');
  const log = o.reuse?.log ?? (o.multiplicative && positive);
  if (o.multiplicative && !log) return skip('the series has zero or negative values, so no model on logarithms');
  if (kind === 'arima-on-adjusted' && !o.seasonal) return skip('no seasonal component to adjust by');
  const minimum = kind === 'seasonal-arima' ? 2 * longest + 4 : 16;
  if (observed < minimum) return skip(`${observed} values are too few for a forecasting model (at least ${minimum})`);

  // What the model sees: the series, or the seasonally adjusted series (logarithms when multiplicative).
  const target = new Float64Array(n);
  for (let t = 0; t < n; t++) {
    const v = kind === 'arima-on-adjusted' ? adjustedValue(values[t], o.seasonal![t], o.multiplicative) : values[t];
    target[t] = log ? Math.log(v) : v;
  }
  let fit: ArimaFit;
  if (o.reuse && o.fixed && !stableCoefficients(o.reuse)) {
    return skip('the model is non-stationary or non-invertible, so its forecasts would not settle');
  }
  try {
    if (o.reuse) {
      const narma = o.reuse.spec.p + o.reuse.spec.q + o.reuse.spec.P + o.reuse.spec.Q;
      const start = o.reuse.coef.slice(0, narma);
      fit = o.fixed
        ? fitArima(target, o.reuse.spec, { fixed: o.reuse.coef })
        : o.full
          ? fitArima(target, o.reuse.spec, { start })
          : fitArima(target, o.reuse.spec, { start, quick: true, forecastable: true });
    } else {
      fit = autoArima(target, kind === 'seasonal-arima' ? seasonalPeriod(o.periods) : 1).fit;
    }
  } catch (e) {
    if (e instanceof ArimaFitError) return skip(reasonText(e));
    throw e;
  }
  if (!Number.isFinite(fit.loglik) || !(fit.sigma2 >= 0)) return skip('the model could not be estimated');
  // Re-estimated coefficients are stationary and invertible by construction; kept ones may not be.
  if (!isStable(fit.phi) || !isStable(fit.theta.map((v) => -v))) {
    return skip('the model is non-stationary or non-invertible, so its forecasts would not settle');
  }
  const f = forecastArima(fit, o.horizon, { levels: [] });
  const out = new Float64Array(n + o.horizon);
  out.set(values);
  for (let h = 0; h < o.horizon; h++) {
    let v = log ? Math.exp(f.mean[h]) : f.mean[h];
    if (kind === 'arima-on-adjusted') {
      // Seasonal naive: each season's last value of the seasonal component.
      const s = o.seasonal![n - longest + (h % longest)];
      v = o.multiplicative ? v * s : v + s;
    }
    if (!Number.isFinite(v)) return skip('the model gave forecasts that are not finite');
    out[n + h] = v;
  }
  const model: ExtensionModel = { kind, spec: fit.spec, coef: fit.coef, log };
  return { values: out, added: o.horizon, model, description: describeModel(model), skipped: null };
}

/** Whether kept coefficients give a stationary AR and an invertible MA part, seasonal parts included. */
function stableCoefficients(m: ExtensionModel): boolean {
  const { p, q, P, Q } = m.spec;
  const part = (from: number, len: number, sign: number) =>
    Array.from(m.coef.subarray(from, from + len), (v) => sign * v);
  return (
    isStable(part(0, p, 1)) &&
    isStable(part(p, q, -1)) &&
    isStable(part(p + q, P, 1)) &&
    isStable(part(p + q + P, Q, -1))
  );
}

function adjustedValue(v: number, s: number, multiplicative: boolean): number {
  return multiplicative ? v / s : v - s;
}

/** The seasonal ARIMA's period: the longest period up to the limit (a daily series' 7, not its 365). */
export function seasonalPeriod(periods: number[]): number {
  const fit = periods.filter((p) => p <= SEASONAL_ARIMA_MAX_PERIOD);
  return fit.length > 0 ? Math.max(...fit) : 1;
}

function reasonText(e: ArimaFitError): string {
  switch (e.reason) {
    case 'constant':
      return 'the series is constant';
    case 'too-short':
      return `the series is too short for a forecasting model: ${e.message}`;
    case 'no-model':
      return 'every model tried was non-stationary or non-invertible';
    case 'optimiser':
      return 'the model could not be estimated (the optimiser failed)';
    default:
      return `the model could not be estimated (${e.message})`;
  }
}

/** "ARIMA(0,1,1)(0,1,1)12", with " with drift", " with mean" and " on logarithms" as they apply. */
export function describeModel(m: ExtensionModel): string {
  const s = m.spec;
  const seasonal = s.P + s.D + s.Q > 0 ? `(${s.P},${s.D},${s.Q})${s.period}` : '';
  const constant = s.drift ? ' with drift' : s.mean && s.d + s.D === 0 ? ' with mean' : '';
  const base = `ARIMA(${s.p},${s.d},${s.q})${seasonal}${constant}`;
  const on =
    m.kind === 'arima-on-adjusted' ? ' on the seasonally adjusted series (seasonal pattern carried forward)' : '';
  return `${base}${on}${m.log ? ', on logarithms' : ''}`;
}
