import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { corpReliabilityChart } from "../../../src/briefing/charts/corpReliabilityChart.js";
import { eraOddsChart } from "../../../src/briefing/charts/eraOddsChart.js";
import { palette } from "../../../src/briefing/charts/palette.js";
import { responseCurveChart } from "../../../src/briefing/charts/responseCurveChart.js";
import { chartText, checkChartSvg, elementsWith } from "./svgAssertions.js";

const value = fc.oneof(fc.constant(null), fc.constant(Number.NaN), fc.constant(Number.POSITIVE_INFINITY), fc.double({ min: -5, max: 5, noNaN: true }), fc.double({ min: 0, max: 1, noNaN: true }));
const number = value.map((entry) => entry ?? Number.NaN);
const text = fc.string({ maxLength: 30 });
const runs = { numRuns: 120, seed: 20270310 };

describe("corpReliabilityChart", () => {
  const input = {
    points: [
      { forecast: 0.05, calibrated: 0.04, count: 120 },
      { forecast: 0.12, calibrated: 0.1, count: 60 },
      { forecast: 0.3, calibrated: 0.36, count: 15 },
    ],
    band: [
      { forecast: 0.05, lower: 0.02, upper: 0.09 },
      { forecast: 0.12, lower: 0.06, upper: 0.19 },
      { forecast: 0.3, lower: 0.12, upper: 0.55 },
    ],
    level: 0.9,
    baseRate: 0.1,
  };
  it("corpReliabilityChart(input) draws the PAV curve, one dot per distinct forecast (area ∝ years), the band and the diagonal", () => {
    const document = checkChartSvg(corpReliabilityChart(input));
    expect(elementsWith(document, "path", "class", "pav-curve")[0]?.attributes.stroke).toBe(palette.estimate);
    const dots = elementsWith(document, "circle", "class", "pav-point");
    expect(dots).toHaveLength(3);
    // r = 1.5 + 4.5 √(count / largest count): 6, 1.5 + 4.5 √0.5, 1.5 + 4.5 √0.125.
    expect(dots.map((dot) => Number(dot.attributes.r))).toEqual([6, 1.5 + 4.5 * Math.sqrt(0.5), 1.5 + 4.5 * Math.sqrt(0.125)].map((r) => Math.round(r * 100) / 100));
    expect(elementsWith(document, "path", "class", "consistency-band")[0]?.attributes.fill).toBe(palette.chance);
    const text = chartText(document);
    for (const label of ["Forecast chance of a high-fire year", "Recalibrated chance", "90% band if calibrated", "Average year", "Recalibrated (PAV)"]) expect(text).toContain(label);
  });
  it("prints the band's level as given (95% here) and names no level when it is missing", () => {
    expect(chartText(checkChartSvg(corpReliabilityChart({ ...input, level: 0.95 })))).toContain("95% band if calibrated");
    const unknown = chartText(checkChartSvg(corpReliabilityChart({ ...input, level: Number.NaN })));
    expect(unknown).toContain("band if calibrated");
    expect(unknown).not.toMatch(/\d+% band/);
  });
  it("the axes run 0 to 10% beyond the largest forecast or recalibrated value: 0–50% here", () => {
    const text = chartText(checkChartSvg(corpReliabilityChart(input)));
    expect(text).toContain("50%");
    expect(text).not.toContain("60%");
  });
  it("no points gives 'not enough data'; arbitrary inputs give well-formed SVG", () => {
    expect(elementsWith(checkChartSvg(corpReliabilityChart({ points: [], band: [], level: 0.9, baseRate: null })), "text", "class", "not-enough-data")).toHaveLength(1);
    fc.assert(
      fc.property(fc.array(fc.record({ forecast: number, calibrated: number, count: number }), { maxLength: 12 }), fc.array(fc.record({ forecast: number, lower: number, upper: number }), { maxLength: 12 }), value, (points, band, baseRate) => {
        checkChartSvg(corpReliabilityChart({ points, band, level: 0.9, baseRate }));
      }),
      runs,
    );
  });
});

