import { classifyPhase, phaseDefinition } from "../climate/phaseDefinition.js";
import type { IndexValues, TrainingSet } from "../calibrate/buildTrainingSet.js";
import { forecastCell } from "../calibrate/forecastCell.js";
import { rankIndicesByAssociation } from "../calibrate/rankIndicesByAssociation.js";
import { curveScratch, readFastResponseCurve, type CurveScratch } from "../hindcast/fastResponseCurve.js";
import type { ActivityCategories, ActivityCategory } from "../record/types.js";
import type { PhaseDefinition } from "../climate/types.js";
import { createRandom } from "../stats/createRandom.js";
import { movingBlockBootstrapIndices } from "../stats/movingBlockBootstrap.js";
import { quantileSorted } from "../stats/quantileSorted.js";
import type { IndexSettings } from "../workspace/types.js";
import type { SelectionInterval } from "./types.js";

/** Fewest calibration years for the selection-aware interval. */
export const MIN_SELECTION_YEARS = 10;

/** A selection-aware interval this many times wider (or narrower) than the plain one "differs much". */
export const WIDTH_RATIO_MUCH = 1.5;

export interface SelectionIntervalInput {
  /** Calibration years, ascending. */
  readonly years: readonly number[];
  readonly indexValues: IndexValues;
  readonly indexSettings: readonly IndexSettings[];
  /** High-fire years and activity categories of the whole calibration period (kept fixed in every resample). */
  readonly isFireYear: ReadonlySet<number>;
  readonly categories: ActivityCategories;
  readonly top: number;
  readonly measure: "fraction" | "sites";
  /** This season's value per index (indices without a value are absent). */
  readonly current: ReadonlyMap<string, number>;
  readonly jointMinYears: number;
  readonly jointMaxQ: number;
  /** Which rule gives the headline: the phase cell, or the curve of the index the rule selects. */
  readonly response: "phase" | "curve";
  readonly blockYears: number;
  readonly resamples: number;
  readonly seed: number;
  readonly level?: number;
}

export type SelectionIntervalResult =
  | { readonly interval: SelectionInterval; readonly reason?: undefined }
  | { readonly interval: null; readonly reason: string };

/**
 * Selection-aware interval of the headline odds (moving-block bootstrap of the whole rule): how
 * uncertain the odds are once we allow for the rule having picked the index, the phase cell and
 * the joint-or-single choice from the same years it reads the odds from.
 *
 * Each resample draws the calibration years in moving blocks of `blockYears` consecutive years
 * (Künsch 1989), seeded, and reruns the whole rule on it: the phase cuts (terciles are recomputed),
 * the ranking of the indices by chi-square p, the Benjamini–Hochberg q gate, the choice of the
 * forecast cell for this season's values (and, with `response` "curve", the fit of the selected
 * index's response curve), then reads the odds for this season. The high-fire-year definition and
 * the activity categories are NOT redone: they are fixed from the whole calibration period, as in
 * the hindcast, so the interval measures the uncertainty of the rule, not of the event definition.
 * The interval is the percentile interval (Efron & Tibshirani 1993, §13.3) of the resampled odds.
 * A resample repeats years; each copy counts as its own year.
 *
 * @param input - calibration years and records, the fixed event definition, this season's values,
 *   the rule's settings, and the bootstrap settings (blocks of 1 … n years, resamples ≥ 1, a seed)
 * @returns the percentile interval with its settings; null with a reason when there are fewer than
 *   {@link MIN_SELECTION_YEARS} calibration years
 * @throws RangeError for resamples below 1 or a level outside (0, 1) (programming errors)
 * @example
 * selectionAwareInterval({ ...calibrationRecords, current: new Map([["ENSO", 1.3]]), response: "phase", blockYears: 5, resamples: 999, seed: 1 });
 * // => { interval: { lower: 0.17, upper: 0.46, resamples: 999, blockYears: 5, level: 0.95, seed: 1, method: "…" } }
 * @see Künsch H.R. (1989) "The jackknife and the bootstrap for general stationary observations", Annals of
 *   Statistics 17(3):1217–1241 (the moving-block bootstrap).
 * @see Efron B., Tibshirani R.J. (1993) An Introduction to the Bootstrap, Chapman & Hall, §13.3 (percentile interval).
 */
