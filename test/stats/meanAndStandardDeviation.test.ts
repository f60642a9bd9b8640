import { describe, expect, it } from "vitest";
import fc from "fast-check";
import jStat from "jstat";
import { meanAndStandardDeviation } from "../../src/stats/meanAndStandardDeviation.js";
import { StatsInputError } from "../../src/stats/StatsInputError.js";
import { nistUnivariateDatasets } from "../fixtures/published/nistUnivariate.js";
import { anscombeQuartetI } from "../fixtures/published/correlationExamples.js";

describe("meanAndStandardDeviation(values)", () => {
  // NIST StRD univariate certified values (V-secondary: quoted identically by two independent test suites).
  it.each(nistUnivariateDatasets)("meanAndStandardDeviation(NIST $name) matches the certified mean and SD", (dataset) => {
    const { mean, sd } = meanAndStandardDeviation(dataset.values);
    expect(Math.abs(mean - dataset.mean) / Math.abs(dataset.mean)).toBeLessThan(1e-14);
    expect(Math.abs(sd - dataset.standardDeviation) / dataset.standardDeviation).toBeLessThan(1e-12);
  });

  it("the NIST fixtures have the documented sizes (Mavro 50, Michelso 100, NumAcc1 3)", () => {
    expect(nistUnivariateDatasets.map((dataset) => dataset.values.length)).toEqual([50, 100, 3]);
  });

  it("meanAndStandardDeviation(Anscombe 1973 x) → mean 9.0, Σ(x − x̄)² = 110.0 (printed values, M)", () => {
    const { mean, sd } = meanAndStandardDeviation(anscombeQuartetI.x);
    expect(mean).toBe(anscombeQuartetI.meanXPrinted);
    expect(sd * sd * (anscombeQuartetI.x.length - 1)).toBeCloseTo(anscombeQuartetI.sumOfSquaresXPrinted, 10);
    expect(meanAndStandardDeviation(anscombeQuartetI.y).mean).toBeCloseTo(anscombeQuartetI.meanYPrinted, 2);
  });

  it("agrees with jstat.mean and jstat.stdev(values, true)", () => {
    fc.assert(
      fc.property(fc.array(fc.double({ min: -1e6, max: 1e6, noNaN: true }), { minLength: 2, maxLength: 200 }), (values) => {
        const { mean, sd } = meanAndStandardDeviation(values);
        const scale = Math.max(1, ...values.map(Math.abs));
        return (
          Math.abs(mean - jStat.mean(values)) <= 1e-9 * scale &&
          Math.abs(sd - jStat.stdev(values, true)) <= 1e-7 * scale
        );
      }),
    );
  });

  it("degenerate input: [] → both NaN; [7] → mean 7, sd NaN; all ties → sd 0", () => {
    const empty = meanAndStandardDeviation([]);
    expect(empty.mean).toBeNaN();
    expect(empty.sd).toBeNaN();
    const single = meanAndStandardDeviation([7]);
    expect(single.mean).toBe(7);
    expect(single.sd).toBeNaN();
    expect(meanAndStandardDeviation([2.5, 2.5, 2.5, 2.5])).toEqual({ mean: 2.5, sd: 0 });
  });

  it("all ties are exact: [0.1, 0.1, 0.1] → mean 0.1, sd 0 (no rounding noise)", () => {
    expect(meanAndStandardDeviation([0.1, 0.1, 0.1])).toEqual({ mean: 0.1, sd: 0 });
  });

  it("neither underflows nor overflows: [0, 1e-170, 2e-170] → sd 1e-170; [1e200, 2e200, 3e200] → sd 1e200", () => {
    expect(meanAndStandardDeviation([0, 1e-170, 2e-170]).sd / 1e-170).toBeCloseTo(1, 12);
    expect(meanAndStandardDeviation([1e200, 2e200, 3e200]).sd / 1e200).toBeCloseTo(1, 12);
  });

  it("keeps precision with a large offset: [1e9 + 1, 1e9 + 2, 1e9 + 3] → sd 1", () => {
    expect(meanAndStandardDeviation([1e9 + 1, 1e9 + 2, 1e9 + 3]).sd).toBeCloseTo(1, 12);
  });

  it.each([[[1, Number.NaN]], [[Number.POSITIVE_INFINITY, 2]]])("meanAndStandardDeviation(%j) throws StatsInputError", (values) => {
    expect(() => meanAndStandardDeviation(values)).toThrow(StatsInputError);
  });
});
