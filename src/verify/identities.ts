/**
 * Checks of the components themselves: the observed values are the data as read, and the components add
 * up (additive) or multiply (multiplicative) to the observed values wherever all are defined, the calendar
 * component included when there is one; the adjusted series is observed minus (or over) the seasonal and
 * the calendar.
 */
import type { SeriesBrief } from '../vocabulary/brief.js';
import { agrees, magnitude } from './numbers.js';

export function checkIdentities(s: SeriesBrief, raw?: ArrayLike<number>): string[] {
  const c = s.components;
  const out: string[] = [];
  const scale = magnitude(c.observed);
  const mult = s.settings.model === 'multiplicative';
  if (raw) {
    for (let i = 0; i < c.observed.length; i++) {
      if (!agrees(c.observed[i], raw[i], scale, 0)) {
        out.push(`observed value ${c.dates[i]} is ${c.observed[i]}, the data say ${raw[i]}`);
        break;
      }
    }
  }
  const neutral = mult ? 1 : 0;
  for (let i = 0; i < c.observed.length; i++) {
    // Matched to yearly totals, the adjusted series is benchmarked; the decomposition's own is kept beside it.
    const decomposed = c.adjustedAsDecomposed ?? c.adjusted;
    const [y, t, s0, e, a] = [c.observed[i], c.trend[i], c.seasonal[i], c.remainder[i], decomposed[i]];
    const cal = c.calendar ? c.calendar[i] : neutral;
    // Seasonal and calendar together: what the adjusted series takes out.
    const sz = mult ? s0 * cal : s0 + cal;
    if ([y, t, sz, e].every(Number.isFinite)) {
      const sum = mult ? t * sz * e : t + sz + e;
      if (!agrees(sum, y, scale, 1e-9)) {
        out.push(`components do not make up the observed value at ${c.dates[i]}`);
        break;
      }
    }
    if (Number.isFinite(y) && Number.isFinite(sz) && !agrees(a, mult ? y / sz : y - sz, scale, 1e-9)) {
      out.push(
        `adjusted value at ${c.dates[i]} is not observed ${mult ? 'over' : 'minus'} seasonal${c.calendar ? ' and calendar' : ''}`,
      );
      break;
    }
  }
  return out;
}