export function selectionAwareInterval(input: SelectionIntervalInput): SelectionIntervalResult {
  const level = input.level ?? 0.95;
  if (!(level > 0 && level < 1)) throw new RangeError(`selectionAwareInterval: level must be in (0, 1), got ${level}`);
  if (!Number.isInteger(input.resamples) || input.resamples < 1) throw new RangeError(`selectionAwareInterval: resamples must be a whole number ≥ 1, got ${input.resamples}`);
  const n = input.years.length;
  if (n < MIN_SELECTION_YEARS) {
    return { interval: null, reason: `only ${n} calibration years; the bootstrap of the rule needs at least ${MIN_SELECTION_YEARS}` };
  }
  const blockYears = Math.max(1, Math.min(Math.round(input.blockYears), n));
  const random = createRandom(input.seed);
  const names = input.indexSettings.map((settings) => settings.name);
  const estimates: number[] = [];
  const scratch = new Map<string, CurveScratch>();
  const prepared = prepare(input);
  for (let resample = 0; resample < input.resamples; resample += 1) {
    const positions = movingBlockBootstrapIndices(n, blockYears, random);
    estimates.push(oddsOnResample(input, prepared, positions, names, scratch));
  }
  estimates.sort((a, b) => a - b);
  const tail = (1 - level) / 2;
  return {
    interval: {
      lower: quantileSorted(estimates, tail),
      upper: quantileSorted(estimates, 1 - tail),
      resamples: input.resamples,
      blockYears,
      level,
      seed: input.seed,
      method: `moving-block bootstrap (Künsch 1989) of the calibration years in blocks of ${blockYears} years, ${input.resamples} resamples, percentile interval (Hyndman & Fan type 7 quantiles); on each resample the phase cuts, the ranking of the indices, the q gate and the choice of cell${input.response === "curve" ? " and the response curve" : ""} are redone and the odds read for this season's values; the high-fire-year definition is kept fixed from the whole calibration period, as in the hindcast`,
    },
  };
}

/**
 * A sentence when the selection-aware interval and the plain interval of the headline differ much:
 * one more than {@link WIDTH_RATIO_MUCH} times as wide as the other (width = upper − lower). Null otherwise.
 *
 * @param plain - the headline's own interval (Wilson, or the curve's Wald band); nulls give no sentence
 * @param selection - the selection-aware interval, or null
 * @param formatRange - how a range is written in words (e.g. "13–41%")
 * @returns the sentence, or null when the widths are within a factor of 1.5 or an interval is missing
 * @example
 * selectionNote({ lower: 0.2, upper: 0.4 }, { lower: 0.1, upper: 0.46, … }, formatPercentRange);
 * // => "Allowing for how the rule chose its index and past years from this same record, the 95% interval is 10–46%, 1.8 times as wide as …"
 */
export function selectionNote(
  plain: { readonly lower: number | null; readonly upper: number | null },
  selection: SelectionInterval | null,
  formatRange: (lower: number, upper: number) => string,
): string | null {
  if (selection === null || plain.lower === null || plain.upper === null) return null;
  const plainWidth = plain.upper - plain.lower;
  const selectionWidth = selection.upper - selection.lower;
  if (!(plainWidth > 0)) return null;
  const ratio = selectionWidth / plainWidth;
  const selectionWords = formatRange(selection.lower, selection.upper);
  const plainWords = formatRange(plain.lower, plain.upper);
  if (ratio > WIDTH_RATIO_MUCH) {
    return `Allowing for how the rule chose its index and past years from this same record, the 95% interval is ${selectionWords}, ${ratio.toFixed(1)} times as wide as the ${plainWords} of the chosen years alone: the odds are less certain than the narrower interval suggests.`;
  }
  if (ratio < 1 / WIDTH_RATIO_MUCH) {
    return `Allowing for how the rule chose its index and past years from this same record, the 95% interval is ${selectionWords}, narrower than the ${plainWords} of the chosen years alone; the wider one is the safer reading.`;
  }
  return null;
}

/** The calibration records by position (0 … n − 1 in `years`), prepared once for all resamples. */
interface Prepared {
  readonly fire: Uint8Array;
  readonly category: readonly (ActivityCategory | undefined)[];
  /** Index values by position, NaN where missing, for the indices of the settings. */
  readonly values: ReadonlyMap<string, Float64Array>;
}

