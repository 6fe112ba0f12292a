/**
 * Words that depend on the series rather than on one figure: period nouns, comparison labels, and whether
 * a movement is the direction the job calls good.
 */
import type { Direction } from '../vocabulary/brief.js';
import type { Frequency } from '../vocabulary/period-index.js';
import type { ComparisonSpec, GoodDirection } from '../vocabulary/settings.js';

export function periodNoun(frequency: Frequency): string {
  return { monthly: 'month', quarterly: 'quarter', weekly: 'week', daily: 'day', hourly: 'hour' }[frequency];
}

export function comparisonLabel(c: ComparisonSpec, frequency: Frequency): string {
  switch (c.kind) {
    case 'year-on-year':
      return `Same ${periodNoun(frequency)} last year`;
    case 'year-to-date':
      return 'Year to date';
    case 'fiscal-year-to-date':
      return 'Fiscal year to date';
    case 'latest-year':
      return frequency === 'monthly'
        ? 'Last 12 months'
        : frequency === 'quarterly'
          ? 'Last 4 quarters'
          : 'Last 52 weeks';
    case 'custom':
      return c.label;
  }
}

/** 'better', 'worse' or null when the job calls neither direction good. */
export function judgement(direction: Direction, good: GoodDirection): 'better' | 'worse' | null {
  if (good === 'neither' || direction === 'flat') return null;
  return (direction === 'rising') === (good === 'up') ? 'better' : 'worse';
}

/** "a" or "an" before a word, by its first sound as spelt (vowel letters; enough for our own nouns). */
export function article(word: string): 'a' | 'an' {
  return /^[aeio]/i.test(word) || /^u(?!ni|se|su|ro)/i.test(word) ? 'an' : 'a';
}

const PERCENT_UNIT = /^(%|percent|per ?cent|pct|pp|p\.p\.|points?|percentage points?|% points?)$/i;

/**
 * The unit a difference is written in: a series in % changes by points ("2.1 points", "1 point"), any other
 * by its own unit; "" for none.
 */
export function unitWords(unit: string, size: number): string {
  if (PERCENT_UNIT.test(unit.trim())) return size === 1 ? 'point' : 'points';
  return unit;
}

const SMALL = ['', 'a', 'two', 'three', 'four', 'five', 'six', 'seven', 'eight', 'nine', 'ten'];

/**
 * A span of periods back in calendar words: "a year" when `yearly`; else "a week" (168 hours, 7 days),
 * "four weeks", "a day" (24 hours), "three months", "two quarters", "13 weeks".
 */
export function spanBack(frequency: Frequency, periods: number, yearly: boolean): string {
  if (yearly) return 'a year';
  let n = periods;
  let noun = periodNoun(frequency);
  if (frequency === 'hourly' && periods % 168 === 0) [n, noun] = [periods / 168, 'week'];
  else if (frequency === 'hourly' && periods % 24 === 0) [n, noun] = [periods / 24, 'day'];
  else if (frequency === 'daily' && periods % 7 === 0) [n, noun] = [periods / 7, 'week'];
  const count = n < SMALL.length ? SMALL[n] : String(n);
  return `${count} ${noun}${n === 1 ? '' : 's'}`;
}
