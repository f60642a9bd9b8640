import { describe, expect, it } from "vitest";
import { selectFireYears } from "../../src/record/selectFireYears.js";

// Hand-counted examples of the high-fire-year rule (README, "Methods"): threshold = activity of the ceil(top × N)-th
// highest year; fire years have activity ≥ threshold and > 0; ties are all in.
describe("selectFireYears(activity, years, top, measure)", () => {
  const years = [1, 2, 3, 4, 5, 6, 7, 8, 9, 10];
  const activity = new Map([
    [1, 0], [2, 0.5], [3, 0.2], [4, 0.5], [5, 0], [6, 0.1], [7, 0.9], [8, 0], [9, 0.2], [10, 0.05],
  ]);

  it("takes the ceil(0.1 × 10) = 1st highest year as threshold", () => {
    const selection = selectFireYears(activity, years, 0.1, "fraction");
    expect(selection.threshold).toBe(0.9);
    expect(selection.years).toEqual([7]);
    expect(selection.realisedShare).toBe(0.1);
  });

  it("keeps every year tied at the threshold and reports the realised share", () => {
    // ceil(0.2 × 10) = 2nd highest = 0.5, shared by years 2 and 4 → 3 fire years, share 0.3
    const selection = selectFireYears(activity, years, 0.2, "fraction");
    expect(selection.threshold).toBe(0.5);
    expect(selection.years).toEqual([2, 4, 7]);
    expect(selection.realisedShare).toBeCloseTo(0.3, 12);
  });

  it("never calls a zero-activity year a fire year", () => {
    // ceil(0.9 × 10) = 9th highest = 0 → only years with activity > 0 are fire years
    const selection = selectFireYears(activity, years, 0.9, "fraction");
    expect(selection.years).toEqual([2, 3, 4, 6, 7, 9, 10]);
    expect(selection.threshold).toBe(0.05);
  });

  it("returns no fire years and a null threshold when no year burned", () => {
    const none = selectFireYears(new Map([[1, 0], [2, 0]]), [1, 2], 0.1, "sites");
    expect(none.threshold).toBeNull();
    expect(none.years).toEqual([]);
    expect(selectFireYears(new Map(), [], 0.1, "sites").calibrationYears).toBe(0);
  });

  it("takes exactly ceil(top × N) years when top × N is whole but not exact in floating point", () => {
    // 0.07 × 100 = 7.000000000000001 and 0.55 × 100 = 55.00000000000001 in binary floating point
    const hundred = Array.from({ length: 100 }, (_, i) => i + 1);
    const distinct = new Map(hundred.map((year) => [year, year / 100]));
    expect(selectFireYears(distinct, hundred, 0.07, "fraction").years).toHaveLength(7);
    expect(selectFireYears(distinct, hundred, 0.55, "fraction").years).toHaveLength(55);
  });
});
