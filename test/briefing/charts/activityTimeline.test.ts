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
  it("activityTimeline(input) labels both axes, the calibration period and the threshold", () => {
    const text = chartText(checkChartSvg(activityTimeline(input)));
    for (const label of ["Share of sites burned", "Sites recording", "Year", "Calibration 1700–1990", "High-fire threshold (0.80)", "High-fire years", "Other calibration years", "Outside calibration (not used)", "1600", "1950"]) {
      expect(text).toContain(label);
    }
  });

  it("activityTimeline(input) draws one bar per calibration fire year with activity > 0 in the fire-year path", () => {
    const document = checkChartSvg(activityTimeline(input));
    const fire = elementsWith(document, "path", "fill", palette.fireYear).find((element) => element.ancestors.length === 1);
    const other = elementsWith(document, "path", "fill", palette.otherYear).find((element) => element.ancestors.length === 1);
    const inside = (entry: (typeof years)[number]) => entry.year >= 1700 && entry.year <= 1990 && (entry.activity ?? 0) > 0;
    const fireCount = years.filter((entry) => inside(entry) && entry.fireYear).length;
    const otherCount = years.filter((entry) => inside(entry) && !entry.fireYear).length;
    expect(fireCount).toBeGreaterThan(20);
    expect(fire?.attributes.d?.match(/Z/g)).toHaveLength(fireCount);
    expect(other?.attributes.d?.match(/Z/g)).toHaveLength(otherCount);
  });

  it("years outside the calibration period (1580–1699, 1991–2000) are drawn light grey, even when flagged or tall", () => {
    const document = checkChartSvg(activityTimeline(input));
    const outside = elementsWith(document, "path", "fill", palette.outsideYear).find((element) => element.ancestors.length === 1);
    const outsideCount = years.filter((entry) => (entry.year < 1700 || entry.year > 1990) && (entry.activity ?? 0) > 0).length;
    expect(outsideCount).toBeGreaterThan(50);
    expect(outside?.attributes.d?.match(/Z/g)).toHaveLength(outsideCount);
    expect(palette.outsideYear).not.toBe(palette.otherYear);
  });

  it("each bar is one year wide: 421 years over the 552-unit plot", () => {
    const document = checkChartSvg(activityTimeline(input));
    const fire = elementsWith(document, "path", "fill", palette.fireYear).find((element) => element.ancestors.length === 1);
    const first = /M([\d.]+) [\d.]+V[\d.]+H([\d.]+)/.exec(fire?.attributes.d ?? "");
    expect(Number(first?.[2]) - Number(first?.[1])).toBeCloseTo(552 / 421, 1);
  });

  it("sample depth is a stepped line in the sample-depth colour; the threshold a dashed line", () => {
    const document = checkChartSvg(activityTimeline(input));
    expect(elementsWith(document, "path", "stroke", palette.sampleDepth).filter((element) => element.ancestors.length === 1)).toHaveLength(1);
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

  it("the sites-recording axis shows distinct integer ticks only, even for a record of one site", () => {
    const svg = activityTimeline({ ...input, years: [{ year: 1800, activity: 0.5, sitesRecording: 1, fireYear: true }] });
    checkChartSvg(svg);
    const labels = [...svg.matchAll(/<text[^>]*text-anchor="start" fill="([^"]+)">([^<]*)<\/text>/g)]
      .filter((match) => match[1] === palette.sampleDepth)
      .map((match) => match[2]);
    expect(labels.length).toBeGreaterThan(1);
    for (const label of labels) expect(label).toMatch(/^\d+$/);
    expect(new Set(labels).size).toBe(labels.length);
  });

  it("a hostile measure label is escaped", () => {
    const svg = activityTimeline({ ...input, measureLabel: "<script>x</script>" });
    checkChartSvg(svg);
    expect(svg).toContain("&lt;script&gt;x&lt;/script&gt;");
  });
});
