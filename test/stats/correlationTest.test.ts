import { describe, expect, it } from "vitest";
import fc from "fast-check";
import jStat from "jstat";
import { correlationTest } from "../../src/stats/correlationTest.js";
import { effectiveSampleSize } from "../../src/stats/effectiveSampleSize.js";
import { pearsonCorrelation } from "../../src/stats/pearsonCorrelation.js";
import { StatsInputError } from "../../src/stats/StatsInputError.js";
import { anscombeQuartetI, criticalCorrelationValues } from "../fixtures/published/correlationExamples.js";

describe("correlationTest(r, effectiveN)", () => {
  // Fisher & Yates (1963) Statistical Tables, Table VII (M, 4 decimals): r at the critical value has p = α.
  it.each(criticalCorrelationValues)(
    "correlationTest($r, $df + 2) has two-sided p ≈ $twoSidedAlpha (Fisher & Yates Table VII)",
    ({ df, twoSidedAlpha, r }) => {
      const result = correlationTest(r, df + 2);
      expect(result.df).toBe(df);
      // the tabled r is rounded to 4 decimals, which moves p by well under 1 % of α
      expect(Math.abs(result.pValue - twoSidedAlpha) / twoSidedAlpha).toBeLessThan(0.01);
    },
  );

  it("correlationTest(0.5, 27) → t = 2.886751, df = 25, p = 0.007913", () => {
    const result = correlationTest(0.5, 27);
    expect(result.t).toBeCloseTo((0.5 * 5) / Math.sqrt(0.75), 12);
    expect(result.df).toBe(25);
    // jstat's Student t CDF is good to about 1e-8 absolute, so compare to 8 decimals
    expect(result.pValue).toBeCloseTo(2 * jStat.studentt.cdf(-result.t, 25), 8);
    expect(result.pValue).toBeCloseTo(0.007913, 6);
  });

  it("Anscombe (1973) set I: r = 0.816 from 11 pairs gives p ≈ 0.00217 (C; the slope test of the same data)", () => {
    const r = pearsonCorrelation(anscombeQuartetI.x, anscombeQuartetI.y);
    const result = correlationTest(r, anscombeQuartetI.x.length);
    expect(result.df).toBe(9);
    expect(result.pValue).toBeCloseTo(0.00217, 5);
  });

  it("agrees with jstat.studentt.cdf for non-integer effective N", () => {
    fc.assert(
      fc.property(
        fc.double({ min: -0.999, max: 0.999, noNaN: true }),
        fc.double({ min: 2.5, max: 500, noNaN: true }),
        (r, effectiveN) => {
          const result = correlationTest(r, effectiveN);
          const reference = 2 * jStat.studentt.cdf(-Math.abs(result.t), effectiveN - 2);
          return Math.abs(result.pValue - Math.min(1, reference)) < 1e-7;
        },
      ),
    );
  });

  it("a Bretherton-adjusted test is less significant: r = 0.3 with N = 100 vs N_eff = 60 (r₁ = r₂ = 0.5)", () => {
    const naive = correlationTest(0.3, 100);
    const adjusted = correlationTest(0.3, effectiveSampleSize(100, 0.5, 0.5));
    expect(adjusted.df).toBeCloseTo(58, 12);
    expect(adjusted.pValue).toBeGreaterThan(naive.pValue);
    expect(adjusted.pValue).toBeCloseTo(2 * jStat.studentt.cdf(-(0.3 * Math.sqrt(58)) / Math.sqrt(0.91), 58), 8);
  });

  it("r = 0 gives t = 0 and p = 1; |r| = 1 gives t = ±Infinity and p = 0", () => {
    expect(correlationTest(0, 20)).toEqual({ t: 0, df: 18, pValue: 1 });
    expect(correlationTest(1, 20)).toEqual({ t: Number.POSITIVE_INFINITY, df: 18, pValue: 0 });
    expect(correlationTest(-1, 20).t).toBe(Number.NEGATIVE_INFINITY);
  });

  it("degenerate input: N ≤ 2, NaN r or NaN N give all NaN", () => {
    for (const [r, n] of [
      [0.5, 2],
      [0.5, 1.5],
      [0.5, 0],
      [Number.NaN, 30],
      [0.5, Number.NaN],
    ] as const) {
      const result = correlationTest(r, n);
      expect([result.t, result.df, result.pValue].every(Number.isNaN)).toBe(true);
    }
  });

  it("throws StatsInputError for r outside [−1, 1] or a negative or infinite N", () => {
    expect(() => correlationTest(1.01, 30)).toThrow(StatsInputError);
    expect(() => correlationTest(-2, 30)).toThrow(StatsInputError);
    expect(() => correlationTest(0.2, -1)).toThrow(StatsInputError);
    expect(() => correlationTest(0.2, Number.POSITIVE_INFINITY)).toThrow(StatsInputError);
  });
});
