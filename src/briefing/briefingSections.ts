/**
 * The briefing's later sections, as view-model pieces: the hindcast's chance test, intervals and
 * CORP diagram, both rules side by side; the response curves; "Then and now" (the modern record);
 * "How our past outlooks turned out" (the review) and "Since the last briefing"; the close-pair
 * warning summary. Every word and figure is formatted here; nothing statistical is computed.
 */
import type { Calibration, IndexCalibration } from "../calibrate/types.js";
import type { Skill } from "../hindcast/types.js";
import type { Outlook } from "../outlook/types.js";
import { formatPercent, formatPercentRange } from "../outlook/describeChance.js";
import type { Review, SinceLastBriefing } from "../review/types.js";
import { corpReliabilityChart } from "./charts/corpReliabilityChart.js";
import { eraOddsChart } from "./charts/eraOddsChart.js";
import { responseCurveChart } from "./charts/responseCurveChart.js";
import { clipText, formatCount, formatDecimal, formatPValue, isFiniteNumber } from "./formatValues.js";
import { trustSvg, type TrustedMarkup } from "./trustedMarkup.js";

const NOT_ENOUGH = "not enough data";

function missing(reason: string | undefined): string {
  return reason === undefined || reason === "" ? NOT_ENOUGH : `${NOT_ENOUGH} (${reason})`;
}

function signed(value: number | null | undefined, digits: number): string {
  if (!isFiniteNumber(value)) return NOT_ENOUGH;
  const text = formatDecimal(value, digits);
  return value > 0 && !/^0\.?0*$/.test(text) ? `+${text}` : text;
}

function plural(count: number, one: string, many: string): string {
  return `${formatCount(count)} ${count === 1 ? one : many}`;
}

function range(interval: readonly [number, number] | null | undefined, digits: number): string {
  if (interval === null || interval === undefined || !isFiniteNumber(interval[0]) || !isFiniteNumber(interval[1])) return "";
  return `${signed(interval[0], digits)} to ${signed(interval[1], digits)}`;
}

/** One row of the hindcast's side-by-side table of the two rules. */
export interface RuleSkillRow {
  readonly score: string;
  readonly phase: string;
  readonly curve: string;
}

/** The hindcast page's additions. */
export interface HindcastExtras {
  /** "Permutation p = 0.001 from 999 block shuffles (blocks of 5 years)", or why there is none. */
  readonly chanceText: string;
  /** The verdict's rule in words (from the hindcast). */
  readonly ruleText: string;
  /** Block-bootstrap intervals of BSS, RPSS and ROC area, one line each; empty when none. */
  readonly intervals: readonly { readonly score: string; readonly value: string; readonly interval: string }[];
  readonly intervalsNote: string;
  /** The CORP reliability diagram and the split of the Brier score. */
  readonly corp: { readonly available: boolean; readonly chart: TrustedMarkup | null; readonly split: string; readonly missingText: string | null };
  /** Both rules side by side (phase rule and curve rule), or null when the curve rule was not run. */
  readonly rules: { readonly rows: readonly RuleSkillRow[]; readonly sentence: string } | null;
  /** One sentence when the hindcast scores a different number of high-fire years than the calibration; else "". */
  readonly countNote: string;
}

/**
 * Format the hindcast page's chance test, bootstrap intervals, CORP diagram and the two rules.
 *
 * @param skill - the outlook's hindcast.
 * @param calibration - the calibration (base rate, high-fire years).
 * @returns the pieces; missing parts say "not enough data" with their reason.
 * @throws never for finite or missing inputs.
 * @example
 * hindcastExtras(outlook.hindcast, calibration).chanceText; // => "Chance test: permutation p = 0.001 …"
 * @see Phipson B., Smyth G.K. (2010) "Permutation p-values should never be zero", Statistical Applications in Genetics and Molecular Biology 9(1):39.
 */
/** "p = 0.03" or "p < 0.001". */
function pText(p: number): string {
  const text = formatPValue(p);
  return text.startsWith("<") ? `p < ${text.slice(1)}` : `p = ${text}`;
}

