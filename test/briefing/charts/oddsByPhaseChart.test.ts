import { describe, expect, it } from "vitest";
import { oddsByPhaseChart, type OddsByPhaseChartInput } from "../../../src/briefing/charts/oddsByPhaseChart.js";
import { palette } from "../../../src/briefing/charts/palette.js";
import { chartText, checkChartSvg, elementsWith } from "./svgAssertions.js";

const input: OddsByPhaseChartInput = Object.freeze({
  indexName: "ENSO",
  phases: [
    { label: "cold", estimate: 0.05, lower: 0.02, upper: 0.12, years: 80, smallSample: false },
    { label: "neutral", estimate: 0.09, lower: 0.05, upper: 0.15, years: 140, smallSample: false },
    { label: "warm", estimate: 0.25, lower: 0.16, upper: 0.35, years: 70, smallSample: false },
  ],
  baseRate: { estimate: 0.11, lower: 0.08, upper: 0.15 },
});

describe("oddsByPhaseChart", () => {
  it("oddsByPhaseChart(input) labels the axis, the phases and each value as 'p% (lo–hi%) · n yr'", () => {
    const text = chartText(checkChartSvg(oddsByPhaseChart(input)));
    for (const label of ["Chance of a high-fire year", "ENSO phase", "cold", "neutral", "warm", "25% (16–35%) · 70 yr", "Average year (11%)", "0%", "100%"]) {
      expect(text).toContain(label);
    }
    expect(text).not.toContain("Hollow");
  });

  it("oddsByPhaseChart(input) puts the warm dot at x = 112 + 0.25 × 418 on the default 680-wide chart", () => {
    // Plot spans x = 112 … 530 (left margin 112, right margin 150).
    const document = checkChartSvg(oddsByPhaseChart(input));
    const dots = elementsWith(document, "circle", "class", "phase-estimate");
    expect(dots.map((dot) => Number(dot.attributes.cx))).toEqual([112 + 0.05 * 418, 112 + 0.09 * 418, 112 + 0.25 * 418].map((v) => Math.round(v * 100) / 100));
  });

  it("a smallSample phase is drawn hollow and the legend explains it", () => {
    const svg = oddsByPhaseChart({ ...input, phases: [{ ...input.phases[0]!, smallSample: true }, input.phases[1]!] });
    const document = checkChartSvg(svg);
    const dots = elementsWith(document, "circle", "class", "phase-estimate");
    expect(dots[0]?.attributes.fill).toBe(palette.paper);
    expect(dots[0]?.attributes.stroke).toBe(palette.phaseFirst);
    expect(dots[1]?.attributes.fill).toBe(palette.phaseLast);
    expect(chartText(document)).toContain("Hollow: few years");
  });

  it("dots take their phase position's colour (first, middle, last) and this season's phase is ringed in the this-season colour", () => {
    const svg = oddsByPhaseChart({ ...input, phases: input.phases.map((phase, index) => ({ ...phase, isCurrent: index === 2 })) });
    const document = checkChartSvg(svg);
    expect(elementsWith(document, "circle", "class", "phase-estimate").map((dot) => dot.attributes.fill)).toEqual([palette.phaseFirst, palette.phaseMiddle, palette.phaseLast]);
    const ring = elementsWith(document, "circle", "class", "this-season");
    expect(ring).toHaveLength(1);
    expect(ring[0]?.attributes.stroke).toBe(palette.current);
    expect(Number(ring[0]?.attributes.cx)).toBeCloseTo(112 + 0.25 * 418, 1);
    expect(chartText(document)).toContain("This season's phase");
  });

  it("a phase with a null estimate reads 'not enough data' in its row; all null gives the notice over the axis", () => {
    const oneNull = checkChartSvg(
      oddsByPhaseChart({ ...input, phases: [...input.phases, { label: "strong", estimate: null, lower: null, upper: null, years: 0, smallSample: true }] }),
    );
    expect(chartText(oneNull)).toContain("not enough data");
    expect(elementsWith(oneNull, "text", "class", "not-enough-data")).toHaveLength(0);

    const allNull = checkChartSvg(
      oddsByPhaseChart({ indexName: "ENSO", phases: [], baseRate: { estimate: null, lower: null, upper: null } }),
    );
    expect(elementsWith(allNull, "text", "class", "not-enough-data")).toHaveLength(1);
    expect(chartText(allNull)).toContain("Chance of a high-fire year");
    expect(chartText(allNull)).toContain("Average year: not enough data");
  });

  it("NaN and infinite numbers are treated as missing, never printed", () => {
    const svg = oddsByPhaseChart({
      indexName: "ENSO",
      phases: [{ label: "odd", estimate: Number.NaN, lower: Number.NEGATIVE_INFINITY, upper: 0.4, years: 3, smallSample: true }],
      baseRate: { estimate: Number.NaN, lower: 0.1, upper: Number.NaN },
    });
    expect(chartText(checkChartSvg(svg))).toContain("not enough data");
  });

  it("a hostile index name or phase label is escaped", () => {
    const svg = oddsByPhaseChart({ ...input, indexName: "<script>alert(1)</script>", phases: [{ ...input.phases[0]!, label: 'a"&<b>' }] });
    const document = checkChartSvg(svg);
    expect(svg).toContain("&lt;script&gt;alert(1)&lt;/script&gt; phase");
    expect(chartText(document)).toContain('a"&<b>');
  });

  it("oddsByPhaseChart(input, { width: 100 }) throws RangeError", () => {
    expect(() => oddsByPhaseChart(input, { width: 100 })).toThrow(RangeError);
  });

  it("oddsByPhaseChart(input, { width: 500, height: 300 }) sets that viewBox", () => {
    expect(checkChartSvg(oddsByPhaseChart(input, { width: 500, height: 300 })).root.attributes.viewBox).toBe("0 0 500 300");
  });
});
