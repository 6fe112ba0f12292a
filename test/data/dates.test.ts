import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  civilFromDays,
  daysFromCivil,
  fitsFrequency,
  inferFrequency,
  type ParsedPeriod,
  parsePeriod,
} from '../../src/data/dates.js';

const DAY = 86_400_000;
const utc = (y: number, m: number, d: number, hh = 0, mm = 0, ss = 0) => Date.UTC(y, m - 1, d, hh, mm, ss);
const parseAll = (texts: string[]): ParsedPeriod[] =>
  texts.map((t) => {
    const p = parsePeriod(t);
    if (p === null) throw new Error(`test data does not parse: ${t}`);
    return p;
  });

// Expected instants come from the engine's own calendar (Date.UTC, ECMA-262 §21.4.1), which the parser
// does not use.
describe('parsePeriod — ISO 8601 forms', () => {
  it('reads calendar dates as daily', () => {
    expect(parsePeriod('2024-03-05')).toEqual({ frequency: 'daily', utcMs: utc(2024, 3, 5), kind: 'date' });
    expect(parsePeriod(' 1999-12-31 ')).toEqual({ frequency: 'daily', utcMs: utc(1999, 12, 31), kind: 'date' });
  });

  it('reads year-month as monthly, starting on the 1st', () => {
    expect(parsePeriod('2024-03')).toEqual({ frequency: 'monthly', utcMs: utc(2024, 3, 1), kind: 'month' });
  });

  it('reads year-quarter in four spellings as quarterly (common practice)', () => {
    for (const t of ['2024-Q2', '2024Q2', '2024-q2', '2024q2']) {
      expect(parsePeriod(t)).toEqual({ frequency: 'quarterly', utcMs: utc(2024, 4, 1), kind: 'quarter' });
    }
    expect(parsePeriod('2024-Q1')?.utcMs).toBe(utc(2024, 1, 1));
    expect(parsePeriod('2024-Q4')?.utcMs).toBe(utc(2024, 10, 1));
  });

  it('reads ISO weeks as weekly, on the Monday of the ISO week', () => {
    // 2024-01-01 is a Monday, so 2024-W01 starts that day and W09 eight weeks later: 1 + 56 days = Feb 26.
    expect(parsePeriod('2024-W09')).toEqual({ frequency: 'weekly', utcMs: utc(2024, 2, 26), kind: 'week' });
    expect(parsePeriod('2024W09')?.utcMs).toBe(utc(2024, 2, 26));
    expect(parsePeriod('2024-w09')?.utcMs).toBe(utc(2024, 2, 26));
    // Weekday 1 is Monday, 7 Sunday (ISO 8601).
    expect(parsePeriod('2024-W09-1')?.utcMs).toBe(utc(2024, 2, 26));
    expect(parsePeriod('2024-W09-7')?.utcMs).toBe(utc(2024, 3, 3));
    expect(parsePeriod('2024W097')?.utcMs).toBe(utc(2024, 3, 3));
  });

  it('follows the ISO week-numbering year at the turn of the year (ISO 8601, common practice)', () => {
    // 2020 began on a Wednesday and is a leap year, so it has 53 ISO weeks; W53 starts Monday 2020-12-28.
    expect(parsePeriod('2020-W53')?.utcMs).toBe(utc(2020, 12, 28));
    // 2021 began on a Friday (in 2020-W53) and is not a leap year: 52 weeks only.
    expect(parsePeriod('2021-W53')).toBeNull();
    expect(parsePeriod('2021-W52')?.utcMs).toBe(utc(2021, 12, 27));
    // 2024-12-30 (a Monday) belongs to 2025-W01, since that week holds Thursday 2025-01-02.
    expect(parsePeriod('2025-W01')?.utcMs).toBe(utc(2024, 12, 30));
    // 2026 begins on a Thursday, so it has 53 weeks (from memory: 1 January 2026 is a Thursday).
    expect(parsePeriod('2026-W53')?.utcMs).toBe(utc(2026, 12, 28));
    // 2010-W01 begins 2010-01-04, since 2010-01-01 was a Friday (in 2009-W53).
    expect(parsePeriod('2010-W01')?.utcMs).toBe(utc(2010, 1, 4));
    expect(parsePeriod('2009-W53')?.utcMs).toBe(utc(2009, 12, 28));
  });

  it('reads date-times as hourly and converts offsets to UTC', () => {
    expect(parsePeriod('2024-03-05T13:00')).toEqual({
      frequency: 'hourly',
      utcMs: utc(2024, 3, 5, 13),
      kind: 'datetime',
    });
    expect(parsePeriod('2024-03-05 13:00')?.utcMs).toBe(utc(2024, 3, 5, 13));
    expect(parsePeriod('2024-03-05T13:00:45')?.utcMs).toBe(utc(2024, 3, 5, 13, 0, 45));
    expect(parsePeriod('2024-03-05T13:00:45.250Z')?.utcMs).toBe(utc(2024, 3, 5, 13, 0, 45));
    expect(parsePeriod('2024-03-05T13:00Z')?.utcMs).toBe(utc(2024, 3, 5, 13));
    // Local time = UTC + offset: 13:00+01:00 is 12:00Z, 13:00-05:00 is 18:00Z, 13:00+05:30 is 07:30Z.
    expect(parsePeriod('2024-03-05T13:00+01:00')?.utcMs).toBe(utc(2024, 3, 5, 12));
    expect(parsePeriod('2024-03-05 13:00:00-05:00')?.utcMs).toBe(utc(2024, 3, 5, 18));
    expect(parsePeriod('2024-03-05T13:00+0530')?.utcMs).toBe(utc(2024, 3, 5, 7, 30));
    // Crossing midnight backwards: 00:30+02:00 on the 1st is 22:30Z on the last day of the month before.
    expect(parsePeriod('2024-03-01T00:30+02:00')?.utcMs).toBe(utc(2024, 2, 29, 22, 30));
  });

  it('rejects impossible dates instead of rolling them over', () => {
    for (const t of [
      '2024-02-30', // February 2024 has 29 days
      '2023-02-29', // 2023 is not a leap year
      '1900-02-29', // century years are leap only when divisible by 400 (Gregorian rule)
      '2024-04-31', // April has 30 days
      '2024-13-01',
      '2024-00-10',
      '2024-01-00',
      '2024-13',
      '2024-00',
      '2024-Q0',
      '2024-Q5',
      '2024-W00',
      '2024-W54',
      '2024-W09-8',
      '2024-W09-0',
      '2024-03-05T24:00',
      '2024-03-05T12:60',
      '2024-03-05T12:00:60',
      '2024-03-05T12:00+24:00',
    ]) {
      expect(parsePeriod(t), t).toBeNull();
    }
    expect(parsePeriod('2000-02-29')?.utcMs).toBe(utc(2000, 2, 29));
    expect(parsePeriod('2024-02-29')?.utcMs).toBe(utc(2024, 2, 29));
  });

  it('rejects other spellings', () => {
    for (const t of [
      '',
      '2024',
      '05/03/2024',
      '2024/03/05',
      '2024-3-5',
      '2024-03-5',
      '24-03-05',
      '2024-03-05X',
      '2024-03-05T13',
      '2024-03-05T13:00+',
      '2024-03-05T13:00Zulu',
      '0001-01-01',
      'March 2024',
      '2024-W9',
      '2024-W091',
      '2024-Q12',
    ]) {
      expect(parsePeriod(t), t).toBeNull();
    }
  });

  it('agrees with Date.UTC on random valid dates (property)', () => {
    fc.assert(
      fc.property(
        fc.date({ min: new Date('1000-01-01T00:00Z'), max: new Date('9999-12-31T23:59Z'), noInvalidDate: true }),
        (d) => {
          const iso = d.toISOString();
          const day = Date.UTC(d.getUTCFullYear(), d.getUTCMonth(), d.getUTCDate());
          expect(parsePeriod(iso.slice(0, 10))?.utcMs).toBe(day);
          const minute = Math.floor(d.getTime() / 60_000) * 60_000;
          expect(parsePeriod(`${iso.slice(0, 16)}Z`)?.utcMs).toBe(minute);
        },
      ),
      { numRuns: 500 },
    );
  });
});

