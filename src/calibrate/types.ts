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
  /**
   * Logistic response curve of high-fire year on the index value over the calibration years
   * (README "`firephase calibrate`"); null with `curveReason` when it cannot be fitted.
   * Optional only for hand-made records; `runCalibration` always fills it.
   */
  readonly curve?: ResponseCurve | null;
  /** Why `curve` is null (absent when it is not). */
  readonly curveReason?: string;
}

/** One point of a fitted response curve with its pointwise 95% band. */
export interface ResponseCurvePoint {
  readonly value: number;
  readonly estimate: number;
  readonly lower: number;
  readonly upper: number;
}

/** A quadratic-logit response curve, reported only when it is clearly better than the straight logit. */
export interface QuadraticResponse {
  /** [intercept, linear, quadratic] on the logit scale. */
  readonly coefficients: readonly [number, number, number];
  readonly standardErrors: readonly [number, number, number];
  /** Likelihood-ratio statistic and chi-square (1 df) p-value of the quadratic against the straight logit. */
  readonly likelihoodRatio: number;
  readonly pValue: number;
  /** Akaike information criterion of the quadratic fit (the straight one's is `ResponseCurve.aic`). */
  readonly aic: number;
  readonly method: "maximum likelihood" | "Firth penalized likelihood";
  readonly points: readonly ResponseCurvePoint[];
  /** Covariance of the coefficients (for reading the curve at another value). */
  readonly covariance: readonly (readonly number[])[];
}

/**
 * Logistic regression of high-fire year (1/0) on the index value: logit P(high-fire) = intercept + slope × value.
 */
export interface ResponseCurve {
  readonly intercept: number;
  readonly slope: number;
  /** Standard errors of [intercept, slope]. */
  readonly standardErrors: readonly [number, number];
  /** Covariance matrix of [intercept, slope] (inverse information at the fit). */
  readonly covariance: readonly (readonly number[])[];
  /** Likelihood-ratio statistic against the intercept-only model and its chi-square (1 df) p-value. */
  readonly likelihoodRatio: number;
  readonly pValue: number;
  /** Benjamini–Hochberg q of `pValue` across all indices' curves (set by the calibration; absent on a fold's own fit). */
  readonly qValue?: number | null;
  readonly method: "maximum likelihood" | "Firth penalized likelihood";
  /** (Quasi-)complete separation found in the maximum-likelihood fit (then the Firth fit is reported). */
  readonly separation: boolean;
  readonly converged: boolean;
  readonly iterations: number;
  /** Akaike information criterion, −2 log-likelihood + 2 × 2. */
  readonly aic: number;
  /** Calibration years in the fit (those with an index value) and their high-fire years. */
  readonly years: number;
  readonly fireYears: number;
  /** Smallest and largest index value of the fit: the curve is not read beyond them. */
  readonly range: { readonly min: number; readonly max: number };
  /** How the band of `points` is computed, in words. */
  readonly band: string;
  readonly level: number;
  readonly points: readonly ResponseCurvePoint[];
  /** The quadratic form when it is clearly better (rule in `quadraticRule`), else null with `quadraticReason`. */
  readonly quadratic: QuadraticResponse | null;
  readonly quadraticReason?: string;
  readonly quadraticRule: string;
}

/** Median and range of one modern measure in a group of years (null with a reason when the group has no value). */
export interface ModernSummary {
  readonly years: number;
  readonly median: number | null;
  readonly min: number | null;
  readonly max: number | null;
  readonly reason?: string;
}

/** The two-era homogeneity test of one index's link (Breslow–Day with Tarone's correction). */
export interface ModernHomogeneity {
  readonly test: string;
  /** The fire-scar phase compared against the other phases in both eras (the one that raised the odds most). */
  readonly phase: string;
  /** The 2×2 of each era: [[phase & high-fire, phase & other], [other phases & high-fire, other phases & other]]. */
  readonly tables: { readonly fireScar: readonly (readonly number[])[]; readonly modern: readonly (readonly number[])[] };
  readonly statistic: number | null;
  readonly df: number;
  readonly pValue: number | null;
  /** Benjamini–Hochberg q of pValue across the indices; "canTell" (the link differs) needs q ≤ 0.05. */
  readonly qValue?: number | null;
  readonly commonOddsRatio: number | null;
  /** Odds ratio of the phase vs the other phases in each era (Woolf; +0.5 to every cell when one is zero). */
  readonly fireScarOddsRatio: number | null;
  readonly modernOddsRatio: number | null;
  /** The modern link by its odds ratio against the fire-scar one (rule in `directionRule`); null when not computable. */
  readonly direction: "same" | "weaker" | "stronger" | null;
  readonly directionRule: string;
  /** True when the test can tell (p ≤ 0.05 with enough modern high-fire years). */
  readonly canTell: boolean;
  readonly sentence: string;
  readonly reason?: string;
}

export interface ModernIndex {
  readonly name: string;
  /** Modern years with a value of this index. */
  readonly years: number;
  readonly phases: readonly { readonly label: string; readonly years: number; readonly fireYears: number; readonly probability: ProbabilityEstimate }[];
  readonly homogeneity: ModernHomogeneity;
}

/** The modern (agency) fire record as a second era beside the fire-scar calibration. */
export interface ModernEra {
  readonly measure: "area" | "fires";
  readonly period: { readonly first: number; readonly last: number; readonly years: number };
  /** Modern years used (ascending): a value of the measure and of at least one index. */
  readonly years: readonly number[];
  readonly top: number;
  readonly threshold: number | null;
  /** Modern high-fire years (ascending). */
  readonly fireYears: readonly number[];
  readonly realisedShare: number;
  readonly baseRate: ProbabilityEstimate;
  /** What a high-fire year means in the modern record's units. */
  readonly meaning: {
    readonly areaHa: { readonly highFire: ModernSummary; readonly other: ModernSummary };
    readonly fires: { readonly highFire: ModernSummary; readonly other: ModernSummary };
  };
  /** Years present in both records: how often both call it a high-fire year. */
  readonly agreement: {
    readonly years: number;
    readonly both: number;
    readonly fireScarOnly: number;
    readonly modernOnly: number;
    readonly neither: number;
    /** Share of the shared years on which the two records agree; null with a reason when there are none. */
    readonly agreementShare: number | null;
    /** Cohen's kappa; null with a reason when undefined. */
    readonly kappa: number | null;
    readonly reason?: string;
  };
  /** How the two eras are compared (the 2×2 of each era and which years count in which era), in words. */
  readonly homogeneityDefinition: string;
  readonly indices: readonly ModernIndex[];
  readonly warnings: readonly { readonly code: string; readonly message: string }[];
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
  /**
   * The modern fire record as a second era; null with `modernReason` when there is no modern
   * record or too few years. Optional only for hand-made records; `runCalibration` always fills it.
   */
  readonly modern?: ModernEra | null;
  readonly modernReason?: string;
}
