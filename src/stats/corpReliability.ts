import type { RandomSource } from "./createRandom.js";
import { pavScratch, poolAdjacentViolators, poolAdjacentViolatorsInto } from "./isotonicRegression.js";
import { quantileSorted } from "./quantileSorted.js";
import { StatsInputError } from "./StatsInputError.js";

/** CORP reliability diagram and CORP decomposition of the Brier score (see {@link corpReliability}). */
export interface CorpReliability {
  /** The CORP recalibration curve: one point per distinct forecast value, ascending. */
  readonly points: readonly { readonly forecast: number; readonly calibrated: number; readonly count: number }[];
  /**
   * Consistency band around the diagonal at each distinct forecast value (same order as `points`): where the
   * recalibrated value would fall, with probability `level`, if the forecasts were calibrated. Empty when
   * `resamples` is 0.
   */
  readonly band: readonly { readonly forecast: number; readonly lower: number; readonly upper: number }[];
  /** Coverage of the consistency band, in (0, 1). */
  readonly level: number;
  /** Number of resamples under calibration behind the band. */
  readonly resamples: number;
  /** Brier score of the original forecasts. */
  readonly brierScore: number;
  /** MCB = BS(original) − BS(recalibrated), ≥ 0 up to rounding. */
  readonly miscalibration: number;
  /** DSC = BS(climatology) − BS(recalibrated), ≥ 0 up to rounding. */
  readonly discrimination: number;
  /** UNC = BS(climatology) = ō(1 − ō), ō the mean outcome. */
  readonly uncertainty: number;
}

/** Default number of resamples under calibration (the R package reliabilitydiag uses 100; we take more). */
const DEFAULT_RESAMPLES = 1000;
/** Default band level, 90%: the default of Dimitriadis, Gneiting & Jordan (2021) and of reliabilitydiag. */
const DEFAULT_LEVEL = 0.9;
/** Upper bound on resamples, to keep a mistaken setting from running for hours. */
const MAX_RESAMPLES = 1_000_000;

/**
 * CORP reliability (consistent, optimally binned, reproducible reliability diagram via the
 * pool-adjacent-violators algorithm): the isotonic recalibration curve of probability forecasts of a yes/no
 * event, its consistency band under the hypothesis of calibration, and the CORP decomposition of the Brier
 * score into miscalibration, discrimination and uncertainty.
 *
 * The recalibrated forecast of each case is the isotonic (PAV) regression of the outcomes on the forecasts,
 * cases with equal forecasts pooled; it replaces the bins of a classical reliability diagram. With ō the
 * mean outcome: MCB = BS(forecasts) − BS(recalibrated), DSC = BS(ō for every case) − BS(recalibrated),
 * UNC = BS(ō for every case) = ō(1 − ō), and BS = MCB − DSC + UNC. The consistency band: `resamples` times,
 * draw each outcome afresh as a yes with probability equal to its forecast (so the forecasts are calibrated
 * by construction), refit PAV, and take at each distinct forecast value the (1 − level)/2 and (1 + level)/2
 * quantiles (Hyndman & Fan type 7) of the refitted values. A recalibration curve outside the band is
 * evidence of miscalibration there.
 *
 * @param probabilities - forecast probabilities of the event, each in [0, 1]; at least one.
 * @param outcomes - what happened, one per forecast (true = event).
 * @param random - the seeded random source for the resamples under calibration (consumed only when
 *   `resamples` > 0: one `nextFloat` per case and resample).
 * @param options - `resamples` (integer 0 … 1 000 000, default 1000; 0 gives an empty band) and `level`
 *   (band coverage, in (0, 1), default 0.90, the paper's default).
 * @returns the curve, band and decomposition. With all outcomes equal, UNC = DSC = 0 and the curve is flat
 *   at that outcome; with all forecasts equal there is one point and DSC = 0.
 * @throws {@link StatsInputError} when the input is empty, the lengths differ, a probability is outside
 *   [0, 1] or NaN, an outcome is not boolean, `resamples` is not an integer in 0 … 1 000 000, or `level` is
 *   not in (0, 1).
 * @example
 * ```ts
 * const corp = corpReliability([0.1, 0.3, 0.3, 0.8], [false, true, false, true], createRandom(1));
 * corp.points; // => [{ forecast: 0.1, calibrated: 0, count: 1 }, { forecast: 0.3, calibrated: 0.5, count: 2 },
 *              //     { forecast: 0.8, calibrated: 1, count: 1 }]
 * corp.brierScore; // => 0.1575 = MCB 0.0325 − DSC 0.125 + UNC 0.25
 * ```
 * @see Dimitriadis T., Gneiting T., Jordan A.I. (2021) "Stable reliability diagrams for probabilistic
 *   classifiers", Proceedings of the National Academy of Sciences 118(8):e2016191118,
 *   doi:10.1073/pnas.2016191118 (CORP curve, decomposition, consistency bands by resampling).
 * @see Bröcker J., Smith L.A. (2007) "Increasing the reliability of reliability diagrams", Weather and
 *   Forecasting 22(3):651–661 (consistency resampling).
 * @see Ayer M., Brunk H.D., Ewing G.M., Reid W.T., Silverman E. (1955) "An empirical distribution function
 *   for sampling with incomplete information", Annals of Mathematical Statistics 26(4):641–647 (PAV).
 */
