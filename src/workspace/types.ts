import type { MonthlyValue } from "../climate/seasonalValues.js";

/**
 * Typed, read-only records produced by the region-folder reader (`loadWorkspace`).
 * After loading, every later stage trusts these types; only the reader validates.
 */

/** Method settings, all optional in region.json under `methods`; defaults are in `DEFAULT_METHODS`. */
export interface MethodSettings {
  /** Interval for a binomial proportion: Wilson score (default) or Jeffreys. */
  readonly interval: "wilson" | "jeffreys";
  /** First and last SEA lag in years around each fire year (default −6 and +4). */
  readonly seaFirstLag: number;
  readonly seaLastLag: number;
  /** Random draws for the SEA limits (default 10,000; at least 1,000). */
  readonly seaDraws: number;
  /** Block length in years of the aggregated lag correlation (default 5). */
  readonly blockYears: number;
  /** Largest block lag either side (default 2, so lags −2…+2). */
  readonly blockMaxLag: number;
  /** Moving-window width and step in years for the stability check (default 100 and 10). */
  readonly stabilityWindow: number;
  readonly stabilityStep: number;
  /** Number of analog years (default 10). */
  readonly analogs: number;
  /** Fewest calibration years a joint phase cell needs to be used for the outlook (default 10). */
  readonly jointMinYears: number;
  /** An index joins the joint phase only when its chi-square q-value (Benjamini–Hochberg across indices) is at most this (default 0.05). */
  readonly jointMaxQ: number;
  /**
   * Margin within which a value is reported as near a phase boundary, as a share of the index's
   * standard deviation over the calibration years (default 0.1, so 0.1 SD; 0 to 10).
   */
  readonly nearBoundarySd: number;
  /** How an index is related to the fire-year odds: by phase (default) or by a logistic response curve. */
  readonly response: "phase" | "curve";
  /** Measure of the modern (agency) fire record used for its fire years: burned area (default) or number of fires. */
  readonly modernMeasure: "area" | "fires";
  /** Random permutations of a permutation test (default 999; 199 to 100,000). */
  readonly permutations: number;
  /** Bootstrap resamples of a bootstrap interval (default 999; 199 to 100,000). */
  readonly bootstrapResamples: number;
  /** Sites closer than this many km are reported as possibly not independent (default 40). */
  readonly independenceKm: number;
  /** Hindcast leaves out the target year and this many years either side (default 2). */
  readonly hindcastExclusion: number;
  /** A phase with fewer calibration years than this is flagged as a small sample (default 20). */
  readonly smallSampleYears: number;
}

export interface FireYearSettings {
  /** Share of calibration years that are fire years, 0 < top < 1 (default 0.10). */
  readonly top: number;
  /** Activity measure: fraction of recording sites burned (default), or number of sites burned. */
  readonly measure: "fraction" | "sites";
  /** Years with fewer recording sites are left out of calibration (default 3). */
  readonly minSitesRecording: number;
}

export type PhaseRule =
  | { readonly kind: "cuts"; readonly cuts: readonly number[]; readonly labels: readonly string[] }
  | { readonly kind: "terciles"; readonly labels: readonly string[] };

export interface IndexSettings {
  readonly name: string;
  /** Path relative to the region folder, as written in region.json. */
  readonly file: string;
  readonly column: string;
  readonly phases: PhaseRule;
  /** Month window such as "Dec-Mar" for monthly files; null for a yearly file. */
  readonly months: string | null;
  /**
   * Declared missing-value codes of this index (e.g. [-99.99]): a cell holding exactly one of them
   * is read as empty. The reader always fills this (default []); optional only for older literals.
   */
  readonly missing?: readonly number[];
  /** Scale of the index as the user names it (e.g. "standardized", "°C anomaly"); null when not given. */
  readonly units?: string | null;
}

export interface RegionSettings {
  readonly name: string;
  readonly description: string | null;
  readonly calibration: { readonly first: number; readonly last: number } | null;
  readonly fireYears: FireYearSettings;
  readonly indices: readonly IndexSettings[];
  readonly outlook: {
    readonly season: number | null;
    readonly values: Readonly<Record<string, number>>;
    readonly issued: string | null;
  };
  readonly seed: number;
  readonly methods: MethodSettings;
  /** Who prepared the region folder (free text); null when not given. The reader always fills this. */
  readonly preparedBy?: string | null;
  /** How to reach them (free text); null when not given. The reader always fills this. */
  readonly contact?: string | null;
}

export interface Site {
  readonly id: string;
  readonly name: string | null;
  readonly latitude: number;
  readonly longitude: number;
  readonly firstYear: number;
  readonly lastYear: number;
}

export interface FireEvent {
  readonly site: string;
  readonly year: number;
}

/** One row of an already composited record (`fire-activity.csv`). */
export interface ActivityRow {
  readonly year: number;
  readonly sitesRecording: number;
  readonly sitesBurned: number;
}

export interface ModernFireRow {
  readonly year: number;
  readonly fires: number | null;
  readonly areaHa: number | null;
}

/** One seasonal value per year for one index; `null` = missing. Years are ascending and unique. */
export interface IndexSeries {
  readonly name: string;
  readonly years: readonly number[];
  readonly values: readonly (number | null)[];
  /**
   * The raw months of a monthly file (ascending year then month; a missing or declared-missing
   * cell is `value: null`), so that this season's value can be computed; absent for a yearly file.
   */
  readonly monthly?: readonly MonthlyValue[];
}

export interface InputFile {
  /** Role in the region: "region", "sites", "events", "activity", "modern", "index:<NAME>". */
  readonly role: string;
  /** Path relative to the region folder. */
  readonly path: string;
  readonly sha256: string;
  readonly bytes: number;
}

export interface Warning {
  readonly code: string;
  readonly message: string;
}

export type FireRecordInput =
  | { readonly kind: "sites"; readonly sites: readonly Site[]; readonly events: readonly FireEvent[] }
  | { readonly kind: "activity"; readonly rows: readonly ActivityRow[] };

/** Everything read from one region folder. */
export interface Workspace {
  /** Absolute path of the region folder. */
  readonly root: string;
  /** The region folder as the user gave it, for messages (`file:line` paths); defaults to `root`. */
  readonly shownRoot?: string;
  readonly settings: RegionSettings;
  readonly fireRecord: FireRecordInput;
  readonly modern: readonly ModernFireRow[] | null;
  readonly indices: readonly IndexSeries[];
  readonly files: readonly InputFile[];
  /** Reader warnings (duplicate events counted once, seasons with a missing month, …). */
  readonly warnings: readonly Warning[];
}
