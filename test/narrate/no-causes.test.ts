/**
 * The brief says what moved, never why: no statement or caution uses causal wording. The word list is ours
 * (common causal connectives of English); the model-choice reason in the settings is not a statement and
 * may explain itself.
 */
import { describe, expect, test } from 'vitest';
import { allStatements } from './all-statements.js';

const CAUSAL =
  /\b(because|due to|caused|causes|causing|driven by|drove|as a result|resulted in|owing to|thanks to|led to|leads to|on account of|attributable|explained by)\b/i;

describe('no causal claims', async () => {
  const cases = await allStatements();

  test('the pattern catches causal wording', () => {
    expect(CAUSAL.test('Orders rose because of the sale.')).toBe(true);
    expect(CAUSAL.test('Deliveries fell, driven by rain.')).toBe(true);
    expect(CAUSAL.test('As a result, visits dropped.')).toBe(true);
    expect(CAUSAL.test('The trend is up 3% on a year ago.')).toBe(false);
  });

  test('no statement of any example or synthetic job, nor any caution, claims a cause', () => {
    expect(cases.length).toBeGreaterThan(50);
    const found = cases
      .filter((c) => CAUSAL.test(c.statement.text))
      .map((c) => `${c.source} ${c.statement.id}: ${c.statement.text}`);
    expect(found).toEqual([]);
  });
});
