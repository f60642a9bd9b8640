import { readdirSync, readFileSync } from "node:fs";
import { join } from "node:path";
import { fileURLToPath } from "node:url";
import { describe, expect, it } from "vitest";
import {
  COLOUR_MEANINGS,
  coloursUsedTogether,
  minimumDeltaE,
  palette,
  paletteColour,
  paletteCss,
  phaseColour,
  phaseRole,
  type PaletteRole,
} from "../../../src/briefing/charts/palette.js";
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
    for (const [role, colour] of Object.entries(palette)) expect(colour, role).toMatch(/^#[0-9a-f]{6}$/);
    expect(Object.keys(palette).length).toBeGreaterThanOrEqual(25);
  });

  it("paletteColour(role) is palette[role]; phaseRole() maps positions to first / middle / last", () => {
    expect(paletteColour("fireYear")).toBe(palette.fireYear);
    expect([0, 1, 2].map((index) => phaseRole(index, 3))).toEqual(["phaseFirst", "phaseMiddle", "phaseLast"]);
    expect([0, 1, 2, 3].map((index) => phaseRole(index, 4))).toEqual(["phaseFirst", "phaseMiddle", "phaseMiddle", "phaseLast"]);
    expect([0, 1].map((index) => phaseRole(index, 2))).toEqual(["phaseFirst", "phaseLast"]);
    expect(phaseRole(0, 1)).toBe("phaseMiddle");
    expect(phaseRole(Number.NaN, Number.NaN)).toBe("phaseMiddle");
    expect(phaseRole(9, 3)).toBe("phaseLast");
    expect(phaseColour(2, 3)).toBe(palette.phaseLast);
  });

  it("paletteCss() writes one --fp-<role> custom property per role", () => {
    const css = paletteCss();
    for (const [role, colour] of Object.entries(palette)) expect(css).toContain(`--fp-${role}: ${colour};`);
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

  it("each meaning has its own colour: every two meaning colours differ by ΔE*ab ≥ 15 for normal vision", () => {
    const meanings = COLOUR_MEANINGS.filter((entry) => entry.role !== "estimate");
    for (let i = 0; i < meanings.length; i += 1) {
      for (let j = i + 1; j < meanings.length; j += 1) {
        const first = meanings[i]!;
        const second = meanings[j]!;
        expect(seenDeltaE(palette[first.role], palette[second.role], "normal"), `${first.meaning} / ${second.meaning}`).toBeGreaterThanOrEqual(15);
      }
    }
  });

  it("phases and categories are ordinal ramps: lightness falls from the first to the last phase and from below to above normal", () => {
    const lightness = (hex: string): number => linearRgbToLab(hexToLinearRgb(hex))[0];
    for (const vision of VISIONS) {
      const seen = (hex: string): number => linearRgbToLab(simulate(hexToLinearRgb(hex), vision))[0];
      expect(seen(palette.phaseFirst)).toBeGreaterThan(seen(palette.phaseMiddle) + 10);
      expect(seen(palette.phaseMiddle)).toBeGreaterThan(seen(palette.phaseLast) + 10);
      expect(seen(palette.below)).toBeGreaterThan(seen(palette.near) + 10);
      expect(seen(palette.near)).toBeGreaterThan(seen(palette.above) + 10);
    }
    expect(lightness(palette.below)).toBeLessThan(100);
  });

  it("below / near / above are not an official outlook's trio: no blue–grey–orange or blue–white–red, one hue throughout", () => {
    const hue = (hex: string): number => {
      const [, a, b] = linearRgbToLab(hexToLinearRgb(hex));
      return (Math.atan2(b, a) * 180) / Math.PI;
    };
    const chroma = (hex: string): number => {
      const [, a, b] = linearRgbToLab(hexToLinearRgb(hex));
      return Math.hypot(a, b);
    };
    const hues = [palette.below, palette.near, palette.above].map(hue);
    // One hue family: all three within 25° of each other, none grey (chroma ≥ 10), none blue (hue near −90° … −60°) or orange/red (0° … 70°).
    expect(Math.max(...hues) - Math.min(...hues)).toBeLessThan(25);
    for (const colour of [palette.below, palette.near, palette.above]) {
      expect(chroma(colour)).toBeGreaterThanOrEqual(10);
      const h = hue(colour);
      expect(h > 0 && h < 70, `${colour} hue ${h}`).toBe(false);
      expect(h > -100 && h < -60, `${colour} hue ${h}`).toBe(false);
    }
  });

  it("every ink used for data stands out from the white page (ΔE*ab ≥ 20 for every vision)", () => {
    for (const role of ["estimate", "fireYear", "otherYear", "current", "baseRate", "phaseFirst", "phaseMiddle", "phaseLast", "below", "near", "above", "ink"] as const) {
      for (const vision of VISIONS) expect(seenDeltaE(palette[role], palette.paper, vision), `${role} under ${vision}`).toBeGreaterThanOrEqual(20);
    }
  });

  it("the palette is not a fire-danger ladder: no pure red, green or yellow among its colours", () => {
    for (const colour of Object.values(palette)) {
      expect(seenDeltaE(colour, "#ff0000", "normal")).toBeGreaterThan(25);
      expect(seenDeltaE(colour, "#00ff00", "normal")).toBeGreaterThan(25);
      expect(seenDeltaE(colour, "#ffff00", "normal")).toBeGreaterThan(25);
    }
  });
});

describe("one colour map: no chart and no style sheet has a colour of its own", () => {
  const chartsFolder = fileURLToPath(new URL("../../../src/briefing/charts/", import.meta.url));
  const templatesFolder = fileURLToPath(new URL("../../../templates/", import.meta.url));
  const colourLiteral = /#[0-9a-f]{3,8}\b|\brgba?\(|\bhsla?\(|\b(?:white|black|red|green|blue|orange|grey|gray|purple|yellow)\b(?=["';\s])/i;
  const chartFiles = readdirSync(chartsFolder).filter((file) => file.endsWith(".ts") && file !== "palette.ts");

  it.each(chartFiles)("src/briefing/charts/%s holds no colour literal (hex, rgb(), hsl() or a colour name)", (file) => {
    const source = readFileSync(join(chartsFolder, file), "utf8")
      // Comments may name colours in words.
      .replace(/\/\*[\s\S]*?\*\//g, "")
      .replace(/\/\/.*$/gm, "");
    expect(source).not.toMatch(colourLiteral);
  });

  it("templates/briefing.css uses palette roles only (var(--fp-…)), no colour literal", () => {
    const css = readFileSync(join(templatesFolder, "briefing.css"), "utf8").replace(/\/\*[\s\S]*?\*\//g, "");
    expect(css).not.toMatch(colourLiteral);
    const used = [...css.matchAll(/var\(--fp-([A-Za-z0-9]+)\)/g)].map((match) => match[1]);
    expect(used.length).toBeGreaterThan(5);
    for (const role of used) expect(Object.keys(palette)).toContain(role);
  });

  it("the scan would catch a hard-coded colour (the check can fail)", () => {
    expect('fill: "#ffffff"').toMatch(colourLiteral);
    expect("stroke: rgb(0, 0, 0)").toMatch(colourLiteral);
    expect('fill: "white"').toMatch(colourLiteral);
    expect("fill: palette.paper").not.toMatch(colourLiteral);
  });
});
