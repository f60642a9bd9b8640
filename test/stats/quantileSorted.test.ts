import jStat from "jstat";
import { describe, expect, it } from "vitest";
import { createRandom } from "../../src/stats/createRandom.js";
import { quantileSorted } from "../../src/stats/quantileSorted.js";
import { StatsInputError } from "../../src/stats/StatsInputError.js";

const ONE_TO_THIRTY = Object.freeze(Array.from({ length: 30 }, (_, index) => index + 1));

describe("quantileSorted(sorted, p)", () => {
  it("quantileSorted(1…30, 1/3) = 10.667 and (…, 2/3) = 20.333 (tercile boundaries, type 7)", () => {
    // Empirical tercile boundaries of x = 1..30 by Hyndman & Fan type; type 7 gives
    // 10.667 / 20.333. Level C (recomputed); Hyndman R.J., Fan Y. (1996) "Sample quantiles in statistical
    // packages", The American Statistician 50:361–365, definition 7 (the paper's details: M, from memory).
    expect(quantileSorted(ONE_TO_THIRTY, 1 / 3)).toBeCloseTo(10.667, 3);
    expect(quantileSorted(ONE_TO_THIRTY, 2 / 3)).toBeCloseTo(20.333, 3);
    // Exact values: h = 29/3 → 10 + 2/3; h = 58/3 → 20 + 1/3.
    expect(quantileSorted(ONE_TO_THIRTY, 1 / 3)).toBeCloseTo(32 / 3, 12);
    expect(quantileSorted(ONE_TO_THIRTY, 2 / 3)).toBeCloseTo(61 / 3, 12);
  });

  it("quantileSorted([1…10], 0.25) = 3.25, R's quantile(1:10, 0.25) (from memory, M)", () => {
    // R default type 7: h = 9 × 0.25 = 2.25 → 3 + 0.25 × (4 − 3). The R output is quoted from memory.
    expect(quantileSorted([1, 2, 3, 4, 5, 6, 7, 8, 9, 10], 0.25)).toBe(3.25);
  });

  it("quantileSorted(x, p) matches jstat.quantiles(x, [p], 1, 1) (alphap = betap = 1 is type 7)", () => {
    const random = createRandom(12);
    for (let trial = 0; trial < 200; trial += 1) {
      const size = 1 + random.nextInt(60);
      // Rounded values so that ties occur.
      const values = Array.from({ length: size }, () => Math.round((random.nextFloat() * 20 - 10) * 4) / 4);
      const sorted = [...values].sort((a, b) => a - b);
      for (const p of [0.005, 0.025, 0.1, 1 / 3, 0.5, 2 / 3, 0.9, 0.975, 0.995, random.nextFloat()]) {
        const [expected] = jStat.quantiles(values, [p], 1, 1);
        expect(quantileSorted(sorted, p)).toBeCloseTo(expected as number, 10);
      }
    }
  });

  it("quantileSorted(x, 0) is the minimum, (x, 1) the maximum, (x, 0.5) the median (jstat.median)", () => {
    const sorted = [-4, -1, 0, 2, 2, 7, 30];
    expect(quantileSorted(sorted, 0)).toBe(-4);
    expect(quantileSorted(sorted, 1)).toBe(30);
    expect(quantileSorted(sorted, 0.5)).toBe(jStat.median(sorted));
    expect(quantileSorted([1, 2, 3, 4], 0.5)).toBe(jStat.median([1, 2, 3, 4]));
  });

  describe("edge cases", () => {
    it("quantileSorted([], p) is NaN", () => {
      expect(quantileSorted([], 0.5)).toBeNaN();
    });

    it("quantileSorted([x], p) is x for every p; all ties give the tied value", () => {
      expect(quantileSorted([3.5], 0.3)).toBe(3.5);
      expect(quantileSorted([2, 2, 2, 2], 0.77)).toBe(2);
    });

    it("p outside [0, 1] or NaN throws StatsInputError", () => {
      expect(() => quantileSorted([1, 2], -0.01)).toThrow(StatsInputError);
      expect(() => quantileSorted([1, 2], 1.01)).toThrow(StatsInputError);
      expect(() => quantileSorted([1, 2], Number.NaN)).toThrow(StatsInputError);
    });

    it("unsorted input or NaN values throw StatsInputError", () => {
      expect(() => quantileSorted([3, 1, 2], 0.5)).toThrow(StatsInputError);
      expect(() => quantileSorted([1, Number.NaN, 2], 0.5)).toThrow(StatsInputError);
    });
  });
});
