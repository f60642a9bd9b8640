/**
 * The briefing's view model: every word and number the templates print, computed and formatted
 * here from the Calibration, the Outlook (with its hindcast Skill) and the Workspace. Templates
 * only place these strings; they compute nothing.
 */
import type { Calibration, IndexCalibration, ProbabilityEstimate } from "../calibrate/types.js";
import type { Outlook } from "../outlook/types.js";
import { comparisonSentence, describeChance, formatPercent, formatPercentRange, headline as headlineSentence } from "../outlook/describeChance.js";
import { compositeFireRecord } from "../record/composite.js";
import type { Workspace } from "../workspace/types.js";
import { sep } from "node:path";
import { activityTimeline } from "./charts/activityTimeline.js";
import { categoryOddsBar } from "./charts/categoryOddsBar.js";
import { oddsByPhaseChart } from "./charts/oddsByPhaseChart.js";
import { phaseSpaceScatter } from "./charts/phaseSpaceScatter.js";
import { reliabilityDiagram } from "./charts/reliabilityDiagram.js";
import { rocCurveChart } from "./charts/rocCurveChart.js";
import { seaChart } from "./charts/seaChart.js";
import { stabilityChart } from "./charts/stabilityChart.js";
import { clipText, formatCount, formatDecimal, formatLongDate, formatMoment, formatNumber, formatPValue, isFiniteNumber } from "./formatValues.js";
import { markdownBlocks, type MarkdownBlock } from "./markdownBlocks.js";
import { METHOD_CITATIONS, type MethodCitation } from "./methodCitations.js";
import { trustSvg, type TrustedMarkup } from "./trustedMarkup.js";
import {
  chanceClause,
  curveView,
  type CurveView,
  hindcastExtras,
  type HindcastExtras,
  modernLine,
  pastOutlooksView,
  type PastOutlooksView,
  skillSizeText,
  sinceLastView,
  type SinceLastView,
  summarizeWarnings,
  thenAndNowView,
  type ThenAndNowView,
} from "./briefingSections.js";

/** The words printed wherever a statistic is null. */
export const NOT_ENOUGH_DATA = "not enough data";

/**
 * The header band's words, on every printed page (templates/briefing.css prints the same words in
 * a page-margin box; the HTML shows them atop the document on screen).
 */
export const BAND_TEXT = "Statistical outlook from past records \u2014 not an official forecast or fire-danger rating";

/** Everything {@link buildBriefingView} reads. */
export interface BriefingInputs {
  readonly workspace: Workspace;
  readonly calibration: Calibration;
  readonly outlook: Outlook;
  /** Version of the tool that made the briefing (package.json "version"). */
  readonly toolVersion: string;
  /** Full markdown text of SAFETY.md, printed in the appendix. */
  readonly safetyMarkdown: string;
  /** Paper size, printed in the settings table. */
  readonly paper: "a4" | "letter";
  /** How the region's kept outlooks turned out (`firephase review`); null/absent when none is kept. */
  readonly review?: import("../review/types.js").Review | null;
  /** What changed since the most recent kept outlook of this or the previous season; null/absent when there is none. */
  readonly sinceLast?: import("../review/types.js").SinceLastBriefing | null;
  /** The moment the briefing was made, ISO 8601 (e.g. "2027-03-10T08:15:00.000Z"), from the CLI's clock. */
  readonly madeAt?: string;
}

/** A statistic that is either shown or replaced by "not enough data" with its reason. */
export interface Shown<T> {
  readonly available: boolean;
  readonly value: T | null;
  /** "not enough data (reason)" when not available; null otherwise. */
  readonly missingText: string | null;
}

/** A probability as printed: percent, interval, words. */
export interface ProbabilityText {
  readonly available: boolean;
  readonly percent: string;
  readonly interval: string;
  /** The interval alone, e.g. "13–30%" (for table cells); empty when unavailable. */
  readonly range: string;
  readonly words: string;
  /** "not enough data (reason)" when the estimate is null; null otherwise. */
  readonly missingText: string | null;
}

/** One row of a label–value table. */
export interface LabelValue {
  readonly label: string;
  readonly value: string;
}

