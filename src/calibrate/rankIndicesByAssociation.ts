import { benjaminiHochberg } from "../stats/benjaminiHochberg.js";
import { chiSquareUpperTail } from "../stats/chiSquareIndependence.js";
import { phaseCounts, type TrainingSet } from "./buildTrainingSet.js";

export interface AssociationRank {
  readonly index: string;
  readonly chiSquare: number;
  readonly pValue: number;
  /** Benjamini–Hochberg q-value across the ranked indices; NaN when the p-value is. */
  readonly qValue: number;
}

/**
 * Orders indices by the strength of their association with fire years: the Pearson chi-square
 * p-value of the phase × fire-year table, smallest first (ties and NaN p-values last, then by name),
 * so "the strongest calibrated association" has one stated meaning in the outlook and the hindcast.
 * The q-values are Benjamini–Hochberg over the p-values of every index given.
 */
export function rankIndicesByAssociation(training: TrainingSet, indices: readonly string[]): AssociationRank[] {
  const tests = indices.map((index) => {
    const counts = phaseCounts(training, index);
    const test = phaseTableChiSquare(
      counts.map((cell) => cell.years.length),
      counts.map((cell) => cell.fireYears),
      0,
      counts.length,
    );
    return { index, chiSquare: test.chiSquare, pValue: test.pValue };
  });
  const qValues = benjaminiHochberg(tests.map((test) => test.pValue));
  const ranks = tests.map((test, i) => ({ ...test, qValue: qValues[i] ?? Number.NaN }));
  return ranks.sort((a, b) => {
    const pa = Number.isNaN(a.pValue) ? Infinity : a.pValue;
    const pb = Number.isNaN(b.pValue) ? Infinity : b.pValue;
    if (pa !== pb) return pa - pb;
    return a.index < b.index ? -1 : a.index > b.index ? 1 : 0;
  });
}

/**
 * Pearson chi-square test of independence of a phase × (fire year, other year) table, from the years and fire
 * years per phase, without building the table: the arithmetic and order of operations of
 * chiSquareIndependence on the rows [fireYears, years − fireYears] (empty phases and an empty column dropped;
 * X² summed row by row; p the chi-square upper tail with (kept phases − 1) degrees of freedom), so the same
 * counts give bit-for-bit the same p. The ranking and the hindcast (which calls it in every fold) share it.
 *
 * @param years - years per phase, read at offset … offset + phases − 1 (integers ≥ 0).
 * @param fireYears - fire years per phase, same layout (0 … years).
 * @param offset - first phase's position in the two arrays.
 * @param phases - number of phases.
 * @returns chiSquare, df and pValue; NaN chiSquare and pValue (df 0) when fewer than two phases have years or
 *   every year (or none) is a fire year.
 * @see Pearson K. (1900) Philosophical Magazine, Series 5, 50(302):157–175 (the test).
 */
export function phaseTableChiSquare(
  years: ArrayLike<number>,
  fireYears: ArrayLike<number>,
  offset: number,
  phases: number,
): { chiSquare: number; df: number; pValue: number } {
  const degrees = new Int32Array(1);
  const chiSquare = phaseTableChiSquareStatistic(years, fireYears, offset, phases, degrees);
  const df = degrees[0] as number;
  return { chiSquare, df, pValue: df === 0 ? Number.NaN : chiSquareUpperTail(chiSquare, df) };
}

/**
 * The statistic of {@link phaseTableChiSquare} without the p-value and without allocating (for the hindcast's
 * folds): returns X² and writes the degrees of freedom into `df[0]` (0, with X² NaN, when undefined).
 */
export function phaseTableChiSquareStatistic(
  years: ArrayLike<number>,
  fireYears: ArrayLike<number>,
  offset: number,
  phases: number,
  df: Int32Array,
): number {
  let fireTotal = 0;
  let otherTotal = 0;
  let grandTotal = 0;
  let keptRows = 0;
  for (let phase = 0; phase < phases; phase += 1) {
    const total = years[offset + phase] as number;
    const burned = fireYears[offset + phase] as number;
    fireTotal += burned;
    otherTotal += total - burned;
    grandTotal += burned + (total - burned);
    if (total > 0) keptRows += 1;
  }
  if (keptRows < 2 || fireTotal === 0 || otherTotal === 0) {
    df[0] = 0;
    return Number.NaN;
  }
  let chiSquare = 0;
  for (let phase = 0; phase < phases; phase += 1) {
    const burned = fireYears[offset + phase] as number;
    const other = (years[offset + phase] as number) - burned;
    const rowTotal = burned + other;
    if (rowTotal === 0) continue;
    const expectedFire = (rowTotal * fireTotal) / grandTotal;
    const differenceFire = burned - expectedFire;
    chiSquare += (differenceFire * differenceFire) / expectedFire;
    const expectedOther = (rowTotal * otherTotal) / grandTotal;
    const differenceOther = other - expectedOther;
    chiSquare += (differenceOther * differenceOther) / expectedOther;
  }
  df[0] = keptRows - 1;
  return chiSquare;
}
