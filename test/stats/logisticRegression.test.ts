import { describe, expect, it } from "vitest";
import fc from "fast-check";
import jStat from "jstat";
import { logisticRegression } from "../../src/stats/logisticRegression.js";
import { StatsInputError } from "../../src/stats/StatsInputError.js";
import {
  emptyCellTable,
  endometrialSeparation,
  shuttleOringAnyDistress,
  shuttleOringMinitab,
} from "../fixtures/published/logisticRegressionExamples.js";

// ---------------------------------------------------------------------------------------------------------------
// Independent implementations, written here from textbook formulas and sharing no code with src/stats.
// ---------------------------------------------------------------------------------------------------------------

/** Gauss–Jordan inverse with partial pivoting. */
function inverseOf(matrix: number[][]): number[][] {
  const size = matrix.length;
  const work = matrix.map((row, r) => [...row, ...Array.from({ length: size }, (_, c) => (r === c ? 1 : 0))]);
  for (let column = 0; column < size; column += 1) {
    let pivot = column;
    for (let r = column + 1; r < size; r += 1) {
      if (Math.abs(work[r]![column]!) > Math.abs(work[pivot]![column]!)) pivot = r;
    }
    [work[column], work[pivot]] = [work[pivot]!, work[column]!];
    const pivotValue = work[column]![column]!;
    work[column] = work[column]!.map((value) => value / pivotValue);
    for (let r = 0; r < size; r += 1) {
      if (r === column) continue;
      const factor = work[r]![column]!;
      work[r] = work[r]!.map((value, c) => value - factor * work[column]![c]!);
    }
  }
  return work.map((row) => row.slice(size));
}

function determinantOf(matrix: number[][]): number {
  const size = matrix.length;
  const work = matrix.map((row) => [...row]);
  let determinant = 1;
  for (let column = 0; column < size; column += 1) {
    let pivot = column;
    for (let r = column + 1; r < size; r += 1) {
      if (Math.abs(work[r]![column]!) > Math.abs(work[pivot]![column]!)) pivot = r;
    }
    if (pivot !== column) {
      [work[column], work[pivot]] = [work[pivot]!, work[column]!];
      determinant = -determinant;
    }
    determinant *= work[column]![column]!;
    for (let r = column + 1; r < size; r += 1) {
      const factor = work[r]![column]! / work[column]![column]!;
      work[r] = work[r]!.map((value, c) => value - factor * work[column]![c]!);
    }
  }
  return determinant;
}

const logistic = (eta: number): number => 1 / (1 + Math.exp(-eta));

/**
 * Iteratively reweighted least squares as printed in McCullagh P., Nelder J.A. (1989) Generalized Linear Models,
 * 2nd ed., Chapman & Hall, §2.5: working response z = η + (y − μ)/w, w = μ(1 − μ), β ← (XᵀWX)⁻¹XᵀWz; run a fixed
 * 200 sweeps (no convergence test) so it shares nothing with the implementation under test.
 */
function textbookIrls(rows: readonly (readonly number[])[], outcomes: readonly boolean[]) {
  const design = rows.map((row) => [1, ...row]);
  const width = design[0]!.length;
  let beta = Array.from({ length: width }, () => 0);
  let information: number[][] = [];
  for (let sweep = 0; sweep < 200; sweep += 1) {
    information = Array.from({ length: width }, () => Array.from({ length: width }, () => 0));
    const right = Array.from({ length: width }, () => 0);
    design.forEach((x, i) => {
      const eta = x.reduce((sum, value, k) => sum + value * beta[k]!, 0);
      const mu = logistic(eta);
      const w = mu * (1 - mu);
      const z = eta + ((outcomes[i] ? 1 : 0) - mu) / w;
      for (let r = 0; r < width; r += 1) {
        right[r]! += w * x[r]! * z;
        for (let c = 0; c < width; c += 1) information[r]![c]! += w * x[r]! * x[c]!;
      }
    });
    const inverse = inverseOf(information);
    beta = inverse.map((row) => row.reduce((sum, value, c) => sum + value * right[c]!, 0));
  }
  const covariance = inverseOf(information);
  return { beta, standardErrors: covariance.map((row, index) => Math.sqrt(row[index]!)) };
}

