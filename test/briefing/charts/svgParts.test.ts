import { scaleLinear } from "d3-scale";
import { describe, expect, it } from "vitest";
import {
  axisBottom,
  coord,
  formatPercent,
  formatSigned,
  legendRows,
  makeFrame,
  paddedExtent,
  svgTextOnPanel,
} from "../../../src/briefing/charts/svgParts.js";
import { parseXml } from "./xmlCheck.js";

describe("svgParts", () => {
  it("coord(12.3456) is '12.35', coord(-0.001) is '0'", () => {
    expect(coord(12.3456)).toBe("12.35");
    expect(coord(-0.001)).toBe("0");
    expect(coord(100)).toBe("100");
  });

  it("coord(NaN) throws RangeError", () => {
    expect(() => coord(Number.NaN)).toThrow(RangeError);
    expect(() => coord(Number.POSITIVE_INFINITY)).toThrow(RangeError);
  });

  it("formatPercent(0.4249) is '42%', formatPercent(0.005) is '1%', formatPercent(1) is '100%'", () => {
    expect(formatPercent(0.4249)).toBe("42%");
    expect(formatPercent(0.005)).toBe("1%");
    expect(formatPercent(1)).toBe("100%");
    expect(formatPercent(0)).toBe("0%");
  });

  it("formatSigned(-0.254, 2) uses U+2212; formatSigned(-0.001, 2) is '0.00'; plus sign on request", () => {
    expect(formatSigned(-0.254, 2)).toBe("\u22120.25");
    expect(formatSigned(-0.001, 2)).toBe("0.00");
    expect(formatSigned(3, 0, true)).toBe("+3");
    expect(formatSigned(0, 0, true)).toBe("0");
  });

  it("makeFrame({ width: 100 }, …) throws RangeError; defaults and margins give the plot rectangle", () => {
    const margins = { top: 10, right: 20, bottom: 40, left: 50 };
    expect(() => makeFrame({ width: 100 }, { width: 680, height: 260 }, margins)).toThrow(RangeError);
    expect(() => makeFrame({ height: Number.NaN }, { width: 680, height: 260 }, margins)).toThrow(RangeError);
    expect(makeFrame(undefined, { width: 680, height: 260 }, margins)).toEqual({
      width: 680, height: 260, left: 50, right: 660, top: 10, bottom: 220,
    });
    expect(makeFrame({ width: 400 }, { width: 680, height: 260 }, (width) => ({ ...margins, right: width / 4 })).right).toBe(300);
  });

  it("axisBottom draws one labelled tick per scale.ticks() value at the scaled position", () => {
    const frame = makeFrame(undefined, { width: 680, height: 260 }, { top: 10, right: 30, bottom: 40, left: 50 });
    const x = scaleLinear().domain([0, 1]).range([frame.left, frame.right]);
    const document = parseXml(`<svg>${axisBottom(x, frame, { title: "Chance", ticks: 5, format: ".0%" })}</svg>`);
    expect(document.texts).toEqual(["0%", "20%", "40%", "60%", "80%", "100%", "Chance"]);
    const labels = document.elements.filter((element) => element.name === "text");
    expect(labels[1]?.attributes.x).toBe(String(50 + 0.2 * 600));
  });

  it("paddedExtent([0, 10], 0.1) is [-1, 11]; an empty, single or denormal spread widens to ±1", () => {
    expect(paddedExtent([0, 10], 0.1)).toEqual([-1, 11]);
    expect(paddedExtent([], 0.1)).toEqual([-1, 1]);
    expect(paddedExtent([3, 3], 0.1)).toEqual([2, 4]);
    expect(paddedExtent([0, 5e-324], 0.1)).toEqual([-1, 1]);
  });

  it("axisBottom halves the tick count until the labels fit: 0–100% over 150 units keeps 3 ticks", () => {
    const frame = makeFrame({ width: 250 }, { width: 680, height: 260 }, { top: 10, right: 50, bottom: 40, left: 50 });
    const x = scaleLinear().domain([0, 1]).range([frame.left, frame.right]);
    const document = parseXml(`<svg>${axisBottom(x, frame, { title: "Chance", ticks: 10, format: ".0%" })}</svg>`);
    expect(document.texts).toEqual(["0%", "50%", "100%", "Chance"]);
  });

  it("legendRows wraps entries wider than the space available", () => {
    const entry = { symbol: "", label: "x".repeat(40) };
    expect(legendRows([entry], 600)).toBe(1);
    expect(legendRows([entry, entry, entry], 600)).toBe(2);
    expect(legendRows([entry, entry, entry], 200)).toBe(3);
  });

  it("svgTextOnPanel(100, 50, 'ENSO', { 'text-anchor': 'end', 'font-size': 10 }) puts a white panel under the text, no stroke", () => {
    const document = parseXml(`<g>${svgTextOnPanel(100, 50, "ENSO", { "text-anchor": "end", "font-size": 10 })}</g>`);
    const [panel, text] = document.elements.slice(1);
    expect(panel?.name).toBe("rect");
    expect(text?.name).toBe("text");
    expect(text?.attributes.stroke).toBeUndefined();
    expect(document.texts).toEqual(["ENSO"]);
    // 4 characters × 0.5 em × 10 px = 20, plus 2 × 2 padding: the panel spans x 78 … 102.
    expect(Number(panel?.attributes.width)).toBeCloseTo(24, 5);
    expect(Number(panel?.attributes.x)).toBeCloseTo(78, 5);
    expect(Number(panel?.attributes.y)).toBeLessThan(50 - 7);
    expect(Number(panel?.attributes.y) + Number(panel?.attributes.height)).toBeGreaterThan(50);
  });
});
