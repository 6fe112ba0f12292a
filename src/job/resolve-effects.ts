/**
 * Resolves a series' effect settings (job key effects:) once the data are known: which calendar effects
 * the frequency allows, each named event's period as a position in the series, and whether the search for
 * unnamed events runs (auto: on for monthly and quarterly data). Every problem is a located error.
 */

import { checkHolidayRegion, holidayLibrary, publicHolidays } from '../calendar/holidays.js';
import { parsePeriod } from '../data/dates.js';
import { readHolidayFile } from '../data/holiday-file.js';
import { BriefError, type Place } from '../errors.js';
import type { EffectSettings } from '../vocabulary/brief.js';
import { type Frequency, isoOf, ordinalOf } from '../vocabulary/period-index.js';
import type { EffectsSpec } from '../vocabulary/settings.js';

/** Frequencies searched for unnamed events unless the job says otherwise. */
export const FIND_BY_DEFAULT: Frequency[] = ['monthly', 'quarterly'];

/** Frequencies whose periods hold different numbers of each weekday: day, leap-year and Easter effects. */
const CALENDAR_FREQUENCIES: Frequency[] = ['monthly', 'quarterly'];

export interface EffectData {
  frequency: Frequency;
  /** Ordinal of the first period. */
  start: number;
  /** Periods of data read (beyond the reporting period too). */
  length: number;
  /** Periods up to the reporting period: what the brief uses. */
  used: number;
  values: Float64Array;
}

/**
 * `place(key)` points at the job setting a problem concerns (e.g. "days", "events.0.at"), in the series or
 * under defaults.
 */
export interface ResolvedEffects {
  settings: EffectSettings;
  /** Holidays (days since 1970-01-01) of the region and the file together; empty for none. */
  holidays: ReadonlySet<number>;
}

export function resolveEffects(spec: EffectsSpec, data: EffectData, place: (key: string) => Place): ResolvedEffects {
  const { frequency } = data;
  const fail = (code: string, message: string, hint: string, key: string): never => {
    throw new BriefError(code, message, hint, place(key));
  };
  const calendarOk = CALENDAR_FREQUENCIES.includes(frequency);
  const needsCalendar = (key: string, what: string) =>
    fail(
      'effects-frequency',
      `${what} needs monthly or quarterly data, but this series is ${frequency}`,
      `remove ${key}: from this series' effects, or set it only for monthly and quarterly series`,
      key,
    );
  if (spec.days !== 'none' && !calendarOk) needsCalendar('days', `days: ${spec.days.replace('-', '_')}`);
  if (spec.leapYear && !calendarOk) needsCalendar('leap_year', 'leap_year: true');
  if (spec.easterDays !== null && !calendarOk) needsCalendar('easter_days', 'an Easter effect');
  // Holidays count out of working days (monthly, quarterly) or have effects of their own (daily).
  const holidayOk = calendarOk || frequency === 'daily';
  for (const key of ['holidays', 'holiday_file'] as const) {
    if ((key === 'holidays' ? spec.holidays : spec.holidayFile) !== null && !holidayOk) {
      fail(
        'effects-frequency',
        `${key} needs monthly, quarterly or daily data, but this series is ${frequency}`,
        `remove ${key}: from this series' effects`,
        key,
      );
    }
  }
  const holidays = new Set<number>();
  const from = Number(isoOf(frequency, data.start).slice(0, 4));
  const to = Number(isoOf(frequency, data.start + data.length - 1).slice(0, 4));
  const sources: string[] = [];
  if (spec.holidays !== null) {
    const region = checkHolidayRegion(spec.holidays, place('holidays'));
    for (const d of publicHolidays(region, Math.max(1900, from), Math.min(2100, to), place('holidays')).days) {
      holidays.add(d);
    }
    sources.push(`${region.name} (${holidayLibrary()})`);
  }
  if (spec.holidayFile !== null) {
    const file = readHolidayFile(spec.holidayFile, spec.holidayFileAsWritten ?? spec.holidayFile);
    for (const d of file.days) holidays.add(d);
    sources.push(`the file ${spec.holidayFileAsWritten ?? spec.holidayFile}`);
  }

  const position = (text: string, key: string): number => {
    const p = parsePeriod(text);
    if (p === null) {
      fail('bad-event-period', `"${text}" is not a period`, 'write it like the data, e.g. 2024-03 or 2024-Q1', key);
    }
    return ordinalOf(frequency, p!.utcMs) - data.start;
  };
  const first = isoOf(frequency, data.start);
  const last = isoOf(frequency, data.start + data.length - 1);
  const events: EffectSettings['events'] = [];
  spec.events.forEach((e, k) => {
    const at = position(e.at, `events.${k}.at`);
    if (at < 0 || at >= data.length) {
      fail(
        'event-outside-data',
        `event "${e.label}" at ${e.at} is outside the data (${first} to ${last})`,
        'give a period within the data, or remove the event',
        `events.${k}.at`,
      );
    }
    if (at < data.used && Number.isNaN(data.values[at])) {
      fail(
        'event-on-missing',
        `event "${e.label}" at ${e.at} falls on a period with no value`,
        'move it to a period with a value, or fill in the data',
        `events.${k}.at`,
      );
    }
    const until = e.until === null ? null : position(e.until, `events.${k}.until`);
    if (until !== null && (until < 0 || until >= data.length)) {
      fail(
        'event-outside-data',
        `the ramp "${e.label}" ends at ${e.until}, outside the data (${first} to ${last})`,
        'give a last period within the data',
        `events.${k}.until`,
      );
    }
    // An event after the reporting period (a brief of an earlier period) does not concern this brief.
    if (at >= data.used) return;
    events.push({
      kind: e.kind,
      at,
      date: isoOf(frequency, data.start + at),
      until: until === null ? null : Math.min(until, data.used - 1),
      label: e.label,
      fadingRate: e.fadingRate,
    });
  });

  const findOn = spec.find === 'on' || (spec.find === 'auto' && FIND_BY_DEFAULT.includes(frequency));
  const find = findOn ? [...spec.findKinds] : [];
  const findReason =
    spec.find === 'auto'
      ? findOn
        ? `on by default for ${frequency} data`
        : `off by default for ${frequency} data`
      : `turned ${spec.find} in the job`;
  const days = calendarOk ? spec.days : 'none';
  const leapYear = calendarOk && spec.leapYear;
  const easterDays = calendarOk ? spec.easterDays : null;
  // Daily data: the holidays are regressors of their own, so asking for them asks for effects.
  const dailyHolidays = frequency === 'daily' && holidays.size > 0;
  const asked =
    days !== 'none' || leapYear || easterDays !== null || spec.events.length > 0 || spec.find === 'on' || dailyHolidays;
  return {
    settings: {
      on: asked || find.length > 0,
      days,
      leapYear,
      easterDays,
      holidays: sources.length > 0 ? sources.join(' and ') : null,
      events,
      find,
      findReason,
      asked,
    },
    holidays,
  };
}
