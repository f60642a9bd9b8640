/**
 * Records of `firephase review`: the outlooks a region kept (`<region>/issued/*.json`), what
 * happened in their seasons, and how the kept outlooks scored (JSON schema `firephase.review/1`).
 */

/** The three activity categories, in order. */
export type ReviewCategory = "below" | "near" | "above";

/**
 * One kept outlook as read back: the fields `review` needs. A kept file needs at least `schema`,
 * `issued`, `season` and `fireYear.estimate`; every other field is optional (older or
 * hand-written records), and absent ones are null here.
 */
export interface KeptOutlook {
  /** The file it was read from, as shown in messages (e.g. "r/issued/2027-2027-03-10.json"). */
  readonly file: string;
  readonly schema: string;
  /** Issue date, YYYY-MM-DD. */
  readonly issued: string;
  readonly season: number;
  /** Stated chance of a high-fire year, 0–1 (`fireYear.estimate`). */
  readonly probability: number;
  /** Its 95% interval (`fireYear.lower`, `fireYear.upper`); null when not kept. */
  readonly lower: number | null;
  readonly upper: number | null;
  /** The average year's chance stated beside it (`baseRate.estimate`); null when not kept. */
  readonly baseRate: number | null;
  /** Stated below/near/above odds (`categories.<c>.estimate`), each 0–1, summing to 1 within 0.01; null when not kept. */
  readonly categories: { readonly below: number; readonly near: number; readonly above: number } | null;
  /** Phase label per index (`phases`), in the kept order. */
  readonly phases: readonly { readonly index: string; readonly label: string }[];
  /** Current value per index (`current[].value`), in the kept order. */
  readonly values: readonly { readonly index: string; readonly value: number }[];
}

/** What happened in one season, from the region's records. */
export interface SeasonOutcome {
  readonly season: number;
  /** True for a high-fire year, false for another year, null when no record covers the season. */
  readonly highFire: boolean | null;
  /** Activity category of the season, null when unknown. */
  readonly category: ReviewCategory | null;
  /** Which record decided it: "modern record", "fire-scar record", or null when unknown. */
  readonly source: "modern record" | "fire-scar record" | null;
  /** The rule and the numbers, in words (e.g. "area burned 5,882 ha ≥ threshold 4,100 ha"). */
  readonly detail: string;
}

/** One kept outlook with its outcome. */
export interface ReviewedOutlook {
  readonly season: number;
  readonly issued: string;
  readonly file: string;
  /** Stated chance of a high-fire year. */
  readonly probability: number;
  /** True / false when the season is known, null when not (listed, not scored). */
  readonly outcome: boolean | null;
  /** Which record decided the outcome; null when unknown. */
  readonly source: "modern record" | "fire-scar record" | null;
  readonly detail: string;
  /** Stated below/near/above odds, null when not kept. */
  readonly categories: { readonly below: number; readonly near: number; readonly above: number } | null;
  /** The season's activity category, null when unknown. */
  readonly category: ReviewCategory | null;
  /** (probability − outcome)² when known, else null. */
  readonly squaredError: number | null;
  /** Whether the outlook put the odds above the average year's (its own base rate, else the reference rate); null when neither is known. */
  readonly saidHigher: boolean | null;
  /** False when a later kept outlook of the same season supersedes it (only the last of a season is scored). */
  readonly scored: boolean;
  /** Issue date of the outlook that superseded it (present only when `scored` is false). */
  readonly supersededBy?: string | null;
}

/** A score that may not be computable: value null with a reason. */
export interface ReviewScore {
  readonly value: number | null;
  /** Seasons that entered the score. */
  readonly seasons: number;
  readonly reason?: string;
}

/** How the kept outlooks scored against what happened (`firephase.review/1`). */
export interface Review {
  readonly schema: "firephase.review/1";
  readonly region: string;
  /** Every kept outlook, by season then issue date. */
  readonly outlooks: readonly ReviewedOutlook[];
  /** Kept outlooks whose season is known (scored), and unknown (listed only). */
  readonly known: number;
  readonly unknown: number;
  /** Mean (p − o)² over the known seasons; null with `brierReason` when none is known. */
  readonly brierScore: number | null;
  readonly brierReason?: string;
  /** The reference forecast: the modern base rate (or the fire-scar base rate without a modern record). */
  readonly reference: { readonly rate: number | null; readonly source: string };
  /** Brier score of always forecasting the reference rate, over the same seasons. */
  readonly brierScoreReference: number | null;
  /** 1 − BS / BS_reference; null with `brierSkillReason` when not computable (no known season, or BS_reference 0). */
  readonly brierSkillScore: number | null;
  readonly brierSkillReason?: string;
  /** Ranked probability score (unnormalized, 0–2) of the category odds over the known seasons that kept them. */
  readonly rps: ReviewScore;
  /** RPS of equal odds (1/3 each) over the same seasons, and the skill 1 − RPS / RPS_equal. */
  readonly rpsEqualOdds: number | null;
  readonly rpss: ReviewScore;
  /**
   * Hit rate of the stated odds: of the known high-fire years, the share whose outlook put the
   * odds above the average year's (hits / high-fire years); with the false-alarm ratio (outlooks
   * above the average year in seasons that were not high-fire, over all outlooks above it).
   */
  readonly hitRate: ReviewScore & { readonly hits: number; readonly highFireYears: number };
  readonly falseAlarmRatio: ReviewScore & { readonly falseAlarms: number; readonly saidHigher: number };
  /** Mean stated chance and observed share of high-fire years over the known seasons. */
  readonly meanProbability: number | null;
  readonly observedFrequency: number | null;
  /** Plain warnings (few known seasons, skipped files, seasons kept twice…). */
  readonly warnings: readonly { readonly code: string; readonly message: string }[];
}

/** One index whose value or phase changed since the last briefing. */
export interface SinceChange<T> {
  readonly index: string;
  readonly before: T | null;
  readonly now: T | null;
}

/**
 * What changed since the most recent kept outlook of the same season (or, failing that, of the
 * previous season) issued before this one.
 */
export interface SinceLastBriefing {
  /** The earlier outlook compared against. */
  readonly previous: { readonly season: number; readonly issued: string; readonly file: string };
  /** "same season" or "previous season". */
  readonly relation: "same season" | "previous season";
  /** Indices whose value changed (by more than 0.005 in index units) or that appeared or went. */
  readonly values: readonly SinceChange<number>[];
  /** Indices whose phase changed. */
  readonly phases: readonly SinceChange<string>[];
  /** The chance of a high-fire year then and now. */
  readonly fireYear: { readonly before: number; readonly now: number | null };
  /** The category odds then and now; null when either is not known. */
  readonly categories: {
    readonly before: { readonly below: number; readonly near: number; readonly above: number };
    readonly now: { readonly below: number; readonly near: number; readonly above: number };
  } | null;
  /** One plain sentence, e.g. "Since the outlook of 2027-02-01: ENSO moved from neutral to warm; the chance rose from 12% to 25%." */
  readonly sentence: string;
}
