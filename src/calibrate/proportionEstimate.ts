import { jeffreysInterval } from "../stats/jeffreysInterval.js";
import { wilsonInterval } from "../stats/wilsonInterval.js";
import type { ProbabilityEstimate } from "./types.js";

/**
 * A proportion k/n with its 95% interval in the JSON form: Wilson score (Wilson E.B. 1927,
 * "Probable inference, the law of succession, and statistical inference", JASA 22:209–212) by
 * default, or Jeffreys (Brown, Cai & DasGupta 2001, "Interval estimation for a binomial
 * proportion", Statistical Science 16:101–133). With n = 0 the estimate is null with a reason.
 */
export function proportionEstimate(successes: number, trials: number, method: "wilson" | "jeffreys"): ProbabilityEstimate {
  if (trials === 0) return { estimate: null, lower: null, upper: null, reason: "no years in this group" };
  const interval = method === "jeffreys" ? jeffreysInterval(successes, trials) : wilsonInterval(successes, trials);
  return { estimate: interval.estimate, lower: interval.lower, upper: interval.upper };
}
