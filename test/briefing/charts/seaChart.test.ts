import { describe, expect, it } from "vitest";
import { palette } from "../../../src/briefing/charts/palette.js";
import { seaChart, type SeaChartInput } from "../../../src/briefing/charts/seaChart.js";
import { chartText, checkChartSvg, elementsWith } from "./svgAssertions.js";

const lags = [-6, -5, -4, -3, -2, -1, 0, 1, 2, 3, 4];
const input: SeaChartInput = Object.freeze({
  indexName: "ENSO",
  lags,
  mean: lags.map((lag) => (lag === 0 ? 0.62 : lag === -1 ? -0.35 : 0.05)),
  ci95: lags.map(() => [-0.3, 0.31] as const),
  ci99: lags.map(() => [-0.42, 0.44] as const),
});

const bars = (svg: string) =>
  checkChartSvg(svg).elements.filter((element) => element.name === "rect" && (element.attributes.fill === palette.estimate || element.attributes.fill === palette.interval) && element.ancestors.length === 1);

describe("seaChart", () => {
  it("seaChart(input) labels both axes and every lag with a signed integer (lag 0 = fire year)", () => {
    const text = chartText(checkChartSvg(seaChart(input)));
    for (const label of ["Years from high-fire year", "Index departure", "\u22126", "\u22121", "0", "+1", "+4", "95% limits", "99% limits"]) {
      expect(text).toContain(label);
    }
  });

  it("seaChart(input) draws one bar per lag; bars outside the 95% limits are dark, the others pale", () => {
    const drawn = bars(seaChart(input));
    expect(drawn).toHaveLength(11);
    expect(drawn.filter((bar) => bar.attributes.fill === palette.estimate)).toHaveLength(2); // lags −1 and 0
    expect(drawn.filter((bar) => bar.attributes.fill === palette.interval)).toHaveLength(9);
  });

  it("the lag-0 bar rises from the zero line by 0.62 in data units", () => {
    const svg = seaChart(input);
    const document = checkChartSvg(svg);
    const zero = document.elements.find((element) => element.name === "line" && element.attributes.stroke === palette.ink && element.attributes.x1 === "64");
    const bar = bars(svg)[6]!;
    const height = Number(bar.attributes.height);
    const barBottom = Number(bar.attributes.y) + height;
    expect(Number(zero?.attributes.y1)).toBeCloseTo(barBottom, 1);
    // y domain niced to [−0.6, 0.8] over 184 units (top 12, bottom 260 − 64).
    expect(height).toBeCloseTo((0.62 / 1.4) * 184, 1);
  });

  it("95% and 99% limits are stepped paths (upper and lower each); a null limit breaks the line", () => {
    const document = checkChartSvg(seaChart(input));
    expect(elementsWith(document, "path", "stroke", palette.limit95)).toHaveLength(2);
    expect(elementsWith(document, "path", "stroke", palette.limit99)).toHaveLength(2);
    const gap = checkChartSvg(seaChart({ ...input, ci95: input.ci95.map((limits, index) => (index === 5 ? null : limits)) }));
    const paths = elementsWith(gap, "path", "stroke", palette.limit95);
    expect(paths.every((path) => (path.attributes.d?.match(/M/g) ?? []).length === 2)).toBe(true);
  });

  it("null means are left out; all null (or no lags) gives 'not enough data' over the axes", () => {
    expect(bars(seaChart({ ...input, mean: input.mean.map((value, index) => (index < 3 ? null : value)) }))).toHaveLength(8);
    for (const empty of [
      { ...input, mean: lags.map(() => null), ci95: lags.map(() => null), ci99: lags.map(() => null) },
      { indexName: "ENSO", lags: [], mean: [], ci95: [], ci99: [] },
      { ...input, mean: [], ci95: [], ci99: [] },
    ]) {
      const document = checkChartSvg(seaChart(empty));
      expect(elementsWith(document, "text", "class", "not-enough-data")).toHaveLength(1);
      expect(chartText(document)).toContain("Index departure");
    }
  });

  it("a hostile index name is escaped in the accessible title", () => {
    const svg = seaChart({ ...input, indexName: "<script>x</script>" });
    checkChartSvg(svg);
    expect(svg).toContain("&lt;script&gt;x&lt;/script&gt;");
  });
});