function prepare(input: SelectionIntervalInput): Prepared {
  const n = input.years.length;
  const fire = new Uint8Array(n);
  const category: (ActivityCategory | undefined)[] = [];
  input.years.forEach((year, position) => {
    fire[position] = input.isFireYear.has(year) ? 1 : 0;
    category.push(input.categories.byYear.get(year));
  });
  const values = new Map<string, Float64Array>();
  for (const settings of input.indexSettings) {
    const byYear = input.indexValues.get(settings.name);
    values.set(
      settings.name,
      Float64Array.from(input.years, (year) => byYear?.get(year) ?? Number.NaN),
    );
  }
  return { fire, category, values };
}

function oddsOnResample(
  input: SelectionIntervalInput,
  prepared: Prepared,
  positions: readonly number[],
  names: readonly string[],
  scratch: Map<string, CurveScratch>,
): number {
  // Each drawn year gets its own number (its position in the resample), so a year drawn twice counts twice.
  const n = positions.length;
  const pseudoYears = positions.map((_, i) => i);
  const isFireYear = new Set<number>();
  const categories = new Map<number, ActivityCategory>();
  for (let i = 0; i < n; i += 1) {
    const position = positions[i] as number;
    if (prepared.fire[position] === 1) isFireYear.add(i);
    const category = prepared.category[position];
    if (category !== undefined) categories.set(i, category);
  }
  // The training set of the resample: phase cuts (and phases) redone from the resampled values; the
  // high-fire years and categories carried over from the whole period (the event definition stays fixed).
  const definitions = new Map<string, PhaseDefinition>();
  const phaseOf = new Map<string, Map<number, number>>();
  for (const settings of input.indexSettings) {
    const byPosition = prepared.values.get(settings.name) as Float64Array;
    const drawn: number[] = [];
    const drawnYears: number[] = [];
    for (let i = 0; i < n; i += 1) {
      const value = byPosition[positions[i] as number] as number;
      if (Number.isNaN(value)) continue;
      drawn.push(value);
      drawnYears.push(i);
    }
    const definition = phaseDefinition(settings, drawn);
    definitions.set(settings.name, definition);
    const phases = new Map<number, number>();
    drawnYears.forEach((year, k) => phases.set(year, classifyPhase(drawn[k] as number, definition.cuts)));
    phaseOf.set(settings.name, phases);
  }
  const fireYears = pseudoYears.filter((year) => isFireYear.has(year));
  const training: TrainingSet = {
    years: pseudoYears,
    fireYears: { top: input.top, measure: input.measure, threshold: null, years: fireYears, realisedShare: fireYears.length / pseudoYears.length, calibrationYears: pseudoYears.length },
    isFireYear,
    categories: { ...input.categories, byYear: categories },
    definitions,
    phaseOf,
  };
  const phases = new Map<string, number>();
  for (const [name, value] of input.current) {
    const definition = training.definitions.get(name);
    if (definition !== undefined) phases.set(name, classifyPhase(value, definition.cuts));
  }
  const ranking = rankIndicesByAssociation(training, names);
  const cell = forecastCell(training, phases, ranking, input.jointMinYears, input.jointMaxQ);
  const phaseOdds = cell.years.length === 0 ? fireYears.length / pseudoYears.length : cell.fireYears / cell.years.length;
  if (input.response === "phase") return phaseOdds;
  // The curve rule (curveForecast): the cell's first index, its curve fitted over the resample's years with a
  // value, read at this season's value. readFastResponseCurve reproduces fitResponseCurve + readResponseCurve
  // (the hindcast's tests check it against curveForecast) without allocating per fit.
  const index = cell.basis === "climatology" ? undefined : cell.indices[0];
  const value = index === undefined ? undefined : input.current.get(index);
  const byPosition = index === undefined ? undefined : prepared.values.get(index);
  if (index === undefined || value === undefined || byPosition === undefined) return phaseOdds;
  const buffers = scratch.get(index) ?? curveScratch(n);
  scratch.set(index, buffers);
  let m = 0;
  for (let i = 0; i < n; i += 1) {
    const x = byPosition[positions[i] as number] as number;
    if (Number.isNaN(x)) continue;
    buffers.x[m] = x;
    buffers.y[m] = isFireYear.has(i) ? 1 : 0;
    m += 1;
  }
  const estimate = readFastResponseCurve(buffers, m, value);
  return Number.isNaN(estimate) ? phaseOdds : estimate;
}
