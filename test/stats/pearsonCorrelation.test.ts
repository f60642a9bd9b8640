import { describe, expect, it } from "vitest";
import fc from "fast-check";
import jStat from "jstat";
import { pearsonCorrelation } from "../../src/stats/pearsonCorrelation.js";
import { StatsInputError } from "../../src/stats/StatsInputError.js";
import { anscombeQuartetI, nistNorris } from "../fixtures/published/correlationExamples.js";

describe("pearsonCorrelation(x, y)", () => {
  // Anscombe F.J. (1973) The American Statistician 27:17–21, data set I: printed r = 0.82 (M), C 0.816421.
  it("pearsonCorrelation(Anscombe 1973 set I) → 0.82 (0.816421)", () => {
    const r = pearsonCorrelation(anscombeQuartetI.x, anscombeQuartetI.y);
    expect(r).toBeCloseTo(anscombeQuartetI.correlationPrinted, 2);
    expect(r).toBeCloseTo(anscombeQuartetI.correlationFullPrecision, 6);
  });

  // NIST StRD linear regression, Norris: certified R² = 0.999993745883712 (V-secondary).
  it("pearsonCorrelation(NIST Norris)² → certified R² 0.999993745883712", () => {
    const r = pearsonCorrelation(nistNorris.x, nistNorris.y);
    expect(r * r).toBeCloseTo(nistNorris.rSquared, 12);
  });

  it("agrees with jstat.corrcoeff", () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 3, max: 80 }).chain((length) =>
          fc.tuple(
            // hundredths in ±10⁴: keeps jstat away from subnormal squares, where it (not we) loses precision
            fc.array(fc.integer({ min: -1e6, max: 1e6 }).map((value) => value / 100), { minLength: length, maxLength: length }),
            fc.array(fc.integer({ min: -1e6, max: 1e6 }).map((value) => value / 100), { minLength: length, maxLength: length }),
          ),
        ),
        ([x, y]) => {
          const expected = jStat.corrcoeff(x, y);
          const actual = pearsonCorrelation(x, y);
          if (!Number.isFinite(expected)) return Number.isNaN(actual) || Math.abs(actual) <= 1;
          return Math.abs(actual - expected) < 1e-9;
        },
      ),
    );
  });

  it("is invariant to a large offset such as calendar years: r(years, y) = r(years − 1700, y)", () => {
    const years = Array.from({ length: 30 }, (_, index) => 1700 + index * 1.5);
    const values = years.map((year, index) => Math.sin(year) + index * 0.1);
    expect(pearsonCorrelation(years, values)).toBeCloseTo(pearsonCorrelation(years.map((year) => year - 1700), values), 12);
  });

  it("is scale-free down to tiny and up to huge magnitudes (no underflow of squares)", () => {
    const reference = pearsonCorrelation([0, 1, 2, 5], [0, 1, 3, 2]);
    expect(pearsonCorrelation([0, 1e-170, 2e-170, 5e-170], [0, 1e-170, 3e-170, 2e-170])).toBeCloseTo(reference, 12);
    expect(pearsonCorrelation([0, 1e170, 2e170, 5e170], [0, 1, 3, 2])).toBeCloseTo(reference, 12);
  });

  it("a constant sample whose mean rounds (0.1 repeated) is still recognised as all ties: NaN", () => {
    expect(pearsonCorrelation([0.1, 0.1, 0.1], [1, 2, 3])).toBeNaN();
  });

  it("perfect linear relations give exactly ±1: r([1, 2, 3], [2, 4, 6]) = 1, r([1, 2, 3], [3, 2, 1]) = −1", () => {
    expect(pearsonCorrelation([1, 2, 3], [2, 4, 6])).toBe(1);
    expect(pearsonCorrelation([1, 2, 3], [3, 2, 1])).toBe(-1);
  });

  it("degenerate input: [] and a single pair give NaN; a constant sample (all ties) gives NaN", () => {
    expect(pearsonCorrelation([], [])).toBeNaN();
    expect(pearsonCorrelation([1], [2])).toBeNaN();
    expect(pearsonCorrelation([3, 3, 3], [1, 2, 3])).toBeNaN();
    expect(pearsonCorrelation([1, 2, 3], [5, 5, 5])).toBeNaN();
  });

  it("property: r lies in [−1, 1] and is symmetric in its arguments", () => {
    fc.assert(
      fc.property(
        fc.array(fc.tuple(fc.integer({ min: -50, max: 50 }), fc.integer({ min: -50, max: 50 })), { minLength: 2, maxLength: 50 }),
        (pairs) => {
          const x = pairs.map(([left]) => left);
          const y = pairs.map(([, right]) => right);
          const r = pearsonCorrelation(x, y);
          const swapped = pearsonCorrelation(y, x);
          // (the range [−1, 1] is not asserted: pearsonCorrelation clamps to it, so that check could not fail)
          return Number.isNaN(r) ? Number.isNaN(swapped) : r === swapped;
        },
      ),
    );
  });

  it("throws StatsInputError for unequal lengths or a non-finite value", () => {
    expect(() => pearsonCorrelation([1, 2, 3], [1, 2])).toThrow(StatsInputError);
    expect(() => pearsonCorrelation([1, Number.NaN, 3], [1, 2, 3])).toThrow(StatsInputError);
    expect(() => pearsonCorrelation([1, 2, 3], [1, 2, Number.POSITIVE_INFINITY])).toThrow(StatsInputError);
  });
});
