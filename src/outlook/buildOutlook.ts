import { classifyPhase, isNearBoundary } from "../climate/phaseDefinition.js";
import { valuesByYear } from "../calibrate/activityByYear.js";
import { buildTrainingSet, type IndexValues } from "../calibrate/buildTrainingSet.js";
import { curveForecast } from "../calibrate/curveForecast.js";
import { forecastCell } from "../calibrate/forecastCell.js";
import { proportionEstimate } from "../calibrate/proportionEstimate.js";
import type { AssociationRank } from "../calibrate/rankIndicesByAssociation.js";
import type { Calibration } from "../calibrate/types.js";
import { runHindcast, type HindcastInput } from "../hindcast/runHindcast.js";
import type { Skill } from "../hindcast/types.js";
import type { IndexSettings, Workspace } from "../workspace/types.js";
import { analogYears } from "./analogYears.js";
import { comparedWithBase, formatPercent, formatPercentRange } from "./describeChance.js";
import { selectionAwareInterval, selectionNote } from "./selectionAwareInterval.js";
import { formatValue, strengthNote } from "./strengthNote.js";
import type { AnalogYear, CurrentPhase, CurveOdds, Outlook } from "./types.js";

export interface OutlookRequest {
  /** Current seasonal value per index name (only known index names; validated by the caller). */
  readonly values: Readonly<Record<string, number>>;
  /** Issue date, YYYY-MM-DD. */
  readonly issued: string;
  readonly season: number;
  /** Where each value came from (shown beside it); absent entries are reported as "given". */
  readonly sources?: Readonly<Record<string, string>>;
  /**
   * How each value was obtained when it was computed from an index file (or given): its source in
   * words, the season window, the months used and whether the window was incomplete (provisional).
   * Absent entries are values given as plain numbers.
   */
  readonly details?: Readonly<Record<string, OutlookValueDetail>>;
  /** Notes about the request itself (e.g. values written for another season), printed as warnings. */
  readonly notes?: readonly { readonly code: string; readonly message: string }[];
}

/** How one current value was obtained (C6 contract; filled by the CLI from the index file). */
export interface OutlookValueDetail {
  readonly source: string;
  readonly window: string | null;
  readonly months: readonly string[];
  readonly provisional: boolean;
}

/**
 * The current-season outlook: the phase of each current index value, the chance of a fire year
 * and of below/near/above-normal activity read from the calibration years that shared this
 * season's phases (joint phase of the two most strongly associated indices when that cell has at
 * least `jointMinYears` years, else the strongest single index), the base rate beside it, analog
 * years, and the cross-validated hindcast skill of the same method.
 */
export function buildOutlook(workspace: Workspace, calibration: Calibration, request: OutlookRequest): Outlook {
  return attachHindcast(buildOutlookWithoutHindcast(workspace, calibration, request), runHindcast(outlookHindcastInput(workspace, calibration, request)));
}

/** An outlook before its hindcast is attached (see {@link attachHindcast}). */
export type OutlookWithoutHindcast = Omit<Outlook, "hindcast">;

/** The region's indices (in region.json's order, as the calibration lists them) with a finite value this season. */
function indicesWithValues(workspace: Workspace, request: OutlookRequest): string[] {
  return workspace.settings.indices
    .filter((index) => {
      const given = Object.hasOwn(request.values, index.name) ? request.values[index.name] : undefined;
      return given !== undefined && Number.isFinite(given);
    })
    .map((index) => index.name);
}

/**
 * The input of the outlook's cross-validated hindcast (runHindcast): the calibration years and records, the
 * indices with a current value, and the methods' settings and seed. It depends on nothing else of the outlook,
 * and of the calibration only on its years and their activity (which calibrationBasis gives before the rest is
 * calibrated), so the hindcast can run beside the rest (other threads) and be joined by {@link attachHindcast}.
 */
