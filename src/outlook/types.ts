/** The current-season Outlook and its JSON form (promised interface, README "JSON output"). */
import type { ProbabilityEstimate } from "../calibrate/types.js";
import type { Skill } from "../hindcast/types.js";

export interface CurrentPhase {
  readonly index: string;
  readonly value: number;
  readonly label: string;
  readonly nearBoundary: boolean;
  /** z-score of the value against the calibration period; null when the index has no spread (SD 0 or undefined). */
  readonly z: number | null;
  /** Why `z` is null (absent when it is not). */
  readonly zReason?: string;
  /** Where the value came from: "region.json", "--values", or the index file and its months. */
  readonly source: string;
  /** True when the value was computed from only part of its season window (buildOutlook always fills it). */
  readonly provisional?: boolean;
  /** Months ("YYYY-MM") the value was computed from; empty when it was given as a number. */
  readonly months?: readonly string[];
  /** The index's season window such as "Dec-Mar", or null for a yearly value. */
  readonly window?: string | null;
  /** Margin around a phase cut within which the value counts as near the boundary (index units). */
  readonly nearBoundaryMargin?: number;
}

/** The fire-year odds read from a response curve at this season's value. */
export interface CurveOdds {
  readonly index: string;
  /** This season's value, and the value the curve was read at (the nearest calibration extreme when beyond). */
  readonly value: number;
  readonly readAt: number;
  /** "above" / "below" when this season's value lies beyond the calibration range; else null. */
  readonly beyondRange: "above" | "below" | null;
  readonly estimate: number;
  readonly lower: number;
  readonly upper: number;
  readonly form: "linear" | "quadratic";
  readonly band: string;
  readonly range: { readonly min: number; readonly max: number };
  /** Calibration years in the fit and their high-fire years. */
  readonly years: number;
  readonly fireYears: number;
}

/** The phase rule's odds (the cell of past years), as reported beside the curve's. */
export interface PhaseOddsReading extends ProbabilityEstimate {
  readonly basis: string;
  readonly basisIndices: readonly string[];
  readonly years: number;
  readonly fireYears: number;
}

/** Percentile interval of the headline odds from a moving-block bootstrap of the whole rule. */
export interface SelectionInterval {
  readonly lower: number;
  readonly upper: number;
  readonly resamples: number;
  readonly blockYears: number;
  readonly level: number;
  readonly seed: number;
  readonly method: string;
}

export interface AnalogYear {
  readonly year: number;
  readonly distance: number;
  readonly fireYear: boolean;
  readonly activity: number;
  readonly category: "below" | "near" | "above";
  readonly values: Readonly<Record<string, number>>;
}

export interface Outlook {
  readonly issued: string; // YYYY-MM-DD
  readonly season: number;
  readonly region: string;
  readonly baseRate: ProbabilityEstimate;
  readonly current: readonly CurrentPhase[];
  /** Indices left out of the outlook because they have no current value. */
  readonly missing: readonly string[];
  readonly fireYear: ProbabilityEstimate & {
    readonly basis: string;
    readonly basisIndices: readonly string[];
    readonly years: number;
    readonly fireYears: number;
    /** "higher" / "lower" when the 95% interval excludes the base rate, else "not distinguishable". */
    readonly comparedWithBase: "higher" | "lower" | "not distinguishable";
    /** Which interval of this season's chance the comparison used (the selection-aware one when there is one). */
    readonly comparedUsing?: "interval" | "selection-aware interval";
    /** Which form gave the headline (`methods.response`); buildOutlook always fills the fields below. */
    readonly response?: "phase" | "curve";
    /** The phase rule's odds (the headline itself when response is "phase"). */
    readonly phaseOdds?: PhaseOddsReading;
    /** The curve rule's odds; null with `curveOddsReason` when no curve could be read. */
    readonly curveOdds?: CurveOdds | null;
    readonly curveOddsReason?: string;
    /** Selection-aware interval of the headline odds; null with `selectionIntervalReason` when not computable. */
    readonly selectionInterval?: SelectionInterval | null;
    readonly selectionIntervalReason?: string;
    /** A plain sentence when the selection-aware and the plain interval differ much; else null. */
    readonly selectionNote?: string | null;
    /** A plain sentence when this season's value is strong within its phase and what the curve gives; else null. */
    readonly strengthNote?: string | null;
  };
  readonly perIndex: readonly { readonly index: string; readonly label: string; readonly probability: ProbabilityEstimate; readonly years: number; readonly fireYears: number }[];
  readonly categories: {
    readonly below: ProbabilityEstimate;
    readonly near: ProbabilityEstimate;
    readonly above: ProbabilityEstimate;
  };
  readonly analogs: readonly AnalogYear[];
  readonly analogFireShare: ProbabilityEstimate;
  readonly hindcast: Skill;
  readonly warnings: readonly { readonly code: string; readonly message: string }[];
}
