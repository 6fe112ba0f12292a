/**
 * spansFor: the spans each comparison sets side by side, checked against calendar dates worked out by hand.
 * Conventions (common practice): a year (or fiscal year) to date runs from the first period of the year
 * holding the reporting period up to it, against the same calendar stretch a year before (for weeks, as
 * many weeks from the start of the year before); the same period last year is the same month or quarter,
 * the same ISO week number, or for days and hours the same weekday 52 weeks back (364 days). Weeks are ISO
 * 8601 weeks and belong to the year holding their Thursday, so ISO week 1 opens the year.
 */
import { describe, expect, test } from 'vitest';
import { spansFor, yearStart } from '../../src/analyse/spans.js';
import { type Frequency, isoOf, isoWeekStart, ordinalOf, startOf } from '../../src/vocabulary/period-index.js';

type Kind = Parameters<typeof spansFor>[0];

/** The spans as ISO dates and lengths, for readable expectations. */
function spans(kind: Kind, f: Frequency, reportingMs: number, fiscal = 1) {
  const p = spansFor(kind, f, ordinalOf(f, reportingMs), fiscal);
  return {
    current: [isoOf(f, p.current.from), isoOf(f, p.current.to), p.current.to - p.current.from + 1],
    baseline: [isoOf(f, p.baseline.from), isoOf(f, p.baseline.to), p.baseline.to - p.baseline.from + 1],
    partial: p.partial,
  };
}
const month = (y: number, m: number) => Date.UTC(y, m - 1, 1);
const day = (y: number, m: number, d: number) => Date.UTC(y, m - 1, d);

describe('year to date', () => {
  test('monthly, September 2026: January to September against the same nine months of 2025', () => {
    expect(spans('year-to-date', 'monthly', month(2026, 9))).toEqual({
      current: ['2026-01-01', '2026-09-01', 9],
      baseline: ['2025-01-01', '2025-09-01', 9],
      partial: true,
    });
  });

  test('monthly, December: the whole year, not partial', () => {
    expect(spans('year-to-date', 'monthly', month(2026, 12)).current).toEqual(['2026-01-01', '2026-12-01', 12]);
    expect(spans('year-to-date', 'monthly', month(2026, 12)).partial).toBe(false);
  });

  test('monthly, January: just January', () => {
    expect(spans('year-to-date', 'monthly', month(2026, 1)).current).toEqual(['2026-01-01', '2026-01-01', 1]);
  });

  test('quarterly, Q3 2026: Q1 to Q3', () => {
    expect(spans('year-to-date', 'quarterly', month(2026, 7))).toEqual({
      current: ['2026-01-01', '2026-07-01', 3],
      baseline: ['2025-01-01', '2025-07-01', 3],
      partial: true,
    });
  });

  test('weekly, ISO week 1 of 2026 (Monday 29 December 2025): just that week', () => {
    // 1 January 2026 is a Thursday, so the week of 29 December 2025 is ISO week 1 of 2026.
    expect(spans('year-to-date', 'weekly', isoWeekStart(2026, 1))).toEqual({
      current: ['2025-12-29', '2025-12-29', 1],
      baseline: ['2024-12-30', '2024-12-30', 1], // 52 weeks back: ISO week 1 of 2025
      partial: true,
    });
  });

  test('weekly, ISO week 10 of 2026: weeks 1 to 10', () => {
    const s = spans('year-to-date', 'weekly', isoWeekStart(2026, 10));
    expect(s.current).toEqual(['2025-12-29', '2026-03-02', 10]); // 29 Dec + 9·7 days = 2 March
    expect(s.baseline).toEqual(['2024-12-30', '2025-03-03', 10]);
  });

  test('weekly, ISO week 53 of 2020: all 53 weeks of the ISO year', () => {
    // ISO 2020 runs from Monday 30 December 2019 (1 January 2020 was a Wednesday) to week 53 (28 December 2020).
    const s = spans('year-to-date', 'weekly', isoWeekStart(2020, 53));
    expect(s.current).toEqual(['2019-12-30', '2020-12-28', 53]);
    expect(s.partial).toBe(false);
  });

  test('daily, 1 January: one day; 3 February: 34 days', () => {
    expect(spans('year-to-date', 'daily', day(2026, 1, 1)).current).toEqual(['2026-01-01', '2026-01-01', 1]);
    expect(spans('year-to-date', 'daily', day(2026, 2, 3)).current).toEqual(['2026-01-01', '2026-02-03', 34]); // 31 + 3
  });

  test('hourly, 05:00 on 1 January 2026: six hours, baseline the same hours of 1 January 2025', () => {
    const s = spans('year-to-date', 'hourly', Date.UTC(2026, 0, 1, 5));
    expect(s.current).toEqual(['2026-01-01T00:00Z', '2026-01-01T05:00Z', 6]);
    expect(s.baseline).toEqual(['2025-01-01T00:00Z', '2025-01-01T05:00Z', 6]);
  });
});