export function outlookHindcastInput(
  workspace: Workspace,
  calibration: Pick<Calibration, "years" | "activity">,
  request: OutlookRequest,
): HindcastInput {
  const { settings } = workspace;
  return {
    years: calibration.years,
    activity: calibration.activity,
    indexValues: new Map(workspace.indices.map((series) => [series.name, valuesByYear(series)])),
    indexSettings: settings.indices,
    indices: indicesWithValues(workspace, request),
    top: settings.fireYears.top,
    measure: settings.fireYears.measure,
    exclusion: settings.methods.hindcastExclusion,
    jointMinYears: settings.methods.jointMinYears,
    jointMaxQ: settings.methods.jointMaxQ,
    // The permutation test, bootstrap intervals and the rule the outlook issues (methods settings and seed).
    seed: settings.seed,
    permutations: settings.methods.permutations,
    blockYears: settings.methods.blockYears,
    bootstrapResamples: settings.methods.bootstrapResamples,
    response: settings.methods.response === "curve" ? "curve" : "phase",
  };
}

/**
 * Joins an outlook and the hindcast of {@link outlookHindcastInput}: the hindcast verifies the rule the outlook
 * issued — with the curve headline, the curve rule's scores and verdict lead and the phase rule's stand beside
 * them (and the other way round); with no current value it says a skill score does not apply.
 */
export function attachHindcast(outlook: OutlookWithoutHindcast, computedSkill: Skill): Outlook {
  const curveHeadline = outlook.fireYear.response === "curve";
  const { curveRule, ...phaseRuleSkill } = computedSkill;
  const issuedSkill: Skill =
    curveHeadline && curveRule !== null && curveRule !== undefined
      ? { ...curveRule, issuedRule: "curve", phaseRule: phaseRuleSkill, curveRule: null, curveRuleReason: "this is the curve rule; the phase rule is under phaseRule" }
      : { ...computedSkill, issuedRule: "phase" };
  const hindcast =
    outlook.current.length === 0
      ? {
          ...issuedSkill,
          verdict:
            "No current index values were given, so these are the long-term average odds; a skill score does not apply to them.",
        }
      : issuedSkill;
  const { warnings, ...before } = outlook;
  return { ...before, hindcast, warnings };
}

