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
  /** Where the value came from: "region.json" or "--values". */
  readonly source: string;
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
