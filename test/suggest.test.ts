import { describe, expect, it } from 'vitest';
import { closest, editDistance } from '../src/suggest.js';

describe('editDistance (optimal string alignment)', () => {
  it('counts the classic kitten → sitting example as 3 edits', () => {
    // Levenshtein's textbook example (from memory): k→s, e→i, insert g.
    expect(editDistance('kitten', 'sitting')).toBe(3);
  });

  it('counts a swap of neighbours as one edit, as Damerau (1964) defines it', () => {
    // "ab" → "ba" is one transposition; plain Levenshtein would need two substitutions.
    expect(editDistance('ab', 'ba')).toBe(1);
    expect(editDistance('delimeter', 'delimiter')).toBe(1); // one substitution e→i
    expect(editDistance('fiscal_yaer_start', 'fiscal_year_start')).toBe(1); // one swap "ae"→"ea"
  });

  it('gives 3 for "ca" → "abc": the alignment may not edit a swapped pair again', () => {
    // Standard example (from memory) separating OSA (3) from unrestricted Damerau–Levenshtein (2):
    // ca → ac (swap) → abc (insert inside the swapped pair) is forbidden, so it is delete c, insert b, c.
    expect(editDistance('ca', 'abc')).toBe(3);
  });

  it('is the length of the other word when one is empty', () => {
    expect(editDistance('', 'period')).toBe(6);
    expect(editDistance('period', '')).toBe(6);
    expect(editDistance('', '')).toBe(0);
  });
});

describe('closest', () => {
  const keys = ['method', 'model', 'period', 'periods', 'seasonal_window', 'seasonal_degree', 'trend_window'];

  it('finds the key a slip was meant to be', () => {
    expect(closest('seasonl_window', keys)).toBe('seasonal_window'); // one letter dropped
    expect(closest('mehtod', keys)).toBe('method'); // one swap
  });

  it('ignores case, hyphens and underscores', () => {
    expect(closest('Trend-Window', keys)).toBe('trend_window');
    expect(closest('seasonalwindow', keys)).toBe('seasonal_window');
  });

  it('offers nothing when no key is near', () => {
    expect(closest('colour', keys)).toBeNull();
    expect(closest('xyz', ['sum', 'mean'])).toBeNull();
  });

  it('allows one edit in short words only', () => {
    // "sm" → "sum" is one insertion; "mn" → "mean" needs two, too many for a four-letter word.
    expect(closest('sm', ['sum', 'mean'])).toBe('sum');
    expect(closest('mn', ['mean'])).toBeNull();
  });
});

describe('column names in data files', () => {
  it('suggests only near names, ignoring case', () => {
    expect(closest('valeu', ['date', 'value'])).toBe('value'); // one swap of neighbours
    expect(closest('Month', ['month', 'value'])).toBe('month');
    expect(closest('amount', ['date', 'value'])).toBeNull();
  });
});
