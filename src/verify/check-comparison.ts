/**
 * Check of a comparison: each span holds the periods it says, the values are the sum (flows) or mean
 * (levels) of the data over it, the changes are those of the data and of the seasonally adjusted series,
 * a percent is only ever of a positive baseline, and a baseline called "a year before" is one.
 */
import type { ClaimSpan, ComparisonClaim } from '../vocabulary/claims.js';
import type { VerifyContext } from './context.js';
import { agrees } from './numbers.js';
import { isIsoWeekYearBefore, isSameWeekdayYearBefore, isYearBefore } from './year-back.js';

function combined(values: number[], from: number, to: number, how: 'sum' | 'mean'): number {
  let s = 0;
  for (let i = from; i <= to; i++) s += values[i];
  return how === 'sum' ? s : s / (to - from + 1);
}

function spanProblem(name: string, span: ClaimSpan, ctx: VerifyContext): string | null {
  const a = ctx.indexOf(span.from);
  const b = ctx.indexOf(span.to);
  if (a < 0 || b < 0) return `the ${name} span ${span.from}–${span.to} lies outside the data`;
  if (b - a + 1 !== span.periods) return `the ${name} span holds ${b - a + 1} periods, not ${span.periods}`;
  if (b > ctx.s.reportingIndex) return `the ${name} span reaches past the reporting period`;
  return null;
}

function changeOf(expression: 'relative' | 'absolute', now: number, base: number): number {
  if (expression === 'absolute') return now - base;
  return base > 0 ? 100 * (now / base - 1) : Number.NaN;
}

export function checkComparison(c: ComparisonClaim, ctx: VerifyContext): string[] {
  const out: string[] = [];
  const k = ctx.s.components;
  for (const [name, span] of [
    ['current', c.current],
    ['baseline', c.baseline],
  ] as const) {
    const p = spanProblem(name, span, ctx);
    if (p) out.push(p);
  }
  if (out.length) return out;
  if (c.baselineWords === 'year-before') {
    const f = ctx.s.frequency;
    if (!isYearBefore(f, c.baseline.from, c.current.from) || !isYearBefore(f, c.baseline.to, c.current.to)) {
      out.push(
        `calls ${c.baseline.from}–${c.baseline.to} the same span a year before ${c.current.from}–${c.current.to}`,
      );
    }
  }
  if (c.baselineWords === 'same-weekday' && !isSameWeekdayYearBefore(c.baseline.from, c.current.from)) {
    out.push(`calls ${c.baseline.from} the same weekday a year before ${c.current.from}`);
  }
  if (c.baselineWords === 'iso-week' && !isIsoWeekYearBefore(c.baseline.from, c.current.from)) {
    out.push(`calls ${c.baseline.from} the same ISO week a year before ${c.current.from}`);
  }
  if ((c.current.periods !== c.baseline.periods) !== c.lengthsDifferSaid) {
    out.push(
      c.lengthsDifferSaid
        ? 'says the spans differ in length, but they do not'
        : `spans of ${c.current.periods} and ${c.baseline.periods} periods, not said to differ`,
    );
  }
  const [a, b, x, y] = [c.current.from, c.current.to, c.baseline.from, c.baseline.to].map(ctx.indexOf);
  const now = combined(k.observed, a, b, c.aggregation);
  const base = combined(k.observed, x, y, c.aggregation);
  if (!agrees(c.currentValue, now, ctx.scale * c.current.periods)) out.push(`current ${c.currentValue}, data ${now}`);
  if (!agrees(c.baselineValue, base, ctx.scale * c.baseline.periods))
    out.push(`baseline ${c.baselineValue}, data ${base}`);
  if (c.expression === 'relative' && !(base > 0) && Number.isFinite(c.change)) {
    out.push(`gives a percent of a baseline of ${base}`);
  }
  const scale = c.expression === 'relative' ? 100 : ctx.scale * Math.max(c.current.periods, c.baseline.periods);
  if (Number.isFinite(c.change) && !agrees(c.change, changeOf(c.expression, now, base), scale)) {
    out.push(`change ${c.change}, data ${changeOf(c.expression, now, base)}`);
  }
  if (Number.isFinite(c.adjustedChange)) {
    const adjNow = combined(k.adjusted, a, b, c.aggregation);
    const adjBase = combined(k.adjusted, x, y, c.aggregation);
    const adj = changeOf(c.expression, adjNow, adjBase);
    if (!agrees(c.adjustedChange, adj, scale)) out.push(`adjusted change ${c.adjustedChange}, recomputed ${adj}`);
  }
  return out;
}
