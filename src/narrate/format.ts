/**
 * Formatting for the job's locale with Intl: numbers, signed changes, percents, percentage points and
 * period labels. Every number a reader sees passes through here, so statements, tables and charts agree.
 */
import { type Frequency, isoWeekOf, startOf } from '../vocabulary/period-index.js';

const cache = new Map<string, Intl.NumberFormat | Intl.DateTimeFormat>();

/**
 * The formatter `key` names (every number of a brief passes here, so the key is the caller's few settings
 * rather than its options spelled out); made from `options` the first time.
 */
function numberFormat(key: string, locale: string, options: () => Intl.NumberFormatOptions): Intl.NumberFormat {
  let f = cache.get(key) as Intl.NumberFormat | undefined;
  if (!f) {
    f = new Intl.NumberFormat(locale, options());
    cache.set(key, f);
  }
  return f;
}

/** The date styles the brief uses, by name (dateFormat's cache key). */
const DATE_STYLES = {
  monthYear: { month: 'long', year: 'numeric' },
  dayMonthYear: { day: 'numeric', month: 'long', year: 'numeric' },
  shortMonthYear: { month: 'short', year: 'numeric' },
  dayShortMonthYear: { day: 'numeric', month: 'short', year: 'numeric' },
  month: { month: 'long' },
  weekday: { weekday: 'long' },
  shortMonth: { month: 'short' },
  dayShortMonth: { day: 'numeric', month: 'short' },
  dayMonthYearHour: {
    day: 'numeric',
    month: 'long',
    year: 'numeric',
    hour: '2-digit',
    minute: '2-digit',
    hourCycle: 'h23',
  },
} satisfies Record<string, Intl.DateTimeFormatOptions>;

/**
 * Dates are written in the brief's language, which is English: an English locale keeps its own order
 * ("September 5, 2026" in en-US), any other takes British English month and day names, so a German
 * brief's sentences do not switch language inside a date. Numbers still follow the locale.
 */
function dateFormat(locale: string, style: keyof typeof DATE_STYLES): Intl.DateTimeFormat {
  const key = `d|${locale}|${style}`;
  let f = cache.get(key) as Intl.DateTimeFormat | undefined;
  if (!f) {
    const dateLocale = /^en\b/i.test(locale) ? locale : 'en-GB';
    f = new Intl.DateTimeFormat(dateLocale, { timeZone: 'UTC', ...DATE_STYLES[style] });
    cache.set(key, f);
  }
  return f;
}

/**
 * Digits after the decimal mark: none from 100 up, one from 1, and below 1 enough for two significant
 * figures (0.46, 0.046, 0.0046), so that a small change never prints as "0.00". Zero takes two.
 */
export function decimalsFor(value: number): number {
  const a = Math.abs(value);
  if (!Number.isFinite(a) || a >= 100) return 0;
  if (a >= 1) return 1;
  if (a === 0) return 2;
  return Math.max(2, 1 - Math.floor(Math.log10(a)));
}

/**
 * Intl (Node 20) takes at most 20 fraction digits, and a long row of zeros is hard to read anyway: from
 * this many decimals on, numbers are written in scientific notation with the same significant figures.
 */
const MAX_FIXED_DECIMALS = 9;

/** "1.2E−20": `digits` significant figures in the locale's scientific notation. */
function scientific(kind: string, value: number, locale: string, digits: number, signed: boolean): string {
  return numberFormat(`${kind}e|${locale}|${digits}`, locale, () => ({
    notation: 'scientific',
    minimumSignificantDigits: digits,
    maximumSignificantDigits: digits,
    signDisplay: signed ? 'exceptZero' : 'auto',
  }))
    .format(value)
    .replaceAll('-', '−');
}

/** Significant figures `decimals` digits after the mark give to a value of this size (at least 1). */
function significantAt(value: number, decimals: number): number {
  return Math.max(1, Math.min(21, decimals + 1 + Math.floor(Math.log10(Math.abs(value)))));
}

/**
 * A plain number with grouping, e.g. "12,345" or "3.4"; "n/a" when undefined. A value that rounds to zero
 * prints without a sign ("0.0", not "−0.0").
 */
export function formatNumber(value: number, locale: string, decimals = decimalsFor(value)): string {
  if (!Number.isFinite(value)) return 'n/a';
  if (decimals > MAX_FIXED_DECIMALS) {
    if (unsignedZero(value, decimals) === 0) return formatNumber(0, locale, 0);
    return scientific('n', value, locale, significantAt(value, decimals), false);
  }
  return fixed(value, locale, decimals);
}

