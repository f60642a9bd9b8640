/**
 * Optimal string alignment distance (Levenshtein distance with adjacent transpositions): the
 * fewest single-character insertions, deletions, substitutions or swaps of two neighbouring
 * characters that turn `a` into `b`. Dynamic programme in O(|a|·|b|) time.
 *
 * @param a - any string
 * @param b - any string
 * @returns a whole number ≥ 0; 0 when the strings are equal
 * @example
 * editDistance("kitten", "sitting"); // => 3
 * editDistance("sede", "seed"); // => 1 (one swap)
 * @see Levenshtein V.I. (1966) "Binary codes capable of correcting deletions, insertions, and
 * reversals", Soviet Physics Doklady 10(8):707–710.
 * @see Damerau F.J. (1964) "A technique for computer detection and correction of spelling errors",
 * Communications of the ACM 7(3):171–176.
 */
export function editDistance(a: string, b: string): number {
  let beforePrevious: number[] = [];
  let previous = Array.from({ length: b.length + 1 }, (_, j) => j);
  for (let i = 1; i <= a.length; i++) {
    const current = [i];
    for (let j = 1; j <= b.length; j++) {
      const substitution = (previous[j - 1] as number) + (a[i - 1] === b[j - 1] ? 0 : 1);
      const deletion = (previous[j] as number) + 1;
      const insertion = (current[j - 1] as number) + 1;
      let best = Math.min(substitution, deletion, insertion);
      if (i > 1 && j > 1 && a[i - 1] === b[j - 2] && a[i - 2] === b[j - 1]) {
        best = Math.min(best, (beforePrevious[j - 2] as number) + 1);
      }
      current.push(best);
    }
    beforePrevious = previous;
    previous = current;
  }
  return previous[b.length] as number;
}

/**
 * The known name closest to an unknown one, when it is close enough to be a likely typo: an edit
 * distance of at most max(1, ⌊length/3⌋) and less than the length of the unknown name (so a
 * one-letter name gets no suggestion), compared without regard to case.
 *
 * @param unknown - the name the user wrote
 * @param known - the names that are allowed at that place
 * @returns the suggestion, or null when no known name is close
 * @example
 * didYouMean("minSiteRecording", ["top", "measure", "minSitesRecording"]); // => "minSitesRecording"
 */
export function didYouMean(unknown: string, known: readonly string[]): string | null {
  const limit = Math.min(Math.max(1, Math.floor(unknown.length / 3)), unknown.length - 1);
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
