/** Cross-validated verification of the outlook method. */

import type { CorpReliability } from "../stats/corpReliability.js";

export interface ReliabilityBin {
  readonly lower: number;
  readonly upper: number;
  readonly count: number;
  readonly meanForecast: number | null;
  readonly observedFrequency: number | null;
}

export interface HindcastYear {
  readonly year: number;
  readonly probability: number;
  /** The left-in share of high-fire years (what the rule says with no index information). */
  readonly climatology: number;
  /** Whether this year was a high-fire year under the event fixed from the whole period. */
  readonly fireYear: boolean;
  readonly categoryProbabilities: readonly [number, number, number];
  /** The left-in category shares (what the rule says with no index information). */
  readonly climatologyCategories: readonly [number, number, number];
  readonly observedCategory: 0 | 1 | 2;
  /**
   * Which past years the forecast was read from: a joint phase, a single index phase, or climatology (all
   * left-in years); "curve" for a curve-rule forecast read from a fitted response curve.
   */
  readonly basis: "joint" | "single" | "climatology" | "curve";
}

/** Moving-block bootstrap intervals of the hindcast scores (C8). An interval is null when it cannot be computed. */
export interface SkillIntervals {
  readonly brierSkillScore: readonly [number, number] | null;
  readonly rpss: readonly [number, number] | null;
  readonly rocArea: readonly [number, number] | null;
  /** How the intervals were made, in words. */
  readonly method: string;
  readonly resamples: number;
  readonly blockYears: number;
  /** Coverage, e.g. 0.95. */
  readonly level: number;
  readonly reason?: string;
}

export interface Skill {
  readonly years: number;
  readonly exclusion: number;
  readonly brierScore: number | null;
  readonly brierScoreClimatology: number | null;
  readonly brierSkillScore: number | null;
  readonly rps: number | null;
  readonly rpsClimatology: number | null;
  readonly rpss: number | null;
  readonly rpsForm: string;
  readonly rocArea: number | null;
  readonly rocStandardError: number | null;
  readonly rocCurve: readonly { readonly falseAlarmRate: number; readonly hitRate: number }[];
  readonly reliability: readonly ReliabilityBin[];
  readonly hasSkill: boolean;
  readonly verdict: string;
  readonly rule: string;
  readonly forecasts: readonly HindcastYear[];
  readonly reason?: string;
  /** Permutation p-value of the Brier skill score, (b + 1)/(m + 1); null (with skillPValueReason) when not computed. */
  readonly skillPValue?: number | null;
  readonly skillPValueReason?: string;
  /** Number of block shuffles m behind skillPValue. */
  readonly permutations?: number;
  /** How the permutation test's statistic is computed when it is not the reported score (the curve rule: ONE_STEP_RULE). */
  readonly permutationStatistic?: string;
  /** Block length (years) of the shuffles behind skillPValue. */
  readonly permutationBlockYears?: number;
  /** Moving-block bootstrap intervals of BSS, RPSS and ROC area. */
  readonly intervals?: SkillIntervals | null;
  /** CORP reliability diagram of the hindcast forecasts; null (with corpReason) when not computable. */
  readonly corp?: CorpReliability | null;
  readonly corpReason?: string;
  /** The curve rule's hindcast in the same folds (issue 11); null (with curveRuleReason) when not run. */
  readonly curveRule?: Skill | null;
  /**
   * Which rule these scores verify: the one the outlook issued (`methods.response`). When the curve
   * rule is issued, the Skill is the curve rule's and `phaseRule` holds the phase rule's beside it.
   */
  readonly issuedRule?: "phase" | "curve";
  /** The phase rule's hindcast, present when the curve rule is the issued one. */
  readonly phaseRule?: Skill | null;
  readonly curveRuleReason?: string;
  /** Why `intervals` is null. */
  readonly intervalsReason?: string;
  /** Why rps/rpss are null when the scores exist (the curve rule has no category odds of its own). */
  readonly rpssReason?: string;
  /** The reference (climatological) forecast of BSS and RPSS: the whole-period shares, and the rule in words. */
  readonly reference?: { readonly fireYear: number; readonly categories: readonly [number, number, number]; readonly rule: string };
}
