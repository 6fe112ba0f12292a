/**
 * A checker for the rule of narrate/statements.ts: every number a statement prints is one of its figures.
 * It finds each number in the text — digits with the locale's grouping separator and decimal mark, an
 * optional sign (+, - or the Unicode minus U+2212) and an optional % (with the no-break spaces some locales
 * put before it), and also bare digit runs inside dates, labels and times ("September 2026", "Q3",
 * "13:00") — and reports those that do not lie inside an occurrence of one of the statement's
 * `figures[].formatted` strings in the text.
 */
import type { Statement } from '../../src/vocabulary/brief.js';

export interface NumberInText {
  text: string;
  start: number;
  end: number;
}

function escapeRegExp(s: string): string {
  return s.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');
}

/** The locale's grouping separator and decimal mark, as Intl writes them. */
export function separators(locale: string): { group: string; decimal: string } {
  const parts = new Intl.NumberFormat(locale).formatToParts(1234567.5);
  return {
    group: parts.find((p) => p.type === 'group')?.value ?? ',',
    decimal: parts.find((p) => p.type === 'decimal')?.value ?? '.',
  };
}

export function numberPattern(locale: string): RegExp {
  const { group, decimal } = separators(locale);
  // A sign counts only where it cannot be a hyphen joining words or dates ("2026-09", "12-month").
  const sign = '(?:(?<![\\p{L}\\p{N}])[+\\-\\u2212])?';
  const digits = `\\d+(?:${escapeRegExp(group)}\\d{3})*(?:${escapeRegExp(decimal)}\\d+)?`;
  const percent = '(?:[\\u00A0\\u202F ]?%)?';
  return new RegExp(`${sign}${digits}${percent}`, 'gu');
}

export function numbersIn(text: string, locale: string): NumberInText[] {
  return [...text.matchAll(numberPattern(locale))].map((m) => ({
    text: m[0],
    start: m.index,
    end: m.index + m[0].length,
  }));
}

/** Where each figure's formatted text occurs in the statement's text. */
function figureSpans(s: Statement): { start: number; end: number }[] {
  const out: { start: number; end: number }[] = [];
  for (const f of s.figures) {
    if (f.formatted === '') continue;
    for (let i = s.text.indexOf(f.formatted); i >= 0; i = s.text.indexOf(f.formatted, i + 1)) {
      out.push({ start: i, end: i + f.formatted.length });
    }
  }
  return out;
}

/** Numbers in the text that no figure accounts for (empty when the statement keeps the rule). */
export function untracedNumbers(s: Statement, locale: string): NumberInText[] {
  const spans = figureSpans(s);
  return numbersIn(s.text, locale).filter((n) => !spans.some((f) => f.start <= n.start && n.end <= f.end));
}

/** Figures whose formatted text the statement never shows. */
export function unshownFigures(s: Statement): string[] {
  return s.figures.filter((f) => !s.text.includes(f.formatted)).map((f) => f.name);
}
