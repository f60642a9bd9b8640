/** Records of the composited fire history. */

/** Fire activity in one year across all sites whose recording span covers it. */
export interface YearActivity {
  readonly year: number;
  readonly sitesRecording: number;
  readonly sitesBurned: number;
  /** sitesBurned / sitesRecording; NaN is never stored: years with 0 sites recording are absent. */
  readonly fraction: number;
}

export interface FireActivity {
  /** Every year with at least one recording site, ascending. */
  readonly years: readonly YearActivity[];
  /** Years (ascending) that meet `minSitesRecording` and may be used for calibration. */
  readonly usableYears: readonly number[];
  /** Years with ≥ 1 but fewer than `minSitesRecording` recording sites. */
  readonly thinYears: readonly number[];
  readonly minSitesRecording: number;
}

/** Fire years chosen from the calibration years (top share by activity, ties all in). */
export interface FireYearSelection {
  readonly top: number;
  readonly measure: "fraction" | "sites";
  /** Activity of the ceil(top × N)-th highest year; null when no year has activity > 0. */
  readonly threshold: number | null;
  readonly years: readonly number[];
  /** years.length / number of calibration years. */
  readonly realisedShare: number;
  readonly calibrationYears: number;
}

export type ActivityCategory = "below" | "near" | "above";

/** Below / near / above normal by terciles of calibration-period activity. */
export interface ActivityCategories {
  /** Upper bound of "below" (inclusive) and lower bound of "above" (exclusive of near), see doc. */
  readonly lowerCut: number;
  readonly upperCut: number;
  /** Sample-quantile rule, e.g. "Hyndman & Fan type 7". */
  readonly quantileRule: string;
  readonly tieRule: string;
  readonly byYear: ReadonlyMap<number, ActivityCategory>;
  readonly realisedShares: { readonly below: number; readonly near: number; readonly above: number };
}
