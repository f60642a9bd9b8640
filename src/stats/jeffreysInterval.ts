import betaQuantile from "@stdlib/stats-base-dists-beta-quantile";
import { assertConfidence, assertProportionCounts } from "./assertProportionArguments.js";
import type { ProportionInterval } from "./proportionInterval.js";

/**
 * Jeffreys confidence interval for a binomial proportion (equal-tailed, with the boundary modification).
 *
 * The interval takes the equal-tailed quantiles of the Jeffreys-prior posterior Beta(x + ½, n − x + ½):
 * lower = B⁻¹(α/2; x + ½, n − x + ½) and upper = B⁻¹(1 − α/2; x + ½, n − x + ½), with α = 1 − confidence.
 * Following Brown, Cai & DasGupta (2001) §4.1.2 the lower limit is set to 0 when x = 0 and the upper limit
 * to 1 when x = n, so the interval includes the sample proportion 0 or 1 at those ends. (At the usual levels,
 * confidence ≥ 0.5, it contains x/n for every x; an equal-tailed posterior interval at a very low level such as
 * 0.01 can miss it, because the posterior median is pulled towards ½.)
 *
 * @param successes - number of successes x; an integer with 0 ≤ x ≤ trials.
 * @param trials - number of trials n; a non-negative integer.
 * @param confidence - two-sided confidence level, strictly between 0 and 1 (default 0.95).
 * @returns `{ estimate: x/n, lower, upper }`, all in [0, 1]. Degenerate case: with `trials = 0` the proportion
 *   is undefined and all three fields are `NaN`.
 * @throws {StatsInputError} if a count is negative, non-integer or not finite, if successes > trials, or if
 *   confidence is not strictly between 0 and 1.
 * @example
 * ```ts
 * // Newcombe's (1998) example 81/263; the Jeffreys limits are computed, not published (C only).
 * jeffreysInterval(81, 263); // => { estimate: 0.30798…, lower: 0.2545…, upper: 0.3656… }
 * ```
 * @see Brown L.D., Cai T.T., DasGupta A. (2001) "Interval estimation for a binomial proportion", Statistical
 *   Science 16(2):101–133, §4.1.2, doi:10.1214/ss/1009213286.
 */
export function jeffreysInterval(successes: number, trials: number, confidence = 0.95): ProportionInterval {
  assertProportionCounts(successes, trials);
  assertConfidence(confidence);
  if (trials === 0) {
    return { estimate: Number.NaN, lower: Number.NaN, upper: Number.NaN };
  }
  const tailProbability = (1 - confidence) / 2;
  const shapeAlpha = successes + 0.5;
  const shapeBeta = trials - successes + 0.5;
  // Brown, Cai & DasGupta (2001) §4.1.2: lower limit 0 at x = 0, upper limit 1 at x = n.
  const lower = successes === 0 ? 0 : betaQuantile(tailProbability, shapeAlpha, shapeBeta);
  const upper = successes === trials ? 1 : betaQuantile(1 - tailProbability, shapeAlpha, shapeBeta);
  return { estimate: successes / trials, lower, upper };
}
