import { describe, expect, it } from "vitest";
import { activityCategories, categoryOf } from "../../src/record/activityCategories.js";

describe("activityCategories(activity, years)", () => {
  it("splits 1..30 at the type-7 terciles 10.667 and 20.333 into 10/10/10 (Hyndman & Fan 1996, The American Statistician 50:361–365, definition 7; recomputed)", () => {
    const years = Array.from({ length: 30 }, (_, i) => i + 1);
    const result = activityCategories(new Map(years.map((y) => [y, y])), years);
    expect(result.lowerCut).toBeCloseTo(10.6667, 4);
    expect(result.upperCut).toBeCloseTo(20.3333, 4);
    expect(result.realisedShares).toEqual({ below: 1 / 3, near: 1 / 3, above: 1 / 3 });
  });

  it("puts every zero-fire year in one category when half the years had no fire", () => {
    // 6 zeros and 6 positive values: lower tercile 0, so all zeros are below normal (6/12).
    const values = [0, 0, 0, 0, 0, 0, 0.1, 0.2, 0.3, 0.4, 0.5, 0.6];
    const years = values.map((_, i) => 2000 + i);
    const result = activityCategories(new Map(years.map((y, i) => [y, values[i] as number])), years);
    expect(result.lowerCut).toBe(0);
    expect(result.realisedShares.below).toBe(0.5);
    expect(result.realisedShares.below + result.realisedShares.near + result.realisedShares.above).toBeCloseTo(1, 12);
    for (const year of years) expect(result.byYear.has(year)).toBe(true);
  });

  it("still gives each year exactly one category when two thirds had no fire", () => {
    const values = [0, 0, 0, 0, 0, 0, 0, 0, 0.3, 0.4, 0.5, 0.6];
    const years = values.map((_, i) => i);
    const result = activityCategories(new Map(years.map((y, i) => [y, values[i] as number])), years);
    expect(result.realisedShares).toEqual({ below: 8 / 12, near: 0, above: 4 / 12 });
  });

  it("classifies held-out years with the training cuts", () => {
    const years = [1, 2, 3];
    const result = activityCategories(new Map([[1, 0], [2, 1], [3, 2], [9, 5]]), years, [9]);
    expect(result.byYear.get(9)).toBe("above");
    expect(categoryOf(0.667, 0.667, 1.333)).toBe("below");
    expect(categoryOf(1.334, 0.667, 1.333)).toBe("above");
  });
});
