/**
 * A comparison of two spans: raw, seasonally adjusted and trend values combined over each span — summed
 * for flows (deliveries, orders), averaged for levels and rates — then the change and percent change.
 * A missing value inside a span makes that total undefined rather than quietly smaller.
 *
 *   sum of [10, 20] against [10, 10] → 30 against 20: change 10, percent 50
 */
import type { ComparisonValues } from '../vocabulary/brief.js';
import type { Aggregation } from '../vocabulary/settings.js';
import { percentChange } from './change.js';
import type { Span } from './spans.js';

export function combine(values: ArrayLike<number>, span: Span, start: number, how: Aggregation): number {
  const from = span.from - start;
  const to = span.to - start;
  if (from < 0 || to >= values.length || to < from) return Number.NaN;
  let s = 0;
  for (let i = from; i <= to; i++) s += values[i];
  return how === 'sum' ? s : s / (to - from + 1);
}

export function compareSpans(
  values: ArrayLike<number>,
  current: Span,
  baseline: Span,
  start: number,
  how: Aggregation,
): ComparisonValues {
  const c = combine(values, current, start, how);
  const b = combine(values, baseline, start, how);
  return { current: c, baseline: b, change: c - b, percent: percentChange(c, b) };
}