/** The view model of the whole briefing (see templates/briefing.hbs). */
export interface BriefingView {
  readonly documentTitle: string;
  /** The header band: this is a statistical outlook, not an official forecast ({@link BAND_TEXT}). */
  readonly bandText: string;
  /** Paper size, for paper-specific spacing in the style sheet (body class paper-a4 / paper-letter). */
  readonly paper: "a4" | "letter";
  readonly header: {
    readonly region: string;
    readonly description: string | null;
    readonly issuedText: string;
    readonly issuedIso: string;
    readonly seasonText: string;
    readonly dataThroughText: string;
    readonly calibrationText: string;
    /** "Prepared by … · Contact: …" from region.json `preparedBy` / `contact`; null when neither is given. */
    readonly preparedText: string | null;
  };
  readonly headline: {
    readonly available: boolean;
    readonly sentence: string;
    readonly chance: ProbabilityText;
    readonly base: ProbabilityText;
    /** Whether this season differs from an average year beyond the uncertainty, in words (plus the ratio when it does). */
    readonly comparison: string;
    /** The selection-aware interval beside the cell's own, e.g. "5–48% allowing for how the rule chose its index"; empty when none. */
    readonly selectionText: string;
    /** The past years the odds are read from, in plain words (no test statistics). */
    readonly basis: string;
    readonly definition: string;
    /** How the rule chose those years, with its test statistics: a footnote on page 1. */
    readonly methodNote: string;
  };
  readonly categories: {
    readonly rows: readonly { readonly label: string; readonly chance: ProbabilityText; readonly averageYear: string }[];
    readonly note: string;
    readonly chart: TrustedMarkup;
  };
  readonly currentPhases: {
    readonly rows: readonly {
      readonly index: string;
      readonly value: string;
      readonly phase: string;
      /** Distance from the calibration mean, e.g. "+1.3 SD". */
      readonly zText: string;
      readonly nearBoundary: boolean;
      readonly note: string;
      /** Where the value came from, e.g. "region.json", "--values" (printed in a page-1 footnote). */
      readonly source: string;
      /** The index's season window and scale, e.g. "Dec–Mar mean, standardized" or "yearly value". */
      readonly scaleText: string;
      /** True when the value is computed from part of its window only. */
      readonly provisional: boolean;
      /** "3 of 4 months so far (Dec 2026–Feb 2027); the odds may change"; empty when not provisional. */
      readonly provisionalText: string;
    }[];
    readonly missingText: string | null;
  };
  readonly skill: {
    /** False when no current index values were given: the outlook is the average year and no skill score applies. */
    readonly applies: boolean;
    readonly hasSkill: boolean;
    readonly title: string;
    readonly verdict: string;
    readonly summary: string;
  };
  /** The "How to read this page" box on page 1: three short lines. */
  readonly howToRead: readonly string[];
  /** Small print at the foot of page 1 (value sources, how the odds were chosen). */
  readonly footnotes: readonly string[];
  readonly cautions: readonly string[];
  /** The outlook's plain-language warnings, shown in the "Read with care" box on page 1. */
  readonly readWithCare: readonly string[];
  readonly indices: readonly IndexView[];
  readonly analogs: {
    readonly available: boolean;
    readonly missingText: string | null;
    /** A caution shown above the analog table when a current value is far outside every past year. */
    readonly caution: string | null;
    readonly indexNames: readonly string[];
    readonly rows: readonly {
      readonly year: string;
      readonly distance: string;
      readonly fireYear: string;
      readonly isFireYear: boolean;
      readonly category: string;
      readonly activity: string;
      readonly values: readonly string[];
    }[];
    readonly shareText: string;
    readonly scatter: {
      readonly available: boolean;
      readonly missingText: string | null;
      readonly title: string;
      readonly caption: string;
      readonly chart: TrustedMarkup | null;
    };
  };
  readonly timeline: { readonly chart: TrustedMarkup; readonly caption: string };
  readonly hindcast: {
    /** False when no current index value is used: the outlook is the average year, and no hindcast score or chart is printed. */
    readonly applies: boolean;
    /** Why the hindcast does not apply (printed instead of the scores); "" when it applies. */
    readonly notApplicableText: string;
    readonly available: boolean;
    readonly missingText: string | null;
    readonly verdict: string;
    readonly hasSkill: boolean;
    readonly rule: string;
    readonly scores: readonly { readonly score: string; readonly value: string; readonly meaning: string }[];
    readonly reliabilityChart: TrustedMarkup;
    readonly rocChart: TrustedMarkup;
    readonly caption: string;
    /** Chance test, bootstrap intervals, CORP diagram, both rules, count note. */
    readonly extras: HindcastExtras;
  };
  /** "Then and now": the modern record beside the fire-scar era. */
  readonly thenAndNow: ThenAndNowView;
  /** "How our past outlooks turned out". */
  readonly pastOutlooks: PastOutlooksView;
  /** "Since the last briefing". */
  readonly sinceLast: SinceLastView;
  /** Page-1 lines: the modern check, the curve's words, the selection-aware interval. */
  readonly pageOneNotes: readonly string[];
  /** "Made 10 March 2027, 08:15 UTC" (the moment the PDF was made), or null when not given. */
  readonly madeText: string | null;
  readonly methods: readonly MethodCitation[];
  readonly settings: readonly LabelValue[];
  readonly files: readonly { readonly role: string; readonly path: string; readonly sha256: string; readonly bytes: string }[];
  readonly dataNotes: readonly string[];
  readonly toolVersion: string;
  readonly footerText: string;
  readonly safety: readonly MarkdownBlock[];
}

/** The per-index sections: odds by phase, tests, SEA, block correlation and stability. */
export interface IndexView {
  readonly name: string;
  readonly ruleText: string;
  readonly currentText: string | null;
  readonly phases: readonly {
    readonly label: string;
    readonly years: string;
    readonly fireYears: string;
    readonly chance: ProbabilityText;
    readonly ratio: string;
    readonly categories: string;
    readonly fisher: string;
    readonly residual: string;
    readonly oddsRatio: string;
    readonly smallSample: boolean;
    readonly isCurrent: boolean;
  }[];
  readonly testText: string;
  readonly oddsChart: TrustedMarkup;
  readonly sea: {
    readonly available: boolean;
    readonly missingText: string | null;
    readonly chart: TrustedMarkup;
    readonly caption: string;
    readonly outsideText: string;
  };
  readonly aggregated: {
    readonly available: boolean;
    readonly missingText: string | null;
    readonly caption: string;
    readonly rows: readonly { readonly lag: string; readonly r: string; readonly pValue: string; readonly effectiveN: string }[];
  };
  readonly stability: { readonly chart: TrustedMarkup; readonly caption: string };
  /** The response curve (drawn for an index with a clear link). */
  readonly curve: CurveView;
}

/** "p = 0.03" or "p < 0.001" (also for q). */
function pEquals(name: string, p: number): string {
  const text = formatPValue(p);
  return text.startsWith("<") ? `${name} < ${text.slice(1)}` : `${name} = ${text}`;
}

function missing(reason: string | undefined): string {
  return reason === undefined || reason === "" ? NOT_ENOUGH_DATA : `${NOT_ENOUGH_DATA} (${reason})`;
}

function probabilityText(estimate: ProbabilityEstimate): ProbabilityText {
  if (estimate.estimate === null) {
    return { available: false, percent: NOT_ENOUGH_DATA, interval: "", range: "", words: NOT_ENOUGH_DATA, missingText: missing(estimate.reason) };
  }
  const range = estimate.lower !== null && estimate.upper !== null ? formatPercentRange(estimate.lower, estimate.upper) : "";
  const interval = range === "" ? "interval: not enough data" : `95% interval ${range}`;
  return { available: true, percent: formatPercent(estimate.estimate), interval, range, words: describeChance(estimate.estimate), missingText: null };
}

/** Text as one sentence: first letter capital, exactly one closing full stop (or ? / !). */
function sentence(text: string): string {
  const trimmed = text.trim().replace(/[;,:]+$/, "");
  if (trimmed === "") return "";
  const capital = trimmed.charAt(0).toUpperCase() + trimmed.slice(1);
  return /[.!?]$/.test(capital) ? capital : `${capital}.`;
}

function signed(value: number, digits: number): string {
  const text = formatDecimal(value, digits);
  return value > 0 && !/^0\.?0*$/.test(text) ? `+${text}` : text;
}

function plural(count: number, one: string, many: string): string {
  return `${formatCount(count)} ${count === 1 ? one : many}`;
}

/** Phase rule in words: "cold: at most −0.50; neutral: between −0.50 and 0.50; warm: at least 0.50". */
export function describePhaseRule(index: IndexCalibration, period: { first: number; last: number }): string {
  const { labels, cuts, rule } = index.definition;
  const parts = labels.map((label, i) => {
    const lower = cuts[i - 1];
    const upper = cuts[i];
    if (i === 0 && upper !== undefined) return `${label}: at most ${formatDecimal(upper, 2)}`;
    if (i === labels.length - 1 && lower !== undefined) return `${label}: at least ${formatDecimal(lower, 2)}`;
    if (lower !== undefined && upper !== undefined) return `${label}: between ${formatDecimal(lower, 2)} and ${formatDecimal(upper, 2)}`;
    return label;
  });
  const origin = rule === "terciles" ? `terciles of ${period.first}–${period.last}` : "fixed cuts";
  return `${parts.join("; ")} (${origin})`;
}

