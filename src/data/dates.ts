/**
 * Reading the date column: which period a cell names, and which frequency a whole column has.
 * Formats are those of ISO 8601 (common practice): calendar dates 2024-03-05, year-month 2024-03, ISO weeks
 * 2024-W09 and 2024-W09-1 (Monday-start weeks of the ISO week-numbering year), date-times 2024-03-05T13:00 or
 * 2024-03-05 13:00 with optional :ss[.fff] and Z or ±hh:mm (converted to UTC); plus year-quarter 2024-Q1 or
 * 2024Q1, the usual way quarters are written. Impossible dates (2024-02-30, month 13, week 54, W53 in a
 * 52-week year) give null rather than rolling over.
 *
 *   parsePeriod('2024-Q2') → { frequency: 'quarterly', kind: 'quarter', utcMs: Date.UTC(2024, 3, 1) }
 *
 * Parsing works on character codes with integer arithmetic and builds no Date, so a column of a million
 * cells parses in well under a second.
 */
import { type Frequency, isoWeekStart, isoWeeksInYear } from '../vocabulary/period-index.js';

/** The written form of a date cell; one column must use one kind throughout. */
export type DateKind = 'date' | 'month' | 'quarter' | 'week' | 'datetime';

export interface ParsedPeriod {
  /** The frequency the text itself implies; ISO dates say 'daily' until the column says otherwise. */
  frequency: Frequency;
  /** Start of the named day, month, quarter or week, or the instant of a date-time, in UTC. */
  utcMs: number;
  kind: DateKind;
}

const DAY_MS = 86_400_000;
const HOUR_MS = 3_600_000;
const MINUTE_MS = 60_000;

/** The frequency each written kind implies on its own. */
export const KIND_FREQUENCY: Record<DateKind, Frequency> = {
  date: 'daily',
  month: 'monthly',
  quarter: 'quarterly',
  week: 'weekly',
  datetime: 'hourly',
};

/** A human example of each kind, for messages. */
export const KIND_EXAMPLES: Record<DateKind, string> = {
  date: 'a date like 2024-03-05',
  month: 'a month like 2024-03',
  quarter: 'a quarter like 2024-Q1',
  week: 'an ISO week like 2024-W09',
  datetime: 'a date and time like 2024-03-05 13:00',
};

export const ACCEPTED_FORMATS = '2024-03-05, 2024-03, 2024-Q1, 2024-W09 or 2024-03-05 13:00';

/** The period a cell names, or null when it is not one of the accepted forms or names no real date. */
export function parsePeriod(text: string): ParsedPeriod | null {
  let s = text;
  const n0 = s.length;
  if (n0 === 0) return null;
  if (s.charCodeAt(0) <= 32 || s.charCodeAt(n0 - 1) <= 32) s = s.trim();
  const n = s.length;
  if (n < 6) return null;
  const year = digits(s, 0, 4);
  // Years below 1000 are almost always a typo or a placeholder such as 0001-01-01.
  if (year < 1000) return null;
  const c4 = s.charCodeAt(4);
  if (c4 === 81 || c4 === 113) return n === 6 ? quarter(year, s, 5) : null; // 2024Q1
  if (c4 === 87 || c4 === 119) return week(year, s, 5); // 2024W09
  if (c4 !== 45) return null; // '-'
  const c5 = s.charCodeAt(5);
  if (c5 === 81 || c5 === 113) return n === 7 ? quarter(year, s, 6) : null; // 2024-Q1
  if (c5 === 87 || c5 === 119) return week(year, s, 6); // 2024-W09
  const month = digits(s, 5, 2);
  if (month < 1 || month > 12) return null;
  if (n === 7) return { frequency: 'monthly', utcMs: daysFromCivil(year, month, 1) * DAY_MS, kind: 'month' };
  if (n < 10 || s.charCodeAt(7) !== 45) return null;
  const day = digits(s, 8, 2);
  if (day < 1 || day > daysInMonth(year, month)) return null;
  const dayMs = daysFromCivil(year, month, day) * DAY_MS;
  if (n === 10) return { frequency: 'daily', utcMs: dayMs, kind: 'date' };
  const utcMs = time(s, dayMs);
  return Number.isNaN(utcMs) ? null : { frequency: 'hourly', utcMs, kind: 'datetime' };
}

/** `Q1`..`Q4` at position `at`, already known to end the text. */
function quarter(year: number, s: string, at: number): ParsedPeriod | null {
  const q = s.charCodeAt(at) - 48;
  if (q < 1 || q > 4) return null;
  return { frequency: 'quarterly', utcMs: daysFromCivil(year, q * 3 - 2, 1) * DAY_MS, kind: 'quarter' };
}