/**
 * The chance test in a few plain words for page 1: "shuffled fire records rarely scored as well
 * (chance test p = 0.004)", or why there is no chance test.
 *
 * @param skill - the outlook's hindcast.
 * @returns one clause without a closing full stop.
 * @throws never.
 * @example
 * chanceClause(outlook.hindcast); // => "shuffled fire records rarely scored as well (chance test p = 0.004)"
 * @see Phipson B., Smyth G.K. (2010) "Permutation p-values should never be zero", Statistical Applications in Genetics and Molecular Biology 9(1):39.
 */
export function chanceClause(skill: Skill): string {
  const p = skill.skillPValue;
  if (!isFiniteNumber(p)) return `chance test: ${missing(skill.skillPValueReason)}`;
  return `shuffled fire records ${p <= 0.05 ? "rarely" : "often"} scored as well (chance test ${pText(p)})`;
}

/**
 * How large the skill is, from the block-bootstrap interval of the Brier skill score: with a
 * skill verdict and an interval reaching below 0, "small and uncertain in size"; "" when there is
 * no interval or no skill verdict.
 *
 * @param skill - the outlook's hindcast.
 * @param short - true for page 1's bracket after the score, " (95% interval −0.02 to +0.12: small and uncertain in size)".
 * @returns one sentence (or the bracket), or "".
 * @throws never.
 * @example
 * skillSizeText(outlook.hindcast); // => "Its size is small and uncertain: the 95% interval of the Brier skill score, −0.02 to +0.12, reaches below 0."
 * @see Künsch H.R. (1989) "The jackknife and the bootstrap for general stationary observations", Annals of Statistics 17(3):1217–1241.
 */
export function skillSizeText(skill: Skill, short = false): string {
  const interval = skill.intervals?.brierSkillScore;
  const text = range(interval, 2);
  if (interval === null || interval === undefined || text === "") return "";
  const level = Math.round((skill.intervals?.level ?? 0.95) * 100);
  if (short) return ` (${level}% interval ${text}${skill.hasSkill && interval[0] < 0 ? ": small and uncertain in size" : ""})`;
  if (!skill.hasSkill) return "";
  return interval[0] < 0
    ? `Its size is small and uncertain: the ${level}% interval of the Brier skill score, ${text}, reaches below 0.`
    : `Its size: the ${level}% interval of the Brier skill score is ${text}.`;
}

