import { benjaminiHochberg } from "../stats/benjaminiHochberg.js";
import { chiSquareIndependence } from "../stats/chiSquareIndependence.js";
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
 */
export function rankIndicesByAssociation(training: TrainingSet, indices: readonly string[]): AssociationRank[] {
  const tests = indices.map((index) => {
    const table = phaseCounts(training, index).map((cell) => [cell.fireYears, cell.years.length - cell.fireYears]);
    const test = chiSquareIndependence(table);
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
