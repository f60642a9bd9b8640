import { classifyPhase } from "../climate/phaseDefinition.js";
import type { IndexValues } from "../calibrate/buildTrainingSet.js";
import { quantileSorted } from "../stats/quantileSorted.js";
import type { IndexSettings } from "../workspace/types.js";

/**
 * Everything about a leave-out hindcast that does not depend on the fire record, computed once and reused by
 * every run of the phase rule (the observed record and each shuffled one): the folds (held-out year and the
 * positions left out with it), each index's phase per year and fold, and the phase cuts each fold relearns.
 *
 * Layout: positions 0 … n − 1 are the calibration years in ascending order. An index's "base phase" of a year
 * is its phase under cuts learned from every year; in a fold, a tercile index's cuts are relearned from the
 * years left in, and the few left-in years whose phase differs from the base phase are listed as that fold's
 * "changes" (a year can change only when its value lies between a base cut and the fold's cut, and the fold's
 * type-7 tercile moves by at most a few ranks). Counting a fold is then: base counts − the left-out years +
 * the changes, never a pass over every year.
 */
export interface HindcastDesign {
  readonly years: readonly number[];
  /** Number of folds (held-out years with at least one year left in). */
  readonly folds: number;
  /** Position of the held-out year of each fold. */
  readonly target: Int32Array;
  /** Left-out positions of fold f: windowStart[f] … windowEnd[f] − 1 (the held-out year and its neighbours). */
  readonly windowStart: Int32Array;
  readonly windowEnd: Int32Array;
  /** Index names in region order (all indices: the ranking and its q-values are over every index). */
  readonly names: readonly string[];
  /** Position of each index's name in sorted name order (the ranking's tie-break). */
  readonly nameRank: Int32Array;
  /** True for the indices the outlook uses (those with a current value). */
  readonly used: readonly boolean[];
  /** Number of phases of each index. */
  readonly phaseCount: Int32Array;
  /** Offset of index k's phases in per-phase arrays (sum of earlier phase counts). */
  readonly phaseOffset: Int32Array;
  readonly totalPhases: number;
  /** Base phase of each position per index, −1 when the index has no value that year. */
  readonly basePhase: readonly Int8Array[];
  /** Years per base phase (flat, phaseOffset). */
  readonly baseYears: Int32Array;
  /** The held-out year's phase under the fold's cuts, per fold × index (−1 when it has no value). */
  readonly targetPhase: Int8Array;
  /** Changes of fold f, index k: positions changePosition[changeStart[f·K + k] … changeStart[f·K + k + 1] − 1]. */
  readonly changeStart: Int32Array;
  readonly changePosition: Int32Array;
  /** Fold phase of each change (its base phase is basePhase). */
  readonly changePhase: Int8Array;
  /** Index values per position (NaN when missing), per index; the curve rule reads them. */
  readonly values: readonly Float64Array[];
}

export interface HindcastDesignInput {
  readonly years: readonly number[];
  readonly indexValues: IndexValues;
  readonly indexSettings: readonly IndexSettings[];
  readonly indices: readonly string[];
  readonly exclusion: number;
}

/**
 * Builds the {@link HindcastDesign} of a leave-out hindcast: sorts each index's values once, and for every fold
 * relearns the tercile cuts from the left-in values by skipping the left-out ranks of the sorted values
 * (type-7 quantiles of Hyndman & Fan 1996, exactly as phaseDefinition computes them from the left-in values),
 * then lists the left-in years whose phase differs from the base phase. Cost O(K·(n log n + n·w)) for n years,
 * K indices and w left-out years per fold.
 *
 * @param input - the calibration years (any order; sorted here), index values and settings, the indices the
 *   outlook uses, and the exclusion (years either side of the held-out year also left out, ≥ 0).
 * @returns the design; folds whose left-in set would be empty are skipped.
 */
