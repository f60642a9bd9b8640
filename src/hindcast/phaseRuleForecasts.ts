import { phaseTableChiSquareStatistic } from "../calibrate/rankIndicesByAssociation.js";
import { chiSquareUpperTail } from "../stats/chiSquareIndependence.js";
import type { HindcastDesign } from "./hindcastDesign.js";

/** Where a hindcast forecast was read from (numbers of {@link PhaseRuleForecasts.basis}). */
export const BASIS = ["joint", "single", "climatology"] as const;

/** The phase rule's forecast of every fold, as flat arrays (one entry, or three for categories, per fold). */
export interface PhaseRuleForecasts {
  /** Forecast probability of a high-fire year. */
  readonly probability: Float64Array;
  /** Forecast probabilities of below, near and above normal (fold·3 + category). */
  readonly categories: Float64Array;
  /** Left-in share of high-fire years (what the rule says with no index information). */
  readonly climatology: Float64Array;
  /** Left-in shares of below, near and above normal. */
  readonly climatologyCategories: Float64Array;
  /** 0 joint phase, 1 single phase, 2 all left-in years (see {@link BASIS}). */
  readonly basis: Uint8Array;
  /**
   * The first index of the fold's forecast cell (the index the curve rule reads, as curveForecast does): the
   * stronger index of a joint cell, the index of a single cell, −1 when the forecast is every left-in year.
   */
  readonly cellIndex: Int16Array;
}

export interface PhaseRuleSettings {
  readonly jointMinYears: number;
  readonly jointMaxQ: number;
}

/** Scratch space reused across runs of one design (so a permutation test allocates once). */
export interface PhaseRuleScratch {
  readonly baseFire: Int32Array;
  readonly baseCategory: Int32Array;
  readonly foldYears: Int32Array;
  readonly foldFire: Int32Array;
  readonly pValues: Float64Array;
  readonly qValues: Float64Array;
  readonly order: Int32Array;
  readonly defined: Int32Array;
  readonly current: Int8Array[];
  readonly joint: Map<number, { years: Int32Array; fire: Int32Array; category: Int32Array; width: number }>;
  /** Chi-square p by (X², df): see cachedPValue. */
  readonly pCache: Map<number, number>;
  output: PhaseRuleForecasts;
}

/** Allocates the scratch space of {@link phaseRuleForecasts} for one design. */
export function phaseRuleScratch(design: HindcastDesign): PhaseRuleScratch {
  const K = design.names.length;
  const folds = design.folds;
  return {
    baseFire: new Int32Array(design.totalPhases),
    baseCategory: new Int32Array(design.totalPhases * 3),
    foldYears: new Int32Array(design.totalPhases),
    foldFire: new Int32Array(design.totalPhases),
    pValues: new Float64Array(K),
    qValues: new Float64Array(K),
    order: new Int32Array(K),
    defined: new Int32Array(K),
    current: design.basePhase.map((phases) => Int8Array.from(phases)),
    joint: new Map(),
    pCache: new Map(),
    output: {
      probability: new Float64Array(folds),
      categories: new Float64Array(folds * 3),
      climatology: new Float64Array(folds),
      climatologyCategories: new Float64Array(folds * 3),
      basis: new Uint8Array(folds),
      cellIndex: new Int16Array(folds),
    },
  };
}

