import { describe, expect, it } from "vitest";
import { categoryOddsBar, type CategoryOddsBarInput } from "../../../src/briefing/charts/categoryOddsBar.js";
import { palette } from "../../../src/briefing/charts/palette.js";
import { chartText, checkChartSvg, elementsWith } from "./svgAssertions.js";

const input: CategoryOddsBarInput = Object.freeze({
  below: { estimate: 0.18, lower: 0.1, upper: 0.3 },
  near: { estimate: 0.29, lower: 0.19, upper: 0.41 },
  above: { estimate: 0.53, lower: 0.4, upper: 0.66 },
  averageYear: { below: 0.49, near: 0.19, above: 0.32 },
});
// Default 340 × 236 chart: plot y = 34 … 182 (148 units).
const PLOT_TOP = 34;
const PLOT_BOTTOM = 182;

describe("categoryOddsBar", () => {
  it("categoryOddsBar(input) names the three categories and writes each as 'p%' over '(lo–hi%)'", () => {
    const text = chartText(checkChartSvg(categoryOddsBar(input)));
    for (const label of ["Below normal", "Near normal", "Above normal", "18%", "(10–30%)", "29%", "(19–41%)", "53%", "(40–66%)", "Chance", "This season, 95% interval", "Average year", "avg 49%", "avg 19%", "avg 32%"]) {
      expect(text).toContain(label);
    }
  });

  it("bars use the below / near / above colours and their heights are proportional to the chance", () => {
    const document = checkChartSvg(categoryOddsBar(input));
    const bars = [palette.below, palette.near, palette.above].map((colour) => elementsWith(document, "rect", "fill", colour)[0]);
    const span = PLOT_BOTTOM - PLOT_TOP;
    expect(Number(bars[0]?.attributes.height)).toBeCloseTo(0.18 * span, 1);
    expect(Number(bars[2]?.attributes.height)).toBeCloseTo(0.53 * span, 1);
    expect(Number(bars[2]?.attributes.y) + Number(bars[2]?.attributes.height)).toBeCloseTo(PLOT_BOTTOM, 1);
  });

  it("each bar carries an average-year (khaki) marker at its realised share (49% at y = 182 − 0.49 × 148), no one-third line", () => {
    const document = checkChartSvg(categoryOddsBar(input));
    const markers = elementsWith(document, "path", "class", "average-year");
    expect(markers).toHaveLength(3);
    const heights = markers.map((marker) => Number(/translate\([\d.]+ ([\d.]+)\)/.exec(marker.attributes.transform ?? "")?.[1]));
    expect(heights[0]).toBeCloseTo(PLOT_BOTTOM - 0.49 * (PLOT_BOTTOM - PLOT_TOP), 1);
    expect(heights[1]).toBeCloseTo(PLOT_BOTTOM - 0.19 * (PLOT_BOTTOM - PLOT_TOP), 1);
    expect(markers.every((marker) => marker.attributes.fill === palette.baseRate)).toBe(true);
    expect(elementsWith(document, "line", "stroke-dasharray", "6 4")).toHaveLength(0);
    expect(chartText(document)).not.toContain("Equal odds");
  });

  it("prints its smallest text at 11 units or more in a 340-unit-wide chart (≈ 8 pt at 88 mm)", () => {
    const svg = categoryOddsBar(input);
    const sizes = [...svg.matchAll(/font-size="([\d.]+)"/g)].map((match) => Number(match[1]));
    expect(Math.min(...sizes)).toBeGreaterThanOrEqual(11);
    expect(svg).toContain('viewBox="0 0 340 236"');
    // 11 units of 340 at 88 mm: 11 × 88 / 340 mm = 2.85 mm = 8.1 pt (1 pt = 0.3528 mm).
  });

  it("a null estimate reads 'not enough data' under its category; all null adds the notice over the axes", () => {
    const partly = checkChartSvg(categoryOddsBar({ ...input, near: { estimate: null, lower: null, upper: null } }));
    expect(chartText(partly)).toContain("not enough data");
    expect(elementsWith(partly, "rect", "fill", palette.near)).toHaveLength(0);
    const none = { estimate: null, lower: null, upper: null };
    const empty = checkChartSvg(
      categoryOddsBar({ below: none, near: none, above: { estimate: Number.NaN, lower: null, upper: null }, averageYear: { below: null, near: null, above: null } }),
    );
    expect(elementsWith(empty, "text", "class", "not-enough-data")).toHaveLength(1);
  });
});
