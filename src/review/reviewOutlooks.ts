import { brierScore } from "../stats/brierScore.js";
import { brierSkillScore } from "../stats/brierSkillScore.js";
import { rankedProbabilityScore } from "../stats/rankedProbabilityScore.js";
import type { KeptOutlook, Review, ReviewCategory, ReviewedOutlook, SeasonOutcome } from "./types.js";

/** Schema name of `firephase review --json`. */
export const REVIEW_SCHEMA = "firephase.review/1";

/** Below this many known seasons every score carries a plain warning. */
export const FEW_KNOWN_SEASONS = 10;

const CATEGORY_ORDER: readonly ReviewCategory[] = ["below", "near", "above"];
const EQUAL_ODDS = [1 / 3, 1 / 3, 1 / 3] as const;

/** Options of {@link reviewOutlooks}. */
export interface ReviewOptions {
  /** Region name, printed with the review. */
  readonly region: string;
  /** The reference forecast of the skill score: the modern base rate, else the fire-scar one, and its name. */
  readonly reference: { readonly rate: number | null; readonly source: string };
  /** Warnings from reading the kept files (files skipped), carried into the review. */
  readonly warnings?: readonly { readonly code: string; readonly message: string }[];
}

const mean = (values: readonly number[]): number | null => (values.length === 0 ? null : values.reduce((sum, value) => sum + value, 0) / values.length);

/**
 * Verification of issued outlooks: scores the outlooks a region kept against what happened.
 *
 * One outlook per season is scored, the last one issued (the others are listed as superseded);
 * a season whose outcome is unknown is listed and not scored. Over the known seasons:
 * - Brier score BS = (1/N) Σ (pᵢ − oᵢ)², pᵢ the stated chance of a high-fire year, oᵢ = 1 for a
 *   high-fire year, else 0;
 * - Brier skill score BSS = 1 − BS / BS_ref, BS_ref the Brier score of always stating the
 *   reference rate (the modern base rate; the fire-scar base rate without a modern record);
 * - ranked probability score (unnormalized, 0–2) of the below/near/above odds where the kept
 *   outlook has them, and its skill against equal odds (1/3 each): RPSS = 1 − RPS / RPS_equal;
 * - hit rate of the stated odds: of the known high-fire years, the share whose outlook put the
 *   chance above the average year's (the base rate the outlook stated, else the reference rate),
 *   hits / high-fire years; and the false-alarm ratio, the share of outlooks above the average
 *   year that were followed by a season that was not a high-fire year;
 * - the mean stated chance beside the observed share of high-fire years.
 * While fewer than {@link FEW_KNOWN_SEASONS} seasons are known, a warning says the scores cannot
 * yet tell skill from luck.
 *
 * @param kept - the kept outlooks, any order
 * @param outcomes - the outcome of each season (seasons not in the map are unknown)
 * @param options - region name, reference rate and reading warnings
 * @returns the review; scores are null with a reason when no season is known (or BS_ref is 0)
 * @example
 * reviewOutlooks([kept2024, kept2025], new Map([[2024, outcome2024]]), { region: "R", reference: { rate: 0.1, source: "modern base rate" } });
 * // => { known: 1, brierScore: (p₂₀₂₄ − o₂₀₂₄)², … }
 * @see Brier G.W. (1950) "Verification of forecasts expressed in terms of probability", Monthly Weather Review 78(1):1–3.
 * @see Epstein E.S. (1969) "A scoring system for probability forecasts of ranked categories", Journal of Applied Meteorology 8(6):985–987.
 * @see Wilks D.S. (2011) Statistical Methods in the Atmospheric Sciences, 3rd ed., Academic Press, §8.2 (hit rate and false-alarm ratio of the 2×2 contingency table) and §8.4 (Brier and ranked probability scores).
 */
