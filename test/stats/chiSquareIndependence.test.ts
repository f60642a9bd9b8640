import { describe, expect, it } from "vitest";
import fc from "fast-check";
import jStat from "jstat";
import { chiSquareIndependence, chiSquareUpperTail } from "../../src/stats/chiSquareIndependence.js";
import { StatsInputError } from "../../src/stats/StatsInputError.js";
import { agrestiPartyByGender, nistChiSquareCriticalValues, rossGenderTable } from "../fixtures/published/chiSquareExamples.js";
import { teaTasting } from "../fixtures/published/fisherExactExamples.js";

describe("chiSquareIndependence(table)", () => {
  // Agresti A. (2007) An Introduction to Categorical Data Analysis, 2nd ed., p. 39 (R ?chisq.test example).
  it("chiSquareIndependence(Agresti 2007 party × gender) → X² = 30.07, df = 2, p = 2.954e-07", () => {
    const result = chiSquareIndependence(agrestiPartyByGender.table);
    expect(result.chiSquare).toBeCloseTo(agrestiPartyByGender.chiSquarePrinted, 2);
    expect(result.chiSquare).toBeCloseTo(agrestiPartyByGender.chiSquareFullPrecision, 5);
    expect(result.df).toBe(2);
    // three significant digits of the published p-value
    expect(Math.abs(result.pValue / agrestiPartyByGender.pValue - 1)).toBeLessThan(5e-4);
    expect(result.droppedRows).toEqual([]);
    expect(result.droppedColumns).toEqual([]);
  });

  it("chiSquareIndependence(Agresti 2007) reproduces the expected counts and adjusted residuals of R's stdres", () => {
    const result = chiSquareIndependence(agrestiPartyByGender.table);
    result.expected.forEach((row, rowIndex) =>
      row.forEach((value, columnIndex) =>
        expect(value).toBeCloseTo(agrestiPartyByGender.expected[rowIndex]?.[columnIndex] ?? Number.NaN, 3),
      ),
    );
    result.adjustedResiduals.forEach((row, rowIndex) =>
      row.forEach((value, columnIndex) =>
        expect(value).toBeCloseTo(agrestiPartyByGender.adjustedResiduals[rowIndex]?.[columnIndex] ?? Number.NaN, 6),
      ),
    );
  });

  it("chiSquareIndependence(Ross women/men table) → TS = 6.433, above the 5 % critical value 5.991", () => {
    // Ross, Introduction to Probability and Statistics for Engineers and Scientists, ch. 11 (V-primary).
    const result = chiSquareIndependence(rossGenderTable.table);
    expect(result.chiSquare).toBeCloseTo(rossGenderTable.statisticPrinted, 3);
    expect(result.chiSquare).toBeGreaterThan(rossGenderTable.criticalValue05);
    expect(result.pValue).toBeCloseTo(rossGenderTable.pValue, 4); // C only
  });

  it("chiSquareIndependence([[3, 1], [1, 3]]) → X² = 2, p = 0.1573 (tea table, C)", () => {
    const result = chiSquareIndependence(teaTasting.table);
    expect(result.chiSquare).toBeCloseTo(2, 12);
    expect(result.pValue).toBeCloseTo(0.1573, 4);
    expect(result.pValue).toBeCloseTo(1 - jStat.chisquare.cdf(2, 1), 12);
  });

  // NIST/SEMATECH e-Handbook §1.3.6.7.4: a statistic equal to the tabled critical value has the tabled tail.
  it.each(nistChiSquareCriticalValues)(
    "a 2 × (df + 1) table with X² = $criticalValue at df = $df has p ≈ $upperTail (NIST critical values)",
    ({ df, upperTail, criticalValue }) => {
      const table = tableWithStatistic(df, criticalValue);
      const result = chiSquareIndependence(table);
      expect(result.df).toBe(df);
      expect(result.chiSquare).toBeCloseTo(criticalValue, 9);
      // the table is rounded to 3 decimals, so the tail agrees to about 0.1 % of its value
      expect(Math.abs(result.pValue - upperTail) / upperTail).toBeLessThan(2e-3);
      expect(result.pValue).toBeCloseTo(1 - jStat.chisquare.cdf(criticalValue, df), 10);
    },
  );

  it("p-values agree with 1 − jstat.chisquare.cdf across statistics and df", () => {
    fc.assert(
      fc.property(
        fc.array(fc.array(fc.integer({ min: 1, max: 60 }), { minLength: 3, maxLength: 3 }), { minLength: 2, maxLength: 5 }),
        (table) => {
          const result = chiSquareIndependence(table);
          const reference = 1 - jStat.chisquare.cdf(result.chiSquare, result.df);
          return Math.abs(result.pValue - reference) < 1e-9;
        },
      ),
    );
  });

  it("far-tail p-values keep relative precision (df = 2: p = exp(−X²/2); df = 4: p = exp(−X²/2)(1 + X²/2))", () => {
    // 2 × 3 and 3 × 3 tables with a very strong association
    const twoDf = chiSquareIndependence([[500, 2, 3], [1, 499, 4]]);
    expect(twoDf.df).toBe(2);
    expect(twoDf.pValue).toBeGreaterThan(0);
    expect(twoDf.pValue / Math.exp(-twoDf.chiSquare / 2) - 1).toBeCloseTo(0, 10);
    const fourDf = chiSquareIndependence([[60, 5, 5], [5, 60, 5], [5, 5, 60]]);
    expect(fourDf.df).toBe(4);
    const closedForm = Math.exp(-fourDf.chiSquare / 2) * (1 + fourDf.chiSquare / 2);
    expect(fourDf.pValue).toBeGreaterThan(0);
    expect(fourDf.pValue / closedForm - 1).toBeCloseTo(0, 10);
  });

  it("df = 1 upper tail equals erfc(√(X²/2)) (jstat.erfc) in the continued-fraction branch", () => {
    // jstat's erfc is a Chebyshev fit good to about 1e-9 here; it loses accuracy further out, so stay moderate.
    const result = chiSquareIndependence([[20, 10], [8, 25]]);
    expect(result.df).toBe(1);
    expect(result.chiSquare / 2).toBeGreaterThan(1.5);
    expect(result.pValue / jStat.erfc(Math.sqrt(result.chiSquare / 2)) - 1).toBeCloseTo(0, 8);
  });

  it("far-tail p-values are never rounded to 0 while a double can hold them", () => {
    const result = chiSquareIndependence([[60, 2], [3, 58]]);
    expect(result.df).toBe(1);
    expect(1 - jStat.chisquare.cdf(result.chiSquare, 1)).toBe(0); // the naive complement rounds to 0
    // Abramowitz & Stegun (1964) Handbook of Mathematical Functions, 7.1.13: for x ≥ 0,
    // 2e^{−x²}/(√π(x + √(x² + 2))) < erfc(x) ≤ 2e^{−x²}/(√π(x + √(x² + 4/π))); here p = erfc(√(X²/2)).
    const x = Math.sqrt(result.chiSquare / 2);
    const lowerBound = (2 * Math.exp(-x * x)) / (Math.sqrt(Math.PI) * (x + Math.sqrt(x * x + 2)));
    const upperBound = (2 * Math.exp(-x * x)) / (Math.sqrt(Math.PI) * (x + Math.sqrt(x * x + 4 / Math.PI)));
    expect(result.pValue).toBeGreaterThan(lowerBound);
    expect(result.pValue).toBeLessThanOrEqual(upperBound);
  });

  it("drops a zero row margin and reports it: [[5, 3], [0, 0], [2, 7]]", () => {
    const result = chiSquareIndependence([[5, 3], [0, 0], [2, 7]]);
    const reference = chiSquareIndependence([[5, 3], [2, 7]]);
    expect(result.droppedRows).toEqual([1]);
    expect(result.droppedColumns).toEqual([]);
    expect(result.chiSquare).toBe(reference.chiSquare);
    expect(result.df).toBe(1);
    expect(result.expected).toEqual(reference.expected);
    expect(result.adjustedResiduals).toEqual(reference.adjustedResiduals);
  });

  it("drops a zero column margin; with one column left the test is undefined (NaN, df 0)", () => {
    const result = chiSquareIndependence([[5, 0], [7, 0], [1, 0]]);
    expect(result.droppedColumns).toEqual([1]);
    expect(result.chiSquare).toBeNaN();
    expect(result.pValue).toBeNaN();
    expect(result.df).toBe(0);
    expect(result.expected.map((row) => row.length)).toEqual([1, 1, 1]);
    expect(result.adjustedResiduals.flat().every(Number.isNaN)).toBe(true);
  });

  it("a single row is undefined: chiSquareIndependence([[4, 6, 1]]) → NaN, df 0", () => {
    const result = chiSquareIndependence([[4, 6, 1]]);
    expect(result.chiSquare).toBeNaN();
    expect(result.df).toBe(0);
    expect(result.expected).toEqual([[4, 6, 1]]);
  });

  it("an all-zero table drops everything: NaN, df 0, empty expected", () => {
    const result = chiSquareIndependence([[0, 0], [0, 0]]);
    expect(result.droppedRows).toEqual([0, 1]);
    expect(result.droppedColumns).toEqual([0, 1]);
    expect(result.chiSquare).toBeNaN();
    expect(result.pValue).toBeNaN();
    expect(result.df).toBe(0);
    expect(result.expected).toEqual([]);
  });

  it("a table of exactly independent counts has X² = 0, p = 1 and zero residuals", () => {
    const result = chiSquareIndependence([[2, 4], [3, 6]]);
    expect(result.chiSquare).toBeCloseTo(0, 12);
    expect(result.pValue).toBeCloseTo(1, 12);
    result.adjustedResiduals.flat().forEach((value) => expect(value).toBeCloseTo(0, 12));
  });

  it.each([
    ["no rows", []],
    ["an empty row", [[]]],
    ["ragged rows", [[1, 2], [3]]],
    ["a negative count", [[1, -2], [3, 4]]],
    ["a NaN count", [[1, Number.NaN], [3, 4]]],
    ["an infinite count", [[1, Number.POSITIVE_INFINITY], [3, 4]]],
  ])("throws StatsInputError for %s", (_label, table) => {
    expect(() => chiSquareIndependence(table as number[][])).toThrow(StatsInputError);
  });
});

