import { classifyPhase } from "../climate/phaseDefinition.js";
import type { IndexValues } from "../calibrate/buildTrainingSet.js";
import { phaseTableChiSquare } from "../calibrate/rankIndicesByAssociation.js";
import { benjaminiHochberg } from "../stats/benjaminiHochberg.js";
import { curveScratch, readFastResponseCurve, type CurveScratch } from "../hindcast/fastResponseCurve.js";
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
  /** High-fire years of the whole calibration period (kept fixed in every resample). */
  readonly isFireYear: ReadonlySet<number>;
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
  const estimates: number[] = [];
  const prepared = prepare(input);
  for (let resample = 0; resample < input.resamples; resample += 1) {
    const positions = movingBlockBootstrapIndices(n, blockYears, random);
    estimates.push(oddsOnResample(input, prepared, positions));
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

/**
 * The calibration records by position (0 … n − 1 in `years`) and the scratch space of every resample,
 * prepared once: typed arrays in the order of the index settings, so a resample allocates almost nothing.
 */
interface Prepared {
  readonly n: number;
  readonly fire: Uint8Array;
  /** Index values by position, NaN where missing, in the order of the settings. */
  readonly values: readonly Float64Array[];
  /** Fixed cuts of an index with the "cuts" rule; null for terciles (recomputed on each resample). */
  readonly fixedCuts: readonly (readonly number[] | null)[];
  /** Number of phases (labels) of each index. */
  readonly phaseCount: readonly number[];
  /** This season's value of each index (read only where `hasCurrent` is 1). */
  readonly current: Float64Array;
  readonly hasCurrent: Uint8Array;
  /** Name order of the indices (ties of p are broken by name, as rankIndicesByAssociation does). */
  readonly nameOrder: Int32Array;
  /** Phase of each resampled position per index (−1 without a value), and this season's phase. */
  readonly phase: readonly Int8Array[];
  readonly currentPhase: Int32Array;
  readonly drawn: Float64Array;
  readonly yearsPerPhase: Int32Array;
  readonly firePerPhase: Int32Array;
  readonly pValues: number[];
  readonly order: number[];
  readonly curve: (CurveScratch | null)[];
}

function prepare(input: SelectionIntervalInput): Prepared {
  const n = input.years.length;
  const fire = new Uint8Array(n);
  input.years.forEach((year, position) => {
    fire[position] = input.isFireYear.has(year) ? 1 : 0;
  });
  const names = input.indexSettings.map((settings) => settings.name);
  const values = input.indexSettings.map((settings) => {
    const byYear = input.indexValues.get(settings.name);
    return Float64Array.from(input.years, (year) => byYear?.get(year) ?? Number.NaN);
  });
  const sortedNames = [...names].sort((a, b) => (a < b ? -1 : a > b ? 1 : 0));
  const phaseCount = input.indexSettings.map((settings) => settings.phases.labels.length);
  return {
    n,
    fire,
    values,
    fixedCuts: input.indexSettings.map((settings) => (settings.phases.kind === "cuts" ? settings.phases.cuts : null)),
    phaseCount,
    current: Float64Array.from(names, (name) => input.current.get(name) ?? Number.NaN),
    hasCurrent: Uint8Array.from(names, (name) => (input.current.has(name) ? 1 : 0)),
    nameOrder: Int32Array.from(names, (name) => sortedNames.indexOf(name)),
    phase: names.map(() => new Int8Array(n)),
    currentPhase: new Int32Array(names.length),
    drawn: new Float64Array(n),
    yearsPerPhase: new Int32Array(Math.max(1, ...phaseCount)),
    firePerPhase: new Int32Array(Math.max(1, ...phaseCount)),
    pValues: names.map(() => Number.NaN),
    order: names.map((_, k) => k),
    curve: names.map(() => null),
  };
}

/**
 * The rule's odds on one resample: the arithmetic of buildTrainingSet (phase cuts by phaseDefinition, phases by
 * classifyPhase), rankIndicesByAssociation (phaseTableChiSquare, benjaminiHochberg, p ascending with NaN last and
 * ties by name), forecastCell (joint, single, climatology) and curveForecast, on counts in typed arrays instead of
 * maps of pseudo-years. The test beside it rebuilds every resample from those functions and gets the same odds.
 */
function oddsOnResample(input: SelectionIntervalInput, prepared: Prepared, positions: readonly number[]): number {
  // Each drawn year is its own pseudo-year (its place i in the resample), so a year drawn twice counts twice.
  const { n, fire, values, fixedCuts, phaseCount, current, phase, currentPhase, drawn, yearsPerPhase, firePerPhase, pValues, order } = prepared;
  const K = values.length;
  let fireTotal = 0;
  for (let i = 0; i < n; i += 1) fireTotal += fire[positions[i] as number] as number;
  for (let k = 0; k < K; k += 1) {
    const byPosition = values[k] as Float64Array;
    const phases = phase[k] as Int8Array;
    let m = 0;
    for (let i = 0; i < n; i += 1) {
      const value = byPosition[positions[i] as number] as number;
      if (Number.isNaN(value)) continue;
      drawn[m] = value;
      m += 1;
    }
    const cuts = fixedCuts[k] ?? tercileCuts(drawn.subarray(0, m));
    const count = phaseCount[k] as number;
    yearsPerPhase.fill(0, 0, count);
    firePerPhase.fill(0, 0, count);
    for (let i = 0; i < n; i += 1) {
      const position = positions[i] as number;
      const value = byPosition[position] as number;
      if (Number.isNaN(value)) {
        phases[i] = -1;
        continue;
      }
      const p = classifyPhase(value, cuts);
      phases[i] = p;
      if (p >= count) continue; // phaseCounts keeps only the phases that have a label
      yearsPerPhase[p] = (yearsPerPhase[p] as number) + 1;
      firePerPhase[p] = (firePerPhase[p] as number) + (fire[position] as number);
    }
    currentPhase[k] = prepared.hasCurrent[k] === 1 ? classifyPhase(current[k] as number, cuts) : -1;
    pValues[k] = phaseTableChiSquare(yearsPerPhase, firePerPhase, 0, count).pValue;
  }
  const qValues = benjaminiHochberg(pValues);
  for (let k = 0; k < K; k += 1) order[k] = k;
  order.sort((a, b) => {
    const pa = Number.isNaN(pValues[a] as number) ? Infinity : (pValues[a] as number);
    const pb = Number.isNaN(pValues[b] as number) ? Infinity : (pValues[b] as number);
    if (pa !== pb) return pa - pb;
    return (prepared.nameOrder[a] as number) - (prepared.nameOrder[b] as number);
  });
  // forecastCell: the joint cell of the two strongest indices with a value this season when both are clear and
  // it holds jointMinYears, else the strongest index's single cell with a year in it, else every year.
  let first = -1;
  let second = -1;
  for (const k of order) {
    if (currentPhase[k] === -1) continue;
    if (first < 0) first = k;
    else if (second < 0) second = k;
  }
  const clear = (k: number): boolean => {
    const q = qValues[k] as number;
    return Number.isFinite(q) && q <= input.jointMaxQ;
  };
  let chosen = -1;
  let cellYears = 0;
  let cellFire = 0;
  if (first >= 0 && second >= 0 && clear(first) && clear(second)) {
    const phasesA = phase[first] as Int8Array;
    const phasesB = phase[second] as Int8Array;
    const wantA = currentPhase[first] as number;
    const wantB = currentPhase[second] as number;
    for (let i = 0; i < n; i += 1) {
      if (phasesA[i] !== wantA || phasesB[i] !== wantB) continue;
      cellYears += 1;
      cellFire += fire[positions[i] as number] as number;
    }
    if (cellYears >= input.jointMinYears) chosen = first;
  }
  if (chosen < 0) {
    for (const k of order) {
      const want = currentPhase[k] as number;
      if (want === -1) continue;
      const phases = phase[k] as Int8Array;
      cellYears = 0;
      cellFire = 0;
      for (let i = 0; i < n; i += 1) {
        if (phases[i] !== want) continue;
        cellYears += 1;
        cellFire += fire[positions[i] as number] as number;
      }
      if (cellYears > 0) {
        chosen = k;
        break;
      }
    }
  }
  if (chosen < 0) {
    cellYears = n;
    cellFire = fireTotal;
  }
  const phaseOdds = cellYears === 0 ? fireTotal / n : cellFire / cellYears;
  if (input.response === "phase" || chosen < 0) return phaseOdds;
  // The curve rule (curveForecast): the cell's first index, its curve fitted over the resample's years with a
  // value, read at this season's value. readFastResponseCurve reproduces fitResponseCurve + readResponseCurve
  // (the hindcast's tests check it against curveForecast) without allocating per fit; each index keeps its own
  // scratch (and so its own warm starts) from resample to resample.
  const buffers = prepared.curve[chosen] ?? curveScratch(n);
  prepared.curve[chosen] = buffers;
  const byPosition = values[chosen] as Float64Array;
  let m = 0;
  for (let i = 0; i < n; i += 1) {
    const position = positions[i] as number;
    const x = byPosition[position] as number;
    if (Number.isNaN(x)) continue;
    buffers.x[m] = x;
    buffers.y[m] = fire[position] as number;
    m += 1;
  }
  const estimate = readFastResponseCurve(buffers, m, current[chosen] as number);
  return Number.isNaN(estimate) ? phaseOdds : estimate;
}

/** The tercile cuts of phaseDefinition (type-7 quantiles at 1/3 and 2/3) of the drawn values. */
function tercileCuts(drawn: Float64Array): number[] {
  const sorted = drawn.slice().sort() as unknown as readonly number[];
  return [quantileSorted(sorted, 1 / 3), quantileSorted(sorted, 2 / 3)];
}
