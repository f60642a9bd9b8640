import { describe, expect, it } from "vitest";
import { palette } from "../../../src/briefing/charts/palette.js";
import { reliabilityDiagram, type ReliabilityDiagramInput } from "../../../src/briefing/charts/reliabilityDiagram.js";
import { chartText, checkChartSvg, elementsWith } from "./svgAssertions.js";

const input: ReliabilityDiagramInput = Object.freeze({
  bins: [
    { lower: 0, upper: 0.1, count: 120, meanForecast: 0.05, observedFrequency: 0.04 },
    { lower: 0.1, upper: 0.2, count: 80, meanForecast: 0.15, observedFrequency: 0.12 },
    { lower: 0.2, upper: 0.3, count: 30, meanForecast: 0.25, observedFrequency: 0.2 },
    { lower: 0.3, upper: 0.4, count: 0, meanForecast: null, observedFrequency: null },
  ],
  climatology: 0.11,
});

/** x of every `<text>` whose whole content is one of the given labels, in document order. */
const textXs = (svg: string, labels: readonly string[]) =>
  [...svg.matchAll(/<text\b[^>]*\bx="([^"]+)"[^>]*>([^<]*)<\/text>/g)]
    .filter((match) => labels.includes(match[2] ?? ""))
    .map((match) => Number(match[1]));

const dots = (svg: string) => checkChartSvg(svg).elements.filter((element) => element.name === "circle" && element.ancestors.length === 1);

describe("reliabilityDiagram", () => {
  it("reliabilityDiagram(input) labels the axes, the legend and the bin counts", () => {
    const text = chartText(checkChartSvg(reliabilityDiagram(input)));
    for (const label of ["Forecast chance of a high-fire year", "Observed frequency", "Perfect reliability", "Average year (climatology)", "Years per bin", "120", "80", "30", "0%", "100%"]) {
      expect(text).toContain(label);
    }
  });

  it("one dot per non-empty bin, at (mean forecast, observed frequency), area proportional to count", () => {
    const drawn = dots(reliabilityDiagram(input));
    expect(drawn).toHaveLength(3);
    // Plot x = 60 … 324 on the default 340-wide chart; 0% … 100% run 73 … 311 (13 px inset).
    expect(Number(drawn[1]?.attributes.cx)).toBeCloseTo(73 + 0.15 * 238, 1);
    const radii = drawn.map((dot) => Number(dot.attributes.r));
    expect(radii[0]).toBeCloseTo(11, 5);
    expect((radii[1]! / radii[0]!) ** 2).toBeCloseTo(80 / 120, 2);
  });

  it("the diagonal runs corner to corner; climatology is one horizontal and one vertical line", () => {
    const document = checkChartSvg(reliabilityDiagram(input));
    const diagonal = elementsWith(document, "line", "stroke-dasharray", "5 4").find((element) => element.ancestors.length === 1);
    expect(diagonal?.attributes).toMatchObject({ x1: "73", x2: "311" });
    const climatology = elementsWith(document, "line", "stroke", palette.baseRate).filter((element) => element.ancestors.length === 1);
    expect(climatology).toHaveLength(2);
  });

  it("no usable bin (or a null climatology) gives 'not enough data' with the diagonal still drawn", () => {
    const document = checkChartSvg(reliabilityDiagram({ bins: [input.bins[3]!], climatology: null }));
    expect(elementsWith(document, "text", "class", "not-enough-data")).toHaveLength(1);
    expect(elementsWith(document, "line", "stroke", palette.baseRate).filter((element) => element.ancestors.length === 1)).toHaveLength(0);
    expect(dots(reliabilityDiagram({ bins: [], climatology: Number.NaN }))).toHaveLength(0);
  });

  it("a full-size dot at (0%, 0%) stays inside the plot, clear of both axes' tick labels", () => {
    const corner = reliabilityDiagram({ bins: [{ lower: 0, upper: 0.1, count: 50, meanForecast: 0, observedFrequency: 0 }], climatology: 0.1 });
    const [dot] = dots(corner);
    const r = Number(dot?.attributes.r);
    expect(r).toBeCloseTo(11, 5);
    // Plot area: x 60 … 324, y 40 … 250 on the default 340 × 330 chart.
    expect(Number(dot?.attributes.cx) - r).toBeGreaterThan(60);
    expect(Number(dot?.attributes.cy) + r).toBeLessThan(250);
  });

  it("each count is written above its own dot; counts that would touch are pushed apart", () => {
    const svg = reliabilityDiagram(input);
    const drawn = dots(svg);
    expect(textXs(svg, ["120", "80", "30"])).toEqual(drawn.map((dot) => Number(dot.attributes.cx)));
    const close = reliabilityDiagram({
      bins: [
        { lower: 0, upper: 0.1, count: 120, meanForecast: 0.1, observedFrequency: 0.1 },
        { lower: 0.1, upper: 0.2, count: 110, meanForecast: 0.11, observedFrequency: 0.1 },
      ],
      climatology: 0.1,
    });
    checkChartSvg(close);
    const xs = textXs(close, ["120", "110"]);
    expect(xs).toHaveLength(2);
    expect(xs[1]! - xs[0]!).toBeGreaterThanOrEqual(15 + 4);
  });
});
