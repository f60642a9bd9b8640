/**
 * The one colour map of the briefing: every colour that a chart or the page prints comes from
 * here, and each colour means one thing on every page.
 *
 * Meanings and inks (firephase's own choice):
 * - a high-fire year: ember brick; an average year (the base rate): khaki; this season: violet;
 * - the phases of an index by position, whatever their names: first phase pale blue, middle
 *   phase mid blue, last phase deep navy (an ordinal ramp: lighter to darker);
 * - the activity categories: below normal pale aqua, near normal mid teal, above normal deep
 *   teal (an ordinal ramp in one hue, so "more fire" reads as "darker", never as a danger ladder);
 * - statistics themselves (means, fitted curves, scores) in near-black ink; what chance alone
 *   gives as a light stone envelope; other years grey; years outside the calibration period a
 *   lighter grey.
 *
 * No official outlook's category colours are used: no blue/grey/orange or blue/white/red trio
 * for below/near/above, and no green–yellow–red danger ladder anywhere. Every pair of colours
 * that one chart shows together (listed in {@link coloursUsedTogether}) is at least
 * {@link minimumDeltaE} CIE76 ΔE*ab apart for normal vision and under simulated protanopia,
 * deuteranopia and tritanopia, and every two meanings differ for normal vision
 * (test/briefing/charts/palette.test.ts). Charts also vary marker shape and dash pattern, so no
 * reading depends on hue alone.
 *
 * @see Machado G.M., Oliveira M.M., Fernandes L.A.F. (2009) "A physiologically-based model for
 * simulation of color vision deficiency", IEEE Transactions on Visualization and Computer
 * Graphics 15(6):1291–1298, doi:10.1109/TVCG.2009.113 — the simulation matrices used in the check.
 * @see CIE (2004) Colorimetry, 3rd edition, CIE 15:2004 — CIELAB and the 1976 colour difference.
 */

/** A colour as a six-digit lower-case hex string, `#rrggbb`. */
export type HexColour = `#${string}`;

/** Named colour roles of the briefing (charts and page). */
export interface ChartPalette {
  /** A high-fire year (marks, dots, the lag-0 column): ember brick. */
  readonly fireYear: HexColour;
  /** Light tint of the high-fire-year colour (backgrounds only). */
  readonly fireYearTint: HexColour;
  /** Calibration years that are not high-fire years: mid grey. */
  readonly otherYear: HexColour;
  /** Years outside the calibration period (not used to choose high-fire years): light grey. */
  readonly outsideYear: HexColour;
  /** An average year (the base rate, climatology): khaki. */
  readonly baseRate: HexColour;
  /** Light tint of the average-year colour (its interval band). */
  readonly baseRateTint: HexColour;
  /** This season: violet. */
  readonly current: HexColour;
  /** Light tint of this season's colour (table rows, backgrounds). */
  readonly currentTint: HexColour;
  /** The first phase of an index (lowest values): pale blue. */
  readonly phaseFirst: HexColour;
  /** A middle phase of an index: mid blue. */
  readonly phaseMiddle: HexColour;
  /** The last phase of an index (highest values): deep navy. */
  readonly phaseLast: HexColour;
  /** Below-normal fire activity: pale aqua. */
  readonly below: HexColour;
  /** Near-normal fire activity: mid teal. */
  readonly near: HexColour;
  /** Above-normal fire activity: deep teal. */
  readonly above: HexColour;
  /** A statistic (mean, fitted curve, score curve, estimate dot): near-black ink. */
  readonly estimate: HexColour;
  /** The uncertainty band of an estimate: light grey. */
  readonly interval: HexColour;
  /** What chance alone gives (95% envelope, consistency band): light stone. */
  readonly chance: HexColour;
  /** The wider chance envelope (99%): paler stone. */
  readonly chanceOuter: HexColour;
  /** Sample depth (sites recording), drawn as a light area: pale slate. */
  readonly sampleDepth: HexColour;
  /** Text, axes, reference lines: near black. */
  readonly ink: HexColour;
  /** Secondary text and tick labels: dark grey. */
  readonly inkMuted: HexColour;
  /** Grid lines, phase cuts drawn lightly: very light grey. */
  readonly grid: HexColour;
  /** Background shading of a period (the calibration years): very light cool grey. */
  readonly shade: HexColour;
  /** The page and marker outlines: white. */
  readonly paper: HexColour;
  /** Headings and the masthead rule: dark slate. */
  readonly heading: HexColour;
  /** Table rules and box borders: light grey. */
  readonly rule: HexColour;
  /** Background of boxes on the page: very light grey. */
  readonly panel: HexColour;
  /** The header band that says the briefing is not an official forecast: dark slate ground. */
  readonly band: HexColour;
}

/**
 * The palette (colour roles to hex colours).
 *
 * @example
 * palette.fireYear; // => "#b2401f"
 * @see Machado, Oliveira & Fernandes (2009), IEEE TVCG 15(6):1291–1298 (simulation used to check it).
 */
export const palette: ChartPalette = Object.freeze({
  fireYear: "#b2401f",
  fireYearTint: "#f6e3dc",
  otherYear: "#9a9fa5",
  outsideYear: "#dcdfe2",
  baseRate: "#8c7a2a",
  baseRateTint: "#eee8cf",
  current: "#7b2f9e",
  currentTint: "#efe4f4",
  phaseFirst: "#94bde3",
  phaseMiddle: "#4f86c6",
  phaseLast: "#1d3f73",
  below: "#92c9c1",
  near: "#46918a",
  above: "#1a5a55",
  estimate: "#1f2226",
  interval: "#c9cdd2",
  chance: "#dedbd1",
  chanceOuter: "#efede7",
  sampleDepth: "#c5d0db",
  ink: "#1f2226",
  inkMuted: "#5c6168",
  grid: "#e4e6e9",
  shade: "#f0f2f4",
  paper: "#ffffff",
  heading: "#2d3a4a",
  rule: "#d5d9de",
  panel: "#f4f5f7",
  band: "#2d3a4a",
});

