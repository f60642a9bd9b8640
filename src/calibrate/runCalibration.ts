import { closeSitePairs } from "../record/closeSitePairs.js";
import { compositeFireRecord } from "../record/composite.js";
import { InputError } from "../workspace/InputError.js";
import { join } from "node:path";
import { benjaminiHochberg } from "../stats/benjaminiHochberg.js";
import { meanAndStandardDeviation } from "../stats/meanAndStandardDeviation.js";
import type { Workspace } from "../workspace/types.js";
import { activityByYear, valuesByYear } from "./activityByYear.js";
import { aggregatedLagCorrelation } from "./aggregatedLagCorrelation.js";
import { buildTrainingSet, phaseCounts, type IndexValues } from "./buildTrainingSet.js";
import { calibrationPeriod } from "./calibrationPeriod.js";
import { contingencyByPhase } from "./contingencyByPhase.js";
import { fitOnTraining } from "./curveForecast.js";
import { modernEra } from "./modernEra.js";
import { proportionEstimate } from "./proportionEstimate.js";
import { seaForIndex } from "./seaForIndex.js";
import { stabilityWindows } from "./stabilityWindows.js";
import type { Calibration, IndexCalibration, PhaseOdds } from "./types.js";

/**
 * The first step of {@link runCalibration}: the composite fire record, its activity per year and the calibration
 * period. The calibration years and their activity are all the outlook's hindcast needs (outlookHindcastInput),
 * so `outlook` and `brief` start the hindcast from this while the rest of the calibration runs.
 */
export interface CalibrationBasis {
  readonly record: ReturnType<typeof compositeFireRecord>;
  readonly activity: ReturnType<typeof activityByYear>;
  readonly period: ReturnType<typeof calibrationPeriod>;
  /** The calibration years' activity, as Calibration.activity gives it. */
  readonly calibrationActivity: ReadonlyMap<number, number>;
}

/**
 * The composite record, activity and calibration period of a region (the start of {@link runCalibration}).
 *
 * @example
 * const basis = calibrationBasis(workspace);
 * runCalibration(workspace, {}, basis).years === basis.period.years; // => true
 */
export function calibrationBasis(workspace: Workspace): CalibrationBasis {
  const { settings } = workspace;
  const record = compositeFireRecord(workspace.fireRecord, settings.fireYears.minSitesRecording);
  const activity = activityByYear(record, settings.fireYears.measure);
  const period = calibrationPeriod(settings, record, workspace.indices);
  return { record, activity, period, calibrationActivity: new Map(period.years.map((year) => [year, activity.get(year) as number])) };
}

export interface CalibrationOptions {
  /** Called before each index is calibrated (the CLI shows it on a terminal). */
  readonly onProgress?: (message: string) => void;
}

/**
 * Calibrates a region: composites the fire record, picks the fire years and activity terciles of
 * the calibration period, and for each index computes the conditional odds of a fire year by phase,
 * the contingency tests, the superposed epoch analysis, the aggregated lag correlation and the
 * stability through time, and the logistic response curve of high-fire year on the index value; then the
 * modern fire record as a second era (see modernEra). Benjamini–Hochberg q-values (Benjamini Y., Hochberg Y. 1995, "Controlling
 * the false discovery rate", JRSS B 57:289–300) are computed across all indices' chi-square tests.
 * Pure: the same workspace (and seed) gives the same Calibration.
 *
 * @param basis - its first step, when already computed (calibrationBasis(workspace)).
 */
