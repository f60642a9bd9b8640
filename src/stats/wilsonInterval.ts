import normalQuantile from "@stdlib/stats-base-dists-normal-quantile";
import { assertConfidence, assertProportionCounts } from "./assertProportionArguments.js";
import type { ProportionInterval } from "./proportionInterval.js";

/**
 * Wilson score confidence interval for a binomial proportion (without continuity correction).
 *
 * The interval is the set of proportions π that a two-sided score test at level 1 − confidence would not
 * reject: with p̂ = x/n and z = Φ⁻¹((1 + confidence)/2), the limits are
 * (x + z²/2 ± z·√(x(n − x)/n + z²/4)) / (n + z²). Unlike the Wald interval it never leaves [0, 1] and keeps
 * close to nominal coverage for small n and proportions near 0 or 1 (Newcombe's method 3). The lower limit is
 * exactly 0 when x = 0 and the upper limit exactly 1 when x = n.
 *
 * @param successes - number of successes x; an integer with 0 ≤ x ≤ trials.
 * @param trials - number of trials n; a non-negative integer.
 * @param confidence - two-sided confidence level, strictly between 0 and 1 (default 0.95, z = 1.959963985…).
 * @returns `{ estimate: x/n, lower, upper }`, all in [0, 1]. Degenerate case: with `trials = 0` the proportion
 *   is undefined and all three fields are `NaN`.
 * @throws {StatsInputError} if a count is negative, non-integer or not finite, if successes > trials, or if
 *   confidence is not strictly between 0 and 1.
 * @example
 * ```ts
 * // Newcombe (1998), illustrative table, method 3: 81/263 → 0.2553–0.3662
 * wilsonInterval(81, 263); // => { estimate: 0.30798…, lower: 0.255289…, upper: 0.366210… }
 * ```
 * @see Wilson E.B. (1927) "Probable inference, the law of succession, and statistical inference", Journal of
 *   the American Statistical Association 22(158):209–212, doi:10.1080/01621459.1927.10502953.
 * @see Newcombe R.G. (1998) "Two-sided confidence intervals for the single proportion: comparison of seven
 *   methods", Statistics in Medicine 17(8):857–872, method 3 and its illustrative table.
 */
export function wilsonInterval(successes: number, trials: number, confidence = 0.95): ProportionInterval {
  assertProportionCounts(successes, trials);
  assertConfidence(confidence);
  if (trials === 0) {
    return { estimate: Number.NaN, lower: Number.NaN, upper: Number.NaN };
  }
  const z = normalQuantile((1 + confidence) / 2, 0, 1);
  const zSquared = z * z;
  const failures = trials - successes;
  const centre = (successes + zSquared / 2) / (trials + zSquared);
  const halfWidth = (z * Math.sqrt((successes * failures) / trials + zSquared / 4)) / (trials + zSquared);
  // Mathematically the limits touch 0 (x = 0) and 1 (x = n) exactly; set them so rounding cannot move them.
  const lower = successes === 0 ? 0 : Math.max(0, centre - halfWidth);
  const upper = successes === trials ? 1 : Math.min(1, centre + halfWidth);
  return { estimate: successes / trials, lower, upper };
}
