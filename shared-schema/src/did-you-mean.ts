// "Did you mean" suggestions for unknown keys and unknown units. One place, so a key typo in a
// clock file and a unit typo in a wave file are answered the same way.

/** Levenshtein distance (insert, delete, substitute: cost 1 each). */
export function editDistance(a: string, b: string): number {
  if (a === b) return 0;
  let prev = Array.from({ length: b.length + 1 }, (_, j) => j);
  for (let i = 1; i <= a.length; i++) {
    const row = [i];
    for (let j = 1; j <= b.length; j++) {
      const cost = a[i - 1] === b[j - 1] ? 0 : 1;
      row[j] = Math.min(prev[j] + 1, row[j - 1] + 1, prev[j - 1] + cost);
    }
    prev = row;
  }
  return prev[b.length];
}

/**
 * The candidates closest to `word`: every case-insensitive match first (so `mhz` offers both
 * `MHz` and `mHz`), else the nearest by edit distance within a third of the word's length.
 */
export function closest(word: string, candidates: readonly string[]): string[] {
  const lower = word.toLowerCase();
  const sameLetters = candidates.filter((c) => c.toLowerCase() === lower && c !== word);
  if (sameLetters.length > 0) return sameLetters;
  const limit = Math.min(word.length - 1, Math.max(2, Math.floor(word.length / 3)));
  let best = Infinity;
  let found: string[] = [];
  for (const c of candidates) {
    const d = editDistance(lower, c.toLowerCase());
    if (d > limit || d > best) continue;
    if (d < best) {
      best = d;
      found = [];
    }
    found.push(c);
  }
  return found;
}

/** " — did you mean `a` or `b`?" or "" when nothing is close. */
export function didYouMean(word: string, candidates: readonly string[]): string {
  const found = closest(word, candidates);
  if (found.length === 0) return '';
  return ` (did you mean ${found.map((c) => `\`${c}\``).join(' or ')}?)`;
}