/**
 * Runs the outlook's phase rule in every fold of a leave-out hindcast for one fire record: in each fold the
 * phase cuts, the chi-square ranking of the indices with its Benjamini–Hochberg q-values, the choice of past
 * years (joint phase of the two strongest indices with a clear link and at least jointMinYears years, else the
 * strongest single index with a past year in its phase, else every left-in year) and the odds are all taken
 * from the left-in years — the same rule as forecastCell and rankIndicesByAssociation, computed from counts
 * that are updated, not rebuilt, per fold. The fire record enters only as the outcome per position, so the
 * permutation test reruns this with shuffled outcomes and the same design.
 *
 * @param design - the fire-independent part (see hindcastDesign).
 * @param fire - 1 for a high-fire year per position (the fixed event definition).
 * @param category - activity category per position (0 below, 1 near, 2 above).
 * @param settings - jointMinYears and jointMaxQ of the outlook.
 * @param scratch - reusable buffers from phaseRuleScratch(design); the result lives in scratch.output and is
 *   overwritten by the next call.
 * @param outputs - "all", or "probability" for the permutation tests, which read only `probability`, `basis` and
 *   `cellIndex`: the category counts are then not kept and `categories` and `climatologyCategories` are NaN
 *   (the probabilities and cells are the same in both, which the tests beside it check).
 * @returns the forecasts of every fold.
 */
