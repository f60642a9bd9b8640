import { describe, expect, it } from "vitest";
import { palette } from "../../../src/briefing/charts/palette.js";
import { seaChart, type SeaChartInput } from "../../../src/briefing/charts/seaChart.js";
import { chartText, checkChartSvg, elementsWith } from "./svgAssertions.js";

const lags = [-4, -3, -2, -1, 0, 1, 2];
const input: SeaChartInput = Object.freeze({
  indexName: "ENSO",
  lags,
  mean: lags.map((lag) => (lag === 0 ? 0.62 : lag === -1 ? -0.35 : 0.05)),
  ci95: lags.map(() => [-0.3, 0.31] as const),
  ci99: lags.map(() => [-0.42, 0.44] as const),
});

const means = (svg: string) => checkChartSvg(svg).elements.filter((element) => element.name === "circle" && (element.attributes.class ?? "").startsWith("sea-mean"));

describe("seaChart", () => {
  it("keeps the value label of the lowest dot inside the plot, above the lag axis (−0.87 at the bottom)", () => {
    const low = { ...input, mean: lags.map((lag) => (lag === 0 ? -0.87 : lag === -1 ? -0.42 : 0.05)), ci95: lags.map(() => [-0.37, 0.37] as const), ci99: lags.map(() => [-0.47, 0.47] as const) };
    const document = checkChartSvg(seaChart(low));
    expect(chartText(document)).toContain("\u22120.87");
    // The lag labels share one baseline: the y that seven text elements have.
    const ys = document.elements.filter((element) => element.name === "text").map((element) => Number(element.attributes.y));
    const lagY = ys.find((y) => ys.filter((other) => other === y).length === lags.length) ?? Number.NaN;
    const panels = elementsWith(document, "rect", "class", "label-panel");
    expect(panels).toHaveLength(2);
    const panelBottom = Math.max(...panels.map((panel) => Number(panel.attributes.y) + Number(panel.attributes.height)));
    // Above the lag labels' tops (labels are 11 units tall) and above the plot's bottom edge (16 above the lag baseline).
    expect(panelBottom).toBeLessThanOrEqual(lagY - 16);
  });
  it("seaChart(input) labels both axes, every lag with a signed integer and the high-fire year's column", () => {
    const text = chartText(checkChartSvg(seaChart(input)));
    for (const label of ["Years before (−) and after (+) a high-fire year", "Index departure from its mean", "\u22124", "\u22121", "0", "+1", "+2", "High-fire year", "Chance alone, 95% of random years", "99%"]) {
      expect(text).toContain(label);
    }
  });

  it("seaChart(input) draws one dot per lag: filled beyond the 95% envelope (lags −1 and 0), hollow within it; no bars, no limit lines", () => {
    const svg = seaChart(input);
    const dots = means(svg);
    expect(dots).toHaveLength(7);
    const beyond = dots.filter((dot) => dot.attributes.class === "sea-mean beyond");
    expect(beyond).toHaveLength(2);
    expect(beyond.every((dot) => dot.attributes.fill === palette.estimate)).toBe(true);
    expect(dots.filter((dot) => dot.attributes.class === "sea-mean within").every((dot) => dot.attributes.fill === palette.paper)).toBe(true);
    const document = checkChartSvg(svg);
    expect(document.elements.filter((element) => element.name === "rect" && element.attributes.fill === palette.estimate)).toHaveLength(0);
    expect(document.elements.filter((element) => element.attributes["stroke-dasharray"] !== undefined)).toHaveLength(0);
    // The two values beyond chance are written beside their dots.
    expect(chartText(document)).toContain("+0.62");
    expect(chartText(document)).toContain("\u22120.35");
  });

  it("the lag-0 dot sits 0.62 data units above the zero line (y domain niced to [−0.6, 0.8] over 164 units)", () => {
    const svg = seaChart(input);
    const document = checkChartSvg(svg);
    const zero = document.elements.find((element) => element.name === "line" && element.attributes.stroke === palette.inkMuted && element.attributes.x1 === "64" && element.attributes.x2 === "660");
    const dot = means(svg)[4]!;
    // Plot from y = 22 to 250 − 64 = 186: 164 units for 1.4 data units.
    expect(Number(zero?.attributes.y1) - Number(dot.attributes.cy)).toBeCloseTo((0.62 / 1.4) * 164, 1);
    // Lags are evenly spaced: lag 0 in the middle of 7 columns over x = 64 … 660.
    expect(Number(dot.attributes.cx)).toBeCloseTo(64 + (4.5 / 7) * 596, 1);
  });

  it("the chance envelopes are shaded areas (99% under 95%) and the high-fire-year column is tinted; a null limit breaks the envelope", () => {
    const document = checkChartSvg(seaChart(input));
    expect(elementsWith(document, "path", "class", "chance-95")[0]?.attributes.fill).toBe(palette.chance);
    expect(elementsWith(document, "path", "class", "chance-99")[0]?.attributes.fill).toBe(palette.chanceOuter);
    expect(elementsWith(document, "rect", "class", "fire-year-column")[0]?.attributes.fill).toBe(palette.fireYearTint);
    const gap = checkChartSvg(seaChart({ ...input, ci95: input.ci95.map((limits, index) => (index === 3 ? null : limits)) }));
    expect(elementsWith(gap, "path", "class", "chance-95")[0]?.attributes.d?.match(/M/g)).toHaveLength(2);
  });

  it("null means are left out; all null (or no lags) gives 'not enough data' over the axes", () => {
    expect(means(seaChart({ ...input, mean: input.mean.map((value, index) => (index < 3 ? null : value)) }))).toHaveLength(4);
    for (const empty of [
      { ...input, mean: lags.map(() => null), ci95: lags.map(() => null), ci99: lags.map(() => null) },
      { indexName: "ENSO", lags: [], mean: [], ci95: [], ci99: [] },
      { ...input, mean: [], ci95: [], ci99: [] },
    ]) {
      const document = checkChartSvg(seaChart(empty));
      expect(elementsWith(document, "text", "class", "not-enough-data")).toHaveLength(1);
      expect(chartText(document)).toContain("Index departure from its mean");
    }
  });

  it("a hostile index name is escaped in the accessible title", () => {
    const svg = seaChart({ ...input, indexName: "<script>x</script>" });
    checkChartSvg(svg);
    expect(svg).toContain("&lt;script&gt;x&lt;/script&gt;");
  });
});