/** `decimals` (at most 20) digits after the mark, grouped; no sign on a value that rounds to zero. */
function fixed(value: number, locale: string, decimals: number): string {
  return numberFormat(`n|${locale}|${decimals}`, locale, () => ({
    minimumFractionDigits: decimals,
    maximumFractionDigits: decimals,
  }))
    .format(unsignedZero(value, decimals))
    .replace('-', '−');
}

/**
 * A value with every digit it was read with: the shortest decimal that reads back to the same number
 * (JavaScript's own number-to-text rule, ECMA-262 Number::toString), written the locale's way, so a row of
 * the data appendix can be matched to the input file ("12,345.678", "0.000123"; "1.03E−20" when the
 * input's own shortest form is exponential). Trailing zeros of the input ("12.50") are not kept: the value
 * is the same.
 */
export function formatExact(value: number, locale: string): string {
  if (!Number.isFinite(value)) return 'n/a';
  const text = String(Math.abs(value));
  const e = text.indexOf('e');
  const dot = text.indexOf('.');
  const decimals = dot < 0 ? 0 : text.length - dot - 1;
  if (e < 0 && decimals <= 20) return fixed(value, locale, decimals);
  // Exponential, or more decimals than Intl takes: the same significant digits in scientific notation.
  const digits = (e < 0 ? text : text.slice(0, e)).replace('.', '').replace(/^0+/, '').length;
  return scientific('x', value, locale, Math.min(21, digits), false);
}

/** 0 for a value that rounds to zero at `decimals` digits, so that Intl prints no minus sign before it. */
function unsignedZero(value: number, decimals: number): number {
  return Math.abs(value) < 0.5 * 10 ** -decimals ? 0 : value;
}

/** A number with its sign, e.g. "+1,234" or "−56" (Unicode minus). */
export function formatSigned(value: number, locale: string, decimals = decimalsFor(value)): string {
  if (!Number.isFinite(value)) return 'n/a';
  if (decimals > MAX_FIXED_DECIMALS) {
    if (unsignedZero(value, decimals) === 0) return formatNumber(0, locale, 0);
    return scientific('s', value, locale, significantAt(value, decimals), true);
  }
  return numberFormat(`s|${locale}|${decimals}`, locale, () => ({
    minimumFractionDigits: decimals,
    maximumFractionDigits: decimals,
    signDisplay: 'exceptZero',
  }))
    .format(value)
    .replace('-', '−');
}

/** A percent from a percent figure (4.2 → "4.2%"), one decimal. */
export function formatPercent(percent: number, locale: string, signed = false, decimals = 1): string {
  if (!Number.isFinite(percent)) return 'n/a';
  return numberFormat(`p|${locale}|${decimals}|${signed}`, locale, () => ({
    style: 'percent',
    minimumFractionDigits: decimals,
    maximumFractionDigits: decimals,
    signDisplay: signed ? 'exceptZero' : 'auto',
  }))
    .format(unsignedZero(percent, decimals) / 100)
    .replace('-', '−');
}

/** "September 2026", "Q3 2026", "week 9 of 2026", "5 March 2026", "5 March 2026, 13:00". */
export function formatPeriod(frequency: Frequency, ordinal: number, locale: string): string {
  const ms = startOf(frequency, ordinal);
  switch (frequency) {
    case 'monthly':
      return dateFormat(locale, 'monthYear').format(ms);
    case 'quarterly': {
      const d = new Date(ms);
      return `Q${Math.floor(d.getUTCMonth() / 3) + 1} ${d.getUTCFullYear()}`;
    }
    case 'weekly': {
      const w = isoWeekOf(ms);
      return `week ${w.week} of ${w.year}`;
    }
    case 'daily':
      return dateFormat(locale, 'dayMonthYear').format(ms);
    case 'hourly':
      return dateFormat(locale, 'dayMonthYearHour').format(ms);
  }
}

/** A short period label for tables and axes: "Sep 2026", "Q3 2026", "2026-W09", "5 Mar 2026". */
export function formatPeriodShort(frequency: Frequency, ordinal: number, locale: string): string {
  const ms = startOf(frequency, ordinal);
  switch (frequency) {
    case 'monthly':
      return dateFormat(locale, 'shortMonthYear').format(ms);
    case 'weekly': {
      const w = isoWeekOf(ms);
      return `${w.year}-W${String(w.week).padStart(2, '0')}`;
    }
    case 'daily':
      return dateFormat(locale, 'dayShortMonthYear').format(ms);
    default:
      return formatPeriod(frequency, ordinal, locale);
  }
}

const ENGLISH_PLURALS = new Intl.PluralRules('en');

