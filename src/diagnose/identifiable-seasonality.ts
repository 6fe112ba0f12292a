/**
 * The combined test for the presence of identifiable seasonality (Lothian & Morry 1978, "A test for the
 * presence of identifiable seasonality when using the X-11 program", Statistics Canada research paper; as
 * run by X-11-ARIMA after its table D8 and described by Ladiray & Quenneville 2001, Seasonal Adjustment with
 * the X-11 Method, Springer, New York, its "combined test"). It asks whether a seasonal pattern can be told apart
 * from noise and from a pattern that moves too much to estimate, on the seasonal-irregular values SI:
 *
 * 1. the F test for stable seasonality F_S (stable-seasonality.ts) at the 0.1% level: not significant →
 *    no identifiable seasonality;
 * 2. T1 = 7 / F_S and T2 = 3·F_M / F_S, with F_M the moving-seasonality F (moving-seasonality.ts); when F_M
 *    is significant at the 5% level and T = (T1 + T2) / 2 ≥ 1 → no identifiable seasonality
 *    (√T is the M7 quality statistic of X-11-ARIMA);
 * 3. T1 ≥ 1 or T2 ≥ 1, or the Kruskal–Wallis test (kruskal-wallis.ts) not significant at the 0.1% level →
 *    identifiable seasonality probably not present;
 * 4. otherwise identifiable seasonality is present.
 *
 * The order of steps 2–3 and their levels are as we recall them from the sources above (from memory; the
 * levels 0.1%, 5%, 0.1% and the thresholds 7 and 3 are Lothian & Morry's). When F_M cannot be computed
 * (fewer than two whole cycles) step 2 is skipped and T2 is NaN.
 *
 * Steps 2 and the T1/T2 part of step 3 apply only to monthly and quarterly cycles (periods 12 and 4), for
 * which the thresholds 7 and 3 were set: with many seasons of few values each (365 days of a year, 168
 * hours of a week) F_S is small even for a plain pattern (a river's daily temperature: F_S ≈ 3.8 on 364
 * and 368 degrees of freedom, p ≈ 1e-35), and T1 would call it unidentifiable. For other periods the
 * verdict rests on the stable-seasonality F test and the Kruskal–Wallis test at their levels.
 *
 * SI is taken against a centred moving average of order `period` (2×period for an even period), X-11's
 * first trend estimate, so the verdict does not depend on the decomposition it decides about:
 * SI = 100·Y/T for a multiplicative model, Y − T for an additive one.
 *
 *   a seasonal sine of amplitude 10 in noise of sd 1 → F_S in the hundreds, T1 ≈ 0.01: present
 */
import { centredMovingAverage } from '../decompose/moving-average.js';
import type { IdentifiableSeasonality, IdentifiableVerdict } from '../vocabulary/seasonality.js';
import { kruskalWallis } from './kruskal-wallis.js';
import { movingSeasonalityTest } from './moving-seasonality.js';
import { stableSeasonalityTest } from './stable-seasonality.js';

export const IDENTIFIABLE_LEVELS = { stable: 0.001, moving: 0.05, kruskalWallis: 0.001 } as const;

/** Whether the T1/T2 thresholds apply: monthly and quarterly cycles, for which they were set. */
export function usesThresholds(period: number): boolean {
  return period === 12 || period === 4;
}

/** SI against the centred moving average of order `period`: 100·Y/T, or Y − T. */
export function seasonalIrregular(values: Float64Array, period: number, multiplicative: boolean): Float64Array {
  const trend = centredMovingAverage(values, period);
  const si = new Float64Array(values.length);
  for (let i = 0; i < values.length; i++) si[i] = multiplicative ? (100 * values[i]) / trend[i] : values[i] - trend[i];
  return si;
}

export function identifiableSeasonality(
  values: Float64Array,
  period: number,
  multiplicative: boolean,
): IdentifiableSeasonality {
  const si = seasonalIrregular(values, period, multiplicative);
  let from = -1;
  let to = -1;
  let count = 0;
  for (let i = 0; i < si.length; i++) {
    if (!Number.isFinite(si[i])) continue;
    if (from < 0) from = i;
    to = i;
    count++;
  }
  const stable = stableSeasonalityTest(si, period);
  const moving = movingSeasonalityTest(si, period, multiplicative ? 100 : 0);
  const kw = kruskalWallis(si, period);
  const t1 = 7 / stable.statistic;
  const t2 = (3 * moving.statistic) / stable.statistic;
  const m7 = Math.sqrt((t1 + t2) / 2);
  const L = IDENTIFIABLE_LEVELS;
  const base = { period, from, to, count, stable, moving, kruskalWallis: kw, t1, t2, m7, levels: L };
  const verdict = (v: IdentifiableVerdict, by: IdentifiableSeasonality['decidedBy']): IdentifiableSeasonality => ({
    ...base,
    verdict: v,
    decidedBy: by,
  });
  if (!(stable.pValue < L.stable)) return verdict('none', 'stable');
  if (usesThresholds(period)) {
    if (moving.pValue < L.moving && (t1 + t2) / 2 >= 1) return verdict('none', 'moving');
    if (t1 >= 1) return verdict('probably-none', 't1');
    if (t2 >= 1) return verdict('probably-none', 't2');
  }
  if (!(kw.pValue < L.kruskalWallis)) return verdict('probably-none', 'kruskal-wallis');
  return verdict('present', 'all');
}