function chanceComparison(chance: number | null, base: number | null): string {
  if (chance === null || base === null || base <= 0) return "";
  // The ratio of the whole percentages printed beside it (35% and 10% → 3.5), so a reader can check it.
  const shownChance = Math.round(chance * 100);
  const shownBase = Math.round(base * 100);
  if (shownBase === 0) return "";
  const ratio = shownChance / shownBase;
  if (shownChance === 0) return "";
  if (ratio >= 1.25) return `That is about ${formatDecimal(ratio, 1)} times the chance in an average year.`;
  if (ratio <= 0.8) return `That is lower than in an average year (about ${formatDecimal(ratio, 1)} times the average chance).`;
  // Between 0.8 and 1.25 times: no ratio sentence (it would read "close to average" beside "higher").
  return "";
}

const MONTHS = ["Jan", "Feb", "Mar", "Apr", "May", "Jun", "Jul", "Aug", "Sep", "Oct", "Nov", "Dec"];

/** "2026-12" → "Dec 2026" (other text unchanged). */
function monthLabel(text: string): string {
  const match = /^(-?\d{1,6})-(\d{2})$/.exec(text);
  const name = match === null ? undefined : MONTHS[Number(match[2]) - 1];
  return match === null || name === undefined ? text : `${name} ${match[1]}`;
}

/** "Dec 2026–Feb 2027" from the first and last of "YYYY-MM" months; one month alone when they agree. */
function monthSpan(months: readonly string[]): string {
  const first = months[0];
  const last = months[months.length - 1];
  if (first === undefined || last === undefined) return "";
  return first === last ? monthLabel(first) : `${monthLabel(first)}\u2013${monthLabel(last)}`;
}

/** Months in a window such as "Dec-Mar" (wrapping the year end), or null when it is not two month names. */
function windowLength(window: string | null): number | null {
  if (window === null) return null;
  const parts = window.split(/[-\u2013]/).map((part) => MONTHS.indexOf(part.trim().slice(0, 3)));
  const [a, b] = parts;
  if (parts.length !== 2 || a === undefined || b === undefined || a < 0 || b < 0) return null;
  return ((b - a + 12) % 12) + 1;
}

/**
 * Printed form of a warning or note: one minus sign (U+2212) before every number, month windows
 * with an en dash ("Dec–Mar"), a value after "=" with three or more decimals rounded to the 2 the
 * tables show, first letter capital and one closing full stop.
 *
 * @param text - a plain-language message (any length; may be empty).
 * @returns the message as printed; "" for empty or blank text.
 * @throws never.
 * @example
 * printedText("WSI = -0.245 is provisional"); // => "WSI = −0.24 is provisional."
 * @see The Unicode Consortium (2023) The Unicode Standard 15.1, chapter 6 (U+2212 MINUS SIGN, U+2013 EN DASH).
 */
export function printedText(text: string): string {
  return sentence(printedNumbers(text));
}