describe("responseCurveChart", () => {
  const points = Array.from({ length: 21 }, (_, i) => {
    const v = -2.5 + i * 0.25;
    const p = 1 / (1 + Math.exp(-(-2.2 - 0.9 * v)));
    return { value: v, estimate: p, lower: p * 0.6, upper: Math.min(1, p * 1.5) };
  });
  const years = [
    { value: -2.1, fireYear: true },
    { value: -1.7, fireYear: true },
    { value: -0.2, fireYear: false },
    { value: 0.4, fireYear: false },
    { value: 1.1, fireYear: false },
  ];
  const input = { indexName: "PMI", points, years, current: -1.65, cuts: [-0.5, 0.5], level: 0.95 };
  it("puts the 'this season' label on the side where its box covers no phase-cut line (0.8 beside the cut at 0.5)", () => {
    for (const current of [0.8, 0.3, -1.65, 2.4]) {
      const document = checkChartSvg(responseCurveChart({ ...input, current }));
      const cutsX = elementsWith(document, "line", "class", "phase-cut").map((cut) => Number(cut.attributes.x1));
      const panel = elementsWith(document, "rect", "class", "label-panel")[0];
      const left = Number(panel?.attributes.x);
      const right = left + Number(panel?.attributes.width);
      expect(cutsX.length, String(current)).toBe(2);
      for (const cutX of cutsX) expect(cutX < left || cutX > right, `${current}: cut at ${cutX} under ${left}–${right}`).toBe(true);
      expect(left, String(current)).toBeGreaterThanOrEqual(0);
      expect(right, String(current)).toBeLessThanOrEqual(680);
    }
  });
  it("keeps the 'this season' label beside its line when one line of text fits on neither side: two lines then, not past a cut", () => {
    // As on the demo: the curve from −2.4 to 2.86, this season at −1.65, cuts at ±0.5 (the axis runs −3 to 4).
    const wide = Array.from({ length: 27 }, (_, i) => {
      const v = -2.4 + (i * 5.26) / 26;
      const p = 1 / (1 + Math.exp(-(-2.6 - 1.1 * v)));
      return { value: v, estimate: p, lower: p * 0.6, upper: Math.min(1, p * 1.5) };
    });
    const document = checkChartSvg(responseCurveChart({ ...input, points: wide, years: [...years, { value: 2.86, fireYear: false }] }));
    const line = Number(elementsWith(document, "line", "class", "this-season")[0]?.attributes.x1);
    const panels = elementsWith(document, "rect", "class", "label-panel").map((panel) => [Number(panel.attributes.x), Number(panel.attributes.x) + Number(panel.attributes.width)] as const);
    expect(panels.length).toBeGreaterThanOrEqual(1);
    for (const [left, right] of panels) {
      const gap = Math.min(Math.abs(left - line), Math.abs(right - line));
      expect(gap, `panel ${left}–${right}, line at ${line}`).toBeLessThan(12);
    }
    expect(chartText(document)).toContain("this season");
    expect(chartText(document)).toContain("\u22121.65");
  });
  it("responseCurveChart(input) draws the curve in its band, a tick per past year (high-fire taller, in their colour), the cuts lightly and this season in violet", () => {
    const document = checkChartSvg(responseCurveChart(input));
    expect(elementsWith(document, "path", "class", "curve")[0]?.attributes.stroke).toBe(palette.estimate);
    expect(elementsWith(document, "path", "class", "curve-band")[0]?.attributes.fill).toBe(palette.interval);
    const fire = elementsWith(document, "path", "class", "rug-fire")[0];
    const other = elementsWith(document, "path", "class", "rug-other")[0];
    expect(fire?.attributes.stroke).toBe(palette.fireYear);
    expect(fire?.attributes.d?.match(/M/g)).toHaveLength(2);
    expect(other?.attributes.d?.match(/M/g)).toHaveLength(3);
    expect(elementsWith(document, "line", "class", "phase-cut").every((cut) => cut.attributes.stroke === palette.grid)).toBe(true);
    expect(elementsWith(document, "line", "class", "phase-cut")).toHaveLength(2);
    expect(elementsWith(document, "line", "class", "this-season")[0]?.attributes.stroke).toBe(palette.current);
    expect(chartText(document)).toContain("this season (\u22121.65)");
    expect(chartText(document)).toContain("PMI value this winter–spring");
  });
  it("arbitrary inputs give well-formed SVG; no points gives 'not enough data'", () => {
    expect(elementsWith(checkChartSvg(responseCurveChart({ ...input, points: [] })), "text", "class", "not-enough-data")).toHaveLength(1);
    fc.assert(
      fc.property(
        text,
        fc.array(fc.record({ value: number, estimate: number, lower: number, upper: number }), { maxLength: 10 }),
        fc.array(fc.record({ value: number, fireYear: fc.boolean() }), { maxLength: 20 }),
        value,
        fc.array(number, { maxLength: 3 }),
        (indexName, curve, past, current, cuts) => {
          checkChartSvg(responseCurveChart({ indexName, points: curve, years: past, current, cuts, level: 0.95 }));
        },
      ),
      runs,
    );
  });
});

