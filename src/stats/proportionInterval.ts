/**
 * Proportion interval: a point estimate of a binomial proportion with the two limits of a two-sided
 * confidence interval, all on the probability scale 0–1.
 *
 * Returned by {@link wilsonInterval} and {@link jeffreysInterval}. With zero trials every field is `NaN`
 * (a proportion of nothing is undefined); otherwise `0 ≤ lower ≤ estimate ≤ upper ≤ 1`.
 *
 * @example
 * ```ts
 * const interval: ProportionInterval = { estimate: 81 / 263, lower: 0.2553, upper: 0.3662 };
 * ```
 * @see Newcombe R.G. (1998) "Two-sided confidence intervals for the single proportion: comparison of seven
 * methods", Statistics in Medicine 17(8):857–872, doi:10.1002/(SICI)1097-0258(19980430)17:8<857::AID-SIM777>3.0.CO;2-E.
 */
export interface ProportionInterval {
  /** Sample proportion successes / trials, in [0, 1]; NaN when trials = 0. */
  estimate: number;
  /** Lower confidence limit, in [0, 1]; NaN when trials = 0. */
  lower: number;
  /** Upper confidence limit, in [0, 1]; NaN when trials = 0. */
  upper: number;
}
