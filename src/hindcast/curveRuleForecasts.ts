import { curveScratch, readFastResponseCurve, type CurveScratch } from "./fastResponseCurve.js";
import type { HindcastDesign } from "./hindcastDesign.js";
import type { PhaseRuleForecasts } from "./phaseRuleForecasts.js";

/** The curve rule's forecast of every fold. */
export interface CurveRuleForecasts {
  readonly probability: Float64Array;
  /** 1 when the fold's forecast was read from a fitted curve, 0 when it fell back to the phase rule's odds. */
  readonly read: Uint8Array;
  /** Index read per fold (−1 when none), as the phase rule's cell chose it. */
  readonly index: Int16Array;
}

/**
 * Runs the outlook's curve rule (`methods.response` "curve", see curveForecast) in every fold of a leave-out
 * hindcast: the index is the first index of the fold's phase-rule cell (same ranking by chi-square p and the
 * same q gate, from the left-in years); its logistic response curve (fitResponseCurve: maximum likelihood,
 * Firth under separation, the quadratic form only when clearly better) is fitted to the fixed high-fire
 * outcome over the left-in years with a value of that index, and read at the held-out year's value, clamped to
 * the left-in range (readResponseCurve). When the cell is every left-in year, or the curve cannot be fitted,
 * the forecast is the phase rule's (as the outlook keeps the phase odds). Nothing from the held-out year or
 * its left-out neighbours reaches the fit: only positions outside the fold's window are used.
 *
 * @param design - the hindcast design.
 * @param fire - 1 for a high-fire year per position.
 * @param phase - the phase rule's forecasts for the same fire record (its cells choose the index).
 * @param scratch - reusable buffers, one per index (curveScratch).
 * @param warmStart - start each fit from the previous fold's coefficients (faster). The optimum does not depend
 *   on the start, but its last bits can, so the observed hindcast starts every fold from 0 (its forecasts then
 *   depend on nothing but the fold's own left-in years, bit for bit); the permutation test uses warm starts.
 * @returns the curve rule's probability per fold.
 */
export function curveRuleForecasts(
  design: HindcastDesign,
  fire: Uint8Array,
  phase: PhaseRuleForecasts,
  scratch: readonly CurveScratch[] = design.names.map(() => curveScratch(design.years.length)),
  warmStart = false,
): CurveRuleForecasts {
  const probability = new Float64Array(design.folds);
  const read = new Uint8Array(design.folds);
  const index = Int16Array.from(phase.cellIndex);
  const warmed = design.names.map(() => false);
  for (let fold = 0; fold < design.folds; fold += 1) {
    probability[fold] = phase.probability[fold] as number;
    const k = phase.cellIndex[fold] as number;
    if (k < 0) continue;
    const buffers = scratch[k] as CurveScratch;
    if (!warmStart) {
      buffers.linearStart.fill(0);
      buffers.quadraticStart.fill(0);
    }
    if (!warmed[k]) {
      // A new fire record: the last fits are not optima of this one, so no warm step from them.
      buffers.hasPrevious.fill(0);
      warmed[k] = true;
    }
    const estimate = readCurveInFold(design, fire, k, fold, buffers, warmStart);
    if (Number.isNaN(estimate)) continue;
    probability[fold] = estimate;
    read[fold] = 1;
  }
  return { probability, read, index };
}

/**
 * The curve rule's reading in one fold (see curveRuleForecasts): index k's curve fitted to the left-in years with
 * a value of it and read at the held-out year's value; NaN when no curve can be fitted.
 *
 * @param warmStart - start from the buffers' last coefficients with a warm step (see curveRuleForecasts).
 */
export function readCurveInFold(design: HindcastDesign, fire: Uint8Array, k: number, fold: number, buffers: CurveScratch, warmStart: boolean): number {
  const n = design.years.length;
  const value = design.values[k] as Float64Array;
  const windowStart = design.windowStart[fold] as number;
  const windowEnd = design.windowEnd[fold] as number;
  const { x, y } = buffers;
  let m = 0;
  for (let position = 0; position < n; position += 1) {
    if (position >= windowStart && position < windowEnd) continue;
    const v = value[position] as number;
    if (Number.isNaN(v)) continue;
    x[m] = v;
    y[m] = fire[position] as number;
    m += 1;
  }
  return readFastResponseCurve(
    buffers,
    m,
    value[design.target[fold] as number] as number,
    warmStart ? { values: value, fire, start: windowStart, end: windowEnd } : undefined,
  );
}
