/**
 * Flesch–Kincaid grade level of English text: 0.39·(words/sentences) + 11.8·(syllables/words) − 15.59
 * (Kincaid, Fishburne, Rogers & Chissom 1975, "Derivation of new readability formulas … for Navy enlisted
 * personnel", Research Branch Report 8-75).
 *
 * Counting choices (ours, stated so the grade can be checked by hand):
 * - A word is a run of characters between spaces that holds a letter or a digit.
 * - A number (digits with grouping, decimal mark, sign, %) counts as one word of one syllable: a reader
 *   takes "55,462" in at a glance, and the formula was fitted on prose, not tables. Words inside a
 *   formatted figure ("September", "months") are counted like any other word.
 * - Syllables by a heuristic: groups of vowels (a e i o u y) in the lower-cased letters, less one for a
 *   silent final "e" (not for "-le" after a consonant, as in "table"), at least one per word.
 * - A sentence ends at ".", "!" or "?" followed by a space or the end of the text ("0.6" is not an end).
 *
 *   "The trend is up." → 4 words, 1 sentence, 4 syllables → 0.39·4 + 11.8·1 − 15.59 = −2.23
 */
export interface TextCounts {
  words: number;
  sentences: number;
  syllables: number;
}

export function syllablesOf(word: string): number {
  const w = word.toLowerCase().replace(/[^a-z]/g, '');
  if (w === '') return 1;
  let count = (w.match(/[aeiouy]+/g) ?? []).length;
  if (w.endsWith('e') && !/[^aeiouy]le$/.test(w) && count > 1) count--;
  return Math.max(1, count);
}

export function countText(text: string): TextCounts {
  const tokens = text.split(/\s+/).filter((t) => /[\p{L}\p{N}]/u.test(t));
  let syllables = 0;
  for (const t of tokens) syllables += /\p{L}/u.test(t) ? syllablesOf(t) : 1;
  const sentences = (text.match(/[.!?](?=\s|$)/g) ?? []).length || 1;
  return { words: tokens.length, sentences, syllables };
}

export function gradeOf(c: TextCounts): number {
  return 0.39 * (c.words / c.sentences) + 11.8 * (c.syllables / c.words) - 15.59;
}

export function addCounts(a: TextCounts, b: TextCounts): TextCounts {
  return { words: a.words + b.words, sentences: a.sentences + b.sentences, syllables: a.syllables + b.syllables };
}
