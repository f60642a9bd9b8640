import { describe, expect, it } from "vitest";
import { buildTrainingSet } from "../../src/calibrate/buildTrainingSet.js";
import { forecastCell } from "../../src/calibrate/forecastCell.js";
import type { IndexSettings } from "../../src/workspace/types.js";

// 40 invented years: X cycles through its three phases, Y alternates between two; every 4th year burns.
const years = Array.from({ length: 40 }, (_, i) => 2000 + i);
const activity = new Map(years.map((year, i) => [year, i % 4 === 0 ? 0.5 : 0]));
const x = new Map(years.map((year, i) => [year, [-1, 0, 1][i % 3] as number]));
const y = new Map(years.map((year, i) => [year, i % 2 === 0 ? -1 : 1]));
const settings: IndexSettings[] = [
  { name: "X", file: "f", column: "X", phases: { kind: "cuts", cuts: [-0.5, 0.5], labels: ["low", "mid", "high"] }, months: null },
  { name: "Y", file: "f", column: "Y", phases: { kind: "cuts", cuts: [0], labels: ["neg", "pos"] }, months: null },
];
const training = buildTrainingSet({ years, activity, indexValues: new Map([["X", x], ["Y", y]]), indexSettings: settings, top: 0.25, measure: "fraction" });
const current = new Map([["X", 2], ["Y", 0]]);
const rank = (qX: number, qY: number) => [
  { index: "X", chiSquare: 9, pValue: 0.001, qValue: qX },
  { index: "Y", chiSquare: 4, pValue: 0.01, qValue: qY },
];

describe("forecastCell(training, current, ranking, jointMinYears, jointMaxQ)", () => {
  it("uses the joint phase when both indices have a clear link and the cell is large enough", () => {
    // X high = i % 3 = 2; Y neg = i even → i ≡ 2 (mod 6): 2, 8, 14, 20, 26, 32, 38 → 7 years
    const cell = forecastCell(training, current, rank(0.01, 0.02), 5, 0.05);
    expect(cell.basis).toBe("joint");
    expect(cell.years).toHaveLength(7);
    // fire years are i % 4 = 0 among those: 8, 20, 32 → 3
    expect(cell.fireYears).toBe(3);
  });

  it("leaves out an index whose link is not clear (q above jointMaxQ)", () => {
    const cell = forecastCell(training, current, rank(0.01, 0.2), 5, 0.05);
    expect(cell.basis).toBe("single");
    expect(cell.indices).toEqual(["X"]);
    expect(cell.years).toHaveLength(13); // i % 3 = 2 for i < 40
  });

  it("falls back to the single index when the joint cell is too small, and to all years without current values", () => {
    expect(forecastCell(training, current, rank(0.01, 0.02), 8, 0.05).basis).toBe("single");
    const none = forecastCell(training, new Map(), rank(0.01, 0.02), 5, 0.05);
    expect(none.basis).toBe("climatology");
    expect(none.years).toHaveLength(40);
    expect(none.fireYears).toBe(10);
  });
});
