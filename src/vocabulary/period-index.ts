/**
 * The regular time index under every series: a frequency, the ordinal of the first period and a length.
 * Ordinals count periods from a fixed origin so that "the same period a year ago" and gaps are plain
 * arithmetic: months and quarters from year 0, ISO weeks and days from 1970-01-01 (Thursday), hours from
 * 1970-01-01T00:00Z. Weekly periods start on Monday (ISO 8601).
 */
export type Frequency = 'hourly' | 'daily' | 'weekly' | 'monthly' | 'quarterly';

export const FREQUENCIES: readonly Frequency[] = ['hourly', 'daily', 'weekly', 'monthly', 'quarterly'];

export interface TimeIndex {
  readonly frequency: Frequency;
  /** Ordinal of the first period. */
  readonly start: number;
  readonly length: number;
}

export interface Series {
  readonly index: TimeIndex;
  /** One value per period; NaN marks a missing value. */
  readonly values: Float64Array;
}

/** The usual seasonal period of each frequency: a year of months or quarters, a year of weeks, a week of
 * days, a day of hours (common practice). */
export function defaultPeriod(frequency: Frequency): number {
  switch (frequency) {
    case 'monthly':
      return 12;
    case 'quarterly':
      return 4;
    case 'weekly':
      return 52;
    case 'daily':
      return 7;
    case 'hourly':
      return 24;
  }
}

/** How many periods make a year, for year-over-year comparisons (a year of hours is 8760, 365 days). */
export function periodsPerYear(frequency: Frequency): number {
  switch (frequency) {
    case 'monthly':
      return 12;
    case 'quarterly':
      return 4;
    case 'weekly':
      return 52;
    case 'daily':
      return 365;
    case 'hourly':
      return 8760;
  }
}

/**
 * How many periods back "the same period a year ago" is: 52 weeks for daily and hourly data, so that the
 * weekday matches (common practice in retail and service reporting), else a year of periods.
 */
export function yearLag(frequency: Frequency): number {
  switch (frequency) {
    case 'daily':
      return 364;
    case 'hourly':
      return 364 * 24;
    default:
      return periodsPerYear(frequency);
  }
}

const DAY_MS = 86_400_000;
const HOUR_MS = 3_600_000;
/** 1970-01-05 is the first Monday after the origin; week ordinal 0 is the ISO week starting 1969-12-29. */
const MONDAY_OFFSET_DAYS = 3;

/** Ordinal of the period containing a UTC instant (milliseconds since 1970-01-01T00:00Z). */
export function ordinalOf(frequency: Frequency, utcMs: number): number {
  const d = new Date(utcMs);
  switch (frequency) {
    case 'monthly':
      return d.getUTCFullYear() * 12 + d.getUTCMonth();
    case 'quarterly':
      return d.getUTCFullYear() * 4 + Math.floor(d.getUTCMonth() / 3);
    case 'weekly':
      return Math.floor((Math.floor(utcMs / DAY_MS) + MONDAY_OFFSET_DAYS) / 7);
    case 'daily':
      return Math.floor(utcMs / DAY_MS);
    case 'hourly':
      return Math.floor(utcMs / HOUR_MS);
  }
}

/** The UTC instant at which a period starts. */
export function startOf(frequency: Frequency, ordinal: number): number {
  switch (frequency) {
    case 'monthly':
      return Date.UTC(Math.floor(ordinal / 12), mod(ordinal, 12), 1);
    case 'quarterly':
      return Date.UTC(Math.floor(ordinal / 4), mod(ordinal, 4) * 3, 1);
    case 'weekly':
      return (ordinal * 7 - MONDAY_OFFSET_DAYS) * DAY_MS;
    case 'daily':
      return ordinal * DAY_MS;
    case 'hourly':
      return ordinal * HOUR_MS;
  }
}

/** ISO 8601 text of a period's start: a date, or a date-time in UTC for hourly data. */
export function isoOf(frequency: Frequency, ordinal: number): string {
  const iso = new Date(startOf(frequency, ordinal)).toISOString();
  return frequency === 'hourly' ? `${iso.slice(0, 16)}Z` : iso.slice(0, 10);
}

/** ISO dates of every period of an index. */
export function isoDates(index: TimeIndex): string[] {
  const out = new Array<string>(index.length);
  for (let i = 0; i < index.length; i++) out[i] = isoOf(index.frequency, index.start + i);
  return out;
}

/** Position of a period within its year (0-based month, quarter, ISO week, weekday Monday=0, hour). */
export function seasonOf(frequency: Frequency, ordinal: number): number {
  switch (frequency) {
    case 'monthly':
      return mod(ordinal, 12);
    case 'quarterly':
      return mod(ordinal, 4);
    case 'weekly':
      return isoWeekOf(startOf('weekly', ordinal)).week - 1;
    case 'daily':
      return mod(ordinal + MONDAY_OFFSET_DAYS, 7);
    case 'hourly':
      return mod(ordinal, 24);
  }
}

/** ISO 8601 week-numbering year and week of a UTC instant. */
export function isoWeekOf(utcMs: number): { year: number; week: number } {
  const d = new Date(utcMs);
  const day = (d.getUTCDay() + 6) % 7; // Monday 0
  const thursday = Date.UTC(d.getUTCFullYear(), d.getUTCMonth(), d.getUTCDate() - day + 3);
  const year = new Date(thursday).getUTCFullYear();
  const week = 1 + Math.floor((thursday - Date.UTC(year, 0, 1)) / (7 * DAY_MS));
  return { year, week };
}

/** Monday of ISO week `week` of ISO year `year`, as a UTC instant. */
export function isoWeekStart(year: number, week: number): number {
  const jan4 = Date.UTC(year, 0, 4);
  const jan4Day = (new Date(jan4).getUTCDay() + 6) % 7;
  return jan4 - jan4Day * DAY_MS + (week - 1) * 7 * DAY_MS;
}

/** Number of ISO weeks (52 or 53) in an ISO week-numbering year. */
export function isoWeeksInYear(year: number): number {
  return isoWeekOf(Date.UTC(year, 11, 28)).week;
}

export function mod(a: number, n: number): number {
  return ((a % n) + n) % n;
}

/**
 * The ordinal of the period whose start an ISO date ("2026-09-01") or UTC date-time ("2026-09-01T13:00:00Z")
 * names: the one parser of the Brief's period labels, so no stage reads them back its own way.
 */
export function ordinalOfIso(frequency: Frequency, iso: string): number {
  return ordinalOf(frequency, Date.parse(iso.length === 10 ? `${iso}T00:00:00Z` : iso));
}

/**
 * The ordinals of a run of periods whose ISO labels the Brief also carries (a comparison's span, a year of
 * totals), first and last inclusive. Later stages read these, never the labels, so no stage parses a label
 * back; the JSON keeps only the labels.
 */
export interface Ordinals {
  readonly first: number;
  readonly last: number;
}

/** The ordinal of the period at position `i` of an index (i may lie before 0 or past the end). */
export function ordinalAt(index: TimeIndex, i: number): number {
  return index.start + i;
}
