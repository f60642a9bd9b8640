import { StatsInputError } from "./StatsInputError.js";

/**
 * Area under the relative (receiver) operating characteristic curve (ROC area), Mann–Whitney form, with the
 * Hanley & McNeil standard error: the probability that a randomly chosen event case has a higher score than a
 * randomly chosen non-event case, ties counting one half. 1 = perfect discrimination, 0.5 = none.
 *
 * A = U / (n₁·n₀), where U = Σ over (event, non-event) pairs of [1 if s_event > s_non-event, ½ if equal],
 * computed in O(n log n) from mid-ranks: U = R₁ − n₁(n₁ + 1)/2 with R₁ the rank sum of the n₁ events. This
 * equals the trapezoidal area under the empirical ROC curve ({@link rocCurve}).
 * Standard error (Hanley & McNeil 1982): SE = √{[A(1 − A) + (n₁ − 1)(Q₁ − A²) + (n₀ − 1)(Q₂ − A²)] /
 * (n₁·n₀)}, with Q₁ = A/(2 − A) and Q₂ = 2A²/(1 + A) (the exponential approximation).
 *
 * @param scores - forecast scores or probabilities, larger = event more likely (finite numbers).
 * @param outcomes - what happened, one per score: 1 / true = event, 0 / false = no event.
 * @returns `area` in [0, 1] and its `standardError`; both `NaN` when there are no events or no non-events
 *   (the area is undefined).
 * @throws {@link StatsInputError} when the lengths differ, a score is not finite, or an outcome is not 0, 1,
 *   true or false.
 * @example
 * ```ts
 * // Hanley & McNeil (1982) Table I: 58 normal and 51 abnormal CT images rated 1 … 5.
 * const expand = (counts: number[]) => counts.flatMap((count, index) => Array<number>(count).fill(index + 1));
 * const ratings = [...expand([33, 6, 6, 11, 2]), ...expand([3, 2, 2, 11, 33])];
 * const abnormal = ratings.map((_, index) => (index < 58 ? 0 : 1));
 * rocArea(ratings, abnormal); // => { area: 0.893, standardError: 0.032 }
 * ```
 * @see Hanley J.A., McNeil B.J. (1982) "The meaning and use of the area under a receiver operating
 *   characteristic (ROC) curve", Radiology 143(1):29–36, doi:10.1148/radiology.143.1.7063747.
 * @see Mason S.J., Graham N.E. (2002) "Areas beneath the relative operating characteristics (ROC) and relative
 *   operating levels (ROL) curves: statistical significance and interpretation", Quarterly Journal of the
 *   Royal Meteorological Society 128(584):2145–2166, doi:10.1256/003590002320603584.
 */
export function rocArea(
  scores: readonly number[],
  outcomes: readonly (0 | 1 | boolean)[],
): { area: number; standardError: number } {
  if (scores.length !== outcomes.length) {
    throw new StatsInputError(
      `rocArea: scores and outcomes differ in length (${scores.length} and ${outcomes.length})`,
    );
  }
  const isEvent: boolean[] = [];
  for (let index = 0; index < scores.length; index += 1) {
    const score = scores[index] as number;
    if (!Number.isFinite(score)) {
      throw new StatsInputError(`rocArea: scores must be finite (position ${index}: ${String(score)})`);
    }
    const outcome = outcomes[index];
    if (outcome !== 0 && outcome !== 1 && outcome !== true && outcome !== false) {
      throw new StatsInputError(
        `rocArea: outcomes must be 0, 1, true or false (position ${index}: ${String(outcome)})`,
      );
    }
    isEvent.push(outcome === true || outcome === 1);
  }
  const eventCount = isEvent.filter(Boolean).length;
  const nonEventCount = scores.length - eventCount;
  if (eventCount === 0 || nonEventCount === 0) {
    return { area: Number.NaN, standardError: Number.NaN };
  }

  const order = scores.map((_, index) => index).sort((a, b) => (scores[a] as number) - (scores[b] as number));
  let eventRankSum = 0;
  let groupStart = 0;
  while (groupStart < order.length) {
    const groupScore = scores[order[groupStart] as number] as number;
    let groupEnd = groupStart + 1;
    while (groupEnd < order.length && scores[order[groupEnd] as number] === groupScore) {
      groupEnd += 1;
    }
    // Ranks groupStart + 1 … groupEnd share their mid-rank.
    const midRank = (groupStart + 1 + groupEnd) / 2;
    for (let position = groupStart; position < groupEnd; position += 1) {
      if (isEvent[order[position] as number] === true) {
        eventRankSum += midRank;
      }
    }
    groupStart = groupEnd;
  }
  const mannWhitneyU = eventRankSum - (eventCount * (eventCount + 1)) / 2;
  const area = mannWhitneyU / (eventCount * nonEventCount);

  const q1 = area / (2 - area);
  const q2 = (2 * area * area) / (1 + area);
  const variance =
    (area * (1 - area) + (eventCount - 1) * (q1 - area * area) + (nonEventCount - 1) * (q2 - area * area)) /
    (eventCount * nonEventCount);
  return { area, standardError: Math.sqrt(Math.max(0, variance)) };
}
