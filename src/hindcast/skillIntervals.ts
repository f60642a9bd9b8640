import type { RandomSource } from "../stats/createRandom.js";
import { movingBlockBootstrapIndices } from "../stats/movingBlockBootstrap.js";
import { quantileSorted } from "../stats/quantileSorted.js";
import type { SkillIntervals } from "./types.js";

/** Coverage of the skill-score intervals. */
export const INTERVAL_LEVEL = 0.95;

/** How the intervals are made, in words (stated in the JSON). */
export const INTERVAL_METHOD =
  "moving-block bootstrap (Künsch 1989) of the hindcast years: blocks of consecutive years (forecast, reference and outcome kept together) " +
  "drawn with replacement, each score recomputed per resample; 95% percentile interval (type-7 quantiles at 2.5% and 97.5%) over the resamples where the score is defined";

/** One hindcast year as the bootstrap sees it: forecast and reference, for the event and the categories. */
export interface ScoredYear {
  readonly probability: number;
  readonly reference: number;
  readonly fireYear: boolean;
  /** Ranked probability score of the forecast and of the reference this year (NaN when not scored). */
  readonly rps: number;
  readonly rpsReference: number;
}

/**
 * Moving-block bootstrap intervals of the Brier skill score, the ranked probability skill score and the ROC
 * area of a hindcast: the years (in time order) are resampled in blocks of `blockYears` consecutive years
 * (Künsch 1989), which keeps the year-to-year dependence of forecasts and outcomes that an independent
 * bootstrap or the Hanley–McNeil standard error ignores; each score is recomputed on every resample
 * (BSS = 1 − ΣBS/ΣBS_reference, RPSS = 1 − ΣRPS/ΣRPS_reference, ROC area by Mann–Whitney), and the 95%
 * percentile interval is read from the resamples where the score is defined (a resample without a high-fire
 * year has no ROC area or BSS).
 *
 * @param years - the hindcast years in time order.
 * @param blockYears - block length in years (≥ 1; shortened to the number of years when longer).
 * @param resamples - number of bootstrap resamples (≥ 1).
 * @param random - the seeded random source.
 * @param scoreCategories - false when the forecasts have no category odds of their own (RPSS interval null).
 * @returns the intervals; an interval is null when fewer than half the resamples define the score, or when
 *   there are fewer than 2 years.
 * @see Künsch H.R. (1989) "The jackknife and the bootstrap for general stationary observations", Annals of
 *   Statistics 17(3):1217–1241.
 * @see Efron B., Tibshirani R.J. (1993) An Introduction to the Bootstrap, Chapman & Hall, ch. 13 (percentile intervals).
 */
export function skillIntervals(
  years: readonly ScoredYear[],
  blockYears: number,
  resamples: number,
  random: RandomSource,
  scoreCategories = true,
): SkillIntervals {
  const n = years.length;
  const blockLength = Math.max(1, Math.min(blockYears, n));
  const base = { method: INTERVAL_METHOD, resamples, blockYears: blockLength, level: INTERVAL_LEVEL };
  if (n < 2) return { ...base, brierSkillScore: null, rpss: null, rocArea: null, reason: `only ${n} hindcast year${n === 1 ? "" : "s"}` };
  const squaredError = Float64Array.from(years, (year) => (year.probability - (year.fireYear ? 1 : 0)) ** 2);
  const squaredErrorReference = Float64Array.from(years, (year) => (year.reference - (year.fireYear ? 1 : 0)) ** 2);
  const bss: number[] = [];
  const rpss: number[] = [];
  const roc: number[] = [];
  // ROC area of a resample by Mann–Whitney over the distinct forecast values (ties count one half), from
  // counts per value: 2U = Σ_v E_v·(2·N_below(v) + N_v), all in integers, so area = 2U / (2·E·N) is the same
  // number rocArea's mid-rank sum gives, without sorting each resample.
  const distinct = [...new Set(years.map((year) => year.probability))].sort((a, b) => a - b);
  const bucketOf = new Map(distinct.map((value, k) => [value, k]));
  const bucket = Int32Array.from(years, (year) => bucketOf.get(year.probability) as number);
  const eventsAt = new Int32Array(distinct.length);
  const othersAt = new Int32Array(distinct.length);
  for (let resample = 0; resample < resamples; resample += 1) {
    const positions = movingBlockBootstrapIndices(n, blockLength, random);
    let bs = 0;
    let bsReference = 0;
    let rps = 0;
    let rpsReference = 0;
    let events = 0;
    for (let i = 0; i < n; i += 1) {
      const position = positions[i] as number;
      const year = years[position] as ScoredYear;
      bs += squaredError[position] as number;
      bsReference += squaredErrorReference[position] as number;
      rps += year.rps;
      rpsReference += year.rpsReference;
      const k = bucket[position] as number;
      if (year.fireYear) {
        events += 1;
        eventsAt[k] = (eventsAt[k] as number) + 1;
      } else {
        othersAt[k] = (othersAt[k] as number) + 1;
      }
    }
    if (bsReference > 0) bss.push(1 - bs / bsReference);
    if (scoreCategories && rpsReference > 0) rpss.push(1 - rps / rpsReference);
    if (events > 0 && events < n) {
      let twiceU = 0;
      let below = 0;
      for (let k = 0; k < distinct.length; k += 1) {
        twiceU += (eventsAt[k] as number) * (2 * below + (othersAt[k] as number));
        below += othersAt[k] as number;
      }
      roc.push(twiceU / (2 * events * (n - events)));
    }
    eventsAt.fill(0);
    othersAt.fill(0);
  }
  const interval = (values: number[]): readonly [number, number] | null => {
    const finite = values.filter(Number.isFinite).sort((a, b) => a - b);
    if (finite.length === 0 || finite.length < resamples / 2) return null;
    return [quantileSorted(finite, (1 - INTERVAL_LEVEL) / 2), quantileSorted(finite, 1 - (1 - INTERVAL_LEVEL) / 2)];
  };
  const result = { ...base, brierSkillScore: interval(bss), rpss: scoreCategories ? interval(rpss) : null, rocArea: interval(roc) };
  const missing = [
    result.brierSkillScore === null ? "BSS" : null,
    scoreCategories && result.rpss === null ? "RPSS" : null,
    result.rocArea === null ? "ROC area" : null,
  ].filter((name) => name !== null);
  return missing.length === 0 ? result : { ...result, reason: `not enough data: fewer than half the resamples define the ${missing.join(", ")}` };
}