/** Penalized log-likelihood ℓ(β) + ½ ln det(XᵀWX) written out directly (Firth 1993, eq. for the Jeffreys prior). */
function firthObjective(rows: readonly (readonly number[])[], outcomes: readonly boolean[], beta: readonly number[]): number {
  const design = rows.map((row) => [1, ...row]);
  const width = design[0]!.length;
  const information = Array.from({ length: width }, () => Array.from({ length: width }, () => 0));
  let logLikelihood = 0;
  design.forEach((x, i) => {
    const eta = x.reduce((sum, value, k) => sum + value * beta[k]!, 0);
    const mu = logistic(eta);
    logLikelihood += outcomes[i] ? Math.log(mu) : Math.log(1 - mu);
    for (let r = 0; r < width; r += 1) for (let c = 0; c < width; c += 1) information[r]![c]! += mu * (1 - mu) * x[r]! * x[c]!;
  });
  return logLikelihood + 0.5 * Math.log(determinantOf(information));
}

/** Nelder–Mead simplex maximization (Nelder J.A., Mead R. (1965) Computer Journal 7:308–313), standard coefficients. */
function nelderMeadMaximize(objective: (point: number[]) => number, start: number[], scale = 1, sweeps = 4000): number[] {
  const dimension = start.length;
  let simplex = [start, ...start.map((_, k) => start.map((value, j) => (j === k ? value + scale : value)))];
  let values = simplex.map((point) => -objective(point));
  for (let sweep = 0; sweep < sweeps; sweep += 1) {
    const order = values.map((_, index) => index).sort((left, right) => values[left]! - values[right]!);
    simplex = order.map((index) => simplex[index]!);
    values = order.map((index) => values[index]!);
    const centroid = Array.from({ length: dimension }, (_, j) => simplex.slice(0, dimension).reduce((sum, point) => sum + point[j]!, 0) / dimension);
    const worst = simplex[dimension]!;
    const along = (factor: number) => centroid.map((value, j) => value + factor * (worst[j]! - value));
    const reflected = along(-1);
    const reflectedValue = -objective(reflected);
    if (reflectedValue < values[0]!) {
      const expanded = along(-2);
      const expandedValue = -objective(expanded);
      [simplex[dimension], values[dimension]] = expandedValue < reflectedValue ? [expanded, expandedValue] : [reflected, reflectedValue];
    } else if (reflectedValue < values[dimension - 1]!) {
      [simplex[dimension], values[dimension]] = [reflected, reflectedValue];
    } else {
      const contracted = along(0.5);
      const contractedValue = -objective(contracted);
      if (contractedValue < values[dimension]!) {
        [simplex[dimension], values[dimension]] = [contracted, contractedValue];
      } else {
        simplex = simplex.map((point) => point.map((value, j) => simplex[0]![j]! + 0.5 * (value - simplex[0]![j]!)));
        values = simplex.map((point) => -objective(point));
      }
    }
  }
  return simplex[values.indexOf(Math.min(...values))]!;
}

function expandCells(cells: readonly (readonly [number, boolean, number])[]) {
  const rows: number[][] = [];
  const outcomes: boolean[] = [];
  cells.forEach(([value, outcome, count]) => {
    for (let k = 0; k < count; k += 1) {
      rows.push([value]);
      outcomes.push(outcome);
    }
  });
  return { rows, outcomes };
}

const oringRows = shuttleOringAnyDistress.temperature.map((t) => [t]);
const oringOutcomes = shuttleOringAnyDistress.damaged.map((count) => count > 0);

// ---------------------------------------------------------------------------------------------------------------

