import type { IndexValues } from "../calibrate/buildTrainingSet.js";
import { blockPermutationIndices } from "../stats/blockPermutation.js";
import { brierScore } from "../stats/brierScore.js";
import { brierSkillScore } from "../stats/brierSkillScore.js";
import { corpReliability } from "../stats/corpReliability.js";
import { createRandom, type RandomSource } from "../stats/createRandom.js";
import { rankedProbabilityScore } from "../stats/rankedProbabilityScore.js";
import { rankedProbabilitySkillScore } from "../stats/rankedProbabilitySkillScore.js";
import { reliabilityTable } from "../stats/reliabilityTable.js";
import { rocArea } from "../stats/rocArea.js";
import { rocCurve } from "../stats/rocCurve.js";
import type { IndexSettings } from "../workspace/types.js";
import { curveRuleForecasts } from "./curveRuleForecasts.js";
import { curveScratch } from "./fastResponseCurve.js";
import { ONE_STEP_RULE, oneStepCurveForecasts, oneStepScratch } from "./oneStepCurveForecasts.js";
import { fixedEvent, type FixedEvent } from "./fixedEvent.js";
import { hindcastDesign, type HindcastDesign } from "./hindcastDesign.js";
import { BASIS, phaseRuleForecasts, phaseRuleScratch, type PhaseRuleForecasts, type PhaseRuleScratch, type PhaseRuleSettings } from "./phaseRuleForecasts.js";
import { skillIntervals, type ScoredYear } from "./skillIntervals.js";
import { skillVerdict, SKILL_RULE } from "./skillVerdict.js";
import type { HindcastYear, Skill } from "./types.js";

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
  /** Seed of the shuffles and resamples (region.json `seed`; default 1). */
  readonly seed?: number;
  /** Block shuffles of the permutation test (methods.permutations; default 999; 0 skips the test). */
  readonly permutations?: number;
  /** Block length in years of the shuffles and of the bootstrap (methods.blockYears; default 5). */
  readonly blockYears?: number;
  /** Moving-block bootstrap resamples of the score intervals and the CORP band (methods.bootstrapResamples; default 999). */
  readonly bootstrapResamples?: number;
  /** The rule the outlook issues (methods.response; default "phase"); the issued rule gets the full permutation count. */
  readonly response?: "phase" | "curve";
  /**
   * Shuffles of the curve rule's permutation test when it is not the issued rule (default 99, at most
   * `permutations`, and at most 99 × 3,000 / years: fewer than 99 affordable shuffles skip it with a
   * reason). Each shuffle fits the curves to the whole record and moves them to every fold by one Newton step
   * (ONE_STEP_RULE), under 1 ms per shuffle on the demo.
   */
  readonly curvePermutations?: number;
  /** Run the curve rule in the same folds (default true). */
  readonly curveRule?: boolean;
}

/** Defaults of the optional hindcast settings. */
export const HINDCAST_DEFAULTS = Object.freeze({
  seed: 1,
  permutations: 999,
  blockYears: 5,
  bootstrapResamples: 999,
  curvePermutations: 99,
});

/** The ranked probability score form used for RPSS (stated in output). */
export const RPS_FORM =
  "unnormalized RPS, the sum over the three categories of squared differences of cumulative forecast and observed probabilities (Epstein 1969; Murphy 1971)";

/** How the event and the reference forecast are defined (stated in output). */
export const REFERENCE_RULE =
  "The high-fire-year threshold and the activity terciles are fixed once from the whole calibration period (a climatology), not refitted in each fold, " +
  "so the event being forecast does not move with the held-out year (the cross-validation degeneracy of Barnston & van den Dool 1993). " +
  "The reference forecast of the Brier and ranked probability skill scores is that climatology: the whole-period share of high-fire years and of each tercile. " +
  "Each fold relearns the phase cuts, the index ranking and its q gate, and the odds from its left-in years only.";

/**
 * Work bound of the curve rule's permutation test when the curve rule is not the issued rule: shuffles × years at
 * most this (99 shuffles of a 3,000-year record; a shuffle costs two whole-record fits per index and a few
 * operations per fold, see oneStepCurveForecasts), so a very long record does not make every outlook slow.
 */
const CURVE_PERMUTATION_WORK = 99 * 3000;
/** Fewest shuffles worth running for the curve rule's p-value (resolution 0.01). */
const CURVE_MIN_PERMUTATIONS = 99;

