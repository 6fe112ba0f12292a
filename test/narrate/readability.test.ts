/**
 * Plain language: the Flesch–Kincaid grade level (Kincaid, Fishburne, Rogers & Chissom 1975) of the
 * statements is at or below US grade 9 (a common target for public-facing text; common practice), for each
 * statement kind pooled over every example and synthetic job, and for each statement on its own. The
 * counting rules are documented in test/narrate/readability.ts.
 */
import { describe, expect, test } from 'vitest';
import type { Statement } from '../../src/vocabulary/brief.js';
import { allStatements } from './all-statements.js';
import { addCounts, countText, gradeOf, syllablesOf, type TextCounts } from './readability.js';

const MAX_GRADE = 9;

describe('the counting rules', () => {
  test('syllables: vowel groups, a silent final e, at least one', () => {
    // Dictionary syllable counts (from memory) the heuristic gets right:
    expect(syllablesOf('trend')).toBe(1);
    expect(syllablesOf('table')).toBe(2); // "-le" after a consonant is sounded
    expect(syllablesOf('change')).toBe(1); // silent final e
    expect(syllablesOf('estimate')).toBe(3);
    expect(syllablesOf('provisional')).toBe(4);
    expect(syllablesOf('regulatory')).toBe(5);
    expect(syllablesOf('ML')).toBe(1); // no vowel: still a word
    // …and one it undercounts, as any vowel-group rule does ("u-su-al" has three):
    expect(syllablesOf('usual')).toBe(2);
  });

  test('words, sentences, numbers; the header example by hand', () => {
    expect(countText('The trend is up.')).toEqual({ words: 4, sentences: 1, syllables: 4 });
    // "0.6" is not a sentence end; "0.6", "+1,234.5" and "4.2%" are one word of one syllable each:
    // Up 0.6 points. | A change of +1,234.5 or 4.2%. → 9 words, 2 sentences, 9 syllables
    expect(countText('Up 0.6 points. A change of +1,234.5 or 4.2%.')).toEqual({ words: 9, sentences: 2, syllables: 9 });
    // 0.39·4/1 + 11.8·4/4 − 15.59 = 1.56 + 11.8 − 15.59 = −2.23
    expect(gradeOf(countText('The trend is up.'))).toBeCloseTo(-2.23, 10);
  });

  test('a dense sentence scores above grade 9, so the check can fail', () => {
    const dense = 'For a regulatory filing, use the methodology the regulator prescribes.';
    // 10 words, 1 sentence; syllables by the heuristic for-a-re·gu·la·to·ry-fi·ling-use-the-me·tho·do·lo·gy-
    // the-re·gu·la·tor-pre·scri·bes: 1+1+5+2+1+1+5+1+4+3 = 24 ("prescribes" overcounted by one)
    // → 0.39·10 + 11.8·2.4 − 15.59 = 16.63
    expect(countText(dense)).toEqual({ words: 10, sentences: 1, syllables: 24 });
    expect(gradeOf(countText(dense))).toBeCloseTo(16.63, 10);
    expect(gradeOf(countText(dense))).toBeGreaterThan(MAX_GRADE);
  });
});

describe('the statements read at grade 9 or below', async () => {
  const cases = await allStatements();
  const byKind = new Map<Statement['kind'], TextCounts>();
  for (const c of cases) {
    const k = c.statement.kind;
    byKind.set(k, addCounts(byKind.get(k) ?? { words: 0, sentences: 0, syllables: 0 }, countText(c.statement.text)));
  }

  test.each([...byKind].map(([k, c]) => [k, c] as const))('kind %s, pooled', (_, counts) => {
    expect(gradeOf(counts)).toBeLessThanOrEqual(MAX_GRADE);
  });

  test('each statement on its own', () => {
    const over = cases
      .map((c) => ({
        id: `${c.source} ${c.statement.id}`,
        grade: gradeOf(countText(c.statement.text)),
        text: c.statement.text,
      }))
      .filter((g) => g.grade > MAX_GRADE);
    expect(over).toEqual([]);
  });
});
