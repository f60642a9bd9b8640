import type { FireYearSelection } from "./types.js";

/**
 * Fire years: the years of highest fire activity, the top `top` share of the calibration years.
 *
 * Rule (README, "calibrate"; common practice in fire-history compositing): rank the N calibration years by
 * activity; the threshold is the activity of the ceil(top × N)-th highest year; every year with
 * activity ≥ threshold and activity > 0 is a fire year. Ties at the threshold are all in, so the
 * realised share can exceed `top`; it is reported beside the selection.
 *
 * @param activity - activity per year (fraction of recording sites burned, or sites burned)
 * @param years - the calibration years to rank (each must have an entry in `activity`)
 * @param top - share of years to call fire years, 0 < top < 1
 * @param measure - which activity measure the numbers are, recorded in the result
 * @returns the threshold (null when no year has activity > 0 or there are no years) and the fire years, ascending
 * @example
 * selectFireYears(new Map([[1, 0], [2, 0.5], [3, 0.2], [4, 0.5]]), [1, 2, 3, 4], 0.25, "fraction")
 * // => threshold 0.5, years [2, 4] (tie at the threshold: realised share 0.5)
 */
export function selectFireYears(
  activity: ReadonlyMap<number, number>,
  years: readonly number[],
  top: number,
  measure: "fraction" | "sites",
): FireYearSelection {
  const ranked = Float64Array.from(years, (year) => activityOf(activity, year))
    .sort()
    .reverse();
  const n = ranked.length;
  // top × n in floating point can land just above a whole number (0.07 × 100 = 7.000000000000001);
  // a tolerance keeps ceil() from skipping to the next rank.
  const rank = Math.max(1, Math.ceil(top * n - 1e-9));
  const atRank = n === 0 ? undefined : ranked[Math.min(rank, n) - 1];
  const anyPositive = ranked.length > 0 && (ranked[0] ?? 0) > 0;
  let threshold: number | null = null;
  if (atRank !== undefined && anyPositive) {
    // A zero threshold would make every zero-fire year a fire year; the rule keeps only years > 0.
    threshold = atRank > 0 ? atRank : smallestPositive(ranked);
  }
  const chosen =
    threshold === null ? [] : years.filter((year) => activityOf(activity, year) >= (threshold as number) && activityOf(activity, year) > 0);
  const sorted = [...chosen].sort((a, b) => a - b);
  return {
    top,
    measure,
    threshold,
    years: sorted,
    realisedShare: n === 0 ? 0 : sorted.length / n,
    calibrationYears: n,
  };
}

function activityOf(activity: ReadonlyMap<number, number>, year: number): number {
  const value = activity.get(year);
  if (value === undefined) throw new RangeError(`no activity for year ${year}`);
  return value;
}

function smallestPositive(sortedDescending: Float64Array): number {
  let smallest = Infinity;
  for (const value of sortedDescending) if (value > 0 && value < smallest) smallest = value;
  return smallest;
}
