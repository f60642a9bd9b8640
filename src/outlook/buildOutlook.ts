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
import type { AnalogYear, CurrentPhase, Outlook } from "./types.js";

export interface OutlookRequest {
  /** Current seasonal value per index name (only known index names; validated by the caller). */
  readonly values: Readonly<Record<string, number>>;
  /** Issue date, YYYY-MM-DD. */
  readonly issued: string;
  readonly season: number;
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
  const warnings: { code: string; message: string }[] = [];
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
      z: Number.isFinite(z) ? z : 0,
    });
    currentPhase.set(index.name, phase);
    currentValue.set(index.name, value);
  }
  if (missing.length > 0) {
    warnings.push({ code: "index-without-value", message: `no current value for ${missing.join(", ")}: left out of this outlook` });
  }

  const ranking: AssociationRank[] = calibration.indices
    .map((index) => ({ index: index.name, chiSquare: index.contingency.chiSquare ?? NaN, pValue: index.contingency.pValue ?? NaN }))
    .sort((a, b) => {
      const pa = Number.isNaN(a.pValue) ? Infinity : a.pValue;
      const pb = Number.isNaN(b.pValue) ? Infinity : b.pValue;
      return pa - pb || (a.index < b.index ? -1 : a.index > b.index ? 1 : 0);
    });
  const cell = forecastCell(training, currentPhase, ranking, settings.methods.jointMinYears);
  const labelOf = (index: string, phase: number): string =>
    calibration.indices.find((candidate) => candidate.name === index)?.definition.labels[phase] ?? String(phase);
  const cellWords = cell.indices.map((index, i) => `${index} ${labelOf(index, cell.phases[i] as number)}`).join(" and ");
  const basis =
    cell.basis === "joint"
      ? `the ${cell.years.length} calibration years when ${cellWords} (the two indices most strongly linked to fire years)`
      : cell.basis === "single"
        ? `the ${cell.years.length} calibration years when ${cellWords} (the index most strongly linked to fire years` +
          (currentPhase.size > 1 ? `; the joint phase with the next index had fewer than ${settings.methods.jointMinYears} years)` : ")")
        : `all ${cell.years.length} calibration years (no current index value was given, so this is the long-term average)`;
  const n = cell.years.length;
  const fireYear = {
    ...proportionEstimate(cell.fireYears, n, method),
    basis,
    basisIndices: cell.indices,
    years: n,
    fireYears: cell.fireYears,
  };
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

  const hindcast = runHindcast({
    years: calibration.years,
    activity: calibration.activity,
    indexValues,
    indexSettings: settings.indices,
    indices: [...currentPhase.keys()],
    top: settings.fireYears.top,
    measure: settings.fireYears.measure,
    exclusion: settings.methods.hindcastExclusion,
    jointMinYears: settings.methods.jointMinYears,
  });

  return {
    issued: request.issued,
    season: request.season,
    region: settings.name,
    baseRate: calibration.baseRate,
    current,
    missing,
    fireYear,
    perIndex,
    categories,
    analogs,
    analogFireShare,
    hindcast,
    warnings,
  };
}