describe('fiscal year to date across a year boundary (fiscal year from July)', () => {
  test('monthly, February 2026: July 2025 to February 2026, eight months', () => {
    expect(spans('fiscal-year-to-date', 'monthly', month(2026, 2), 7)).toEqual({
      current: ['2025-07-01', '2026-02-01', 8], // Jul Aug Sep Oct Nov Dec Jan Feb
      baseline: ['2024-07-01', '2025-02-01', 8],
      partial: true,
    });
  });

  test('monthly, July 2026: just July', () => {
    expect(spans('fiscal-year-to-date', 'monthly', month(2026, 7), 7)).toEqual({
      current: ['2026-07-01', '2026-07-01', 1],
      baseline: ['2025-07-01', '2025-07-01', 1],
      partial: true,
    });
  });

  test('monthly, June 2026: the whole fiscal year, not partial', () => {
    const s = spans('fiscal-year-to-date', 'monthly', month(2026, 6), 7);
    expect(s.current).toEqual(['2025-07-01', '2026-06-01', 12]);
    expect(s.partial).toBe(false);
  });

  test('quarterly, Q1 2026: Q3 2025 to Q1 2026; Q3 2026: just Q3', () => {
    expect(spans('fiscal-year-to-date', 'quarterly', month(2026, 1), 7).current).toEqual([
      '2025-07-01',
      '2026-01-01',
      3,
    ]);
    expect(spans('fiscal-year-to-date', 'quarterly', month(2026, 7), 7).current).toEqual([
      '2026-07-01',
      '2026-07-01',
      1,
    ]);
  });

  test('quarterly with an April fiscal year, Q1 2026: Q2 2025 to Q1 2026, the full year', () => {
    const s = spans('fiscal-year-to-date', 'quarterly', month(2026, 1), 4);
    expect(s.current).toEqual(['2025-04-01', '2026-01-01', 4]);
    expect(s.partial).toBe(false);
  });

  test('weekly, week of Monday 2 February 2026: from the week of Monday 30 June 2025', () => {
    // 1 July 2025 is a Tuesday; the week of 30 June holds Thursday 3 July, so it opens the fiscal year.
    // 30 June 2025 to 2 February 2026 is 217 days = 31 weeks, so 32 weekly periods.
    expect(spans('fiscal-year-to-date', 'weekly', day(2026, 2, 2), 7).current).toEqual([
      '2025-06-30',
      '2026-02-02',
      32,
    ]);
  });

  test('weekly, the first and last weeks of a fiscal year', () => {
    expect(spans('fiscal-year-to-date', 'weekly', day(2025, 6, 30), 7).current).toEqual([
      '2025-06-30',
      '2025-06-30',
      1,
    ]);
    // The week of 23 June 2025 holds Thursday 26 June: still the year that began with the week of
    // Monday 1 July 2024; 357 days later is 51 weeks, so 52 periods.
    const last = spans('fiscal-year-to-date', 'weekly', day(2025, 6, 23), 7);
    expect(last.current).toEqual(['2024-07-01', '2025-06-23', 52]);
    expect(last.partial).toBe(false);
  });

  test('daily, 3 February 2026: 1 July 2025 onwards, 218 days; baseline the same calendar dates a year before', () => {
    const s = spans('fiscal-year-to-date', 'daily', day(2026, 2, 3), 7);
    // July 31 + Aug 31 + Sep 30 + Oct 31 + Nov 30 + Dec 31 + Jan 31 = 215, plus 3 days of February
    expect(s.current).toEqual(['2025-07-01', '2026-02-03', 218]);
    // 1 July 2024 to 3 February 2025: the same 215 + 3 days (no 29 February inside).
    expect(s.baseline).toEqual(['2024-07-01', '2025-02-03', 218]);
  });

  test('daily year to date on 31 December 2024 (a leap year) does not overlap its baseline', () => {
    const s = spans('year-to-date', 'daily', day(2024, 12, 31));
    expect(s.current).toEqual(['2024-01-01', '2024-12-31', 366]);
    expect(s.baseline).toEqual(['2023-01-01', '2023-12-31', 365]);
    expect(s.partial).toBe(false);
  });

  test('29 February compares with 28 February', () => {
    expect(spans('year-to-date', 'daily', day(2024, 2, 29)).baseline).toEqual(['2023-01-01', '2023-02-28', 59]);
  });

  test('a fiscal year from January is the calendar year', () => {
    expect(spans('fiscal-year-to-date', 'monthly', month(2026, 9), 1)).toEqual(
      spans('year-to-date', 'monthly', month(2026, 9)),
    );
  });
});

