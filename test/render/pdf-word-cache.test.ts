/**
 * What a process keeps of its shaped words and table cells (src/render/pdf/shape.ts WordCache): at most two
 * generations of `limit` words, so a long batch's heap stops growing, while words met again are kept.
 * The whole-process figure (a 1,000-brief batch's peak memory) is in bench/BRIEFS.md; these checks are the
 * rule itself, and that the PDF text uses it (plainLine gives the same object for a cell met again soon).
 */
import { describe, expect, it } from 'vitest';
import { WORDS_KEPT, WordCache } from '../../src/render/pdf/shape.js';
import { plainLine } from '../../src/render/pdf/text.js';

describe('WordCache', () => {
  it('keeps at most two generations of its limit, however many words it meets', () => {
    const c = new WordCache<number>(100);
    for (let i = 0; i < 10_000; i++) {
      if (c.get(`w${i}`) === undefined) c.set(`w${i}`, i);
      expect(c.size).toBeLessThanOrEqual(200);
    }
    // The last hundred are all there; the first are long gone.
    for (let i = 9_900; i < 10_000; i++) expect(c.get(`w${i}`)).toBe(i);
    expect(c.get('w0')).toBeUndefined();
  });

  it('keeps a word that is met again in every generation, among a stream of new ones', () => {
    const c = new WordCache<string>(50);
    c.set('the', 'kept');
    for (let i = 0; i < 5_000; i++) {
      c.set(`figure ${i}`, 'new');
      // Met once every 40 new words: always in the newer or the older generation, moved up when met.
      if (i % 40 === 0) expect(c.get('the')).toBe('kept');
    }
  });

  it('lets a word met once go after two turns', () => {
    const c = new WordCache<number>(10);
    c.set('once', 1);
    for (let i = 0; i < 10; i++) c.set(`a${i}`, i);
    expect(c.get('once')).toBe(1); // in the older generation: found, and moved up
    for (let i = 0; i < 20; i++) c.set(`b${i}`, i);
    expect(c.get('once')).toBeUndefined();
  });
});

describe('table cells', () => {
  it('are laid out once while met again, and not kept for ever', () => {
    const first = plainLine('1,234.5', 'Regular');
    expect(plainLine('1,234.5', 'Regular')).toBe(first);
    // Three generations' worth of other cells later, the first is laid out afresh (the same line, a new object).
    for (let i = 0; i < 3 * WORDS_KEPT; i++) plainLine(`${i}.25`, 'Regular');
    const again = plainLine('1,234.5', 'Regular');
    expect(again).not.toBe(first);
    expect(again).toEqual(first);
  });
});
