/**
 * Which way the trend is moving at a period and for how many periods in a row it has moved that way.
 * "Flat" when the period-on-period change is within 1e-9 of the level (numerically no change).
 *
 *   trendDirection([1, 2, 3, 3.5], 3) → rising for 3 periods (+1, +1, +0.5)
 */
import type { Direction } from '../vocabulary/brief.js';

export function stepDirection(values: ArrayLike<number>, t: number): Direction | null {
  const d = values[t] - values[t - 1];
  if (Number.isNaN(d)) return null;
  if (Math.abs(d) <= 1e-9 * Math.max(1, Math.abs(values[t]))) return 'flat';
  return d > 0 ? 'rising' : 'falling';
}

export function trendDirection(values: ArrayLike<number>, index: number): { direction: Direction; run: number } {
  const direction = index >= 1 ? stepDirection(values, index) : null;
  if (direction === null) return { direction: 'flat', run: 0 };
  let run = 0;
  for (let t = index; t >= 1 && stepDirection(values, t) === direction; t--) run++;
  return { direction, run };
}