describe('rolling year and same period last year', () => {
  test('monthly rolling 12: October 2025 to September 2026 against the twelve months before', () => {
    expect(spans('latest-year', 'monthly', month(2026, 9))).toEqual({
      current: ['2025-10-01', '2026-09-01', 12],
      baseline: ['2024-10-01', '2025-09-01', 12],
      partial: false,
    });
  });

  test('the rolling year is 4 quarters, 52 weeks, 364 days', () => {
    expect(spans('latest-year', 'quarterly', month(2026, 7)).current).toEqual(['2025-10-01', '2026-07-01', 4]);
    expect(spans('latest-year', 'weekly', isoWeekStart(2026, 10)).current[2]).toBe(52);
    expect(spans('latest-year', 'daily', day(2026, 9, 30)).current).toEqual(['2025-10-02', '2026-09-30', 364]);
  });

  test('same period last year: September 2025; for a day, the same weekday 52 weeks back', () => {
    expect(spans('year-on-year', 'monthly', month(2026, 9)).baseline).toEqual(['2025-09-01', '2025-09-01', 1]);
    // Wednesday 30 September 2026 − 364 days = Wednesday 1 October 2025
    expect(spans('year-on-year', 'daily', day(2026, 9, 30)).baseline).toEqual(['2025-10-01', '2025-10-01', 1]);
    expect(spans('year-on-year', 'quarterly', month(2026, 7)).baseline).toEqual(['2025-07-01', '2025-07-01', 1]);
  });
});

