/**
 * Public holidays of a country, state or region, from the date-holidays library (npm `date-holidays`,
 * pinned in package.json; its rules follow ISO 3166-1/3166-2 codes). Only holidays of its type `public`
 * count: bank, school and optional days and observances do not. A holiday of several days counts each whole
 * day it covers; one that begins at noon or later (Christmas Eve afternoon in Iceland, Guatemala's New
 * Year's Eve) covers no whole day and does not count. Substitute days ("Boxing Day (substitute day)") count:
 * they are the days off.
 *
 * The library (about 800 kB of rules and the moment-timezone data) is loaded on the first call only, so a
 * brief without holidays never pays for it (bench/holidays.js measures it).
 *
 *   publicHolidays('GB-ENG', 2024, 2024).days → 8 days, 2024-01-01 (New Year's Day) … 2024-12-26 (Boxing Day)
 *   publicHolidays('UK', 2024, 2024) → BriefError: unknown holiday country "UK"; close matches: GB (United Kingdom)
 */
import { createRequire } from 'node:module';
import type HolidaysClass from 'date-holidays';
import { BriefError, type Place } from '../errors.js';
import { editDistance } from '../suggest.js';

/** Holiday days (days since 1970-01-01, UTC) and each day's name(s). */
export interface HolidayCalendar {
  days: ReadonlySet<number>;
  names: ReadonlyMap<number, string>;
}

/** A checked region: the library's own codes and names, and the text the job wrote. */
export interface HolidayRegion {
  /** The job's text, as written. */
  written: string;
  /** Canonical code, `GB-ENG`, `US-NY`, `DE-BY-A`. */
  code: string;
  country: string;
  state?: string;
  region?: string;
  /** English name where the library has one: "England, United Kingdom". */
  name: string;
}

const DAY = 86_400_000;

let library: typeof HolidaysClass | null = null;
const requireHere = createRequire(import.meta.url);

function lib(): typeof HolidaysClass {
  library ??= requireHere('date-holidays') as typeof HolidaysClass;
  return library;
}

/** The library's name and version, for a brief's data note: "date-holidays 3.37.0". */
export function holidayLibrary(): string {
  const pkg = requireHere('date-holidays/package.json') as { name: string; version: string };
  return `${pkg.name} ${pkg.version}`;
}

/**
 * Checks a region written in the job (`GB`, `gb-eng`, `US-NY`, `DE-BY-A`) against the library's codes.
 * Unknown → BriefError `holiday-region` at `place`, whose message lists close matches by edit distance over
 * the codes and English names.
 */
export function checkHolidayRegion(written: string, place: Place = {}): HolidayRegion {
  const info = new (lib())();
  const parts = written.trim().split('-');
  const countries = info.getCountries('en') ?? {};
  const country = findCode(parts[0], countries);
  if (country === null || parts.length > 3 || parts.some((p) => p.trim() === '')) {
    if (country !== null) throw unknown(`"${written}" is not a holiday region`, [], place, country);
    throw unknown(`unknown holiday country "${parts[0]}"`, suggest(parts[0], countries, ALIASES), place);
  }
  const countryName = countries[country];
  if (parts.length === 1) return { written, code: country, country, name: countryName };
  const states = info.getStates(country, 'en') ?? {};
  const state = findCode(parts[1], states);
  if (state === null) {
    const what = `${countryName} (${country}) has no state or region "${parts[1]}" in the holiday library`;
    throw unknown(what, suggest(parts[1], states), place, country);
  }
  const stateName = `${states[state]}, ${countryName}`;
  if (parts.length === 2) return { written, code: `${country}-${state}`, country, state, name: stateName };
  const regions = info.getRegions(country, state, 'en') ?? {};
  const region = findCode(parts[2], regions);
  if (region === null) {
    const what = `${states[state]} (${country}-${state}) has no region "${parts[2]}" in the holiday library`;
    throw unknown(what, suggest(parts[2], regions), place, `${country}-${state}`);
  }
  const code = `${country}-${state}-${region}`;
  return { written, code, country, state, region, name: `${regions[region]}, ${stateName}` };
}

/**
 * Public holidays of `region` (as checkHolidayRegion takes it) in the years fromYear…toYear inclusive.
 * Several holidays on one day give one day, their names joined by " / ".
 */
export function publicHolidays(
  region: string | HolidayRegion,
  fromYear: number,
  toYear: number,
  place: Place = {},
): HolidayCalendar {
  if (!Number.isInteger(fromYear) || !Number.isInteger(toYear) || fromYear > toYear) {
    throw new RangeError(`publicHolidays: years ${fromYear}…${toYear} are not a span of whole years`);
  }
  const r = typeof region === 'string' ? checkHolidayRegion(region, place) : region;
  const days = new Set<number>();
  const names = new Map<number, string>();
  for (let year = fromYear; year <= toYear; year++) {
    for (const [day, name] of yearOf(r, year)) {
      // The library lists a holiday of a year by its start, so a span from the year before can reach in.
      const y = new Date(day * DAY).getUTCFullYear();
      if (y < fromYear || y > toYear) continue;
      days.add(day);
      const had = names.get(day);
      if (had === undefined) names.set(day, name);
      else if (!had.split(' / ').includes(name)) names.set(day, `${had} / ${name}`);
    }
  }
  const order = (a: [number, string], b: [number, string]) => a[0] - b[0];
  return { days: new Set([...days].sort((a, b) => a - b)), names: new Map([...names].sort(order)) };
}

