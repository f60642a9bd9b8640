import { describe, expect, it } from "vitest";
import fc from "fast-check";
import jStat from "jstat";
import { jeffreysInterval } from "../../src/stats/jeffreysInterval.js";
import { StatsInputError } from "../../src/stats/StatsInputError.js";
import { newcombe1998Examples } from "../fixtures/published/binomialProportionIntervals.js";

describe("jeffreysInterval(successes, trials, confidence = 0.95)", () => {
  it("jeffreysInterval(13, 16) → 0.5792 to 0.9442 (Fagerland, Lydersen & Laake 2017, chapter 2)", () => {
    // Fagerland M.W., Lydersen S., Laake P. (2017) Statistical Analysis of Contingency Tables, Chapman &
    // Hall/CRC, chapter 2 "The 1×2 table and the binomial distribution": the 13-of-16 example, Jeffreys 95 % CI
    // 0.5792 to 0.9442 as printed by the book's companion R package contingencytables (its chapter 2 test,
    // `Jeffreys_CI_1x2(X = 13, n = 16)`); the book's table number is not quoted here (not seen).
    const interval = jeffreysInterval(13, 16);
    expect(interval.estimate).toBe(0.8125);
    expect(interval.lower).toBeCloseTo(0.5792, 4);
    expect(interval.upper).toBeCloseTo(0.9442, 4);
  });

  // Newcombe's (1998) four examples. Brown, Cai & DasGupta (2001) publish no Jeffreys values for them:
  // the expected limits are C only (derived with scipy, not a published number).
  it.each(newcombe1998Examples)(
    "jeffreysInterval($successes, $trials) matches the derived limits (C only)",
    ({ successes, trials, jeffreys }) => {
      const interval = jeffreysInterval(successes, trials);
      expect(interval.estimate).toBe(successes / trials);
      expect(Math.abs(interval.lower - jeffreys[0])).toBeLessThan(5e-5);
      expect(Math.abs(interval.upper - jeffreys[1])).toBeLessThan(5e-5);
    },
  );

  it.each([
    [81, 263, 0.95],
    [15, 148, 0.9],
    [1, 29, 0.99],
    [3, 4, 0.8],
  ])("jeffreysInterval(%i, %i, %f) agrees with jstat.beta.inv of Beta(x + ½, n − x + ½)", (successes, trials, confidence) => {
    const alpha = (1 - confidence) / 2;
    const interval = jeffreysInterval(successes, trials, confidence);
    expect(interval.lower).toBeCloseTo(jStat.beta.inv(alpha, successes + 0.5, trials - successes + 0.5), 8);
    expect(interval.upper).toBeCloseTo(jStat.beta.inv(1 - alpha, successes + 0.5, trials - successes + 0.5), 8);
  });

  it("applies the Brown, Cai & DasGupta (2001) §4.1.2 boundary rule: lower 0 at x = 0, upper 1 at x = n", () => {
    const none = jeffreysInterval(0, 20);
    expect(none.lower).toBe(0);
    expect(none.upper).toBeCloseTo(jStat.beta.inv(0.975, 0.5, 20.5), 8);
    const all = jeffreysInterval(20, 20);
    expect(all.upper).toBe(1);
    expect(all.lower).toBeCloseTo(1 - none.upper, 10);
  });

  it("jeffreysInterval(0, 0) is all NaN (a proportion of no trials is undefined)", () => {
    const interval = jeffreysInterval(0, 0);
    expect([interval.estimate, interval.lower, interval.upper].every(Number.isNaN)).toBe(true);
  });

  it.each([
    [-1, 10, 0.95],
    [2.5, 10, 0.95],
    [11, 10, 0.95],
    [0, -1, 0.95],
    [1, 10, 1.2],
    [1, 10, -0.1],
  ])("jeffreysInterval(%f, %f, %f) throws StatsInputError", (successes, trials, confidence) => {
    expect(() => jeffreysInterval(successes, trials, confidence)).toThrow(StatsInputError);
  });

  it("jeffreysInterval(1, 5, 0.01) lies above 1/5: at a very low level the posterior median, pulled towards ½, leads", () => {
    const interval = jeffreysInterval(1, 5, 0.01);
    expect(interval.lower).toBeGreaterThan(0.2);
    expect(interval.lower).toBeCloseTo(jStat.beta.inv(0.495, 1.5, 4.5), 8);
  });

  it("property: for any 0 ≤ x ≤ n, lower ≤ x/n ≤ upper", () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 1, max: 2000 }).chain((trials) => fc.tuple(fc.integer({ min: 0, max: trials }), fc.constant(trials))),
        fc.double({ min: 0.5, max: 0.999, noNaN: true }),
        ([successes, trials], confidence) => {
          const interval = jeffreysInterval(successes, trials, confidence);
          // 0 ≤ lower and upper ≤ 1 are not asserted: Beta quantiles cannot leave [0, 1], so those could not fail.
          return interval.lower <= interval.estimate && interval.estimate <= interval.upper;
        },
      ),
      { seed: 2001 },
    );
  });
});
