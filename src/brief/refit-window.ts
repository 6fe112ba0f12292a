/**
 * A bound on the data each re-fit of a long series sees. The firmness study re-fits the series cut at each
 * of its cut-off periods, and the sensitivity search re-fits it with one trial value appended, tens of
 * times in all; on a million hourly values each fit takes seconds, and the brief minutes. STL's and MSTL's
 * smoothers are local regressions (Cleveland, Cleveland, McRae & Terpenning 1990, J. Official Statistics
 * 6(1), §2), so a re-fit on the latest stretch of data gives nearly the estimates a re-fit on all of it
 * gives: measured on an hourly series (test/brief/refit-window.test.ts), the year-earlier value to 1e-5 of
 * the level and the end value to 0.25%. The stretch is three years (two years of data before the
 * year-earlier period the change is measured from) or twenty of the longest seasonal cycles, whichever is
 * longer; only series longer than REFIT_BOUND_FROM periods are bounded, so no brief of monthly, quarterly,
 * weekly or daily data changes, and the method appendix says when a brief's re-fits were bounded.
 *
 *   refitWindow(1_200_000, 8736, 168) → 26,208 (three years of hours);  refitWindow(120, 12, 12) → null
 */

/** Series up to this many periods are re-fitted whole. */
export const REFIT_BOUND_FROM = 40_000;

/** Periods each re-fit sees, or null when the series is re-fitted whole. */
export function refitWindow(length: number, yearLag: number, longestPeriod: number): number | null {
  if (length <= REFIT_BOUND_FROM) return null;
  const window = Math.max(3 * yearLag, 20 * longestPeriod);
  return window < length ? window : null;
}

/**
 * A fit that sees only the last `window` values of what it is given; the trend it returns has the length of
 * the input, NaN before the window (never used: every reader looks a year back from the end at most).
 */
export function windowedTrendOf(
  refit: (values: Float64Array) => Float64Array,
  window: number | null,
): (values: Float64Array) => Float64Array {
  if (window === null) return refit;
  return (values) => {
    if (values.length <= window) return refit(values);
    const part = refit(values.subarray(values.length - window));
    const out = new Float64Array(values.length).fill(Number.NaN);
    out.set(part, values.length - window);
    return out;
  };
}
