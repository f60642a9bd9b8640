import { classifyPhase } from "../climate/phaseDefinition.js";
import type { PhaseDefinition } from "../climate/types.js";
import { selectFireYears } from "../record/selectFireYears.js";
import { benjaminiHochberg } from "../stats/benjaminiHochberg.js";
import { breslowDayTest } from "../stats/breslowDayTest.js";
import { oddsRatioWoolf } from "../stats/oddsRatioWoolf.js";
import { quantileSorted } from "../stats/quantileSorted.js";
import type { ModernFireRow } from "../workspace/types.js";
import { agreementOfRecords } from "./agreementOfRecords.js";
import type { IndexValues } from "./buildTrainingSet.js";
import { proportionEstimate } from "./proportionEstimate.js";
import type { ModernEra, ModernHomogeneity, ModernIndex, ModernSummary, PhaseOdds } from "./types.js";

/** Fewest modern years (with a value of the measure and of an index) for the modern era to be reported. */
export const MIN_MODERN_YEARS = 10;

/** Fewest modern high-fire years for the two-era test to be able to tell a difference. */
export const MIN_MODERN_FIRE_YEARS = 5;

/** A modern odds ratio within this factor of the fire-scar one counts as "the same" link. */
export const SAME_LINK_FACTOR = 1.5;

/** How the two eras are compared in the homogeneity test (stated in the JSON). */
export const HOMOGENEITY_DEFINITION =
  "for each index, one 2×2 table per era: the phase that raised the odds of a high-fire year most in the fire-scar calibration (highest share of high-fire years) against the other phases, by high-fire year or not; the fire-scar era is the calibration years that are not modern years (so no year counts twice), the modern era the modern years with a value of the index, each era with its own high-fire years; the tables are tested for a common odds ratio by the Breslow–Day test with Tarone's correction";

/** The rule behind "the same / weaker / stronger" (stated in the JSON). */
export const DIRECTION_RULE = `the modern odds ratio against the fire-scar one (Woolf, +0.5 to every cell of a table with a zero): "the same" within a factor of ${SAME_LINK_FACTOR} either way, "weaker" below that, "stronger" above; the test can tell only when its p-value is at most 0.05 and the modern record has at least ${MIN_MODERN_FIRE_YEARS} high-fire years`;

export interface ModernEraInput {
  /** The rows of modern-fires.csv, or null when the region has no modern record. */
  readonly rows: readonly ModernFireRow[] | null;
  readonly measure: "area" | "fires";
  /** Share of years that are high-fire years (the fire-scar record's `fireYears.top`). */
  readonly top: number;
  readonly indexValues: IndexValues;
  /** Each index's phase definition (cuts of the fire-scar calibration) and fire-scar odds by phase. */
  readonly indices: readonly { readonly name: string; readonly definition: PhaseDefinition; readonly phases: readonly PhaseOdds[] }[];
  readonly calibrationYears: readonly number[];
  /** Fire-scar high-fire years among the calibration years. */
  readonly fireScarFireYears: ReadonlySet<number>;
  readonly interval: "wilson" | "jeffreys";
}

export type ModernEraResult = { readonly modern: ModernEra; readonly reason?: undefined } | { readonly modern: null; readonly reason: string };

/**
 * The modern (agency) fire record as a second era beside the fire-scar calibration: does the link
 * between an index and high-fire years hold in the modern record?
 *
 * Modern years are the rows of modern-fires.csv with a value of the chosen measure (area burned by
 * default, or number of fires) and a value of at least one index. Modern high-fire years follow the
 * fire-scar rule (selectFireYears): the `top` share, threshold = the ceil(top × N)-th highest value, ties
 * all in, only values > 0. Each index's modern years are put in phases with the SAME cuts as the
 * fire-scar calibration, and the odds of a high-fire year per phase get the calibration's interval
 * (Wilson or Jeffreys). The two eras are compared by the Breslow–Day test of a common odds ratio with
 * Tarone's correction on one 2×2 table per era ({@link HOMOGENEITY_DEFINITION}), and a plain sentence
 * says whether the link looks the same, weaker or stronger ({@link DIRECTION_RULE}). What a high-fire year
 * means in modern units: median and range of area burned and of fires in modern high-fire years and in
 * the other modern years. Years in both records: how often both call a year a high-fire year, with
 * Cohen's kappa.
 *
 * @param input - the modern rows, measure, share, index values and the fire-scar calibration it is compared with
 * @returns the modern era; `modern: null` with a reason when there is no modern record or fewer than
 *   {@link MIN_MODERN_YEARS} usable modern years. A homogeneity test that cannot be computed (no
 *   fire-scar or modern years in one of the tables, fewer than two phases with years) has null numbers and a reason.
 * @throws RangeError for a programming error (an index without a definition)
 * @example
 * modernEra({ rows, measure: "area", top: 0.1, indexValues, indices, calibrationYears, fireScarFireYears, interval: "wilson" });
 * // => { modern: { measure: "area", period: { first: 1950, last: 2026, years: 77 }, threshold, fireYears, indices: [...] } }
 * @see Breslow N.E., Day N.E. (1980) Statistical Methods in Cancer Research, Volume I: The Analysis of
 *   Case-Control Studies, IARC Scientific Publications No. 32, Lyon, §4.4 (the test of homogeneity of odds ratios).
 * @see Tarone R.E. (1985) "On heterogeneity tests based on efficient scores", Biometrika 72(1):91–95 (the correction).
 * @see Woolf B. (1955) "On estimating the relation between blood group and disease", Annals of Human Genetics 19:251–253.
 * @see Cohen J. (1960) "A coefficient of agreement for nominal scales", Educational and Psychological Measurement 20(1):37–46.
 */
