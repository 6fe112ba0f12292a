/**
 * Check of the unusual periods statement: the span the words name is that many calendar years ending at
 * the reporting period (clipped to the first observation only when the claim says the span is the whole
 * series, years = 0), and the count and the named periods are those whose remainder lies beyond
 * median ± 3 × 1.4826 × MAD of the remainder over the whole series (on logarithms for a multiplicative
 * model; common practice, Hampel 1974), recomputed here.
 */
import type { UnusualCountClaim } from '../vocabulary/claims.js';
import type { VerifyContext } from './context.js';
import { ms, yearsBefore } from './dates.js';
import { agrees, median } from './numbers.js';

export function checkUnusualCount(c: UnusualCountClaim, ctx: VerifyContext): string[] {
  const { s } = ctx;
  const k = s.components;
  const out: string[] = [];
  const r = s.reportingIndex;
  if (c.span.to !== k.dates[r]) out.push(`the span ends ${c.span.to}, not at the reporting period`);
  // First period starting after the same instant `years` years before the reporting period starts.
  const cutoff = c.years > 0 ? yearsBefore(ms(k.dates[r]), c.years) : Number.NEGATIVE_INFINITY;
  let from = 0;
  while (from < r && ms(k.dates[from]) <= cutoff) from++;
  if (c.years > 0 && ms(k.dates[0]) > cutoff) out.push(`the data do not reach back ${c.years} years`);
  if (c.span.from !== k.dates[from])
    out.push(`the span starts ${c.span.from}; ${c.years} years back is ${k.dates[from]}`);
  if (c.span.periods !== r - from + 1) out.push(`the span holds ${r - from + 1} periods, not ${c.span.periods}`);
  const mult = s.settings.model === 'multiplicative';
  const e = k.remainder.map((v) => (mult ? Math.log(v) : v));
  const finite = e.filter((v) => !Number.isNaN(v));
  const mid = median(finite);
  const spread = 1.4826 * median(finite.map((v) => Math.abs(v - mid)));
  const unusual: number[] = [];
  if (spread > 0) {
    for (let i = from; i <= r; i++) if (Math.abs(e[i] - mid) > c.limit.multiple * spread) unusual.push(i);
  }
  if (c.count !== unusual.length) out.push(`counts ${c.count} unusual periods, the remainder gives ${unusual.length}`);
  for (const n of c.named) {
    const i = ctx.indexOf(n.date);
    if (!unusual.includes(i)) out.push(`names ${n.date}, which is not unusual in the span`);
    else {
      const size = mult ? 100 * (k.remainder[i] - 1) : k.remainder[i];
      if (!agrees(n.size, size, mult ? 100 : ctx.scale)) out.push(`gives ${n.date} a size of ${n.size}, not ${size}`);
    }
  }
  return out;
}
