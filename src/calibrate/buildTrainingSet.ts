import { activityCategories, categoryOf, TERCILE_QUANTILE_RULE, TERCILE_TIE_RULE } from "../record/activityCategories.js";
import { selectFireYears } from "../record/selectFireYears.js";
import type { ActivityCategories, ActivityCategory, FireYearSelection } from "../record/types.js";
import { classifyPhase, phaseDefinition } from "../climate/phaseDefinition.js";
import type { PhaseDefinition } from "../climate/types.js";
import type { IndexSettings } from "../workspace/types.js";

/** Index values by index name, then by year (missing years are absent). */
export type IndexValues = ReadonlyMap<string, ReadonlyMap<number, number>>;

/**
 * Everything the odds are computed from, for one set of years: which years are fire years, their
 * activity categories, and each index's phase definition and phase per year. The calibration builds
 * one from all calibration years; the hindcast builds one per held-out year from the years left in,
 * so nothing about a held-out year leaks into its own forecast.
 */
export interface TrainingSet {
  readonly years: readonly number[];
  readonly fireYears: FireYearSelection;
  readonly isFireYear: ReadonlySet<number>;
  readonly categories: ActivityCategories;
  readonly definitions: ReadonlyMap<string, PhaseDefinition>;
  /** Phase number per index and year, for the training years that have a value. */
  readonly phaseOf: ReadonlyMap<string, ReadonlyMap<number, number>>;
}

export interface TrainingInput {
  readonly years: readonly number[];
  readonly activity: ReadonlyMap<number, number>;
  readonly indexValues: IndexValues;
  readonly indexSettings: readonly IndexSettings[];
  readonly top: number;
  readonly measure: "fraction" | "sites";
  /** Years outside the training set whose activity category should be given with the training cuts. */
  readonly classify?: readonly number[];
  /**
   * A fixed event definition (the hindcast's, from the whole calibration period): when given, the fire years
   * of `years` are those with activity ≥ threshold and > 0, and the categories use these tercile cuts,
   * instead of both being learned from `years`.
   */
  readonly event?: { readonly threshold: number | null; readonly lowerCut: number; readonly upperCut: number };
}

/**
 * Builds a {@link TrainingSet}: fire years, tercile categories and phase definitions from `years` only (or,
 * with `event`, fire years and categories under that fixed definition and phase definitions from `years`).
 */
export function buildTrainingSet(input: TrainingInput): TrainingSet {
  const fireYears =
    input.event === undefined
      ? selectFireYears(input.activity, input.years, input.top, input.measure)
      : fixedFireYears(input.activity, input.years, input.top, input.measure, input.event.threshold);
  const categories =
    input.event === undefined
      ? activityCategories(input.activity, input.years, input.classify ?? [])
      : fixedCategories(input.activity, input.years, input.classify ?? [], input.event.lowerCut, input.event.upperCut);
  const definitions = new Map<string, PhaseDefinition>();
  const phaseOf = new Map<string, Map<number, number>>();
  for (const settings of input.indexSettings) {
    const values = input.indexValues.get(settings.name) ?? new Map<number, number>();
    const trainingValues: number[] = [];
    for (const year of input.years) {
      const value = values.get(year);
      if (value !== undefined) trainingValues.push(value);
    }
    const definition = phaseDefinition(settings, trainingValues);
    definitions.set(settings.name, definition);
    const phases = new Map<number, number>();
    for (const year of input.years) {
      const value = values.get(year);
      if (value !== undefined) phases.set(year, classifyPhase(value, definition.cuts));
    }
    phaseOf.set(settings.name, phases);
  }
  return { years: input.years, fireYears, isFireYear: new Set(fireYears.years), categories, definitions, phaseOf };
}

/** Fire-year and category counts of the training years in each phase of one index. */
export interface PhaseCount {
  readonly phase: number;
  readonly years: readonly number[];
  readonly fireYears: number;
  readonly categories: { below: number; near: number; above: number };
}

/** Counts per phase of one index (phases with no years are included with zero counts). */
export function phaseCounts(training: TrainingSet, index: string): PhaseCount[] {
  const definition = training.definitions.get(index);
  const phases = training.phaseOf.get(index);
  if (definition === undefined || phases === undefined) throw new RangeError(`unknown index ${index}`);
  const counts: PhaseCount[] = definition.labels.map((_, phase) => ({
    phase,
    years: [] as number[],
    fireYears: 0,
    categories: { below: 0, near: 0, above: 0 },
  }));
  for (const [year, phase] of phases) {
    const cell = counts[phase];
    if (cell === undefined) continue;
    (cell.years as number[]).push(year);
    if (training.isFireYear.has(year)) (cell as { fireYears: number }).fireYears += 1;
    const category = training.categories.byYear.get(year);
    if (category !== undefined) cell.categories[category] += 1;
  }
  return counts;
}

function fixedFireYears(
  activity: ReadonlyMap<number, number>,
  years: readonly number[],
  top: number,
  measure: "fraction" | "sites",
  threshold: number | null,
): FireYearSelection {
  const chosen =
    threshold === null
      ? []
      : years.filter((year) => {
          const value = activity.get(year) ?? Number.NaN;
          return value >= threshold && value > 0;
        });
  const sorted = [...chosen].sort((a, b) => a - b);
  return { top, measure, threshold, years: sorted, realisedShare: years.length === 0 ? 0 : sorted.length / years.length, calibrationYears: years.length };
}

function fixedCategories(
  activity: ReadonlyMap<number, number>,
  years: readonly number[],
  classify: readonly number[],
  lowerCut: number,
  upperCut: number,
): ActivityCategories {
  const byYear = new Map<number, ActivityCategory>();
  const counts = { below: 0, near: 0, above: 0 };
  for (const year of years) {
    const category = categoryOf(activity.get(year) ?? Number.NaN, lowerCut, upperCut);
    byYear.set(year, category);
    counts[category] += 1;
  }
  for (const year of classify) byYear.set(year, categoryOf(activity.get(year) ?? Number.NaN, lowerCut, upperCut));
  const n = years.length;
  return {
    lowerCut,
    upperCut,
    quantileRule: TERCILE_QUANTILE_RULE,
    tieRule: TERCILE_TIE_RULE,
    byYear,
    realisedShares: {
      below: n === 0 ? Number.NaN : counts.below / n,
      near: n === 0 ? Number.NaN : counts.near / n,
      above: n === 0 ? Number.NaN : counts.above / n,
    },
  };
}
