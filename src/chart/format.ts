/**
 * Numbers and periods as words for chart labels and alt text, through Intl for the brief's locale. Dates are
 * ISO strings of a period's start and are always read and written in UTC.
 */
import type { Frequency } from '../data/calendar.js';

const numberFormats = new Map<string, Intl.NumberFormat>();

function numberFormat(locale: string, digits: number, signed: boolean): Intl.NumberFormat {
  const key = `${locale}|${digits}|${signed}`;
  let f = numberFormats.get(key);
  if (f === undefined) {
    f = new Intl.NumberFormat(locale, {
      maximumFractionDigits: digits,
      minimumFractionDigits: 0,
      signDisplay: signed ? 'exceptZero' : 'auto',
    });
    numberFormats.set(key, f);
  }
  return f;
}

/** Fraction digits that keep about three significant figures without going past two decimals. */
function digitsFor(value: number): number {
  const a = Math.abs(value);
  if (a >= 100) return 0;
  if (a >= 10) return 1;
  return 2;
}

/** A value in the series' units: "1,234", "12.5", "0.42"; "n/a" when undefined. */
export function formatValue(value: number, locale: string, unit = ''): string {
  if (!Number.isFinite(value)) return 'n/a';
  const text = numberFormat(locale, digitsFor(value), false).format(value);
  return unit ? `${text} ${unit}` : text;
}

/** A signed value: "+12", "−3.4". */
export function formatSigned(value: number, locale: string, unit = ''): string {
  if (!Number.isFinite(value)) return 'n/a';
  const text = numberFormat(locale, digitsFor(value), true).format(value);
  return unit ? `${text} ${unit}` : text;
}

/** A signed percent with one decimal: "+4.2 %" written the locale's way; "n/a" when undefined. */
export function formatPercent(percent: number, locale: string): string {
  if (!Number.isFinite(percent)) return 'n/a';
  const key = `${locale}|pct`;
  let f = numberFormats.get(key);
  if (f === undefined) {
    f = new Intl.NumberFormat(locale, {
      style: 'percent',
      maximumFractionDigits: 1,
      minimumFractionDigits: 1,
      signDisplay: 'exceptZero',
    });
    numberFormats.set(key, f);
  }
  return f.format(percent / 100);
}

/** A plain count: "36". */
export function formatCount(count: number, locale: string): string {
  return numberFormat(locale, 0, false).format(count);
}

const dateFormats = new Map<string, Intl.DateTimeFormat>();

function dateFormat(locale: string, options: Intl.DateTimeFormatOptions): Intl.DateTimeFormat {
  const key = `${locale}|${JSON.stringify(options)}`;
  let f = dateFormats.get(key);
  if (f === undefined) {
    f = new Intl.DateTimeFormat(locale, { ...options, timeZone: 'UTC' });
    dateFormats.set(key, f);
  }
  return f;
}

/** A period named the way its frequency suggests: "Sep 2026", "Q3 2026", "7 Sep 2026", "7 Sep 2026, 13:00". */
export function formatPeriod(iso: string, frequency: Frequency, locale: string): string {
  const ms = Date.parse(iso);
  if (!Number.isFinite(ms)) return iso;
  const d = new Date(ms);
  switch (frequency) {
    case 'monthly':
      return dateFormat(locale, { month: 'short', year: 'numeric' }).format(d);
    case 'quarterly':
      return `Q${Math.floor(d.getUTCMonth() / 3) + 1} ${d.getUTCFullYear()}`;
    case 'weekly':
    case 'daily':
      return dateFormat(locale, { day: 'numeric', month: 'short', year: 'numeric' }).format(d);
    case 'hourly':
      return dateFormat(locale, {
        day: 'numeric',
        month: 'short',
        year: 'numeric',
        hour: '2-digit',
        minute: '2-digit',
        hourCycle: 'h23',
      }).format(d);
  }
}
