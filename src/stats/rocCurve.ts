import { StatsInputError } from "./StatsInputError.js";

/**
 * Empirical relative (receiver) operating characteristic curve (ROC curve): the hit rate against the false
 * alarm rate when an event is forecast whenever the score reaches a threshold, for every threshold.
 *
 * For each distinct score t, from the highest down, "event forecast" means score ≥ t; then
 * hit rate = events with score ≥ t / all events and false alarm rate = non-events with score ≥ t / all
 * non-events. The curve starts at (0, 0) with threshold +∞ (never forecast) and ends at (1, 1) at the lowest
 * score (always forecast); tied scores move the curve diagonally, so the trapezoidal area under it equals
 * {@link rocArea} with ties counting one half.
 *
 * @param scores - forecast scores or probabilities, larger = event more likely (finite numbers).
 * @param outcomes - what happened, one per score: 1 / true = event, 0 / false = no event.
 * @returns the points in order of decreasing threshold, from (0, 0) to (1, 1): one more point than there are
 *   distinct scores. An empty array when there are no events or no non-events (the rates are undefined).
 * @throws {@link StatsInputError} when the lengths differ, a score is not finite, or an outcome is not 0, 1,
 *   true or false.
 * @example
 * ```ts
 * rocCurve([0.9, 0.6, 0.6, 0.2], [1, 1, 0, 0]);
 * // => [{ threshold: Infinity, hitRate: 0, falseAlarmRate: 0 }, { threshold: 0.9, hitRate: 0.5, falseAlarmRate: 0 },
 * //     { threshold: 0.6, hitRate: 1, falseAlarmRate: 0.5 }, { threshold: 0.2, hitRate: 1, falseAlarmRate: 1 }]
 * ```
 * @see Mason I. (1982) "A model for assessment of weather forecasts", Australian Meteorological Magazine
 *   30:291–303 (the ROC in forecast verification).
 * @see Hanley J.A., McNeil B.J. (1982) "The meaning and use of the area under a receiver operating
 *   characteristic (ROC) curve", Radiology 143(1):29–36, doi:10.1148/radiology.143.1.7063747.
 */
export function rocCurve(
  scores: readonly number[],
  outcomes: readonly (0 | 1 | boolean)[],
): { threshold: number; hitRate: number; falseAlarmRate: number }[] {
  if (scores.length !== outcomes.length) {
    throw new StatsInputError(
      `rocCurve: scores and outcomes differ in length (${scores.length} and ${outcomes.length})`,
    );
  }
  const cases: { score: number; isEvent: boolean }[] = [];
  for (let index = 0; index < scores.length; index += 1) {
    const score = scores[index] as number;
    if (!Number.isFinite(score)) {
      throw new StatsInputError(`rocCurve: scores must be finite (position ${index}: ${String(score)})`);
    }
    const outcome = outcomes[index];
    if (outcome !== 0 && outcome !== 1 && outcome !== true && outcome !== false) {
      throw new StatsInputError(
        `rocCurve: outcomes must be 0, 1, true or false (position ${index}: ${String(outcome)})`,
      );
    }
    cases.push({ score, isEvent: outcome === true || outcome === 1 });
  }
  const eventCount = cases.filter((item) => item.isEvent).length;
  const nonEventCount = cases.length - eventCount;
  if (eventCount === 0 || nonEventCount === 0) {
    return [];
  }
  cases.sort((a, b) => b.score - a.score);
  const points = [{ threshold: Number.POSITIVE_INFINITY, hitRate: 0, falseAlarmRate: 0 }];
  let hits = 0;
  let falseAlarms = 0;
  let position = 0;
  while (position < cases.length) {
    const threshold = (cases[position] as { score: number }).score;
    while (position < cases.length && (cases[position] as { score: number }).score === threshold) {
      if ((cases[position] as { isEvent: boolean }).isEvent) {
        hits += 1;
      } else {
        falseAlarms += 1;
      }
      position += 1;
    }
    points.push({ threshold, hitRate: hits / eventCount, falseAlarmRate: falseAlarms / nonEventCount });
  }
  return points;
}
