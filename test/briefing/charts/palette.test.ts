import { describe, expect, it } from "vitest";
import { coloursUsedTogether, minimumDeltaE, palette, paletteColour, type PaletteRole } from "../../../src/briefing/charts/palette.js";
import { hexToLinearRgb, linearRgbToLab, MACHADO_2009, seenDeltaE, simulate, VISIONS } from "./colourVision.js";

describe("colour-vision helpers", () => {
  it("linearRgbToLab(hexToLinearRgb('#ff0000')) is (53.24, 80.09, 67.20)", () => {
    // Commonly quoted CIELAB (D65) of sRGB red, e.g. B. Lindbloom's calculator; from memory (M).
    const [l, a, b] = linearRgbToLab(hexToLinearRgb("#ff0000"));
    expect(l).toBeCloseTo(53.24, 1);
    expect(a).toBeCloseTo(80.09, 1);
    expect(b).toBeCloseTo(67.2, 1);
  });

  it("linearRgbToLab of white is (100, 0, 0) and of black (0, 0, 0)", () => {
    const white = linearRgbToLab(hexToLinearRgb("#ffffff"));
    expect(white[0]).toBeCloseTo(100, 3);
    expect(Math.abs(white[1])).toBeLessThan(0.01);
    expect(Math.abs(white[2])).toBeLessThan(0.01);
    expect(linearRgbToLab(hexToLinearRgb("#000000"))).toEqual([0, 0, 0]);
  });

  it("each Machado et al. (2009) matrix keeps white white (rows sum to 1)", () => {
    for (const matrix of Object.values(MACHADO_2009)) {
      for (const row of matrix) expect(row[0] + row[1] + row[2]).toBeCloseTo(1, 5);
    }
  });

  it("simulate() makes red and green nearly alike for a deuteranope but not for normal vision", () => {
    // The defining confusion of red–green dichromacy: a sanity check that the matrices act.
    expect(seenDeltaE("#d62728", "#2ca02c", "normal")).toBeGreaterThan(60);
    expect(seenDeltaE("#d62728", "#2ca02c", "deuteranopia")).toBeLessThan(seenDeltaE("#d62728", "#2ca02c", "normal") / 2);
    expect(simulate([0.2, 0.4, 0.6], "normal")).toEqual([0.2, 0.4, 0.6]);
  });

  it("simulate() makes blue and green closer under tritanopia than under deuteranopia", () => {
    expect(seenDeltaE("#1f77b4", "#2ca02c", "tritanopia")).toBeLessThan(seenDeltaE("#1f77b4", "#2ca02c", "deuteranopia"));
  });
});

describe("palette", () => {
  it("palette has every named role as a #rrggbb colour", () => {
    const roles = ["estimate", "interval", "limit95", "limit99", "fireYear", "otherYear", "current", "baseRate",
      "sampleDepth", "below", "near", "above", "ink", "inkMuted", "grid", "shade"] as const;
    for (const role of roles) expect(palette[role]).toMatch(/^#[0-9a-f]{6}$/);
    expect(palette.series).toHaveLength(4);
    for (const colour of palette.series) expect(colour).toMatch(/^#[0-9a-f]{6}$/);
  });

  it("paletteColour('series2') is palette.series[2]", () => {
    expect(paletteColour("series2")).toBe(palette.series[2]);
    expect(paletteColour("fireYear")).toBe(palette.fireYear);
  });

  const pairs: [string, PaletteRole, PaletteRole][] = [];
  for (const [chart, roles] of Object.entries(coloursUsedTogether)) {
    for (let i = 0; i < roles.length; i += 1) {
      for (let j = i + 1; j < roles.length; j += 1) pairs.push([chart, roles[i] as PaletteRole, roles[j] as PaletteRole]);
    }
  }

  it.each(pairs)(`%s: %s and %s stay ≥ ${minimumDeltaE} ΔE*ab apart for normal, protan, deutan and tritan vision`, (_chart, first, second) => {
    for (const vision of VISIONS) {
      const difference = seenDeltaE(paletteColour(first), paletteColour(second), vision);
      expect(difference, `${first}/${second} under ${vision}`).toBeGreaterThanOrEqual(minimumDeltaE);
    }
  });

  it("below / near / above diverge: near is the lightest and below and above differ in hue for every vision", () => {
    const lightness = (hex: string): number => linearRgbToLab(hexToLinearRgb(hex))[0];
    expect(lightness(palette.near)).toBeGreaterThan(lightness(palette.below));
    expect(lightness(palette.near)).toBeGreaterThan(lightness(palette.above));
    for (const vision of VISIONS) {
      const below = linearRgbToLab(simulate(hexToLinearRgb(palette.below), vision));
      const above = linearRgbToLab(simulate(hexToLinearRgb(palette.above), vision));
      // Opposite signs on the blue–yellow axis b*: blue below, amber above.
      expect(below[2]).toBeLessThan(0);
      expect(above[2]).toBeGreaterThan(0);
    }
  });

  it("every ink used for data stands out from the white page (ΔE*ab ≥ 20 for every vision)", () => {
    for (const role of ["estimate", "limit95", "limit99", "fireYear", "otherYear", "current", "baseRate", "below", "above", "ink"] as const) {
      for (const vision of VISIONS) expect(seenDeltaE(palette[role], "#ffffff", vision)).toBeGreaterThanOrEqual(20);
    }
  });

  it("the palette is not a fire-danger ladder: no pure red, green or yellow among its colours", () => {
    const all = [...Object.values(palette).filter((value): value is string => typeof value === "string"), ...palette.series];
    for (const colour of all) {
      expect(seenDeltaE(colour, "#ff0000", "normal")).toBeGreaterThan(25);
      expect(seenDeltaE(colour, "#00ff00", "normal")).toBeGreaterThan(25);
      expect(seenDeltaE(colour, "#ffff00", "normal")).toBeGreaterThan(25);
    }
  });
});
