import jStat from "jstat";
import { describe, expect, it } from "vitest";
import { createRandom } from "../../src/stats/createRandom.js";
import { rankedProbabilityScore } from "../../src/stats/rankedProbabilityScore.js";
import { rankedProbabilitySkillScore } from "../../src/stats/rankedProbabilitySkillScore.js";
import { StatsInputError } from "../../src/stats/StatsInputError.js";

describe("rankedProbabilitySkillScore(meanScore, meanReferenceScore)", () => {
  it("rankedProbabilitySkillScore(0.29, 5/9) = 1 − 0.29 × 9/5 = 0.478", () => {
    // REFERENCES.md §7 derived tercile checks (C): (0.2, 0.3, 0.5) with upper observed scores 0.29,
    // climatology 5/9; RPSS = 1 − RPS̄/RPS̄_clim (definition; no published numeric RPSS example found).
    const score = rankedProbabilityScore([0.2, 0.3, 0.5], 2);
    const reference = rankedProbabilityScore([1 / 3, 1 / 3, 1 / 3], 2);
    expect(rankedProbabilitySkillScore(score, reference)).toBeCloseTo(0.478, 14);
  });

  it("the skill score is the same for normalized and unnormalized means (jstat.mean over 60 forecasts)", () => {
    const random = createRandom(5);
    const forecasts = Array.from({ length: 60 }, () => {
      const below = random.nextFloat() * 0.6;
      const near = random.nextFloat() * (1 - below);
      return [below, near, 1 - below - near];
    });
    const observed = forecasts.map(() => random.nextInt(3));
    const scores = (normalized: boolean): number[] =>
      forecasts.map((forecast, index) => rankedProbabilityScore(forecast, observed[index] as number, { normalized }));
    const references = (normalized: boolean): number[] =>
      observed.map((category) => rankedProbabilityScore([1 / 3, 1 / 3, 1 / 3], category, { normalized }));
    const plain = rankedProbabilitySkillScore(jStat.mean(scores(false)), jStat.mean(references(false)));
    const normalized = rankedProbabilitySkillScore(jStat.mean(scores(true)), jStat.mean(references(true)));
    expect(normalized).toBeCloseTo(plain, 13);
    const sumRatio = jStat.sum(scores(false)) / jStat.sum(references(false));
    expect(plain).toBeCloseTo(1 - sumRatio, 13);
  });

  it("perfect forecasts score 1, the reference itself 0", () => {
    expect(rankedProbabilitySkillScore(0, 0.4)).toBe(1);
    expect(rankedProbabilitySkillScore(0.4, 0.4)).toBe(0);
  });

  describe("edge cases", () => {
    it("a zero reference score or NaN input gives NaN", () => {
      expect(rankedProbabilitySkillScore(0.2, 0)).toBeNaN();
      expect(rankedProbabilitySkillScore(Number.NaN, 0.5)).toBeNaN();
    });

    it("negative or infinite scores throw StatsInputError", () => {
      expect(() => rankedProbabilitySkillScore(-1, 0.5)).toThrow(StatsInputError);
      expect(() => rankedProbabilitySkillScore(0.1, Number.POSITIVE_INFINITY)).toThrow(StatsInputError);
    });
  });
});