export function phaseRuleForecasts(
  design: HindcastDesign,
  fire: Uint8Array,
  category: Uint8Array,
  settings: PhaseRuleSettings,
  scratch: PhaseRuleScratch = phaseRuleScratch(design),
  outputs: "all" | "probability" = "all",
): PhaseRuleForecasts {
  const withCategories = outputs === "all";
  const K = design.names.length;
  const n = design.years.length;
  const { baseFire, baseCategory, foldYears, foldFire, pValues, qValues, order, defined, current } = scratch;
  const { phaseCount, phaseOffset, basePhase, baseYears, targetPhase, changeStart, changePosition, changePhase } = design;
  const out = scratch.output;

  // Counts per base phase for this fire record.
  baseFire.fill(0);
  baseCategory.fill(0);
  let fireTotal = 0;
  const categoryTotal = [0, 0, 0];
  for (let position = 0; position < n; position += 1) {
    const burned = fire[position] as number;
    const cat = category[position] as number;
    fireTotal += burned;
    categoryTotal[cat] = (categoryTotal[cat] as number) + 1;
    for (let k = 0; k < K; k += 1) {
      const phase = (basePhase[k] as Int8Array)[position] as number;
      if (phase < 0) continue;
      const slot = (phaseOffset[k] as number) + phase;
      baseFire[slot] = (baseFire[slot] as number) + burned;
      if (withCategories) baseCategory[slot * 3 + cat] = (baseCategory[slot * 3 + cat] as number) + 1;
    }
  }
  if (!withCategories) {
    out.categories.fill(Number.NaN);
    out.climatologyCategories.fill(Number.NaN);
  }
  for (const table of scratch.joint.values()) {
    table.fire.fill(0);
    table.category.fill(0);
  }
  const jointFilled = new Set<number>();
  const jointTable = (a: number, b: number) => {
    const key = a * K + b;
    let table = scratch.joint.get(key);
    if (table === undefined) {
      const width = phaseCount[b] as number;
      const cells = (phaseCount[a] as number) * width;
      table = { years: new Int32Array(cells), fire: new Int32Array(cells), category: new Int32Array(cells * 3), width };
      const phasesA = basePhase[a] as Int8Array;
      const phasesB = basePhase[b] as Int8Array;
      for (let position = 0; position < n; position += 1) {
        const pa = phasesA[position] as number;
        const pb = phasesB[position] as number;
        if (pa >= 0 && pb >= 0) table.years[pa * width + pb] = (table.years[pa * width + pb] as number) + 1;
      }
      scratch.joint.set(key, table);
    }
    if (!jointFilled.has(key)) {
      const phasesA = basePhase[a] as Int8Array;
      const phasesB = basePhase[b] as Int8Array;
      for (let position = 0; position < n; position += 1) {
        const pa = phasesA[position] as number;
        const pb = phasesB[position] as number;
        if (pa < 0 || pb < 0) continue;
        const cell = pa * table.width + pb;
        table.fire[cell] = (table.fire[cell] as number) + (fire[position] as number);
        if (!withCategories) continue;
        const slot = cell * 3 + (category[position] as number);
        table.category[slot] = (table.category[slot] as number) + 1;
      }
      jointFilled.add(key);
    }
    return table;
  };

  const pCache = scratch.pCache;
  if (pCache.size > 100_000) pCache.clear();
  const jointMinYears = settings.jointMinYears;
  const jointMaxQ = settings.jointMaxQ;
  for (let fold = 0; fold < design.folds; fold += 1) {
    const windowStart = design.windowStart[fold] as number;
    const windowEnd = design.windowEnd[fold] as number;
    let leftFire = fireTotal;
    let left0 = categoryTotal[0] as number;
    let left1 = categoryTotal[1] as number;
    let left2 = categoryTotal[2] as number;
    for (let position = windowStart; position < windowEnd; position += 1) {
      leftFire -= fire[position] as number;
      if (!withCategories) continue;
      const cat = category[position] as number;
      if (cat === 0) left0 -= 1;
      else if (cat === 1) left1 -= 1;
      else left2 -= 1;
    }
    const leftYears = n - (windowEnd - windowStart);

    // Per-phase counts of every index in this fold, and the chi-square p of each index's phase table.
    for (let k = 0; k < K; k += 1) {
      const offset = phaseOffset[k] as number;
      const phases = phaseCount[k] as number;
      for (let phase = 0; phase < phases; phase += 1) {
        foldYears[offset + phase] = baseYears[offset + phase] as number;
        foldFire[offset + phase] = baseFire[offset + phase] as number;
      }
      const base = basePhase[k] as Int8Array;
      for (let position = windowStart; position < windowEnd; position += 1) {
        const phase = base[position] as number;
        if (phase < 0) continue;
        foldYears[offset + phase] = (foldYears[offset + phase] as number) - 1;
        foldFire[offset + phase] = (foldFire[offset + phase] as number) - (fire[position] as number);
      }
      const from = changeStart[fold * K + k] as number;
      const to = changeStart[fold * K + k + 1] as number;
      for (let change = from; change < to; change += 1) {
        const position = changePosition[change] as number;
        const was = offset + (base[position] as number);
        const now = offset + (changePhase[change] as number);
        const burned = fire[position] as number;
        foldYears[was] = (foldYears[was] as number) - 1;
        foldFire[was] = (foldFire[was] as number) - burned;
        foldYears[now] = (foldYears[now] as number) + 1;
        foldFire[now] = (foldFire[now] as number) + burned;
      }
      pValues[k] = cachedPValue(foldYears, foldFire, offset, phases, pCache);
    }
    benjaminiHochbergInPlace(pValues, qValues, defined, K);
    // Ranking: p ascending (NaN last), ties by index name.
    for (let k = 0; k < K; k += 1) order[k] = k;
    for (let i = 1; i < K; i += 1) {
      const held = order[i] as number;
      let j = i - 1;
      while (j >= 0 && rankedAfter(order[j] as number, held, pValues, design.nameRank)) {
        order[j + 1] = order[j] as number;
        j -= 1;
      }
      order[j + 1] = held;
    }
    let first = -1;
    let second = -1;
    for (let r = 0; r < K && second < 0; r += 1) {
      const k = order[r] as number;
      if (!design.used[k] || (targetPhase[fold * K + k] as number) < 0) continue;
      if (first < 0) first = k;
      else second = k;
    }
    let cellIndex = -1;
    let chosenYears = -1;
    let chosenFire = 0;
    let c0 = 0;
    let c1 = 0;
    let c2 = 0;
    let basis = 2;
    if (first >= 0 && second >= 0 && isClear(qValues[first] as number, jointMaxQ) && isClear(qValues[second] as number, jointMaxQ)) {
      // Joint cell of (first, second) at the held-out year's phases, from the base joint table of the pair.
      const a = first < second ? first : second;
      const b = first < second ? second : first;
      const table = jointTable(a, b);
      const phaseA = targetPhase[fold * K + a] as number;
      const phaseB = targetPhase[fold * K + b] as number;
      const cell = phaseA * table.width + phaseB;
      let years = table.years[cell] as number;
      let burned = table.fire[cell] as number;
      let k0 = table.category[cell * 3] as number;
      let k1 = table.category[cell * 3 + 1] as number;
      let k2 = table.category[cell * 3 + 2] as number;
      const baseA = basePhase[a] as Int8Array;
      const baseB = basePhase[b] as Int8Array;
      for (let position = windowStart; position < windowEnd; position += 1) {
        if (baseA[position] !== phaseA || baseB[position] !== phaseB) continue;
        years -= 1;
        burned -= fire[position] as number;
        if (!withCategories) continue;
        const cat = category[position] as number;
        if (cat === 0) k0 -= 1;
        else if (cat === 1) k1 -= 1;
        else k2 -= 1;
      }
      const currentA = current[a] as Int8Array;
      const currentB = current[b] as Int8Array;
      const fromA = changeStart[fold * K + a] as number;
      const toA = changeStart[fold * K + a + 1] as number;
      const fromB = changeStart[fold * K + b] as number;
      const toB = changeStart[fold * K + b + 1] as number;
      if (toA > fromA || toB > fromB) {
        for (let change = fromA; change < toA; change += 1) currentA[changePosition[change] as number] = changePhase[change] as number;
        for (let change = fromB; change < toB; change += 1) currentB[changePosition[change] as number] = changePhase[change] as number;
        // A year whose phase moved in either index leaves the cell by its base phases and enters it by its fold
        // phases; a change of b that is also a change of a is counted once, with a's changes.
        for (let pass = 0; pass < 2; pass += 1) {
          const from = pass === 0 ? fromA : fromB;
          const to = pass === 0 ? toA : toB;
          for (let change = from; change < to; change += 1) {
            const position = changePosition[change] as number;
            if (pass === 1 && currentA[position] !== baseA[position]) continue;
            const was = baseA[position] === phaseA && baseB[position] === phaseB;
            const now = currentA[position] === phaseA && currentB[position] === phaseB;
            if (was === now) continue;
            const sign = now ? 1 : -1;
            years += sign;
            burned += sign * (fire[position] as number);
            if (!withCategories) continue;
            const cat = category[position] as number;
            if (cat === 0) k0 += sign;
            else if (cat === 1) k1 += sign;
            else k2 += sign;
          }
        }
        for (let change = fromA; change < toA; change += 1) {
          const position = changePosition[change] as number;
          currentA[position] = baseA[position] as number;
        }
        for (let change = fromB; change < toB; change += 1) {
          const position = changePosition[change] as number;
          currentB[position] = baseB[position] as number;
        }
      }
      if (years >= jointMinYears) {
        chosenYears = years;
        chosenFire = burned;
        c0 = k0;
        c1 = k1;
        c2 = k2;
        basis = 0;
        cellIndex = first;
      }
    }
    if (chosenYears < 0) {
      for (let r = 0; r < K; r += 1) {
        const k = order[r] as number;
        const phase = targetPhase[fold * K + k] as number;
        if (!design.used[k] || phase < 0) continue;
        const slot = (phaseOffset[k] as number) + phase;
        const years = foldYears[slot] as number;
        if (years <= 0) continue;
        // Category counts of this single cell: base − left-out years + changes.
        let k0 = baseCategory[slot * 3] as number;
        let k1 = baseCategory[slot * 3 + 1] as number;
        let k2 = baseCategory[slot * 3 + 2] as number;
        if (withCategories) {
          const base = basePhase[k] as Int8Array;
          for (let position = windowStart; position < windowEnd; position += 1) {
            if (base[position] !== phase) continue;
            const cat = category[position] as number;
            if (cat === 0) k0 -= 1;
            else if (cat === 1) k1 -= 1;
            else k2 -= 1;
          }
          const from = changeStart[fold * K + k] as number;
          const to = changeStart[fold * K + k + 1] as number;
          for (let change = from; change < to; change += 1) {
            const position = changePosition[change] as number;
            const sign = base[position] === phase ? -1 : changePhase[change] === phase ? 1 : 0;
            if (sign === 0) continue;
            const cat = category[position] as number;
            if (cat === 0) k0 += sign;
            else if (cat === 1) k1 += sign;
            else k2 += sign;
          }
        }
        chosenYears = years;
        chosenFire = foldFire[slot] as number;
        c0 = k0;
        c1 = k1;
        c2 = k2;
        basis = 1;
        cellIndex = k;
        break;
      }
    }
    if (chosenYears < 0) {
      chosenYears = leftYears;
      chosenFire = leftFire;
      c0 = left0;
      c1 = left1;
      c2 = left2;
    }
    out.basis[fold] = basis;
    out.cellIndex[fold] = cellIndex;
    out.probability[fold] = chosenFire / chosenYears;
    out.climatology[fold] = leftFire / leftYears;
    if (!withCategories) continue;
    out.categories[fold * 3] = c0 / chosenYears;
    out.categories[fold * 3 + 1] = c1 / chosenYears;
    out.categories[fold * 3 + 2] = c2 / chosenYears;
    out.climatologyCategories[fold * 3] = left0 / leftYears;
    out.climatologyCategories[fold * 3 + 1] = left1 / leftYears;
    out.climatologyCategories[fold * 3 + 2] = left2 / leftYears;
  }
  return out;
}

