/**
 * Numbers and periods for chart labels and alt text: the brief's own formatting (narrate/format.ts), so a
 * chart and the sentence beside it print a figure the same way. Dates are ISO strings of a period's start.
 */

import {
  formatNumber,
  formatPeriodShort,
  formatSpan,
  formatPercent as percentText,
  formatPeriod as periodText,
  formatSigned as signedText,
  withUnit,
} from '../narrate/format.js';
import type { Frequency, Ordinals } from '../vocabulary/period-index.js';
import { vegaLocale } from './locale.js';

/** A value in the series' units: "1,234", "12.5", "0.42"; "n/a" when undefined. */
export function formatValue(value: number, locale: string, unit = ''): string {
  const text = formatNumber(value, locale);
  return unit && text !== 'n/a' ? withUnit(text, unit, locale) : text;
}

/** A signed value: "+12", "−3.4". */
export function formatSigned(value: number, locale: string, unit = ''): string {
  const text = signedText(value, locale);
  return unit && text !== 'n/a' ? withUnit(text, unit, locale) : text;
}

/** A signed percent with one decimal, written the locale's way; "n/a" when undefined. */
export function formatPercent(percent: number, locale: string): string {
  return percentText(percent, locale, true);
}

/** A plain count: "36". */
export function formatCount(count: number, locale: string): string {
  return formatNumber(count, locale, 0);
}

/** A period for a label: "Sept 2026", "Q3 2026", "2026-W37", "7 Sept 2026", "7 September 2026, 13:00". */
export function formatPeriod(ordinal: number, frequency: Frequency, locale: string): string {
  return frequency === 'hourly'
    ? periodText(frequency, ordinal, locale)
    : formatPeriodShort(frequency, ordinal, locale);
}

/** A span for a narrow label under a bar: "Sept 2026", "Jul–Sept 2026", "Oct 25 – Sept 26". */
export function formatSpanLabel(span: Ordinals, frequency: Frequency, locale: string): string {
  return formatSpan(frequency, span.first, span.last, locale, true);
}

/**
 * A value-axis label: the value with the decimals its tick step needs, grouped the locale's way, with a
 * Unicode minus as in the brief's text; `signed` adds "+" before values above zero ("+2.5").
 */
export function formatTick(value: number, decimals: number, locale: string, signed = false): string {
  const text = formatNumber(value, locale, decimals);
  return signed && value > 0 && text !== formatNumber(0, locale, decimals) ? `+${text}` : text;
}

const shortMonthCache = new Map<string, readonly string[]>();

/** The locale's short month names (as the vega specs' time axes use them: vegaLocale in locale.ts). */
function shortMonths(locale: string): readonly string[] {
  let names = shortMonthCache.get(locale);
  if (names === undefined) {
    names = vegaLocale(locale).time?.shortMonths ?? [];
    shortMonthCache.set(locale, names);
  }
  return names;
}

/**
 * A time-axis label in UTC, at the calendar field that makes the instant round (scale-time.ts
 * timeLabelUnit): "2024", "Apr", "7 Apr", "13:00" — the formats of the specs' TIME_AXIS (theme.ts). With
 * `withYear` (the first label of an axis, so a reader never meets a month without its year) "Apr 2024",
 * "7 Apr 2024".
 */
export function formatTimeTick(
  t: number,
  unit: 'hour' | 'day' | 'month' | 'year',
  locale: string,
  withYear = false,
): string {
  const d = new Date(t);
  const year = withYear ? ` ${d.getUTCFullYear()}` : '';
  switch (unit) {
    case 'year':
      return String(d.getUTCFullYear());
    case 'month':
      return `${shortMonths(locale)[d.getUTCMonth()]}${year}`;
    case 'day':
      return `${d.getUTCDate()} ${shortMonths(locale)[d.getUTCMonth()]}${year}`;
    case 'hour':
      return `${String(d.getUTCHours()).padStart(2, '0')}:${String(d.getUTCMinutes()).padStart(2, '0')}`;
  }
}
