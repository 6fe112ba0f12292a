/**
 * A band scale: n equal bands across a range, with inner padding between bands and outer padding at the
 * ends, each a fraction of the step.
 *
 * Source: d3-scale's `scaleBand` (Mike Bostock, d3-scale 4.0, src/band.js, ISC licence), unrounded:
 * step = span / max(1, n − paddingInner + 2·paddingOuter), bandwidth = step·(1 − paddingInner), and the
 * bands are placed `align` of the way into what the step leaves over. Our bars use vega-lite's defaults for
 * bar charts, paddingInner 0.1 and paddingOuter 0.05, centred (align 0.5).
 *
 *   bandScale(3, 0, 100, 0.1, 0.05) → step 100/3 = 33.33, bandwidth 30, first band at 1.67
 */

export interface BandScale {
  /** Left edge of band i. */
  start: (i: number) => number;
  /** Centre of band i. */
  centre: (i: number) => number;
  bandwidth: number;
  step: number;
}

export function bandScale(
  n: number,
  r0: number,
  r1: number,
  paddingInner = 0.1,
  paddingOuter = 0.05,
  align = 0.5,
): BandScale {
  const span = r1 - r0;
  const step = span / Math.max(1, n - paddingInner + 2 * paddingOuter);
  const first = r0 + (span - step * (n - paddingInner)) * align;
  const bandwidth = step * (1 - paddingInner);
  return {
    start: (i) => first + step * i,
    centre: (i) => first + step * i + bandwidth / 2,
    bandwidth,
    step,
  };
}
