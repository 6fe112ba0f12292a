/**
 * Public holidays from the date-holidays library (src/calendar/holidays.ts): which days count, their names,
 * and the error for an unknown country or region. The dates below are facts of the calendar checked by
 * hand against the weekday rules the laws set (England and Wales: Banking and Financial Dealings Act 1971,
 * schedule 1, and the royal proclamations moving a bank holiday); the comparison with R's timeDate over
 * 1990–2040 is in holidays-timedate.test.ts.
 */
import { spawnSync } from 'node:child_process';
import { describe, expect, it } from 'vitest';
import { checkHolidayRegion, holidayLibrary, publicHolidays, wholeDays } from '../../src/calendar/holidays.js';
import { errorOf } from '../support/error-of.js';

const DAY = 86_400_000;
const iso = (day: number) => new Date(day * DAY).toISOString().slice(0, 10);
const dayOf = (s: string) => Date.parse(`${s}T00:00:00Z`) / DAY;
const listed = (region: string, from: number, to = from) => [...publicHolidays(region, from, to).days].map(iso).sort();

describe('public holidays of a region', () => {
  it('England 2024: the eight bank holidays, names from the library in English', () => {
    // 2024: Easter Sunday 31 March; first Monday of May the 6th, last Mondays of May and August 27th, 26th.
    const got = publicHolidays('GB-ENG', 2024, 2024);
    expect([...got.days].map(iso)).toEqual([
      '2024-01-01',
      '2024-03-29',
      '2024-04-01',
      '2024-05-06',
      '2024-05-27',
      '2024-08-26',
      '2024-12-25',
      '2024-12-26',
    ]);
    expect(got.names.get(dayOf('2024-03-29'))).toBe('Good Friday');
    expect(got.names.get(dayOf('2024-12-26'))).toBe('Boxing Day');
  });

  it('England 2020: the May holiday moved to Friday 8 May (VE Day), Boxing Day on a Saturday gives Monday 28th', () => {
    const got = listed('GB-ENG', 2020);
    expect(got).toContain('2020-05-08');
    expect(got).not.toContain('2020-05-04');
    expect(got).toContain('2020-12-26');
    expect(got).toContain('2020-12-28');
  });

  it('Scotland differs from England: 2 January and St Andrew’s Day, the first Monday of August', () => {
    const got = listed('gb-sct', 2024); // the case of the code does not matter
    expect(got).toContain('2024-01-02');
    expect(got).toContain('2024-08-05');
    expect(got).not.toContain('2024-08-26');
  });

  it('only public holidays: Christmas Eve (optional) and Valentine’s Day (observance) are not counted in the US', () => {
    const got = listed('US', 2022);
    expect(got).not.toContain('2022-12-24');
    expect(got).not.toContain('2022-02-14');
    expect(got).toContain('2022-11-24'); // Thanksgiving, fourth Thursday of November
    expect(got).toContain('2022-12-26'); // Christmas on a Sunday: Monday off
  });

  it('a span of years holds every year’s holidays and nothing outside it', () => {
    const got = listed('GB-ENG', 2023, 2025);
    expect(got.slice(0, 2)).toEqual(['2023-01-01', '2023-01-02']); // New Year's Day 2023 a Sunday: Monday off too
    expect(got.at(-1)).toBe('2025-12-26');
    expect(got.filter((d) => d.startsWith('2024'))).toEqual(listed('GB-ENG', 2024));
  });

  it('several days at once and half days: Eid al-Fitr 2024 in Türkiye is 10–12 April, Iceland’s Christmas Eve afternoon no day', () => {
    const tr = listed('TR', 2024);
    expect(tr.filter((d) => d.startsWith('2024-04-'))).toEqual([
      '2024-04-10',
      '2024-04-11',
      '2024-04-12',
      '2024-04-23',
    ]);
    const is = listed('IS', 2024);
    expect(is).not.toContain('2024-12-24');
    expect(is).toContain('2024-12-25');
  });

  it('whole days of one holiday, by its start and length', () => {
    const at = (iso: string) => new Date(iso);
    // A day from midnight; a sunset-to-sunset day counted as the day it ends in; noon to midnight none.
    expect(
      wholeDays({ date: '2024-12-25 00:00:00', start: at('2024-12-25T00:00Z'), end: at('2024-12-26T00:00Z') }).map(iso),
    ).toEqual(['2024-12-25']);
    expect(
      wholeDays({
        date: '2024-04-10 00:00:00 -0600',
        start: at('2024-04-09T14:00Z'),
        end: at('2024-04-12T14:00Z'),
      }).map(iso),
    ).toEqual(['2024-04-10', '2024-04-11', '2024-04-12']);
    expect(
      wholeDays({ date: '2024-12-24 12:00:00', start: at('2024-12-24T12:00Z'), end: at('2024-12-25T00:00Z') }),
    ).toEqual([]);
    // A 23-hour day (clocks forward) is still a day.
    expect(
      wholeDays({ date: '2024-03-31 00:00:00', start: at('2024-03-31T00:00Z'), end: at('2024-03-31T23:00Z') }),
    ).toHaveLength(1);
  });

  it('names the library and its version', () => {
    expect(holidayLibrary()).toMatch(/^date-holidays \d+\.\d+\.\d+$/);
  });
});

