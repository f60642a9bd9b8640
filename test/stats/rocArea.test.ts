import { wilcoxonRankSum } from "simple-statistics";
import { describe, expect, it } from "vitest";
import { createRandom } from "../../src/stats/createRandom.js";
import { rocArea } from "../../src/stats/rocArea.js";
import { rocCurve } from "../../src/stats/rocCurve.js";
import { StatsInputError } from "../../src/stats/StatsInputError.js";

/**
 * Hanley J.A., McNeil B.J. (1982) "The meaning and use of the area under a receiver operating characteristic
 * (ROC) curve", Radiology 143(1):29–36, Table I: CT ratings 1 (definitely normal) … 5 (definitely abnormal) of
 * 58 normal and 51 abnormal images, published area 0.893 (data and area as quoted by secondary sources; the
 * table itself was not seen).
 */
const HANLEY_MCNEIL = Object.freeze(
  (() => {
    const ratings: number[] = [];
    const abnormal: (0 | 1)[] = [];
    const normalCounts = [33, 6, 6, 11, 2];
    const abnormalCounts = [3, 2, 2, 11, 33];
    normalCounts.forEach((count, index) => {
      for (let case_ = 0; case_ < count; case_ += 1) {
        ratings.push(index + 1);
        abnormal.push(0);
      }
    });
    abnormalCounts.forEach((count, index) => {
      for (let case_ = 0; case_ < count; case_ += 1) {
        ratings.push(index + 1);
        abnormal.push(1);
      }
    });
    return { ratings, abnormal };
  })(),
);

/** O(n²) Mann–Whitney pair count: the share of (event, non-event) pairs ranked right, ties ½. */
function pairCountArea(scores: readonly number[], outcomes: readonly (0 | 1)[]): number {
  let favourable = 0;
  let pairs = 0;
  scores.forEach((eventScore, eventIndex) => {
    if (outcomes[eventIndex] !== 1) return;
    scores.forEach((otherScore, otherIndex) => {
      if (outcomes[otherIndex] !== 0) return;
      pairs += 1;
      favourable += eventScore > otherScore ? 1 : eventScore === otherScore ? 0.5 : 0;
    });
  });
  return favourable / pairs;
}

