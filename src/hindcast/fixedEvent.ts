import { activityCategories } from "../record/activityCategories.js";
import { selectFireYears } from "../record/selectFireYears.js";

/** Category number of an activity category: below 0, near 1, above 2. */
export const CATEGORY_NUMBER = { below: 0, near: 1, above: 2 } as const;

/**
 * The event a hindcast verifies, defined once from the whole calibration period (a climatology): which years
 * are high-fire years and which activity tercile each year falls in.
 */
export interface FixedEvent {
  /** Activity at or above which a year (with activity > 0) is a high-fire year; null when no year had fire. */
  readonly threshold: number | null;
  /** Upper bound (inclusive) of "below normal" and the bound above which a year is "above normal". */
  readonly lowerCut: number;
  readonly upperCut: number;
  /** 1 for a high-fire year, 0 otherwise, per position of `years`. */
  readonly fire: Uint8Array;
  /** Category 0 (below), 1 (near) or 2 (above) per position of `years`. */
  readonly category: Uint8Array;
  /** Share of high-fire years over the whole period: the climatological (reference) forecast. */
  readonly baseRate: number;
  /** Shares of below, near and above normal over the whole period: the reference category forecast. */
  readonly shares: readonly [number, number, number];
}

/**
 * Fixed event definition of a hindcast: the high-fire-year threshold (top share of the years by activity,
 * ties all in, see selectFireYears) and the activity terciles (see activityCategories) computed once from
 * every year of `years`, not refitted in each fold. Refitting them without the held-out year lets the
 * definition itself move with the outcome that is being forecast (when the held-out year sits at a tied
 * threshold, leaving it out shifts the threshold and the left-in base rate), which is the cross-validation
 * degeneracy of Barnston & van den Dool (1993). A permutation of the activity across years leaves both
 * definitions unchanged (they depend only on the multiset of activity values), so under the permutation test
 * the outcomes simply move with the years.
 *
 * @param years - the calibration years, ascending; each must have an entry in `activity`.
 * @param activity - fire activity per year.
 * @param top - share of years that are high-fire years, 0 < top < 1.
 * @param measure - which activity measure the numbers are (recorded by selectFireYears).
 * @returns the threshold, cuts, outcome per position and the climatological shares; with no years the
 *   rates are NaN.
 * @see Barnston A.G., van den Dool H.M. (1993) "A degeneracy in cross-validated skill in regression-based
 *   forecasts", Journal of Climate 6(5):963–977.
 */
export function fixedEvent(
  years: readonly number[],
  activity: ReadonlyMap<number, number>,
  top: number,
  measure: "fraction" | "sites",
): FixedEvent {
  const selection = selectFireYears(activity, years, top, measure);
  const categories = activityCategories(activity, years);
  const fireSet = new Set(selection.years);
  const fire = new Uint8Array(years.length);
  const category = new Uint8Array(years.length);
  years.forEach((year, position) => {
    fire[position] = fireSet.has(year) ? 1 : 0;
    category[position] = CATEGORY_NUMBER[categories.byYear.get(year) ?? "below"];
  });
  const n = years.length;
  return {
    threshold: selection.threshold,
    lowerCut: categories.lowerCut,
    upperCut: categories.upperCut,
    fire,
    category,
    baseRate: n === 0 ? Number.NaN : selection.years.length / n,
    shares: [categories.realisedShares.below, categories.realisedShares.near, categories.realisedShares.above],
  };
}