describe('daysFromCivil / civilFromDays — Hinnant (2013)', () => {
  it('matches the published anchors', () => {
    expect(daysFromCivil(1970, 1, 1)).toBe(0);
    // 2000-03-01: 30 years of 365 days plus 7 leap days (72, 76, …, 96) plus 31 + 29 days = 11017.
    expect(daysFromCivil(2000, 3, 1)).toBe(11017);
    expect(daysFromCivil(1969, 12, 31)).toBe(-1);
  });

  it('round-trips and agrees with Date.UTC (property)', () => {
    fc.assert(
      fc.property(fc.integer({ min: -354_000, max: 2_900_000 }), (days) => {
        const { y, m, d } = civilFromDays(days);
        expect(daysFromCivil(y, m, d)).toBe(days);
        const date = new Date(days * DAY);
        expect([y, m, d]).toEqual([date.getUTCFullYear(), date.getUTCMonth() + 1, date.getUTCDate()]);
      }),
      { numRuns: 500 },
    );
  });
});

describe('inferFrequency', () => {
  it('takes months, quarters and weeks from their form', () => {
    expect(inferFrequency(parseAll(['2024-01', '2024-02']))).toBe('monthly');
    expect(inferFrequency(parseAll(['2024-Q1', '2024-Q3']))).toBe('quarterly');
    expect(inferFrequency(parseAll(['2024-W01', '2024-W02']))).toBe('weekly');
    expect(inferFrequency(parseAll(['2024-01']))).toBe('monthly');
  });

  it('reads ISO dates on the 1st of each month as monthly, also across a gap', () => {
    expect(inferFrequency(parseAll(['2024-01-01', '2024-02-01', '2024-03-01', '2024-05-01']))).toBe('monthly');
    // February 1 to March 1 of a common year is exactly 28 days = 4 weeks; still monthly, not weekly.
    expect(inferFrequency(parseAll(['2023-02-01', '2023-03-01']))).toBe('monthly');
  });

  it('reads month-end dates as monthly', () => {
    expect(inferFrequency(parseAll(['2024-01-31', '2024-02-29', '2024-03-31', '2024-04-30']))).toBe('monthly');
  });

  it('reads the 1st of each quarter with about 91-day spacing as quarterly', () => {
    // Spacings 90, 91, 92, 92 days (Jan–Mar of 2023 has 31 + 28 + 31 = 90).
    expect(inferFrequency(parseAll(['2023-01-01', '2023-04-01', '2023-07-01', '2023-10-01', '2024-01-01']))).toBe(
      'quarterly',
    );
    // Quarter ends, too.
    expect(inferFrequency(parseAll(['2023-03-31', '2023-06-30', '2023-09-30', '2023-12-31']))).toBe('quarterly');
  });

  it('reads 7-day spacing as weekly, also with a missing week', () => {
    expect(inferFrequency(parseAll(['2024-03-04', '2024-03-11', '2024-03-18', '2024-04-01']))).toBe('weekly');
    // Unsorted input is sorted first.
    expect(inferFrequency(parseAll(['2024-03-18', '2024-03-04', '2024-03-11']))).toBe('weekly');
  });

  it('reads everything else as daily', () => {
    // Weekdays only: spacings 1, 1, 1, 1, 3.
    expect(
      inferFrequency(parseAll(['2024-03-04', '2024-03-05', '2024-03-06', '2024-03-07', '2024-03-08', '2024-03-11'])),
    ).toBe('daily');
    expect(inferFrequency(parseAll(['2024-03-05']))).toBe('daily');
    // 1st of the month but one 15th breaks the pattern.
    expect(inferFrequency(parseAll(['2024-01-01', '2024-02-01', '2024-03-15']))).toBe('daily');
  });

  it('reads date-times as hourly, unless all are at midnight UTC', () => {
    expect(inferFrequency(parseAll(['2024-03-05T00:00', '2024-03-05T01:00']))).toBe('hourly');
    expect(inferFrequency(parseAll(['2024-03-05 00:00:00', '2024-03-06 00:00:00']))).toBe('daily');
    expect(inferFrequency(parseAll(['2024-01-01T00:00Z', '2024-02-01T00:00Z', '2024-03-01T00:00Z']))).toBe('monthly');
  });
});

describe('fitsFrequency', () => {
  it('lets dates stand for coarser periods but not for hours', () => {
    const [date] = parseAll(['2024-03-05']);
    expect(fitsFrequency(date, 'daily')).toBe(true);
    expect(fitsFrequency(date, 'monthly')).toBe(true);
    expect(fitsFrequency(date, 'hourly')).toBe(false);
  });

  it('keeps months, quarters and weeks to their own frequency', () => {
    const [month, quarter, week] = parseAll(['2024-03', '2024-Q1', '2024-W09']);
    expect(fitsFrequency(month, 'monthly')).toBe(true);
    expect(fitsFrequency(month, 'quarterly')).toBe(false);
    expect(fitsFrequency(quarter, 'monthly')).toBe(false);
    expect(fitsFrequency(week, 'daily')).toBe(false);
  });

  it('lets date-times stand for days only at midnight', () => {
    const [midnight, noon] = parseAll(['2024-03-05T00:00Z', '2024-03-05T12:00Z']);
    expect(fitsFrequency(midnight, 'daily')).toBe(true);
    expect(fitsFrequency(noon, 'daily')).toBe(false);
    expect(fitsFrequency(noon, 'hourly')).toBe(true);
  });
});