/** Independent streams of the one region seed: shuffles, bootstrap, CORP band, and the curve rule's. */
const STREAM = { permutation: 0, bootstrap: 1, corp: 2, curvePermutation: 3, curveBootstrap: 4, curveCorp: 5 } as const;

function streamOf(seed: number, stream: number): RandomSource {
  // Distinct 32-bit seeds per stream (createRandom uses the low 32 bits); 0x9E3779B1 is the 32-bit golden-ratio constant.
  return createRandom(((seed | 0) + Math.imul(stream, 0x9e3779b1)) | 0);
}

/**
 * Cross-validated hindcast of the outlook method, with a permutation test of its skill. Every calibration year
 * is forecast from the years left after removing it and `exclusion` years either side: the index-phase cuts,
 * the ranking of indices by chi-square p with its Benjamini–Hochberg q gate, and the odds are relearned from
 * the years left in. The event (high-fire-year threshold and activity terciles) and the reference forecast are
 * fixed once from the whole period ({@link REFERENCE_RULE}).
 *
 * Scores: Brier score and Brier skill score against that climatology (Brier G.W. 1950, "Verification of
 * forecasts expressed in terms of probability", Monthly Weather Review 78:1–3); ranked probability skill score
 * for below/near/above normal (Epstein E.S. 1969, J. Appl. Meteor. 8:985–987; Murphy A.H. 1971, J. Appl.
 * Meteor. 10:155–156); ROC area by the Mann–Whitney statistic (its Hanley & McNeil 1982 standard error is
 * still reported, but assumes independent years and is not used by the verdict); a binned reliability table
 * and the CORP reliability diagram (Dimitriadis, Gneiting & Jordan 2021, PNAS 118:e2016191118).
 * Uncertainty: moving-block bootstrap 95% intervals of BSS, RPSS and ROC area (Künsch 1989, Ann. Statist.
 * 17:1217–1241). Skill test: the fire record (the fixed outcome per year) is shuffled across years in blocks
 * of `blockYears`, the whole hindcast is rerun for each shuffle, and p = (b + 1)/(m + 1) where b of the m
 * shuffles reach the observed BSS (Phipson & Smyth 2010, Stat. Appl. Genet. Mol. Biol. 9:39). The verdict
 * follows {@link SKILL_RULE}. The curve rule is verified in the same folds (Skill.curveRule).
 *
 * Speed: the parts that do not depend on the fire record (folds, phases, relearned cuts) are computed once
 * (hindcastDesign), and a fold's counts are the whole-record counts less its left-out years plus the few
 * years whose phase its cuts move, so one hindcast costs O(years × indices × window) and a shuffle reruns only
 * that counting.
 */
export function runHindcast(input: HindcastInput): Skill {
  const common = hindcastCommon(input);
  const result = phaseRuleHindcast(input, common);
  if (input.curveRule === false) return result;
  return withCurveRule(result, curveRuleHindcast(input, common));
}

/**
 * The curve rule's part of {@link runHindcast} alone (what runHindcast gives as `curveRule`), so it can be
 * computed apart from the phase rule's (another thread) and joined by {@link withCurveRule}: every part draws
 * from its own seeded stream, so the joined result is the same as runHindcast's.
 */
export function runCurveRuleHindcast(input: HindcastInput): Skill {
  return curveRuleHindcast(input, hindcastCommon(input));
}

/** The phase rule's hindcast (runHindcast with `curveRule: false`) joined with the curve rule's ({@link runCurveRuleHindcast}). */
export function withCurveRule(phaseRule: Skill, curveRule: Skill): Skill {
  return { ...phaseRule, curveRule };
}

/** What both rules' hindcasts share: the settings, the design, the fixed event and the phase rule's forecasts. */
interface HindcastCommon {
  readonly seed: number;
  readonly permutations: number;
  readonly blockYears: number;
  readonly resamples: number;
  readonly settings: PhaseRuleSettings;
  readonly design: HindcastDesign;
  readonly event: FixedEvent;
  readonly scratch: PhaseRuleScratch;
  readonly phase: PhaseRuleForecasts;
}

