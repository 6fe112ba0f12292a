/**
 * How close the trend is to turning: the raw value next period would need for the trend's direction to
 * reverse. A trial value is appended, the series decomposed again, and the new last step of the trend
 * read; bisection (Burden & Faires, Numerical Analysis, §2.1) finds the value at which that step changes
 * sign. A lower value pulls the end of the trend down, so the search runs on one side only: below the
 * expected value for a rising trend, above it for a falling one.
 *
 * The search, exactly: trials lie on a grid of `steps` equal steps from the expected value out to `scale`;
 * the boundary is the first grid cell, counted outward, whose ends disagree on whether the trend turns, and
 * that cell is bisected until it is narrower than 0.05% of the value (RELATIVE_TOLERANCE; at most 30
 * halvings), and its midpoint returned, within 0.025% of the boundary. The brief prints the value to three or
 * four figures: that is the boundary's own figure, or one unit off in the last digit when the boundary lies
 * next to a rounding edge. When the decomposition is known to turn the step's
 * sign at most once along the search (`singleCrossing`: decompositions linear in the data, or linear in
 * their logarithms), the first such cell is the only one, and a binary search over the grid finds it in
 * about log₂(steps) trials instead of walking every step; robust fits can turn the sign back (a far-off
 * trial is down-weighted), so they gallop (`gallop`): probes at grid steps 1, 2, 4, 8, … and the last, then a
 * binary search of the first interval whose far end has turned. That is the walk's answer unless the sign
 * turns and turns back between two probes; on the examples, the open datasets of the verifier's corpus and
 * bench/brief-12.yaml it gives the walk's value to the last bit (test/brief/refits.test.ts).
 *
 *   rising trend, appended values below 80 make the last step negative → reversalValue ≈ 80, side 'below'
 */
import type { Direction } from '../vocabulary/brief.js';

export interface SensitivityResult {
  reversalValue: number;
  side: 'below' | 'above' | 'none';
}

export interface ReversalSearch {
  /** Equal steps from the start out to `scale` (default 40). */
  steps?: number;
  /** The step's sign changes at most once along the search: a binary search over the grid is exact. */
  singleCrossing?: boolean;
  /**
   * Where the sign may turn back (robust fits), probe grid steps 1, 2, 4, 8, … and the last instead of every
   * step, then binary-search the first interval whose far end has turned. Equal to the walk wherever the
   * sign turns at most once up to that probe; test/brief/refits.test.ts measures how far it strays.
   */
  gallop?: boolean;
}

/** Bisection stops once the bracket is narrower than this share of the value. */
export const RELATIVE_TOLERANCE = 5e-4;
/** Most halvings, whatever the value (a boundary at zero would otherwise never meet a relative width). */
const MAX_HALVINGS = 30;

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
  search: ReversalSearch = {},
): SensitivityResult {
  if (direction === 'flat' || !(scale > 0) || !Number.isFinite(start))
    return { reversalValue: Number.NaN, side: 'none' };
  const steps = search.steps ?? 40;
  const rising = direction === 'rising';
  const turned = (x: number): boolean => (rising ? lastStep(x) < 0 : lastStep(x) > 0);
  // A rising trend turns down for low values: the boundary lies below `start`, unless even the expected
  // value already turns it, in which case it lies above (and the other way round for a falling trend).
  const side: 'below' | 'above' = rising ? 'below' : 'above';
  const startTurns = turned(start);
  const sign = (rising ? -1 : 1) * (startTurns ? -1 : 1);
  const at = (k: number): number => start + (sign * scale * k) / steps;
  // The last grid index whose trial is allowed.
  let last = steps;
  if (positiveOnly) while (last > 0 && at(last) <= 0) last--;
  if (last === 0) return { reversalValue: Number.NaN, side: 'none' };

  // Grid indices lo (start's side) and hi (across) halved to neighbours: [inside, outside].
  const narrow = (lo: number, hi: number): [number, number] => {
    while (hi - lo > 1) {
      const mid = (lo + hi) >> 1;
      if (turned(at(mid)) === startTurns) lo = mid;
      else hi = mid;
    }
    return [lo, hi];
  };
  // inside: a grid index on the start's side of the boundary; outside: the next one, across it.
  let inside = 0;
  let outside = -1;
  if (search.singleCrossing) {
    if (turned(at(last)) !== startTurns) [inside, outside] = narrow(0, last);
  } else if (search.gallop) {
    let near = 0;
    for (let k = 1; ; k = Math.min(2 * k, last)) {
      if (turned(at(k)) !== startTurns) {
        [inside, outside] = narrow(near, k);
        break;
      }
      near = k;
      if (k === last) break;
    }
  } else {
    for (let k = 1; k <= last; k++) {
      if (turned(at(k)) !== startTurns) {
        outside = k;
        break;
      }
      inside = k;
    }
  }
  if (outside < 0) return { reversalValue: Number.NaN, side: 'none' };
  let near = at(inside);
  let far = at(outside);
  for (let k = 0; k < MAX_HALVINGS; k++) {
    if (Math.abs(far - near) < RELATIVE_TOLERANCE * Math.max(Math.abs(near), Math.abs(far))) break;
    const mid = (near + far) / 2;
    if (turned(mid) === startTurns) near = mid;
    else far = mid;
  }
  return { reversalValue: (near + far) / 2, side };
}