export function hindcastExtras(skill: Skill, calibration: Calibration): HindcastExtras {
  const p = skill.skillPValue;
  const chanceText = isFiniteNumber(p)
    ? `The verdict rests on the chance test: in ${formatCount(skill.permutations ?? 0)} shuffles of the fire record across years` +
      (isFiniteNumber(skill.permutationBlockYears) ? ` (in blocks of ${skill.permutationBlockYears} years)` : "") +
      `, the whole hindcast rerun each time, ${p <= 0.05 ? "few" : "many"} scored as well as the real record: permutation ${pText(p)}` +
      ` (the share of shuffles at least as good, counting the real record; skill needs p at most 0.05). ${skillSizeText(skill)}`.trimEnd()
    : `Chance test: ${missing(skill.skillPValueReason)}.`;
  const intervals = skill.intervals;
  const intervalRows =
    intervals === null || intervals === undefined
      ? []
      : [
          { score: "Brier skill score", value: signed(skill.brierSkillScore, 2), interval: range(intervals.brierSkillScore, 2) },
          { score: "Ranked probability skill score", value: signed(skill.rpss, 2), interval: range(intervals.rpss, 2) },
          { score: "ROC area", value: isFiniteNumber(skill.rocArea) ? formatDecimal(skill.rocArea, 2) : NOT_ENOUGH, interval: range(intervals.rocArea, 2).replace(/\+/g, "") },
        ].map((row) => ({ ...row, interval: row.interval === "" ? NOT_ENOUGH : row.interval }));
  const intervalsNote =
    intervals === null || intervals === undefined
      ? `Intervals of the scores: ${missing(skill.intervalsReason)}.`
      : `${Math.round((intervals.level ?? 0.95) * 100)}% intervals from a moving-block bootstrap of the hindcast years (blocks of ${intervals.blockYears} years, ${formatCount(intervals.resamples)} resamples), so years that follow each other are kept together. ` +
        "The verdict rests on the chance test above; these intervals say how large the skill is. " +
        (skill.hasSkill
          ? "An interval that reaches below 0 (or below 0.5 for the ROC area) means the skill is small and uncertain in size."
          : "An interval that reaches below 0 (or below 0.5 for the ROC area) fits the verdict: no clear skill.");

  const corp = skill.corp;
  const corpView =
    corp === null || corp === undefined
      ? { available: false, chart: null, split: "", missingText: missing(skill.corpReason) }
      : {
          available: true,
          chart: trustSvg(corpReliabilityChart({ points: corp.points, band: corp.band, level: corp.level, baseRate: calibration.baseRate.estimate })),
          split:
            `Brier score ${formatDecimal(corp.brierScore, 3)} = miscalibration ${formatDecimal(corp.miscalibration, 3)} − discrimination ${formatDecimal(corp.discrimination, 3)} + uncertainty ${formatDecimal(corp.uncertainty, 3)}. ` +
            "Miscalibration is how much the stated chances were off on average (lower is better); discrimination is how well they told high-fire years apart (higher is better); uncertainty is the record's own variability, the same for any method.",
          missingText: null,
        };

  // The issued rule leads `skill`; the other rule stands beside it (curveRule, or phaseRule when the curve is issued).
  const phaseSkill = skill.phaseRule ?? skill;
  const curveRule = skill.phaseRule !== null && skill.phaseRule !== undefined ? skill : skill.curveRule;
  let rules: HindcastExtras["rules"] = null;
  if (curveRule !== null && curveRule !== undefined) {
    const row = (score: string, pick: (rule: Skill) => string): RuleSkillRow => ({ score, phase: pick(phaseSkill), curve: pick(curveRule) });
    const bss = (rule: Skill) => signed(rule.brierSkillScore, 2);
    const rows = [
      row("Brier skill score", bss),
      // A rule that issues no below/near/above odds of its own has no RPSS: that does not apply, it is not missing data.
      row("Ranked probability skill score", (rule) =>
        isFiniteNumber(rule.rpss) ? signed(rule.rpss, 2) : rule.rpssReason !== undefined ? `does not apply (${rule.rpssReason})` : missing(rule.reason),
      ),
      row("ROC area", (rule) => (isFiniteNumber(rule.rocArea) ? formatDecimal(rule.rocArea, 2) : NOT_ENOUGH)),
      // With the shuffles behind it: with 99 shuffles 0.01 is the smallest p there can be.
      row("Permutation p (shuffles)", (rule) =>
        isFiniteNumber(rule.skillPValue)
          ? `${formatPValue(rule.skillPValue)}${isFiniteNumber(rule.permutations) && rule.permutations > 0 ? ` (${formatCount(rule.permutations)})` : ""}`
          : missing(rule.skillPValueReason),
      ),
      row("Verdict", (rule) => (rule.hasSkill ? "some skill" : "no skill shown")),
    ];
    const a = phaseSkill.brierSkillScore;
    const b = curveRule.brierSkillScore;
    const sentence =
      isFiniteNumber(a) && isFiniteNumber(b)
        ? Math.abs(a - b) < 0.01
          ? "On this record the two rules did about equally well (Brier skill scores within 0.01)."
          : `On this record the ${a > b ? "phase rule" : "curve rule"} did better by its Brier skill score (${signed(Math.max(a, b), 2)} against ${signed(Math.min(a, b), 2)}); with intervals this wide, the difference may be chance.`
        : "The two rules cannot be compared on this record (a score is missing).";
    rules = { rows, sentence };
  }

  const scored = skill.forecasts.filter((forecast) => forecast.fireYear).length;
  const calibrated = calibration.fireYears.years.length;
  const countNote =
    skill.forecasts.length > 0 && scored !== calibrated
      ? `The hindcast scores ${plural(scored, "high-fire year", "high-fire years")} against the calibration’s ${formatCount(calibrated)}: ` +
        `it forecasts only the ${plural(skill.years, "year", "years")} that have the index values and enough past years left in around them.`
      : skill.forecasts.length > 0
        ? `The hindcast scores the same ${plural(scored, "high-fire year", "high-fire years")} as the calibration (the event is defined once from the whole period).`
        : "";
  return { chanceText, ruleText: skill.rule, intervals: intervalRows, intervalsNote, corp: corpView, rules, countNote };
}

