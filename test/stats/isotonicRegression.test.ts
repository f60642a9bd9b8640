import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { isotonicRegression, pavScratch, poolAdjacentViolators, poolAdjacentViolatorsInto } from "../../src/stats/isotonicRegression.js";
import { StatsInputError } from "../../src/stats/StatsInputError.js";

/**
 * Independent fit 1 (brute force, no pooling): enumerate every split of the distinct-x groups into
 * contiguous blocks (2^(m−1) splits), give each block its weighted mean, keep the splits whose block values
 * are non-decreasing, and return the one with the least sum of squared errors. The least-squares isotonic fit
 * is a step function whose levels are the means of its level sets, so it is among these candidates.
 */
function bruteForceIsotonic(x: readonly number[], y: readonly number[]): number[] {
  const distinct = [...new Set(x)].sort((a, b) => a - b);
  const groupSums = distinct.map((value) => y.filter((_, index) => x[index] === value).reduce((s, v) => s + v, 0));
  const groupCounts = distinct.map((value) => x.filter((other) => other === value).length);
  const groups = distinct.length;
  let bestError = Number.POSITIVE_INFINITY;
  let bestLevels: number[] = [];
  for (let mask = 0; mask < 2 ** Math.max(0, groups - 1); mask += 1) {
    const levels: number[] = [];
    let start = 0;
    for (let group = 0; group < groups; group += 1) {
      const cutAfter = group === groups - 1 || (mask & (1 << group)) !== 0;
      if (!cutAfter) continue;
      let sum = 0;
      let count = 0;
      for (let member = start; member <= group; member += 1) {
        sum += groupSums[member] as number;
        count += groupCounts[member] as number;
      }
      for (let member = start; member <= group; member += 1) levels.push(sum / count);
      start = group + 1;
    }
    if (levels.some((level, group) => group > 0 && level < (levels[group - 1] as number) - 1e-12)) continue;
    let error = 0;
    x.forEach((value, index) => {
      error += ((y[index] as number) - (levels[distinct.indexOf(value)] as number)) ** 2;
    });
    if (error < bestError - 1e-12) {
      bestError = error;
      bestLevels = levels;
    }
  }
  return x.map((value) => bestLevels[distinct.indexOf(value)] as number);
}

/**
 * Independent fit 2, the max–min formula: fitted value at group i = max over s ≤ i of min over t ≥ i of the
 * weighted mean of groups s … t (Barlow, Bartholomew, Bremner & Brunk 1972, Statistical Inference under Order
 * Restrictions, Wiley, theorem 1.4 — the theorem number is from memory).
 */
function maxMinIsotonic(x: readonly number[], y: readonly number[]): number[] {
  const distinct = [...new Set(x)].sort((a, b) => a - b);
  const sums = distinct.map((value) => y.filter((_, index) => x[index] === value).reduce((s, v) => s + v, 0));
  const counts = distinct.map((value) => x.filter((other) => other === value).length);
  const levels = distinct.map((_, i) => {
    let best = Number.NEGATIVE_INFINITY;
    for (let s = 0; s <= i; s += 1) {
      let smallest = Number.POSITIVE_INFINITY;
      for (let t = i; t < distinct.length; t += 1) {
        let sum = 0;
        let count = 0;
        for (let k = s; k <= t; k += 1) {
          sum += sums[k] as number;
          count += counts[k] as number;
        }
        smallest = Math.min(smallest, sum / count);
      }
      best = Math.max(best, smallest);
    }
    return best;
  });
  return x.map((value) => levels[distinct.indexOf(value)] as number);
}

function expectAllClose(actual: readonly number[], expected: readonly number[], digits = 12): void {
  expect(actual).toHaveLength(expected.length);
  actual.forEach((value, index) => expect(value).toBeCloseTo(expected[index] as number, digits));
}

