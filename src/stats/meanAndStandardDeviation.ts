import { StatsInputError } from "./StatsInputError.js";

/**
 * Sample mean and sample standard deviation (Bessel-corrected, divisor n − 1).
 *
 * mean = Σxᵢ/n; sd = √(Σ(xᵢ − mean)²/(n − 1)). The squared deviations are summed in a second pass, after the
 * mean is known, with the compensating term Σ(xᵢ − mean) subtracted (the corrected two-pass algorithm), so data
 * with a large common offset keep full precision; deviations are divided by the largest of them before squaring
 * so the sum of squares cannot underflow or overflow. Identical values are detected exactly (sd = 0).
 *
 * @param values - the sample, finite numbers.
 * @returns `{ mean, sd }` with sd ≥ 0. Degenerate cases: for an empty sample both are NaN; for a single value
 *   the mean is that value and sd is NaN (a spread needs two values); identical values give sd 0.
 * @throws {StatsInputError} if a value is not finite.
 * @example
 * ```ts
 * // NIST StRD NumAcc1: certified mean 10000002 and standard deviation 1
 * meanAndStandardDeviation([10000001, 10000003, 10000002]); // => { mean: 10000002, sd: 1 }
 * ```
 * @see Chan T.F., Golub G.H., LeVeque R.J. (1983) "Algorithms for computing the sample variance: analysis and
 *   recommendations", The American Statistician 37(3):242–247, doi:10.1080/00031305.1983.10483115, eq. 1.7.
 * @see National Institute of Standards and Technology, Statistical Reference Datasets, Univariate Summary
 *   Statistics, https://www.itl.nist.gov/div898/strd/univ/homepage.html.
 */
export function meanAndStandardDeviation(values: readonly number[]): { mean: number; sd: number } {
  values.forEach((value, index) => {
    if (!Number.isFinite(value)) {
      throw new StatsInputError(`sample has a non-finite value at ${index} (${value})`);
    }
  });
  const count = values.length;
  if (count === 0) return { mean: Number.NaN, sd: Number.NaN };
  const first = values[0] ?? Number.NaN;
  // All ties are detected exactly, so equal values give their own value as mean and an SD of exactly 0.
  if (values.every((value) => value === first)) return { mean: first, sd: count < 2 ? Number.NaN : 0 };
  const mean = values.reduce((sum, value) => sum + value, 0) / count;
  const deviations = values.map((value) => value - mean);
  // Divide by the largest absolute deviation so the sum of squares cannot underflow or overflow.
  const scale = deviations.reduce((maximum, deviation) => Math.max(maximum, Math.abs(deviation)), 0);
  let sumOfSquares = 0;
  let sumOfDeviations = 0;
  for (const deviation of deviations) {
    const scaled = deviation / scale;
    sumOfSquares += scaled * scaled;
    sumOfDeviations += scaled;
  }
  // Corrected two-pass: subtract the rounding error of the mean, (Σ deviations)²/n.
  const scaledVariance = Math.max(0, (sumOfSquares - (sumOfDeviations * sumOfDeviations) / count) / (count - 1));
  return { mean, sd: scale * Math.sqrt(scaledVariance) };
}
