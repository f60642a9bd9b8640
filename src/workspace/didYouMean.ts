/**
 * Levenshtein edit distance: the fewest single-character insertions, deletions or substitutions
 * that turn `a` into `b` (Wagner–Fischer dynamic programme, O(|a|·|b|) time).
 *
 * @param a - any string
 * @param b - any string
 * @returns a whole number ≥ 0; 0 when the strings are equal
 * @example
 * editDistance("seaDraw", "seaDraws"); // => 1
 * @see Levenshtein V.I. (1966) "Binary codes capable of correcting deletions, insertions, and
 * reversals", Soviet Physics Doklady 10(8):707–710.
 */
export function editDistance(a: string, b: string): number {
  let previous = Array.from({ length: b.length + 1 }, (_, j) => j);
  for (let i = 1; i <= a.length; i++) {
    const current = [i];
    for (let j = 1; j <= b.length; j++) {
      const substitution = (previous[j - 1] as number) + (a[i - 1] === b[j - 1] ? 0 : 1);
      const deletion = (previous[j] as number) + 1;
      const insertion = (current[j - 1] as number) + 1;
      current.push(Math.min(substitution, deletion, insertion));
    }
    previous = current;
  }
  return previous[b.length] as number;
}

/**
 * The known name closest to an unknown one, when it is close enough to be a likely typo: an edit
 * distance of at most max(2, ⌊length/3⌋), compared without regard to case.
 *
 * @param unknown - the name the user wrote
 * @param known - the names that are allowed at that place
 * @returns the suggestion, or null when no known name is close
 * @example
 * didYouMean("minSiteRecording", ["top", "measure", "minSitesRecording"]); // => "minSitesRecording"
 */
export function didYouMean(unknown: string, known: readonly string[]): string | null {
  const limit = Math.max(2, Math.floor(unknown.length / 3));
  let best: string | null = null;
  let bestDistance = Infinity;
  for (const candidate of known) {
    const distance = editDistance(unknown.toLowerCase(), candidate.toLowerCase());
    if (distance < bestDistance) {
      best = candidate;
      bestDistance = distance;
    }
  }
  return bestDistance <= limit ? best : null;
}