/** "1 period" / "3 periods"; the unit word is the frequency's ("month", "quarter", "week", "day", "hour"). */
export function countOf(count: number, frequency: Frequency, locale: string): string {
  const unit = { monthly: 'month', quarterly: 'quarter', weekly: 'week', daily: 'day', hourly: 'hour' }[frequency];
  return countNoun(count, unit, locale);
}

/**
 * A count with an English noun, "1 value" / "0 values" / "1,234 values". The number follows the locale;
 * the plural follows English rules, because the noun is English (French rules would give "0 value").
 */
export function countNoun(count: number, noun: string, locale: string): string {
  const plural = ENGLISH_PLURALS.select(count) === 'one' ? noun : `${noun}s`;
  return `${formatNumber(count, locale, 0)} ${plural}`;
}

/**
 * A span of periods, as short as reads well: "Sept 2026", "Jul–Sept 2026", "Oct 2025 – Sept 2026",
 * "Q1–Q3 2026", "1 Jan – 30 Sept 2026". With `twoDigitYears` (narrow chart labels) years shorten to two
 * digits and the dash loses its spaces: "Oct 25–Sept 26", "1 Jan–30 Sept 26".
 */
export function formatSpan(
  frequency: Frequency,
  from: number,
  to: number,
  locale: string,
  twoDigitYears = false,
): string {
  if (from === to) return formatPeriodShort(frequency, from, locale);
  const a = new Date(startOf(frequency, from));
  const b = new Date(startOf(frequency, to));
  const sameYear = a.getUTCFullYear() === b.getUTCFullYear();
  const dash = twoDigitYears ? '–' : ' – ';
  const year = (d: Date): string => (twoDigitYears ? String(d.getUTCFullYear()).slice(2) : String(d.getUTCFullYear()));
  if (frequency === 'monthly' || frequency === 'quarterly') {
    const name = (d: Date): string =>
      frequency === 'monthly' ? dateFormat(locale, 'shortMonth').format(d) : `Q${Math.floor(d.getUTCMonth() / 3) + 1}`;
    if (sameYear) return `${name(a)}–${name(b)} ${year(b)}`;
    return `${name(a)} ${year(a)}${dash}${name(b)} ${year(b)}`;
  }
  if (frequency === 'daily') {
    const dayMonth = (d: Date): string => dateFormat(locale, 'dayShortMonth').format(d);
    if (twoDigitYears)
      return sameYear
        ? `${dayMonth(a)}–${dayMonth(b)} ${year(b)}`
        : `${dayMonth(a)} ${year(a)}–${dayMonth(b)} ${year(b)}`;
    if (sameYear) return `${dayMonth(a)} – ${formatPeriodShort(frequency, to, locale)}`;
  }
  return `${formatPeriodShort(frequency, from, locale)}${dash}${formatPeriodShort(frequency, to, locale)}`;
}

/** A currency sign at the start of a unit, the space after it, and the rest: "£ thousand", "$m", "€". */
const CURRENCY_LED = /^(\p{Sc})(\s*)(.*)$/su;
const currencyFirst = new Map<string, boolean>();

/** Whether the locale writes a currency sign before the amount ("£5" in en-GB; "5 €" in de-DE), as Intl does. */
function signBefore(locale: string): boolean {
  let before = currencyFirst.get(locale);
  if (before === undefined) {
    const parts = new Intl.NumberFormat(locale, { style: 'currency', currency: 'EUR' }).formatToParts(1);
    before = parts.findIndex((p) => p.type === 'currency') < parts.findIndex((p) => p.type === 'integer');
    currencyFirst.set(locale, before);
  }
  return before;
}

/**
 * What goes before and after a number written with its unit. A unit is written after the number
 * ("1,522 ML"), except that a unit opening with a currency sign puts the sign where the locale puts it
 * for money (common practice, as Intl's currency format): "£1,522 thousand" and "$3.1m" in English,
 * "1.522 £ thousand" in German. "" for no unit.
 */
export function unitAround(unit: string, locale: string): { before: string; after: string } {
  const u = unit.trim();
  if (u === '') return { before: '', after: '' };
  const m = CURRENCY_LED.exec(u);
  if (!m || !signBefore(locale)) return { before: '', after: ` ${u}` };
  return { before: m[1], after: m[3] === '' ? '' : `${m[2] === '' ? '' : ' '}${m[3]}` };
}

/** A formatted number with its unit placed by unitAround; a leading sign stays first ("−£12 thousand"). */
export function withUnit(formatted: string, unit: string, locale: string): string {
  const { before, after } = unitAround(unit, locale);
  const sign = before !== '' && /^[+\-\u2212]/.test(formatted) ? formatted[0] : '';
  return `${sign}${before}${formatted.slice(sign.length)}${after}`;
}