/** The response-curve section of one index. */
export interface CurveView {
  readonly shown: boolean;
  readonly chart: TrustedMarkup | null;
  readonly caption: string;
  /** Why no curve is drawn ("no clear link", or the fit's reason); empty when shown. */
  readonly missingText: string;
}

/**
 * The response-curve chart of one index, drawn when its logistic fit shows a clear link
 * (likelihood-ratio p at most 0.05).
 *
 * @param index - the index's calibration (with its `curve`).
 * @param years - past calibration years: value and high-fire flag.
 * @param current - this season's value of the index, or null.
 * @param calibrationYears - the number of calibration years, when known: a curve fitted on fewer (years without
 *   a value of the index) says "the N calibration years with a <index> value".
 * @returns the chart and caption, or why none is drawn.
 * @throws never.
 * @example
 * curveView(calibration.indices[0], [{ value: 1.2, fireYear: true }], 1.3).shown; // => true when q ≤ 0.05
 * @see Hosmer D.W., Lemeshow S., Sturdivant R.X. (2013) Applied Logistic Regression, 3rd edition, Wiley.
 */
export function curveView(
  index: IndexCalibration,
  years: readonly { readonly value: number; readonly fireYear: boolean }[],
  current: number | null,
  calibrationYears?: number,
): CurveView {
  const curve = index.curve;
  if (curve === null || curve === undefined) return { shown: false, chart: null, caption: "", missingText: `Response curve: ${missing(index.curveReason)}.` };
  // Clear only by the q-value across all indices' curves (the strongest of k curves reaches p ≤ 0.05 by
  // chance about 1 − 0.95^k of the time); a curve without a q (not set by the calibration) uses its p.
  const q = curve.qValue ?? curve.pValue;
  if (!isFiniteNumber(q) || q > 0.05) {
    return {
      shown: false,
      chart: null,
      caption: "",
      missingText: `No response curve is drawn for ${index.name}: its fit shows no clear link (likelihood-ratio ${pText(curve.pValue)}${isFiniteNumber(curve.qValue) ? `, ${pText(curve.qValue).replace(/^p/, "q")} across indices` : ""}).`,
    };
  }
  const chart = responseCurveChart({
    indexName: index.name,
    points: curve.points,
    years,
    current,
    cuts: index.definition.cuts,
    level: curve.level,
  });
  return {
    shown: true,
    chart: trustSvg(chart),
    caption:
      `How the chance of a high-fire year rises or falls with the ${index.name} value: a logistic regression on ${curve.years < (calibrationYears ?? curve.years) ? `the ${formatCount(curve.years)} calibration years with a ${index.name} value` : plural(curve.years, "calibration year", "calibration years")} ` +
      `(${formatCount(curve.fireYears)} high-fire), ${curve.method}, likelihood-ratio ${pText(curve.pValue)}${isFiniteNumber(curve.qValue) ? ` (${pText(curve.qValue).replace(/^p/, "q")}, false discovery rate across indices)` : ""}; the band is ${curve.band}. ` +
      `Ticks under the curve are the past years (taller: high-fire years); the curve is not read beyond the record's range (${formatDecimal(curve.range.min, 2)} to ${formatDecimal(curve.range.max, 2)}).` +
      (curve.separation ? " The record separates high-fire years completely at some value, so the penalized (Firth) fit is shown." : ""),
    missingText: "",
  };
}

/** The "Then and now" page. */
export interface ThenAndNowView {
  readonly available: boolean;
  readonly missingText: string | null;
  readonly intro: string;
  readonly chart: TrustedMarkup | null;
  readonly sentences: readonly string[];
  readonly meaning: readonly { readonly measure: string; readonly highFire: string; readonly other: string }[];
  readonly agreement: string;
  readonly definition: string;
}