/** `ww`, `ww-d` or `wwd` after the W at position `at`. */
function week(year: number, s: string, at: number): ParsedPeriod | null {
  const n = s.length;
  const w = digits(s, at, 2);
  if (w < 1 || w > 53) return null;
  let weekday = 1;
  if (n === at + 4 && s.charCodeAt(at + 2) === 45) weekday = digits(s, at + 3, 1);
  else if (n === at + 3 && s.charCodeAt(at - 2) !== 45)
    weekday = digits(s, at + 2, 1); // basic 2024W091
  else if (n !== at + 2) return null;
  if (weekday < 1 || weekday > 7) return null;
  if (w > isoWeeksInYear(year)) return null;
  return { frequency: 'weekly', utcMs: isoWeekStart(year, w) + (weekday - 1) * DAY_MS, kind: 'week' };
}

/** The time part after a date (at position 10): `Thh:mm[:ss[.fff]][Z|±hh:mm|±hhmm|±hh]`; NaN if malformed. */
function time(s: string, dayMs: number): number {
  const n = s.length;
  const sep = s.charCodeAt(10);
  if (sep !== 84 && sep !== 116 && sep !== 32) return Number.NaN; // T, t, space
  if (n < 16 || s.charCodeAt(13) !== 58) return Number.NaN;
  const hh = digits(s, 11, 2);
  const mm = digits(s, 14, 2);
  if (hh < 0 || hh > 23 || mm < 0 || mm > 59) return Number.NaN;
  let ms = dayMs + hh * HOUR_MS + mm * MINUTE_MS;
  let i = 16;
  if (i < n && s.charCodeAt(i) === 58) {
    const ss = digits(s, i + 1, 2);
    if (ss < 0 || ss > 59) return Number.NaN;
    ms += ss * 1000;
    i += 3;
    if (i < n && s.charCodeAt(i) === 46) {
      // Fractions of a second do not change the hour; only check they are digits.
      const start = ++i;
      while (i < n && isDigit(s.charCodeAt(i))) i++;
      if (i === start) return Number.NaN;
    }
  }
  if (i === n) return ms;
  const z = s.charCodeAt(i);
  if ((z === 90 || z === 122) && i + 1 === n) return ms;
  // '+', '-' or the Unicode minus some spreadsheets write.
  if (z !== 43 && z !== 45 && z !== 0x2212) return Number.NaN;
  const oh = digits(s, i + 1, 2);
  let om = 0;
  const rest = n - (i + 3);
  if (rest === 3 && s.charCodeAt(i + 3) === 58) om = digits(s, i + 4, 2);
  else if (rest === 2) om = digits(s, i + 3, 2);
  else if (rest !== 0) return Number.NaN;
  if (oh < 0 || oh > 23 || om < 0 || om > 59) return Number.NaN;
  const offset = oh * HOUR_MS + om * MINUTE_MS;
  // Local time = UTC + offset, so UTC = local − offset.
  return z === 43 ? ms - offset : ms + offset;
}

/** The non-negative integer written by `count` ASCII digits at `at`, or −1. */
function digits(s: string, at: number, count: number): number {
  if (at + count > s.length) return -1;
  let v = 0;
  for (let i = at; i < at + count; i++) {
    const c = s.charCodeAt(i);
    if (!isDigit(c)) return -1;
    v = v * 10 + (c - 48);
  }
  return v;
}

function isDigit(c: number): boolean {
  return c >= 48 && c <= 57;
}

export function isLeapYear(y: number): boolean {
  return (y % 4 === 0 && y % 100 !== 0) || y % 400 === 0;
}

export function daysInMonth(y: number, m: number): number {
  if (m === 2) return isLeapYear(y) ? 29 : 28;
  return m === 4 || m === 6 || m === 9 || m === 11 ? 30 : 31;
}

/**
 * Days since 1970-01-01 of a proleptic Gregorian date (month 1–12).
 * Source: H. Hinnant, "chrono-Compatible Low-Level Date Algorithms", days_from_civil (2013).
 *   daysFromCivil(1970, 1, 1) → 0;  daysFromCivil(2000, 3, 1) → 11017
 */
export function daysFromCivil(y: number, m: number, d: number): number {
  const yy = m <= 2 ? y - 1 : y;
  const era = Math.floor(yy / 400);
  const yoe = yy - era * 400;
  const doy = Math.floor((153 * (m > 2 ? m - 3 : m + 9) + 2) / 5) + d - 1;
  const doe = yoe * 365 + Math.floor(yoe / 4) - Math.floor(yoe / 100) + doy;
  return era * 146097 + doe - 719468;
}

