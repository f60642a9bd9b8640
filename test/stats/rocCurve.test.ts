import { describe, expect, it } from "vitest";
import { rocCurve } from "../../src/stats/rocCurve.js";
import { StatsInputError } from "../../src/stats/StatsInputError.js";

describe("rocCurve(scores, outcomes)", () => {
  it("Hanley & McNeil (1982) Table I ratings give the published cumulative operating points", () => {
    // Hanley J.A., McNeil B.J. (1982) Radiology 143(1):29–36, Table I (data as quoted by secondary sources).
    // Calling "abnormal" at rating ≥ t: abnormal counts from the top 33, 44, 46, 48, 51 of 51;
    // normal counts 2, 13, 19, 25, 58 of 58 (cumulated from the table by hand).
    const ratings: number[] = [];
    const abnormal: (0 | 1)[] = [];
    [33, 6, 6, 11, 2].forEach((count, index) => {
      for (let case_ = 0; case_ < count; case_ += 1) {
        ratings.push(index + 1);
        abnormal.push(0);
      }
    });
    [3, 2, 2, 11, 33].forEach((count, index) => {
      for (let case_ = 0; case_ < count; case_ += 1) {
        ratings.push(index + 1);
        abnormal.push(1);
      }
    });
    const curve = rocCurve(ratings, abnormal);
    expect(curve.map((point) => point.threshold)).toEqual([Number.POSITIVE_INFINITY, 5, 4, 3, 2, 1]);
    const expectedHits = [0, 33, 44, 46, 48, 51].map((count) => count / 51);
    const expectedFalseAlarms = [0, 2, 13, 19, 25, 58].map((count) => count / 58);
    curve.forEach((point, index) => {
      expect(point.hitRate).toBeCloseTo(expectedHits[index] as number, 14);
      expect(point.falseAlarmRate).toBeCloseTo(expectedFalseAlarms[index] as number, 14);
    });
  });

  it("rocCurve([0.9, 0.6, 0.6, 0.2], [1, 1, 0, 0]) moves diagonally through the tie", () => {
    expect(rocCurve([0.9, 0.6, 0.6, 0.2], [1, 1, 0, 0])).toEqual([
      { threshold: Number.POSITIVE_INFINITY, hitRate: 0, falseAlarmRate: 0 },
      { threshold: 0.9, hitRate: 0.5, falseAlarmRate: 0 },
      { threshold: 0.6, hitRate: 1, falseAlarmRate: 0.5 },
      { threshold: 0.2, hitRate: 1, falseAlarmRate: 1 },
    ]);
  });

  it("runs from (0, 0) to (1, 1), non-decreasing in both rates, one point per distinct score plus one", () => {
    const scores = [0.3, 0.1, 0.8, 0.3, 0.5, 0.9, 0.1, 0.7];
    const outcomes = [false, false, true, true, false, true, false, false];
    const curve = rocCurve(scores, outcomes);
    expect(curve).toHaveLength(new Set(scores).size + 1);
    expect(curve[0]).toMatchObject({ hitRate: 0, falseAlarmRate: 0 });
    expect(curve[curve.length - 1]).toMatchObject({ hitRate: 1, falseAlarmRate: 1 });
    for (let index = 1; index < curve.length; index += 1) {
      const previous = curve[index - 1] as { hitRate: number; falseAlarmRate: number; threshold: number };
      const current = curve[index] as { hitRate: number; falseAlarmRate: number; threshold: number };
      expect(current.threshold).toBeLessThan(previous.threshold);
      expect(current.hitRate).toBeGreaterThanOrEqual(previous.hitRate);
      expect(current.falseAlarmRate).toBeGreaterThanOrEqual(previous.falseAlarmRate);
    }
  });

  describe("edge cases", () => {
    it("no events or no non-events gives []", () => {
      expect(rocCurve([0.1, 0.2], [0, 0])).toEqual([]);
      expect(rocCurve([0.1, 0.2], [true, true])).toEqual([]);
      expect(rocCurve([], [])).toEqual([]);
    });

    it("mismatched lengths, a non-finite score or an outcome of 2 throw StatsInputError", () => {
      expect(() => rocCurve([0.1], [0, 1])).toThrow(StatsInputError);
      expect(() => rocCurve([Number.POSITIVE_INFINITY, 0.2], [0, 1])).toThrow(StatsInputError);
      expect(() => rocCurve([0.1, 0.2], [0, 2 as 1])).toThrow(StatsInputError);
    });
  });
});
