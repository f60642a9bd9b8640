/**
 * A slow, direct re-implementation of the hindcast's folds for tests: every fold rebuilds its training set
 * with buildTrainingSet (under the fixed event), ranks the indices with rankIndicesByAssociation, picks the
 * cell with forecastCell and reads the curve with curveForecast — the outlook's own functions, one fold at a
 * time, exactly as the outlook would from the left-in years. The fast hindcast must agree with it exactly.
 */
import { buildTrainingSet } from "../../src/calibrate/buildTrainingSet.js";
import { curveForecast } from "../../src/calibrate/curveForecast.js";
import { forecastCell } from "../../src/calibrate/forecastCell.js";
import { rankIndicesByAssociation } from "../../src/calibrate/rankIndicesByAssociation.js";
import { classifyPhase } from "../../src/climate/phaseDefinition.js";
import { fixedEvent } from "../../src/hindcast/fixedEvent.js";
import type { HindcastInput } from "../../src/hindcast/runHindcast.js";

export interface SlowFold {
  readonly year: number;
  readonly probability: number;
  readonly categories: readonly [number, number, number];
  readonly climatology: number;
  readonly basis: "joint" | "single" | "climatology";
  readonly curveProbability: number;
  readonly curveRead: boolean;
}

export function slowHindcast(input: HindcastInput): SlowFold[] {
  const years = [...input.years].sort((a, b) => a - b);
  const event = fixedEvent(years, input.activity, input.top, input.measure);
  const folds: SlowFold[] = [];
  for (const target of years) {
    const trainingYears = years.filter((year) => Math.abs(year - target) > input.exclusion);
    if (trainingYears.length === 0) continue;
    const training = buildTrainingSet({
      years: trainingYears,
      activity: input.activity,
      indexValues: input.indexValues,
      indexSettings: input.indexSettings,
      top: input.top,
      measure: input.measure,
      classify: [target],
      event: { threshold: event.threshold, lowerCut: event.lowerCut, upperCut: event.upperCut },
    });
    const current = new Map<string, number>();
    const currentValues = new Map<string, number>();
    for (const index of input.indices) {
      const value = input.indexValues.get(index)?.get(target);
      const definition = training.definitions.get(index);
      if (value !== undefined && definition !== undefined) {
        current.set(index, classifyPhase(value, definition.cuts));
        currentValues.set(index, value);
      }
    }
    const ranking = rankIndicesByAssociation(training, input.indexSettings.map((settings) => settings.name));
    const cell = forecastCell(training, current, ranking, input.jointMinYears, input.jointMaxQ);
    const n = cell.years.length;
    const climatology = training.fireYears.years.length / trainingYears.length;
    const probability = n === 0 ? climatology : cell.fireYears / n;
    const curve = curveForecast(training, input.indexValues, cell, currentValues);
    folds.push({
      year: target,
      probability,
      categories: [cell.categories.below / n, cell.categories.near / n, cell.categories.above / n],
      climatology,
      basis: cell.basis,
      curveProbability: curve.forecast === null ? probability : curve.forecast.reading.estimate,
      curveRead: curve.forecast !== null,
    });
  }
  return folds;
}
