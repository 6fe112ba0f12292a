/**
 * The seasonally adjusted series forced to the raw data's totals over each whole year (calendar years, or
 * financial years from `yearStartMonth`), by Denton's proportional first-difference method (denton.ts).
 * Only whole years with every raw and adjusted value present are forced; a year the data hold only in
 * part (at either end) or with a missing value is left free, so its adjusted values follow the nearest
 * forced year's ratio of adjusted to decomposed (the manual's extrapolation), and say nothing of its total.
 *
 *   monthly data January 2020 – June 2022: 2020 and 2021 are forced, January–June 2022 is carried on.
 */
import { type Frequency, startOf } from '../vocabulary/period-index.js';
import { dentonProportional } from './denton.js';

export interface YearlyTotals {
  /** The benchmarked adjusted series; the decomposition's own where nothing could be forced. */
  adjusted: Float64Array;
  /** The whole years forced, as inclusive index ranges, with the year each starts in. */
  years: { from: number; to: number; startYear: number }[];
  /** Why nothing was forced, in words; null when some year was. */
  skipped: string | null;
}

/** The year a period belongs to, named by the calendar year it starts in. */
export function yearOfPeriod(frequency: Frequency, ordinal: number, yearStartMonth: number): number {
  const d = new Date(startOf(frequency, ordinal));
  return d.getUTCMonth() + 1 >= yearStartMonth ? d.getUTCFullYear() : d.getUTCFullYear() - 1;
}

export function matchYearlyTotals(
  observed: Float64Array,
  adjusted: Float64Array,
  frequency: Frequency,
  start: number,
  yearStartMonth: number,
): YearlyTotals {
  const n = observed.length;
  const key = (i: number) => yearOfPeriod(frequency, start + i, yearStartMonth);
  const years: YearlyTotals['years'] = [];
  let gaps = false;
  let from = 0;
  while (from < n) {
    const k = key(from);
    let to = from;
    while (to + 1 < n && key(to + 1) === k) to++;
    // Whole: the period before the first and the one after the last belong to other years.
    const whole = key(from - 1) !== k && key(to + 1) !== k;
    let present = true;
    for (let i = from; i <= to; i++)
      if (!Number.isFinite(observed[i]) || !Number.isFinite(adjusted[i])) present = false;
    if (whole && !present) gaps = true;
    if (whole && present) years.push({ from, to, startYear: k });
    from = to + 1;
  }
  const unchanged = (skipped: string): YearlyTotals => ({ adjusted, years: [], skipped });
  if (years.length === 0) {
    return unchanged(
      gaps ? 'every whole year in the data has a missing value' : 'the data hold no whole year to match',
    );
  }
  for (const y of years) {
    for (let i = y.from; i <= y.to; i++) {
      if (!(adjusted[i] > 0)) {
        return unchanged(
          'the seasonally adjusted series has zero or negative values, and the proportional method needs positive ones',
        );
      }
    }
  }
  const block = new Int32Array(n).fill(-1);
  const totals = new Float64Array(years.length);
  years.forEach((y, b) => {
    let s = 0;
    for (let i = y.from; i <= y.to; i++) {
      block[i] = b;
      s += observed[i];
    }
    totals[b] = s;
  });
  const benchmarked = dentonProportional(adjusted, block, totals);
  if (!benchmarked.some(Number.isFinite)) return unchanged('the benchmarking system could not be solved');
  return { adjusted: benchmarked, years, skipped: null };
}
