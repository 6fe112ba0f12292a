/**
 * How the seasons of a seasonal pattern are named, and so grouped, in words and charts: each pattern in
 * its own terms. A pattern whose period is the frequency's own cycle is named by that cycle (months of a
 * year of months, weekdays of a week of days, hours of a day of hours, ISO weeks of a year of weeks); a
 * yearly pattern of days or hours is described by calendar month, a weekly pattern of hours by weekday.
 * Any other period is named by position in its cycle (1…period).
 *
 *   namingFor('daily', 365) → 'month'      namingFor('daily', 7) → 'weekday'
 */
import type { SeasonNaming } from '../vocabulary/claims.js';
import { type Frequency, isoWeekOf, startOf } from '../vocabulary/period-index.js';

export function namingFor(frequency: Frequency, period: number): SeasonNaming {
  switch (frequency) {
    case 'monthly':
      return period === 12 ? 'month' : 'cycle-position';
    case 'quarterly':
      return period === 4 ? 'quarter' : 'cycle-position';
    case 'weekly':
      return period === 52 || period === 53 ? 'iso-week' : 'cycle-position';
    case 'daily':
      return period === 7 ? 'weekday' : period >= 364 && period <= 366 ? 'month' : 'cycle-position';
    case 'hourly':
      if (period === 24) return 'hour';
      if (period === 168) return 'weekday';
      return period >= 8736 && period <= 8784 ? 'month' : 'cycle-position';
  }
}

const MONTHS = new Intl.DateTimeFormat('en-GB', { month: 'long', timeZone: 'UTC' });
const WEEKDAYS = new Intl.DateTimeFormat('en-GB', { weekday: 'long', timeZone: 'UTC' });

/**
 * The season a period falls in under a naming: its order within the cycle (for sorting) and its English
 * name ("March", "Q2", "week 9", "Tuesday", "13:00", or "3" for the third position of a cycle).
 */
export function seasonAt(
  naming: SeasonNaming,
  frequency: Frequency,
  ordinal: number,
  position: number,
): { order: number; label: string } {
  const t = startOf(frequency, ordinal);
  const d = new Date(t);
  switch (naming) {
    case 'month':
      return { order: d.getUTCMonth(), label: MONTHS.format(t) };
    case 'quarter':
      return { order: Math.floor(d.getUTCMonth() / 3), label: `Q${Math.floor(d.getUTCMonth() / 3) + 1}` };
    case 'iso-week': {
      const w = isoWeekOf(t).week;
      return { order: w - 1, label: `week ${w}` };
    }
    case 'weekday': {
      const day = (d.getUTCDay() + 6) % 7;
      return { order: day, label: WEEKDAYS.format(t) };
    }
    case 'hour':
      return { order: d.getUTCHours(), label: `${String(d.getUTCHours()).padStart(2, '0')}:00` };
    case 'cycle-position':
      return { order: position, label: String(position + 1) };
  }
}
