import { describe, expect, it } from "vitest";
import fc from "fast-check";
import jStat from "jstat";
import { wilsonInterval } from "../../src/stats/wilsonInterval.js";
import { StatsInputError } from "../../src/stats/StatsInputError.js";
import {
  newcombe1998Examples,
  newcombe1998Wilson81of263FullPrecision,
  z975,
} from "../fixtures/published/binomialProportionIntervals.js";

/** Wilson limits written out independently with jstat's normal quantile (jstat used only in tests). */
function wilsonWithJstat(successes: number, trials: number, confidence: number): [number, number] {
  const z = jStat.normal.inv((1 + confidence) / 2, 0, 1);
  const p = successes / trials;
  const denominator = 1 + (z * z) / trials;
  const centre = (p + (z * z) / (2 * trials)) / denominator;
  const half = (z / denominator) * Math.sqrt((p * (1 - p)) / trials + (z * z) / (4 * trials * trials));
  return [centre - half, centre + half];
}

describe("wilsonInterval(successes, trials, confidence = 0.95)", () => {
  // Newcombe R.G. (1998) Statistics in Medicine 17:857–872, illustrative table, method 3 (V-secondary + C).
  it.each(newcombe1998Examples)(
    "wilsonInterval($successes, $trials) matches Newcombe (1998) Table I, method 3",
    ({ successes, trials, wilson }) => {
      const interval = wilsonInterval(successes, trials);
      expect(interval.estimate).toBe(successes / trials);
      expect(Math.abs(interval.lower - wilson[0])).toBeLessThan(5e-5);
      expect(Math.abs(interval.upper - wilson[1])).toBeLessThan(5e-5);
    },
  );

  it("wilsonInterval(81, 263) matches the full-precision limits 0.255289–0.366210 (C, scipy)", () => {
    const interval = wilsonInterval(81, 263);
    expect(interval.lower).toBeCloseTo(newcombe1998Wilson81of263FullPrecision.lower, 6);
    expect(interval.upper).toBeCloseTo(newcombe1998Wilson81of263FullPrecision.upper, 6);
  });

  it("uses the exact z = 1.959963985… from the normal quantile (agrees with jstat.normal.inv)", () => {
    expect(jStat.normal.inv(0.975, 0, 1)).toBeCloseTo(z975, 9);
    // With z exact the 95 % Wilson interval for 1/1 has lower limit 1/(1 + z²).
    expect(wilsonInterval(1, 1).lower).toBeCloseTo(1 / (1 + z975 * z975), 14);
  });

  it.each([
    [81, 263, 0.95],
    [15, 148, 0.9],
    [1, 29, 0.99],
    [7, 7, 0.8],
  ])("wilsonInterval(%i, %i, %f) agrees with an independent jstat computation", (successes, trials, confidence) => {
    const [lower, upper] = wilsonWithJstat(successes, trials, confidence);
    const interval = wilsonInterval(successes, trials, confidence);
    expect(interval.lower).toBeCloseTo(Math.max(0, lower), 10);
    expect(interval.upper).toBeCloseTo(Math.min(1, upper), 10);
  });

  it("wilsonInterval(0, 20) has lower limit exactly 0 and wilsonInterval(20, 20) upper limit exactly 1", () => {
    expect(wilsonInterval(0, 20).lower).toBe(0);
    expect(wilsonInterval(20, 20).upper).toBe(1);
    // Symmetry: the interval for n − x is the mirror image of the interval for x.
    const mirrored = wilsonInterval(20, 20);
    expect(mirrored.lower).toBeCloseTo(1 - wilsonInterval(0, 20).upper, 14);
  });

  it("wilsonInterval(0, 0) is all NaN (a proportion of no trials is undefined)", () => {
    const interval = wilsonInterval(0, 0);
    expect(interval.estimate).toBeNaN();
    expect(interval.lower).toBeNaN();
    expect(interval.upper).toBeNaN();
  });

  it("a wider confidence level gives a wider interval", () => {
    const narrow = wilsonInterval(15, 148, 0.8);
    const wide = wilsonInterval(15, 148, 0.99);
    expect(wide.lower).toBeLessThan(narrow.lower);
    expect(wide.upper).toBeGreaterThan(narrow.upper);
  });

  it.each([
    [-1, 10, 0.95],
    [1.5, 10, 0.95],
    [11, 10, 0.95],
    [1, -2, 0.95],
    [1, Number.NaN, 0.95],
    [1, Number.POSITIVE_INFINITY, 0.95],
    [1, 10, 0],
    [1, 10, 1],
    [1, 10, Number.NaN],
  ])("wilsonInterval(%f, %f, %f) throws StatsInputError", (successes, trials, confidence) => {
    expect(() => wilsonInterval(successes, trials, confidence)).toThrow(StatsInputError);
  });

  it("property: for any 0 ≤ x ≤ n, lower ≤ x/n ≤ upper", () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 1, max: 5000 }).chain((trials) => fc.tuple(fc.integer({ min: 0, max: trials }), fc.constant(trials))),
        fc.double({ min: 0.5, max: 0.999, noNaN: true }),
        ([successes, trials], confidence) => {
          const interval = wilsonInterval(successes, trials, confidence);
          // 0 ≤ lower and upper ≤ 1 are not asserted: wilsonInterval clamps to them, so those could not fail.
          return interval.lower <= interval.estimate && interval.estimate <= interval.upper;
        },
      ),
    );
  });
});