describe('an unknown country or region: one located line with close matches', () => {
  const place = { file: 'job.yaml', line: 7, column: 13 };

  it('"UK" suggests GB, the code ISO 3166-1 gives the United Kingdom', () => {
    const e = errorOf(() => checkHolidayRegion('UK', place));
    expect(e.code).toBe('holiday-region');
    expect(e.oneLine()).toMatch(/^job\.yaml:7:13: unknown holiday country "UK"; close matches: GB \(United Kingdom\)/);
    expect(e.oneLine()).toContain('ISO 3166-1');
    expect(e.oneLine()).not.toContain('\n');
  });

  it('a misspelt name finds the country', () => {
    expect(errorOf(() => checkHolidayRegion('Grmany')).message).toContain('DE (Germany)');
    expect(errorOf(() => checkHolidayRegion('Sweeden')).message).toContain('SE (Sweden)');
  });

  it('an unknown state lists the close states of that country and says how to take the whole country', () => {
    const e = errorOf(() => publicHolidays('US-NX', 2024, 2024, place));
    expect(e.message).toMatch(/^United States of America \(US\) has no state or region "NX".*; close matches: NC/);
    expect(errorOf(() => checkHolidayRegion('US-Nwe York')).message).toContain('close matches: NY (New York)');
    expect(e.hint).toContain('just US');
    const r = errorOf(() => checkHolidayRegion('DE-BY-ZZZ'));
    expect(r.message).toContain('(DE-BY) has no region "ZZZ"');
  });

  it('nothing close: still one line, with the form to write', () => {
    const e = errorOf(() => checkHolidayRegion('QQQQQQQ'));
    expect(e.message).toBe('unknown holiday country "QQQQQQQ"');
    expect(e.hint).toContain('GB-ENG');
    expect(errorOf(() => checkHolidayRegion('GB--ENG')).message).toBe('"GB--ENG" is not a holiday region');
    expect(errorOf(() => checkHolidayRegion('')).code).toBe('holiday-region');
  });

  it('a known region is returned with its codes and names', () => {
    expect(checkHolidayRegion('de-by-a')).toMatchObject({ code: 'DE-BY-A', country: 'DE', state: 'BY', region: 'A' });
    expect(checkHolidayRegion('GB-ENG').name).toBe('England, United Kingdom');
  });
});

describe('loading', () => {
  it('the library is loaded on the first call, not on import (built code, a child process)', () => {
    const r = spawnSync(
      process.execPath,
      [
        new URL('./files/holidays-lazy.mjs', import.meta.url).pathname,
        new URL('../../dist/calendar/holidays.js', import.meta.url).href,
      ],
      { encoding: 'utf8' },
    );
    expect(r.status, r.stderr).toBe(0);
    expect(JSON.parse(r.stdout)).toEqual({ before: false, after: true, days: 8 });
  });
});
