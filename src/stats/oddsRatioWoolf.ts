import normalQuantile from "@stdlib/stats-base-dists-normal-quantile";
import { StatsInputError } from "./StatsInputError.js";

/**
 * Sample odds ratio of a 2 × 2 table with Woolf's logit (log-scale) confidence interval.
 *
 * For [[a, b], [c, d]] the odds ratio is OR = (a·d)/(b·c). Woolf's interval is built on the log scale:
 * SE(ln OR) = √(1/a + 1/b + 1/c + 1/d) and the limits are exp(ln OR ± z·SE) with z = Φ⁻¹((1 + confidence)/2).
 * When any cell is 0, ½ is added to every cell before both the estimate and the interval are computed
 * (the Haldane–Anscombe correction) and `haldaneCorrected` is true.
 *
 * @param table - [[a, b], [c, d]], finite non-negative counts (rows: exposure yes / no; columns: outcome yes / no).
 * @param confidence - two-sided confidence level, strictly between 0 and 1 (default 0.95).
 * @returns `{ oddsRatio, lower, upper, haldaneCorrected }`, with 0 < lower ≤ oddsRatio ≤ upper. Degenerate case:
 *   when a row or column total is zero the odds ratio is undefined (0/0 before any correction) and
 *   oddsRatio, lower and upper are NaN with haldaneCorrected false.
 * @throws {StatsInputError} if the table is not 2 × 2, a count is negative or not finite, or confidence is
 *   not strictly between 0 and 1.
 * @example
 * ```ts
 * // Bland & Altman (2000), hay fever by eczema in 11-year-olds
 * oddsRatioWoolf([[141, 420], [928, 13525]]); // => { oddsRatio: 4.89, lower: 4.00, upper: 5.99, haldaneCorrected: false }
 * ```
 * @see Woolf B. (1955) "On estimating the relation between blood group and disease", Annals of Human Genetics
 *   19(4):251–253, doi:10.1111/j.1469-1809.1955.tb01348.x.
 * @see Haldane J.B.S. (1956) "The estimation and significance of the logarithm of a ratio of frequencies",
 *   Annals of Human Genetics 20(4):309–311, doi:10.1111/j.1469-1809.1955.tb01285.x.
 * @see Bland J.M., Altman D.G. (2000) "The odds ratio", BMJ 320:1468, doi:10.1136/bmj.320.7247.1468.
 */
export function oddsRatioWoolf(
  table: readonly [readonly [number, number], readonly [number, number]],
  confidence = 0.95,
): { oddsRatio: number; lower: number; upper: number; haldaneCorrected: boolean } {
  if (table.length !== 2 || table.some((row) => row.length !== 2)) {
    throw new StatsInputError("the odds ratio needs a 2 × 2 table");
  }
  const cells = [table[0][0], table[0][1], table[1][0], table[1][1]];
  cells.forEach((count) => {
    if (!Number.isFinite(count) || count < 0) {
      throw new StatsInputError(`2 × 2 table counts must be finite and non-negative (got ${count})`);
    }
  });
  if (!(confidence > 0 && confidence < 1)) {
    throw new StatsInputError(`confidence must be strictly between 0 and 1 (got ${confidence})`);
  }
  const [a, b, c, d] = cells as [number, number, number, number];
  if (a + b === 0 || c + d === 0 || a + c === 0 || b + d === 0) {
    return { oddsRatio: Number.NaN, lower: Number.NaN, upper: Number.NaN, haldaneCorrected: false };
  }
  const haldaneCorrected = cells.some((count) => count === 0);
  // Haldane–Anscombe: add one half to every cell when any cell is empty.
  const correction = haldaneCorrected ? 0.5 : 0;
  const [ca, cb, cc, cd] = [a + correction, b + correction, c + correction, d + correction];
  const logOddsRatio = Math.log(ca) + Math.log(cd) - Math.log(cb) - Math.log(cc);
  const standardError = Math.sqrt(1 / ca + 1 / cb + 1 / cc + 1 / cd);
  const z = normalQuantile((1 + confidence) / 2, 0, 1);
  return {
    oddsRatio: Math.exp(logOddsRatio),
    lower: Math.exp(logOddsRatio - z * standardError),
    upper: Math.exp(logOddsRatio + z * standardError),
    haldaneCorrected,
  };
}
