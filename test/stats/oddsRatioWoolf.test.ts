import { describe, expect, it } from "vitest";
import fc from "fast-check";
import jStat from "jstat";
import { oddsRatioWoolf } from "../../src/stats/oddsRatioWoolf.js";
import { StatsInputError } from "../../src/stats/StatsInputError.js";
import { aspirinMyocardialInfarction, hayFeverEczema } from "../fixtures/published/blandAltman2000OddsRatio.js";

type TwoByTwo = [[number, number], [number, number]];

describe("oddsRatioWoolf(table, confidence = 0.95)", () => {
  // Bland J.M., Altman D.G. (2000) "The odds ratio", BMJ 320:1468 — OR 4.89 (V-secondary); SE 0.103 and
  // CI 4.00–5.99 as printed are from memory (M), matched by the full-precision C values.
  it("oddsRatioWoolf([[141, 420], [928, 13525]]) → 4.89 (4.00–5.99), hay fever and eczema", () => {
    const result = oddsRatioWoolf(hayFeverEczema.table);
    expect(result.oddsRatio).toBeCloseTo(hayFeverEczema.oddsRatioPrinted, 2);
    expect(Math.log(result.oddsRatio)).toBeCloseTo(hayFeverEczema.logOddsRatioPrinted, 2);
    expect(result.lower).toBeCloseTo(hayFeverEczema.intervalPrinted[0], 2);
    expect(result.upper).toBeCloseTo(hayFeverEczema.intervalPrinted[1], 2);
    expect(result.lower).toBeCloseTo(hayFeverEczema.intervalFullPrecision[0], 4);
    expect(result.upper).toBeCloseTo(hayFeverEczema.intervalFullPrecision[1], 4);
    expect(result.haldaneCorrected).toBe(false);
    const standardError = (Math.log(result.upper) - Math.log(result.lower)) / (2 * jStat.normal.inv(0.975, 0, 1));
    expect(standardError).toBeCloseTo(hayFeverEczema.standardErrorPrinted, 3);
    expect(standardError).toBeCloseTo(hayFeverEczema.standardErrorFullPrecision, 6);
  });

  it("oddsRatioWoolf(aspirin/MI table) → 1.832 (1.440–2.331) (Agresti 2002 values M; C)", () => {
    const result = oddsRatioWoolf(aspirinMyocardialInfarction.table);
    expect(result.oddsRatio).toBeCloseTo(aspirinMyocardialInfarction.oddsRatio, 4);
    expect(result.lower).toBeCloseTo(aspirinMyocardialInfarction.interval[0], 4);
    expect(result.upper).toBeCloseTo(aspirinMyocardialInfarction.interval[1], 4);
  });

  it("agrees with an interval written from jstat.normal.inv at several confidence levels", () => {
    fc.assert(
      fc.property(
        fc.tuple(fc.integer({ min: 1, max: 500 }), fc.integer({ min: 1, max: 500 }), fc.integer({ min: 1, max: 500 }), fc.integer({ min: 1, max: 500 })),
        fc.constantFrom(0.8, 0.9, 0.95, 0.99),
        ([a, b, c, d], confidence) => {
          const result = oddsRatioWoolf([[a, b], [c, d]], confidence);
          const logOdds = Math.log((a * d) / (b * c));
          const halfWidth = jStat.normal.inv((1 + confidence) / 2, 0, 1) * Math.sqrt(1 / a + 1 / b + 1 / c + 1 / d);
          return (
            Math.abs(Math.log(result.oddsRatio) - logOdds) < 1e-10 &&
            Math.abs(Math.log(result.lower) - (logOdds - halfWidth)) < 1e-8 &&
            Math.abs(Math.log(result.upper) - (logOdds + halfWidth)) < 1e-8 &&
            result.lower <= result.oddsRatio &&
            result.oddsRatio <= result.upper
          );
        },
      ),
    );
  });

  it("oddsRatioWoolf([[0, 5], [3, 7]]) adds ½ to every cell (Haldane–Anscombe): OR = (0.5·7.5)/(5.5·3.5)", () => {
    const result = oddsRatioWoolf([[0, 5], [3, 7]]);
    expect(result.haldaneCorrected).toBe(true);
    expect(result.oddsRatio).toBeCloseTo((0.5 * 7.5) / (5.5 * 3.5), 12);
    const standardError = Math.sqrt(1 / 0.5 + 1 / 5.5 + 1 / 3.5 + 1 / 7.5);
    expect(Math.log(result.upper / result.oddsRatio)).toBeCloseTo(jStat.normal.inv(0.975, 0, 1) * standardError, 10);
  });

  it("swapping the rows inverts the odds ratio and its interval", () => {
    const forward = oddsRatioWoolf([[141, 420], [928, 13525]]);
    const reversed = oddsRatioWoolf([[928, 13525], [141, 420]]);
    expect(reversed.oddsRatio).toBeCloseTo(1 / forward.oddsRatio, 12);
    expect(reversed.lower).toBeCloseTo(1 / forward.upper, 12);
    expect(reversed.oddsRatio).toBeCloseTo(0.204, 3); // Bland & Altman: reversing one margin gives 0.204
  });

  it.each([
    ["a zero row", [[0, 0], [3, 7]]],
    ["a zero column", [[0, 5], [0, 7]]],
    ["an all-zero table", [[0, 0], [0, 0]]],
  ])("a zero margin (%s) makes the odds ratio undefined: NaN, not corrected", (_label, table) => {
    const result = oddsRatioWoolf(table as TwoByTwo);
    expect(result.oddsRatio).toBeNaN();
    expect(result.lower).toBeNaN();
    expect(result.upper).toBeNaN();
    expect(result.haldaneCorrected).toBe(false);
  });

  it.each([
    ["a negative count", [[-1, 2], [3, 4]], 0.95],
    ["an infinite count", [[Number.POSITIVE_INFINITY, 2], [3, 4]], 0.95],
    ["three columns", [[1, 2, 3], [3, 4, 5]], 0.95],
    ["confidence 1", [[1, 2], [3, 4]], 1],
    ["confidence 0", [[1, 2], [3, 4]], 0],
  ])("throws StatsInputError for %s", (_label, table, confidence) => {
    expect(() => oddsRatioWoolf(table as unknown as TwoByTwo, confidence)).toThrow(StatsInputError);
  });
});
