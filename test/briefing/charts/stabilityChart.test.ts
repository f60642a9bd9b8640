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

  it("each phase has its own colour, a band, a line and one marker per window with an estimate", () => {
    const svg = stabilityChart(input);
    const cold = plotted(svg, palette.series[0]);
    const warm = plotted(svg, palette.series[1]);
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
    const markers = plotted(svg, palette.series[0]).filter((element) => element.attributes.transform);
    expect(markers[0]?.attributes.transform).toMatch(/^translate\(68 /);
    expect(markers[9]?.attributes.transform).toMatch(/^translate\(656 /);
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
