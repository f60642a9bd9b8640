import type { Calibration } from "./types.js";

/** Schema name of `firephase calibrate --json` (promised interface, README "JSON output"). */
export const CALIBRATION_SCHEMA = "firephase.calibration/1";

/**
 * The promised JSON form of a Calibration. Key order is fixed, so the same inputs and seed give
 * byte-identical output. A statistic that cannot be computed is null with a `reason` beside it.
 */
export function toCalibrationJson(calibration: Calibration): Record<string, unknown> {
  const indices: Record<string, unknown> = {};
  for (const index of calibration.indices) {
    indices[index.name] = {
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
    };
  }
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
    warnings: calibration.warnings,
  };
}
