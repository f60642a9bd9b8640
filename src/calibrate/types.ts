/**
 * The Calibration record: how each index phase has shifted the odds of a fire year in the
 * calibration period. Its JSON form (`toCalibrationJson`) is a promised interface (README "JSON output").
 * A statistic that cannot be computed is `null` with a `reason` beside it.
 */
import type { FireYearSelection, ActivityCategories } from "../record/types.js";
import type { PhaseDefinition } from "../climate/types.js";

export interface ProbabilityEstimate {
  readonly estimate: number | null;
  readonly lower: number | null;
  readonly upper: number | null;
  /** Present when the estimate is null (e.g. "no years in this phase"). */
  readonly reason?: string;
}

export interface PhaseOdds {
  readonly label: string;
  readonly years: number;
  readonly fireYears: number;
  readonly probability: ProbabilityEstimate;
  /** probability.estimate / base rate; null when either is undefined. */
  readonly ratioToBase: number | null;
  /** Category counts of the phase years (below / near / above normal). */
  readonly categories: { readonly below: number; readonly near: number; readonly above: number };
  readonly smallSample: boolean;
}

export interface PerPhaseTest {
  readonly label: string;
  /** Two-sided Fisher exact p, this phase against all other phases. */
  readonly fisherPValue: number | null;
  /** Adjusted standardized residual of the fire-year cell (Agresti). */
  readonly residual: number | null;
  readonly oddsRatio: { readonly estimate: number | null; readonly lower: number | null; readonly upper: number | null; readonly haldaneCorrected: boolean };
}

export interface ContingencyResult {
  readonly chiSquare: number | null;
  readonly df: number;
  readonly pValue: number | null;
  /** Benjamini–Hochberg q across all indices' chi-square tests. */
  readonly qValue: number | null;
  /** Share of expected counts below 5 (a chi-square approximation caution). */
  readonly smallExpectedShare: number;
  readonly perPhase: readonly PerPhaseTest[];
  readonly reason?: string;
}

export interface SeaResult {
  readonly lags: readonly number[];
  /** Mean departure of the index from the baseline at each lag; null where not computable. */
  readonly mean: readonly (number | null)[];
  readonly ci95: readonly ([number, number] | null)[];
  readonly ci99: readonly ([number, number] | null)[];
  readonly pValue: readonly (number | null)[];
  /** Benjamini–Hochberg q across this index's lags. */
  readonly qValue: readonly (number | null)[];
  readonly eventYears: readonly number[];
  readonly poolYears: number;
  readonly draws: number;
  readonly seed: number;
  readonly baseline: string;
  readonly sampling: string;
  readonly percentileRule: string;
  readonly reason?: string;
}

export interface AggregatedLagResult {
  readonly blockYears: number;
  readonly blocks: number;
  readonly lags: readonly number[];
  readonly r: readonly (number | null)[];
  readonly pValue: readonly (number | null)[];
  readonly effectiveN: readonly (number | null)[];
  readonly reason?: string;
}

export interface StabilityWindow {
  readonly first: number;
  readonly last: number;
  readonly years: number;
  readonly phases: readonly { readonly label: string; readonly years: number; readonly fireYears: number; readonly probability: ProbabilityEstimate }[];
}

export interface IndexCalibration {
  readonly name: string;
  readonly definition: PhaseDefinition;
  /** Calibration years with an index value. */
  readonly years: number;
  readonly phases: readonly PhaseOdds[];
  readonly contingency: ContingencyResult;
  readonly sea: SeaResult;
  readonly aggregated: AggregatedLagResult;
  readonly stability: { readonly window: number; readonly step: number; readonly windows: readonly StabilityWindow[] };
  /** Mean and standard deviation of the index over the calibration years (for z-scores). */
  readonly mean: number;
  readonly sd: number;
}

export interface Calibration {
  readonly region: { readonly name: string };
  readonly period: { readonly first: number; readonly last: number; readonly years: number };
  /** Calibration years used (ascending): inside the period, enough recording sites. */
  readonly years: readonly number[];
  /** Activity per calibration year in the chosen measure. */
  readonly activity: ReadonlyMap<number, number>;
  readonly fireYears: FireYearSelection;
  readonly categories: ActivityCategories;
  readonly baseRate: ProbabilityEstimate;
  readonly indices: readonly IndexCalibration[];
  readonly interval: "wilson" | "jeffreys";
  readonly seed: number;
  readonly warnings: readonly { readonly code: string; readonly message: string }[];
}
