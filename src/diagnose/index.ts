/** The diagnostics of one decomposition: strengths, unusual periods and residual seasonality. */
import type { Diagnostics, Outlier } from '../brief/model.js';
import { remainderOutliers } from './outliers.js';
import { residualSeasonality } from './residual-seasonality.js';
import { componentStrength } from './strength.js';

export interface DiagnoseInput {
  observed: ArrayLike<number>;
  trend: ArrayLike<number>;
  seasonal: ArrayLike<number>;
  remainder: ArrayLike<number>;
  adjusted: ArrayLike<number>;
  period: number;
  multiplicative: boolean;
  dates: string[];
}

export function diagnose(d: DiagnoseInput): Diagnostics {
  const scale = (v: ArrayLike<number>): ArrayLike<number> => (d.multiplicative ? Array.from(v, Math.log) : v);
  const remainder = scale(d.remainder);
  const outliers: Outlier[] = remainderOutliers(d.remainder, d.multiplicative).map((o) => ({
    index: o.index,
    date: d.dates[o.index],
    observed: d.observed[o.index],
    remainder: d.remainder[o.index],
    score: o.score,
  }));
  return {
    trendStrength: componentStrength(scale(d.trend), remainder),
    seasonalStrength: componentStrength(scale(d.seasonal), remainder),
    outliers,
    residualSeasonality: residualSeasonality(d.adjusted, d.period),
  };
}
