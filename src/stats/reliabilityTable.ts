import { StatsInputError } from "./StatsInputError.js";

/** Default bin edges 0, 0.1, …, 1, written as i/10 so that 0.3 is exactly the literal 0.3. */
const TENTHS: readonly number[] = Array.from({ length: 11 }, (_, index) => index / 10);

/**
 * Reliability table (the data of a reliability or attributes diagram): forecasts grouped into probability
 * bins, with the mean forecast probability and the observed event frequency in each bin. A reliable forecast
 * has observed frequency ≈ mean forecast in every bin.
 *
 * Bin b covers [edge_b, edge_b₊₁), the last bin [edge_last−1, edge_last] closed on the right. For each bin:
 * count = number of forecasts in it, meanForecast = their mean probability, observedFrequency = share of them
 * followed by the event. The counts are the bin's sharpness histogram.
 *
 * @param probabilities - forecast probabilities, each in [0, 1] and within the outer bin edges.
 * @param outcomes - what happened, one per forecast: 1 / true = event, 0 / false = no event.
 * @param binEdges - strictly increasing bin edges in [0, 1], at least two (default 0, 0.1, …, 1: ten bins).
 * @returns one row per bin, in order; `meanForecast` and `observedFrequency` are `null` for an empty bin.
 *   Empty input gives all bins with count 0.
 * @throws {@link StatsInputError} when the lengths differ, a probability is outside [0, 1] or outside the
 *   edges, an outcome is not 0, 1, true or false, or the edges are fewer than two, not strictly increasing, or
 *   outside [0, 1].
 * @example
 * ```ts
 * reliabilityTable([0.1, 0.1, 0.7, 0.8], [0, 1, 1, 1], [0, 0.5, 1]);
 * // => [{ lower: 0, upper: 0.5, count: 2, meanForecast: 0.1, observedFrequency: 0.5 },
 * //     { lower: 0.5, upper: 1, count: 2, meanForecast: 0.75, observedFrequency: 1 }]
 * ```
 * @see Murphy A.H., Winkler R.L. (1977) "Reliability of subjective probability forecasts of precipitation
 *   and temperature", Journal of the Royal Statistical Society C (Applied Statistics) 26(1):41–47.
 * @see Hsu W., Murphy A.H. (1986) "The attributes diagram: a geometrical framework for assessing the quality
 *   of probability forecasts", International Journal of Forecasting 2(3):285–293.
 */
export function reliabilityTable(
  probabilities: readonly number[],
  outcomes: readonly (0 | 1 | boolean)[],
  binEdges: readonly number[] = TENTHS,
): {
  lower: number;
  upper: number;
  count: number;
  meanForecast: number | null;
  observedFrequency: number | null;
}[] {
  if (probabilities.length !== outcomes.length) {
    throw new StatsInputError(
      `reliabilityTable: probabilities and outcomes differ in length (${probabilities.length} and ${outcomes.length})`,
    );
  }
  if (binEdges.length < 2) {
    throw new StatsInputError(`reliabilityTable: at least two bin edges are needed (got ${binEdges.length})`);
  }
  for (let index = 0; index < binEdges.length; index += 1) {
    const edge = binEdges[index] as number;
    if (!(edge >= 0 && edge <= 1) || (index > 0 && edge <= (binEdges[index - 1] as number))) {
      throw new StatsInputError(
        `reliabilityTable: bin edges must be strictly increasing values in [0, 1] (position ${index}: ${String(edge)})`,
      );
    }
  }
  const binCount = binEdges.length - 1;
  const counts = new Array<number>(binCount).fill(0);
  const forecastSums = new Array<number>(binCount).fill(0);
  const eventCounts = new Array<number>(binCount).fill(0);
  const lowestEdge = binEdges[0] as number;
  const highestEdge = binEdges[binCount] as number;
  for (let index = 0; index < probabilities.length; index += 1) {
    const probability = probabilities[index] as number;
    if (!(probability >= 0 && probability <= 1)) {
      throw new StatsInputError(
        `reliabilityTable: probabilities must be in [0, 1] (position ${index}: ${String(probability)})`,
      );
    }
    if (probability < lowestEdge || probability > highestEdge) {
      throw new StatsInputError(
        `reliabilityTable: probability ${probability} (position ${index}) is outside the bin edges ` +
          `${lowestEdge}…${highestEdge}`,
      );
    }
    const outcome = outcomes[index];
    if (outcome !== 0 && outcome !== 1 && outcome !== true && outcome !== false) {
      throw new StatsInputError(
        `reliabilityTable: outcomes must be 0, 1, true or false (position ${index}: ${String(outcome)})`,
      );
    }
    // The last bin whose lower edge is ≤ p; p equal to the top edge falls in the last bin.
    let bin = binCount - 1;
    while (bin > 0 && probability < (binEdges[bin] as number)) {
      bin -= 1;
    }
    counts[bin] = (counts[bin] as number) + 1;
    forecastSums[bin] = (forecastSums[bin] as number) + probability;
    if (outcome === true || outcome === 1) {
      eventCounts[bin] = (eventCounts[bin] as number) + 1;
    }
  }
  return counts.map((count, bin) => ({
    lower: binEdges[bin] as number,
    upper: binEdges[bin + 1] as number,
    count,
    meanForecast: count > 0 ? (forecastSums[bin] as number) / count : null,
    observedFrequency: count > 0 ? (eventCounts[bin] as number) / count : null,
  }));
}
