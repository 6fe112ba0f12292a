/**
 * What every check sees: the series as built (components, settings, analysis) and, when given, the raw
 * values as read from the data file, plus index lookups by date.
 */
import type { SeriesBrief, Statement } from '../vocabulary/brief.js';
import { magnitude } from './numbers.js';

export interface VerifyContext {
  s: SeriesBrief;
  statement: Statement;
  /** Index of a period by its ISO date; -1 when the date is not a period of the series. */
  indexOf: (iso: string) => number;
  /** Largest absolute observed value: the scale of tolerances in units. */
  scale: number;
}

export function contextFor(s: SeriesBrief, statement: Statement): VerifyContext {
  const byDate = new Map(s.components.dates.map((d, i) => [d, i]));
  return {
    s,
    statement,
    indexOf: (iso) => byDate.get(iso) ?? -1,
    scale: magnitude(s.components.observed),
  };
}
