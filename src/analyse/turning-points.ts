/**
 * Turning points of the trend. Our rule, stated in the brief: a peak (trough) is a period after which the
 * trend falls (rises) for at least two periods, having risen (fallen) for at least two periods before it —
 * a change of slope sign that lasts. Periods of no change are skipped over. This follows the spirit of the
 * Bry & Boschan (1971) minimum-phase rule, scaled down to a smoothed trend.
 *
 *   [1, 2, 3, 2, 1] → a peak at index 2
 */
import type { TurningPoint } from '../vocabulary/brief.js';
import { stepDirection } from './direction.js';

export const TURNING_POINT_RULE =
  'a turning point is a period after which the trend moved the other way for at least two periods, having moved its way for at least two periods before';

export function turningPoints(trend: ArrayLike<number>, dates: string[], minRun = 2): TurningPoint[] {
  // The steps that moved, as two typed arrays (where, and which way) rather than an object each, and the
  // runs read in place rather than sliced out: on a long series both were tens of megabytes of garbage.
  const at = new Int32Array(Math.max(0, trend.length - 1));
  const up = new Uint8Array(at.length);
  let count = 0;
  for (let t = 1; t < trend.length; t++) {
    const d = stepDirection(trend, t);
    if (d === 'rising' || d === 'falling') {
      at[count] = t;
      up[count++] = d === 'rising' ? 1 : 0;
    }
  }
  /** Whether the steps from … from + minRun − 1 all went the way `way` (1 up, 0 down). */
  const all = (from: number, way: number): boolean => {
    for (let i = from; i < from + minRun; i++) if (up[i] !== way) return false;
    return true;
  };
  const out: TurningPoint[] = [];
  for (let k = minRun; k + minRun <= count; k++) {
    const wasUp = all(k - minRun, 1);
    const wasDown = all(k - minRun, 0);
    const nowDown = all(k, 0);
    const nowUp = all(k, 1);
    if ((wasUp && nowDown) || (wasDown && nowUp)) {
      // The turn is at the period the last pre-turn step arrived at.
      const index = at[k - 1];
      out.push({ index, date: dates[index], kind: wasUp ? 'peak' : 'trough', value: trend[index] });
    }
  }
  return out;
}
