/**
 * Check of the overview's latest value: the period named is the reporting period, and the value is the
 * one observed there (the figure is the observation itself, so it must agree exactly; a gap has none).
 */
import type { LatestValueClaim } from '../vocabulary/claims.js';
import type { VerifyContext } from './context.js';

export function checkLatestValue(c: LatestValueClaim, ctx: VerifyContext): string[] {
  const { s } = ctx;
  const out: string[] = [];
  const r = s.reportingIndex;
  if (c.at !== s.components.dates[r]) out.push(`names ${c.at}, not the reporting period ${s.components.dates[r]}`);
  const i = ctx.indexOf(c.at);
  const observed = i < 0 ? Number.NaN : s.components.observed[i];
  if (Number.isNaN(observed)) out.push(`states a value for ${c.at}, which has no observation`);
  else if (c.value !== observed) out.push(`states ${c.value}, the data hold ${observed}`);
  return out;
}