export function corpReliability(
  probabilities: readonly number[],
  outcomes: readonly boolean[],
  random: RandomSource,
  options?: { readonly resamples?: number; readonly level?: number },
): CorpReliability {
  const resamples = options?.resamples ?? DEFAULT_RESAMPLES;
  const level = options?.level ?? DEFAULT_LEVEL;
  if (probabilities.length !== outcomes.length) {
    throw new StatsInputError(
      `corpReliability: probabilities and outcomes differ in length (${probabilities.length} and ${outcomes.length})`,
    );
  }
  if (probabilities.length === 0) {
    throw new StatsInputError("corpReliability: at least one forecast is needed (got none)");
  }
  if (!Number.isSafeInteger(resamples) || resamples < 0 || resamples > MAX_RESAMPLES) {
    throw new StatsInputError(
      `corpReliability: resamples must be an integer in 0 … ${MAX_RESAMPLES} (got ${String(resamples)})`,
    );
  }
  if (!(level > 0 && level < 1)) {
    throw new StatsInputError(`corpReliability: level must be in (0, 1) (got ${String(level)})`);
  }
  for (let index = 0; index < probabilities.length; index += 1) {
    const probability = probabilities[index] as number;
    if (!(probability >= 0 && probability <= 1)) {
      throw new StatsInputError(
        `corpReliability: probabilities must be in [0, 1] (position ${index}: ${String(probability)})`,
      );
    }
    if (typeof outcomes[index] !== "boolean") {
      throw new StatsInputError(
        `corpReliability: outcomes must be true or false (position ${index}: ${String(outcomes[index])})`,
      );
    }
  }

  // Distinct forecast values ascending, with case count and event count (equal forecasts pooled first).
  const order = probabilities
    .map((_, index) => index)
    .sort((a, b) => (probabilities[a] as number) - (probabilities[b] as number) || a - b);
  const forecasts: number[] = [];
  const counts: number[] = [];
  const events: number[] = [];
  for (const index of order) {
    const probability = probabilities[index] as number;
    const last = forecasts.length - 1;
    if (last >= 0 && forecasts[last] === probability) {
      counts[last] = (counts[last] as number) + 1;
      events[last] = (events[last] as number) + (outcomes[index] ? 1 : 0);
    } else {
      forecasts.push(probability);
      counts.push(1);
      events.push(outcomes[index] ? 1 : 0);
    }
  }
  const groups = forecasts.length;
  const total = probabilities.length;
  const calibrated = poolAdjacentViolators(
    events.map((eventCount, group) => eventCount / (counts[group] as number)),
    counts,
  );

  // Brier scores, summed per group: Σ over a group of (f − o)² = e(1 − f)² + (c − e)f² for c cases, e events.
  let originalSum = 0;
  let recalibratedSum = 0;
  let eventTotal = 0;
  for (let group = 0; group < groups; group += 1) {
    const count = counts[group] as number;
    const eventCount = events[group] as number;
    const forecast = forecasts[group] as number;
    const recalibrated = calibrated[group] as number;
    originalSum += eventCount * (1 - forecast) ** 2 + (count - eventCount) * forecast ** 2;
    recalibratedSum += eventCount * (1 - recalibrated) ** 2 + (count - eventCount) * recalibrated ** 2;
    eventTotal += eventCount;
  }
  const climatology = eventTotal / total;
  const brierScore = originalSum / total;
  const recalibratedScore = recalibratedSum / total;
  const uncertainty = climatology * (1 - climatology);

  // Consistency band: outcomes redrawn under calibration, PAV refitted, quantiles per distinct forecast.
  const band: { forecast: number; lower: number; upper: number }[] = [];
  if (resamples > 0) {
    // refitted[group · resamples + resample]: one row per distinct forecast, sorted in place at the end.
    const refitted = new Float64Array(groups * resamples);
    const means = new Float64Array(groups);
    const scratch = pavScratch(groups);
    for (let resample = 0; resample < resamples; resample += 1) {
      for (let group = 0; group < groups; group += 1) {
        const forecast = forecasts[group] as number;
        const count = counts[group] as number;
        let drawn = 0;
        for (let member = 0; member < count; member += 1) {
          if (random.nextFloat() < forecast) {
            drawn += 1;
          }
        }
        means[group] = drawn / count;
      }
      poolAdjacentViolatorsInto(means, counts, groups, refitted, resample, resamples, scratch);
    }
    for (let group = 0; group < groups; group += 1) {
      // Fitted values are ≥ 0 and never −0, so the typed (numeric) sort orders them as (a, b) => a − b does.
      const sorted = refitted.subarray(group * resamples, (group + 1) * resamples).sort() as unknown as readonly number[];
      band.push({
        forecast: forecasts[group] as number,
        lower: quantileSorted(sorted, (1 - level) / 2),
        upper: quantileSorted(sorted, (1 + level) / 2),
      });
    }
  }

  return {
    points: forecasts.map((forecast, group) => ({
      forecast,
      calibrated: calibrated[group] as number,
      count: counts[group] as number,
    })),
    band,
    level,
    resamples,
    brierScore,
    miscalibration: brierScore - recalibratedScore,
    discrimination: uncertainty - recalibratedScore,
    uncertainty,
  };
}
