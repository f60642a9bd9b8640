import tCdf from "@stdlib/stats-base-dists-t-cdf";
import { StatsInputError } from "./StatsInputError.js";

/**
 * Two-sided t test of a Pearson correlation against zero, with a possibly non-integer (effective) sample size.
 *
 * t = r·√(N − 2)/√(1 − r²) with df = N − 2, and p = 2·P(T_df ≤ −|t|) from Student's t distribution. N may be an
 * effective sample size (see {@link effectiveSampleSize}), so df need not be an integer. The lower tail is
 * evaluated directly, so small p-values keep their relative precision.
 *
 * @param r - sample correlation in [−1, 1], or NaN when undefined.
 * @param effectiveN - (effective) number of independent pairs, ≥ 0, or NaN when undefined.
 * @returns `{ t, df, pValue }` with pValue in [0, 1]; |r| = 1 gives t = ±Infinity and p = 0. Degenerate case:
 *   when N ≤ 2 (no degrees of freedom), or r or N is NaN, all three fields are NaN.
 * @throws {StatsInputError} if r is outside [−1, 1] or effectiveN is negative or infinite.
 * @example
 * ```ts
 * // r = 0.5 from 27 independent pairs: t = 0.5·5/√0.75 = 2.8868 with 25 df
 * correlationTest(0.5, 27); // => { t: 2.886751, df: 25, pValue: 0.007913 }
 * ```
 * @see Fisher R.A. (1915) "Frequency distribution of the values of the correlation coefficient in samples from
 *   an indefinitely large population", Biometrika 10(4):507–521, doi:10.2307/2331838.
 * @see Bretherton C.S., Widmann M., Dymnikov V.P., Wallace J.M., Bladé I. (1999) "The effective number of
 *   spatial degrees of freedom of a time-varying field", Journal of Climate 12(7):1990–2009, §5.
 */
export function correlationTest(r: number, effectiveN: number): { t: number; df: number; pValue: number } {
  if (!Number.isNaN(r) && !(r >= -1 && r <= 1)) {
    throw new StatsInputError(`r must lie in [−1, 1] or be NaN (got ${r})`);
  }
  if (!Number.isNaN(effectiveN) && !(effectiveN >= 0 && Number.isFinite(effectiveN))) {
    throw new StatsInputError(`effectiveN must be finite and non-negative or NaN (got ${effectiveN})`);
  }
  if (Number.isNaN(r) || Number.isNaN(effectiveN) || effectiveN <= 2) {
    return { t: Number.NaN, df: Number.NaN, pValue: Number.NaN };
  }
  const df = effectiveN - 2;
  if (Math.abs(r) === 1) {
    return { t: r * Number.POSITIVE_INFINITY, df, pValue: 0 };
  }
  const t = (r * Math.sqrt(df)) / Math.sqrt(1 - r * r);
  const pValue = Math.min(1, 2 * tCdf(-Math.abs(t), df));
  return { t, df, pValue };
}
