/**
 * "Did you mean" for misspelt keys and values: the optimal-string-alignment form of the Damerau–Levenshtein
 * distance, the fewest insertions, deletions, substitutions and swaps of two neighbouring characters that
 * turn one word into another (no substring edited twice).
 * Source: Damerau (1964), "A technique for computer detection and correction of spelling errors",
 * Communications of the ACM 7(3), 171–176; Levenshtein (1966), Soviet Physics Doklady 10(8), 707–710.
 *
 *   editDistance('seasonl_window', 'seasonal_window') → 1 (one insertion)
 *   editDistance('ca', 'abc') → 3 (the swap-then-insert route needs the pair edited twice, not allowed)
 */

export function editDistance(a: string, b: string): number {
  const m = a.length;
  const n = b.length;
  // Three rows suffice: the swap looks two rows back.
  let before = new Array<number>(n + 1).fill(0);
  let prev = Array.from({ length: n + 1 }, (_, j) => j);
  let row = new Array<number>(n + 1).fill(0);
  for (let i = 1; i <= m; i++) {
    row[0] = i;
    for (let j = 1; j <= n; j++) {
      const cost = a[i - 1] === b[j - 1] ? 0 : 1;
      let d = Math.min(prev[j] + 1, row[j - 1] + 1, prev[j - 1] + cost);
      if (i > 1 && j > 1 && a[i - 1] === b[j - 2] && a[i - 2] === b[j - 1]) d = Math.min(d, before[j - 2] + 1);
      row[j] = d;
    }
    [before, prev, row] = [prev, row, before];
  }
  return prev[n];
}

/** Case, `-`, `_` and spaces do not count: `Page-Size` is taken for `page_size`. */
function normalise(word: string): string {
  return word.toLowerCase().replace(/[-_\s]/g, '');
}

/**
 * The candidate closest to `word`, if close enough to be a slip: at most one edit for words up to four
 * characters, two up to eight, three beyond. Ties go to the earlier candidate.
 */
export function closest(word: string, candidates: readonly string[]): string | null {
  const w = normalise(word);
  const limit = w.length <= 4 ? 1 : w.length <= 8 ? 2 : 3;
  let best: string | null = null;
  let bestDistance = Number.POSITIVE_INFINITY;
  for (const candidate of candidates) {
    if (candidate === word) continue;
    const d = editDistance(w, normalise(candidate));
    if (d < bestDistance) {
      best = candidate;
      bestDistance = d;
    }
  }
  return bestDistance <= limit ? best : null;
}
