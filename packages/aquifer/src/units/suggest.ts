/**
 * Close-match suggestions for unknown unit text, by optimal-string-alignment edit distance
 * (Levenshtein distance plus adjacent transposition, so "gmp" is one edit from "gpm").
 */

/** Edit distance between a and b counting insertions, deletions, substitutions and adjacent swaps. */
export function editDistance(a: string, b: string): number {
  const rows = a.length + 1;
  const cols = b.length + 1;
  const d: number[][] = Array.from({ length: rows }, (_, i) => {
    const row = new Array<number>(cols).fill(0);
    row[0] = i;
    return row;
  });
  for (let j = 0; j < cols; j++) d[0][j] = j;
  for (let i = 1; i < rows; i++) {
    for (let j = 1; j < cols; j++) {
      const cost = a[i - 1] === b[j - 1] ? 0 : 1;
      let best = Math.min(d[i - 1][j] + 1, d[i][j - 1] + 1, d[i - 1][j - 1] + cost);
      if (i > 1 && j > 1 && a[i - 1] === b[j - 2] && a[i - 2] === b[j - 1]) {
        best = Math.min(best, d[i - 2][j - 2] + 1);
      }
      d[i][j] = best;
    }
  }
  return d[a.length][b.length];
}

/**
 * Up to `limit` candidates closest to `text` (all tied at the smallest distance, in code-point order).
 * A candidate that differs only in letter case counts as half an edit, so "M" suggests only "m";
 * otherwise one edit is allowed for texts of up to 3 characters, two beyond.
 */
export function closeMatches(text: string, candidates: readonly string[], limit = 3): string[] {
  const allowed = text.length <= 3 ? 1 : 2;
  const scored: { candidate: string; score: number }[] = [];
  for (const candidate of candidates) {
    const exact = editDistance(text, candidate);
    const caseless = editDistance(text.toLowerCase(), candidate.toLowerCase()) + 0.5;
    const score = Math.min(exact, caseless);
    if (score <= allowed) scored.push({ candidate, score });
  }
  if (scored.length === 0) return [];
  const best = Math.min(...scored.map((s) => s.score));
  return scored
    .filter((s) => s.score === best)
    .map((s) => s.candidate)
    .sort()
    .slice(0, limit);
}
