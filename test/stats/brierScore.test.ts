import jStat from "jstat";
import { describe, expect, it } from "vitest";
import { brierScore } from "../../src/stats/brierScore.js";
import { createRandom } from "../../src/stats/createRandom.js";
import { StatsInputError } from "../../src/stats/StatsInputError.js";

/**
 * Finley's tornado forecasts (Finley J.P. (1884) American Meteorological Journal 1:85–88): H 28, F 72, M 23,
 * C 2680 as 0/1 forecasts and outcomes.
 */
function finleyCases(): { forecasts: number[]; outcomes: (0 | 1)[] } {
  const forecasts: number[] = [];
  const outcomes: (0 | 1)[] = [];
  const add = (count: number, forecast: 0 | 1, outcome: 0 | 1): void => {
    for (let index = 0; index < count; index += 1) {
      forecasts.push(forecast);
      outcomes.push(outcome);
    }
  };
  add(28, 1, 1);
  add(72, 1, 0);
  add(23, 0, 1);
  add(2680, 0, 0);
  return { forecasts, outcomes };
}

describe("brierScore(probabilities, outcomes)", () => {
  it("brierScore([0.1, 0.9, 0.8, 0.3], [0, 1, 1, 0]) = 0.0375", () => {
    // The scikit-learn brier_score_loss docstring example, 0.0375 — the docstring is quoted
    // from memory (M); the value is recomputed (C): (0.01 + 0.01 + 0.04 + 0.09)/4 = 0.0375.
    expect(brierScore([0.1, 0.9, 0.8, 0.3], [0, 1, 1, 0])).toBeCloseTo(0.0375, 15);
  });

  it("brierScore of Finley's 0/1 tornado forecasts = 95/2803 = 0.03389", () => {
    // Finley J.P. (1884) American Meteorological Journal 1:85–88 (table as quoted by secondary sources);
    // BS = (misses + false alarms)/N = 95/2803 is level C.
    const { forecasts, outcomes } = finleyCases();
    expect(brierScore(forecasts, outcomes)).toBeCloseTo(95 / 2803, 15);
    expect(brierScore(forecasts, outcomes)).toBeCloseTo(0.03389, 5);
  });

  it("brierScore(p, o) equals jstat.mean of squared errors on random forecasts", () => {
    const random = createRandom(44);
    for (let trial = 0; trial < 50; trial += 1) {
      const size = 1 + random.nextInt(200);
      const probabilities = Array.from({ length: size }, () => random.nextFloat());
      const outcomes = Array.from({ length: size }, () => (random.nextInt(2) === 1 ? 1 : 0) as 0 | 1);
      const squaredErrors = probabilities.map((p, index) => (p - (outcomes[index] as number)) ** 2);
      expect(brierScore(probabilities, outcomes)).toBeCloseTo(jStat.mean(squaredErrors), 14);
    }
  });

  it("brierScore(p, o) is half of Brier's (1950) two-category sum", () => {
    // Brier G.W. (1950) Monthly Weather Review 78(1):1–3 sums over event and non-event (the 0–2 range is from memory).
    const probabilities = [0.05, 0.4, 0.75, 1, 0];
    const outcomes: (0 | 1)[] = [0, 1, 0, 1, 0];
    const twoCategory = jStat.mean(
      probabilities.map((p, index) => {
        const o = outcomes[index] as number;
        return (p - o) ** 2 + (1 - p - (1 - o)) ** 2;
      }),
    );
    expect(2 * brierScore(probabilities, outcomes)).toBeCloseTo(twoCategory, 15);
  });

  it("boolean outcomes score like 0/1; perfect forecasts score 0 and certain wrong ones 1", () => {
    expect(brierScore([0.2, 0.7], [false, true])).toBe(brierScore([0.2, 0.7], [0, 1]));
    expect(brierScore([1, 0, 1], [1, 0, true])).toBe(0);
    expect(brierScore([1, 0], [0, 1])).toBe(1);
  });

  describe("edge cases", () => {
    it("brierScore([], []) is NaN", () => {
      expect(brierScore([], [])).toBeNaN();
    });

    it("probabilities outside [0, 1] or NaN, mismatched lengths and outcome 2 throw StatsInputError", () => {
      expect(() => brierScore([1.2], [1])).toThrow(StatsInputError);
      expect(() => brierScore([-0.1], [0])).toThrow(StatsInputError);
      expect(() => brierScore([Number.NaN], [0])).toThrow(StatsInputError);
      expect(() => brierScore([0.5, 0.5], [1])).toThrow(StatsInputError);
      expect(() => brierScore([0.5], [2 as 1])).toThrow(StatsInputError);
    });
  });
});
