/**
 * Every number in a statement's text is one of its figures (the rule of narrate/statements.ts), checked
 * with test/narrate/numbers.ts over every statement of the three examples (examples/<name>/job.yaml), of small
 * synthetic jobs in other frequencies and locales, and over the brief cautions. First the checker itself
 * is shown to catch what it should, so a pass below means something.
 */
import { describe, expect, test } from 'vitest';
import { statement } from '../../src/narrate/statement.js';
import type { Statement } from '../../src/vocabulary/brief.js';
import { allStatements } from './all-statements.js';
import { EXAMPLE_NAMES } from './examples.js';
import { numbersIn, unshownFigures, untracedNumbers } from './numbers.js';

const fig = (name: string, formatted: string) => ({ name, value: formatted, unit: '', formatted });

describe('the checker', () => {
  test('finds numbers with grouping, decimals, signs and percent signs in each locale', () => {
    expect(numbersIn('Up 1,234.5 ML, +2.0% or −3% and -4.', 'en-GB').map((n) => n.text)).toEqual([
      '1,234.5',
      '+2.0%',
      '−3%',
      '-4',
    ]);
    expect(numbersIn('Plus 1.234,5 und −4,3\u00A0%.', 'de-DE').map((n) => n.text)).toEqual(['1.234,5', '−4,3\u00A0%']);
    expect(numbersIn('Soit 1\u202F234,5 ou +4,3\u00A0%.', 'fr-FR').map((n) => n.text)).toEqual([
      '1\u202F234,5',
      '+4,3\u00A0%',
    ]);
  });

  test('finds numbers inside dates, labels and times, and does not take a hyphen for a sign', () => {
    expect(numbersIn('In September 2026, Q3 and week 9 at 13:00 (2026-09).', 'en-GB').map((n) => n.text)).toEqual([
      '2026',
      '3',
      '9',
      '13',
      '00',
      '2026',
      '09',
    ]);
  });

  test('accepts numbers inside figures, rejects the others', () => {
    const good = statement('t', 'context', ['Sent in ', fig('p', 'September 2026'), ': ', fig('v', '6,275'), ' ML.']);
    expect(untracedNumbers(good, 'en-GB')).toEqual([]);
    const stray: Statement = { ...good, text: `${good.text} Up 4% on 2025.` };
    expect(untracedNumbers(stray, 'en-GB').map((n) => n.text)).toEqual(['4%', '2025']);
    // A number only partly inside a figure is not traced: "6,275" shown as "16,275".
    const partial: Statement = { ...good, text: good.text.replace('6,275', '16,275') };
    expect(untracedNumbers(partial, 'en-GB').map((n) => n.text)).toEqual(['16,275']);
    const changed: Statement = { ...good, text: good.text.replace('6,275', '6,276') };
    expect(untracedNumbers(changed, 'en-GB').map((n) => n.text)).toEqual(['6,276']);
    expect(unshownFigures(changed)).toEqual(['v']);
  });
});

describe('every statement keeps the rule', async () => {
  const cases = await allStatements();

  test('every example and every statement kind are covered', () => {
    expect(EXAMPLE_NAMES).toEqual(['clinic-visits', 'harbour-freight', 'online-orders', 'water-deliveries']);
    const kinds = new Set(cases.map((c) => c.statement.kind));
    for (const k of [
      'headline',
      'context',
      'seasonal',
      'comparison',
      'unusual',
      'effects',
      'firmness',
      'sensitivity',
      'caution',
    ]) {
      expect(kinds.has(k as Statement['kind'])).toBe(true);
    }
  });

  test.each(cases.map((c) => [`${c.source} ${c.statement.id}`, c] as const))('%s', (_, c) => {
    expect(untracedNumbers(c.statement, c.locale).map((n) => n.text)).toEqual([]);
    expect(unshownFigures(c.statement)).toEqual([]);
  });
});