/** Everything of {@link buildOutlook} but the hindcast (see {@link attachHindcast}). */
export function buildOutlookWithoutHindcast(workspace: Workspace, calibration: Calibration, request: OutlookRequest): OutlookWithoutHindcast {
  const { settings } = workspace;
  // The near-boundary margin is a share of the index's standard deviation (methods.nearBoundarySd, default 0.1).
  const nearBoundarySd = Number.isFinite(settings.methods.nearBoundarySd) ? settings.methods.nearBoundarySd : 0.1;
  const nearBoundaryMargin = (sd: number): number => (Number.isFinite(sd) && sd > 0 ? nearBoundarySd * sd : 0);
  const method = calibration.interval;
  const indexValues: IndexValues = new Map(workspace.indices.map((series) => [series.name, valuesByYear(series)]));
  const training = buildTrainingSet({
    years: calibration.years,
    activity: calibration.activity,
    indexValues,
    indexSettings: settings.indices,
    top: settings.fireYears.top,
    measure: settings.fireYears.measure,
  });
  const warnings: { code: string; message: string }[] = [...(request.notes ?? [])];
  const current: CurrentPhase[] = [];
  const missing: string[] = [];
  const currentPhase = new Map<string, number>();
  const currentValue = new Map<string, number>();
  for (const index of calibration.indices) {
    // Own properties only: an index named like a built-in object property ("constructor") must not
    // read an inherited value.
    const given = Object.hasOwn(request.values, index.name) ? request.values[index.name] : undefined;
    if (given === undefined || !Number.isFinite(given)) {
      missing.push(index.name);
      continue;
    }
    const value = given;
    const phase = classifyPhase(value, index.definition.cuts);
    const z = index.sd > 0 ? (value - index.mean) / index.sd : NaN;
    if (Number.isFinite(z) && Math.abs(z) > 5) {
      warnings.push({
        code: "value-far-outside",
        message: `${index.name} = ${value} is ${Math.abs(z).toFixed(1)} standard deviations from its calibration mean: check the value; no past year is like it`,
      });
    }
    const detail = request.details !== undefined && Object.hasOwn(request.details, index.name) ? request.details[index.name] : undefined;
    const source =
      detail?.source ?? (request.sources !== undefined && Object.hasOwn(request.sources, index.name) ? request.sources[index.name] : undefined) ?? "given";
    const provisional = detail?.provisional ?? false;
    const months = detail?.months ?? [];
    const window = detail?.window ?? indexWindow(settings.indices, index.name);
    if (provisional) {
      warnings.push({
        code: "value-provisional",
        message: `${index.name} = ${formatValue(value)} is provisional: computed from ${months.length === 0 ? "part" : monthSpan(months)} of its ${window ?? "season"} window, which is not complete yet; the odds may change when it is`,
      });
    }
    const margin = nearBoundaryMargin(index.sd);
    current.push({
      index: index.name,
      value,
      label: index.definition.labels[phase] ?? String(phase),
      nearBoundary: isNearBoundary(value, index.definition.cuts, margin),
      z: Number.isFinite(z) ? z : null,
      ...(Number.isFinite(z) ? {} : { zReason: "the index has no spread over the calibration years (standard deviation 0 or undefined), so no z-score" }),
      source,
      provisional,
      months,
      window,
      nearBoundaryMargin: margin,
    });
    currentPhase.set(index.name, phase);
    currentValue.set(index.name, value);
  }
  if (missing.length > 0) {
    warnings.push({ code: "index-without-value", message: `no current value for ${missing.join(", ")}: left out of this outlook` });
  }

  const ranking: AssociationRank[] = calibration.indices
    .map((index) => ({
      index: index.name,
      chiSquare: index.contingency.chiSquare ?? NaN,
      pValue: index.contingency.pValue ?? NaN,
      qValue: index.contingency.qValue ?? NaN,
    }))
    .sort((a, b) => {
      const pa = Number.isNaN(a.pValue) ? Infinity : a.pValue;
      const pb = Number.isNaN(b.pValue) ? Infinity : b.pValue;
      return pa - pb || (a.index < b.index ? -1 : a.index > b.index ? 1 : 0);
    });
  const { jointMinYears, jointMaxQ } = settings.methods;
  const cell = forecastCell(training, currentPhase, ranking, jointMinYears, jointMaxQ);
  const labelOf = (index: string, phase: number): string =>
    calibration.indices.find((candidate) => candidate.name === index)?.definition.labels[phase] ?? String(phase);
  const cellWords = cell.indices.map((index, i) => `${index} ${labelOf(index, cell.phases[i] as number)}`).join(" and ");
  const ranked = ranking.filter((rank) => currentPhase.has(rank.index));
  const qText = (q: number): string => (Number.isFinite(q) ? q.toPrecision(2) : "not computable");
  const rankOf = (index: string): AssociationRank | undefined => ranking.find((rank) => rank.index === index);
  const isClear = (rank: AssociationRank | undefined): boolean => rank !== undefined && Number.isFinite(rank.qValue) && rank.qValue <= jointMaxQ;
  const used = cell.indices[0] === undefined ? undefined : rankOf(cell.indices[0]);
  // Why a single index was used, said about the index actually used and the next one in rank order.
  let singleReason = "";
  if (cell.basis === "single" && used !== undefined) {
    const skipped = ranked.slice(0, ranked.findIndex((rank) => rank.index === used.index));
    const next = ranked.find((rank) => rank.index !== used.index && !skipped.includes(rank));
    if (skipped.length > 0) {
      singleReason = `; no past year shared this season's phase of ${skipped.map((rank) => rank.index).join(" or ")}`;
    } else if (next !== undefined && isClear(used)) {
      singleReason = !isClear(next)
        ? `; ${next.index} is not combined with it because its link is not clear, q = ${qText(next.qValue)}`
        : `; the joint phase with ${next.index} had fewer than ${jointMinYears} years`;
    }
  }
  const basis =
    cell.basis === "joint"
      ? `the ${cell.years.length} calibration years when ${cellWords} (the two indices with the strongest measured link to high-fire years in the calibration, by chi-square p, both with a clear link, q at most ${jointMaxQ})`
      : cell.basis === "single"
        ? `the ${cell.years.length} calibration years when ${cellWords} (` +
          (used !== undefined && used.index === ranked[0]?.index
            ? "the index with the strongest measured link to high-fire years in the calibration, by chi-square p"
            : "the most strongly linked index with past years in its current phase") +
          `${singleReason})`
        : currentPhase.size === 0
          ? `all ${cell.years.length} calibration years (no current index value was given, so this is the long-term average)`
          : `all ${cell.years.length} calibration years (no past year shared this season's phases, so this is the long-term average)`;
  // Honesty notes on the basis: the index behind the odds without a clear link, and an index whose
  // value sits near a phase boundary, with the odds the outlook would give on the other side.
  const probabilityWords = (k: number, n: number): string => {
    const estimate = proportionEstimate(k, n, method);
    return `${formatPercent(estimate.estimate)} (95% interval ${formatPercentRange(estimate.lower, estimate.upper)}, ${n} years)`;
  };
  if (cell.basis === "single" && used !== undefined && !isClear(used)) {
    warnings.push({
      code: "no-clear-link",
      message: `the odds rest on ${used.index}, whose link to high-fire years is not clear in this record (chi-square q = ${qText(used.qValue)}): they may be no better than the average year's`,
    });
  }
  cell.indices.forEach((name) => {
    const calibrated = calibration.indices.find((index) => index.name === name);
    if (calibrated === undefined) return;
    const value = currentValue.get(name) as number;
    const cuts = calibrated.definition.cuts;
    const margin = nearBoundaryMargin(calibrated.sd);
    if (!isNearBoundary(value, cuts, margin)) return;
    const nearest = cuts.reduce((best, cut) => (Math.abs(cut - value) < Math.abs(best - value) ? cut : best), cuts[0] as number);
    const phase = currentPhase.get(name) as number;
    const step = 1e-9 * Math.max(1, Math.abs(nearest));
    const otherPhase = [nearest - step, nearest, nearest + step]
      .map((candidate) => classifyPhase(candidate, cuts))
      .find((candidate) => candidate !== phase) ?? phase;
    if (otherPhase < 0 || otherPhase >= calibrated.definition.labels.length || otherPhase === phase) return;
    // The odds the outlook itself would give with this index on the other side of the boundary.
    const shifted = new Map(currentPhase);
    shifted.set(name, otherPhase);
    const alternative = forecastCell(training, shifted, ranking, jointMinYears, jointMaxQ);
    warnings.push({
      code: "basis-near-boundary",
      message: `${name} (${formatValue(value)}) is within ${formatMargin(margin)} (${nearBoundarySd} of its standard deviation) of its ${nearest.toFixed(2)} phase boundary: had it been ${labelOf(name, otherPhase)}, the chance would be ${probabilityWords(alternative.fireYears, alternative.years.length)}`,
    });
  });
  const n = cell.years.length;
  const phaseOdds = {
    ...proportionEstimate(cell.fireYears, n, method),
    basis,
    basisIndices: cell.indices,
    years: n,
    fireYears: cell.fireYears,
  };
  if (n > 0 && n < settings.methods.smallSampleYears) {
    warnings.push({ code: "small-basis", message: `the odds rest on only ${n} past years: treat them as rough` });
  }

  // The curve rule: the response curve of the index the phase rule selects, read at this season's value.
  const response: "phase" | "curve" = settings.methods.response === "curve" ? "curve" : "phase";
  const curveResult = curveForecast(training, indexValues, cell, currentValue);
  const curveOdds: CurveOdds | null =
    curveResult.forecast === null
      ? null
      : {
          index: curveResult.forecast.index,
          value: curveResult.forecast.reading.value,
          readAt: curveResult.forecast.reading.readAt,
          beyondRange: curveResult.forecast.reading.beyondRange,
          estimate: curveResult.forecast.reading.estimate,
          lower: curveResult.forecast.reading.lower,
          upper: curveResult.forecast.reading.upper,
          form: curveResult.forecast.reading.form,
          band: curveResult.forecast.curve.band,
          range: curveResult.forecast.curve.range,
          years: curveResult.forecast.curve.years,
          fireYears: curveResult.forecast.curve.fireYears,
        };
  if (curveOdds !== null && curveOdds.beyondRange !== null) {
    const side = curveOdds.beyondRange === "above" ? "above the largest" : "below the smallest";
    warnings.push({
      code: "curve-beyond-range",
      message: `${curveOdds.index} = ${formatValue(curveOdds.value)} is ${side} calibration value (${formatValue(curveOdds.readAt)}): the response curve is read at ${formatValue(curveOdds.readAt)}, not beyond the record`,
    });
  }
  const curveHeadline = response === "curve" && curveOdds !== null;
  if (response === "curve" && curveOdds === null) {
    warnings.push({
      code: "curve-not-available",
      message: `the response curve could not be read (${curveResult.reason ?? "no curve"}), so the headline odds come from the phases`,
    });
  }
  const curveBasis =
    curveOdds === null
      ? ""
      : `the ${curveOdds.index} response curve read at ${formatValue(curveOdds.readAt)}${curveOdds.beyondRange === null ? "" : ` (this season's ${formatValue(curveOdds.value)} is beyond the calibration range)`}, a logistic regression of high-fire year on ${curveOdds.index} over ${curveOdds.years} calibration years; ${curveOdds.index} is the index the phase rule uses, whose odds come from ${basis}`;
  const headlineEstimate = curveHeadline && curveOdds !== null
    ? { estimate: curveOdds.estimate, lower: curveOdds.lower, upper: curveOdds.upper }
    : proportionEstimate(cell.fireYears, n, method);
  const fireYear = {
    ...headlineEstimate,
    basis: curveHeadline ? curveBasis : basis,
    basisIndices: curveHeadline && curveOdds !== null ? [curveOdds.index] : cell.indices,
    years: curveHeadline && curveOdds !== null ? curveOdds.years : n,
    fireYears: curveHeadline && curveOdds !== null ? curveOdds.fireYears : cell.fireYears,
  };

  // Selection-aware interval: the whole rule bootstrapped in blocks of years (event definition fixed).
  const selection = selectionAwareInterval({
    years: calibration.years,
    indexValues,
    indexSettings: settings.indices,
    isFireYear: training.isFireYear,
    current: currentValue,
    jointMinYears,
    jointMaxQ,
    response: curveHeadline ? "curve" : "phase",
    blockYears: settings.methods.blockYears,
    resamples: Number.isInteger(settings.methods.bootstrapResamples) && settings.methods.bootstrapResamples > 0 ? settings.methods.bootstrapResamples : 999,
    seed: settings.seed,
  });
  // With no current value there is no choice of index to allow for, so no sentence.
  const note = currentPhase.size === 0 ? null : selectionNote(fireYear, selection.interval, formatPercentRange);
  const strength = curveOdds === null ? null : strengthNote(curveOdds, calibration, training, indexValues, currentPhase, jointMaxQ);
  const fireYearWithComparison = {
    ...fireYear,
    // Compared by the wider, selection-aware interval when there is one: it allows for the rule's
    // choice of index, which the cell's own interval does not (the chance audit's point).
    comparedWithBase: comparedWithBase(selection.interval === null ? fireYear : { estimate: fireYear.estimate, ...widest(fireYear, selection.interval) }, calibration.baseRate),
    comparedUsing: selection.interval === null ? ("interval" as const) : ("selection-aware interval" as const),
    response: curveHeadline ? ("curve" as const) : ("phase" as const),
    phaseOdds,
    curveOdds,
    ...(curveOdds === null ? { curveOddsReason: curveResult.reason ?? "no curve" } : {}),
    selectionInterval: selection.interval,
    ...(selection.interval === null ? { selectionIntervalReason: selection.reason } : {}),
    selectionNote: note,
    strengthNote: strength,
  };
  const categories = {
    below: proportionEstimate(cell.categories.below, n, method),
    near: proportionEstimate(cell.categories.near, n, method),
    above: proportionEstimate(cell.categories.above, n, method),
  };
  const perIndex = current.map((phase) => {
    const calibrated = calibration.indices.find((index) => index.name === phase.index);
    const odds = calibrated?.phases.find((candidate) => candidate.label === phase.label);
    return {
      index: phase.index,
      label: phase.label,
      probability: odds?.probability ?? { estimate: null, lower: null, upper: null, reason: "no calibration years in this phase" },
      years: odds?.years ?? 0,
      fireYears: odds?.fireYears ?? 0,
    };
  });

  const moments = new Map(calibration.indices.map((index) => [index.name, { mean: index.mean, sd: index.sd }]));
  const candidates = calibration.years.map((year) => ({
    year,
    values: new Map(
      [...indexValues].flatMap(([name, values]) => (values.has(year) ? [[name, values.get(year) as number] as const] : [])),
    ),
  }));
  const nearest = analogYears(currentValue, moments, candidates, settings.methods.analogs);
  const fireSet = new Set(calibration.fireYears.years);
  const analogs: AnalogYear[] = nearest.map(({ year, distance }) => {
    // Own properties only (Object.fromEntries), whatever the index names are.
    const values: Record<string, number> = Object.fromEntries(
      [...currentValue.keys()].map((name) => [name, indexValues.get(name)?.get(year) as number]),
    );
    return {
      year,
      distance,
      fireYear: fireSet.has(year),
      activity: calibration.activity.get(year) as number,
      category: calibration.categories.byYear.get(year) ?? "below",
      values,
    };
  });
  const analogFireShare = proportionEstimate(analogs.filter((analog) => analog.fireYear).length, analogs.length, method);

  return {
    issued: request.issued,
    season: request.season,
    region: settings.name,
    baseRate: calibration.baseRate,
    current,
    missing,
    fireYear: fireYearWithComparison,
    perIndex,
    categories,
    analogs,
    analogFireShare,
    warnings,
  };
}

/** The season window of an index ("Dec-Mar"), or null for a yearly file. */
function indexWindow(indices: readonly IndexSettings[], name: string): string | null {
  return indices.find((index) => index.name === name)?.months ?? null;
}

/** A margin in index units, to two significant digits. */
function formatMargin(margin: number): string {
  return Number(margin.toPrecision(2)).toString();
}

const MONTH_NAMES = ["Jan", "Feb", "Mar", "Apr", "May", "Jun", "Jul", "Aug", "Sep", "Oct", "Nov", "Dec"] as const;

/** "2026-12", "2027-01", "2027-02" → "Dec 2026–Feb 2027" (first and last of the months used, in words). */
function monthSpan(months: readonly string[]): string {
  const label = (text: string): string => {
    const [year, month] = text.split("-");
    return `${MONTH_NAMES[Number(month) - 1] ?? month} ${year}`;
  };
  const first = months[0] as string;
  const last = months[months.length - 1] as string;
  return first === last ? label(first) : `${label(first)}–${label(last)}`;
}

/** The union of two intervals (the wider reach on each side), for a cautious comparison. */
function widest(
  a: { readonly lower: number | null; readonly upper: number | null },
  b: { readonly lower: number | null; readonly upper: number | null },
): { lower: number | null; upper: number | null } {
  const pick = (x: number | null, y: number | null, choose: (u: number, v: number) => number): number | null =>
    x === null ? y : y === null ? x : choose(x, y);
  return { lower: pick(a.lower, b.lower, Math.min), upper: pick(a.upper, b.upper, Math.max) };
}
