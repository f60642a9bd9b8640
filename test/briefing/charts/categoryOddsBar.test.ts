import { describe, expect, it } from "vitest";
import { categoryOddsBar, type CategoryOddsBarInput } from "../../../src/briefing/charts/categoryOddsBar.js";
import { palette } from "../../../src/briefing/charts/palette.js";
import { chartText, checkChartSvg, elementsWith } from "./svgAssertions.js";

const input: CategoryOddsBarInput = Object.freeze({
  below: { estimate: 0.18, lower: 0.1, upper: 0.3 },
  near: { estimate: 0.29, lower: 0.19, upper: 0.41 },
  above: { estimate: 0.53, lower: 0.4, upper: 0.66 },
});

describe("categoryOddsBar", () => {
  it("categoryOddsBar(input) names the three categories and writes each as 'p%' over '(lo–hi%)'", () => {
    const text = chartText(checkChartSvg(categoryOddsBar(input)));
    for (const label of ["Below normal", "Near normal", "Above normal", "18%", "(10–30%)", "29%", "(19–41%)", "53%", "(40–66%)", "Equal odds", "(33%)", "Chance"]) {
      expect(text).toContain(label);
    }
  });

  it("bars use the below / near / above colours and their heights are proportional to the chance", () => {
    const document = checkChartSvg(categoryOddsBar(input));
    const bars = [palette.below, palette.near, palette.above].map((colour) => elementsWith(document, "rect", "fill", colour)[0]);
    // Plot y = 16 … 182 (166 units) on the default 680 × 240 chart.
    expect(Number(bars[0]?.attributes.height)).toBeCloseTo(0.18 * 166, 1);
    expect(Number(bars[2]?.attributes.height)).toBeCloseTo(0.53 * 166, 1);
    expect(Number(bars[2]?.attributes.y) + Number(bars[2]?.attributes.height)).toBeCloseTo(182, 1);
  });

  it("the one-third reference line is dashed at y = 182 − 166 / 3", () => {
    const document = checkChartSvg(categoryOddsBar(input));
    const reference = elementsWith(document, "line", "stroke-dasharray", "6 4")[0];
    expect(Number(reference?.attributes.y1)).toBeCloseTo(182 - 166 / 3, 1);
  });

  it("a null estimate reads 'not enough data' under its category; all null adds the notice over the axes", () => {
    const partly = checkChartSvg(categoryOddsBar({ ...input, near: { estimate: null, lower: null, upper: null } }));
    expect(chartText(partly)).toContain("not enough data");
    expect(elementsWith(partly, "rect", "fill", palette.near)).toHaveLength(0);
    const none = { estimate: null, lower: null, upper: null };
    const empty = checkChartSvg(categoryOddsBar({ below: none, near: none, above: { estimate: Number.NaN, lower: null, upper: null } }));
    expect(elementsWith(empty, "text", "class", "not-enough-data")).toHaveLength(1);
  });
});