/**
 * The chi-square p of a phase table (phaseTableChiSquare): with 2 degrees of freedom (three phases, the usual
 * case) the closed form in chiSquareUpperTail; with 1, looked up by its statistic (folds share most of their
 * tables, and the same X² always gives the same p, so each is computed once); above 2, computed.
 */
const degrees = new Int32Array(1);

function cachedPValue(years: Int32Array, fireYears: Int32Array, offset: number, phases: number, cache: Map<number, number>): number {
  const chiSquare = phaseTableChiSquareStatistic(years, fireYears, offset, phases, degrees);
  const df = degrees[0] as number;
  if (df === 0) return Number.NaN;
  if (df >= 2) return chiSquareUpperTail(chiSquare, df);
  const key = chiSquare; // df 1 only
  const hit = cache.get(key);
  if (hit !== undefined) return hit;
  const pValue = chiSquareUpperTail(chiSquare, df);
  cache.set(key, pValue);
  return pValue;
}

function isClear(q: number, maxQ: number): boolean {
  return Number.isFinite(q) && q <= maxQ;
}

/** True when index a ranks after index b (p ascending with NaN last, then name). */
function rankedAfter(a: number, b: number, pValues: Float64Array, nameRank: Int32Array): boolean {
  const pa = Number.isNaN(pValues[a] as number) ? Infinity : (pValues[a] as number);
  const pb = Number.isNaN(pValues[b] as number) ? Infinity : (pValues[b] as number);
  if (pa !== pb) return pa > pb;
  return (nameRank[a] as number) > (nameRank[b] as number);
}

/**
 * Benjamini–Hochberg q-values of the first `count` p-values, written into `q` — the same arithmetic and
 * order as benjaminiHochberg (sorted by p, ties by position; q(i) = min over j ≥ i of p(j)·(m/j)), without
 * allocating.
 */
function benjaminiHochbergInPlace(p: Float64Array, q: Float64Array, sorted: Int32Array, count: number): void {
  let m = 0;
  for (let k = 0; k < count; k += 1) {
    q[k] = Number.NaN;
    if (Number.isNaN(p[k] as number)) continue;
    let j = m - 1;
    while (j >= 0 && (p[sorted[j] as number] as number) > (p[k] as number)) {
      sorted[j + 1] = sorted[j] as number;
      j -= 1;
    }
    sorted[j + 1] = k;
    m += 1;
  }
  let running = 1;
  for (let rank = m; rank >= 1; rank -= 1) {
    const k = sorted[rank - 1] as number;
    running = Math.min(running, (p[k] as number) * (m / rank));
    q[k] = running;
  }
}