describe("isotonicRegression(x, y)", () => {
  it("isotonicRegression(1…4, [23, 27, 25, 28]) → [23, 26, 26, 28]", () => {
    // Robert C.P., Casella G. (2004) Monte Carlo Statistical Methods, 2nd ed., Springer, exercise 1.18 on the
    // pool-adjacent-violators algorithm (exercise and data from memory); the violators 27 > 25 pool to 26.
    expectAllClose(isotonicRegression([1, 2, 3, 4], [23, 27, 25, 28]), [23, 26, 26, 28], 14);
  });

  it("isotonicRegression(0…6, [3, 7, 5, 9, 8, 7, 10]) → [3, 6, 6, 8, 8, 8, 10] and ([10, 0, 2]) → [4, 4, 4]", () => {
    // Expected values printed in scikit-learn's own test suite (sklearn/tests/test_isotonic.py,
    // test_isotonic_regression), a second implementation's reference output.
    expectAllClose(isotonicRegression([0, 1, 2, 3, 4, 5, 6], [3, 7, 5, 9, 8, 7, 10]), [3, 6, 6, 8, 8, 8, 10], 14);
    expectAllClose(isotonicRegression([0, 1, 2], [10, 0, 2]), [4, 4, 4], 14);
  });

  it("isotonicRegression(1…9, [1, 0, 4, 3, 3, 5, 4, 2, 0]) → [0.5, 0.5, 3, 3, 3, 3, 3, 3, 3]", () => {
    // R Core Team, R stats package, help page of isoreg(), first example `isoreg(c(1,0,4,3,3,5,4,2,0))`,
    // whose printed fitted values yf are 0.5 0.5 3 3 3 3 3 3 3 (the printout from memory; recomputed by hand:
    // 1,0 pool to 0.5; 4,3,3,5,4,2,0 pool to 21/7 = 3).
    const x = [1, 2, 3, 4, 5, 6, 7, 8, 9];
    expectAllClose(isotonicRegression(x, [1, 0, 4, 3, 3, 5, 4, 2, 0]), [0.5, 0.5, 3, 3, 3, 3, 3, 3, 3], 14);
    // Same help page, second example (last value 3 instead of 0): 4,3,3 pool to 10/3 and 5,4,2,3 to 3.5.
    expectAllClose(
      isotonicRegression(x, [1, 0, 4, 3, 3, 5, 4, 2, 3]),
      [0.5, 0.5, 10 / 3, 10 / 3, 10 / 3, 3.5, 3.5, 3.5, 3.5],
      14,
    );
    // Same help page, `isoreg(1:10, c(5, 9, 1:2, 5:8, 3, 8))`: 5,9,1,2 pool to 4.25 and 7,8,3 to 6.
    expectAllClose(
      isotonicRegression([1, 2, 3, 4, 5, 6, 7, 8, 9, 10], [5, 9, 1, 2, 5, 6, 7, 8, 3, 8]),
      [4.25, 4.25, 4.25, 4.25, 5, 6, 6, 6, 6, 8],
      14,
    );
  });

  it("pools equal x first, weighted by count: isotonicRegression([2, 1, 2, 3], [0, 1, 1, 0]) → all 0.5", () => {
    // Groups: x=1 → mean 1 (1 case), x=2 → mean 0.5 (2 cases), x=3 → 0. All pool: (1 + 1 + 0)/4 = 0.5.
    expectAllClose(isotonicRegression([2, 1, 2, 3], [0, 1, 1, 0]), [0.5, 0.5, 0.5, 0.5], 15);
    // x=1 → 0, x=2 → 0.5 (weight 2), x=3 → 0 (weight 1): the last two pool to (1 + 0)/3 = 1/3.
    expectAllClose(isotonicRegression([3, 2, 1, 2], [0, 1, 0, 0]), [1 / 3, 1 / 3, 0, 1 / 3], 15);
  });

  it("returns fitted values in input order when x is unsorted", () => {
    expectAllClose(isotonicRegression([4, 3, 2, 1], [28, 25, 27, 23]), [28, 26, 26, 23], 14);
  });

  it("agrees with a brute-force least-squares search over all monotone block splits (n ≤ 8)", () => {
    fc.assert(
      fc.property(
        fc.array(fc.tuple(fc.integer({ min: 0, max: 5 }), fc.integer({ min: -20, max: 20 })), {
          minLength: 1,
          maxLength: 8,
        }),
        (pairs) => {
          const x = pairs.map(([value]) => value);
          const y = pairs.map(([, value]) => value / 4);
          const actual = isotonicRegression(x, y);
          const expected = bruteForceIsotonic(x, y);
          return actual.every((value, index) => Math.abs(value - (expected[index] as number)) < 1e-9);
        },
      ),
      { seed: 20210223, numRuns: 400 },
    );
  });

  it("agrees with the max–min formula on binary outcomes with many ties (n ≤ 40)", () => {
    fc.assert(
      fc.property(
        fc.array(fc.tuple(fc.integer({ min: 0, max: 10 }), fc.boolean()), { minLength: 1, maxLength: 40 }),
        (pairs) => {
          const x = pairs.map(([value]) => value / 10);
          const y = pairs.map(([, event]) => (event ? 1 : 0));
          const actual = isotonicRegression(x, y);
          const expected = maxMinIsotonic(x, y);
          return actual.every((value, index) => Math.abs(value - (expected[index] as number)) < 1e-12);
        },
      ),
      { seed: 1955, numRuns: 300 },
    );
  });

  describe("edge cases", () => {
    it("isotonicRegression([], []) is []; one case fits itself; all x equal fit the mean", () => {
      expect(isotonicRegression([], [])).toEqual([]);
      expect(isotonicRegression([0.4], [1])).toEqual([1]);
      expectAllClose(isotonicRegression([0.3, 0.3, 0.3], [1, 0, 0]), [1 / 3, 1 / 3, 1 / 3], 15);
    });

    it("a decreasing sequence pools to its mean everywhere", () => {
      expectAllClose(isotonicRegression([1, 2, 3, 4], [4, 3, 2, 1]), [2.5, 2.5, 2.5, 2.5], 15);
    });

    it("mismatched lengths, NaN and infinite values throw StatsInputError", () => {
      expect(() => isotonicRegression([1, 2], [1])).toThrow(StatsInputError);
      expect(() => isotonicRegression([Number.NaN], [1])).toThrow(StatsInputError);
      expect(() => isotonicRegression([1], [Number.POSITIVE_INFINITY])).toThrow(StatsInputError);
    });
  });
});

describe("poolAdjacentViolatorsInto — the resampling loops' PAV without allocation", () => {
  it("gives bit for bit poolAdjacentViolators' fitted values, at any offset and stride (fast-check)", () => {
    fc.assert(
      fc.property(
        fc.array(fc.tuple(fc.integer({ min: 0, max: 12 }), fc.integer({ min: 1, max: 9 })), { minLength: 1, maxLength: 40 }),
        fc.integer({ min: 0, max: 3 }),
        fc.integer({ min: 1, max: 4 }),
        (groups, offset, stride) => {
          // Means as in a resample: events / cases, so every value is an exact ratio of small integers.
          const means = groups.map(([events, cases]) => Math.min(events, cases) / cases);
          const weights = groups.map(([, cases]) => cases);
          const out = new Float64Array(offset + stride * groups.length);
          poolAdjacentViolatorsInto(means, weights, groups.length, out, offset, stride, pavScratch(groups.length));
          const expected = poolAdjacentViolators(means, weights);
          expect(groups.map((_, g) => out[offset + stride * g])).toEqual(expected);
        },
      ),
      { numRuns: 300, seed: 11 },
    );
  });
});
