import { classifyPhase } from "../climate/phaseDefinition.js";
import type { ActivityCategory } from "../record/types.js";
import { brierScore } from "../stats/brierScore.js";
import { brierSkillScore } from "../stats/brierSkillScore.js";
import { rankedProbabilityScore } from "../stats/rankedProbabilityScore.js";
import { rankedProbabilitySkillScore } from "../stats/rankedProbabilitySkillScore.js";
import { reliabilityTable } from "../stats/reliabilityTable.js";
import { rocArea } from "../stats/rocArea.js";
import { rocCurve } from "../stats/rocCurve.js";
import { buildTrainingSet, type IndexValues } from "../calibrate/buildTrainingSet.js";
import { forecastCell } from "../calibrate/forecastCell.js";
import { rankIndicesByAssociation } from "../calibrate/rankIndicesByAssociation.js";
import type { IndexSettings } from "../workspace/types.js";
import type { HindcastYear, Skill } from "./types.js";
import { skillVerdict, SKILL_RULE } from "./skillVerdict.js";

export interface HindcastInput {
  readonly years: readonly number[];
  readonly activity: ReadonlyMap<number, number>;
  readonly indexValues: IndexValues;
  readonly indexSettings: readonly IndexSettings[];
  /** The indices the outlook uses (those with a current value); the hindcast verifies that same method. */
  readonly indices: readonly string[];
  readonly top: number;
  readonly measure: "fraction" | "sites";
  readonly exclusion: number;
  readonly jointMinYears: number;
  readonly jointMaxQ: number;
}

const CATEGORY_NUMBER: Record<ActivityCategory, 0 | 1 | 2> = { below: 0, near: 1, above: 2 };

/** The ranked probability score form used for RPSS (stated in output). */
export const RPS_FORM =
  "unnormalized RPS, the sum over the three categories of squared differences of cumulative forecast and observed probabilities (Epstein 1969; Murphy 1971)";

/**
 * Cross-validated hindcast of the outlook method. Every calibration year is forecast from a
 * calibration that leaves out that year and `exclusion` years either side: the fire-year
 * threshold, activity terciles, index-phase terciles, the ranking of indices and the conditional
 * odds are all recomputed from the years left in, and the year's observed outcome is judged with the
 * left-in threshold and terciles. Nothing about a held-out year reaches its own forecast.
 *
 * Scores: Brier score and Brier skill score against the left-in climatology (Brier G.W. 1950,
 * "Verification of forecasts expressed in terms of probability", Monthly Weather Review 78:1–3);
 * ranked probability skill score for below/near/above normal (Epstein E.S. 1969, "A scoring system
 * for probability forecasts of ranked categories", J. Appl. Meteor. 8:985–987; Murphy A.H. 1971,
 * J. Appl. Meteor. 10:155–156), against the left-in category shares; ROC area by the Mann–Whitney
 * statistic with the Hanley & McNeil (1982) standard error ("The meaning and use of the area under a
 * receiver operating characteristic (ROC) curve", Radiology 143:29–36); a reliability table.
 */
