import type { Calibration, IndexCalibration, ModernEra, ResponseCurve } from "./types.js";

/** Schema name of `firephase calibrate --json` (promised interface, README "JSON output"). */
export const CALIBRATION_SCHEMA = "firephase.calibration/1";

/**
 * The promised JSON form of a Calibration. Key order is fixed, so the same inputs and seed give
 * byte-identical output. A statistic that cannot be computed is null with a `reason` beside it.
 */
export function toCalibrationJson(calibration: Calibration): Record<string, unknown> {
  // Object.fromEntries defines own properties, so an index named like a built-in property stays a plain key.
  const indices = Object.fromEntries(calibration.indices.map((index) => [index.name, indexJson(index)]));
  return {
    schema: CALIBRATION_SCHEMA,
    region: calibration.region,
    period: calibration.period,
    fireYears: {
      top: calibration.fireYears.top,
      measure: calibration.fireYears.measure,
      threshold: calibration.fireYears.threshold,
      realisedShare: calibration.fireYears.realisedShare,
      years: calibration.fireYears.years,
    },
    baseRate: calibration.baseRate,
    categories: {
      lowerCut: calibration.categories.lowerCut,
      upperCut: calibration.categories.upperCut,
      quantileRule: calibration.categories.quantileRule,
      tieRule: calibration.categories.tieRule,
      realisedShares: calibration.categories.realisedShares,
    },
    interval: calibration.interval,
    seed: calibration.seed,
    indices,
    modern: calibration.modern === undefined || calibration.modern === null ? null : modernJson(calibration.modern),
    ...(calibration.modern === undefined || calibration.modern === null
      ? { modernReason: calibration.modernReason ?? "the modern era was not computed" }
      : {}),
    warnings: calibration.warnings,
  };
}

/** JSON form of a response curve (`indices.<NAME>.curve`), in a fixed key order. */
function curveJson(curve: ResponseCurve): Record<string, unknown> {
  return {
    intercept: curve.intercept,
    slope: curve.slope,
    standardErrors: curve.standardErrors,
    covariance: curve.covariance,
    likelihoodRatio: curve.likelihoodRatio,
    pValue: curve.pValue,
    ...(curve.qValue === undefined ? {} : { qValue: curve.qValue }),
    method: curve.method,
    separation: curve.separation,
    converged: curve.converged,
    iterations: curve.iterations,
    aic: curve.aic,
    years: curve.years,
    fireYears: curve.fireYears,
    range: curve.range,
    level: curve.level,
    band: curve.band,
    points: curve.points,
    quadratic:
      curve.quadratic === null
        ? null
        : {
            coefficients: curve.quadratic.coefficients,
            standardErrors: curve.quadratic.standardErrors,
            covariance: curve.quadratic.covariance,
            likelihoodRatio: curve.quadratic.likelihoodRatio,
            pValue: curve.quadratic.pValue,
            aic: curve.quadratic.aic,
            method: curve.quadratic.method,
            points: curve.quadratic.points,
          },
    ...(curve.quadratic === null ? { quadraticReason: curve.quadraticReason ?? "not reported" } : {}),
    quadraticRule: curve.quadraticRule,
  };
}

/** JSON form of the modern era (`modern`), indices keyed by name, in a fixed key order. */
function modernJson(modern: ModernEra): Record<string, unknown> {
  const indices = Object.fromEntries(
    modern.indices.map((index) => [index.name, { years: index.years, phases: index.phases, homogeneity: index.homogeneity }]),
  );
  return {
    measure: modern.measure,
    period: modern.period,
    years: modern.years,
    top: modern.top,
    threshold: modern.threshold,
    ...(modern.threshold === null ? { thresholdReason: "no modern year has a value above 0" } : {}),
    fireYears: modern.fireYears,
    realisedShare: modern.realisedShare,
    baseRate: modern.baseRate,
    meaning: modern.meaning,
    agreement: modern.agreement,
    homogeneityDefinition: modern.homogeneityDefinition,
    indices,
    warnings: modern.warnings,
  };
}

/** JSON form of one index's calibration (`indices.<NAME>`), in a fixed key order. */
function indexJson(index: IndexCalibration): Record<string, unknown> {
  return {
    rule: index.definition.rule,
    cuts: index.definition.cuts,
    labels: index.definition.labels,
    years: index.years,
    mean: index.mean,
    sd: index.sd,
    phases: index.phases.map((phase) => ({
      label: phase.label,
      years: phase.years,
      fireYears: phase.fireYears,
      probability: phase.probability,
      ratioToBase: phase.ratioToBase,
      categories: phase.categories,
      smallSample: phase.smallSample,
    })),
    contingency: index.contingency,
    sea: {
      lags: index.sea.lags,
      mean: index.sea.mean,
      ci95: index.sea.ci95,
      ci99: index.sea.ci99,
      pValue: index.sea.pValue,
      qValue: index.sea.qValue,
      eventYears: index.sea.eventYears,
      poolYears: index.sea.poolYears,
      draws: index.sea.draws,
      seed: index.sea.seed,
      baseline: index.sea.baseline,
      sampling: index.sea.sampling,
      percentileRule: index.sea.percentileRule,
      ...(index.sea.reason === undefined ? {} : { reason: index.sea.reason }),
    },
    aggregated: index.aggregated,
    stability: index.stability,
    curve: index.curve === undefined || index.curve === null ? null : curveJson(index.curve),
    ...(index.curve === undefined || index.curve === null ? { curveReason: index.curveReason ?? "the response curve was not computed" } : {}),
  };
}