function hindcastCommon(input: HindcastInput): HindcastCommon {
  const settings: PhaseRuleSettings = { jointMinYears: input.jointMinYears, jointMaxQ: input.jointMaxQ };
  const design = hindcastDesign(input);
  const event = fixedEvent(design.years, input.activity, input.top, input.measure);
  const scratch = phaseRuleScratch(design);
  const phase = copyForecasts(phaseRuleForecasts(design, event.fire, event.category, settings, scratch));
  return {
    seed: input.seed ?? HINDCAST_DEFAULTS.seed,
    permutations: input.permutations ?? HINDCAST_DEFAULTS.permutations,
    blockYears: input.blockYears ?? HINDCAST_DEFAULTS.blockYears,
    resamples: input.bootstrapResamples ?? HINDCAST_DEFAULTS.bootstrapResamples,
    settings,
    design,
    event,
    scratch,
    phase,
  };
}

function phaseRuleHindcast(input: HindcastInput, common: HindcastCommon): Skill {
  const { seed, permutations, blockYears, resamples, settings, design, event, scratch, phase } = common;
  const forecasts = hindcastYears(design, event, phase, phase.probability, null);
  const skill = scoreHindcast(forecasts, input.exclusion, event, true);
  const phaseTest =
    skill.brierSkillScore === null
      ? { pValue: null, reason: "the Brier skill score could not be computed" }
      : input.indices.length === 0
        ? { pValue: null, reason: "no index value was given, so every forecast is the long-term average" }
        : permutations <= 0
          ? { pValue: null, reason: "the permutation test was not run (0 shuffles)" }
          : permutationTest(design, event, permutations, blockYears, streamOf(seed, STREAM.permutation), (fire, category) => {
              return phaseRuleForecasts(design, fire, category, settings, scratch, "probability").probability;
            });
  return finishSkill(skill, forecasts, event, phaseTest, permutations, blockYears, resamples, seed, [STREAM.bootstrap, STREAM.corp], true);
}

function curveRuleHindcast(input: HindcastInput, common: HindcastCommon): Skill {
  const { seed, permutations, blockYears, resamples, settings, design, event, scratch, phase } = common;
  const curveBuffers = design.names.map(() => curveScratch(design.years.length));
  const oneStep = oneStepScratch(design);
  const curve = curveRuleForecasts(design, event.fire, phase, curveBuffers);
  const curveYears = hindcastYears(design, event, phase, curve.probability, curve.read);
  const curveSkill = scoreHindcast(curveYears, input.exclusion, event, false);
  const issued = input.response === "curve";
  const affordable = Math.floor(CURVE_PERMUTATION_WORK / Math.max(1, design.years.length));
  const curveCount = issued
    ? permutations
    : Math.min(permutations, input.curvePermutations ?? HINDCAST_DEFAULTS.curvePermutations, affordable);
  const curveTest =
    curveSkill.brierSkillScore === null
      ? { pValue: null, reason: "the Brier skill score could not be computed" }
      : input.indices.length === 0
        ? { pValue: null, reason: "no index value was given, so every forecast is the long-term average" }
        : !issued && affordable < CURVE_MIN_PERMUTATIONS && permutations > 0
          ? {
              pValue: null,
              reason: `not run for a record of ${design.years.length} years while the curve rule is not the issued rule (methods.response "curve" runs it): it fits logistic curves to the whole record in every shuffle`,
            }
          : curveCount <= 0
          ? { pValue: null, reason: "the permutation test was not run (0 shuffles)" }
          : permutationTest(design, event, curveCount, blockYears, streamOf(seed, STREAM.curvePermutation), (fire, category) => {
              // The test's statistic is the BSS of one-step case-deletion forecasts (ONE_STEP_RULE), observed and shuffled alike.
              const shuffledPhase = phaseRuleForecasts(design, fire, category, settings, scratch, "probability");
              return oneStepCurveForecasts(design, fire, shuffledPhase, oneStep);
            });
  const curveResult = finishSkill(curveSkill, curveYears, event, curveTest, curveCount, blockYears, resamples, seed, [STREAM.curveBootstrap, STREAM.curveCorp], false);
  const curveStatistic = curveResult.skillPValue === null || curveResult.skillPValue === undefined ? {} : { permutationStatistic: ONE_STEP_RULE };
  return { ...curveResult, ...curveStatistic };
}

function copyForecasts(forecasts: PhaseRuleForecasts): PhaseRuleForecasts {
  return {
    probability: Float64Array.from(forecasts.probability),
    categories: Float64Array.from(forecasts.categories),
    climatology: Float64Array.from(forecasts.climatology),
    climatologyCategories: Float64Array.from(forecasts.climatologyCategories),
    basis: Uint8Array.from(forecasts.basis),
    cellIndex: Int16Array.from(forecasts.cellIndex),
  };
}