export function modernEra(input: ModernEraInput): ModernEraResult {
  if (input.rows === null) return { modern: null, reason: "this region has no modern fire record (fireRecord.modern in region.json)" };
  const measureOf = (row: ModernFireRow): number | null => (input.measure === "area" ? row.areaHa : row.fires);
  const anyIndex = (year: number): boolean => input.indices.some((index) => input.indexValues.get(index.name)?.has(year) === true);
  const usable = input.rows.filter((row) => measureOf(row) !== null && anyIndex(row.year)).sort((a, b) => a.year - b.year);
  const measureWords = input.measure === "area" ? "area burned" : "number of fires";
  if (usable.length < MIN_MODERN_YEARS) {
    return {
      modern: null,
      reason: `only ${usable.length} modern year(s) have a value of the ${measureWords} and of an index; at least ${MIN_MODERN_YEARS} are needed`,
    };
  }
  const years = usable.map((row) => row.year);
  const activity = new Map(usable.map((row) => [row.year, measureOf(row) as number]));
  // selectFireYears records a measure name; the modern measure is not one of the fire-scar measures, so the
  // recorded name is not used (the era's own `measure` says what the numbers are).
  const selection = selectFireYears(activity, years, input.top, "sites");
  const fireSet = new Set(selection.years);
  const warnings: { code: string; message: string }[] = [];
  if (selection.years.length < MIN_MODERN_FIRE_YEARS) {
    warnings.push({
      code: "few-modern-fire-years",
      message: `only ${selection.years.length} modern high-fire year(s): the modern odds are very uncertain and the two-era test cannot tell a difference`,
    });
  }
  if (selection.realisedShare > 2 * input.top) {
    warnings.push({
      code: "many-tied-modern-fire-years",
      message: `${selection.years.length} of ${years.length} modern years tie at or above the modern threshold (${Math.round(selection.realisedShare * 100)}%, asked for the top ${Math.round(input.top * 100)}%)`,
    });
  }

  const perIndex = input.indices.map((index) => {
    const values = input.indexValues.get(index.name) ?? new Map<number, number>();
    const modernYears = years.filter((year) => values.has(year));
    const counts = index.definition.labels.map(() => ({ years: 0, fireYears: 0 }));
    for (const year of modernYears) {
      const cell = counts[classifyPhase(values.get(year) as number, index.definition.cuts)];
      if (cell === undefined) continue;
      cell.years += 1;
      if (fireSet.has(year)) cell.fireYears += 1;
    }
    const phases = counts.map((cell, phase) => ({
      label: index.definition.labels[phase] ?? String(phase),
      years: cell.years,
      fireYears: cell.fireYears,
      probability: proportionEstimate(cell.fireYears, cell.years, input.interval),
    }));
    const testInput: TwoEraInput = {
      index: index.name,
      definition: index.definition,
      fireScarPhases: index.phases,
      values,
      fireScarYears: input.calibrationYears.filter((year) => values.has(year) && !modernYears.includes(year)),
      fireScarFireYears: input.fireScarFireYears,
      modernYears,
      modernFireYears: fireSet,
    };
    return { name: index.name, years: modernYears.length, phases, testInput, homogeneity: twoEraTest(testInput) };
  });
  // "The link differs" is said only by the q-value across the indices (Benjamini–Hochberg): one of k
  // indices reaches p ≤ 0.05 by chance about 1 − 0.95^k of the time.
  const eraQValues = benjaminiHochberg(perIndex.map((entry) => entry.homogeneity.pValue ?? NaN));
  const indices: ModernIndex[] = perIndex.map(({ testInput, ...entry }, position) => {
    const q = eraQValues[position];
    return { ...entry, homogeneity: twoEraTest({ ...testInput, qValue: q !== undefined && Number.isFinite(q) ? q : null }) };
  });

  const overlap = input.calibrationYears.filter((year) => activity.has(year));
  const agreementCounts = { both: 0, fireScarOnly: 0, modernOnly: 0, neither: 0 };
  for (const year of overlap) {
    const scar = input.fireScarFireYears.has(year);
    const modern = fireSet.has(year);
    if (scar && modern) agreementCounts.both += 1;
    else if (scar) agreementCounts.fireScarOnly += 1;
    else if (modern) agreementCounts.modernOnly += 1;
    else agreementCounts.neither += 1;
  }
  const agreement = agreementOfRecords(agreementCounts);

  const groups = (pick: (row: ModernFireRow) => number | null): { highFire: ModernSummary; other: ModernSummary } => ({
    highFire: summary(usable.filter((row) => fireSet.has(row.year)).map(pick)),
    other: summary(usable.filter((row) => !fireSet.has(row.year)).map(pick)),
  });

  return {
    modern: {
      measure: input.measure,
      period: { first: years[0] as number, last: years[years.length - 1] as number, years: years.length },
      years,
      top: input.top,
      threshold: selection.threshold,
      fireYears: selection.years,
      realisedShare: selection.realisedShare,
      baseRate: proportionEstimate(selection.years.length, years.length, input.interval),
      meaning: { areaHa: groups((row) => row.areaHa), fires: groups((row) => row.fires) },
      agreement: { years: overlap.length, ...agreementCounts, ...agreement },
      homogeneityDefinition: HOMOGENEITY_DEFINITION,
      indices,
      warnings,
    },
  };
}

