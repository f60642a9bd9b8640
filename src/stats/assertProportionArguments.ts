import { StatsInputError } from "./StatsInputError.js";

/**
 * Argument checks shared by the binomial proportion intervals (Wilson, Jeffreys): counts are
 * non-negative integers with successes ≤ trials.
 *
 * @throws StatsInputError naming the argument and the value found
 */
export function assertProportionCounts(successes: number, trials: number): void {
  if (!Number.isInteger(trials) || trials < 0) {
    throw new StatsInputError(`trials must be a non-negative integer (got ${trials})`);
  }
  if (!Number.isInteger(successes) || successes < 0) {
    throw new StatsInputError(`successes must be a non-negative integer (got ${successes})`);
  }
  if (successes > trials) {
    throw new StatsInputError(`successes must not exceed trials (got ${successes} of ${trials})`);
  }
}

/**
 * The confidence level of an interval must lie strictly between 0 and 1.
 *
 * @throws StatsInputError with the value found
 */
export function assertConfidence(confidence: number): void {
  if (!(confidence > 0 && confidence < 1)) {
    throw new StatsInputError(`confidence must be strictly between 0 and 1 (got ${confidence})`);
  }
}
