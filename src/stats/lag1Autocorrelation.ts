import { StatsInputError } from "./StatsInputError.js";

/**
 * Lag-1 sample autocorrelation coefficient of a time series (the standard, biased-denominator estimator).
 *
 * r₁ = Σₜ₌₁ⁿ⁻¹ (xₜ − x̄)(xₜ₊₁ − x̄) / Σₜ₌₁ⁿ (xₜ − x̄)², where x̄ is the mean of all n values. This is the estimator
 * of Box & Jenkins and of R's `acf`, and the one NIST certifies in its univariate reference datasets: the
 * autocovariance sum has n − 1 terms but both sums are divided by the same n, so |r₁| ≤ 1 and the estimate
 * is slightly biased towards 0 in short series. Values must be equally spaced in time, in time order.
 *
 * @param x - the series in time order, finite numbers.
 * @returns r₁ in [−1, 1]. Degenerate case: NaN when n < 3 (too short for a lag-1 estimate) or when all
 *   values are equal (zero variance).
 * @throws {StatsInputError} if a value is not finite (fill or remove gaps before calling).
 * @example
 * ```ts
 * // NIST StRD NumAcc1: certified lag-1 autocorrelation −0.5
 * lag1Autocorrelation([10000001, 10000003, 10000002]); // => -0.5
 * ```
 * @see Box G.E.P., Jenkins G.M., Reinsel G.C. (1994) Time Series Analysis: Forecasting and Control, 3rd ed.,
 *   Prentice-Hall, §2.1.5 (estimation of autocovariance and autocorrelation functions).
 * @see National Institute of Standards and Technology, Statistical Reference Datasets, Univariate Summary
 *   Statistics, https://www.itl.nist.gov/div898/strd/univ/homepage.html.
 */
export function lag1Autocorrelation(x: readonly number[]): number {
  x.forEach((value, index) => {
    if (!Number.isFinite(value)) {
      throw new StatsInputError(`series has a non-finite value at ${index} (${value})`);
    }
  });
  const length = x.length;
  if (length < 3) return Number.NaN;
  // All ties are detected exactly: a rounded mean of equal values could otherwise leave spurious deviations.
  if (x.every((value) => value === x[0])) return Number.NaN;
  const mean = x.reduce((sum, value) => sum + value, 0) / length;
  const rawDeviations = x.map((value) => value - mean);
  // Divide by the largest absolute deviation so sums of squares cannot underflow or overflow (r₁ is scale-free).
  const largest = rawDeviations.reduce((maximum, deviation) => Math.max(maximum, Math.abs(deviation)), 0);
  const deviations = rawDeviations.map((deviation) => deviation / largest);
  let sumOfSquares = 0;
  let laggedProducts = 0;
  for (let index = 0; index < length; index += 1) {
    const deviation = deviations[index] ?? 0;
    sumOfSquares += deviation * deviation;
    if (index + 1 < length) laggedProducts += deviation * (deviations[index + 1] ?? 0);
  }
  return laggedProducts / sumOfSquares;
}
