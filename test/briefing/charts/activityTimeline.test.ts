import { describe, expect, it } from "vitest";
import { activityTimeline, type ActivityTimelineInput } from "../../../src/briefing/charts/activityTimeline.js";
import { palette } from "../../../src/briefing/charts/palette.js";
import { chartText, checkChartSvg, elementsWith } from "./svgAssertions.js";

const years = Array.from({ length: 421 }, (_, index) => {
  const year = 1580 + index;
  const activity = index % 3 === 0 ? 0 : ((index * 37) % 100) / 100;
  return { year, activity: index < 5 ? null : activity, sitesRecording: Math.min(40, 1 + Math.floor(index / 8)), fireYear: index >= 5 && activity >= 0.8 };
});
const input: ActivityTimelineInput = Object.freeze({
  years,
  threshold: 0.8,
  measureLabel: "Share of sites burned",
  calibration: { first: 1700, last: 1990 },
});

describe("activityTimeline", () => {
  it("activityTimeline(input) labels the axes, the calibration period, the threshold and the sample-depth strip", () => {
    const text = chartText(checkChartSvg(activityTimeline(input)));
    for (const label of ["Share of sites burned", "Sites", "Year", "Calibration 1700–1990", "High-fire threshold (0.80)", "High-fire years", "Activity, calibration years", "Outside calibration (not used)", "Sites recording (lower strip)", "1600", "1950"]) {
      expect(text).toContain(label);
    }
  });

  it("activityTimeline(input) marks every calibration high-fire year with a dot, and only those", () => {
    const document = checkChartSvg(activityTimeline(input));
    const dots = elementsWith(document, "circle", "class", "fire-year");
    const expected = years.filter((entry) => entry.year >= 1700 && entry.year <= 1990 && entry.fireYear && entry.activity !== null);
    expect(expected.length).toBeGreaterThan(20);
    expect(dots).toHaveLength(expected.length);
    expect(dots.every((dot) => dot.attributes.fill === palette.fireYear)).toBe(true);
  });

  it("activity is a line, not bars: the calibration years in grey, years outside (1580–1699, 1991–2000) lighter", () => {
    const document = checkChartSvg(activityTimeline(input));
    const inside = elementsWith(document, "path", "class", "activity");
    const outside = elementsWith(document, "path", "class", "activity-outside");
    expect(inside[0]?.attributes.stroke).toBe(palette.otherYear);
    expect(outside[0]?.attributes.stroke).toBe(palette.outsideYear);
    expect(inside[0]?.attributes.fill).toBe("none");
    // Two stretches outside the calibration period (before and after), the first broken by 5 null years at its start.
    expect(outside[0]?.attributes.d?.match(/M/g)).toHaveLength(2);
    expect(document.elements.filter((element) => element.name === "path" && element.attributes.fill === palette.fireYear)).toHaveLength(0);
  });

  it("a dot sits on its year: x = 64 + (year − 1579.5) / 421 × 596 on the default chart", () => {
    const document = checkChartSvg(activityTimeline(input));
    const first = elementsWith(document, "circle", "class", "fire-year")[0]!;
    const year = years.find((entry) => entry.year >= 1700 && entry.fireYear)!.year;
    expect(Number(first.attributes.cx)).toBeCloseTo(64 + ((year - 1579.5) / 421) * 596, 1);
  });

  it("sample depth is a light area in its own strip under the activity (no second axis on the right); the threshold a dashed line", () => {
    const svg = activityTimeline(input);
    const document = checkChartSvg(svg);
    const depth = elementsWith(document, "path", "class", "sample-depth");
    expect(depth).toHaveLength(1);
    expect(depth[0]?.attributes.fill).toBe(palette.sampleDepth);
    expect(svg).not.toContain("axis-y-right");
    expect(elementsWith(document, "line", "stroke-dasharray", "6 3").filter((element) => element.ancestors.length === 1)).toHaveLength(1);
  });

  it("no years, or only null activity, gives 'not enough data' over the axes without NaN", () => {
    for (const empty of [
      { ...input, years: [], threshold: null },
      { ...input, years: years.map((entry) => ({ ...entry, activity: null })) },
      { ...input, years: [{ year: 1800, activity: null, sitesRecording: 0, fireYear: false }], calibration: { first: Number.NaN, last: Number.NaN } },
    ]) {
      const document = checkChartSvg(activityTimeline(empty));
      expect(elementsWith(document, "text", "class", "not-enough-data")).toHaveLength(1);
    }
    expect(chartText(checkChartSvg(activityTimeline({ ...input, years: [], threshold: null })))).toContain("High-fire threshold: none");
  });

  it("the sites axis shows distinct integer ticks only, even for a record of one site", () => {
    const svg = activityTimeline({ ...input, years: [{ year: 1800, activity: 0.5, sitesRecording: 1, fireYear: true }] });
    const document = checkChartSvg(svg);
    const strip = document.elements.filter((element) => element.name === "g" && element.attributes.class === "axis axis-y-left");
    expect(strip).toHaveLength(2);
    const labels = [...svg.matchAll(/<g class="axis axis-y-left">(.*?)<\/g>/g)][1]![1]!.match(/>(\d+)<\/text>/g)!.map((text) => text.slice(1, -7));
    expect(labels.length).toBeGreaterThan(1);
    expect(new Set(labels).size).toBe(labels.length);
  });

  it("a hostile measure label is escaped", () => {
    const svg = activityTimeline({ ...input, measureLabel: "<script>x</script>" });
    checkChartSvg(svg);
    expect(svg).toContain("&lt;script&gt;x&lt;/script&gt;");
  });
});
