import { StatsInputError } from "./StatsInputError.js";

/**
 * Ranked probability skill score (RPSS): the relative improvement of the mean ranked probability score of
 * the forecasts over that of a reference (usually climatology, ⅓ each for terciles), 1 = perfect, 0 = no
 * better than the reference, negative = worse.
 *
 * RPSS = 1 − RPS̄ / RPS̄_ref, both means over the same cases and in the same form (both unnormalized or both
 * divided by K − 1; the ratio is the same either way).
 *
 * @param meanScore - mean ranked probability score of the forecasts, ≥ 0 (NaN propagates).
 * @param meanReferenceScore - mean ranked probability score of the reference forecasts, ≥ 0 (NaN propagates).
 * @returns the skill score in (−∞, 1]; `NaN` when the reference score is 0 (a perfect reference) or when
 *   either score is NaN.
 * @throws {@link StatsInputError} when a score is negative or infinite.
 * @example
 * ```ts
 * // Forecast (0.2, 0.3, 0.5) scores 0.29 when the upper tercile is observed; climatology scores 5/9.
 * rankedProbabilitySkillScore(0.29, 5 / 9); // => 0.478
 * ```
 * @see Epstein E.S. (1969) "A scoring system for probability forecasts of ranked categories", Journal of
 *   Applied Meteorology 8(6):985–987.
 * @see Weigel A.P., Liniger M.A., Appenzeller C. (2007) "The discrete Brier and ranked probability skill
 *   scores", Monthly Weather Review 135(1):118–124, doi:10.1175/MWR3280.1 (the score's negative bias for small
 *   ensembles; not corrected here).
 */
export function rankedProbabilitySkillScore(meanScore: number, meanReferenceScore: number): number {
  for (const [name, value] of [
    ["meanScore", meanScore],
    ["meanReferenceScore", meanReferenceScore],
  ] as const) {
    if (value < 0 || value === Number.POSITIVE_INFINITY) {
      throw new StatsInputError(
        `rankedProbabilitySkillScore: ${name} must be finite and ≥ 0 (got ${String(value)})`,
      );
    }
  }
  if (Number.isNaN(meanScore) || Number.isNaN(meanReferenceScore) || meanReferenceScore === 0) {
    return Number.NaN;
  }
  return 1 - meanScore / meanReferenceScore;
}