/** The inverse of daysFromCivil (same source, civil_from_days): year, month 1–12, day. */
export function civilFromDays(days: number): { y: number; m: number; d: number } {
  const z = days + 719468;
  const era = Math.floor(z / 146097);
  const doe = z - era * 146097;
  const yoe = Math.floor((doe - Math.floor(doe / 1460) + Math.floor(doe / 36524) - Math.floor(doe / 146096)) / 365);
  const doy = doe - (365 * yoe + Math.floor(yoe / 4) - Math.floor(yoe / 100));
  const mp = Math.floor((5 * doy + 2) / 153);
  const d = doy - Math.floor((153 * mp + 2) / 5) + 1;
  const m = mp < 10 ? mp + 3 : mp - 9;
  return { y: yoe + era * 400 + (m <= 2 ? 1 : 0), m, d };
}

/**
 * The frequency of a whole column of parsed cells of one kind (the loader rejects mixed kinds first).
 * Months, quarters and weeks say so by their form. Date-times are hourly, unless every one is at midnight
 * UTC, when they are read as dates (databases often export daily data that way). For dates, with the
 * spacing measured between distinct sorted dates:
 *   - all on the same day of the month (or all on month ends), in the same month of their quarter and at
 *     least 89 days apart → quarterly (the shortest quarter, Jan–Mar of a common year, has 90 days);
 *   - all on the same day of the month or all on month ends, at least 28 days apart → monthly;
 *   - every spacing a multiple of 7 days → weekly;
 *   - otherwise daily (also for a single date).
 */
export function inferFrequency(parsed: readonly ParsedPeriod[]): Frequency {
  if (parsed.length === 0) return 'daily';
  const utcMs = new Float64Array(parsed.length);
  for (let i = 0; i < parsed.length; i++) utcMs[i] = parsed[i].utcMs;
  return inferFrequencyOf(parsed[0].kind, utcMs);
}

/** inferFrequency on a column held as one kind and its instants (the loader's form, one number per row). */
export function inferFrequencyOf(kind: DateKind, utcMs: Float64Array): Frequency {
  if (kind === 'month') return 'monthly';
  if (kind === 'quarter') return 'quarterly';
  if (kind === 'week') return 'weekly';
  if (kind === 'datetime') {
    for (let i = 0; i < utcMs.length; i++) if (utcMs[i] % DAY_MS !== 0) return 'hourly';
  }
  const days = distinctSortedDays(utcMs);
  if (days.length < 2) return 'daily';
  let minGap = Number.POSITIVE_INFINITY;
  let allWeeks = true;
  for (let i = 1; i < days.length; i++) {
    const gap = days[i] - days[i - 1];
    if (gap < minGap) minGap = gap;
    if (gap % 7 !== 0) allWeeks = false;
  }
  if (minGap >= 28) {
    const shape = monthShape(days);
    if (shape.sameDay) return shape.sameQuarterMonth && minGap >= 89 ? 'quarterly' : 'monthly';
  }
  return allWeeks ? 'weekly' : 'daily';
}

function distinctSortedDays(utcMs: Float64Array): Float64Array {
  const all = new Float64Array(utcMs.length);
  for (let i = 0; i < utcMs.length; i++) all[i] = Math.floor(utcMs[i] / DAY_MS);
  all.sort();
  let k = 0;
  for (let i = 0; i < all.length; i++) if (i === 0 || all[i] !== all[k - 1]) all[k++] = all[i];
  return all.subarray(0, k);
}

/** Whether sorted days all sit at the same place in their month, and in the same month of their quarter. */
function monthShape(days: Float64Array): { sameDay: boolean; sameQuarterMonth: boolean } {
  const first = civilFromDays(days[0]);
  const firstEnd = first.d === daysInMonth(first.y, first.m);
  let sameDayNumber = true;
  let allEnds = firstEnd;
  let sameQuarterMonth = true;
  for (let i = 1; i < days.length; i++) {
    const c = civilFromDays(days[i]);
    if (c.d !== first.d) sameDayNumber = false;
    if (c.d !== daysInMonth(c.y, c.m)) allEnds = false;
    if ((c.m - 1) % 3 !== (first.m - 1) % 3) sameQuarterMonth = false;
    if (!sameDayNumber && !allEnds) break;
  }
  return { sameDay: sameDayNumber || allEnds, sameQuarterMonth };
}

/**
 * Whether a parsed cell can stand for a period of the given frequency: months, quarters and weeks only for
 * their own frequency; dates for daily and coarser; date-times for hourly, and for daily and coarser only
 * at midnight.
 */
export function fitsFrequency(p: ParsedPeriod, frequency: Frequency): boolean {
  switch (p.kind) {
    case 'month':
      return frequency === 'monthly';
    case 'quarter':
      return frequency === 'quarterly';
    case 'week':
      return frequency === 'weekly';
    case 'date':
      return frequency !== 'hourly';
    case 'datetime':
      return frequency === 'hourly' || p.utcMs % DAY_MS === 0;
  }
}
