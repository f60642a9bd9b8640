import { quantileSorted } from "../stats/quantileSorted.js";
import type { ActivityCategories, ActivityCategory } from "./types.js";

export const TERCILE_QUANTILE_RULE = "Hyndman & Fan (1996) type 7 sample quantiles at 1/3 and 2/3";
export const TERCILE_TIE_RULE =
  "below normal: activity at or below the lower tercile; above normal: activity above the upper tercile; near normal: the rest. " +
  "Equal activity always falls in one category, so with many zero-fire years the realised shares differ from one third.";

/**
 * Below / near / above normal fire-activity categories by terciles of the calibration period.
 *
 * The cuts are the type-7 sample quantiles (Hyndman R.J., Fan Y. 1996, "Sample quantiles in
 * statistical packages", The American Statistician 50:361–365) at 1/3 and 2/3 of the activity of
 * `years`. A year is below normal when its activity ≤ the lower cut, above normal when > the upper
 * cut, and near normal otherwise. Years of equal activity always share a category, so every year
 * is in exactly one category; when a third or more of the years had no fire, the lower cut is 0 and
 * every zero year is below normal (realised shares reported, not forced to one third).
 *
 * @param activity - activity per year
 * @param years - the years whose terciles define the categories
 * @param classify - further years to classify with the same cuts (e.g. a held-out year)
 * @returns the cuts, the category of every year in `years` and `classify`, and the realised shares over `years`
 */
export function activityCategories(
  activity: ReadonlyMap<number, number>,
  years: readonly number[],
  classify: readonly number[] = [],
): ActivityCategories {
  const sorted = Array.from(Float64Array.from(years, (year) => activity.get(year) ?? NaN).sort());
  const lowerCut = quantileSorted(sorted, 1 / 3);
  const upperCut = quantileSorted(sorted, 2 / 3);
  const byYear = new Map<number, ActivityCategory>();
  const counts = { below: 0, near: 0, above: 0 };
  for (const year of years) {
    const category = categoryOf(activity.get(year) ?? NaN, lowerCut, upperCut);
    byYear.set(year, category);
    counts[category] += 1;
  }
  for (const year of classify) byYear.set(year, categoryOf(activity.get(year) ?? NaN, lowerCut, upperCut));
  const n = years.length;
  return {
    lowerCut,
    upperCut,
    quantileRule: TERCILE_QUANTILE_RULE,
    tieRule: TERCILE_TIE_RULE,
    byYear,
    realisedShares: {
      below: n === 0 ? NaN : counts.below / n,
      near: n === 0 ? NaN : counts.near / n,
      above: n === 0 ? NaN : counts.above / n,
    },
  };
}

/** The category of one activity value given the tercile cuts (see {@link activityCategories}). */
export function categoryOf(value: number, lowerCut: number, upperCut: number): ActivityCategory {
  if (value <= lowerCut) return "below";
  if (value > upperCut) return "above";
  return "near";
}