interface TwoEraInput {
  readonly index: string;
  readonly definition: PhaseDefinition;
  readonly fireScarPhases: readonly PhaseOdds[];
  readonly values: ReadonlyMap<number, number>;
  readonly fireScarYears: readonly number[];
  readonly fireScarFireYears: ReadonlySet<number>;
  readonly modernYears: readonly number[];
  readonly modernFireYears: ReadonlySet<number>;
  /** Benjamini–Hochberg q of this test's p across the indices; the sentence says "differs" only when q ≤ 0.05. */
  readonly qValue?: number | null;
}

const TEST_NAME = "Breslow–Day test of a common odds ratio across the two eras, with Tarone's correction";

function twoEraTest(input: TwoEraInput): ModernHomogeneity {
  // The phase that raised the odds most in the fire-scar calibration: the highest share of high-fire years
  // among the phases with years (first in phase order on a tie).
  let best = -1;
  let bestEstimate = -Infinity;
  let withYears = 0;
  input.fireScarPhases.forEach((phase, position) => {
    if (phase.years === 0 || phase.probability.estimate === null) return;
    withYears += 1;
    if (phase.probability.estimate > bestEstimate) {
      bestEstimate = phase.probability.estimate;
      best = position;
    }
  });
  const label = best >= 0 ? (input.definition.labels[best] ?? String(best)) : "";
  const empty = (reason: string, tables = { fireScar: [] as number[][], modern: [] as number[][] }): ModernHomogeneity => ({
    test: TEST_NAME,
    phase: label,
    tables,
    statistic: null,
    df: 1,
    pValue: null,
    commonOddsRatio: null,
    fireScarOddsRatio: null,
    modernOddsRatio: null,
    direction: null,
    directionRule: DIRECTION_RULE,
    canTell: false,
    sentence: `The two-era test of ${input.index} cannot be computed: ${reason}.`,
    reason,
  });
  if (withYears < 2) return empty("fewer than two of its phases have fire-scar calibration years");
  const tableOf = (years: readonly number[], fire: ReadonlySet<number>): [[number, number], [number, number]] => {
    const table: [[number, number], [number, number]] = [
      [0, 0],
      [0, 0],
    ];
    for (const year of years) {
      const inPhase = classifyPhase(input.values.get(year) as number, input.definition.cuts) === best;
      const row = table[inPhase ? 0 : 1];
      row[fire.has(year) ? 0 : 1] += 1;
    }
    return table;
  };
  const fireScar = tableOf(input.fireScarYears, input.fireScarFireYears);
  const modern = tableOf(input.modernYears, input.modernFireYears);
  const tables = { fireScar, modern };
  const emptyRowOrColumn = (table: readonly (readonly number[])[]): boolean => {
    const [[a, b], [c, d]] = table as [[number, number], [number, number]];
    return a + b === 0 || c + d === 0 || a + c === 0 || b + d === 0;
  };
  if (input.modernYears.length === 0) return empty("no modern year has a value of this index", tables);
  if (input.fireScarYears.length === 0) return empty("every fire-scar calibration year is also a modern year, so the fire-scar era has no years of its own", tables);
  if (emptyRowOrColumn(fireScar)) return empty(`the fire-scar table has an empty row or column (no years in ${label} or in the other phases, or no high-fire or no other years)`, tables);
  if (emptyRowOrColumn(modern)) return empty(`the modern table has an empty row or column (no modern years in ${label} or in the other phases, or no modern high-fire or no other years)`, tables);
  const fireScarOddsRatio = oddsRatioWoolf(fireScar).oddsRatio;
  const modernOddsRatio = oddsRatioWoolf(modern).oddsRatio;
  const test = breslowDayTest([fireScar, modern], { tarone: true });
  const pValue = Number.isFinite(test.pValue) ? test.pValue : null;
  const ratio = modernOddsRatio / fireScarOddsRatio;
  const direction: "same" | "weaker" | "stronger" | null = !Number.isFinite(ratio)
    ? null
    : ratio < 1 / SAME_LINK_FACTOR
      ? "weaker"
      : ratio > SAME_LINK_FACTOR
        ? "stronger"
        : "same";
  const modernFire = modern[0][0] + modern[1][0];
  const qValue = input.qValue === undefined ? pValue : input.qValue;
  const canTell = qValue !== null && qValue <= 0.05 && modernFire >= MIN_MODERN_FIRE_YEARS;
  const n = input.modernYears.length;
  const looks = direction === "same" ? "the same" : (direction ?? "different");
  const ratios = `odds ratio ${formatRatio(modernOddsRatio)} in the modern record against ${formatRatio(fireScarOddsRatio)} in the fire-scar record`;
  const pWords =
    pValue === null
      ? `the test could not be computed${test.reason === undefined ? "" : ` (${test.reason})`}`
      : `Breslow–Day p = ${formatP(pValue)}${input.qValue === undefined || input.qValue === null ? "" : `, q = ${formatP(input.qValue)} across indices`}`;
  let sentence: string;
  if (canTell) {
    sentence =
      direction === "same"
        ? `The ${input.index} ${label} association with high-fire years differs between the two records although the odds ratios are close (${ratios}; ${pWords}).`
        : `The ${input.index} ${label} association with high-fire years looks ${looks} in the modern record (${ratios}; ${pWords}).`;
  } else {
    const why =
      modernFire < MIN_MODERN_FIRE_YEARS
        ? `${n} modern years with only ${modernFire} high-fire year(s) cannot tell`
        : `${n} modern years cannot tell`;
    sentence =
      direction === "same"
        ? `The ${input.index} ${label} association with high-fire years shows no clear change in the modern record, but ${why} whether it has changed a little (${ratios}; ${pWords}).`
        : `The ${input.index} ${label} association with high-fire years looks ${looks} in the modern record, but ${why} this from chance (${ratios}; ${pWords}).`;
  }
  return {
    test: TEST_NAME,
    phase: label,
    tables,
    statistic: Number.isFinite(test.statistic) ? test.statistic : null,
    df: test.df,
    pValue,
    ...(input.qValue === undefined ? {} : { qValue: input.qValue }),
    commonOddsRatio: Number.isFinite(test.commonOddsRatio) ? test.commonOddsRatio : null,
    fireScarOddsRatio: Number.isFinite(fireScarOddsRatio) ? fireScarOddsRatio : null,
    modernOddsRatio: Number.isFinite(modernOddsRatio) ? modernOddsRatio : null,
    direction,
    directionRule: DIRECTION_RULE,
    canTell,
    sentence,
    ...(pValue === null ? { reason: test.reason ?? "the Breslow–Day statistic is not defined for these tables" } : {}),
  };
}

function summary(values: readonly (number | null)[]): ModernSummary {
  const present = values.filter((value): value is number => value !== null).sort((a, b) => a - b);
  if (present.length === 0) return { years: 0, median: null, min: null, max: null, reason: "no years with a value in this group" };
  return { years: present.length, median: quantileSorted(present, 0.5), min: present[0] as number, max: present[present.length - 1] as number };
}

function formatRatio(value: number): string {
  if (!Number.isFinite(value)) return "not computable";
  return value >= 10 ? value.toFixed(0) : value.toFixed(1);
}

function formatP(p: number): string {
  return p < 0.001 ? "< 0.001" : p.toFixed(p < 0.01 ? 3 : 2);
}
