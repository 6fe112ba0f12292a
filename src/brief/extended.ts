/**
 * The decomposition a brief uses, with forecast extension when the settings ask for it: extend the series
 * by forecasts (adjust/extend.ts), decompose the extended series, keep every component only up to the last
 * observation. The model on the seasonally adjusted series takes its seasonal component from a first
 * decomposition without extension. For the revision study's shorter series, `reuse` re-estimates the
 * chosen orders instead of selecting a model again; `fixed` keeps its coefficients too (the sensitivity
 * check, which adds one value to the series many times over); `fullEstimate` estimates them in full (the
 * brief's own fit from a model already chosen, effectsModel).
 */
import { type Extension, type ExtensionModel, extendSeries, seasonalPeriod } from '../adjust/extend.js';
import { runDecomposition } from '../decompose/index.js';
import type { DecomposeOutput } from '../decompose/output.js';
import type { ArimaFit } from '../model/fit-arima.js';
import type { DecompositionSettings } from '../vocabulary/brief.js';

export interface ExtendedDecomposition {
  d: DecomposeOutput;
  extension: Extension | null;
}

export function decomposeExtended(
  values: Float64Array,
  s: DecompositionSettings,
  reuse: ExtensionModel | null = null,
  fixed = false,
  fullEstimate = false,
): ExtendedDecomposition {
  if (!s.extension.on) return { d: runDecomposition(values, s), extension: null };
  const n = values.length;
  const multiplicative = s.model === 'multiplicative';
  const kind = reuse?.kind ?? s.extension.kind;
  const plain = kind === 'arima-on-adjusted' ? runDecomposition(values, s) : null;
  const extension = extendSeries(values, {
    periods: s.periods,
    horizon: s.extension.horizon,
    multiplicative,
    kind,
    seasonal: plain?.seasonal,
    reuse: reuse ?? undefined,
    fixed,
    full: fullEstimate,
  });
  if (extension.added === 0) return { d: plain ?? runDecomposition(values, s), extension };
  const full = runDecomposition(extension.values, s);
  const cut = (a: Float64Array) => a.slice(0, n);
  const d: DecomposeOutput = {
    trend: cut(full.trend),
    seasonal: cut(full.seasonal),
    remainder: cut(full.remainder),
    adjusted: cut(full.adjusted),
    seasonals: full.seasonals ? new Map([...full.seasonals].map(([p, v]) => [p, cut(v)])) : null,
    weights: full.weights ? cut(full.weights) : null,
    provisionalCount: full.provisionalCount,
  };
  return { d, extension };
}

/**
 * The model the calendar-and-events regression chose, as an extension model for the series it leaves
 * (adjust/extend.ts): its orders and ARMA coefficients, without the regressors. Null unless the extension
 * is a seasonal ARIMA of the regression's period (a daily series with a weekly cycle; the model on the
 * seasonally adjusted series of other frequencies is another model) or the regression's is non-seasonal.
 */
export function effectsModel(fit: ArimaFit, log: boolean, s: DecompositionSettings): ExtensionModel | null {
  if (!s.extension.on || s.extension.kind !== 'seasonal-arima') return null;
  const spec = fit.spec;
  const seasonal = spec.P + spec.D + spec.Q > 0;
  if (seasonal && spec.period !== seasonalPeriod(s.periods)) return null;
  const narma = spec.p + spec.q + spec.P + spec.Q;
  return {
    kind: 'seasonal-arima',
    spec: { ...spec, xreg: undefined, xregNames: undefined },
    coef: fit.coef.slice(0, narma),
    log,
  };
}
