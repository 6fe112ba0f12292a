/**
 * The verifier's own calendar, from the ISO dates in the Brief: UTC instants, calendar-year shifts, the
 * names of months and weekdays, ISO weeks (ISO 8601: weeks start on Monday; week 1 holds the year's first
 * Thursday). Kept apart from src/vocabulary/period-index.ts on purpose.
 */
const DAY = 86_400_000;

export function ms(iso: string): number {
  return Date.parse(iso.length === 10 ? `${iso}T00:00:00Z` : iso.endsWith('Z') ? iso : `${iso}Z`);
}

/** The same instant `years` calendar years earlier (29 February becomes 28 February). */
export function yearsBefore(t: number, years: number): number {
  const d = new Date(t);
  const y = d.getUTCFullYear() - years;
  const last = new Date(Date.UTC(y, d.getUTCMonth() + 1, 0)).getUTCDate();
  return Date.UTC(y, d.getUTCMonth(), Math.min(d.getUTCDate(), last), d.getUTCHours());
}

export function days(a: number, b: number): number {
  return (b - a) / DAY;
}

export const MONTHS = [
  'January',
  'February',
  'March',
  'April',
  'May',
  'June',
  'July',
  'August',
  'September',
  'October',
  'November',
  'December',
];
export const WEEKDAYS = ['Monday', 'Tuesday', 'Wednesday', 'Thursday', 'Friday', 'Saturday', 'Sunday'];

export function monthOf(t: number): number {
  return new Date(t).getUTCMonth();
}

/** 0 = Monday … 6 = Sunday. */
export function weekdayOf(t: number): number {
  return (new Date(t).getUTCDay() + 6) % 7;
}

export function isoWeek(t: number): { year: number; week: number } {
  const thursday = t - weekdayOf(t) * DAY + 3 * DAY;
  const year = new Date(thursday).getUTCFullYear();
  const jan4 = Date.UTC(year, 0, 4);
  const week1 = jan4 - weekdayOf(jan4) * DAY;
  return { year, week: Math.floor((thursday - 3 * DAY - week1) / (7 * DAY)) + 1 };
}
