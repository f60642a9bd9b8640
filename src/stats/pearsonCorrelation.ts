import { StatsInputError } from "./StatsInputError.js";

/**
 * Pearson product-moment correlation coefficient of two paired samples.
 *
 * r = Σ(xᵢ − x̄)(yᵢ − ȳ) / √(Σ(xᵢ − x̄)² · Σ(yᵢ − ȳ)²), computed from centred values (two passes) so large offsets
 * such as calendar years do not cost precision, with each sample's deviations divided by their largest absolute
 * value so sums of squares cannot underflow or overflow; the result is clamped to [−1, 1] against rounding.
 *
 * @param x - first sample, finite numbers.
 * @param y - second sample, finite numbers, the same length as x (pairs are (x[i], y[i])).
 * @returns r in [−1, 1]. Degenerate case: NaN when there are fewer than 2 pairs or when either sample has
 *   zero variance (all values tied), because the coefficient is then undefined.
 * @throws {StatsInputError} if the samples differ in length or contain a non-finite value (remove missing
 *   pairs before calling).
 * @example
 * ```ts
 * // Anscombe (1973), data set I: printed correlation coefficient 0.82
 * pearsonCorrelation([10, 8, 13, 9, 11, 14, 6, 4, 12, 7, 5],
 *   [8.04, 6.95, 7.58, 8.81, 8.33, 9.96, 7.24, 4.26, 10.84, 4.82, 5.68]); // => 0.816421
 * ```
 * @see Pearson K. (1895) "Note on regression and inheritance in the case of two parents", Proceedings of the
 *   Royal Society of London 58:240–242, doi:10.1098/rspl.1895.0041.
 * @see Anscombe F.J. (1973) "Graphs in statistical analysis", The American Statistician 27(1):17–21,
 *   doi:10.1080/00031305.1973.10478966.
 */
export function pearsonCorrelation(x: readonly number[], y: readonly number[]): number {
  if (x.length !== y.length) {
    throw new StatsInputError(`samples must have the same length (got ${x.length} and ${y.length})`);
  }
  [x, y].forEach((sample, sampleIndex) =>
    sample.forEach((value, index) => {
      if (!Number.isFinite(value)) {
        throw new StatsInputError(`sample ${sampleIndex === 0 ? "x" : "y"} has a non-finite value at ${index} (${value})`);
      }
    }),
  );
  const pairCount = x.length;
  if (pairCount < 2) return Number.NaN;
  const deviationsX = scaledDeviations(x);
  const deviationsY = scaledDeviations(y);
  if (deviationsX === undefined || deviationsY === undefined) return Number.NaN;
  let crossProducts = 0;
  let squaresX = 0;
  let squaresY = 0;
  for (let index = 0; index < pairCount; index += 1) {
    const deviationX = deviationsX[index] ?? 0;
    const deviationY = deviationsY[index] ?? 0;
    crossProducts += deviationX * deviationY;
    squaresX += deviationX * deviationX;
    squaresY += deviationY * deviationY;
  }
  const correlation = crossProducts / Math.sqrt(squaresX * squaresY);
  return Math.max(-1, Math.min(1, correlation));
}

/**
 * Deviations from the mean divided by the largest absolute deviation, so that squares neither underflow
 * (values near 1e-160) nor overflow (near 1e160); r is unchanged by this rescaling. Undefined when all
 * values are equal.
 */
function scaledDeviations(values: readonly number[]): number[] | undefined {
  // All ties are detected exactly: a rounded mean of equal values could otherwise leave spurious deviations.
  if (values.every((value) => value === values[0])) return undefined;
  const mean = values.reduce((sum, value) => sum + value, 0) / values.length;
  const deviations = values.map((value) => value - mean);
  const largest = deviations.reduce((maximum, deviation) => Math.max(maximum, Math.abs(deviation)), 0);
  return deviations.map((deviation) => deviation / largest);
}
