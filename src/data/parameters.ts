/**
 * The values of a query's parameters, drawn from the reporting period as written in the job or on the
 * command line: period (as written: 2026-09), period_start (its first day: 2026-09-01) and period_end (its
 * last day: 2026-09-30). An hourly period's start and end are the hour itself (2026-09-15T14:00).
 */
import { BriefError } from '../errors.js';
import { type Frequency, startOf } from '../vocabulary/period-index.js';
import type { QueryParameter } from '../vocabulary/settings.js';
import { parsePeriod } from './dates.js';
import { periodOrdinal } from './place.js';

export function parameterValues(names: readonly QueryParameter[], period: string | null, file: string): string[] {
  if (names.length === 0) return [];
  if (period === null) {
    throw new BriefError(
      'data-query-period',
      `the query's parameters (${names.join(', ')}) come from the reporting period, and none is set`,
      'set brief.period in the job (e.g. period: 2026-09) or give --period',
      { file },
    );
  }
  const p = parsePeriod(period.trim());
  if (p === null) {
    throw new BriefError(
      'data-query-period',
      `the reporting period "${period}" is not a period the query's parameters can be drawn from`,
      'write it as 2026-09, 2026-Q3, 2026-W39, 2026-09-15 or 2026-09-15T14:00',
      { file },
    );
  }
  const frequency: Frequency = p.frequency;
  const ordinal = periodOrdinal(frequency, p.utcMs);
  const first = startOf(frequency, ordinal);
  const last = frequency === 'hourly' ? first : startOf(frequency, ordinal + 1) - 86_400_000;
  const text = (ms: number) => {
    const iso = new Date(ms).toISOString();
    return frequency === 'hourly' ? iso.slice(0, 16) : iso.slice(0, 10);
  };
  return names.map((n) => (n === 'period' ? period.trim() : n === 'period_start' ? text(first) : text(last)));
}
