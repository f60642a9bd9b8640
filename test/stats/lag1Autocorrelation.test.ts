import { describe, expect, it } from "vitest";
import fc from "fast-check";
import jStat from "jstat";
import { lag1Autocorrelation } from "../../src/stats/lag1Autocorrelation.js";
import { StatsInputError } from "../../src/stats/StatsInputError.js";
import { nistUnivariateDatasets } from "../fixtures/published/nistUnivariate.js";

/** Σ(xₜ − x̄)(xₜ₊₁ − x̄)/Σ(xₜ − x̄)² written with jstat's mean and (population) variance. */
function lag1WithJstat(values: readonly number[]): number {
  const mean = jStat.mean(values);
  let products = 0;
  for (let index = 0; index + 1 < values.length; index += 1) {
    products += ((values[index] ?? 0) - mean) * ((values[index + 1] ?? 0) - mean);
  }
  return products / (jStat.variance(values, false) * values.length);
}

describe("lag1Autocorrelation(x)", () => {
  // NIST StRD univariate certified lag-1 autocorrelation coefficients (V-secondary).
  it.each(nistUnivariateDatasets)("lag1Autocorrelation(NIST $name) → $lag1Autocorrelation", (dataset) => {
    const value = lag1Autocorrelation(dataset.values);
    expect(Math.abs(value - dataset.lag1Autocorrelation)).toBeLessThan(1e-12);
  });

  it("lag1Autocorrelation([10000001, 10000003, 10000002]) → −0.5 (NumAcc1, by hand: (−1·1 + 1·0)/2)", () => {
    expect(lag1Autocorrelation([10000001, 10000003, 10000002])).toBeCloseTo(-0.5, 14);
  });

  it("agrees with the estimator written from jstat.mean and jstat.variance", () => {
    fc.assert(
      fc.property(fc.array(fc.integer({ min: -1e5, max: 1e5 }).map((value) => value / 100), { minLength: 3, maxLength: 100 }), (values) => {
        const expected = lag1WithJstat(values);
        const actual = lag1Autocorrelation(values);
        if (!Number.isFinite(expected)) return Number.isNaN(actual) || Math.abs(actual) <= 1;
        return Math.abs(actual - expected) < 1e-9;
      }),
    );
  });

  it("an alternating series [1, −1, 1, −1] → −0.75 and a linear trend [1, 2, 3, 4] → 0.25 (biased denominator)", () => {
    // alternating: x̄ = 0, products 3·(−1), squares 4 → −3/4; trend: deviations −1.5, −0.5, 0.5, 1.5 → 1.25/5
    expect(lag1Autocorrelation([1, -1, 1, -1])).toBeCloseTo(-0.75, 15);
    expect(lag1Autocorrelation([1, 2, 3, 4])).toBeCloseTo(0.25, 15);
  });

  it("is scale-free down to tiny magnitudes and recognises rounded ties ([0.1, 0.1, 0.1] → NaN)", () => {
    expect(lag1Autocorrelation([0, 0, 8e-161])).toBeCloseTo(lag1Autocorrelation([0, 0, 8]), 14);
    expect(lag1Autocorrelation([0.1, 0.1, 0.1])).toBeNaN();
  });

  it("degenerate input: [], [1], [1, 2] (n < 3) and a constant series give NaN", () => {
    expect(lag1Autocorrelation([])).toBeNaN();
    expect(lag1Autocorrelation([1])).toBeNaN();
    expect(lag1Autocorrelation([1, 2])).toBeNaN();
    expect(lag1Autocorrelation([4, 4, 4, 4])).toBeNaN();
  });

  it("property: the estimate lies in [−1, 1]", () => {
    fc.assert(
      fc.property(fc.array(fc.integer({ min: -100, max: 100 }), { minLength: 3, maxLength: 80 }), (values) => {
        const value = lag1Autocorrelation(values);
        return Number.isNaN(value) || (value >= -1 && value <= 1);
      }),
    );
  });

  it.each([[[1, 2, Number.NaN]], [[1, Number.NEGATIVE_INFINITY, 3]]])("lag1Autocorrelation(%j) throws StatsInputError", (values) => {
    expect(() => lag1Autocorrelation(values)).toThrow(StatsInputError);
  });
});
