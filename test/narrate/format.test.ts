/**
 * Locale formatting through Intl. Expected strings follow the Unicode CLDR conventions as shipped with
 * Node 20's ICU (from memory of CLDR, confirmed by hand in node): en-GB and en-US group with "," and mark
 * decimals with "."; de-DE groups with "." and marks decimals with ","; fr-FR groups with the narrow
 * no-break space U+202F; de-DE and fr-FR put a no-break space before "%". Our own rules on top: the
 * Unicode minus U+2212 instead of the hyphen, about three significant figures (format.ts, decimalsFor),
 * "n/a" for undefined, English plurals.
 */
import { describe, expect, test } from 'vitest';
import {
  countNoun,
  countOf,
  decimalsFor,
  formatExact,
  formatNumber,
  formatPercent,
  formatPeriod,
  formatPeriodShort,
  formatSigned,
} from '../../src/narrate/format.js';
import { type Frequency, isoWeekStart, ordinalOf } from '../../src/vocabulary/period-index.js';

const NNBSP = '\u202F';
const NBSP = '\u00A0';
const MINUS = '\u2212';

describe('numbers', () => {
  test('grouping and decimal marks per locale', () => {
    expect(formatNumber(1234567.891, 'en-GB')).toBe('1,234,568');
    expect(formatNumber(1234567.891, 'en-US')).toBe('1,234,568');
    expect(formatNumber(1234567.891, 'de-DE')).toBe('1.234.568');
    expect(formatNumber(1234567.891, 'fr-FR')).toBe(`1${NNBSP}234${NNBSP}568`);
    expect(formatNumber(12.345, 'en-GB')).toBe('12.3');
    expect(formatNumber(12.345, 'de-DE')).toBe('12,3');
    expect(formatNumber(12.345, 'fr-FR')).toBe('12,3');
    expect(formatNumber(1234.5, 'de-DE', 1)).toBe('1.234,5');
    expect(formatNumber(1234.5, 'fr-FR', 1)).toBe(`1${NNBSP}234,5`);
  });

  test('no decimals from 100, one from 1, below 1 two significant figures', () => {
    expect([decimalsFor(100), decimalsFor(99.9), decimalsFor(1), decimalsFor(0.99), decimalsFor(-250)]).toEqual([
      0, 1, 1, 2, 0,
    ]);
    expect([decimalsFor(0.1), decimalsFor(0.0456), decimalsFor(-0.00456), decimalsFor(0)]).toEqual([2, 3, 4, 2]);
    // Found: "a change of 0.00 units" for a change of 0.0042. Two significant figures, not "0.00".
    expect(formatNumber(0.0456, 'en-GB')).toBe('0.046');
    expect(formatSigned(0.0042, 'en-GB')).toBe('+0.0042');
    expect(formatSigned(-0.0042, 'de-DE')).toBe(`${MINUS}0,0042`);
    expect(formatNumber(0.000123, 'en-GB')).toBe('0.00012');
  });

  test('tiny magnitudes in scientific notation, never an Intl range error', () => {
    // Found: values of about 1e-20 made Intl throw "minimumFractionDigits value is out of range" (Node 20
    // takes at most 20 fraction digits). From ten decimals on, the same significant figures, scientific.
    expect(formatNumber(1.234e-20, 'en-GB')).toBe(`1.2E${MINUS}20`);
    expect(formatSigned(-1.234e-20, 'en-GB')).toBe(`${MINUS}1.2E${MINUS}20`);
    expect(formatSigned(1.234e-20, 'de-DE')).toBe(`+1,2E${MINUS}20`);
    expect(formatNumber(5e-21, 'en-GB', 21)).toBe(`5E${MINUS}21`); // a chart tick with a step of 5e-21
    expect(formatNumber(0, 'en-GB', 21)).toBe('0');
    expect(formatNumber(1e-300, 'en-GB')).toBe(`1.0E${MINUS}300`);
  });

  test('observed values with every digit they were read with', () => {
    // The shortest decimal that reads back to the same double (ECMA-262 Number::toString), in the locale.
    expect(formatExact(12345.678, 'en-GB')).toBe('12,345.678');
    expect(formatExact(12345.678, 'de-DE')).toBe('12.345,678');
    expect(formatExact(0.1, 'en-GB')).toBe('0.1');
    expect(formatExact(1.1061346651711343, 'en-GB')).toBe('1.1061346651711343');
    expect(formatExact(-0.000123, 'en-GB')).toBe(`${MINUS}0.000123`);
    expect(formatExact(42, 'en-GB')).toBe('42');
    expect(formatExact(1.03e-20, 'en-GB')).toBe(`1.03E${MINUS}20`);
    expect(formatExact(1.1061346651711343e-20, 'en-GB')).toBe(`1.1061346651711343E${MINUS}20`);
    expect(formatExact(Number.NaN, 'en-GB')).toBe('n/a');
    // Property: what is printed reads back to the same number (en-GB: drop the grouping commas).
    for (const v of [Math.PI, 1234567.125, 0.000001, 98.76e-3, 7e-7, 123456789012345680000]) {
      const back = Number(formatExact(v, 'en-GB').replaceAll(',', '').replace('E', 'e').replace(MINUS, '-'));
      expect(back).toBe(v);
    }
  });

  test('negative numbers take the Unicode minus', () => {
    expect(formatNumber(-1234.5, 'en-GB')).toBe(`${MINUS}1,235`); // half away from zero, Intl's default
    expect(formatNumber(-1234.5, 'de-DE', 1)).toBe(`${MINUS}1.234,5`);
    expect(formatNumber(-1234.5, 'fr-FR', 1)).toBe(`${MINUS}1${NNBSP}234,5`);
  });

  test('a value that rounds to zero has no sign', () => {
    expect(formatNumber(-0.001, 'en-GB', 2)).toBe('0.00');
    expect(formatNumber(-0.04, 'en-GB', 1)).toBe('0.0');
    expect(formatNumber(-0.05, 'en-GB', 1)).toBe(`${MINUS}0.1`);
    expect(formatNumber(-0, 'de-DE', 0)).toBe('0');
  });

  test('signed numbers', () => {
    expect(formatSigned(56, 'en-GB')).toBe('+56.0');
    expect(formatSigned(-1234.5, 'en-US')).toBe(`${MINUS}1,235`);
    expect(formatSigned(2.25, 'de-DE')).toBe('+2,3');
    expect(formatSigned(-2.25, 'fr-FR')).toBe(`${MINUS}2,3`);
    expect(formatSigned(0, 'en-GB')).toBe('0.00');
    expect(formatSigned(-0.001, 'en-GB', 2)).toBe('0.00');
  });

  test('percents from percent figures, one decimal', () => {
    expect(formatPercent(4.25, 'en-GB')).toBe('4.3%');
    expect(formatPercent(4.25, 'en-US', true)).toBe('+4.3%');
    expect(formatPercent(-4.25, 'en-GB', true)).toBe(`${MINUS}4.3%`);
    expect(formatPercent(-4.25, 'en-GB')).toBe(`${MINUS}4.3%`);
    expect(formatPercent(4.25, 'de-DE')).toBe(`4,3${NBSP}%`);
    expect(formatPercent(-4.25, 'de-DE', true)).toBe(`${MINUS}4,3${NBSP}%`);
    expect(formatPercent(4.25, 'fr-FR')).toMatch(new RegExp(`^4,3[${NBSP}${NNBSP}]%$`));
    expect(formatPercent(1234.5, 'fr-FR')).toMatch(new RegExp(`^1${NNBSP}234,5[${NBSP}${NNBSP}]%$`));
    expect(formatPercent(-0.04, 'en-GB')).toBe('0.0%');
    expect(formatPercent(0, 'en-GB', true)).toBe('0.0%');
  });

  test('undefined values', () => {
    for (const f of [formatNumber, formatSigned]) expect(f(Number.NaN, 'en-GB')).toBe('n/a');
    expect(formatPercent(Number.POSITIVE_INFINITY, 'en-GB')).toBe('n/a');
  });
});