describe("logisticRegression(predictors, outcomes) — published worked examples", () => {
  // Dalal, Fowlkes & Hoadley (1989) JASA 84:945–957 data; Agresti (2007) An Introduction to Categorical Data
  // Analysis, 2nd ed., Table 5.10. R glm output (V): 15.0429 (7.3786), −0.2322 (0.1082); Agresti's 15.04 − 0.232x
  // with SE 7.38 and 0.108 is from memory (M).
  it("23 launches, any O-ring distress on temperature → logit = 15.0429 − 0.2322·t (SE 7.3786, 0.1082)", () => {
    const fit = logisticRegression(oringRows, oringOutcomes);
    expect(fit.method).toBe("maximum likelihood");
    expect(fit.separation).toBe(false);
    expect(fit.converged).toBe(true);
    expect(fit.coefficients[0]).toBeCloseTo(shuttleOringAnyDistress.printed.coefficients[0], 4);
    expect(fit.coefficients[1]).toBeCloseTo(shuttleOringAnyDistress.printed.coefficients[1], 4);
    expect(fit.standardErrors[0]).toBeCloseTo(shuttleOringAnyDistress.printed.standardErrors[0], 4);
    expect(fit.standardErrors[1]).toBeCloseTo(shuttleOringAnyDistress.printed.standardErrors[1], 4);
    // z values as printed by R
    expect(fit.coefficients[0]! / fit.standardErrors[0]!).toBeCloseTo(shuttleOringAnyDistress.printed.zValues[0], 3);
    expect(fit.coefficients[1]! / fit.standardErrors[1]!).toBeCloseTo(shuttleOringAnyDistress.printed.zValues[1], 3);
    // Agresti (2007), from memory (M): 15.04 − 0.232x, SE 7.38 and 0.108
    expect(fit.coefficients[0]).toBeCloseTo(shuttleOringAnyDistress.fromMemory.coefficients[0], 2);
    expect(fit.coefficients[1]).toBeCloseTo(shuttleOringAnyDistress.fromMemory.coefficients[1], 3);
    expect(fit.standardErrors[0]).toBeCloseTo(shuttleOringAnyDistress.fromMemory.standardErrors[0], 2);
    expect(fit.standardErrors[1]).toBeCloseTo(shuttleOringAnyDistress.fromMemory.standardErrors[1], 3);
    // Deviances 28.267 and 20.315 (M)
    expect(-2 * fit.logLikelihood).toBeCloseTo(shuttleOringAnyDistress.fromMemory.residualDeviance, 3);
    expect(-2 * fit.nullLogLikelihood).toBeCloseTo(shuttleOringAnyDistress.fromMemory.nullDeviance, 3);
    // Full-precision regression values (C)
    expect(fit.coefficients[0]).toBeCloseTo(shuttleOringAnyDistress.fullPrecision.coefficients[0], 6);
    expect(fit.coefficients[1]).toBeCloseTo(shuttleOringAnyDistress.fullPrecision.coefficients[1], 7);
    expect(fit.standardErrors[0]).toBeCloseTo(shuttleOringAnyDistress.fullPrecision.standardErrors[0], 7);
    expect(fit.standardErrors[1]).toBeCloseTo(shuttleOringAnyDistress.fullPrecision.standardErrors[1], 8);
  });

  // Montgomery D.C., Runger G.C. (2003) Applied Statistics and Probability for Engineers, 3rd ed., Wiley,
  // supplement S11, Minitab output (V): Constant 10.875 (5.703), Temperature −0.17132 (0.08344),
  // log-likelihood −11.515, G = 5.944, DF 1, P 0.015, odds ratio 0.84 (0.72–0.99).
  it("24 launches (Minitab) → 10.875 − 0.17132·t, ℓ = −11.515, G = 5.944, p = 0.015", () => {
    const fit = logisticRegression(
      shuttleOringMinitab.temperature.map((t) => [t]),
      shuttleOringMinitab.failure.map((value) => value === 1),
    );
    const printed = shuttleOringMinitab.printed;
    expect(fit.method).toBe("maximum likelihood");
    expect(fit.coefficients[0]).toBeCloseTo(printed.coefficients[0], 3);
    expect(fit.coefficients[1]).toBeCloseTo(printed.coefficients[1], 5);
    expect(fit.standardErrors[0]).toBeCloseTo(printed.standardErrors[0], 3);
    expect(fit.standardErrors[1]).toBeCloseTo(printed.standardErrors[1], 5);
    expect(fit.logLikelihood).toBeCloseTo(printed.logLikelihood, 3);
    expect(fit.likelihoodRatio).toBeCloseTo(printed.likelihoodRatio, 3);
    expect(fit.pValue).toBeCloseTo(printed.pValue, 3);
    const z = jStat.normal.inv(0.975, 0, 1);
    expect(Math.exp(fit.coefficients[1]!)).toBeCloseTo(printed.oddsRatio, 2);
    expect(Math.exp(fit.coefficients[1]! - z * fit.standardErrors[1]!)).toBeCloseTo(printed.oddsRatioInterval[0], 2);
    expect(Math.exp(fit.coefficients[1]! + z * fit.standardErrors[1]!)).toBeCloseTo(printed.oddsRatioInterval[1], 2);
  });

  // Kleinman & Horton, "SAS and R" Example 8.15 (2010): 2 × 2 table with an empty cell; SAS maximum likelihood
  // stops at 19.7 (SE 1349) (V). Firth with one binary predictor = log odds ratio with ½ added to every cell (M).
  it("2 × 2 table with an empty cell (20/0, 20/200) → separation, Firth slope ln 401 = 5.99396", () => {
    const { rows, outcomes } = expandCells(emptyCellTable.cells);
    const fit = logisticRegression(rows, outcomes);
    expect(fit.separation).toBe(true);
    expect(fit.method).toBe("Firth penalized likelihood");
    expect(fit.converged).toBe(true);
    expect(fit.coefficients[0]).toBeCloseTo(emptyCellTable.firthFromHaldaneIdentity.intercept, 8);
    expect(fit.coefficients[1]).toBeCloseTo(emptyCellTable.firthFromHaldaneIdentity.slope, 8);
    // The maximum-likelihood estimate SAS printed is far larger: the data carry no finite ML slope.
    expect(fit.coefficients[1]!).toBeLessThan(emptyCellTable.maximumLikelihoodPrinted.slope);
  });

  // Heinze & Schemper (2002) endometrial data (Agresti 2015 data file, V); Firth estimates (SE) as printed in
  // Rigon & Aliverti (2023) Table 1 from R brglm2 (V): 3.775 (1.489), 2.929 (1.551), −0.035 (0.04), −2.604 (0.776).
  it("endometrial study, HG on [NV, PI, EH] → separation on NV; Firth 3.775, 2.929, −0.035, −2.604", () => {
    const rows = endometrialSeparation.predictors.map((row) => [...row]);
    const outcomes = endometrialSeparation.highGrade.map((value) => value === 1);
    const fit = logisticRegression(rows, outcomes);
    expect(fit.separation).toBe(true);
    expect(fit.method).toBe("Firth penalized likelihood");
    expect(fit.converged).toBe(true);
    const printed = endometrialSeparation.firthPrinted;
    expect(fit.coefficients[0]).toBeCloseTo(printed.coefficients[0], 3);
    expect(fit.coefficients[1]).toBeCloseTo(printed.coefficients[1], 3);
    expect(fit.coefficients[2]).toBeCloseTo(printed.coefficients[2], 3);
    expect(fit.coefficients[3]).toBeCloseTo(printed.coefficients[3], 3);
    expect(fit.standardErrors[0]).toBeCloseTo(printed.standardErrors[0], 3);
    expect(fit.standardErrors[1]).toBeCloseTo(printed.standardErrors[1], 3);
    expect(fit.standardErrors[2]).toBeCloseTo(printed.standardErrors[2], 2);
    expect(fit.standardErrors[3]).toBeCloseTo(printed.standardErrors[3], 3);
  });

  it("endometrial study without Firth: the divergent ML fit's other coefficients approach the printed 4.305, −0.042, −2.903", () => {
    // Maximum likelihood only exists in the limit NV → ∞; the NV = 0 cases alone give the same finite coefficients.
    const keep = endometrialSeparation.predictors.map(([nv]) => nv === 0);
    const rows = endometrialSeparation.predictors.filter((_, i) => keep[i]).map(([, pi, eh]) => [pi, eh]);
    const outcomes = endometrialSeparation.highGrade.filter((_, i) => keep[i]).map((value) => value === 1);
    const fit = logisticRegression(rows, outcomes);
    const printed = endometrialSeparation.maximumLikelihoodWithoutNeovasculization;
    expect(fit.method).toBe("maximum likelihood");
    expect(fit.coefficients[0]).toBeCloseTo(printed.coefficients[0], 3);
    expect(fit.coefficients[1]).toBeCloseTo(printed.coefficients[1], 3);
    expect(fit.coefficients[2]).toBeCloseTo(printed.coefficients[2], 3);
    expect(fit.standardErrors[0]).toBeCloseTo(printed.standardErrors[0], 3);
    expect(fit.standardErrors[1]).toBeCloseTo(printed.standardErrors[1], 3);
    expect(fit.standardErrors[2]).toBeCloseTo(printed.standardErrors[2], 3);
  });
});

