/**
 * How a series' changes are put in words, resolved once from the job's `change_as` and the data:
 * 'relative' (a percent of the earlier value) or 'absolute' (in the series' units; percentage points for a
 * series in %). The default is absolute when a percent would mislead: the unit is itself a percent or
 * points (a share or a rate in %: "down 24.7%" of a percentage is ambiguous), the unit is a temperature (its
 * zero is arbitrary), or any value is zero or negative (a percent of such a level is undefined or flips
 * sign). Otherwise relative. Our stated rule; a percent change of a level that can be ≤ 0 is undefined
 * (FPP 3rd ed., §5.1 on growth rates).
 *
 *   resolveChangeExpression('auto', 'ML', [3, 4]) → relative      ('auto', '%', [3, 4]) → absolute
 */
import type { ChangeExpression } from '../vocabulary/claims.js';

export type ChangeAs = 'auto' | 'percent' | 'units';

const PERCENT_UNITS = /^(%|percent|per ?cent|pct|pp|p\.p\.|points?|percentage points?|% points?)$/i;
// °, ℃ and ℉ written as escapes: the bundled script is ASCII only (scripts/bundle.mjs).
const TEMPERATURE_UNITS =
  /^(\u00b0\s?[CF]|\u2103|\u2109|deg ?[CF]|degrees?( [CF]| celsius| fahrenheit)?|celsius|fahrenheit)$/i;

export function resolveChangeExpression(
  setting: ChangeAs,
  unit: string,
  values: ArrayLike<number>,
): { expression: ChangeExpression; reason: string } {
  if (setting === 'percent') return { expression: 'relative', reason: 'set in the job (change_as: percent)' };
  if (setting === 'units') return { expression: 'absolute', reason: 'set in the job (change_as: units)' };
  const u = unit.trim();
  if (PERCENT_UNITS.test(u)) {
    return { expression: 'absolute', reason: 'the unit is a percent, so changes are given in percentage points' };
  }
  if (TEMPERATURE_UNITS.test(u)) {
    return {
      expression: 'absolute',
      reason: 'the unit is a temperature, whose zero is arbitrary, so changes are given in units',
    };
  }
  for (let i = 0; i < values.length; i++) {
    if (values[i] <= 0) {
      return { expression: 'absolute', reason: 'the data hold zero or negative values, so changes are given in units' };
    }
  }
  return { expression: 'relative', reason: 'all values are positive, so changes are given as percentages' };
}
