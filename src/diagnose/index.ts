/** The diagnostics of one decomposition: strengths, unusual periods, residual and identifiable seasonality. */
import type { Diagnostics, Outlier } from '../vocabulary/brief.js';
import type { IdentifiableSeasonality } from '../vocabulary/seasonality.js';
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
  /** The combined test for identifiable seasonality of each period, run before decomposing. */
  identifiable: IdentifiableSeasonality[];
  /** Whether the season was removed; when not, there is no adjusted series to test for residual seasonality. */
  seasonAdjusted?: boolean;
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
    residualSeasonality:
      d.seasonAdjusted === false ? residualSeasonality([], d.period) : residualSeasonality(d.adjusted, d.period),
    identifiableSeasonality: d.identifiable,
  };
}