describe("logisticRegression — against independent computations in the test", () => {
  it("matches a textbook IRLS (McCullagh & Nelder §2.5) on the O-ring data to 1e-8", () => {
    const fit = logisticRegression(oringRows, oringOutcomes);
    const reference = textbookIrls(oringRows, oringOutcomes);
    fit.coefficients.forEach((value, index) => expect(Math.abs(value - reference.beta[index]!)).toBeLessThan(1e-8));
    fit.standardErrors.forEach((value, index) => expect(Math.abs(value - reference.standardErrors[index]!)).toBeLessThan(1e-8));
  });

  it("p-value equals 1 − jStat.chisquare.cdf(LR, df) and LR = 2(ℓ̂ − ℓ̂₀) with ℓ̂₀ = n₁ ln ȳ + n₀ ln(1 − ȳ)", () => {
    const fit = logisticRegression(oringRows, oringOutcomes);
    const events = oringOutcomes.filter(Boolean).length;
    const n = oringOutcomes.length;
    const nullLogLikelihood = events * Math.log(events / n) + (n - events) * Math.log(1 - events / n);
    expect(fit.nullLogLikelihood).toBeCloseTo(nullLogLikelihood, 12);
    expect(fit.likelihoodRatio).toBeCloseTo(2 * (fit.logLikelihood - nullLogLikelihood), 12);
    expect(fit.pValue).toBeCloseTo(1 - jStat.chisquare.cdf(fit.likelihoodRatio, 1), 12);
  });

  it("quadratic term [t, t²] on the O-ring data matches the textbook IRLS and p uses df = 2", () => {
    const centred = shuttleOringAnyDistress.temperature.map((t) => (t - 70) / 10);
    const rows = centred.map((x) => [x, x * x]);
    const fit = logisticRegression(rows, oringOutcomes);
    const reference = textbookIrls(rows, oringOutcomes);
    expect(fit.method).toBe("maximum likelihood");
    fit.coefficients.forEach((value, index) => expect(Math.abs(value - reference.beta[index]!)).toBeLessThan(1e-8));
    fit.standardErrors.forEach((value, index) => expect(Math.abs(value - reference.standardErrors[index]!)).toBeLessThan(1e-8));
    expect(fit.pValue).toBeCloseTo(1 - jStat.chisquare.cdf(fit.likelihoodRatio, 2), 12);
  });

  it("Firth fit under complete separation maximizes ℓ + ½ ln det(XᵀWX) (Nelder–Mead in the test) and its penalized LR p matches jstat", () => {
    const rows = [[-2], [-1.5], [-1], [-0.5], [0], [0.5], [1], [1.5], [2], [2.5]];
    const outcomes = rows.map(([x]) => x! > 0);
    const fit = logisticRegression(rows, outcomes);
    expect(fit.separation).toBe(true);
    expect(fit.method).toBe("Firth penalized likelihood");
    expect(fit.converged).toBe(true);
    const optimum = nelderMeadMaximize((beta) => firthObjective(rows, outcomes, beta), [0, 0]);
    expect(Math.abs(fit.coefficients[0]! - optimum[0]!)).toBeLessThan(1e-6);
    expect(Math.abs(fit.coefficients[1]! - optimum[1]!)).toBeLessThan(1e-6);
    expect(fit.logLikelihood).toBeCloseTo(firthObjective(rows, outcomes, fit.coefficients), 10);
    // Heinze & Schemper (2002): the null fit maximizes the same penalized likelihood with the slope held at 0.
    const nullOptimum = nelderMeadMaximize(([intercept]) => firthObjective(rows, outcomes, [intercept!, 0]), [0]);
    expect(fit.nullLogLikelihood).toBeCloseTo(firthObjective(rows, outcomes, [nullOptimum[0]!, 0]), 8);
    expect(fit.pValue).toBeCloseTo(1 - jStat.chisquare.cdf(fit.likelihoodRatio, 1), 10);
    expect(fit.pValue).toBeLessThan(0.05);
  });

  it("Firth with two predictors under separation agrees with Nelder–Mead on the penalized likelihood", () => {
    const rows = [[-2], [-1], [-0.5], [0.2], [0.7], [1.1], [1.9], [2.4], [3]].map(([x]) => [x!, x! * x!]);
    const outcomes = rows.map(([x]) => x! > 0);
    const fit = logisticRegression(rows, outcomes);
    expect(fit.separation).toBe(true);
    expect(fit.method).toBe("Firth penalized likelihood");
    const optimum = nelderMeadMaximize((beta) => firthObjective(rows, outcomes, beta), [0, 0, 0], 1, 20000);
    expect(firthObjective(rows, outcomes, fit.coefficients)).toBeGreaterThanOrEqual(firthObjective(rows, outcomes, optimum) - 1e-9);
    fit.coefficients.forEach((value, index) => expect(Math.abs(value - optimum[index]!)).toBeLessThan(1e-4));
  });

  it("Firth estimates approach maximum likelihood as the same data are repeated (bias of order 1/n)", () => {
    const differences = [1, 10, 100].map((copies) => {
      const rows = Array.from({ length: copies }, () => oringRows).flat();
      const outcomes = Array.from({ length: copies }, () => oringOutcomes).flat();
      const ml = logisticRegression(rows, outcomes);
      const firth = logisticRegression(rows, outcomes, { firth: true });
      expect(firth.method).toBe("Firth penalized likelihood");
      expect(firth.separation).toBe(false);
      return Math.abs(firth.coefficients[1]! - ml.coefficients[1]!);
    });
    expect(differences[1]!).toBeLessThan(differences[0]! / 5);
    expect(differences[2]!).toBeLessThan(differences[1]! / 5);
  });
});

