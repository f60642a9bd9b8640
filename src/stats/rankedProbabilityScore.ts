import { StatsInputError } from "./StatsInputError.js";

/** Largest accepted departure of the forecast probabilities' sum from 1 (rounded percentages pass). */
const SUM_TOLERANCE = 1e-6;

/**
 * Ranked probability score (RPS) of one categorical probability forecast: the squared distance between the
 * cumulative forecast and the cumulative observation over ordered categories, 0 = perfect.
 *
 * RPS = Σₖ (Fₖ − Oₖ)², k = 1 … K, where Fₖ = p₁ + … + pₖ is the cumulative forecast probability and Oₖ = 1 when
 * the observed category is at or below k, else 0 (the last term is always 0). This is the UNNORMALIZED form
 * (Epstein 1969, as written by Murphy 1971), ranging 0 … K − 1. With `{ normalized: true }` the score is
 * divided by K − 1 so that it ranges 0 … 1, as some authors and software do; whichever form is used, a skill
 * score must compare like with like. For K = 2 the unnormalized RPS equals the Brier
 * score of the first category.
 *
 * @param probabilities - forecast probabilities of the K ≥ 2 ordered categories (for terciles: below, near,
 *   above normal), each in [0, 1], summing to 1 within 1e-6.
 * @param observedCategory - the zero-based index of the observed category, an integer in 0 … K − 1.
 * @param options - `normalized`: divide by K − 1 (default false).
 * @returns the score in [0, K − 1] (unnormalized) or [0, 1] (normalized). There is no degenerate case.
 * @throws {@link StatsInputError} when fewer than two categories are given, a probability is outside [0, 1],
 *   the probabilities do not sum to 1, or observedCategory is not an integer in 0 … K − 1.
 * @example
 * ```ts
 * rankedProbabilityScore([1 / 3, 1 / 3, 1 / 3], 2); // => 0.5556 (5/9, climatology, upper tercile observed)
 * rankedProbabilityScore([1 / 3, 1 / 3, 1 / 3], 2, { normalized: true }); // => 0.2778
 * rankedProbabilityScore([0.2, 0.3, 0.5], 0); // => 0.89
 * ```
 * @see Epstein E.S. (1969) "A scoring system for probability forecasts of ranked categories", Journal of
 *   Applied Meteorology 8(6):985–987.
 * @see Murphy A.H. (1971) "A note on the ranked probability score", Journal of Applied Meteorology
 *   10(1):155–156.
 */
export function rankedProbabilityScore(
  probabilities: readonly number[],
  observedCategory: number,
  options: { readonly normalized?: boolean } = {},
): number {
  const categoryCount = probabilities.length;
  if (categoryCount < 2) {
    throw new StatsInputError(
      `rankedProbabilityScore: at least two categories are needed (got ${categoryCount})`,
    );
  }
  if (!Number.isInteger(observedCategory) || observedCategory < 0 || observedCategory >= categoryCount) {
    throw new StatsInputError(
      `rankedProbabilityScore: observedCategory must be an integer in 0…${categoryCount - 1} ` +
        `(got ${String(observedCategory)})`,
    );
  }
  let cumulativeForecast = 0;
  let score = 0;
  for (let category = 0; category < categoryCount; category += 1) {
    const probability = probabilities[category] as number;
    if (!(probability >= 0 && probability <= 1)) {
      throw new StatsInputError(
        `rankedProbabilityScore: probabilities must be in [0, 1] (category ${category}: ${String(probability)})`,
      );
    }
    cumulativeForecast += probability;
    const cumulativeObservation = category >= observedCategory ? 1 : 0;
    const difference = cumulativeForecast - cumulativeObservation;
    score += difference * difference;
  }
  if (Math.abs(cumulativeForecast - 1) > SUM_TOLERANCE) {
    throw new StatsInputError(
      `rankedProbabilityScore: probabilities must sum to 1 (got ${String(cumulativeForecast)})`,
    );
  }
  return options.normalized === true ? score / (categoryCount - 1) : score;
}