function summary(entry: { readonly median: number | null; readonly min: number | null; readonly max: number | null; readonly years: number; readonly reason?: string }, unit: string): string {
  if (!isFiniteNumber(entry.median) || !isFiniteNumber(entry.min) || !isFiniteNumber(entry.max)) return missing(entry.reason);
  return `median ${formatCount(entry.median)} ${unit} (${formatCount(entry.min)}–${formatCount(entry.max)}; ${plural(entry.years, "year", "years")})`;
}

/**
 * The "Then and now" page: the modern record's odds by phase beside the fire-scar era's, the
 * homogeneity sentence per index, and what a high-fire year means in hectares and fires.
 *
 * @param calibration - the calibration with its `modern` era (null: the page says why).
 * @returns the page's pieces.
 * @throws never.
 * @example
 * thenAndNowView(calibration).available; // => true when the region has a modern record
 * @see Breslow N.E., Day N.E. (1980) Statistical Methods in Cancer Research, Vol. I, IARC Lyon (homogeneity of odds ratios); Tarone R.E. (1985) Biometrika 72:91–95.
 */
export function thenAndNowView(calibration: Calibration): ThenAndNowView {
  const modern = calibration.modern;
  if (modern === null || modern === undefined) {
    return { available: false, missingText: missing(calibration.modernReason ?? "the region has no modern fire record"), intro: "", chart: null, sentences: [], meaning: [], agreement: "", definition: "" };
  }
  const byName = new Map(modern.indices.map((index) => [index.name, index]));
  const indices = calibration.indices
    .filter((index) => byName.has(index.name))
    .map((index) => {
      const modernIndex = byName.get(index.name);
      const modernPhases = new Map((modernIndex?.phases ?? []).map((phase) => [phase.label, phase]));
      return {
        name: clipText(index.name, 40),
        phases: index.phases.map((phase) => ({
          label: clipText(phase.label, 30),
          fireScar: phase.probability,
          modern: modernPhases.get(phase.label)?.probability ?? { estimate: null, lower: null, upper: null },
        })),
      };
    });
  const measure = modern.measure === "area" ? "area burned" : "number of fires";
  const chart = eraOddsChart({
    indices,
    fireScarBase: calibration.baseRate.estimate,
    modernBase: modern.baseRate.estimate,
    fireScarLabel: `Fire-scar record ${calibration.period.first}–${calibration.period.last}`,
    modernLabel: `Modern record ${modern.period.first}–${modern.period.last}`,
  });
  const agreement = modern.agreement;
  return {
    available: true,
    missingText: null,
    intro:
      `Does the link still hold under today's fire regime? The modern agency record (${modern.period.first}–${modern.period.last}, ${plural(modern.period.years, "year", "years")}) ` +
      `defines its own high-fire years: the top ${Math.round(modern.top * 100)}% by ${measure} ` +
      `(threshold ${isFiniteNumber(modern.threshold) ? formatCount(modern.threshold) : NOT_ENOUGH}${modern.measure === "area" ? " ha" : " fires"}; ${plural(modern.fireYears.length, "year", "years")}). ` +
      `Its average year: ${formatPercent(modern.baseRate.estimate)} (95% interval ${formatPercentRange(modern.baseRate.lower, modern.baseRate.upper)}); the same phase cuts as the calibration. In the chart, dots are the fire-scar era and triangles the modern record.`,
    chart: trustSvg(chart),
    sentences: modern.indices.map((index) => index.homogeneity.sentence).filter((text) => text !== ""),
    meaning: [
      { measure: "Area burned", highFire: summary(modern.meaning.areaHa.highFire, "ha"), other: summary(modern.meaning.areaHa.other, "ha") },
      { measure: "Fires", highFire: summary(modern.meaning.fires.highFire, "fires"), other: summary(modern.meaning.fires.other, "fires") },
    ],
    agreement:
      agreement.years === 0 || !isFiniteNumber(agreement.agreementShare)
        ? `Years in both records: ${missing(agreement.reason ?? "none")}.`
        : `In the ${plural(agreement.years, "year", "years")} covered by both records they agree on ${formatPercent(agreement.agreementShare)} of years ` +
          `(both high-fire ${agreement.both}, fire-scar only ${agreement.fireScarOnly}, modern only ${agreement.modernOnly}` +
          (isFiniteNumber(agreement.kappa) ? `; Cohen's kappa ${formatDecimal(agreement.kappa, 2)}` : "") +
          ").",
    definition: `How the eras are compared: ${modern.homogeneityDefinition}.`,
  };
}