describe('periods', () => {
  const at = (f: Frequency, ms: number) => ordinalOf(f, ms);
  const sep2026 = Date.UTC(2026, 8, 1);

  test('months', () => {
    expect(formatPeriod('monthly', at('monthly', sep2026), 'en-GB')).toBe('September 2026');
    expect(formatPeriod('monthly', at('monthly', sep2026), 'en-US')).toBe('September 2026');
    expect(formatPeriod('monthly', at('monthly', sep2026), 'de-DE')).toBe('September 2026');
    // The brief's sentences are English, so a non-English locale gets British English dates (format.ts).
    expect(formatPeriod('monthly', at('monthly', sep2026), 'fr-FR')).toBe('September 2026');
    // CLDR abbreviates September as "Sept" in British English and "Sep" in American English.
    expect(formatPeriodShort('monthly', at('monthly', sep2026), 'en-GB')).toBe('Sept 2026');
    expect(formatPeriodShort('monthly', at('monthly', sep2026), 'en-US')).toBe('Sep 2026');
  });

  test('quarters', () => {
    expect(formatPeriod('quarterly', at('quarterly', sep2026), 'en-GB')).toBe('Q3 2026');
    expect(formatPeriod('quarterly', at('quarterly', Date.UTC(2026, 0, 1)), 'de-DE')).toBe('Q1 2026');
  });

  test('ISO weeks, across the year boundary', () => {
    // ISO 8601: week 1 holds the year's first Thursday. 1 January 2026 is a Thursday, so week 1 of 2026
    // starts on Monday 29 December 2025 and week 9 on 23 February 2026; 1 January 2021, a Friday, is in
    // week 53 of 2020.
    expect(formatPeriod('weekly', at('weekly', Date.UTC(2025, 11, 29)), 'en-GB')).toBe('week 1 of 2026');
    expect(formatPeriod('weekly', at('weekly', Date.UTC(2026, 1, 23)), 'fr-FR')).toBe('week 9 of 2026');
    expect(formatPeriod('weekly', at('weekly', Date.UTC(2021, 0, 1)), 'en-GB')).toBe('week 53 of 2020');
    expect(formatPeriodShort('weekly', at('weekly', isoWeekStart(2026, 9)), 'en-GB')).toBe('2026-W09');
  });

  test('days', () => {
    const d = at('daily', Date.UTC(2026, 2, 5));
    expect(formatPeriod('daily', d, 'en-GB')).toBe('5 March 2026');
    expect(formatPeriod('daily', d, 'en-US')).toBe('March 5, 2026');
    expect(formatPeriod('daily', d, 'de-DE')).toBe('5 March 2026');
    expect(formatPeriod('daily', d, 'fr-FR')).toBe('5 March 2026');
  });

  test('hours: the date and a 24-hour time, in UTC', () => {
    const h = at('hourly', Date.UTC(2026, 2, 5, 13));
    for (const [locale, date] of [
      ['en-GB', '5 March 2026'],
      ['en-US', 'March 5, 2026'],
      ['de-DE', '5 March 2026'],
      ['fr-FR', '5 March 2026'],
    ]) {
      const text = formatPeriod('hourly', h, locale);
      expect(text.startsWith(date)).toBe(true);
      expect(text.endsWith('13:00')).toBe(true);
    }
  });
});

describe('plurals', () => {
  test('"1 month", "2 months", in every locale (the nouns are English)', () => {
    for (const locale of ['en-GB', 'en-US', 'de-DE', 'fr-FR']) {
      expect(countOf(1, 'monthly', locale)).toBe('1 month');
      expect(countOf(2, 'monthly', locale)).toBe('2 months');
      // French plural rules call 0 "one"; English ones do not
      expect(countOf(0, 'monthly', locale)).toBe('0 months');
    }
    expect(countOf(1, 'quarterly', 'en-GB')).toBe('1 quarter');
    expect(countOf(273, 'daily', 'en-GB')).toBe('273 days');
    expect(countOf(1234, 'hourly', 'de-DE')).toBe('1.234 hours');
    expect(countNoun(1, 'value', 'fr-FR')).toBe('1 value');
    expect(countNoun(10, 'value', 'fr-FR')).toBe('10 values');
  });
});