export function hindcastDesign(input: HindcastDesignInput): HindcastDesign {
  const years = [...input.years].sort((a, b) => a - b);
  const n = years.length;
  const settings = input.indexSettings;
  const K = settings.length;
  const names = settings.map((entry) => entry.name);
  const sortedNames = [...names].sort((a, b) => (a < b ? -1 : a > b ? 1 : 0));
  const nameRank = Int32Array.from(names, (name) => sortedNames.indexOf(name));
  const usedSet = new Set(input.indices);
  const used = names.map((name) => usedSet.has(name));

  // Folds: the window of left-out positions around each held-out year.
  const targets: number[] = [];
  const starts: number[] = [];
  const ends: number[] = [];
  let low = 0;
  let high = 0;
  for (let position = 0; position < n; position += 1) {
    const year = years[position] as number;
    while ((years[low] as number) < year - input.exclusion) low += 1;
    if (high < position) high = position;
    while (high < n && (years[high] as number) <= year + input.exclusion) high += 1;
    if (n - (high - low) <= 0) continue;
    targets.push(position);
    starts.push(low);
    ends.push(high);
  }
  const folds = targets.length;

  const phaseCount = Int32Array.from(settings, (entry) => (entry.phases.kind === "cuts" ? entry.phases.cuts.length + 1 : 3));
  const phaseOffset = new Int32Array(K);
  let totalPhases = 0;
  for (let k = 0; k < K; k += 1) {
    phaseOffset[k] = totalPhases;
    totalPhases += phaseCount[k] as number;
  }
  const baseYears = new Int32Array(totalPhases);
  const basePhase: Int8Array[] = [];
  const values: Float64Array[] = [];
  const targetPhase = new Int8Array(folds * K).fill(-1);
  const changeLists: { position: number[]; phase: number[] }[] = Array.from({ length: folds * K }, () => ({ position: [], phase: [] }));

  for (let k = 0; k < K; k += 1) {
    const entry = settings[k] as IndexSettings;
    const byYear = input.indexValues.get(entry.name) ?? new Map<number, number>();
    const value = Float64Array.from(years, (year) => byYear.get(year) ?? Number.NaN);
    values.push(value);
    const valued: number[] = [];
    for (let position = 0; position < n; position += 1) if (!Number.isNaN(value[position] as number)) valued.push(position);
    // Sorted values (ascending, as Float64Array.prototype.sort orders them) and the position behind each.
    const order = valued.slice().sort((a, b) => (value[a] as number) - (value[b] as number) || a - b);
    const sorted = Array.from(Float64Array.from(valued, (position) => value[position] as number).sort());
    const rank = new Int32Array(n).fill(-1);
    order.forEach((position, r) => {
      rank[position] = r;
    });
    const orderedValues = order.map((position) => value[position] as number);
    const fixedCuts = entry.phases.kind === "cuts" ? entry.phases.cuts : null;
    const baseCuts = fixedCuts ?? [quantileSorted(sorted, 1 / 3), quantileSorted(sorted, 2 / 3)];
    const phases = new Int8Array(n).fill(-1);
    for (const position of valued) {
      const phase = classifyPhase(value[position] as number, baseCuts);
      phases[position] = phase;
      baseYears[(phaseOffset[k] as number) + phase] = (baseYears[(phaseOffset[k] as number) + phase] as number) + 1;
    }
    basePhase.push(phases);
    const stamp = new Int32Array(n).fill(-1);
    for (let fold = 0; fold < folds; fold += 1) {
      const windowStart = starts[fold] as number;
      const windowEnd = ends[fold] as number;
      const targetValue = value[targets[fold] as number] as number;
      if (fixedCuts !== null) {
        if (!Number.isNaN(targetValue)) targetPhase[fold * K + k] = classifyPhase(targetValue, fixedCuts);
        continue;
      }
      const removed: number[] = [];
      for (let position = windowStart; position < windowEnd; position += 1) {
        const r = rank[position] as number;
        if (r >= 0) removed.push(r);
      }
      removed.sort((a, b) => a - b);
      const kept = sorted.length - removed.length;
      const kth = (r: number): number => {
        let at = r;
        for (const gone of removed) {
          if (gone <= at) at += 1;
          else break;
        }
        return sorted[at] as number;
      };
      const quantile = (p: number): number => {
        if (kept === 0) return Number.NaN;
        const where = (kept - 1) * p;
        const lowerIndex = Math.floor(where);
        const fraction = where - lowerIndex;
        const lowerValue = kth(lowerIndex);
        if (fraction === 0) return lowerValue;
        return lowerValue + fraction * (kth(lowerIndex + 1) - lowerValue);
      };
      const foldCuts = [quantile(1 / 3), quantile(2 / 3)];
      if (!Number.isNaN(targetValue)) targetPhase[fold * K + k] = classifyPhase(targetValue, foldCuts);
      const list = changeLists[fold * K + k] as { position: number[]; phase: number[] };
      for (let cut = 0; cut < 2; cut += 1) {
        const a = baseCuts[cut] as number;
        const b = foldCuts[cut] as number;
        if (Number.isNaN(a) || Number.isNaN(b) || a === b) continue;
        const from = Math.min(a, b);
        const to = Math.max(a, b);
        for (let r = lowerBound(orderedValues, from); r < orderedValues.length && (orderedValues[r] as number) <= to; r += 1) {
          const position = order[r] as number;
          if (position >= windowStart && position < windowEnd) continue;
          if (stamp[position] === fold) continue;
          const phase = classifyPhase(orderedValues[r] as number, foldCuts);
          if (phase !== phases[position]) {
            stamp[position] = fold;
            list.position.push(position);
            list.phase.push(phase);
          }
        }
      }
    }
  }

  const changeStart = new Int32Array(folds * K + 1);
  let total = 0;
  for (let cell = 0; cell < folds * K; cell += 1) {
    changeStart[cell] = total;
    total += (changeLists[cell] as { position: number[] }).position.length;
  }
  changeStart[folds * K] = total;
  const changePosition = new Int32Array(total);
  const changePhase = new Int8Array(total);
  for (let cell = 0; cell < folds * K; cell += 1) {
    const list = changeLists[cell] as { position: number[]; phase: number[] };
    changePosition.set(list.position, changeStart[cell] as number);
    changePhase.set(list.phase, changeStart[cell] as number);
  }

  return {
    years,
    folds,
    target: Int32Array.from(targets),
    windowStart: Int32Array.from(starts),
    windowEnd: Int32Array.from(ends),
    names,
    nameRank,
    used,
    phaseCount,
    phaseOffset,
    totalPhases,
    basePhase,
    baseYears,
    targetPhase,
    changeStart,
    changePosition,
    changePhase,
    values,
  };
}

/** First r with sorted[r] ≥ value (sorted ascending). */
function lowerBound(sorted: readonly number[], value: number): number {
  let low = 0;
  let high = sorted.length;
  while (low < high) {
    const middle = (low + high) >>> 1;
    if ((sorted[middle] as number) < value) low = middle + 1;
    else high = middle;
  }
  return low;
}