/**
 * The one page-1 line on the modern check: the homogeneity sentence of the index the odds rest on
 * (else the first index), or why there is no modern check.
 *
 * @param calibration - the calibration.
 * @param outlook - the outlook (its basis indices).
 * @returns one sentence.
 * @throws never.
 * @example
 * modernLine(calibration, outlook); // => "Modern record check (1950–2026): The PMI dry link looks the same …"
 */
export function modernLine(calibration: Calibration, outlook: Outlook): string {
  const modern = calibration.modern;
  if (modern === null || modern === undefined) return `Modern record check: ${missing(calibration.modernReason ?? "no modern fire record")}.`;
  const chosen = outlook.fireYear.basisIndices[0];
  const index = modern.indices.find((entry) => entry.name === chosen) ?? modern.indices[0];
  if (index === undefined) return `Modern record check: ${NOT_ENOUGH}.`;
  return `Modern record check (${modern.period.first}–${modern.period.last}): ${index.homogeneity.sentence.replace(/\s*\([^()]*Breslow[^()]*\)\.?$/, ".")}`;
}

/** "How our past outlooks turned out". */
export interface PastOutlooksView {
  readonly available: boolean;
  readonly missingText: string | null;
  readonly rows: readonly { readonly season: string; readonly issued: string; readonly chance: string; readonly outcome: string; readonly source: string; readonly scored: boolean }[];
  readonly scores: readonly { readonly label: string; readonly value: string }[];
  readonly warnings: readonly string[];
}

/**
 * The review of kept outlooks as a table and scores, with the small-sample warnings.
 *
 * @param review - the review (null/absent: none kept yet).
 * @returns the section's pieces.
 * @throws never.
 * @example
 * pastOutlooksView(null).missingText; // => "No outlook of this region has been kept yet: …"
 * @see Brier G.W. (1950) "Verification of forecasts expressed in terms of probability", Monthly Weather Review 78(1):1–3.
 */
export function pastOutlooksView(review: Review | null | undefined): PastOutlooksView {
  if (review === null || review === undefined || review.outlooks.length === 0) {
    return {
      available: false,
      missingText: "No outlook of this region has been kept yet: each briefing keeps its outlook, and later briefings score the kept ones against what happened.",
      rows: [],
      scores: [],
      warnings: [],
    };
  }
  const rows = review.outlooks.map((entry) => ({
    season: String(entry.season),
    issued: entry.issued,
    chance: formatPercent(entry.probability),
    outcome: entry.outcome === null ? "not known yet" : entry.outcome ? "high-fire year" : "not a high-fire year",
    source: entry.source ?? "",
    scored: entry.scored,
  }));
  const score = (value: number | null, digits: number, reason?: string): string => (isFiniteNumber(value) ? formatDecimal(value, digits) : missing(reason));
  const scores = [
    { label: "Seasons known (scored)", value: `${formatCount(review.known)} of ${formatCount(review.known + review.unknown)}` },
    { label: "Brier score of our outlooks", value: score(review.brierScore, 3, review.brierReason) },
    {
      label: `Brier score of always forecasting the average year (${isFiniteNumber(review.reference.rate) ? formatPercent(review.reference.rate) : "rate unknown"}, ${review.reference.source})`,
      value: score(review.brierScoreReference, 3),
    },
    { label: "Brier skill score (above 0: better than the average year)", value: isFiniteNumber(review.brierSkillScore) ? signed(review.brierSkillScore, 2) : missing(review.brierSkillReason) },
    {
      label: "Hit rate (high-fire years whose outlook put the odds above average)",
      value: isFiniteNumber(review.hitRate.value) ? `${review.hitRate.hits} of ${review.hitRate.highFireYears}` : missing(review.hitRate.reason),
    },
  ];
  const capital = (text: string): string => (text === "" ? text : text.charAt(0).toUpperCase() + text.slice(1));
  return { available: true, missingText: null, rows, scores, warnings: review.warnings.map((warning) => capital(clipText(warning.message, 400))) };
}