function hindcastYears(
  design: HindcastDesign,
  event: FixedEvent,
  phase: PhaseRuleForecasts,
  probability: Float64Array,
  curveRead: Uint8Array | null,
): HindcastYear[] {
  const years: HindcastYear[] = [];
  for (let fold = 0; fold < design.folds; fold += 1) {
    const position = design.target[fold] as number;
    years.push({
      year: design.years[position] as number,
      probability: probability[fold] as number,
      climatology: phase.climatology[fold] as number,
      fireYear: event.fire[position] === 1,
      categoryProbabilities: [phase.categories[fold * 3] as number, phase.categories[fold * 3 + 1] as number, phase.categories[fold * 3 + 2] as number],
      climatologyCategories: [
        phase.climatologyCategories[fold * 3] as number,
        phase.climatologyCategories[fold * 3 + 1] as number,
        phase.climatologyCategories[fold * 3 + 2] as number,
      ],
      observedCategory: event.category[position] as 0 | 1 | 2,
      basis: curveRead !== null && curveRead[fold] === 1 ? "curve" : (BASIS[phase.basis[fold] as number] as "joint" | "single" | "climatology"),
    });
  }
  return years;
}

/** Relative margin within which a shuffle's BSS counts as equal to the observed one (sums in another order). */
const TIE_MARGIN = 1e-12;

/**
 * Permutation test of the hindcast Brier skill score: m block shuffles of the fire record (the fixed outcome
 * and category of each year move together, in blocks of consecutive years), the hindcast rerun on each by
 * `forecast`, and p = (b + 1)/(m + 1) with b the shuffles whose BSS is at least the observed one (computed the
 * same way; a BSS equal to it up to rounding, 1e-12 relative, counts as reaching it).
 */
function permutationTest(
  design: HindcastDesign,
  event: FixedEvent,
  permutations: number,
  blockYears: number,
  random: RandomSource,
  forecast: (fire: Uint8Array, category: Uint8Array) => Float64Array,
): { pValue: number; reason?: undefined } {
  const n = design.years.length;
  const blockLength = Math.max(1, Math.min(blockYears, n));
  const observed = foldBrierSkill(design, event.fire, event.baseRate, forecast(event.fire, event.category));
  const fire = new Uint8Array(n);
  const category = new Uint8Array(n);
  const bar = observed - TIE_MARGIN * Math.max(1, Math.abs(observed));
  let reached = 0;
  for (let shuffle = 0; shuffle < permutations; shuffle += 1) {
    const order = blockPermutationIndices(n, blockLength, random);
    for (let position = 0; position < n; position += 1) {
      const from = order[position] as number;
      fire[position] = event.fire[from] as number;
      category[position] = event.category[from] as number;
    }
    if (foldBrierSkill(design, fire, event.baseRate, forecast(fire, category)) >= bar) reached += 1;
  }
  return { pValue: (reached + 1) / (permutations + 1) };
}

/** BSS of per-fold forecasts against the fixed climatology (NaN when the reference scores 0). */
function foldBrierSkill(design: HindcastDesign, fire: Uint8Array, reference: number, probability: Float64Array): number {
  let score = 0;
  let referenceScore = 0;
  for (let fold = 0; fold < design.folds; fold += 1) {
    const outcome = fire[design.target[fold] as number] as number;
    const p = probability[fold] as number;
    score += (p - outcome) * (p - outcome);
    referenceScore += (reference - outcome) * (reference - outcome);
  }
  return referenceScore > 0 ? 1 - score / referenceScore : Number.NaN;
}

