import { StatsInputError } from "./StatsInputError.js";

/**
 * Brier skill score: the relative improvement of a forecast's Brier score over a reference forecast's
 * (usually climatology), 1 = perfect, 0 = no better than the reference, negative = worse.
 *
 * BSS = 1 − BS / BS_ref. With sample climatology as reference, BS_ref = ō·(1 − ō) for the observed event
 * frequency ō.
 *
 * @param score - the Brier score of the forecasts, ≥ 0 (NaN propagates).
 * @param referenceScore - the Brier score of the reference forecasts over the same cases, ≥ 0 (NaN
 *   propagates).
 * @returns the skill score in (−∞, 1]; `NaN` when the reference score is 0 (a perfect reference leaves no
 *   room for improvement, for example climatology when the event always or never happened) or when either
 *   score is NaN.
 * @throws {@link StatsInputError} when a score is negative or infinite.
 * @example
 * ```ts
 * brierSkillScore(0.0375, 0.25); // => 0.85 (the four-case example against the 50 % climatology)
 * ```
 * @see Murphy A.H. (1973) "A new vector partition of the probability score", Journal of Applied Meteorology
 *   12(4):595–600.
 * @see Wilks D.S. (2011) Statistical Methods in the Atmospheric Sciences, 3rd ed., Academic Press, chapter 8
 *   (skill scores relative to climatology).
 */
export function brierSkillScore(score: number, referenceScore: number): number {
  for (const [name, value] of [
    ["score", score],
    ["referenceScore", referenceScore],
  ] as const) {
    if (value < 0 || value === Number.POSITIVE_INFINITY) {
      throw new StatsInputError(`brierSkillScore: ${name} must be finite and ≥ 0 (got ${String(value)})`);
    }
  }
  if (Number.isNaN(score) || Number.isNaN(referenceScore) || referenceScore === 0) {
    return Number.NaN;
  }
  return 1 - score / referenceScore;
}
