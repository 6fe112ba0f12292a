/**
 * The decomposition a brief uses, with forecast extension when the settings ask for it: extend the series
 * by forecasts (adjust/extend.ts), decompose the extended series, keep every component only up to the last
 * observation. The model on the seasonally adjusted series takes its seasonal component from a first
 * decomposition without extension. For the revision study's shorter series, `reuse` re-estimates the
 * chosen orders instead of selecting a model again; `fixed` keeps its coefficients too (the sensitivity
 * check, which adds one value to the series many times over).
 */
import { type Extension, type ExtensionModel, extendSeries } from '../adjust/extend.js';
import { runDecomposition } from '../decompose/index.js';
import type { DecomposeOutput } from '../decompose/output.js';
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
