import { describe, expect, it } from "vitest";
import fc from "fast-check";
import jStat from "jstat";
import { logisticPrediction } from "../../src/stats/logisticPrediction.js";
import { logisticRegression } from "../../src/stats/logisticRegression.js";
import { StatsInputError } from "../../src/stats/StatsInputError.js";
import { shuttleOringAnyDistress } from "../fixtures/published/logisticRegressionExamples.js";

const oringFit = logisticRegression(
  shuttleOringAnyDistress.temperature.map((t) => [t]),
  shuttleOringAnyDistress.damaged.map((count) => count > 0),
);

/** Hand computation: η = b₀ + b₁t, se² = V₀₀ + 2tV₀₁ + t²V₁₁, limits 1/(1 + e^−(η ± z·se)), z from jstat. */
function byHand(t: number, level: number) {
  const [b0, b1] = oringFit.coefficients as [number, number];
  const v = oringFit.covariance;
  const eta = b0 + b1 * t;
  const se = Math.sqrt(v[0]![0]! + 2 * t * v[0]![1]! + t * t * v[1]![1]!);
  const z = jStat.normal.inv((1 + level) / 2, 0, 1);
  const expit = (value: number) => 1 / (1 + Math.exp(-value));
  return { estimate: expit(eta), lower: expit(eta - z * se), upper: expit(eta + z * se) };
}

describe("logisticPrediction(fit, row, level = 0.95)", () => {
  // Agresti (2007) An Introduction to Categorical Data Analysis, 2nd ed., exercise on Table 5.10: the fitted
  // probability of thermal distress at 31 °F is 0.9996 (from memory, M).
  it("O-ring fit at 31 °F → estimate 0.9996 (Agresti 2007, M)", () => {
    const prediction = logisticPrediction(oringFit, [31]);
    expect(prediction.estimate).toBeCloseTo(shuttleOringAnyDistress.fromMemory.probabilityAt31, 4);
    expect(prediction.lower).toBeLessThan(prediction.estimate);
    expect(prediction.upper).toBeGreaterThan(prediction.estimate);
    expect(prediction.upper).toBeLessThan(1);
  });

  it("agrees with a hand computation using jStat.normal.inv at 31, 53, 70 and 81 °F and levels 0.8, 0.95, 0.99", () => {
    for (const t of [31, 53, 70, 81]) {
      for (const level of [0.8, 0.95, 0.99]) {
        const prediction = logisticPrediction(oringFit, [t], level);
        const reference = byHand(t, level);
        expect(prediction.estimate).toBeCloseTo(reference.estimate, 12);
        expect(prediction.lower).toBeCloseTo(reference.lower, 12);
        expect(prediction.upper).toBeCloseTo(reference.upper, 12);
      }
    }
  });

  it("at 70 °F → 0.2300 (95 % Wald on the logit scale 0.0851–0.4895), C", () => {
    const prediction = logisticPrediction(oringFit, [70]);
    expect(prediction.estimate).toBeCloseTo(0.229968, 5);
    expect(prediction.lower).toBeCloseTo(0.085086, 5);
    expect(prediction.upper).toBeCloseTo(0.489548, 5);
  });

  it("with two predictors [x, x²] at x = 0.7 uses the full covariance: se² = xᵀVx with x = [1, 0.7, 0.49]", () => {
    const xs = [-2, -1.5, -1, -0.5, 0, 0.5, 1, 1.5, 2, 2.5, 3, -2.5];
    const ys = [false, false, true, false, true, false, true, true, false, true, true, false];
    const fit = logisticRegression(xs.map((x) => [x, x * x]), ys);
    const row = [0.7, 0.49];
    const x = [1, ...row];
    const eta = x.reduce((sum, value, k) => sum + value * fit.coefficients[k]!, 0);
    let variance = 0;
    x.forEach((left, r) => x.forEach((right, c) => (variance += left * fit.covariance[r]![c]! * right)));
    const z = jStat.normal.inv(0.975, 0, 1);
    const prediction = logisticPrediction(fit, row);
    expect(prediction.lower).toBeCloseTo(1 / (1 + Math.exp(-(eta - z * Math.sqrt(variance)))), 12);
    expect(prediction.upper).toBeCloseTo(1 / (1 + Math.exp(-(eta + z * Math.sqrt(variance)))), 12);
  });

  it("throws StatsInputError on a row of the wrong length, a non-finite value or a level outside (0, 1)", () => {
    expect(() => logisticPrediction(oringFit, [])).toThrow(StatsInputError);
    expect(() => logisticPrediction(oringFit, [1, 2])).toThrow(/1 predictor value/);
    expect(() => logisticPrediction(oringFit, [Number.POSITIVE_INFINITY])).toThrow(/finite/);
    expect(() => logisticPrediction(oringFit, [70], 1)).toThrow(/level/);
    expect(() => logisticPrediction(oringFit, [70], 0)).toThrow(/level/);
  });

  it("a fit that could not be computed (constant predictor) gives NaN estimate and limits", () => {
    const fit = logisticRegression([[1], [1], [1]], [true, false, true]);
    const prediction = logisticPrediction(fit, [1]);
    expect(Number.isNaN(prediction.estimate)).toBe(true);
    expect(Number.isNaN(prediction.lower)).toBe(true);
    expect(Number.isNaN(prediction.upper)).toBe(true);
  });

  it("property: lower ≤ estimate ≤ upper, inside [0, 1], for random fits, rows and levels (fixed seed)", () => {
    fc.assert(
      fc.property(
        fc.array(fc.tuple(fc.integer({ min: -300, max: 300 }), fc.boolean()), { minLength: 3, maxLength: 40 }),
        fc.integer({ min: -600, max: 600 }),
        fc.double({ min: 0.5, max: 0.999, noNaN: true }),
        (cases, value, level) => {
          const xs = cases.map(([x]) => x / 100);
          fc.pre(new Set(xs).size > 1);
          const fit = logisticRegression(xs.map((x) => [x]), cases.map(([, y]) => y));
          const prediction = logisticPrediction(fit, [value / 100], level);
          return (
            prediction.lower <= prediction.estimate &&
            prediction.estimate <= prediction.upper &&
            prediction.lower >= 0 &&
            prediction.upper <= 1
          );
        },
      ),
      { seed: 20261205, numRuns: 200 },
    );
  });
});
