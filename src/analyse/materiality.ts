/**
 * The one materiality rule behind every direction word of a brief (headline, key figures, tiles): is the
 * trend's change over a year large enough to call rising or falling, or is it broadly unchanged?
 *
 * - With a revision study (at least MIN_REVISIONS first estimates compared with later ones): the change is
 *   broadly unchanged when zero lies inside change + [low, high], where [low, high] is the 10th–90th
 *   percentile range (quantile type 7, Hyndman & Fan 1996) of past revisions measured as later minus
 *   earlier estimate (the convention of official revision analysis, e.g. Findley et al. 1998, JBES 16(2)).
 *   The range may be one-sided; it is used as it is.
 * - Without one: broadly unchanged when |change| is at most the noise of one period, 1.4826·MAD of the
 *   misfit observed − (trend with season) in units (Hampel 1974), as a percent of the trend a year earlier
 *   when the change is relative. Our stated rule.
 *
 *   change +0.4 with revisions range [−0.6, 0.3] → 0.4 + [−0.6, 0.3] = [−0.2, 0.7] holds 0: broadly unchanged
 */

import { robustScale } from '../diagnose/robust-scale.js';
import type { Revision } from '../vocabulary/brief.js';
import type { DirectionWord, Materiality } from '../vocabulary/claims.js';
import { quantile } from './revisions.js';

export const MIN_REVISIONS = 4;

export interface MaterialityInput {
  revisions: Revision[];
  observed: ArrayLike<number>;
  trend: ArrayLike<number>;
  seasonal: ArrayLike<number>;
  multiplicative: boolean;
  /** The trend a year before the reporting period: the base of a relative change. */
  base: number;
  relative: boolean;
}

export function materialityOf(m: MaterialityInput): Materiality {
  if (m.revisions.length >= MIN_REVISIONS) {
    const later = m.revisions.map((r) => r.latest - r.first);
    return { rule: 'revision-range', low: quantile(later, 0.1), high: quantile(later, 0.9) };
  }
  const misfit = Array.from(m.observed, (y, i) =>
    m.multiplicative ? y - m.trend[i] * m.seasonal[i] : y - m.trend[i] - m.seasonal[i],
  );
  const noise = robustScale(misfit).mad;
  const high = m.relative ? (100 * noise) / m.base : noise;
  return { rule: 'noise', low: -high, high };
}

/** The direction word a change earns under its materiality. */
export function directionOf(change: number, m: Materiality): DirectionWord | 'unknown' {
  if (!Number.isFinite(change) || !Number.isFinite(m.low) || !Number.isFinite(m.high)) {
    return Number.isFinite(change) ? (change > 0 ? 'rising' : change < 0 ? 'falling' : 'broadly-unchanged') : 'unknown';
  }
  if (m.rule === 'revision-range') {
    return change + m.low <= 0 && 0 <= change + m.high ? 'broadly-unchanged' : change > 0 ? 'rising' : 'falling';
  }
  return Math.abs(change) <= m.high ? 'broadly-unchanged' : change > 0 ? 'rising' : 'falling';
}
