import { classifyPhase, isNearBoundary } from "../climate/phaseDefinition.js";
import { valuesByYear } from "../calibrate/activityByYear.js";
import { buildTrainingSet, type IndexValues } from "../calibrate/buildTrainingSet.js";
import { forecastCell } from "../calibrate/forecastCell.js";
import { proportionEstimate } from "../calibrate/proportionEstimate.js";
import type { AssociationRank } from "../calibrate/rankIndicesByAssociation.js";
import type { Calibration } from "../calibrate/types.js";
import { runHindcast } from "../hindcast/runHindcast.js";
import type { Workspace } from "../workspace/types.js";
import { analogYears } from "./analogYears.js";
import { comparedWithBase, formatPercent, formatPercentRange } from "./describeChance.js";
import type { AnalogYear, CurrentPhase, Outlook } from "./types.js";

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
  const { settings } = workspace;
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
    const value = request.values[index.name];
    if (value === undefined) {
      missing.push(index.name);
      continue;
    }
    const phase = classifyPhase(value, index.definition.cuts);
    const z = index.sd > 0 ? (value - index.mean) / index.sd : NaN;
    if (Number.isFinite(z) && Math.abs(z) > 5) {
      warnings.push({
        code: "value-far-outside",
        message: `${index.name} = ${value} is ${Math.abs(z).toFixed(1)} standard deviations from its calibration mean: check the value; no past year is like it`,
      });
    }
    current.push({
      index: index.name,
      value,
      label: index.definition.labels[phase] ?? String(phase),
      nearBoundary: isNearBoundary(value, index.definition.cuts, settings.methods.nearBoundaryMargin),
      z: Number.isFinite(z) ? z : null,
      source: request.sources?.[index.name] ?? "given",
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
    if (!isNearBoundary(value, cuts, settings.methods.nearBoundaryMargin)) return;
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
      message: `${name} (${value}) is within ${settings.methods.nearBoundaryMargin} of its ${nearest.toFixed(2)} phase boundary: had it been ${labelOf(name, otherPhase)}, the chance would be ${probabilityWords(alternative.fireYears, alternative.years.length)}`,
    });
  });
  const n = cell.years.length;
  const fireYear = {
    ...proportionEstimate(cell.fireYears, n, method),
    basis,
    basisIndices: cell.indices,
    years: n,
    fireYears: cell.fireYears,
  };
  const fireYearWithComparison = { ...fireYear, comparedWithBase: comparedWithBase(fireYear, calibration.baseRate) };
  if (n > 0 && n < settings.methods.smallSampleYears) {
    warnings.push({ code: "small-basis", message: `the odds rest on only ${n} past years: treat them as rough` });
  }
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
    const values: Record<string, number> = {};
    for (const name of currentValue.keys()) values[name] = indexValues.get(name)?.get(year) as number;
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

  const computedSkill = runHindcast({
    years: calibration.years,
    activity: calibration.activity,
    indexValues,
    indexSettings: settings.indices,
    indices: [...currentPhase.keys()],
    top: settings.fireYears.top,
    measure: settings.fireYears.measure,
    exclusion: settings.methods.hindcastExclusion,
    jointMinYears: settings.methods.jointMinYears,
    jointMaxQ: settings.methods.jointMaxQ,
  });
  const hindcast =
    currentPhase.size === 0
      ? {
          ...computedSkill,
          verdict:
            "No current index values were given, so these are the long-term average odds; a skill score does not apply to them.",
        }
      : computedSkill;

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
    hindcast,
    warnings,
  };
}