export function runHindcast(input: HindcastInput): Skill {
  const forecasts: HindcastYear[] = [];
  for (const target of input.years) {
    const trainingYears = input.years.filter((year) => Math.abs(year - target) > input.exclusion);
    if (trainingYears.length === 0) continue;
    const training = buildTrainingSet({
      years: trainingYears,
      activity: input.activity,
      indexValues: input.indexValues,
      indexSettings: input.indexSettings,
      top: input.top,
      measure: input.measure,
      classify: [target],
    });
    const current = new Map<string, number>();
    for (const index of input.indices) {
      const value = input.indexValues.get(index)?.get(target);
      const definition = training.definitions.get(index);
      if (value !== undefined && definition !== undefined) current.set(index, classifyPhase(value, definition.cuts));
    }
    // Ranked (and q-values taken) over every index of the region, as the outlook does from its calibration.
    const ranking = rankIndicesByAssociation(training, input.indexSettings.map((settings) => settings.name));
    const cell = forecastCell(training, current, ranking, input.jointMinYears, input.jointMaxQ);
    const climatology = training.fireYears.years.length / trainingYears.length;
    const shares = training.categories.realisedShares;
    const n = cell.years.length;
    const probability = n === 0 ? climatology : cell.fireYears / n;
    const categoryProbabilities: [number, number, number] =
      n === 0 ? [shares.below, shares.near, shares.above] : [cell.categories.below / n, cell.categories.near / n, cell.categories.above / n];
    const activity = input.activity.get(target) as number;
    const threshold = training.fireYears.threshold;
    const fireYear = threshold !== null && activity >= threshold && activity > 0;
    const category = training.categories.byYear.get(target) ?? "below";
    forecasts.push({
      year: target,
      probability,
      climatology,
      fireYear,
      categoryProbabilities,
      climatologyCategories: [shares.below, shares.near, shares.above],
      observedCategory: CATEGORY_NUMBER[category],
      basis: cell.basis,
    });
  }
  return scoreHindcast(forecasts, input.exclusion);
}

/** Scores a list of hindcast forecasts (see {@link runHindcast}). */
export function scoreHindcast(forecasts: readonly HindcastYear[], exclusion: number): Skill {
  const outcomes = forecasts.map((forecast) => forecast.fireYear);
  const probabilities = forecasts.map((forecast) => forecast.probability);
  const events = outcomes.filter(Boolean).length;
  if (forecasts.length < 10 || events === 0 || events === forecasts.length) {
    const reason =
      forecasts.length < 10
        ? `only ${forecasts.length} hindcast years`
        : events === 0
          ? "no fire year among the hindcast years"
          : "every hindcast year was a fire year";
    const verdict = skillVerdict(null, null, null);
    return {
      years: forecasts.length,
      exclusion,
      brierScore: null,
      brierScoreClimatology: null,
      brierSkillScore: null,
      rps: null,
      rpsClimatology: null,
      rpss: null,
      rpsForm: RPS_FORM,
      rocArea: null,
      rocStandardError: null,
      rocCurve: [],
      reliability: [],
      hasSkill: false,
      verdict: verdict.text,
      rule: SKILL_RULE,
      forecasts,
      reason,
    };
  }
  const bs = brierScore(probabilities, outcomes);
  const bsClimatology = brierScore(
    forecasts.map((forecast) => forecast.climatology),
    outcomes,
  );
  const bss = brierSkillScore(bs, bsClimatology);
  const rps = mean(forecasts.map((forecast) => rankedProbabilityScore(forecast.categoryProbabilities, forecast.observedCategory)));
  const rpsClimatology = mean(forecasts.map((forecast) => rankedProbabilityScore(forecast.climatologyCategories, forecast.observedCategory)));
  const rpss = rankedProbabilitySkillScore(rps, rpsClimatology);
  const roc = rocArea(probabilities, outcomes);
  const curve = rocCurve(probabilities, outcomes).map((point) => ({ falseAlarmRate: point.falseAlarmRate, hitRate: point.hitRate }));
  const finite = (value: number): number | null => (Number.isFinite(value) ? value : null);
  const verdict = skillVerdict(finite(bss), finite(roc.area), finite(roc.standardError));
  return {
    years: forecasts.length,
    exclusion,
    brierScore: finite(bs),
    brierScoreClimatology: finite(bsClimatology),
    brierSkillScore: finite(bss),
    rps: finite(rps),
    rpsClimatology: finite(rpsClimatology),
    rpss: finite(rpss),
    rpsForm: RPS_FORM,
    rocArea: finite(roc.area),
    rocStandardError: finite(roc.standardError),
    rocCurve: curve,
    reliability: reliabilityTable(probabilities, outcomes),
    hasSkill: verdict.hasSkill,
    verdict: verdict.text,
    rule: SKILL_RULE,
    forecasts,
  };
}

function mean(values: readonly number[]): number {
  return values.length === 0 ? NaN : values.reduce((sum, value) => sum + value, 0) / values.length;
}