/** "Since the last briefing". */
export interface SinceLastView {
  readonly available: boolean;
  readonly text: string;
  readonly rows: readonly { readonly what: string; readonly before: string; readonly now: string }[];
}

/**
 * What changed since the most recent kept outlook of this or the previous season.
 *
 * @param since - the comparison (null/absent: nothing kept to compare with).
 * @returns the sentence and a small table of changes.
 * @throws never.
 * @example
 * sinceLastView(null).available; // => false
 */
export function sinceLastView(since: SinceLastBriefing | null | undefined): SinceLastView {
  if (since === null || since === undefined) return { available: false, text: "No earlier outlook of this or the previous season has been kept, so there is nothing to compare with.", rows: [] };
  const rows: { what: string; before: string; now: string }[] = [];
  rows.push({ what: "Chance of a high-fire year", before: formatPercent(since.fireYear.before), now: formatPercent(since.fireYear.now) });
  for (const change of since.phases) rows.push({ what: `${clipText(change.index, 40)} phase`, before: change.before ?? "none", now: change.now ?? "none" });
  for (const change of since.values) {
    rows.push({ what: `${clipText(change.index, 40)} value`, before: isFiniteNumber(change.before) ? formatDecimal(change.before, 2) : "none", now: isFiniteNumber(change.now) ? formatDecimal(change.now, 2) : "none" });
  }
  if (since.categories !== null) {
    for (const key of ["below", "near", "above"] as const) {
      rows.push({ what: `Chance of ${key}-normal activity`, before: formatPercent(since.categories.before[key]), now: formatPercent(since.categories.now[key]) });
    }
  }
  const relation = since.relation === "same season" ? "an earlier outlook for this season" : "last season's outlook";
  return { available: true, text: `${since.sentence} (Compared with ${relation}.)`, rows };
}

/** The close-pair warnings of the fire record, summarized for the PDF. */
export interface WarningSummary {
  readonly notes: readonly string[];
}

/**
 * Data notes for the appendix with many close-site-pair warnings summarized: their count and the
 * closest few pairs (the full list stays in `check --json`); every other note is kept as it is.
 *
 * @param messages - the warning messages, in order.
 * @param codes - the warning codes, same order (close pairs are recognized by a code containing "close").
 * @param keep - how many close pairs to list before summarizing (default 5).
 * @returns the notes to print.
 * @throws never.
 * @example
 * summarizeWarnings(["a", "b"], ["close-sites", "close-sites"], 5).notes.length; // => 2
 */
export function summarizeWarnings(messages: readonly string[], codes: readonly string[], keep = 5): WarningSummary {
  const close: { message: string; km: number; order: number }[] = [];
  const other: string[] = [];
  messages.forEach((message, order) => {
    const code = codes[order] ?? "";
    if (/close|spacing|near-sites|pair/i.test(code)) {
      const km = /([\d.,]+)\s*km/.exec(message);
      close.push({ message, km: km === null ? Number.POSITIVE_INFINITY : Number(km[1]!.replace(/,/g, "")), order });
    } else {
      other.push(message);
    }
  });
  if (close.length <= keep) return { notes: [...close.map((entry) => entry.message), ...other] };
  const closest = close.slice().sort((a, b) => a.km - b.km || a.order - b.order).slice(0, keep);
  return {
    notes: [
      `${formatCount(close.length)} pairs of sites are closer than the independence distance, so their fire records may not be independent; the ${keep} closest are listed below and the full list is in \`firephase check --json\`.`,
      ...closest.map((entry) => entry.message),
      ...other,
    ],
  };
}