describe('weeks and days like with like', () => {
  const len = (x: (string | number)[]) => x[2];

  test('same week last year is the same ISO week number, not 52 weeks back', () => {
    // Found: 2021-W01 (Monday 4 January 2021) − 52 weeks = Monday 6 January 2020, which is 2020-W02,
    // because ISO 2020 had 53 weeks. The same week number is 2020-W01, Monday 30 December 2019.
    const s = spansFor('year-on-year', 'weekly', ordinalOf('weekly', isoWeekStart(2021, 1)), 1);
    expect(isoOf('weekly', s.baseline.from)).toBe('2019-12-30');
    expect(s.alignment).toBe('iso-week');
  });

  test('week 53 compares with week 52 of a year that has no week 53', () => {
    // Found: 2020-W53 was compared with 2020-W01 (52 weeks back). ISO 2019 has 52 weeks; its week 52 starts
    // on Monday 23 December 2019.
    expect(spans('year-on-year', 'weekly', isoWeekStart(2020, 53)).baseline).toEqual(['2019-12-23', '2019-12-23', 1]);
    // ISO 2015 has 53 weeks (1 January 2015 was a Thursday), so 52 weeks back from 2016-W01 is 2015-W02; the
    // same week number is 2015-W01.
    expect(spans('year-on-year', 'weekly', isoWeekStart(2016, 1)).baseline[0]).toBe(
      isoOf('weekly', ordinalOf('weekly', isoWeekStart(2015, 1))),
    );
  });

  test('a weekly fiscal year to date has as many weeks as its baseline', () => {
    // Found: fiscal year from July, reporting week 2021-W01 (4 January 2021): the year began with the week of
    // Monday 29 June 2020, 28 weeks; the baseline ran from Monday 1 July 2019 to the same ISO week number
    // (2019-12-30), 27 weeks. Now 28 weeks from 1 July 2019: to Monday 6 January 2020 (1 July + 27·7 days).
    const s = spans('fiscal-year-to-date', 'weekly', isoWeekStart(2021, 1), 7);
    expect(s.current).toEqual(['2020-06-29', '2021-01-04', 28]);
    expect(s.baseline).toEqual(['2019-07-01', '2020-01-06', 28]);
  });

  test('property: every weekly year or fiscal year to date, 2000–2040, matches its baseline in length but for week 53', () => {
    for (
      let week = ordinalOf('weekly', Date.UTC(2000, 0, 3));
      week < ordinalOf('weekly', Date.UTC(2040, 0, 1));
      week++
    ) {
      for (const month of [1, 4, 7, 10]) {
        const kind = month === 1 ? 'year-to-date' : 'fiscal-year-to-date';
        const p = spansFor(kind, 'weekly', week, month);
        const a = p.current.to - p.current.from + 1;
        const b = p.baseline.to - p.baseline.from + 1;
        // The baseline's year before may have one week fewer: only the 53rd week of a current year lacks a twin.
        if (a !== b) expect([a, b]).toEqual([53, 52]);
        expect(p.baseline.to).toBeLessThan(p.current.from);
      }
    }
  });

  test('a leap year to date is a day longer than its baseline (the brief says so)', () => {
    const s = spans('year-to-date', 'daily', day(2024, 3, 1));
    expect([len(s.current), len(s.baseline)]).toEqual([61, 60]); // 31 + 29 + 1 against 31 + 28 + 1
  });

  test('alignment says how the baseline was matched', () => {
    const r = (f: Frequency, ms: number) => ordinalOf(f, ms);
    expect(spansFor('year-on-year', 'daily', r('daily', day(2026, 9, 30)), 1).alignment).toBe('weekday');
    expect(spansFor('year-on-year', 'hourly', r('hourly', day(2026, 9, 30)), 1).alignment).toBe('weekday');
    expect(spansFor('year-on-year', 'monthly', r('monthly', day(2026, 9, 1)), 1).alignment).toBe('calendar');
    expect(spansFor('year-to-date', 'daily', r('daily', day(2026, 9, 30)), 1).alignment).toBe('calendar');
    expect(spansFor('latest-year', 'daily', r('daily', day(2026, 9, 30)), 1).alignment).toBe('periods');
  });
});

describe('yearStart', () => {
  test('a quarter that begins before a mid-quarter fiscal start belongs to the previous year', () => {
    // Fiscal year from February: Q1 2026 (January–March) began on 1 January, before 1 February 2026, so
    // it closes the year that opened with Q2 2025 (the first quarter beginning on or after 1 February 2025).
    const q1 = ordinalOf('quarterly', month(2026, 1));
    expect(isoOf('quarterly', yearStart('quarterly', q1, 2))).toBe('2025-04-01');
  });

  test('the first period of the year starts on or after the year start (monthly, daily)', () => {
    for (const f of ['monthly', 'daily'] as const) {
      const first = yearStart(f, ordinalOf(f, day(2026, 5, 17)), 4);
      expect(startOf(f, first)).toBe(day(2026, 4, 1));
    }
  });
});
