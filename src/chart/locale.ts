/**
 * Vega locale definitions (decimal mark, digit grouping, minus sign, month and weekday names) taken from the
 * runtime's Intl data for a BCP 47 locale, so axis labels read like the numbers in the text of the brief.
 * Dates in charts are UTC throughout; the names below are looked up at UTC to stay independent of the
 * machine's time zone.
 */
import type { Locale } from 'vega';

const SAMPLE = 1234567.5;

export function vegaLocale(locale: string): Locale {
  const number = new Intl.NumberFormat(locale, { useGrouping: true, maximumFractionDigits: 1 });
  const parts = number.formatToParts(-SAMPLE);
  const part = (type: Intl.NumberFormatPartTypes, fallback: string) =>
    parts.find((p) => p.type === type)?.value ?? fallback;
  const integers = parts.filter((p) => p.type === 'integer').map((p) => p.value.length);
  // Group sizes from the right: [3] for "1,234,567", [3, 2] for the Indian "12,34,567".
  const grouping = integers.length > 1 ? integers.slice(1).reverse() : [3];
  const digits = new Intl.NumberFormat(locale, { useGrouping: false });
  const numerals = Array.from({ length: 10 }, (_, d) => digits.format(d));
  const latin = numerals.every((n, d) => n === String(d));

  const months = names(locale, { month: 'long' }, 12, (i) => Date.UTC(2001, i, 1));
  const shortMonths = names(locale, { month: 'short' }, 12, (i) => Date.UTC(2001, i, 1));
  // 2001-01-07 was a Sunday; d3 lists weekdays from Sunday.
  const days = names(locale, { weekday: 'long' }, 7, (i) => Date.UTC(2001, 0, 7 + i));
  const shortDays = names(locale, { weekday: 'short' }, 7, (i) => Date.UTC(2001, 0, 7 + i));
  const hour = new Intl.DateTimeFormat(locale, { hour: 'numeric', hour12: true, timeZone: 'UTC' });
  const period = (h: number) =>
    hour.formatToParts(Date.UTC(2001, 0, 1, h)).find((p) => p.type === 'dayPeriod')?.value ?? (h < 12 ? 'AM' : 'PM');

  return {
    number: {
      decimal: part('decimal', '.'),
      thousands: part('group', ''),
      grouping: uniformTail(grouping),
      currency: ['', ''],
      minus: part('minusSign', '-'),
      percent: new Intl.NumberFormat(locale, { style: 'percent' })
        .formatToParts(0.5)
        .find((p) => p.type === 'percentSign')?.value,
      ...(latin ? {} : { numerals: numerals as Vector10 }),
    },
    time: {
      dateTime: '%Y-%m-%d %H:%M',
      date: '%Y-%m-%d',
      time: '%H:%M',
      periods: [period(1), period(13)],
      days: days as Vector7,
      shortDays: shortDays as Vector7,
      months: months as Vector12,
      shortMonths: shortMonths as Vector12,
    },
  };
}

type Vector7 = [string, string, string, string, string, string, string];
type Vector10 = [...Vector7, string, string, string];
type Vector12 = [...Vector10, string, string];

function names(
  locale: string,
  options: Intl.DateTimeFormatOptions,
  count: number,
  at: (i: number) => number,
): string[] {
  const format = new Intl.DateTimeFormat(locale, { ...options, timeZone: 'UTC' });
  return Array.from({ length: count }, (_, i) => format.format(at(i)));
}

/** d3 cycles the last group size; drop repeats so [3, 3] becomes [3] and [3, 2, 2] stays [3, 2]. */
function uniformTail(groups: number[]): number[] {
  const out = [...groups];
  while (out.length > 1 && out[out.length - 1] === out[out.length - 2]) out.pop();
  return out;
}