/**
 * A 2 × (df + 1) table whose Pearson X² equals `target` exactly: the first df columns are balanced
 * [[m, m]] and the last column is [[m + δ, m − δ]]. Solved for δ from X² = f(δ) on real-valued counts.
 */
function tableWithStatistic(df: number, target: number): number[][] {
  const m = 1000;
  const columns = df + 1;
  const statisticFor = (delta: number): number => {
    const table = [
      [...Array.from({ length: columns - 1 }, () => m), m + delta],
      [...Array.from({ length: columns - 1 }, () => m), m - delta],
    ];
    return chiSquareIndependence(table).chiSquare;
  };
  let low = 0;
  let high = m;
  for (let iteration = 0; iteration < 200; iteration += 1) {
    const middle = (low + high) / 2;
    if (statisticFor(middle) < target) low = middle;
    else high = middle;
  }
  const delta = (low + high) / 2;
  return [
    [...Array.from({ length: columns - 1 }, () => m), m + delta],
    [...Array.from({ length: columns - 1 }, () => m), m - delta],
  ];
}

describe("chiSquareUpperTail(x, df)", () => {
  // NIST/SEMATECH e-Handbook of Statistical Methods, 1.3.6.7.4 "Critical values of the chi-square
  // distribution" (values printed to 3 decimals, so the tail is checked to about 1e-3 relative).
  it("at the NIST critical values of 1, 2 and 3 degrees of freedom gives the table's upper-tail areas", () => {
    for (const { df, upperTail, criticalValue } of nistChiSquareCriticalValues) {
      expect(Math.abs(chiSquareUpperTail(criticalValue, df) / upperTail - 1)).toBeLessThan(2e-3);
    }
  });

  it("with 2 degrees of freedom (the closed form e^(−x/2)) agrees with jStat's chi-square CDF to 1e-9 (jStat's own incomplete gamma is good to about 1e-10), and with 1 and 3 (the incomplete gamma) too", () => {
    fc.assert(
      fc.property(fc.double({ min: 1e-6, max: 40, noNaN: true }), fc.constantFrom(1, 2, 3), (x, df) => {
        const reference = 1 - jStat.chisquare.cdf(x, df);
        expect(Math.abs(chiSquareUpperTail(x, df) - reference)).toBeLessThan(1e-9);
      }),
      { seed: 20271, numRuns: 500 },
    );
    expect(chiSquareUpperTail(0, 2)).toBe(1);
    expect(chiSquareUpperTail(2 * Math.log(20), 2)).toBeCloseTo(0.05, 15);
  });
});