function finishSkill(
  skill: Skill,
  forecasts: readonly HindcastYear[],
  event: FixedEvent,
  test: { pValue: number | null; reason?: string },
  permutations: number,
  blockYears: number,
  resamples: number,
  seed: number,
  streams: readonly [number, number],
  scoreCategories: boolean,
): Skill {
  const verdict = skillVerdict(skill.brierSkillScore, test.pValue, test.pValue === null ? test.reason : undefined);
  const scored: ScoredYear[] = forecasts.map((forecast) => ({
    probability: forecast.probability,
    reference: event.baseRate,
    fireYear: forecast.fireYear,
    rps: scoreCategories ? rankedProbabilityScore(forecast.categoryProbabilities, forecast.observedCategory) : Number.NaN,
    rpsReference: scoreCategories ? rankedProbabilityScore(event.shares, forecast.observedCategory) : Number.NaN,
  }));
  const intervals =
    skill.brierSkillScore === null || resamples <= 0
      ? null
      : skillIntervals(scored, blockYears, resamples, streamOf(seed, streams[0]), scoreCategories);
  const corp =
    forecasts.length === 0
      ? null
      : corpReliability(
          forecasts.map((forecast) => forecast.probability),
          forecasts.map((forecast) => forecast.fireYear),
          streamOf(seed, streams[1]),
          // 95% like every other interval in the outlook (the CORP paper's own default is 90%).
          { resamples: Math.max(0, resamples), level: 0.95 },
        );
  return {
    ...skill,
    hasSkill: verdict.hasSkill,
    verdict: verdict.text,
    skillPValue: test.pValue,
    ...(test.reason === undefined ? {} : { skillPValueReason: test.reason }),
    // The shuffles actually behind skillPValue: none when the test was not run.
    permutations: test.pValue === null ? 0 : permutations,
    permutationBlockYears: Math.max(1, Math.min(blockYears, event.fire.length)),
    intervals,
    ...(intervals === null ? { intervalsReason: skill.brierSkillScore === null ? "the scores could not be computed" : "no bootstrap resamples were asked for" } : {}),
    corp,
    ...(corp === null ? { corpReason: "no hindcast years" } : {}),
  };
}

/**
 * Scores a list of hindcast forecasts against the fixed climatology of `event` (see {@link runHindcast}).
 * With `scoreCategories` false (the curve rule, which forecasts only high-fire years) the RPS scores are null.
 * The verdict here is provisional ("No skill shown"): runHindcast replaces it once the permutation test has run.
 */
export function scoreHindcast(
  forecasts: readonly HindcastYear[],
  exclusion: number,
  event: Pick<FixedEvent, "baseRate" | "shares">,
  scoreCategories = true,
): Skill {
  const outcomes = forecasts.map((forecast) => forecast.fireYear);
  const probabilities = forecasts.map((forecast) => forecast.probability);
  const events = outcomes.filter(Boolean).length;
  const reference = { fireYear: event.baseRate, categories: event.shares, rule: REFERENCE_RULE };
  const rpssReason = scoreCategories ? undefined : "the curve rule forecasts only high-fire years; its below/near/above odds are the phase rule's";
  if (forecasts.length < 10 || events === 0 || events === forecasts.length) {
    const reason =
      forecasts.length < 10
        ? `only ${forecasts.length} hindcast years`
        : events === 0
          ? "no fire year among the hindcast years"
          : "every hindcast year was a fire year";
    const verdict = skillVerdict(null, null);
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
      reference,
      ...(rpssReason === undefined ? {} : { rpssReason }),
    };
  }
  const finite = (value: number): number | null => (Number.isFinite(value) ? value : null);
  const bs = brierScore(probabilities, outcomes);
  const bsClimatology = brierScore(
    forecasts.map(() => event.baseRate),
    outcomes,
  );
  const bss = brierSkillScore(bs, bsClimatology);
  let rps: number | null = null;
  let rpsClimatology: number | null = null;
  let rpss: number | null = null;
  if (scoreCategories) {
    const mean = (values: readonly number[]) => values.reduce((sum, value) => sum + value, 0) / values.length;
    const forecastScore = mean(forecasts.map((forecast) => rankedProbabilityScore(forecast.categoryProbabilities, forecast.observedCategory)));
    const referenceScore = mean(forecasts.map((forecast) => rankedProbabilityScore(event.shares, forecast.observedCategory)));
    rps = finite(forecastScore);
    rpsClimatology = finite(referenceScore);
    rpss = finite(rankedProbabilitySkillScore(forecastScore, referenceScore));
  }
  const roc = rocArea(probabilities, outcomes);
  const curve = rocCurve(probabilities, outcomes).map((point) => ({ falseAlarmRate: point.falseAlarmRate, hitRate: point.hitRate }));
  const verdict = skillVerdict(null, null);
  return {
    years: forecasts.length,
    exclusion,
    brierScore: finite(bs),
    brierScoreClimatology: finite(bsClimatology),
    brierSkillScore: finite(bss),
    rps,
    rpsClimatology,
    rpss,
    rpsForm: RPS_FORM,
    rocArea: finite(roc.area),
    rocStandardError: finite(roc.standardError),
    rocCurve: curve,
    reliability: reliabilityTable(probabilities, outcomes),
    hasSkill: false,
    verdict: verdict.text,
    rule: SKILL_RULE,
    forecasts,
    reference,
    ...(rpssReason === undefined ? {} : { rpssReason }),
  };
}
