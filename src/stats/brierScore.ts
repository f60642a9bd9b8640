import { StatsInputError } from "./StatsInputError.js";

/**
 * Brier score (probability score, mean squared error of probability forecasts): how far forecast
 * probabilities of a yes/no event are from what happened, 0 = perfect, 1 = worst.
 *
 * BS = (1/N)·Σᵢ (pᵢ − oᵢ)², where pᵢ is the forecast probability of the event and oᵢ = 1 when it occurred,
 * 0 when not. This is the one-category form used in modern verification; Brier's 1950 original sums over both
 * categories (event and non-event) and is exactly twice this value, ranging 0 … 2.
 *
 * @param probabilities - forecast probabilities of the event, each in [0, 1].
 * @param outcomes - what happened, one per forecast: 1 / true = event, 0 / false = no event.
 * @returns the Brier score in [0, 1]; `NaN` for empty input (no forecasts to score).
 * @throws {@link StatsInputError} when the lengths differ, a probability is outside [0, 1] or NaN, or an
 *   outcome is not 0, 1, true or false.
 * @example
 * ```ts
 * brierScore([0.1, 0.9, 0.8, 0.3], [0, 1, 1, 0]); // => 0.0375
 * ```
 * @see Brier G.W. (1950) "Verification of forecasts expressed in terms of probability", Monthly Weather Review
 *   78(1):1–3, doi:10.1175/1520-0493(1950)078<0001:VOFEIT>2.0.CO;2.
 * @see Murphy A.H. (1973) "A new vector partition of the probability score", Journal of Applied Meteorology
 *   12(4):595–600 (the one-category form and its decomposition).
 */
export function brierScore(
  probabilities: readonly number[],
  outcomes: readonly (0 | 1 | boolean)[],
): number {
  if (probabilities.length !== outcomes.length) {
    throw new StatsInputError(
      `brierScore: probabilities and outcomes differ in length (${probabilities.length} and ${outcomes.length})`,
    );
  }
  if (probabilities.length === 0) {
    return Number.NaN;
  }
  let squaredErrorSum = 0;
  for (let index = 0; index < probabilities.length; index += 1) {
    const probability = probabilities[index] as number;
    if (!(probability >= 0 && probability <= 1)) {
      throw new StatsInputError(
        `brierScore: probabilities must be in [0, 1] (position ${index}: ${String(probability)})`,
      );
    }
    const outcome = outcomes[index];
    if (outcome !== 0 && outcome !== 1 && outcome !== true && outcome !== false) {
      throw new StatsInputError(
        `brierScore: outcomes must be 0, 1, true or false (position ${index}: ${String(outcome)})`,
      );
    }
    const error = probability - (outcome === true || outcome === 1 ? 1 : 0);
    squaredErrorSum += error * error;
  }
  return squaredErrorSum / probabilities.length;
}