describe("rocArea(scores, outcomes)", () => {
  it("Hanley & McNeil (1982) Table I ratings → area 0.893, standard error 0.032", () => {
    const { area, standardError } = rocArea(HANLEY_MCNEIL.ratings, HANLEY_MCNEIL.abnormal);
    // Published area 0.893 (Hanley & McNeil 1982, Table I data); recomputed: 0.893171.
    expect(area).toBeCloseTo(0.893, 3);
    expect(area).toBeCloseTo(0.893171, 6);
    // Published SE 0.032 is from memory (M); recomputed with their formula (C): 0.032487.
    expect(standardError).toBeCloseTo(0.032, 3);
    expect(standardError).toBeCloseTo(0.032487, 6);
  });

  it("rocArea equals an O(n²) pair count with ties ½ and the trapezoidal area under rocCurve", () => {
    const random = createRandom(17);
    for (let trial = 0; trial < 60; trial += 1) {
      const size = 2 + random.nextInt(80);
      // Coarse scores so that ties are common.
      const scores = Array.from({ length: size }, () => random.nextInt(8) / 7);
      const outcomes = Array.from({ length: size }, () => (random.nextInt(3) === 0 ? 1 : 0) as 0 | 1);
      if (!outcomes.includes(1) || !outcomes.includes(0)) continue;
      const { area } = rocArea(scores, outcomes);
      expect(area).toBeCloseTo(pairCountArea(scores, outcomes), 12);
      const curve = rocCurve(scores, outcomes);
      let trapezoid = 0;
      for (let index = 1; index < curve.length; index += 1) {
        const previous = curve[index - 1] as { hitRate: number; falseAlarmRate: number };
        const current = curve[index] as { hitRate: number; falseAlarmRate: number };
        trapezoid += ((current.falseAlarmRate - previous.falseAlarmRate) * (current.hitRate + previous.hitRate)) / 2;
      }
      expect(area).toBeCloseTo(trapezoid, 12);
    }
  });

  it("rocArea equals the Mann–Whitney U from simple-statistics' rank sum: A = (R₁ − n₁(n₁ + 1)/2)/(n₁n₀)", () => {
    // Mason S.J., Graham N.E. (2002) "Areas beneath the relative operating characteristics (ROC) and relative
    // operating levels (ROL) curves", Q. J. R. Meteorol. Soc. 128:2145–2166: the ROC area is U/(n₁n₀).
    // simple-statistics' wilcoxonRankSum gives tied values their average rank (mid-ranks).
    const check = (scores: readonly number[], outcomes: readonly (0 | 1)[]): void => {
      const events = scores.filter((_, index) => outcomes[index] === 1);
      const nonEvents = scores.filter((_, index) => outcomes[index] === 0);
      const rankSum = wilcoxonRankSum([...events], [...nonEvents]);
      const u = rankSum - (events.length * (events.length + 1)) / 2;
      expect(rocArea(scores, outcomes).area).toBeCloseTo(u / (events.length * nonEvents.length), 12);
    };
    check(HANLEY_MCNEIL.ratings, HANLEY_MCNEIL.abnormal);
    const random = createRandom(23);
    for (let trial = 0; trial < 60; trial += 1) {
      const size = 2 + random.nextInt(120);
      const scores = Array.from({ length: size }, () => random.nextInt(6) / 5);
      const outcomes = Array.from({ length: size }, () => (random.nextInt(4) === 0 ? 1 : 0) as 0 | 1);
      if (!outcomes.includes(1) || !outcomes.includes(0)) continue;
      check(scores, outcomes);
    }
  });

  it("standard error follows Hanley & McNeil (1982) with Q1 = A/(2 − A), Q2 = 2A²/(1 + A)", () => {
    const scores = [0.9, 0.8, 0.7, 0.6, 0.55, 0.4, 0.3, 0.2, 0.1];
    const outcomes: (0 | 1)[] = [1, 1, 0, 1, 0, 1, 0, 0, 0];
    const { area, standardError } = rocArea(scores, outcomes);
    expect(area).toBeCloseTo(pairCountArea(scores, outcomes), 14); // 17/20
    const q1 = area / (2 - area);
    const q2 = (2 * area * area) / (1 + area);
    const expected = Math.sqrt((area * (1 - area) + 3 * (q1 - area ** 2) + 4 * (q2 - area ** 2)) / 20);
    expect(standardError).toBeCloseTo(expected, 14);
  });

  it("perfect discrimination gives area 1 and SE 0; reversed gives 0; all tied gives 0.5; booleans work", () => {
    expect(rocArea([3, 4, 1, 2], [true, true, false, false])).toEqual({ area: 1, standardError: 0 });
    expect(rocArea([1, 2, 3, 4], [1, 1, 0, 0]).area).toBe(0);
    expect(rocArea([5, 5, 5, 5], [1, 0, 1, 0]).area).toBe(0.5);
  });

  describe("edge cases", () => {
    it("no events or no non-events gives NaN area and standard error", () => {
      const none = rocArea([0.2, 0.4], [0, 0]);
      expect(none.area).toBeNaN();
      expect(none.standardError).toBeNaN();
      expect(rocArea([0.2, 0.4], [1, 1]).area).toBeNaN();
      expect(rocArea([], []).area).toBeNaN();
    });

    it("mismatched lengths, a non-finite score or an outcome of 2 throw StatsInputError", () => {
      expect(() => rocArea([0.1], [0, 1])).toThrow(StatsInputError);
      expect(() => rocArea([Number.NaN, 0.2], [0, 1])).toThrow(StatsInputError);
      expect(() => rocArea([0.1, 0.2], [0, 2 as 1])).toThrow(StatsInputError);
    });
  });
});
