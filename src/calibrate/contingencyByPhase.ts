import { chiSquareIndependence } from "../stats/chiSquareIndependence.js";
import { fisherExactTest } from "../stats/fisherExactTest.js";
import { oddsRatioWoolf } from "../stats/oddsRatioWoolf.js";
import type { PhaseCount } from "./buildTrainingSet.js";
import type { ContingencyResult, PerPhaseTest } from "./types.js";

/**
 * Contingency of fire years by phase: Pearson's chi-square test of independence on the
 * phase × (fire year, other year) table (Pearson K. 1900, Phil. Mag. 50:157–175), Agresti's
 * adjusted standardized residual of each phase's fire-year cell (Agresti A. 2007, An Introduction
 * to Categorical Data Analysis, 2nd ed., §2.4.5), and for each phase against all the others a
 * two-sided Fisher exact test (Fisher R.A. 1935, The Design of Experiments) and the odds ratio with
 * Woolf's log interval (Woolf B. 1955, "On estimating the relation between blood group and
 * disease", Ann. Hum. Genet. 19:251–253), +0.5 to every cell when one is zero.
 * The q-value across indices is filled in by the caller.
 */
export function contingencyByPhase(labels: readonly string[], counts: readonly PhaseCount[]): ContingencyResult {
  const table = counts.map((cell) => [cell.fireYears, cell.years.length - cell.fireYears]);
  const totalFire = table.reduce((sum, row) => sum + (row[0] ?? 0), 0);
  const total = table.reduce((sum, row) => sum + (row[0] ?? 0) + (row[1] ?? 0), 0);
  const test = chiSquareIndependence(table);
  const dropped = new Set(test.droppedRows);
  let residualRow = 0;
  const perPhase: PerPhaseTest[] = counts.map((cell, phase) => {
    const label = labels[phase] ?? String(phase);
    const n = cell.years.length;
    const k = cell.fireYears;
    const restFire = totalFire - k;
    const restOther = total - n - restFire;
    const residual = dropped.has(phase) || test.droppedColumns.length > 0 ? null : finite(test.adjustedResiduals[residualRow++]?.[0]);
    if (n === 0 || n === total) {
      return { label, fisherPValue: null, residual, oddsRatio: { estimate: null, lower: null, upper: null, haldaneCorrected: false } };
    }
    const twoByTwo = [
      [k, n - k],
      [restFire, restOther],
    ] as const;
    const fisher = fisherExactTest(twoByTwo);
    const odds = oddsRatioWoolf(twoByTwo);
    return {
      label,
      fisherPValue: finite(fisher.pTwoSided),
      residual,
      oddsRatio: { estimate: finite(odds.oddsRatio), lower: finite(odds.lower), upper: finite(odds.upper), haldaneCorrected: odds.haldaneCorrected },
    };
  });
  const expectedCells = test.expected.flat();
  const smallExpectedShare = expectedCells.length === 0 ? 0 : expectedCells.filter((value) => value < 5).length / expectedCells.length;
  const result: ContingencyResult = {
    chiSquare: finite(test.chiSquare),
    df: test.df,
    pValue: finite(test.pValue),
    qValue: null,
    smallExpectedShare,
    perPhase,
  };
  return result.pValue === null ? { ...result, reason: "fewer than two phases, or no fire years or no other years, among the calibration years" } : result;
}

function finite(value: number | undefined): number | null {
  return value !== undefined && Number.isFinite(value) ? value : null;
}