/**
 * One region's public holidays of one year as [day, name] pairs, kept: the library takes some milliseconds
 * a year, and every series of a brief asks for the same years (at most 64 regions are kept).
 */
const kept = new Map<string, { hd: HolidaysClass; years: Map<number, [number, string][]> }>();

function yearOf(r: HolidayRegion, year: number): [number, string][] {
  let entry = kept.get(r.code);
  if (entry === undefined) {
    if (kept.size >= 64) kept.clear();
    const Holidays = lib();
    const opts = { types: ['public' as const], languages: 'en' };
    const hd =
      r.region !== undefined && r.state !== undefined
        ? new Holidays(r.country, r.state, r.region, opts)
        : r.state !== undefined
          ? new Holidays(r.country, r.state, opts)
          : new Holidays(r.country, opts);
    entry = { hd, years: new Map() };
    kept.set(r.code, entry);
  }
  const known = entry.years.get(year);
  if (known !== undefined) return known;
  const out: [number, string][] = [];
  for (const h of entry.hd.getHolidays(year) ?? []) {
    if (h.type !== 'public') continue;
    for (const day of wholeDays(h)) out.push([day, h.name]);
  }
  entry.years.set(year, out);
  return out;
}

/**
 * The whole local days a holiday covers. Its `date` is the local start "YYYY-MM-DD hh:mm:ss"; start and end
 * give its length. A trailing offset marks a holiday reckoned from sunset to sunset (Islamic holidays:
 * "2024-04-10 00:00:00 -0600" begins at sunset on the 9th and lasts 24 hours): each of its days counts as
 * the civil day it ends in, so the 10th. A holiday that begins later than midnight (noon on Christmas
 * Eve) leaves its first day a working morning: counting starts the next day.
 */
export function wholeDays(h: { date: string; start: Date; end: Date }): number[] {
  const m = /^(\d{4})-(\d\d)-(\d\d) (\d\d):(\d\d)/.exec(h.date);
  if (!m) return [];
  let first = Date.UTC(+m[1], +m[2] - 1, +m[3]) / DAY;
  let hours = (h.end.getTime() - h.start.getTime()) / 3_600_000;
  const startsAt = +m[4] + +m[5] / 60;
  if (!/\s[+-]\d{4}$/.test(h.date) && startsAt > 0) {
    first += 1;
    hours -= 24 - startsAt;
  }
  // Summer time makes a day 23 or 25 hours: a tolerance of an hour and a bit.
  const count = Math.floor((hours + 1.5) / 24);
  return Array.from({ length: Math.max(0, count) }, (_, i) => first + i);
}

/** Codes people write that ISO 3166-1 reserves for another: the United Kingdom is GB, Greece GR. */
const ALIASES: Record<string, string> = { UK: 'GB', EL: 'GR' };

function findCode(text: string, table: Record<string, string>): string | null {
  const t = text.trim().toUpperCase();
  for (const code of Object.keys(table)) if (code.toUpperCase() === t) return code;
  return null;
}

function norm(s: string): string {
  return s
    .normalize('NFD')
    .replace(/\p{M}/gu, '')
    .toLowerCase()
    .replace(/[^a-z0-9]/g, '');
}

/**
 * Up to four codes whose code or English name is close to `text`: within one edit for up to four
 * characters, two up to eight, three beyond (as suggest.ts's rule), or a name that begins with it.
 */
export function suggest(text: string, table: Record<string, string>, aliases: Record<string, string> = {}): string[] {
  const t = norm(text);
  if (t === '') return [];
  const limit = t.length <= 4 ? 1 : t.length <= 8 ? 2 : 3;
  const scored: { code: string; d: number }[] = [];
  const alias = aliases[text.trim().toUpperCase()];
  if (alias && table[alias] !== undefined) scored.push({ code: alias, d: -1 });
  for (const [code, name] of Object.entries(table)) {
    if (code === alias) continue;
    const n = norm(name);
    let d = Math.min(editDistance(t, norm(code)), editDistance(t, n));
    if (t.length >= 3 && n.startsWith(t)) d = Math.min(d, 0.5);
    if (d <= limit) scored.push({ code, d });
  }
  scored.sort((a, b) => a.d - b.d || a.code.localeCompare(b.code));
  return scored.slice(0, 4).map((s) => `${s.code} (${table[s.code]})`);
}

function unknown(what: string, close: string[], place: Place, within?: string): BriefError {
  const matches = close.length > 0 ? `; close matches: ${close.join(', ')}` : '';
  const hint = within
    ? `write a state or region of ${within} as the library codes it, or just ${within.split('-')[0]} for the whole country`
    : 'write a country as its two-letter ISO 3166-1 code (GB, US, DE), optionally a state or region after a dash (GB-ENG, US-NY, DE-BY)';
  return new BriefError('holiday-region', `${what}${matches}`, hint, place);
}
