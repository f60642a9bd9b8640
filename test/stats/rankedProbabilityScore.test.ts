import jStat from "jstat";
import { describe, expect, it } from "vitest";
import { brierScore } from "../../src/stats/brierScore.js";
import { createRandom } from "../../src/stats/createRandom.js";
import { rankedProbabilityScore } from "../../src/stats/rankedProbabilityScore.js";
import { StatsInputError } from "../../src/stats/StatsInputError.js";

const CLIMATOLOGY = Object.freeze([1 / 3, 1 / 3, 1 / 3]);

describe("rankedProbabilityScore(probabilities, observedCategory, options?)", () => {
  it("rankedProbabilityScore([0.2, 0.5, 0.3], 0) = 0.8² + 0.3² = 0.73, normalized 0.365 (Wilks's example)", () => {
    // The three-category forecast (0.2, 0.5, 0.3) with the first category observed: the example that the R
    // package verification's rps() help page (Pocernich M.) labels "Example from Wilks", citing Wilks D.S.
    // (2005/2006) Statistical Methods in the Atmospheric Sciences, 2nd ed., Academic Press, chapter 7 (ranked
    // probability score section; page not seen). rps() divides by K − 1 and so gives 0.365. Both values are
    // recomputed here from the definition: cumulative forecast 0.2, 0.7, 1 against cumulative observation 1, 1, 1.
    expect(rankedProbabilityScore([0.2, 0.5, 0.3], 0)).toBeCloseTo(0.73, 14);
    expect(rankedProbabilityScore([0.2, 0.5, 0.3], 0, { normalized: true })).toBeCloseTo(0.365, 14);
  });

  it("agrees with an independent jstat cumsum computation Σ (cumsum p − cumsum o)² on random forecasts", () => {
    const random = createRandom(1969);
    for (let trial = 0; trial < 200; trial += 1) {
      const categoryCount = 2 + random.nextInt(7);
      const weights = Array.from({ length: categoryCount }, () => random.nextFloat() + 1e-3);
      const total = jStat.sum(weights);
      const probabilities = weights.map((weight) => weight / total);
      const observed = random.nextInt(categoryCount);
      const indicator = probabilities.map((_, category) => (category === observed ? 1 : 0));
      const forecastCumulative = jStat.cumsum(probabilities);
      const observedCumulative = jStat.cumsum(indicator);
      const expected = jStat.sum(forecastCumulative.map((value, category) => (value - (observedCumulative[category] as number)) ** 2));
      expect(rankedProbabilityScore(probabilities, observed)).toBeCloseTo(expected, 12);
    }
  });

  // Tercile checks recomputed by hand (derived, not published numbers). Definition: Epstein E.S. (1969) "A
  // scoring system for probability forecasts of ranked categories", J. Appl. Meteor. 8:985–987, and Murphy A.H.
  // (1971) "A note on the ranked probability score", J. Appl. Meteor. 10:155–156 (the normalisation convention
  // of the original is from memory).
  it.each([
    { label: "lower", category: 0, unnormalized: 5 / 9, normalized: 0.2778, shown: "5/9" },
    { label: "middle", category: 1, unnormalized: 2 / 9, normalized: 0.1111, shown: "2/9" },
    { label: "upper", category: 2, unnormalized: 5 / 9, normalized: 0.2778, shown: "5/9" },
  ])("rankedProbabilityScore((⅓, ⅓, ⅓), $category) = $shown, normalized $normalized ($label observed)", ({
    category,
    unnormalized,
    normalized,
  }) => {
    const probabilities = CLIMATOLOGY;
    expect(rankedProbabilityScore(probabilities, category)).toBeCloseTo(unnormalized, 14);
    expect(rankedProbabilityScore(probabilities, category, { normalized: true })).toBeCloseTo(normalized, 4);
    expect(rankedProbabilityScore(probabilities, category, { normalized: false })).toBeCloseTo(unnormalized, 14);
  });

  it("rankedProbabilityScore([0.2, 0.3, 0.5], 2) = 0.29 and (…, 0) = 0.89", () => {
    expect(rankedProbabilityScore([0.2, 0.3, 0.5], 2)).toBeCloseTo(0.29, 14);
    expect(rankedProbabilityScore([0.2, 0.3, 0.5], 0)).toBeCloseTo(0.89, 14);
  });

  it("equals the sum of Brier scores of the cumulative events 'at or below k' (k = 1 … K − 1)", () => {
    const random = createRandom(71);
    for (let trial = 0; trial < 100; trial += 1) {
      const categoryCount = 2 + random.nextInt(5);
      const weights = Array.from({ length: categoryCount }, () => random.nextFloat() + 1e-3);
      const total = jStat.sum(weights);
      const probabilities = weights.map((weight) => weight / total);
      const observed = random.nextInt(categoryCount);
      let sumOfBrierScores = 0;
      let cumulative = 0;
      for (let category = 0; category < categoryCount - 1; category += 1) {
        cumulative += probabilities[category] as number;
        sumOfBrierScores += brierScore([Math.min(1, cumulative)], [observed <= category ? 1 : 0]);
      }
      expect(rankedProbabilityScore(probabilities, observed)).toBeCloseTo(sumOfBrierScores, 12);
      expect(rankedProbabilityScore(probabilities, observed, { normalized: true })).toBeCloseTo(
        sumOfBrierScores / (categoryCount - 1),
        12,
      );
    }
  });

  it("K = 2: the RPS is the Brier score of the first category", () => {
    expect(rankedProbabilityScore([0.7, 0.3], 0)).toBeCloseTo(brierScore([0.7], [1]), 15);
    expect(rankedProbabilityScore([0.7, 0.3], 1)).toBeCloseTo(brierScore([0.7], [0]), 15);
  });

  it("a certain correct forecast scores 0; certain in the far wrong category scores K − 1", () => {
    expect(rankedProbabilityScore([0, 0, 1], 2)).toBe(0);
    expect(rankedProbabilityScore([1, 0, 0], 2)).toBe(2);
    expect(rankedProbabilityScore([1, 0, 0], 2, { normalized: true })).toBe(1);
  });

  describe("contract breaks throw StatsInputError", () => {
    it("one category, probabilities not summing to 1, a probability outside [0, 1], a bad category", () => {
      expect(() => rankedProbabilityScore([1], 0)).toThrow(StatsInputError);
      expect(() => rankedProbabilityScore([0.5, 0.4], 0)).toThrow(StatsInputError);
      expect(() => rankedProbabilityScore([1.5, -0.5], 0)).toThrow(StatsInputError);
      expect(() => rankedProbabilityScore(CLIMATOLOGY, 3)).toThrow(StatsInputError);
      expect(() => rankedProbabilityScore(CLIMATOLOGY, -1)).toThrow(StatsInputError);
      expect(() => rankedProbabilityScore(CLIMATOLOGY, 1.5)).toThrow(StatsInputError);
    });

    it("rounded percentages (0.33, 0.33, 0.34) are accepted, a sum off by 1e-3 is not", () => {
      expect(rankedProbabilityScore([0.33, 0.33, 0.34], 1)).toBeCloseTo(0.33 ** 2 + 0.34 ** 2, 14);
      expect(() => rankedProbabilityScore([0.333, 0.333, 0.333], 1)).toThrow(StatsInputError);
    });
  });
});