export function reviewOutlooks(kept: readonly KeptOutlook[], outcomes: ReadonlyMap<number, SeasonOutcome>, options: ReviewOptions): Review {
  const sorted = [...kept].sort((a, b) => a.season - b.season || (a.issued < b.issued ? -1 : a.issued > b.issued ? 1 : 0) || (a.file < b.file ? -1 : a.file > b.file ? 1 : 0));
  const lastOfSeason = new Map<number, KeptOutlook>();
  for (const outlook of sorted) lastOfSeason.set(outlook.season, outlook);
  const warnings: { code: string; message: string }[] = [...(options.warnings ?? [])];
  const referenceRate = options.reference.rate;

  const outlooks: ReviewedOutlook[] = sorted.map((outlook) => {
    const outcome = outcomes.get(outlook.season);
    const known = outcome !== undefined && outcome.highFire !== null;
    const scored = lastOfSeason.get(outlook.season) === outlook;
    const average = outlook.baseRate ?? referenceRate;
    return {
      season: outlook.season,
      issued: outlook.issued,
      file: outlook.file,
      probability: outlook.probability,
      outcome: known ? (outcome.highFire as boolean) : null,
      source: known ? outcome.source : null,
      detail: outcome?.detail ?? "no record of this season",
      categories: outlook.categories,
      category: known ? outcome.category : null,
      squaredError: known ? (outlook.probability - (outcome.highFire === true ? 1 : 0)) ** 2 : null,
      saidHigher: average === null ? null : outlook.probability > average,
      scored,
      ...(scored ? {} : { supersededBy: lastOfSeason.get(outlook.season)?.issued ?? null }),
    };
  });
  const superseded = outlooks.filter((entry) => !entry.scored).length;
  if (superseded > 0) {
    warnings.push({
      code: "superseded-outlooks",
      message: `${superseded} kept outlook${superseded === 1 ? " was" : "s were"} followed by a later one for the same season: only the last outlook of each season is scored`,
    });
  }
  const scoredKnown = outlooks.filter((entry) => entry.scored && entry.outcome !== null);
  const unknown = outlooks.filter((entry) => entry.scored && entry.outcome === null).length;
  const known = scoredKnown.length;
  const probabilities = scoredKnown.map((entry) => entry.probability);
  const observed = scoredKnown.map((entry) => entry.outcome === true);

  const bs = known === 0 ? null : brierScore(probabilities, observed);
  const bsReference = known === 0 || referenceRate === null ? null : brierScore(probabilities.map(() => referenceRate), observed);
  let bss: number | null = null;
  let bssReason: string | undefined;
  if (bs === null || bsReference === null) bssReason = known === 0 ? "no kept outlook's season is known yet" : "no reference rate (no base rate in either record)";
  else if (bsReference === 0) bssReason = "the reference forecast scored 0, so skill against it is undefined";
  else bss = brierSkillScore(bs, bsReference);

  const withCategories = scoredKnown.filter((entry) => entry.categories !== null && entry.category !== null);
  const rpsValues = withCategories.map((entry) => {
    const odds = entry.categories as { below: number; near: number; above: number };
    return rankedProbabilityScore([odds.below, odds.near, odds.above], CATEGORY_ORDER.indexOf(entry.category as ReviewCategory));
  });
  const rpsEqualValues = withCategories.map((entry) => rankedProbabilityScore([...EQUAL_ODDS], CATEGORY_ORDER.indexOf(entry.category as ReviewCategory)));
  const rps = mean(rpsValues);
  const rpsEqual = mean(rpsEqualValues);
  const noCategories = "no known season's outlook kept its below/near/above odds";
  const rpss =
    rps === null || rpsEqual === null
      ? { value: null, seasons: 0, reason: noCategories }
      : rpsEqual === 0
        ? { value: null, seasons: withCategories.length, reason: "equal odds scored 0, so skill against them is undefined" }
        : { value: 1 - rps / rpsEqual, seasons: withCategories.length };

  const highFire = scoredKnown.filter((entry) => entry.outcome === true && entry.saidHigher !== null);
  const hits = highFire.filter((entry) => entry.saidHigher === true).length;
  const saidHigher = scoredKnown.filter((entry) => entry.saidHigher === true);
  const falseAlarms = saidHigher.filter((entry) => entry.outcome === false).length;

  if (known > 0 && known < FEW_KNOWN_SEASONS) {
    warnings.push({
      code: "few-known-seasons",
      message: `only ${known} season${known === 1 ? " is" : "s are"} known so far: with fewer than ${FEW_KNOWN_SEASONS}, these scores cannot tell skill from luck`,
    });
  }
  if (kept.length > 0 && known === 0) {
    warnings.push({ code: "no-known-season", message: "no kept outlook's season is in the records yet: nothing can be scored" });
  }
  return {
    schema: REVIEW_SCHEMA,
    region: options.region,
    outlooks,
    known,
    unknown,
    brierScore: bs,
    ...(bs === null ? { brierReason: "no kept outlook's season is known yet" } : {}),
    reference: options.reference,
    brierScoreReference: bsReference,
    brierSkillScore: bss,
    ...(bssReason === undefined ? {} : { brierSkillReason: bssReason }),
    rps: rps === null ? { value: null, seasons: 0, reason: noCategories } : { value: rps, seasons: withCategories.length },
    rpsEqualOdds: rpsEqual,
    rpss,
    hitRate:
      highFire.length === 0
        ? { value: null, seasons: known, hits, highFireYears: 0, reason: "no known season was a high-fire year" }
        : { value: hits / highFire.length, seasons: known, hits, highFireYears: highFire.length },
    falseAlarmRatio:
      saidHigher.length === 0
        ? { value: null, seasons: known, falseAlarms, saidHigher: 0, reason: "no known season's outlook put the odds above the average year's" }
        : { value: falseAlarms / saidHigher.length, seasons: known, falseAlarms, saidHigher: saidHigher.length },
    meanProbability: mean(probabilities),
    observedFrequency: known === 0 ? null : observed.filter(Boolean).length / known,
    warnings,
  };
}
