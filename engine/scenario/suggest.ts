/**
 * "Did you mean": the known word nearest to a misspelt one, so that `lenght` points at `length`
 * instead of leaving the user to compare against a list.
 */

/**
 * Edit distance counting insertions, deletions, substitutions and swaps of neighbours ("inelt" is
 * one step from "inlet"): the optimal-string-alignment variant of the Damerau–Levenshtein distance.
 */
export function editDistance(a: string, b: string): number {
  const rows: number[][] = [Array.from({ length: b.length + 1 }, (_, j) => j)];
  for (let i = 1; i <= a.length; i++) {
    const row = [i];
    for (let j = 1; j <= b.length; j++) {
      const cost = a[i - 1] === b[j - 1] ? 0 : 1;
      let d = Math.min(rows[i - 1][j] + 1, row[j - 1] + 1, rows[i - 1][j - 1] + cost);
      if (i > 1 && j > 1 && a[i - 1] === b[j - 2] && a[i - 2] === b[j - 1]) d = Math.min(d, rows[i - 2][j - 2] + 1);
      row.push(d);
    }
    rows.push(row);
  }
  return rows[a.length][b.length];
}

// Words longer than this are not compared: a pasted paragraph is no misspelt key.
const MAX_COMPARED_LENGTH = 64;

/** The nearest candidate within about a third of the word's length (case ignored), or undefined. */
export function nearest(word: string, candidates: readonly string[]): string | undefined {
  if (word.length > MAX_COMPARED_LENGTH) return undefined;
  const lower = word.toLowerCase();
  const budget = Math.max(1, Math.floor(word.length / 3));
  let best: string | undefined;
  let bestDistance = Infinity;
  for (const candidate of candidates) {
    const d = editDistance(lower, candidate.toLowerCase());
    if (d < bestDistance && d <= budget) {
      best = candidate;
      bestDistance = d;
    }
  }
  return best;
}

/** `did you mean "length"? ` or "", for the front of a fix. */
export function didYouMean(word: string, candidates: readonly string[]): string {
  const guess = nearest(word, candidates);
  return guess === undefined ? '' : `did you mean "${guess}"? `;
}
