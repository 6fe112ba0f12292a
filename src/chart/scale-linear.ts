/**
 * A linear scale for a value axis: tick values, a "nice" domain and the pixel padding of a domain.
 *
 * Ticks: the step rule of d3-array's `ticks` / `tickIncrement` (Mike Bostock, d3-array 3.2, src/ticks.js,
 * ISC licence): the raw step (stop − start) / count is rounded to 1, 2, 5 or 10 times a power of ten, the
 * factor chosen by comparing the step's mantissa with √50, √10 and √2; for steps under 1 the tick values
 * are computed as integers divided by the inverse step, so 0.1 + 0.2 never prints as 0.30000000000000004.
 * Nice domain: d3-scale's `linear.nice(count)` (Bostock, d3-scale 4.0, src/linear.js): widen the domain to
 * multiples of the tick step until the step no longer changes. Padding: vega's pixel padding of a
 * continuous domain (Heer et al., vega-encode 4, src/Scale.js `padDomain` with vega-util's `zoomLinear`).
 *
 *   ticks(0, 10, 5)               → [0, 2, 4, 6, 8, 10]
 *   niceDomain(3751, 6777, 10)    → [3500, 7000]   (step 200 gives [3600, 6800], whose step is 500)
 *   ticks(3500, 7000, 5)          → [3500, 4000, …, 7000]
 */

const E10 = Math.sqrt(50);
const E5 = Math.sqrt(10);
const E2 = Math.sqrt(2);

/** [first, last, increment]: ticks are first…last times the increment, or divided by −increment when < 0. */
function tickSpec(start: number, stop: number, count: number): [number, number, number] {
  const step = (stop - start) / Math.max(0, count);
  const power = Math.floor(Math.log10(step));
  const error = step / 10 ** power;
  const factor = error >= E10 ? 10 : error >= E5 ? 5 : error >= E2 ? 2 : 1;
  let i1: number;
  let i2: number;
  let inc: number;
  if (power < 0) {
    inc = 10 ** -power / factor;
    i1 = Math.round(start * inc);
    i2 = Math.round(stop * inc);
    if (i1 / inc < start) ++i1;
    if (i2 / inc > stop) --i2;
    inc = -inc;
  } else {
    inc = 10 ** power * factor;
    i1 = Math.round(start / inc);
    i2 = Math.round(stop / inc);
    if (i1 * inc < start) ++i1;
    if (i2 * inc > stop) --i2;
  }
  if (i2 < i1 && 0.5 <= count && count < 2) return tickSpec(start, stop, count * 2);
  return [i1, i2, inc];
}

/** About `count` round values from start to stop inclusive, ascending (start ≤ stop). */
export function ticks(start: number, stop: number, count: number): number[] {
  if (!(count > 0) || !Number.isFinite(start) || !Number.isFinite(stop)) return [];
  if (start === stop) return [start];
  const reverse = stop < start;
  const [i1, i2, inc] = reverse ? tickSpec(stop, start, count) : tickSpec(start, stop, count);
  if (!(i2 >= i1)) return [];
  const n = i2 - i1 + 1;
  const out = new Array<number>(n);
  for (let i = 0; i < n; i++) {
    const k = reverse ? i2 - i : i1 + i;
    out[i] = inc < 0 ? k / -inc : k * inc;
  }
  return out;
}

/** The tick step as d3 encodes it: positive for steps ≥ 1, −1/step for smaller ones. */
export function tickIncrement(start: number, stop: number, count: number): number {
  return tickSpec(start, stop, count)[2];
}

/** The tick step itself (0.5, 2, 500). */
export function tickStep(start: number, stop: number, count: number): number {
  const reverse = stop < start;
  const inc = reverse ? tickIncrement(stop, start, count) : tickIncrement(start, stop, count);
  return (reverse ? -1 : 1) * (inc < 0 ? 1 / -inc : inc);
}

/**
 * The domain widened to whole tick steps for about `count` ticks (d3's default count is 10). As in d3, the
 * widened domain is taken only once the step has settled (within ten rounds); else the domain stays as given.
 */
export function niceDomain(lo: number, hi: number, count = 10): [number, number] {
  let start = Math.min(lo, hi);
  let stop = Math.max(lo, hi);
  let prestep: number | undefined;
  for (let iter = 0; iter < 10; iter++) {
    const step = tickIncrement(start, stop, count);
    if (step === prestep) return lo <= hi ? [start, stop] : [stop, start];
    if (step > 0) {
      start = Math.floor(start / step) * step;
      stop = Math.ceil(stop / step) * step;
    } else if (step < 0) {
      start = Math.ceil(start * step) / step;
      stop = Math.floor(stop * step) / step;
    } else break;
    prestep = step;
  }
  return [lo, hi];
}

/**
 * The domain widened about its middle so that its ends sit `pad` px inside a range `span` px long
 * (vega's scale padding): [0, 10] over 100 px with 10 px padding → [−1.25, 11.25].
 */
export function padDomain(lo: number, hi: number, span: number, pad: number): [number, number] {
  if (!(pad > 0) || lo === hi || !(span > 2 * pad)) return [lo, hi];
  const k = span / (span - 2 * pad);
  const mid = (lo + hi) / 2;
  return [mid + (lo - mid) * k, mid + (hi - mid) * k];
}

/** A value → px map from [d0, d1] onto [r0, r1]; a one-point domain maps to the middle of the range. */
export function linearScale(d0: number, d1: number, r0: number, r1: number): (value: number) => number {
  if (d0 === d1) {
    const mid = (r0 + r1) / 2;
    return () => mid;
  }
  const k = (r1 - r0) / (d1 - d0);
  return (value) => r0 + (value - d0) * k;
}

/** Digits after the decimal mark that a tick step needs: 500 → 0, 0.5 → 1, 0.05 → 2 (d3-format's precisionFixed). */
export function stepDecimals(step: number): number {
  const a = Math.abs(step);
  if (!(a > 0) || !Number.isFinite(a)) return 0;
  return Math.max(0, -Math.floor(Math.log10(a) + 1e-9));
}
