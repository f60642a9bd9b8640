import { describe, expect, it } from "vitest";
import { palette } from "../../../src/briefing/charts/palette.js";
import { phaseSpaceScatter, type PhaseSpaceScatterInput } from "../../../src/briefing/charts/phaseSpaceScatter.js";
import { chartText, checkChartSvg, elementsWith } from "./svgAssertions.js";

const points = Array.from({ length: 60 }, (_, index) => ({
  x: Math.sin(index) * 1.5,
  y: Math.cos(index * 1.7),
  fireYear: index % 7 === 0,
  year: 1700 + index,
}));
const input: PhaseSpaceScatterInput = Object.freeze({
  xName: "ENSO",
  yName: "PDO",
  points,
  current: { x: 1.2, y: 0.9 },
  xCuts: [-0.5, 0.5],
  yCuts: [-0.4, 0.4],
});

describe("phaseSpaceScatter", () => {
  it("phaseSpaceScatter(input) draws other years as grey circles and fire years as amber triangles", () => {
    const document = checkChartSvg(phaseSpaceScatter(input));
    const plotted = (colour: string) => document.elements.filter((element) => element.attributes.fill === colour && element.ancestors.length === 1);
    expect(plotted(palette.otherYear).filter((element) => element.name === "circle")).toHaveLength(51);
    const triangles = plotted(palette.fireYear).filter((element) => element.name === "path");
    expect(triangles).toHaveLength(9);
    expect(new Set(triangles.map((triangle) => triangle.attributes.d)).size).toBe(1);
  });

  it("phaseSpaceScatter(input) labels the axes, the legend and the current season 'This season'", () => {
    const document = checkChartSvg(phaseSpaceScatter(input));
    const text = chartText(document);
    for (const label of ["ENSO", "PDO", "Other years", "High-fire years", "Phase cuts", "This season"]) expect(text).toContain(label);
    expect(elementsWith(document, "path", "fill", palette.current).filter((element) => element.ancestors.length === 1)).toHaveLength(1);
  });

  it("each cut is a dashed line across the plot", () => {
    const document = checkChartSvg(phaseSpaceScatter(input));
    const cuts = elementsWith(document, "line", "stroke-dasharray", "5 4").filter((element) => element.ancestors.length === 1);
    expect(cuts).toHaveLength(4);
    expect(cuts.filter((line) => line.attributes.x1 === line.attributes.x2)).toHaveLength(2);
  });

  it("current: null draws no 'This season'; points with a null coordinate are left out", () => {
    const svg = phaseSpaceScatter({ ...input, current: null, points: [...points, { x: null, y: 1, fireYear: true, year: 1900 }] });
    const document = checkChartSvg(svg);
    expect(chartText(document)).not.toContain("This season");
    expect(document.elements.filter((element) => element.attributes.fill === palette.fireYear && element.ancestors.length === 1)).toHaveLength(9);
  });

  it("no points gives 'not enough data' over the axes (and still shows a known current season)", () => {
    const document = checkChartSvg(phaseSpaceScatter({ ...input, points: [], xCuts: [], yCuts: [] }));
    expect(elementsWith(document, "text", "class", "not-enough-data")).toHaveLength(1);
    expect(chartText(document)).toContain("This season");
    const bare = checkChartSvg(phaseSpaceScatter({ xName: "A", yName: "B", points: [], current: { x: null, y: null }, xCuts: [], yCuts: [] }));
    expect(chartText(bare)).toContain("not enough data");
  });

  it("hostile index names are escaped", () => {
    const svg = phaseSpaceScatter({ ...input, xName: "<script>x</script>", yName: "a&b" });
    const document = checkChartSvg(svg);
    expect(svg).toContain("&lt;script&gt;x&lt;/script&gt;");
    expect(chartText(document)).toContain("a&b");
  });

  it("phaseSpaceScatter(input) writes 'This season' once, on a white panel, never as stroked (doubled) text", () => {
    const svg = phaseSpaceScatter(input);
    const document = checkChartSvg(svg);
    expect(document.texts.filter((text) => text.includes("This season"))).toHaveLength(1);
    expect(svg).not.toContain("paint-order");
    expect(elementsWith(document, "rect", "class", "label-panel")).toHaveLength(1);
  });
});
