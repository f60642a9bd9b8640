import { StatsInputError } from "./StatsInputError.js";

/**
 * Scores of a 2×2 forecast contingency table (yes/no forecasts of a yes/no event), named as in the forecast
 * verification literature.
 *
 * With H = hits, M = misses, F = false alarms, C = correct negatives and N = H + M + F + C:
 * - hitRate (probability of detection, POD) = H/(H + M);
 * - falseAlarmRatio (FAR, share of "yes" forecasts that were wrong) = F/(H + F);
 * - falseAlarmRate (probability of false detection, POFD, share of non-events forecast "yes") = F/(F + C);
 *   not to be confused with the false alarm ratio;
 * - threatScore (critical success index) = H/(H + M + F);
 * - bias (frequency bias) = (H + F)/(H + M);
 * - percentCorrect (proportion correct, a fraction 0 … 1 despite the name) = (H + C)/N;
 * - heidkeSkillScore = 2(H·C − M·F)/[(H + M)(M + C) + (H + F)(F + C)], proportion correct relative to chance;
 * - peirceSkillScore (Hanssen–Kuipers discriminant, true skill statistic) = hitRate − falseAlarmRate
 *   = (H·C − F·M)/[(H + M)(F + C)];
 * - equitableThreatScore (Gilbert skill score) = (H − H_random)/(H + M + F − H_random), where
 *   H_random = (H + M)(H + F)/N.
 *
 * @param table - the four counts, each a non-negative integer.
 * @returns the nine scores. A score whose denominator is 0 is `NaN` (for example hitRate when no event
 *   occurred, falseAlarmRatio when "yes" was never forecast, every score of an empty table).
 * @throws {@link StatsInputError} when a count is not a non-negative integer.
 * @example
 * ```ts
 * // Finley's tornado forecasts (1884): H = 28, F = 72, M = 23, C = 2680.
 * const scores = contingencyTableScores({ hits: 28, misses: 23, falseAlarms: 72, correctNegatives: 2680 });
 * scores.percentCorrect; // => 0.966
 * scores.threatScore; // => 0.228
 * scores.peirceSkillScore; // => 0.5229
 * ```
 * @see Finley J.P. (1884) "Tornado predictions", American Meteorological Journal 1:85–88; Murphy A.H. (1996)
 *   "The Finley affair: a signal event in the history of forecast verification", Weather and Forecasting
 *   11(1):3–20.
 * @see Heidke P. (1926) "Berechnung des Erfolges und der Güte der Windstärkevorhersagen im
 *   Sturmwarnungsdienst", Geografiska Annaler 8:301–349; Peirce C.S. (1884) "The numerical measure of the
 *   success of predictions", Science 4(93):453–454; Gilbert G.K. (1884) "Finley's tornado predictions",
 *   American Meteorological Journal 1:166–172.
 * @see Jolliffe I.T., Stephenson D.B. (eds.) (2012) Forecast Verification: A Practitioner's Guide in
 *   Atmospheric Science, 2nd ed., Wiley, chapter 3.
 */
export function contingencyTableScores(table: {
  hits: number;
  misses: number;
  falseAlarms: number;
  correctNegatives: number;
}): {
  hitRate: number;
  falseAlarmRatio: number;
  falseAlarmRate: number;
  threatScore: number;
  bias: number;
  percentCorrect: number;
  heidkeSkillScore: number;
  peirceSkillScore: number;
  equitableThreatScore: number;
} {
  const { hits, misses, falseAlarms, correctNegatives } = table;
  for (const [name, count] of Object.entries({ hits, misses, falseAlarms, correctNegatives })) {
    if (!Number.isSafeInteger(count) || count < 0) {
      throw new StatsInputError(
        `contingencyTableScores: ${name} must be a non-negative integer (got ${String(count)})`,
      );
    }
  }
  const ratio = (numerator: number, denominator: number): number =>
    denominator === 0 ? Number.NaN : numerator / denominator;
  const total = hits + misses + falseAlarms + correctNegatives;
  const observedYes = hits + misses;
  const observedNo = falseAlarms + correctNegatives;
  const forecastYes = hits + falseAlarms;
  const forecastNo = misses + correctNegatives;
  const crossDifference = hits * correctNegatives - misses * falseAlarms;
  const randomHits = total === 0 ? Number.NaN : (observedYes * forecastYes) / total;
  return {
    hitRate: ratio(hits, observedYes),
    falseAlarmRatio: ratio(falseAlarms, forecastYes),
    falseAlarmRate: ratio(falseAlarms, observedNo),
    threatScore: ratio(hits, hits + misses + falseAlarms),
    bias: ratio(forecastYes, observedYes),
    percentCorrect: ratio(hits + correctNegatives, total),
    heidkeSkillScore: ratio(2 * crossDifference, observedYes * forecastNo + forecastYes * observedNo),
    peirceSkillScore: ratio(crossDifference, observedYes * observedNo),
    equitableThreatScore: ratio(hits - randomHits, hits + misses + falseAlarms - randomHits),
  };
}