describe("eraOddsChart", () => {
  const input = {
    indices: [
      { name: "PMI", phases: [
        { label: "dry", fireScar: { estimate: 0.22, lower: 0.15, upper: 0.32 }, modern: { estimate: 0.25, lower: 0.12, upper: 0.45 } },
        { label: "neutral", fireScar: { estimate: 0.07, lower: 0.04, upper: 0.12 }, modern: { estimate: 0.06, lower: 0.02, upper: 0.2 } },
        { label: "wet", fireScar: { estimate: 0.03, lower: 0.01, upper: 0.08 }, modern: { estimate: null, lower: null, upper: null } },
      ] },
    ],
    fireScarBase: 0.1,
    modernBase: 0.1,
    fireScarLabel: "Fire-scar record 1720–1990",
    modernLabel: "Modern record 1950–2026",
  };
  it("eraOddsChart(input) marks each phase in both eras in its position's colour, the fire-scar era as dots and the modern record as filled triangles (never hollow: hollow means a small sample)", () => {
    const document = checkChartSvg(eraOddsChart(input));
    const then = elementsWith(document, "circle", "class", "era-fire-scar");
    const now = elementsWith(document, "path", "class", "era-modern");
    expect(then.map((dot) => dot.attributes.fill)).toEqual([palette.phaseFirst, palette.phaseMiddle, palette.phaseLast]);
    expect(now).toHaveLength(2);
    expect(now.map((mark) => mark.attributes.fill)).toEqual([palette.phaseFirst, palette.phaseMiddle]);
    expect(now.every((mark) => mark.attributes.stroke === palette.ink)).toBe(true);
    // d3 symbolTriangle: three vertices (M … L … L … Z), unlike the diamond's four.
    expect(now.every((mark) => (mark.attributes.d ?? "").split("L").length === 3)).toBe(true);
    const text = chartText(document);
    for (const label of ["PMI", "dry", "then / now: 22% / 25%", "then / now: 3% / \u2013", "Fire-scar record 1720–1990", "Modern record 1950–2026", "Average year, then"]) expect(text).toContain(label);
  });
  it("arbitrary inputs give well-formed SVG; nothing to draw gives 'not enough data'", () => {
    expect(elementsWith(checkChartSvg(eraOddsChart({ ...input, indices: [] })), "text", "class", "not-enough-data")).toHaveLength(1);
    const interval = fc.record({ estimate: value, lower: value, upper: value });
    fc.assert(
      fc.property(fc.array(fc.record({ name: text, phases: fc.array(fc.record({ label: text, fireScar: interval, modern: interval }), { maxLength: 4 }) }), { maxLength: 3 }), value, value, (indices, a, b) => {
        checkChartSvg(eraOddsChart({ indices, fireScarBase: a, modernBase: b, fireScarLabel: "then", modernLabel: "now" }));
      }),
      runs,
    );
  });
});