/** A colour role of {@link palette}. */
export type PaletteRole = keyof ChartPalette;

/**
 * What each meaning colour stands for, in the words of the briefing (the legend of the colour map).
 *
 * @example
 * COLOUR_MEANINGS.find((entry) => entry.role === "baseRate")?.meaning; // => "an average year (base rate)"
 */
export const COLOUR_MEANINGS: readonly { readonly role: PaletteRole; readonly meaning: string }[] = Object.freeze([
  { role: "fireYear", meaning: "a high-fire year" },
  { role: "baseRate", meaning: "an average year (base rate)" },
  { role: "current", meaning: "this season" },
  { role: "phaseFirst", meaning: "the first phase of an index" },
  { role: "phaseMiddle", meaning: "the middle phase of an index" },
  { role: "phaseLast", meaning: "the last phase of an index" },
  { role: "below", meaning: "below-normal fire activity" },
  { role: "near", meaning: "near-normal fire activity" },
  { role: "above", meaning: "above-normal fire activity" },
  { role: "estimate", meaning: "a statistic (mean, fitted curve)" },
  { role: "chance", meaning: "what chance alone gives" },
  { role: "otherYear", meaning: "other calibration years" },
]);

/**
 * The sets of colour roles that appear together in one chart, keyed by chart function name:
 * within each set every pair must stay distinguishable.
 *
 * @example
 * coloursUsedTogether.categoryOddsBar; // => ["below", "near", "above", "baseRate", "ink"]
 */
export const coloursUsedTogether: Readonly<Record<string, readonly PaletteRole[]>> = Object.freeze({
  oddsByPhaseChart: ["phaseFirst", "phaseMiddle", "phaseLast", "baseRate", "ink"],
  seaChart: ["estimate", "chance", "fireYear"],
  phaseSpaceScatter: ["otherYear", "fireYear", "current", "ink"],
  activityTimeline: ["otherYear", "outsideYear", "fireYear", "ink"],
  reliabilityDiagram: ["estimate", "chance", "baseRate"],
  rocCurveChart: ["estimate", "inkMuted"],
  stabilityChart: ["phaseFirst", "phaseMiddle", "phaseLast", "baseRate"],
  categoryOddsBar: ["below", "near", "above", "baseRate", "ink"],
  responseCurveChart: ["estimate", "fireYear", "otherYear", "current"],
  eraOddsChart: ["phaseFirst", "phaseMiddle", "phaseLast", "baseRate", "ink"],
});

/**
 * The smallest CIE76 colour difference ΔE*ab allowed between two colours used together, for
 * normal vision and for each simulated dichromacy (Machado et al. 2009, severity 1.0).
 * A ΔE*ab of about 2.3 is a just-noticeable difference; 20 keeps small markers and thin lines
 * apart at a glance.
 *
 * @example
 * minimumDeltaE; // => 20
 * @see Sharma G., Wu W., Dalal E.N. (2005) "The CIEDE2000 color-difference formula: implementation
 * notes, supplementary test data, and mathematical observations", Color Research & Application
 * 30(1):21–30 (on ΔE*ab and its just-noticeable difference; the value 2.3 is from memory).
 */
export const minimumDeltaE = 20;

/**
 * The colour of a palette role by name.
 *
 * @param role - a role of {@link palette}.
 * @returns its hex colour.
 * @throws never: every {@link PaletteRole} has a colour.
 * @example
 * paletteColour("current"); // => "#7b2f9e"
 */
export function paletteColour(role: PaletteRole): HexColour {
  return palette[role];
}

/**
 * The ordinal position of a phase among an index's phases: first, middle or last (every phase
 * between the first and the last is a middle phase; charts tell several middle phases apart by
 * marker and dash, not by colour).
 *
 * @param index - 0-based position of the phase (0 … count − 1; out-of-range values are clamped).
 * @param count - number of phases of the index (≥ 1).
 * @returns the palette role of that position; a single phase is "phaseMiddle".
 * @throws never.
 * @example
 * phaseRole(2, 3); // => "phaseLast"
 */
export function phaseRole(index: number, count: number): "phaseFirst" | "phaseMiddle" | "phaseLast" {
  const total = Number.isFinite(count) ? Math.max(1, Math.floor(count)) : 1;
  const position = Number.isFinite(index) ? Math.min(total - 1, Math.max(0, Math.floor(index))) : 0;
  if (total === 1) return "phaseMiddle";
  if (position === 0) return "phaseFirst";
  if (position === total - 1) return "phaseLast";
  return "phaseMiddle";
}

/**
 * The colour of a phase by its position (see {@link phaseRole}): the same on every page.
 *
 * @param index - 0-based position of the phase.
 * @param count - number of phases of the index.
 * @returns its hex colour.
 * @throws never.
 * @example
 * phaseColour(0, 3); // => "#94bde3"
 */
export function phaseColour(index: number, count: number): HexColour {
  return palette[phaseRole(index, count)];
}

/**
 * The palette as CSS custom properties (`--fp-<role>`), so the page's style sheet prints the same
 * colours as the charts and holds no colour of its own.
 *
 * @returns a `:root { … }` rule.
 * @throws never.
 * @example
 * paletteCss().startsWith(":root {"); // => true
 */
export function paletteCss(): string {
  const lines = (Object.keys(palette) as PaletteRole[]).map((role) => `  --fp-${role}: ${palette[role]};`);
  return `:root {\n${lines.join("\n")}\n}\n`;
}
