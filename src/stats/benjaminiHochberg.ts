import { StatsInputError } from "./StatsInputError.js";

/**
 * Benjamini–Hochberg adjusted p-values (q-values) controlling the false discovery rate.
 *
 * With the m defined p-values sorted ascending, p(1) ≤ … ≤ p(m), the adjusted value of rank i is
 * q(i) = min over j ≥ i of min(1, m·p(j)/j) — the step-up form, so q is monotone in p, never below p and never
 * above 1. Rejecting every hypothesis with q ≤ α is the BH (1995) procedure at false discovery rate α.
 * Results come back in the input order. NaN entries (tests that could not be computed) stay NaN and are not
 * counted in m.
 *
 * @param pValues - p-values in [0, 1], or NaN for "not computed"; any length, including 0.
 * @returns adjusted p-values in the input order, each in [p, 1], NaN where the input is NaN. Degenerate case:
 *   an empty input gives an empty array; a single p-value is returned unchanged.
 * @throws {StatsInputError} if a value is not NaN and outside [0, 1] (including ±Infinity).
 * @example
 * ```ts
 * // Benjamini & Hochberg (1995) §4: the 15 p-values of their example; the four smallest have q ≤ 0.05
 * const q = benjaminiHochberg([0.0001, 0.0004, 0.0019, 0.0095, 0.0201, 0.0278, 0.0298, 0.0344, 0.0459,
 *   0.324, 0.4262, 0.5719, 0.6528, 0.759, 1]);
 * // => [0.0015, 0.003, 0.0095, 0.035625, 0.0603, 0.06386, 0.06386, 0.0645, 0.0765, 0.486, …, 1]
 * q.filter((value) => value <= 0.05).length; // => 4
 * ```
 * @see Benjamini Y., Hochberg Y. (1995) "Controlling the false discovery rate: a practical and powerful approach
 *   to multiple testing", Journal of the Royal Statistical Society B 57(1):289–300,
 *   doi:10.1111/j.2517-6161.1995.tb02031.x.
 */
export function benjaminiHochberg(pValues: readonly number[]): number[] {
  pValues.forEach((pValue, index) => {
    if (!Number.isNaN(pValue) && !(pValue >= 0 && pValue <= 1)) {
      throw new StatsInputError(`p-values must lie in [0, 1] or be NaN (entry ${index} is ${pValue})`);
    }
  });
  const definedIndices = pValues
    .map((pValue, index) => ({ pValue, index }))
    .filter((entry) => !Number.isNaN(entry.pValue))
    .sort((left, right) => left.pValue - right.pValue || left.index - right.index);
  const testCount = definedIndices.length;
  const adjusted = pValues.map(() => Number.NaN);
  let runningMinimum = 1;
  for (let rank = testCount; rank >= 1; rank -= 1) {
    const entry = definedIndices[rank - 1];
    if (entry === undefined) continue;
    // p·(m/rank), not (m·p)/rank: multiplying p by a factor ≥ 1 can never round below p.
    runningMinimum = Math.min(runningMinimum, entry.pValue * (testCount / rank));
    adjusted[entry.index] = runningMinimum;
  }
  return adjusted;
}
