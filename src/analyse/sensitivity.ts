/**
 * How close the trend is to turning: the raw value next period would need for the trend's direction to
 * reverse. A trial value is appended, the series decomposed again, and the new last step of the trend
 * read; bisection (Burden & Faires, Numerical Analysis, §2.1) finds the value at which that step changes
 * sign. A lower value pulls the end of the trend down, so the search runs on one side only: below the
 * expected value for a rising trend, above it for a falling one.
 *
 *   rising trend, appended values below 80 make the last step negative → reversalValue ≈ 80, side 'below'
 */
import type { Direction } from '../brief/model.js';

export interface SensitivityResult {
  reversalValue: number;
  side: 'below' | 'above' | 'none';
}

/**
 * `lastStep(x)` decomposes the series with x appended and returns trend[n] − trend[n − 1]. The search steps
 * away from `start` in `steps` equal steps up to `scale` (a robust fit ignores values far outside
 * the usual range, so the effect of x need not grow without bound), then bisects between the last trial
 * that left the direction alone and the first that reversed it. `positiveOnly` keeps trials above zero
 * (multiplicative models).
 */
export function reversalValue(
  direction: Direction,
  start: number,
  scale: number,
  positiveOnly: boolean,
  lastStep: (x: number) => number,
  steps = 40,
  iterations = 30,
): SensitivityResult {
  if (direction === 'flat' || !(scale > 0) || !Number.isFinite(start))
    return { reversalValue: Number.NaN, side: 'none' };
  const rising = direction === 'rising';
  const turned = (x: number): boolean => (rising ? lastStep(x) < 0 : lastStep(x) > 0);
  // A rising trend turns down for low values: the boundary lies below `start`, unless even the expected
  // value already turns it, in which case it lies above (and the other way round for a falling trend).
  const side: 'below' | 'above' = rising ? 'below' : 'above';
  const startTurns = turned(start);
  const sign = (rising ? -1 : 1) * (startTurns ? -1 : 1);
  let inside = start; // last trial on the start's side of the boundary
  let outside = Number.NaN;
  for (let k = 1; k <= steps; k++) {
    const x = start + (sign * scale * k) / steps;
    if (positiveOnly && x <= 0) break;
    if (turned(x) !== startTurns) {
      outside = x;
      break;
    }
    inside = x;
  }
  if (Number.isNaN(outside)) return { reversalValue: Number.NaN, side: 'none' };
  let near = inside;
  let far = outside;
  for (let k = 0; k < iterations; k++) {
    const mid = (near + far) / 2;
    if (turned(mid) === startTurns) near = mid;
    else far = mid;
  }
  return { reversalValue: (near + far) / 2, side };
}
