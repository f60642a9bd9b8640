import { activityCategories } from "../record/activityCategories.js";
import { selectFireYears } from "../record/selectFireYears.js";
import type { ActivityCategories, FireYearSelection } from "../record/types.js";
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
}

/** Builds a {@link TrainingSet}: fire years, tercile categories and phase definitions from `years` only. */
export function buildTrainingSet(input: TrainingInput): TrainingSet {
  const fireYears = selectFireYears(input.activity, input.years, input.top, input.measure);
  const categories = activityCategories(input.activity, input.years, input.classify ?? []);
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