describe("logisticRegression — degenerate inputs", () => {
  it("throws StatsInputError on no cases, mismatched lengths, empty or ragged rows, non-finite values, bad options", () => {
    expect(() => logisticRegression([], [])).toThrow(StatsInputError);
    expect(() => logisticRegression([[1], [2]], [true])).toThrow(/one outcome per predictor row/);
    expect(() => logisticRegression([[], []], [true, false])).toThrow(/at least one predictor/);
    expect(() => logisticRegression([[1], [2, 3]], [true, false])).toThrow(/equal length/);
    expect(() => logisticRegression([[1], [Number.NaN]], [true, false])).toThrow(/finite/);
    expect(() => logisticRegression([[1], [2]], [true, false], { tolerance: 0 })).toThrow(/tolerance/);
    expect(() => logisticRegression([[1], [2]], [true, false], { maxIterations: 0.5 })).toThrow(/maxIterations/);
  });

  it("logisticRegression([[1]], [true]) → NaN fit with reason 'not enough data' (1 case, 2 coefficients)", () => {
    const fit = logisticRegression([[1]], [true]);
    expect(fit.coefficients.every(Number.isNaN)).toBe(true);
    expect(Number.isNaN(fit.pValue)).toBe(true);
    expect(fit.converged).toBe(false);
    expect(fit.reason).toMatch(/not enough data/);
  });

  it("two cases with different x → separated, Firth gives a finite fit", () => {
    const fit = logisticRegression([[0], [1]], [false, true]);
    expect(fit.separation).toBe(true);
    expect(fit.method).toBe("Firth penalized likelihood");
    expect(fit.coefficients.every(Number.isFinite)).toBe(true);
    expect(fit.coefficients[1]!).toBeGreaterThan(0);
  });

  it("all outcomes false, x symmetric → Firth slope 0 and fitted probability 1/(n + 2) (derived from the modified score)", () => {
    const rows = [[-2], [-1], [0], [1], [2], [3]];
    const fit = logisticRegression(rows, rows.map(() => false));
    expect(fit.separation).toBe(true);
    expect(fit.method).toBe("Firth penalized likelihood");
    expect(fit.converged).toBe(true);
    expect(fit.coefficients[1]!).toBeCloseTo(0, 10);
    // With the slope at 0 (zero third central moment of x), Σhᵢ = 2 and the modified score Σ(0 − π + hᵢ(½ − π)) = 0
    // give π = 1/(n + 2) = 1/8 at every x, so η = logit(1/8) = ln(1/7).
    expect(fit.coefficients[0]! + 0.5 * fit.coefficients[1]!).toBeCloseTo(Math.log(1 / 7), 10);
    expect(fit.likelihoodRatio).toBeCloseTo(0, 10);
    expect(fit.pValue).toBeGreaterThan(0.9999);
  });

  it("perfect separation (x ≤ 0 all false, x > 0 all true) → separation: true, Firth, finite, increasing", () => {
    const rows = [[-3], [-2], [-1], [0], [1], [2], [3], [4]];
    const fit = logisticRegression(rows, rows.map(([x]) => x! > 0));
    expect(fit.separation).toBe(true);
    expect(fit.method).toBe("Firth penalized likelihood");
    expect(fit.converged).toBe(true);
    expect(fit.coefficients.every(Number.isFinite)).toBe(true);
    expect(fit.standardErrors.every(Number.isFinite)).toBe(true);
    expect(fit.coefficients[1]!).toBeGreaterThan(0);
  });

  it("quasi-complete separation (a tie at the cut holds both outcomes) is detected", () => {
    const rows = [[-2], [-1], [0], [0], [1], [2]];
    const fit = logisticRegression(rows, [false, false, false, true, true, true]);
    expect(fit.separation).toBe(true);
    expect(fit.method).toBe("Firth penalized likelihood");
  });

  it("constant predictor → NaN fit with reason (singular information), not a throw", () => {
    const fit = logisticRegression([[2], [2], [2], [2]], [true, false, true, false]);
    expect(fit.coefficients.every(Number.isNaN)).toBe(true);
    expect(fit.standardErrors.every(Number.isNaN)).toBe(true);
    expect(fit.reason).toMatch(/constant/);
  });

  it("collinear predictors [x, 2x + 1] → NaN fit with reason 'linear combination'", () => {
    const xs = [0, 1, 2, 3, 4, 5];
    const fit = logisticRegression(xs.map((x) => [x, 2 * x + 1]), [false, true, false, true, true, false]);
    expect(fit.coefficients.every(Number.isNaN)).toBe(true);
    expect(fit.reason).toMatch(/linear combination/);
  });

  it("non-convergence within maxIterations refits by Firth and says so", () => {
    const fit = logisticRegression(oringRows, oringOutcomes, { maxIterations: 2 });
    expect(fit.method).toBe("Firth penalized likelihood");
    expect(fit.separation).toBe(false);
    expect(fit.iterations).toBe(2);
    expect(fit.converged).toBe(false);
  });
});

