import jStat from "jstat";
import { describe, expect, it } from "vitest";
import { brierScore } from "../../src/stats/brierScore.js";
import { brierSkillScore } from "../../src/stats/brierSkillScore.js";
import { StatsInputError } from "../../src/stats/StatsInputError.js";

describe("brierSkillScore(score, referenceScore)", () => {
  it("brierSkillScore(0.0375, 0.25) = 0.85: the four-case example against its 50 % climatology", () => {
    // BS = 0.0375: the scikit-learn brier_score_loss docstring example (docstring from memory; recomputed) and
    // BSS = 1 − BS/BS_ref with BS_ref = ō(1 − ō) = 0.25 for ō = 1/2 (definition, AMS Glossary, read).
    const outcomes: (0 | 1)[] = [0, 1, 1, 0];
    const score = brierScore([0.1, 0.9, 0.8, 0.3], outcomes);
    const climatology = brierScore([0.5, 0.5, 0.5, 0.5], outcomes);
    expect(climatology).toBe(0.25);
    expect(brierSkillScore(score, climatology)).toBeCloseTo(0.85, 14);
  });

  it("the climatological reference score ō(1 − ō) equals jstat's population variance of the outcomes", () => {
    // Finley J.P. (1884) American Meteorological Journal 1:85–88, tornado table: 51 tornadoes in 2803 cases;
    // forecasts 0/1 give BS = 95/2803.
    const outcomes: (0 | 1)[] = [...new Array<0 | 1>(51).fill(1), ...new Array<0 | 1>(2752).fill(0)];
    const frequency = 51 / 2803;
    const reference = brierScore(outcomes.map(() => frequency), outcomes);
    expect(reference).toBeCloseTo(jStat.variance(outcomes), 14);
    expect(reference).toBeCloseTo(frequency * (1 - frequency), 14);
    // Derived (C): Finley's yes/no forecasts are worse than forecasting the climatological frequency.
    expect(brierSkillScore(95 / 2803, reference)).toBeCloseTo(1 - 95 / 2803 / (frequency * (1 - frequency)), 11);
    expect(brierSkillScore(95 / 2803, reference)).toBeLessThan(0);
  });

  it("perfect forecasts score 1, the reference itself 0", () => {
    expect(brierSkillScore(0, 0.2)).toBe(1);
    expect(brierSkillScore(0.2, 0.2)).toBe(0);
  });

  describe("edge cases", () => {
    it("brierSkillScore(s, 0) and NaN inputs are NaN", () => {
      expect(brierSkillScore(0.1, 0)).toBeNaN();
      expect(brierSkillScore(0, 0)).toBeNaN();
      expect(brierSkillScore(Number.NaN, 0.2)).toBeNaN();
      expect(brierSkillScore(0.1, Number.NaN)).toBeNaN();
    });

    it("negative or infinite scores throw StatsInputError", () => {
      expect(() => brierSkillScore(-0.1, 0.2)).toThrow(StatsInputError);
      expect(() => brierSkillScore(0.1, -0.2)).toThrow(StatsInputError);
      expect(() => brierSkillScore(Number.POSITIVE_INFINITY, 0.2)).toThrow(StatsInputError);
    });
  });
});
