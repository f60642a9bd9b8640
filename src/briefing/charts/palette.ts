/**
 * The colour palette of the briefing charts: firephase's own choice of inks, checked to stay
 * distinct for readers with a colour-vision deficiency.
 *
 * Hues: a deep blue (estimates), a teal (base rate, 95% limits), an orange-amber (fire years),
 * purples (the current season, 99% limits), and neutral greys. The below / near / above normal
 * trio diverges from blue through grey to amber. Every pair of colours that one chart shows
 * together (listed in {@link coloursUsedTogether}) is at least {@link minimumDeltaE} CIE76 ΔE*ab
 * apart for normal vision and under simulated protanopia, deuteranopia and tritanopia
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

/** Named colour roles of the briefing charts. */
export interface ChartPalette {
  /** Point estimates (dots, bars of means, the ROC curve): deep blue. */
  readonly estimate: HexColour;
  /** Interval bands and bars that are not beyond their limits: pale blue. */
  readonly interval: HexColour;
  /** 95% confidence limits (superposed epoch analysis): teal. */
  readonly limit95: HexColour;
  /** 99% confidence limits (superposed epoch analysis): light purple. */
  readonly limit99: HexColour;
  /** Fire years (bars, markers): orange-amber. */
  readonly fireYear: HexColour;
  /** Years that are not fire years: mid grey. */
  readonly otherYear: HexColour;
  /** Years outside the calibration period (not used to choose fire years): light grey. */
  readonly outsideYear: HexColour;
  /** The current season's marker: purple. */
  readonly current: HexColour;
  /** The base rate (climatology) line and band: teal. */
  readonly baseRate: HexColour;
  /** Sample depth (sites recording): deep blue line on the second axis. */
  readonly sampleDepth: HexColour;
  /** Below-normal category: blue. */
  readonly below: HexColour;
  /** Near-normal category: light grey. */
  readonly near: HexColour;
  /** Above-normal category: orange-amber. */
  readonly above: HexColour;
  /** Text, axes, reference lines: near black. */
  readonly ink: HexColour;
  /** Secondary text and tick labels: dark grey. */
  readonly inkMuted: HexColour;
  /** Grid lines: very light grey. */
  readonly grid: HexColour;
  /** Background shading of a period (the calibration years): very light blue-grey. */
  readonly shade: HexColour;
  /** Colours of several lines in one chart (phases across moving windows), in order. */
  readonly series: readonly [HexColour, HexColour, HexColour, HexColour];
}

/**
 * The chart palette (colour roles to hex colours).
 *
 * @example
 * palette.fireYear; // => "#d9822b"
 * @see Machado, Oliveira & Fernandes (2009), IEEE TVCG 15(6):1291–1298 (simulation used to check it).
 */
export const palette: ChartPalette = Object.freeze({
  estimate: "#1d4e89",
  interval: "#a9c4e4",
  limit95: "#168a7a",
  limit99: "#a772cf",
  fireYear: "#d9822b",
  otherYear: "#9e9e9e",
  outsideYear: "#d6d6d6",
  current: "#8e44ad",
  baseRate: "#168a7a",
  sampleDepth: "#1d4e89",
  below: "#2f6db5",
  near: "#c4c4c4",
  above: "#d9822b",
  ink: "#262626",
  inkMuted: "#5f5f5f",
  grid: "#e2e2e2",
  shade: "#e9eef5",
  series: Object.freeze(["#1d4e89", "#d9822b", "#4fb8a5", "#a772cf"] as const),
});

/** A colour role of {@link palette}, or an entry of its `series` as `series0` … `series3`. */
export type PaletteRole = Exclude<keyof ChartPalette, "series"> | "series0" | "series1" | "series2" | "series3";

/**
 * The sets of colour roles that appear together in one chart, keyed by chart function name:
 * within each set every pair must stay distinguishable.
 *
 * @example
 * coloursUsedTogether.categoryOddsBar; // => ["below", "near", "above", "ink"]
 */
export const coloursUsedTogether: Readonly<Record<string, readonly PaletteRole[]>> = Object.freeze({
  oddsByPhaseChart: ["estimate", "interval", "baseRate", "ink"],
  seaChart: ["estimate", "interval", "limit95", "limit99", "ink"],
  phaseSpaceScatter: ["otherYear", "fireYear", "current", "ink"],
  activityTimeline: ["otherYear", "outsideYear", "fireYear", "sampleDepth", "ink"],
  reliabilityDiagram: ["estimate", "baseRate", "ink"],
  rocCurveChart: ["estimate", "ink"],
  stabilityChart: ["series0", "series1", "series2", "series3", "inkMuted"],
  categoryOddsBar: ["below", "near", "above", "ink"],
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
 * @param role - a role of {@link palette} or `series0` … `series3`.
 * @returns its hex colour.
 * @throws never: every {@link PaletteRole} has a colour.
 * @example
 * paletteColour("series1"); // => "#d9822b"
 * @see Machado, Oliveira & Fernandes (2009), IEEE TVCG 15(6):1291–1298.
 */
export function paletteColour(role: PaletteRole): HexColour {
  switch (role) {
    case "series0":
      return palette.series[0];
    case "series1":
      return palette.series[1];
    case "series2":
      return palette.series[2];
    case "series3":
      return palette.series[3];
    default:
      return palette[role];
  }
}