export function runCalibration(workspace: Workspace, options: CalibrationOptions = {}, basis: CalibrationBasis = calibrationBasis(workspace)): Calibration {
  const { settings } = workspace;
  const { record, activity, period } = basis;
  const indexValues: IndexValues = new Map(workspace.indices.map((series) => [series.name, valuesByYear(series)]));
  const training = buildTrainingSet({
    years: period.years,
    activity,
    indexValues,
    indexSettings: settings.indices,
    top: settings.fireYears.top,
    measure: settings.fireYears.measure,
  });
  const method = settings.methods.interval;
  const n = period.years.length;
  if (n === 0) {
    const where =
      settings.calibration === null
        ? `the fire record's usable years (at least ${settings.fireYears.minSitesRecording} recording sites) and the index years do not overlap`
        : `no year of calibration ${settings.calibration.first}–${settings.calibration.last} has at least ${settings.fireYears.minSitesRecording} recording sites in the fire record`;
    throw new InputError([
      { file: join(workspace.shownRoot ?? workspace.root, "region.json"), line: null, message: `no calibration years: ${where}` },
    ]);
  }
  const baseRate = proportionEstimate(training.fireYears.years.length, n, method);
  const warnings: { code: string; message: string }[] = [];
  const thinInPeriod = record.thinYears.filter((year) => year >= period.first && year <= period.last);
  if (thinInPeriod.length > 0) {
    warnings.push({
      code: "thin-years-left-out",
      message: `${thinInPeriod.length} year(s) of ${period.first}–${period.last} have fewer than ${settings.fireYears.minSitesRecording} recording sites and are left out of the calibration`,
    });
  }
  if (workspace.fireRecord.kind === "sites") {
    const limit = settings.methods.independenceKm;
    for (const pair of closeSitePairs(workspace.fireRecord.sites, limit)) {
      warnings.push({
        code: "sites-close",
        message: `sites ${pair.a} and ${pair.b} are ${pair.distanceKm.toFixed(1)} km apart, closer than ${limit} km: their fire years may not be independent evidence`,
      });
    }
  }
  if (training.fireYears.years.length === 0) {
    warnings.push({ code: "no-fire-years", message: "no calibration year had any fire recorded: every odds estimate is 0 and says nothing about this season" });
  } else if (training.fireYears.realisedShare > 2 * settings.fireYears.top) {
    warnings.push({
      code: "many-tied-fire-years",
      message: `${training.fireYears.years.length} of ${n} calibration years tie at or above the fire-year threshold (${Math.round(training.fireYears.realisedShare * 100)}%, asked for the top ${Math.round(settings.fireYears.top * 100)}%): fire years are not rare here, so read the odds with that in mind`,
    });
  }
  if (n < 50) {
    warnings.push({ code: "short-record", message: `only ${n} calibration years: every estimate is uncertain` });
  }

  const calibrated: IndexCalibration[] = settings.indices.map((indexSettings, position) => {
    const name = indexSettings.name;
    options.onProgress?.(`calibrating ${name} (${position + 1} of ${settings.indices.length}): ${settings.methods.seaDraws} random draws for the epoch analysis`);
    const series = workspace.indices.find((candidate) => candidate.name === name);
    const values = indexValues.get(name) ?? new Map<number, number>();
    const definition = training.definitions.get(name);
    if (series === undefined || definition === undefined) throw new RangeError(`index ${name} was not loaded`);
    const counts = phaseCounts(training, name);
    const baseEstimate = baseRate.estimate;
    const phases: PhaseOdds[] = counts.map((cell, phase) => {
      const probability = proportionEstimate(cell.fireYears, cell.years.length, method);
      const label = definition.labels[phase] ?? String(phase);
      const smallSample = cell.years.length < settings.methods.smallSampleYears;
      if (smallSample) {
        warnings.push({
          code: "small-phase-sample",
          message: `${name} ${label}: only ${cell.years.length} calibration year(s) — its odds are very uncertain`,
        });
      }
      return {
        label,
        years: cell.years.length,
        fireYears: cell.fireYears,
        probability,
        ratioToBase:
          probability.estimate !== null && baseEstimate !== null && baseEstimate > 0 ? probability.estimate / baseEstimate : null,
        categories: cell.categories,
        smallSample,
      };
    });
    const contingency = contingencyByPhase(definition.labels, counts);
    if (contingency.smallExpectedShare > 0.2) {
      warnings.push({
        code: "small-expected-counts",
        message: `${name}: ${Math.round(contingency.smallExpectedShare * 100)}% of expected counts are below 5, so the chi-square p-value is approximate; the Fisher exact tests do not need large counts`,
      });
    }
    const sea = seaForIndex({
      series,
      first: period.first,
      last: period.last,
      eventYears: training.fireYears.years,
      firstLag: settings.methods.seaFirstLag,
      lastLag: settings.methods.seaLastLag,
      draws: settings.methods.seaDraws,
      seed: settings.seed,
      poolYears: period.years,
    });
    const aggregated = aggregatedLagCorrelation({
      first: period.first,
      last: period.last,
      activity: new Map(period.years.map((year) => [year, activity.get(year) as number])),
      index: values,
      blockYears: settings.methods.blockYears,
      maxLag: settings.methods.blockMaxLag,
    });
    const windows = stabilityWindows({
      training,
      index: name,
      first: period.first,
      last: period.last,
      width: settings.methods.stabilityWindow,
      step: settings.methods.stabilityStep,
      interval: method,
    });
    const calibrationValues = period.years.flatMap((year) => (values.has(year) ? [values.get(year) as number] : []));
    const moments = meanAndStandardDeviation(calibrationValues);
    const fitted = fitOnTraining(training, indexValues, name);
    return {
      name,
      definition,
      years: calibrationValues.length,
      phases,
      contingency,
      sea,
      aggregated,
      stability: { window: settings.methods.stabilityWindow, step: settings.methods.stabilityStep, windows },
      mean: moments.mean,
      sd: moments.sd,
      curve: fitted.curve,
      ...(fitted.curve === null ? { curveReason: fitted.reason } : {}),
    };
  });

  const qValues = benjaminiHochberg(calibrated.map((index) => index.contingency.pValue ?? NaN));
  // The response curves are tested across all indices too: the strongest of k curves reaches p ≤ 0.05
  // by chance about 1 − 0.95^k of the time, so a curve shows a clear link only by its q-value.
  const curveQValues = benjaminiHochberg(calibrated.map((index) => index.curve?.pValue ?? NaN));
  const finiteOrNull = (q: number | undefined): number | null => (q !== undefined && Number.isFinite(q) ? q : null);
  const indices = calibrated.map((index, i) => ({
    ...index,
    contingency: { ...index.contingency, qValue: finiteOrNull(qValues[i]) },
    curve: index.curve === null || index.curve === undefined ? index.curve : { ...index.curve, qValue: finiteOrNull(curveQValues[i]) },
  }));

  const modern = modernEra({
    rows: workspace.modern,
    measure: settings.methods.modernMeasure ?? "area",
    top: settings.fireYears.top,
    indexValues,
    indices,
    calibrationYears: period.years,
    fireScarFireYears: training.isFireYear,
    interval: method,
  });

  return {
    region: { name: settings.name },
    period: { first: period.first, last: period.last, years: n },
    years: period.years,
    activity: basis.calibrationActivity,
    fireYears: training.fireYears,
    categories: training.categories,
    baseRate,
    indices,
    interval: method,
    seed: settings.seed,
    warnings,
    modern: modern.modern,
    ...(modern.modern === null ? { modernReason: modern.reason } : {}),
  };
}
