import { describe, expect, it } from "vitest";
import { palette } from "../../../src/briefing/charts/palette.js";
import { rocCurveChart } from "../../../src/briefing/charts/rocCurveChart.js";
import { chartText, checkChartSvg, elementsWith } from "./svgAssertions.js";

const points = [
  { falseAlarmRate: 0.35, hitRate: 0.7 },
  { falseAlarmRate: 0.05, hitRate: 0.2 },
  { falseAlarmRate: 0.15, hitRate: 0.45 },
];

describe("rocCurveChart", () => {
  it("rocCurveChart({ points, area: 0.7234 }) writes 'Area 0.72' and labels both rates", () => {
    const text = chartText(checkChartSvg(rocCurveChart({ points, area: 0.7234 })));
    for (const label of ["Area 0.72", "False alarm rate", "Hit rate", "Hindcast ROC curve", "No skill (area 0.50)"]) expect(text).toContain(label);
  });

  it("the curve runs from (0, 0) through the points sorted by false alarm rate to (1, 1)", () => {
    const document = checkChartSvg(rocCurveChart({ points, area: 0.72 }));
    const curve = document.elements.find((element) => element.name === "path" && element.attributes.stroke === palette.estimate && element.ancestors.length === 1);
    // Plot x = 60 … 324, y = 250 … 12 on the default 340 × 330 chart (margins 12 / 16 / 80 / 60).
    const coordinates = (curve?.attributes.d ?? "").split(/[ML]/).filter(Boolean).map((pair) => pair.split(",").map(Number));
    expect(coordinates).toHaveLength(5);
    expect(coordinates[0]).toEqual([60, 250]);
    expect(coordinates[4]).toEqual([324, 12]);
    const xs = coordinates.map((pair) => pair[0]!);
    expect([...xs].sort((a, b) => a - b)).toEqual(xs);
    expect(coordinates[1]?.[0]).toBeCloseTo(60 + 0.05 * 264, 1);
    expect(elementsWith(document, "circle", "fill", palette.estimate).filter((element) => element.ancestors.length === 1)).toHaveLength(3);
  });

  it("area: null reads 'Area: not enough data'; no points gives 'not enough data' over the axes", () => {
    const document = checkChartSvg(rocCurveChart({ points: [{ falseAlarmRate: Number.NaN, hitRate: 0.5 }], area: null }));
    expect(chartText(document)).toContain("Area: not enough data");
    expect(elementsWith(document, "text", "class", "not-enough-data")).toHaveLength(1);
  });
});
