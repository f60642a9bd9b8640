import type { IndexValues, TrainingSet } from "./buildTrainingSet.js";
import { fitResponseCurve, readResponseCurve, type CurveReading, type ResponseCurveOptions } from "./fitResponseCurve.js";
import type { ForecastCell } from "./forecastCell.js";
import type { ResponseCurve } from "./types.js";

/** The curve rule's forecast: the curve of the index the phase rule leads with, read at its current value (curve points left out). */
export interface CurveForecast {
  readonly index: string;
  readonly curve: ResponseCurve;
  readonly reading: CurveReading;
}

export type CurveForecastResult = { readonly forecast: CurveForecast; readonly reason?: undefined } | { readonly forecast: null; readonly reason: string };

/**
 * The curve rule (README "`firephase outlook`", `methods.response` "curve"): the index is the one the
 * phase rule selects — the first index of the forecast cell, chosen by the same ranking by chi-square p
 * and the same q gate (see forecastCell) — and its logistic response curve, fitted over the training
 * years with a value of that index, is read at this season's value (not beyond the training range:
 * the nearest end is used and the reading says so). The outlook and the hindcast both call this, so
 * the hindcast verifies the curve rule the outlook issues; in the hindcast the training years are the
 * years left in, so nothing from a held-out year reaches its fit.
 *
 * @param training - the training years and their high-fire years (`isFireYear`)
 * @param indexValues - index values by index name and year
 * @param cell - the phase rule's forecast cell for the same training set and current phases
 * @param current - this season's value per index name
 * @returns the forecast; null with a reason when the cell is the long-term average (no index selected),
 *   the selected index has no current value, or its curve cannot be fitted (the caller then keeps the phase odds)
 * @example
 * const cell = forecastCell(training, phases, ranking, 10, 0.05);
 * curveForecast(training, indexValues, cell, new Map([["ENSO", 1.6]]));
 * // => { forecast: { index: "ENSO", curve, reading: { estimate: 0.45, lower: 0.31, upper: 0.6, … } } }
 * @see Agresti A. (2013) Categorical Data Analysis, 3rd ed., Wiley, §5.1 (the logistic model fitted here).
 */
export function curveForecast(
  training: TrainingSet,
  indexValues: IndexValues,
  cell: ForecastCell,
  current: ReadonlyMap<string, number>,
): CurveForecastResult {
  const index = cell.basis === "climatology" ? undefined : cell.indices[0];
  if (index === undefined) return { forecast: null, reason: "the rule selected no index (the long-term average is used)" };
  const value = current.get(index);
  if (value === undefined) return { forecast: null, reason: `no current value of ${index}` };
  const fitted = fitOnTraining(training, indexValues, index, { points: false });
  if (fitted.curve === null) return { forecast: null, reason: `the ${index} response curve cannot be fitted: ${fitted.reason}` };
  return { forecast: { index, curve: fitted.curve, reading: readResponseCurve(fitted.curve, value) } };
}

/**
 * The response curve of one index over a training set: the training years with a value of the index,
 * high-fire year or not (see fitResponseCurve; `options.points` as there).
 *
 * @param training - the training years and their high-fire years
 * @param indexValues - index values by index name and year
 * @param index - the index name (an index without values gives `curve: null` with a reason)
 * @param options - `points: false` leaves out the reported curve points
 * @returns the fit, or null with a reason (see fitResponseCurve)
 */
export function fitOnTraining(
  training: TrainingSet,
  indexValues: IndexValues,
  index: string,
  options: ResponseCurveOptions = {},
): ReturnType<typeof fitResponseCurve> {
  const values = indexValues.get(index);
  const x: number[] = [];
  const y: boolean[] = [];
  if (values !== undefined) {
    for (const year of training.years) {
      const value = values.get(year);
      if (value === undefined) continue;
      x.push(value);
      y.push(training.isFireYear.has(year));
    }
  }
  return fitResponseCurve(x, y, options);
}
