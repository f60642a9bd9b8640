import jStat from "jstat";
import { describe, expect, it } from "vitest";
import { createRandom } from "../../src/stats/createRandom.js";
import { rankedProbabilityScore } from "../../src/stats/rankedProbabilityScore.js";
import { rankedProbabilitySkillScore } from "../../src/stats/rankedProbabilitySkillScore.js";
import { StatsInputError } from "../../src/stats/StatsInputError.js";

describe("rankedProbabilitySkillScore(meanScore, meanReferenceScore)", () => {
  it("rankedProbabilitySkillScore(0.29, 5/9) = 1 − 0.29 × 9/5 = 0.478", () => {
    // Derived tercile check (recomputed, not a published number): (0.2, 0.3, 0.5) with the upper tercile observed
    // scores 0.29, climatology 5/9; RPSS = 1 − RPS̄/RPS̄_clim (Epstein 1969, J. Appl. Meteor. 8:985–987).
    const score = rankedProbabilityScore([0.2, 0.3, 0.5], 2);
    const reference = rankedProbabilityScore([1 / 3, 1 / 3, 1 / 3], 2);
    expect(rankedProbabilitySkillScore(score, reference)).toBeCloseTo(0.478, 14);
  });

  it("Wilks's forecast (0.2, 0.5, 0.3), first category observed, against climatology: 1 − 0.73/(5/9) = −0.314", () => {
    // The forecast of the "Example from Wilks" on the R package verification's rps() help page (Wilks D.S.,
    // Statistical Methods in the Atmospheric Sciences, 2nd ed., Academic Press, chapter 7; page not seen): RPS
    // 0.73 (unnormalized). Climatology (⅓, ⅓, ⅓) scores (2/3)² + (1/3)² = 5/9 there, so the forecast is worse
    // than climatology: RPSS = 1 − 0.73 · 9/5 = −0.314 (derived). The normalized forms give the same RPSS.
    const plain = rankedProbabilitySkillScore(
      rankedProbabilityScore([0.2, 0.5, 0.3], 0),
      rankedProbabilityScore([1 / 3, 1 / 3, 1 / 3], 0),
    );
    expect(plain).toBeCloseTo(-0.314, 12);
    const normalized = rankedProbabilitySkillScore(
      rankedProbabilityScore([0.2, 0.5, 0.3], 0, { normalized: true }),
      rankedProbabilityScore([1 / 3, 1 / 3, 1 / 3], 0, { normalized: true }),
    );
    expect(normalized).toBeCloseTo(-0.314, 12);
  });

  it("equals 1 − Σ RPS / Σ RPS_clim computed independently with jstat cumsums over 80 forecasts", () => {
    const random = createRandom(55);
    const rps = (probabilities: readonly number[], observed: number): number => {
      const forecast = jStat.cumsum([...probabilities]);
      const outcome = jStat.cumsum(probabilities.map((_, category) => (category === observed ? 1 : 0)));
      return jStat.sum(forecast.map((value, category) => (value - (outcome[category] as number)) ** 2));
    };
    const forecasts = Array.from({ length: 80 }, () => {
      const weights = [random.nextFloat() + 0.05, random.nextFloat() + 0.05, random.nextFloat() + 0.05];
      const total = jStat.sum(weights);
      return weights.map((weight) => weight / total);
    });
    const observed = forecasts.map(() => random.nextInt(3));
    const scores = forecasts.map((forecast, index) => rankedProbabilityScore(forecast, observed[index] as number));
    const references = observed.map((category) => rankedProbabilityScore([1 / 3, 1 / 3, 1 / 3], category));
    const independent =
      1 -
      jStat.sum(forecasts.map((forecast, index) => rps(forecast, observed[index] as number))) /
        jStat.sum(observed.map((category) => rps([1 / 3, 1 / 3, 1 / 3], category)));
    expect(rankedProbabilitySkillScore(jStat.mean(scores), jStat.mean(references))).toBeCloseTo(independent, 12);
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
