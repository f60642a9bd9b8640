import type { TrainingSet } from "./buildTrainingSet.js";
import type { AssociationRank } from "./rankIndicesByAssociation.js";

/** The set of past years a forecast is read from, and what happened in them. */
export interface ForecastCell {
  readonly basis: "joint" | "single" | "climatology";
  readonly indices: readonly string[];
  /** Phase number of each index in `indices`. */
  readonly phases: readonly number[];
  readonly years: readonly number[];
  readonly fireYears: number;
  readonly categories: { readonly below: number; readonly near: number; readonly above: number };
}

/**
 * Chooses the past years a forecast is read from (README, "outlook"):
 * the joint phase of the two indices with the strongest calibrated association (smallest chi-square
 * p) when both have a clear link (Benjamini–Hochberg q at most `jointMaxQ`, so an index with no
 * demonstrated link never moves the odds through a joint cell) and that joint cell holds at least
 * `jointMinYears` training years; otherwise the current phase
 * of the single strongest index that has at least one training year in that phase; with no current
 * index value, or no past year in any current phase, all training years (climatology). The outlook
 * and the hindcast both use this one rule, so the hindcast verifies what the outlook issues.
 *
 * @param training - the training years and their fire years, categories and phases
 * @param current - the current phase number per index (indices without a current value are absent)
 * @param ranking - indices ordered by association strength (see rankIndicesByAssociation)
 * @param jointMinYears - fewest years a joint cell needs
 * @param jointMaxQ - largest q-value of an index in a joint cell
 */
export function forecastCell(
  training: TrainingSet,
  current: ReadonlyMap<string, number>,
  ranking: readonly AssociationRank[],
  jointMinYears: number,
  jointMaxQ: number,
): ForecastCell {
  const usable = ranking.map((rank) => rank.index).filter((index) => current.has(index));
  const [first, second] = usable;
  const clear = (index: string): boolean => {
    const q = ranking.find((rank) => rank.index === index)?.qValue;
    return q !== undefined && Number.isFinite(q) && q <= jointMaxQ;
  };
  if (first !== undefined && second !== undefined && clear(first) && clear(second)) {
    const joint = cellOf(training, [first, second], [current.get(first) as number, current.get(second) as number]);
    if (joint.years.length >= jointMinYears) return { ...joint, basis: "joint" };
  }
  for (const index of usable) {
    const single = cellOf(training, [index], [current.get(index) as number]);
    if (single.years.length > 0) return { ...single, basis: "single" };
  }
  return { ...cellOf(training, [], []), basis: "climatology" };
}

function cellOf(training: TrainingSet, indices: readonly string[], phases: readonly number[]): Omit<ForecastCell, "basis"> {
  const years: number[] = [];
  let fireYears = 0;
  const categories = { below: 0, near: 0, above: 0 };
  for (const year of training.years) {
    let inside = true;
    for (let i = 0; i < indices.length; i += 1) {
      const phase = training.phaseOf.get(indices[i] as string)?.get(year);
      if (phase !== phases[i]) {
        inside = false;
        break;
      }
    }
    if (!inside) continue;
    years.push(year);
    if (training.isFireYear.has(year)) fireYears += 1;
    const category = training.categories.byYear.get(year);
    if (category !== undefined) categories[category] += 1;
  }
  return { indices, phases, years, fireYears, categories };
}