/** {@link printedText} without the capital and full stop (for notes that start with a file path). */
function printedNumbers(text: string): string {
  const months = MONTHS.join("|");
  return (
    text
      .replace(/(=\s*)(-?\d+\.\d{3,})(?![\d.])/g, (_all, lead: string, value: string) => `${lead}${formatDecimal(Number(value), 2)}`)
      .replace(new RegExp(`\\b(${months})-(${months})\\b`, "g"), "$1\u2013$2")
      .replace(/(^|[\s(=:;,[])-(?=\.?\d)/g, "$1\u2212")
  );
}

function lastYearWithValue(series: { years: readonly number[]; values: readonly (number | null)[] }): number | null {
  for (let i = series.years.length - 1; i >= 0; i--) {
    if (series.values[i] !== null && series.values[i] !== undefined) return series.years[i] ?? null;
  }
  return null;
}

function strongestPair(calibration: Calibration, outlook: Outlook): [IndexCalibration, IndexCalibration] | null {
  const byName = new Map(calibration.indices.map((index) => [index.name, index]));
  const chosen: IndexCalibration[] = [];
  for (const name of outlook.fireYear.basisIndices) {
    const index = byName.get(name);
    if (index !== undefined && !chosen.includes(index)) chosen.push(index);
  }
  const ranked = [...calibration.indices].sort((a, b) => (a.contingency.pValue ?? 2) - (b.contingency.pValue ?? 2) || (a.name < b.name ? -1 : 1));
  for (const index of ranked) if (chosen.length < 2 && !chosen.includes(index)) chosen.push(index);
  const [first, second] = chosen;
  return first !== undefined && second !== undefined ? [first, second] : null;
}

function buildIndexView(index: IndexCalibration, calibration: Calibration, outlook: Outlook, yearValues: ReadonlyMap<number, number>): IndexView {
  const fireYearSet = new Set(calibration.fireYears.years);
  const period = calibration.period;
  const current = outlook.current.find((phase) => phase.index === index.name);
  const tests = new Map(index.contingency.perPhase.map((test) => [test.label, test]));
  const phases = index.phases.map((phase) => {
    const test = tests.get(phase.label);
    const oddsRatio = test?.oddsRatio;
    return {
      label: phase.label,
      years: formatCount(phase.years),
      fireYears: formatCount(phase.fireYears),
      chance: probabilityText(phase.probability),
      ratio: phase.ratioToBase === null ? NOT_ENOUGH_DATA : `${formatDecimal(phase.ratioToBase, 1)}×`,
      categories: `${phase.categories.below} / ${phase.categories.near} / ${phase.categories.above}`,
      fisher: test?.fisherPValue === null || test?.fisherPValue === undefined ? NOT_ENOUGH_DATA : formatPValue(test.fisherPValue),
      residual: test?.residual === null || test?.residual === undefined ? NOT_ENOUGH_DATA : signed(test.residual, 2),
      oddsRatio:
        oddsRatio === undefined || oddsRatio.estimate === null
          ? NOT_ENOUGH_DATA
          : `${formatDecimal(oddsRatio.estimate, 2)}` +
            (oddsRatio.lower !== null && oddsRatio.upper !== null ? ` (${formatDecimal(oddsRatio.lower, 2)}–${formatDecimal(oddsRatio.upper, 2)})` : "") +
            (oddsRatio.haldaneCorrected ? "*" : ""),
      smallSample: phase.smallSample,
      isCurrent: current !== undefined && current.label === phase.label,
    };
  });
  const contingency = index.contingency;
  const testText =
    contingency.chiSquare === null || contingency.pValue === null
      ? `Chi-square test: ${missing(contingency.reason)}.`
      : `Chi-square test of high-fire years by phase: X² = ${formatDecimal(contingency.chiSquare, 2)}, df = ${contingency.df}, ` +
        pEquals("p", contingency.pValue) +
        (contingency.qValue === null ? "" : `, false discovery rate ${pEquals("q", contingency.qValue)} across all indices`) +
        "." +
        (contingency.smallExpectedShare > 0
          ? ` ${Math.round(contingency.smallExpectedShare * 100)}% of expected counts are below 5, so read the chi-square p-value with care (Fisher exact p-values per phase are exact).`
          : "");

  const sea = index.sea;
  const seaAvailable = sea.mean.some((value) => value !== null);
  const outside: string[] = [];
  const clearEarlierLags: number[] = [];
  sea.lags.forEach((lag, i) => {
    const mean = sea.mean[i];
    const ci95 = sea.ci95[i];
    if (mean === null || mean === undefined || ci95 === null || ci95 === undefined) return;
    if (mean < ci95[0] || mean > ci95[1]) {
      const p = sea.pValue[i];
      const q = sea.qValue[i];
      if (lag !== 0 && isFiniteNumber(q) && q <= 0.05) clearEarlierLags.push(lag);
      outside.push(
        `lag ${signed(lag, 0)} (${signed(mean, 2)}` +
          (p === null || p === undefined ? "" : `, ${pEquals("p", p)}`) +
          (q === null || q === undefined ? "" : `, ${pEquals("q", q)}`) +
          ")",
      );
    }
  });
  const seaChartSvg = seaChart({ indexName: index.name, lags: sea.lags, mean: sea.mean, ci95: sea.ci95, ci99: sea.ci99 });

  const aggregated = index.aggregated;
  const aggregatedRows = aggregated.lags.map((lag, i) => {
    const r = aggregated.r[i];
    const p = aggregated.pValue[i];
    const n = aggregated.effectiveN[i];
    return {
      lag: signed(lag, 0),
      r: r === null || r === undefined ? NOT_ENOUGH_DATA : signed(r, 2),
      pValue: p === null || p === undefined ? NOT_ENOUGH_DATA : formatPValue(p),
      effectiveN: n === null || n === undefined ? NOT_ENOUGH_DATA : formatDecimal(n, 1),
    };
  });
  const aggregatedAvailable = aggregated.r.some((value) => value !== null);

  const stability = index.stability;
  const base = calibration.baseRate.estimate ?? 0;
  const stabilitySvg = stabilityChart({
    windows: stability.windows.map((window) => ({
      first: window.first,
      last: window.last,
      phases: window.phases.map((phase) => ({
        label: phase.label,
        estimate: phase.probability.estimate,
        lower: phase.probability.lower,
        upper: phase.probability.upper,
      })),
    })),
    labels: index.definition.labels,
    baseRate: base,
  });

  return {
    name: index.name,
    ruleText: describePhaseRule(index, period),
    currentText:
      current === undefined
        ? null
        : `This season: ${current.label} (${formatDecimal(current.value, 2)}${current.nearBoundary ? ", near a phase boundary" : ""}).`,
    phases,
    testText,
    oddsChart: trustSvg(
      oddsByPhaseChart({
        indexName: index.name,
        phases: index.phases.map((phase) => ({
          label: phase.label,
          estimate: phase.probability.estimate,
          lower: phase.probability.lower,
          upper: phase.probability.upper,
          years: phase.years,
          smallSample: phase.smallSample,
          isCurrent: current !== undefined && current.label === phase.label,
        })),
        baseRate: { estimate: calibration.baseRate.estimate, lower: calibration.baseRate.lower, upper: calibration.baseRate.upper },
      }),
    ),
    sea: {
      available: seaAvailable,
      missingText: seaAvailable ? null : missing(sea.reason),
      chart: trustSvg(seaChartSvg),
      caption:
        `Mean ${index.name} departure in the years around ${plural(sea.eventYears.length, "high-fire year", "high-fire years")}` +
        (sea.eventYears.length < calibration.fireYears.years.length
          ? ` (of the ${formatCount(calibration.fireYears.years.length)}: those whose whole window has ${index.name} values)`
          : "") +
        " (lag 0 = the high-fire year); " +
        "the shaded envelope shows how far chance alone goes (random years; settings in Appendix A).",
      outsideText:
        !seaAvailable
          ? ""
          : outside.length === 0
            ? "No lag lies beyond the 95% chance envelope."
            : `Beyond the 95% chance envelope: ${outside.join("; ")}.` +
              (clearEarlierLags.length === 0
                ? ""
                : ` The outlook uses only this winter's ${index.name} value (lag 0), so a link at ${clearEarlierLags.length === 1 ? "lag" : "lags"} ` +
                  `${clearEarlierLags.map((lag) => signed(lag, 0)).join(", ")} (through ${clearEarlierLags.every((lag) => lag < 0) ? "an earlier" : "another"} winter) is shown here but not used in the odds.`),
    },
    aggregated: {
      available: aggregatedAvailable,
      missingText: aggregatedAvailable ? null : missing(aggregated.reason),
      caption:
        `Fire activity and ${index.name} averaged in ${plural(aggregated.blocks, "block", "blocks")} of ${aggregated.blockYears} years; ` +
        "Pearson r at block lags (negative: the index leads), p-values from the effective sample size.",
      rows: aggregatedRows,
    },
    curve: curveView(
      index,
      calibration.years.flatMap((year) => {
        const value = yearValues.get(year);
        return value === undefined ? [] : [{ value, fireYear: fireYearSet.has(year) }];
      }),
      current === undefined ? null : current.value,
      calibration.years.length,
    ),
    stability: {
      chart: trustSvg(stabilitySvg),
      caption:
        `Chance of a high-fire year by ${index.name} phase in moving windows of ${stability.window} years, step ${stability.step} years ` +
        `(${plural(stability.windows.length, "window", "windows")}); a link that holds through time stays on the same side of the average year.`,
    },
  };
}

/** "Prepared by … · Contact: …" from region.json, read defensively (the fields are optional). */
function preparedText(settings: Workspace["settings"]): string | null {
  const fields = settings as { readonly preparedBy?: unknown; readonly contact?: unknown };
  const preparedBy = typeof fields.preparedBy === "string" && fields.preparedBy.trim() !== "" ? fields.preparedBy.trim() : null;
  const contact = typeof fields.contact === "string" && fields.contact.trim() !== "" ? fields.contact.trim() : null;
  if (preparedBy === null && contact === null) return null;
  return [preparedBy === null ? null : `Prepared by ${preparedBy}`, contact === null ? null : `Contact: ${contact}`].filter((part) => part !== null).join(" \u00b7 ");
}

/**
 * Build the briefing's view model: every word and number the templates print.
 *
 * Computes nothing statistical: it formats the Calibration, the Outlook and its hindcast Skill,
 * composites the fire record only to draw the sample depth, calls the chart functions, and reads
 * the markdown of SAFETY.md into blocks. A null statistic becomes "not enough data" with its reason.
 *
 * @param inputs - workspace, calibration, outlook, tool version, SAFETY.md text, paper size.
 * @returns the view model; with no usable outlook estimate the headline says "not enough data".
 * @throws RangeError when the issue date is not a calendar date or a chart returns unsafe SVG.
 * @example
 * const view = buildBriefingView({ workspace, calibration, outlook, toolVersion: "0.1.0", safetyMarkdown, paper: "a4" });
 * view.header.issuedText; // => "Issued 10 March 2027"
 * @see Brown L.D., Cai T.T., DasGupta A. (2001) "Interval estimation for a binomial proportion", Statistical Science 16(2):101–133 (the intervals shown).
 */
export function buildBriefingView(inputs: BriefingInputs): BriefingView {
  const { workspace, calibration, outlook } = inputs;
  const settings = workspace.settings;
  const methods = settings.methods;
  const period = calibration.period;
  const issuedLong = formatLongDate(outlook.issued);
  const record = compositeFireRecord(workspace.fireRecord, settings.fireYears.minSitesRecording);
  // The usable record: years with enough recording sites to be counted at all.
  let lastUsableYear: number | null = null;
  let lastRecordYear: number | null = null;
  for (const row of record.years) {
    lastRecordYear = lastRecordYear === null ? row.year : Math.max(lastRecordYear, row.year);
    if (row.sitesRecording >= settings.fireYears.minSitesRecording) lastUsableYear = lastUsableYear === null ? row.year : Math.max(lastUsableYear, row.year);
  }
  // A monthly index states its last month with a value ("Feb 2027"); a yearly index its last year.
  const indexLast = workspace.indices
    .map((series) => {
      const months = (series.monthly ?? []).filter((month) => month.value !== null);
      const lastMonth = months.reduce<{ year: number; month: number } | null>(
        (latest, month) => (latest === null || month.year * 12 + month.month > latest.year * 12 + latest.month ? month : latest),
        null,
      );
      const lastYear = lastYearWithValue(series);
      const last = lastMonth !== null ? `${MONTHS[lastMonth.month - 1] ?? lastMonth.month} ${lastMonth.year}` : lastYear === null ? null : String(lastYear);
      return { name: series.name, last };
    })
    .filter((entry): entry is { name: string; last: string } => entry.last !== null);
  const indexLastYears = [...new Set(indexLast.map((entry) => entry.last))];
  const indexThrough =
    indexLast.length === 0
      ? "no index values"
      : indexLastYears.length === 1
        ? `climate indices through ${indexLastYears[0]}`
        : `climate indices through ${indexLast.map((entry) => `${entry.last} (${entry.name})`).join(", ")}`;

  const measureWords = calibration.fireYears.measure === "fraction" ? "share of recording sites burned" : "number of sites burned";
  const topPercent = Math.round(calibration.fireYears.top * 100);
  const chance = probabilityText(outlook.fireYear);
  const base = probabilityText(outlook.baseRate);
  const fireYearCount = calibration.fireYears.years.length;

  const categoryKeys = [
    ["below", "Below normal"],
    ["near", "Near normal"],
    ["above", "Above normal"],
  ] as const;
  const shares = calibration.categories.realisedShares;

  const skill = outlook.hindcast;
  const hindcastAvailable = skill.brierScore !== null;
  // With no current index values the outlook is the average year itself; the outlook's verdict says so.
  const skillApplies = outlook.current.length > 0;

  const analogNames = calibration.indices.map((index) => index.name);
  const analogFireCount = outlook.analogs.filter((analog) => analog.fireYear).length;
  const fireYearSet = new Set(calibration.fireYears.years);
  const pair = strongestPair(calibration, outlook);
  const seriesByName = new Map(workspace.indices.map((series) => [series.name, series]));
  const valueMap = (name: string): Map<number, number> => {
    const series = seriesByName.get(name);
    const map = new Map<number, number>();
    series?.years.forEach((year, i) => {
      const value = series.values[i];
      if (value !== null && value !== undefined) map.set(year, value);
    });
    return map;
  };
  let scatter: BriefingView["analogs"]["scatter"];
  if (pair === null) {
    scatter = { available: false, missingText: missing("the phase space needs two indices"), title: "Phase space", caption: "", chart: null };
  } else {
    const [xIndex, yIndex] = pair;
    const xValues = valueMap(xIndex.name);
    const yValues = valueMap(yIndex.name);
    const points = calibration.years.flatMap((year) => {
      const x = xValues.get(year);
      const y = yValues.get(year);
      return x === undefined || y === undefined ? [] : [{ x, y, fireYear: fireYearSet.has(year), year }];
    });
    const currentX = outlook.current.find((phase) => phase.index === xIndex.name);
    const currentY = outlook.current.find((phase) => phase.index === yIndex.name);
    scatter = {
      available: points.length > 0,
      missingText: points.length > 0 ? null : missing("no calibration year has both values"),
      title: `Phase space: ${xIndex.name} and ${yIndex.name}`,
      caption:
        `Each point is a calibration year (${period.first}–${period.last}) placed by its ${xIndex.name} and ${yIndex.name} values; ` +
        `high-fire years are marked, dashed lines are the phase boundaries` +
        (currentX !== undefined && currentY !== undefined
          ? ", and the large marker is this season."
          : outlook.current.length === 0
            ? "; no current index values were given."
            : "; this season lacks one of the two values."),
      chart: trustSvg(
        phaseSpaceScatter({
          xName: xIndex.name,
          yName: yIndex.name,
          points,
          current: currentX !== undefined && currentY !== undefined ? { x: currentX.value, y: currentY.value } : null,
          xCuts: xIndex.definition.cuts,
          yCuts: yIndex.definition.cuts,
        }),
      ),
    };
  }

  // Years under minSitesRecording are drawn without a bar: they are not used, and one or two
  // recording sites make a misleading 0 or 100%.
  const timelineYears = record.years.map((row) => ({
    year: row.year,
    activity:
      row.sitesRecording < settings.fireYears.minSitesRecording
        ? null
        : calibration.fireYears.measure === "fraction"
          ? row.fraction
          : row.sitesBurned,
    sitesRecording: row.sitesRecording,
    fireYear: fireYearSet.has(row.year),
  }));

  const warningsSeen = new Set<string>();
  const noteMessages: string[] = [];
  const noteCodes: string[] = [];
  for (const warning of [...workspace.warnings, ...calibration.warnings, ...outlook.warnings]) {
    // Paths in reader warnings are relative to the region folder in the briefing, never a machine's absolute path.
    const message = clipText(warning.message.split(`${workspace.root}${sep}`).join(""), 400);
    if (warningsSeen.has(message)) continue;
    warningsSeen.add(message);
    noteMessages.push(message);
    noteCodes.push(warning.code);
  }
  // Many close site pairs are summarized (count and the closest); the full list stays in check --json.
  const dataNotes = summarizeWarnings(noteMessages, noteCodes, 5).notes.map((note) => {
    const text = printedNumbers(note).trim();
    return text === "" || /[.!?]$/.test(text) ? text : `${text}.`;
  });

  const curveOdds = outlook.fireYear.curveOdds ?? null;
  const phaseOdds = outlook.fireYear.phaseOdds;
  const pageOneNotes: string[] = [];
  const selection = outlook.fireYear.selectionInterval;
  const selectionShown = selection !== null && selection !== undefined && isFiniteNumber(selection.lower) && isFiniteNumber(selection.upper);
  const selectionText = selectionShown
    ? `${formatPercentRange(selection.lower, selection.upper)} allowing for the rule's choice of index`
    : "";
  if (outlook.fireYear.strengthNote !== null && outlook.fireYear.strengthNote !== undefined && curveOdds !== null) {
    const phaseLabel = outlook.current.find((phase) => phase.index === curveOdds.index)?.label ?? "";
    const phaseChance = outlook.perIndex.find((entry) => entry.index === curveOdds.index)?.probability.estimate ?? phaseOdds?.estimate ?? null;
    pageOneNotes.push(
      `This season's ${clipText(curveOdds.index, 40)} value (${formatNumber(curveOdds.value, 2)}) is strong within its ${phaseLabel} phase: ` +
        `the response curve gives ${formatPercent(curveOdds.estimate)} (95% interval ${formatPercentRange(curveOdds.lower, curveOdds.upper)})` +
        (isFiniteNumber(phaseChance) ? `, against ${formatPercent(phaseChance)} for the ${phaseLabel} phase as a whole.` : ".") +
        (curveOdds.beyondRange !== null ? ` The value lies ${curveOdds.beyondRange} every past year, so the curve is read at the record's edge.` : ""),
    );
  }
  pageOneNotes.push(modernLine(calibration, outlook));

  const labelOf = new Map(outlook.current.map((phase) => [phase.index, phase.label]));
  const phaseWords = outlook.fireYear.basisIndices.map((name) => `${name} ${labelOf.get(name) ?? ""}`.trim());
  const plainBasis =
    outlook.fireYear.basisIndices.length === 0
      ? `Read from all ${plural(outlook.fireYear.years, "past year", "past years")} (the average year): ` +
        `${formatCount(outlook.fireYear.fireYears)} of them ${outlook.fireYear.fireYears === 1 ? "was a high-fire year" : "were high-fire years"}.`
      : `Read from the ${plural(outlook.fireYear.years, "past year", "past years")} with ${phaseWords.join(" and ")}: ` +
        `${formatCount(outlook.fireYear.fireYears)} of them ${outlook.fireYear.fireYears === 1 ? "was a high-fire year" : "were high-fire years"}.`;
  const bySource = new Map<string, string[]>();
  for (const phase of outlook.current) {
    const names = bySource.get(phase.source) ?? [];
    names.push(phase.index);
    bySource.set(phase.source, names);
  }
  const sourcesNote =
    bySource.size === 0 ? "" : `Where this season's values came from: ${[...bySource].map(([source, names]) => `${names.join(", ")} from ${source}`).join("; ")}.`;

  const firstSea = calibration.indices[0]?.sea;
  const settingsRows: LabelValue[] = [
    { label: "Calibration period", value: `${period.first}–${period.last} (${formatCount(period.years)} years used)` },
    {
      label: "High-fire years",
      value:
        `top ${topPercent}% of calibration years by ${measureWords}; at least ${settings.fireYears.minSitesRecording} recording sites; ` +
        `threshold ${calibration.fireYears.threshold === null ? NOT_ENOUGH_DATA : formatDecimal(calibration.fireYears.threshold, calibration.fireYears.measure === "fraction" ? 3 : 0)}; ` +
        `realised ${fireYearCount} of ${calibration.fireYears.calibrationYears} years (${Math.round(calibration.fireYears.realisedShare * 1000) / 10}%)`,
    },
    {
      label: "Activity categories",
      value:
        `terciles of calibration-period activity (${calibration.categories.quantileRule}). ${sentence(calibration.categories.tieRule)} ` +
        `Realised shares: below ${formatPercent(shares.below)}, near ${formatPercent(shares.near)}, above ${formatPercent(shares.above)}.`,
    },
    { label: "Interval for a proportion", value: calibration.interval === "wilson" ? "Wilson score, 95%, no continuity correction" : "Jeffreys, 95% equal-tailed" },
    { label: "Small-sample flag", value: `a phase with fewer than ${methods.smallSampleYears} calibration years` },
    { label: "Near-boundary margin", value: `${formatDecimal(methods.nearBoundarySd, 2)} of each index's standard deviation either side of a cut` },
    { label: "Headline rule", value: methods.response === "curve" ? "response curve of the selected index, read at this season's value (the phase odds beside it)" : "phase odds of the selected index or joint phase (the response curve beside it)" },
    { label: "Chance test and intervals", value: `${formatCount(methods.permutations)} block shuffles of the fire record; ${formatCount(methods.bootstrapResamples)} moving-block bootstrap resamples; blocks of ${methods.blockYears} years` },
    { label: "Modern record high-fire years", value: `top ${topPercent}% of modern years by ${methods.modernMeasure === "area" ? "area burned" : "number of fires"}` },
    { label: "Superposed epoch analysis", value: `lags ${signed(methods.seaFirstLag, 0)} to ${signed(methods.seaLastLag, 0)} years; ${formatCount(methods.seaDraws)} random draws` },
    ...(firstSea === undefined
      ? []
      : [{ label: "SEA draws and limits", value: `${firstSea.sampling}; baseline: ${firstSea.baseline}; ${firstSea.percentileRule}` }]),
    { label: "Aggregated lag correlation", value: `blocks of ${methods.blockYears} years, block lags −${methods.blockMaxLag} to +${methods.blockMaxLag}` },
    { label: "Stability windows", value: `${methods.stabilityWindow} years, step ${methods.stabilityStep} years` },
    { label: "Joint phases", value: `used when the joint cell has at least ${methods.jointMinYears} calibration years and both indices have a clear link (chi-square q at most ${methods.jointMaxQ})` },
    { label: "Analog years", value: `${methods.analogs} nearest calibration years in standardized index space` },
    { label: "Hindcast", value: `each year forecast without itself and ${methods.hindcastExclusion} years either side` },
    { label: "Site independence distance", value: `${formatCount(methods.independenceKm)} km` },
    { label: "Random seed", value: String(calibration.seed) },
    { label: "Paper", value: inputs.paper === "a4" ? "A4" : "US Letter" },
    { label: "Tool version", value: `firephase ${inputs.toolVersion}` },
  ];

  return {
    documentTitle: `Fire-season outlook ${outlook.season}: ${clipText(outlook.region, 120)}`,
    bandText: BAND_TEXT,
    paper: inputs.paper,
    header: {
      // Free text is bounded for the page (the reader bounds it at load too): a very long name
      // must not push page 1 onto a second page.
      region: clipText(outlook.region, 120),
      description: settings.description === null ? null : clipText(settings.description, 400),
      issuedText: `Issued ${issuedLong}`,
      issuedIso: outlook.issued,
      seasonText: `for the ${outlook.season} fire season`,
      dataThroughText:
        `Data through: fire record ${lastUsableYear ?? "none usable"}` +
        (lastUsableYear !== null && lastRecordYear !== null && lastRecordYear > lastUsableYear
          ? ` (later years have fewer than ${settings.fireYears.minSitesRecording} recording sites)`
          : "") +
        `; ${indexThrough}.`,
      calibrationText: `Calibrated on ${period.first}–${period.last} (${formatCount(period.years)} years).`,
      preparedText: preparedText(settings),
    },
    headline: {
      available: chance.available,
      sentence: chance.available ? headlineSentence(outlook.fireYear, outlook.baseRate) : `Chance of a high-fire year: ${chance.missingText ?? NOT_ENOUGH_DATA}.`,
      chance,
      base,
      comparison:
        outlook.fireYear.comparedWithBase === "not distinguishable"
          ? comparisonSentence(outlook.fireYear, outlook.baseRate)
          : `${comparisonSentence(outlook.fireYear, outlook.baseRate)} ${chanceComparison(outlook.fireYear.estimate, outlook.baseRate.estimate)}`.trim(),
      selectionText,
      basis: plainBasis,
      methodNote: `How the past years were chosen: ${sentence(outlook.fireYear.basis)}`,
      definition:
        `A high-fire year is one of the top ${topPercent}% of years ${period.first}–${period.last} by the ${measureWords} ` +
        `(${fireYearCount} of ${calibration.fireYears.calibrationYears} years).`,
    },
    categories: {
      rows: categoryKeys.map(([key, label]) => ({ label, chance: probabilityText(outlook.categories[key]), averageYear: formatPercent(shares[key]) })),
      note:
        `Categories split ${period.first}–${period.last} fire activity at its terciles; the diamonds mark an average year ` +
        `(below ${formatPercent(shares.below)}, near ${formatPercent(shares.near)}, above ${formatPercent(shares.above)})` +
        (Math.max(Math.abs(shares.below - 1 / 3), Math.abs(shares.near - 1 / 3), Math.abs(shares.above - 1 / 3)) > 0.02
          ? ": years with equal activity (often no fire) stay in one category, so the shares are not a third each."
          : "."),
      chart: trustSvg(
        categoryOddsBar({
          below: outlook.categories.below,
          near: outlook.categories.near,
          above: outlook.categories.above,
          averageYear: { below: shares.below, near: shares.near, above: shares.above },
        }),
      ),
    },
    currentPhases: {
      rows: outlook.current.map((phase) => {
        // Fields the outlook adds for values read from the index files (read defensively).
        const extra = phase as { readonly window?: string | null; readonly months?: readonly string[]; readonly provisional?: boolean; readonly nearBoundaryMargin?: number };
        const indexSettings = settings.indices.find((entry) => entry.name === phase.index);
        const window = extra.window ?? indexSettings?.months ?? null;
        const units = indexSettings?.units ?? null;
        const provisional = extra.provisional === true;
        const months = extra.months ?? [];
        const margin = isFiniteNumber(extra.nearBoundaryMargin) ? extra.nearBoundaryMargin : Number.NaN;
        return {
          index: phase.index,
          value: formatNumber(phase.value, 2),
          phase: phase.label,
          zText: isFiniteNumber(phase.z) ? `${signed(phase.z, 1)} SD` : "not computable (no spread)",
          nearBoundary: phase.nearBoundary,
          source: phase.source,
          scaleText: `${window === null ? "yearly value" : `${window.replace("-", "\u2013")} mean`}${units === null || units === "" ? "" : `, ${units}`}`,
          provisional,
          provisionalText: !provisional
            ? ""
            : months.length === 0
              ? "The season's months are not all in yet; the odds may change."
              : `${windowLength(window) === null ? plural(months.length, "month", "months") : `${formatCount(months.length)} of ${plural(windowLength(window) ?? 0, "month", "months")}`} so far (${monthSpan(months)}); the odds may change.`,
          note: phase.nearBoundary
            ? isFiniteNumber(margin)
              ? `Within ${formatNumber(margin, 2)} of a cut (${formatDecimal(methods.nearBoundarySd, 2)} SD): a small change would change the phase.`
              : "Near a cut: a small change would change the phase."
            : "",
        };
      }),
      missingText: outlook.missing.length === 0 ? null : `No value for this season, left out: ${outlook.missing.join(", ")}.`,
    },
    skill: {
      applies: skillApplies,
      hasSkill: skill.hasSkill,
      title: !skillApplies ? "Hindcast: no index-based forecast to check" : "Hindcast",
      verdict: skill.verdict,
      summary: !skillApplies
        ? "With no index values there is no index-based forecast to verify."
        : hindcastAvailable
        ? `Tested on ${plural(skill.years, "past year", "past years")}, each forecast without itself and ${skill.exclusion} years either side: ` +
          `Brier skill score ${skill.brierSkillScore === null ? NOT_ENOUGH_DATA : signed(skill.brierSkillScore, 2)}${skillSizeText(skill, true)}, ` +
          `ROC area ${skill.rocArea === null ? NOT_ENOUGH_DATA : formatDecimal(skill.rocArea, 2)}; ${chanceClause(skill)}.`
        : `Hindcast scores: ${missing(skill.reason)}.`,
    },
    howToRead: [
      selectionShown
        ? "The large figure is this season's chance of a high-fire year; the range beside it is its 95% interval, and the wider range after it allows also for how the rule chose its index from the same records."
        : "The large figure is this season's chance of a high-fire year; the range is its 95% interval.",
      "Compare it with an average year: higher odds tilt the season, they do not make a bad one certain.",
      "The hindcast box says whether the method beat the average year on past years; if not, plan for an average year.",
    ],
    footnotes: [
      sourcesNote,
    ].filter((note) => note !== ""),
    cautions: [
      "This is a statistical outlook built from past fire and climate records. It does not forecast weather, fire danger or any single fire.",
      "Official agency seasonal outlooks and daily fire-danger forecasts come first: use them for operational decisions, and where they differ from this briefing, follow them.",
      `The odds describe ${period.first}–${period.last}; land use, fire suppression and climate have changed since, so the past may not repeat.`,
      "Even at higher odds most seasons are not high-fire years, and a quiet outlook does not mean a quiet season.",
    ],
    // A provisional value is said in the index table (tag and months), not again here; a briefing
    // dated ahead of the day it is made is said in the data notes (beside "Made …"), keeping page 1 to one page.
    readWithCare: outlook.warnings.filter((warning) => warning.code !== "value-provisional" && warning.code !== "issued-ahead").map((warning) => printedText(warning.message)),
    indices: calibration.indices.map((index) => buildIndexView(index, calibration, outlook, valueMap(index.name))),
    analogs: {
      available: outlook.analogs.length > 0,
      missingText:
        outlook.analogs.length > 0
          ? null
          : missing(outlook.current.length === 0 ? "no current index values were given" : "no calibration year has all current index values"),
      caution: outlook.warnings.some((warning) => warning.code === "value-far-outside")
        ? "A current value lies far outside every past year (see Read with care), so even the nearest years are not much like this season."
        : null,
      indexNames: analogNames,
      rows: outlook.analogs.map((analog) => ({
        year: String(analog.year),
        distance: formatDecimal(analog.distance, 2),
        fireYear: analog.fireYear ? "yes" : "no",
        isFireYear: analog.fireYear,
        category: analog.category === "below" ? "Below normal" : analog.category === "near" ? "Near normal" : "Above normal",
        activity:
          calibration.fireYears.measure === "fraction" ? `${Math.round(analog.activity * 100)}% of sites` : plural(analog.activity, "site", "sites"),
        values: analogNames.map((name) => {
          const value = Object.hasOwn(analog.values, name) ? analog.values[name] : undefined;
          return value === undefined ? "–" : formatDecimal(value, 2);
        }),
      })),
      shareText:
        outlook.analogs.length === 0
          ? ""
          : `${analogFireCount} of ${outlook.analogs.length} analog years were high-fire years` +
            (outlook.analogFireShare.estimate === null
              ? "."
              : ` (${formatPercent(outlook.analogFireShare.estimate)}` +
                (outlook.analogFireShare.lower !== null && outlook.analogFireShare.upper !== null
                  ? `, 95% interval ${formatPercentRange(outlook.analogFireShare.lower, outlook.analogFireShare.upper)}`
                  : "") +
                `; all years ${formatPercent(calibration.baseRate.estimate)}).`),
      scatter,
    },
    timeline: {
      chart: trustSvg(
        activityTimeline({
          years: timelineYears,
          threshold: calibration.fireYears.threshold,
          measureLabel: calibration.fireYears.measure === "fraction" ? "Share of sites burned" : "Sites burned",
          calibration: { first: period.first, last: period.last },
        }),
      ),
      caption:
        `Fire activity per year (${measureWords}) as a line, high-fire years as dots, with the high-fire threshold; the strip below is the sample depth (sites recording). ` +
        `High-fire years are chosen only among the calibration years ${period.first}–${period.last} (shaded); years outside it are drawn light grey ` +
        `and are not used, however active. Years with fewer than ${settings.fireYears.minSitesRecording} recording sites are left out (the line breaks there).`,
    },
    hindcast: {
      applies: skillApplies,
      notApplicableText: skillApplies
        ? ""
        : "No current index value is used, so this season's outlook is the long-term average year and there is no index-based forecast to check. " +
          "A hindcast of always forecasting the average year says nothing about the method's skill, so no scores or charts are shown here. " +
          "Give this season's index values to see how the method did on past years.",
      available: hindcastAvailable,
      missingText: hindcastAvailable ? null : missing(skill.reason),
      verdict: skill.verdict,
      hasSkill: skill.hasSkill,
      rule: skill.rule,
      scores: [
        {
          score: "Brier score",
          value:
            skill.brierScore === null
              ? NOT_ENOUGH_DATA
              : `${formatDecimal(skill.brierScore, 3)} (Brier score of the average-year forecast: ${skill.brierScoreClimatology === null ? NOT_ENOUGH_DATA : formatDecimal(skill.brierScoreClimatology, 3)})`,
          meaning: "mean squared error of the high-fire-year chance; lower is better",
        },
        {
          score: "Brier skill score",
          value: skill.brierSkillScore === null ? NOT_ENOUGH_DATA : signed(skill.brierSkillScore, 2),
          meaning: "above 0: better than always forecasting the average-year chance",
        },
        {
          score: "Ranked probability score",
          value:
            skill.rps === null
              ? NOT_ENOUGH_DATA
              : `${formatDecimal(skill.rps, 3)} (ranked probability score of the average-year forecast: ${skill.rpsClimatology === null ? NOT_ENOUGH_DATA : formatDecimal(skill.rpsClimatology, 3)}; ${skill.rpsForm})`,
          meaning: "error of the below / near / above odds; lower is better",
        },
        {
          score: "Ranked probability skill score",
          value: skill.rpss === null ? NOT_ENOUGH_DATA : signed(skill.rpss, 2),
          meaning:
            "above 0: better than always forecasting the average-year shares of the three categories (their shares over the whole calibration period, the same for every forecast)",
        },
        {
          score: "ROC area",
          value:
            skill.rocArea === null
              ? NOT_ENOUGH_DATA
              : `${formatDecimal(skill.rocArea, 2)}` +
                (skill.intervals?.rocArea !== null && skill.intervals?.rocArea !== undefined
                  ? ` (95% block-bootstrap interval ${formatDecimal(skill.intervals.rocArea[0], 2)}–${formatDecimal(skill.intervals.rocArea[1], 2)})`
                  : skill.rocStandardError === null
                    ? ""
                    : ` (standard error ${formatDecimal(skill.rocStandardError, 3)}, assuming independent years)`),
          meaning: "0.5: no better than chance at telling high-fire years from others; 1: perfect",
        },
        { score: "Years tested", value: formatCount(skill.years), meaning: `each left out with ${skill.exclusion} years either side` },
      ],
      reliabilityChart: trustSvg(reliabilityDiagram({ bins: skill.reliability, climatology: calibration.baseRate.estimate ?? 0 })),
      rocChart: trustSvg(rocCurveChart({ points: skill.rocCurve, area: skill.rocArea })),
      caption:
        `Reliability: when the method said a given chance, how often a high-fire year followed — the recalibrated curve of the hindcast's own forecasts; inside the ` +
        (isFiniteNumber(skill.corp?.level) ? `${Math.round((skill.corp?.level ?? 0) * 100)}% ` : "") +
        "band it is as reliable as chance allows. " +
        "ROC: hit rate against false-alarm rate over all probability thresholds.",
      extras: hindcastExtras(skill, calibration),
    },
    thenAndNow: thenAndNowView(calibration),
    pastOutlooks: pastOutlooksView(inputs.review),
    sinceLast: sinceLastView(inputs.sinceLast),
    pageOneNotes,
    madeText: inputs.madeAt === undefined ? null : `Made ${formatMoment(inputs.madeAt)}`,
    methods: METHOD_CITATIONS,
    settings: settingsRows,
    files: workspace.files.map((file) => ({ role: file.role, path: file.path, sha256: file.sha256, bytes: formatCount(file.bytes) })),
    dataNotes,
    toolVersion: inputs.toolVersion,
    footerText: `${clipText(outlook.region, 70)} · fire-season outlook ${outlook.season} · Issued ${issuedLong}`,
    safety: markdownBlocks(inputs.safetyMarkdown),
  };
}
