import { describe, expect, it } from "vitest";
import { palette } from "../../../src/briefing/charts/palette.js";
import { stabilityChart, type StabilityChartInput } from "../../../src/briefing/charts/stabilityChart.js";
import { chartText, checkChartSvg, elementsWith } from "./svgAssertions.js";

const windows = Array.from({ length: 10 }, (_, index) => ({
  first: 1700 + 10 * index,
  last: 1799 + 10 * index,
  phases: [
    { label: "cold", estimate: 0.05, lower: 0.01, upper: 0.14 },
    { label: "warm", estimate: index === 4 ? null : 0.25, lower: index === 4 ? null : 0.15, upper: index === 4 ? null : 0.38 },
  ],
}));
const input: StabilityChartInput = Object.freeze({ windows, labels: ["cold", "warm"], baseRate: 0.11 });

const plotted = (svg: string, colour: string) =>
  checkChartSvg(svg).elements.filter((element) => element.ancestors.length === 1 && (element.attributes.stroke === colour || element.attributes.fill === colour));

describe("stabilityChart", () => {
  it("stabilityChart(input) labels the axes, the phases and the base rate", () => {
    const text = chartText(checkChartSvg(stabilityChart(input)));
    for (const label of ["Middle year of window", "Chance of a high-fire year", "cold", "warm", "Average year (11%)", "95% interval"]) {
      expect(text).toContain(label);
    }
  });

  it("each phase takes its position's colour (first, last), with a band, a line and one marker per window with an estimate", () => {
    const svg = stabilityChart(input);
    const cold = plotted(svg, palette.phaseFirst);
    const warm = plotted(svg, palette.phaseLast);
    // band + line + 10 markers; warm misses one window
    expect(cold).toHaveLength(12);
    expect(warm).toHaveLength(11);
    const warmLine = warm.find((element) => element.attributes.fill === "none");
    expect(warmLine?.attributes.d?.match(/M/g)).toHaveLength(2);
    const coldMarkers = cold.filter((element) => element.attributes.transform);
    const warmMarkers = warm.filter((element) => element.attributes.transform);
    expect(coldMarkers[0]?.attributes.d).not.toBe(warmMarkers[0]?.attributes.d);
  });

  it("markers sit at the window middle years: first at (1700 + 1799) / 2 on the left edge", () => {
    const svg = stabilityChart(input);
    const markers = plotted(svg, palette.phaseFirst).filter((element) => element.attributes.transform);
    expect(markers[0]?.attributes.transform).toMatch(/^translate\(68 /);
    expect(markers[9]?.attributes.transform).toMatch(/^translate\(656 /);
  });

  it("three or more phases: middle phases share the middle colour, a second middle phase is dotted; the average year is khaki and dashed", () => {
    const labels = ["a", "b", "c", "d"];
    const svg = stabilityChart({ labels, baseRate: 0.1, windows: [{ first: 1700, last: 1799, phases: labels.map((label) => ({ label, estimate: 0.2, lower: 0.1, upper: 0.3 })) }, { first: 1710, last: 1809, phases: labels.map((label) => ({ label, estimate: 0.25, lower: 0.1, upper: 0.4 })) }] });
    const document = checkChartSvg(svg);
    const lines = document.elements.filter((element) => element.name === "path" && element.attributes.fill === "none" && element.ancestors.length === 1);
    expect(lines.map((element) => element.attributes.stroke)).toEqual([palette.phaseFirst, palette.phaseMiddle, palette.phaseMiddle, palette.phaseLast]);
    expect(lines.map((element) => element.attributes["stroke-dasharray"])).toEqual([undefined, undefined, "2 2", undefined]);
    const base = elementsWith(document, "line", "stroke", palette.baseRate).filter((element) => element.ancestors.length === 1);
    expect(base).toHaveLength(1);
    expect(base[0]?.attributes["stroke-dasharray"]).toBe("6 4");
  });

  it("no windows, or all-null estimates, gives 'not enough data' over the axes", () => {
    for (const empty of [
      { windows: [], labels: ["cold"], baseRate: null },
      { windows: windows.map((window) => ({ ...window, phases: [] })), labels: ["cold"], baseRate: 0.1 },
    ]) {
      const document = checkChartSvg(stabilityChart(empty));
      expect(elementsWith(document, "text", "class", "not-enough-data")).toHaveLength(1);
    }
  });

  it("a hostile phase label is escaped", () => {
    const svg = stabilityChart({ ...input, labels: ["<script>x</script>"], windows: [{ first: 1700, last: 1799, phases: [{ label: "<script>x</script>", estimate: 0.2, lower: 0.1, upper: 0.3 }] }] });
    const document = checkChartSvg(svg);
    expect(chartText(document)).toContain("<script>x</script>");
    expect(svg).toContain("&lt;script&gt;x&lt;/script&gt;");
  });
});
