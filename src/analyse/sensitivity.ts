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
 * When the fit is linear in the data (`affine`: no robustness weights, no logarithms), the last step is an
 * affine function of the appended value, a + b·x, so two fits (the start and the far end of the grid) fix
 * it and a third, at the grid's middle, checks it; the same search then runs on that line without fitting
 * again. Its decisions are the fits' own unless a trial's step lies within rounding of zero; where the check
 * disagrees by more than rounding the search fits every trial as before.
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
  /** lastStep is affine in the appended value (a fit linear in the data): searched on the line two fits give. */
  affine?: boolean;
}

/** How far (relative to the steps' size) a checked fit may stray from the line before the line is not trusted. */
export const AFFINE_AGREEMENT = 1e-9;

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
  let stepAt = lastStep;
  const turned = (x: number): boolean => (rising ? stepAt(x) < 0 : stepAt(x) > 0);
  // A rising trend turns down for low values: the boundary lies below `start`, unless even the expected
  // value already turns it, in which case it lies above (and the other way round for a falling trend).
  const side: 'below' | 'above' = rising ? 'below' : 'above';
  const f0 = lastStep(start);
  const startTurns = rising ? f0 < 0 : f0 > 0;
  const sign = (rising ? -1 : 1) * (startTurns ? -1 : 1);
  const at = (k: number): number => start + (sign * scale * k) / steps;
  // The last grid index whose trial is allowed.
  let last = steps;
  if (positiveOnly) while (last > 0 && at(last) <= 0) last--;
  if (last === 0) return { reversalValue: Number.NaN, side: 'none' };
  if (search.affine && last >= 2) stepAt = lineThrough(lastStep, start, f0, at(last), at(last >> 1));

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

/**
 * The step as a line through its values at x0 (f0, fitted already) and x1, when a fit at xm lies on that line
 * to within AFFINE_AGREEMENT of the steps' size; otherwise lastStep itself. At x0 and x1 the line gives the
 * fits' own values, so the search's first decisions are the fits' own.
 */
function lineThrough(
  lastStep: (x: number) => number,
  x0: number,
  f0: number,
  x1: number,
  xm: number,
): (x: number) => number {
  const f1 = lastStep(x1);
  const fm = lastStep(xm);
  const slope = (f1 - f0) / (x1 - x0);
  const size = Math.max(Math.abs(f0), Math.abs(f1), Math.abs(fm));
  const predicted = f0 + slope * (xm - x0);
  if (!Number.isFinite(slope) || !(Math.abs(predicted - fm) <= AFFINE_AGREEMENT * size)) return lastStep;
  return (x) => (x === x1 ? f1 : f0 + slope * (x - x0));
}