describe("logisticRegression — properties (fast-check, fixed seed)", () => {
  // Index-like values on a 0.01 grid in [−3, 3] (no subnormal magnitudes, which no index file holds).
  const predictorValue = fc.integer({ min: -300, max: 300 }).map((value) => value / 100);
  const nonSeparated = fc
    .array(fc.tuple(predictorValue, fc.boolean()), { minLength: 8, maxLength: 60 })
    .filter((cases) => {
      const events = cases.filter(([, y]) => y).map(([x]) => x);
      const nonEvents = cases.filter(([, y]) => !y).map(([x]) => x);
      if (events.length === 0 || nonEvents.length === 0) return false;
      // Overlap on both sides: no cut separates the two groups (written independently of the source check).
      return Math.max(...nonEvents) > Math.min(...events) && Math.max(...events) > Math.min(...nonEvents);
    });

  it("the score Σ(yᵢ − π̂ᵢ)xᵢ is ~0 at the maximum-likelihood estimate on random non-separated data", () => {
    fc.assert(
      fc.property(nonSeparated, (cases) => {
        const rows = cases.map(([x]) => [x]);
        const outcomes = cases.map(([, y]) => y);
        const fit = logisticRegression(rows, outcomes);
        if (fit.method !== "maximum likelihood" || fit.separation || !fit.converged) return false;
        let scoreIntercept = 0;
        let scoreSlope = 0;
        cases.forEach(([x, y]) => {
          const residual = (y ? 1 : 0) - logistic(fit.coefficients[0]! + fit.coefficients[1]! * x);
          scoreIntercept += residual;
          scoreSlope += residual * x;
        });
        return Math.abs(scoreIntercept) < 1e-7 && Math.abs(scoreSlope) < 1e-7;
      }),
      { seed: 20261203, numRuns: 150 },
    );
  });

  it("Firth's modified score Σ(yᵢ − πᵢ + hᵢ(½ − πᵢ))xᵢ is ~0 at the Firth estimate (any data, separated or not)", () => {
    fc.assert(
      fc.property(
        fc.array(fc.tuple(predictorValue, fc.boolean()), { minLength: 4, maxLength: 40 }),
        (cases) => {
          const xs = cases.map(([x]) => x);
          fc.pre(Math.max(...xs) - Math.min(...xs) > 0.1);
          const rows = xs.map((x) => [x]);
          const outcomes = cases.map(([, y]) => y);
          const fit = logisticRegression(rows, outcomes, { firth: true });
          const [b0, b1] = fit.coefficients as [number, number];
          const mu = xs.map((x) => logistic(b0 + b1 * x));
          const information = [
            [0, 0],
            [0, 0],
          ];
          xs.forEach((x, i) => {
            const w = mu[i]! * (1 - mu[i]!);
            information[0]![0]! += w;
            information[0]![1]! += w * x;
            information[1]![0]! += w * x;
            information[1]![1]! += w * x * x;
          });
          const inverse = inverseOf(information);
          let score0 = 0;
          let score1 = 0;
          xs.forEach((x, i) => {
            const w = mu[i]! * (1 - mu[i]!);
            const h = w * (inverse[0]![0]! + 2 * x * inverse[0]![1]! + x * x * inverse[1]![1]!);
            const residual = (outcomes[i] ? 1 : 0) - mu[i]! + h * (0.5 - mu[i]!);
            score0 += residual;
            score1 += residual * x;
          });
          return fit.converged && Math.abs(score0) < 1e-7 && Math.abs(score1) < 1e-7;
        },
      ),
      { seed: 20261204, numRuns: 150 },
    );
  });
});
