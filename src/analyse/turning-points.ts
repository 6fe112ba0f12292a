/**
 * Turning points of the trend. Our rule, stated in the brief: a peak (trough) is a period after which the
 * trend falls (rises) for at least two periods, having risen (fallen) for at least two periods before it —
 * a change of slope sign that lasts. Periods of no change are skipped over. This follows the spirit of the
 * Bry & Boschan (1971) minimum-phase rule, scaled down to a smoothed trend.
 *
 *   [1, 2, 3, 2, 1] → a peak at index 2
 */
import type { TurningPoint } from '../brief/model.js';
import { stepDirection } from './direction.js';

export const TURNING_POINT_RULE =
  'a turning point is a period after which the trend moved the other way for at least two periods, having moved its way for at least two periods before';

export function turningPoints(trend: ArrayLike<number>, dates: string[], minRun = 2): TurningPoint[] {
  const signs: { t: number; up: boolean }[] = [];
  for (let t = 1; t < trend.length; t++) {
    const d = stepDirection(trend, t);
    if (d === 'rising' || d === 'falling') signs.push({ t, up: d === 'rising' });
  }
  const out: TurningPoint[] = [];
  for (let k = minRun; k + minRun <= signs.length; k++) {
    const before = signs.slice(k - minRun, k);
    const after = signs.slice(k, k + minRun);
    const wasUp = before.every((s) => s.up);
    const wasDown = before.every((s) => !s.up);
    const nowDown = after.every((s) => !s.up);
    const nowUp = after.every((s) => s.up);
    if ((wasUp && nowDown) || (wasDown && nowUp)) {
      // The turn is at the period the last pre-turn step arrived at.
      const index = before[minRun - 1].t;
      out.push({ index, date: dates[index], kind: wasUp ? 'peak' : 'trough', value: trend[index] });
    }
  }
  return out;
}
