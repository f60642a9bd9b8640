import { chiSquareUpperTail } from "../stats/chiSquareIndependence.js";
import { readCurveInFold } from "./curveRuleForecasts.js";
import { curveScratch, designIsRegular, fitLogisticCases, QUADRATIC_MIN_RARER, solveInformation, type CurveScratch } from "./fastResponseCurve.js";
import type { HindcastDesign } from "./hindcastDesign.js";
import type { PhaseRuleForecasts } from "./phaseRuleForecasts.js";

/** How the curve rule's permutation test computes its statistic (stated in output). */
export const ONE_STEP_RULE =
  "The curve rule's permutation test scores one-step case-deletion forecasts: in each fold the curves fitted to every year are moved to the fold's left-in years by one Newton step (Pregibon 1981), " +
  "for the observed record and every shuffle alike; the reported curve-rule scores are from exact refits.";

/** What the one-step forecasts keep per index between fire records (the parts that depend only on the index values). */
export interface OneStepScratch {
  /** Per index: positions with a value, ascending by value (ties by position). */
  readonly byValue: readonly (Int32Array | null)[];
  /** Per index: the values and outcomes of every position with a value, in position order. */
  readonly x: readonly Float64Array[];
  readonly y: readonly Uint8Array[];
  readonly cases: Int32Array;
  /** Per index: at least 3 + (largest window) distinct values, so every fold keeps 3. */
  readonly manyDistinct: Uint8Array;
  /** Per index: the linear and quadratic designs of all cases are regular with a hundredfold margin (see designIsRegular). */
  readonly regular: Uint8Array;
  /** Per index: coefficients of the last whole-record fits (a start only). */
  readonly linear: readonly Float64Array[];
  readonly quadratic: readonly Float64Array[];
  /** Exact fold fits when the one-step reading does not apply (one per index). */
  readonly exact: readonly CurveScratch[];
}

/** Builds the {@link OneStepScratch} of a design (once per hindcast). */
export function oneStepScratch(design: HindcastDesign): OneStepScratch {
  const n = design.years.length;
  let widest = 0;
  for (let fold = 0; fold < design.folds; fold += 1) widest = Math.max(widest, (design.windowEnd[fold] as number) - (design.windowStart[fold] as number));
  const K = design.names.length;
  const byValue: (Int32Array | null)[] = [];
  const x: Float64Array[] = [];
  const y: Uint8Array[] = [];
  const cases = new Int32Array(K);
  const manyDistinct = new Uint8Array(K);
  const regular = new Uint8Array(K);
  for (let k = 0; k < K; k += 1) {
    const value = design.values[k] as Float64Array;
    const positions: number[] = [];
    for (let position = 0; position < n; position += 1) if (!Number.isNaN(value[position] as number)) positions.push(position);
    const own = Float64Array.from(positions, (position) => value[position] as number);
    x.push(own);
    y.push(new Uint8Array(positions.length));
    cases[k] = positions.length;
    byValue.push(Int32Array.from(positions.sort((a, b) => (value[a] as number) - (value[b] as number) || a - b)));
    const distinct = new Set(own).size;
    manyDistinct[k] = distinct >= 3 + widest ? 1 : 0;
    // Regular with room to spare, so that no fold, a few years fewer, comes near the exact path's rank margin
    // (where it would hand the fold to fitResponseCurve); otherwise every fold of this index is refitted exactly.
    regular[k] = own.length > 0 && designIsRegular(own, own.length, 2, 100) && designIsRegular(own, own.length, 3, 100) ? 1 : 0;
  }
  return {
    byValue,
    x,
    y,
    cases,
    manyDistinct,
    regular,
    linear: design.names.map(() => new Float64Array(2)),
    quadratic: design.names.map(() => new Float64Array(3)),
    exact: design.names.map(() => curveScratch(n)),
  };
}

/** A whole-record fit: coefficients, information matrix (3×3 row-major) and log-likelihood; null when none. */
interface WholeFit {
  readonly coefficients: Float64Array;
  readonly information: Float64Array;
  logLikelihood: number;
}

/**
 * The curve rule's forecasts of every fold computed by one-step case deletion, for the statistic of its
 * permutation test ({@link ONE_STEP_RULE}). For each index the straight and (when the rarer outcome has at
 * least 20 years) quadratic logits are fitted once to every year with a value; in a fold, the few left-out years'
 * score and information are taken away and one Newton step gives the fold's coefficients, and the fold's
 * log-likelihood is ℓ − Σ ℓᵢ + ½ gᵀ I⁻¹ g (Pregibon D. 1981, "Logistic regression diagnostics", Annals of
 * Statistics 9:705–724, one-step approximation; Cook R.D. & Weisberg S. 1982, "Residuals and Influence in
 * Regression", Chapman & Hall, deletion of several cases). The fold then chooses between the two forms by the
 * same rule as the outlook (likelihood-ratio p < 0.05 and a lower AIC) and reads the chosen curve at the held-out
 * year's value, clamped to the left-in range. With about 290 years and 5 left out, the step's error is of order
 * (5/290)² of the coefficients, far below a forecast's rounding. A fold where the whole-record fit does not apply
 * — separated outcomes in the fold, a fit that did not converge, a nearly singular design, too few distinct values
 * — is fitted exactly (readCurveInFold), so every fold follows the curve rule.
 *
 * Cost per fire record: two whole-record fits per index and O(window) per fold, against a refit per fold.
 *
 * @returns the probability per fold (the phase rule's where no curve is read, as curveRuleForecasts).
 */
export function oneStepCurveForecasts(design: HindcastDesign, fire: Uint8Array, phase: PhaseRuleForecasts, scratch: OneStepScratch): Float64Array {
  const probability = Float64Array.from(phase.probability);
  const K = design.names.length;
  const linearFits: (WholeFit | null | undefined)[] = new Array<WholeFit | null | undefined>(K).fill(undefined);
  const quadraticFits: (WholeFit | null | undefined)[] = new Array<WholeFit | null | undefined>(K).fill(undefined);
  const eventCount = new Int32Array(K);
  const exactWarmed = new Uint8Array(K);
  for (let fold = 0; fold < design.folds; fold += 1) {
    const k = phase.cellIndex[fold] as number;
    if (k < 0) continue;
    if (linearFits[k] === undefined) {
      const fitted = fitWhole(design, fire, k, scratch);
      linearFits[k] = fitted.linear;
      quadraticFits[k] = fitted.quadratic;
      eventCount[k] = fitted.events;
    }
    const estimate = readOneStep(design, fire, k, fold, scratch, linearFits[k] ?? null, quadraticFits[k] ?? null, eventCount[k] as number, exactWarmed);
    if (!Number.isNaN(estimate)) probability[fold] = estimate;
  }
  return probability;
}

function fitWhole(design: HindcastDesign, fire: Uint8Array, k: number, scratch: OneStepScratch): { linear: WholeFit | null; quadratic: WholeFit | null; events: number } {
  const x = scratch.x[k] as Float64Array;
  const y = scratch.y[k] as Uint8Array;
  const m = scratch.cases[k] as number;
  const value = design.values[k] as Float64Array;
  let events = 0;
  let c = 0;
  for (let position = 0; position < design.years.length; position += 1) {
    if (Number.isNaN(value[position] as number)) continue;
    const outcome = fire[position] as number;
    y[c] = outcome;
    events += outcome;
    c += 1;
  }
  if (scratch.regular[k] !== 1 || events === 0 || events === m) return { linear: null, quadratic: null, events };
  const linear = wholeFit(x, y, m, 2, scratch.linear[k] as Float64Array);
  const rarer = Math.min(events, m - events);
  const quadratic = linear !== null && rarer >= QUADRATIC_MIN_RARER ? wholeFit(x, y, m, 3, scratch.quadratic[k] as Float64Array) : null;
  return { linear, quadratic, events };
}

function wholeFit(x: Float64Array, y: Uint8Array, m: number, size: 2 | 3, start: Float64Array): WholeFit | null {
  const information = new Float64Array(9);
  const logLikelihood = fitLogisticCases(x, y, m, size, start, information);
  return logLikelihood === null ? null : { coefficients: Float64Array.from(start), information, logLikelihood };
}

/** First and last left-in position in `order` (ascending by value) that satisfy `keep`, skipping the window. */
function extremes(order: Int32Array, start: number, end: number, fire: Uint8Array, outcome: -1 | 0 | 1): { low: number; high: number } {
  let low = -1;
  for (let i = 0; i < order.length; i += 1) {
    const position = order[i] as number;
    if (position >= start && position < end) continue;
    if (outcome !== -1 && fire[position] !== outcome) continue;
    low = position;
    break;
  }
  let high = -1;
  for (let i = order.length - 1; i >= 0; i -= 1) {
    const position = order[i] as number;
    if (position >= start && position < end) continue;
    if (outcome !== -1 && fire[position] !== outcome) continue;
    high = position;
    break;
  }
  return { low, high };
}

const score = new Float64Array(3);
const foldInformation = new Float64Array(9);
const step = new Float64Array(3);

/**
 * One Newton step from a whole-record fit to the fold without the window's cases; the fold's coefficients go to
 * `out` and the function returns the fold's approximate log-likelihood (NaN when the step cannot be solved).
 */
function oneStep(fit: WholeFit, size: 2 | 3, value: Float64Array, fire: Uint8Array, start: number, end: number, out: Float64Array): number {
  const b = fit.coefficients;
  const c0 = b[0] as number;
  const c1 = b[1] as number;
  const c2 = size === 3 ? (b[2] as number) : 0;
  foldInformation.set(fit.information);
  score.fill(0);
  let removedLikelihood = 0;
  for (let position = start; position < end; position += 1) {
    const v = value[position] as number;
    if (Number.isNaN(v)) continue;
    const v2 = v * v;
    const eta = c0 + c1 * v + c2 * v2;
    const e = Math.exp(-Math.abs(eta));
    const inverse = 1 / (1 + e);
    const outcome = fire[position] as number;
    removedLikelihood += outcome * eta - (Math.max(eta, 0) + Math.log1p(e));
    const residual = eta >= 0 ? (outcome === 1 ? e * inverse : -inverse) : outcome === 1 ? inverse : -e * inverse;
    const weight = e * inverse * inverse;
    // The whole-record score is zero at its optimum, so the fold's score is minus the removed cases' scores.
    score[0] = (score[0] as number) - residual;
    score[1] = (score[1] as number) - residual * v;
    foldInformation[0] = (foldInformation[0] as number) - weight;
    foldInformation[1] = (foldInformation[1] as number) - weight * v;
    foldInformation[4] = (foldInformation[4] as number) - weight * v2;
    if (size === 3) {
      score[2] = (score[2] as number) - residual * v2;
      foldInformation[2] = (foldInformation[2] as number) - weight * v2;
      foldInformation[5] = (foldInformation[5] as number) - weight * v2 * v;
      foldInformation[8] = (foldInformation[8] as number) - weight * v2 * v2;
    }
  }
  if (!solveInformation(foldInformation, score, size, step)) return Number.NaN;
  const s0 = step[0] as number;
  const s1 = step[1] as number;
  const s2 = size === 3 ? (step[2] as number) : 0;
  out[0] = c0 + s0;
  out[1] = c1 + s1;
  if (size === 3) out[2] = c2 + s2;
  const ascent = (score[0] as number) * s0 + (score[1] as number) * s1 + (size === 3 ? (score[2] as number) * s2 : 0);
  return fit.logLikelihood - removedLikelihood + 0.5 * ascent;
}


const linearOut = new Float64Array(3);
const quadraticOut = new Float64Array(3);

function readOneStep(
  design: HindcastDesign,
  fire: Uint8Array,
  k: number,
  fold: number,
  scratch: OneStepScratch,
  linear: WholeFit | null,
  quadratic: WholeFit | null,
  events: number,
  exactWarmed: Uint8Array,
): number {
  const value = design.values[k] as Float64Array;
  const start = design.windowStart[fold] as number;
  const end = design.windowEnd[fold] as number;
  const target = value[design.target[fold] as number] as number;
  const order = scratch.byValue[k] as Int32Array;
  let removed = 0;
  let removedEvents = 0;
  for (let position = start; position < end; position += 1) {
    if (Number.isNaN(value[position] as number)) continue;
    removed += 1;
    removedEvents += fire[position] as number;
  }
  const m = (scratch.cases[k] as number) - removed;
  const foldEvents = events - removedEvents;
  const exact = (): number => {
    const buffers = scratch.exact[k] as CurveScratch;
    if (exactWarmed[k] !== 1) {
      buffers.hasPrevious.fill(0);
      exactWarmed[k] = 1;
    }
    buffers.linearStart.fill(0);
    buffers.quadraticStart.fill(0);
    return readCurveInFold(design, fire, k, fold, buffers, false);
  };
  if (m === 0 || foldEvents === 0 || foldEvents === m) return Number.NaN;
  const range = extremes(order, start, end, fire, -1);
  const min = value[range.low] as number;
  const max = value[range.high] as number;
  if (!(max > min)) return Number.NaN;
  const withEvent = extremes(order, start, end, fire, 1);
  const without = extremes(order, start, end, fire, 0);
  const separated = (value[without.high] as number) <= (value[withEvent.low] as number) || (value[withEvent.high] as number) <= (value[without.low] as number);
  if (separated || linear === null) return exact();
  const linearLikelihood = oneStep(linear, 2, value, fire, start, end, linearOut);
  if (Number.isNaN(linearLikelihood)) return exact();
  let useQuadratic = false;
  const rarer = Math.min(foldEvents, m - foldEvents);
  if (rarer >= QUADRATIC_MIN_RARER) {
    if (quadratic === null || scratch.manyDistinct[k] !== 1) return exact();
    const quadraticLikelihood = oneStep(quadratic, 3, value, fire, start, end, quadraticOut);
    if (Number.isNaN(quadraticLikelihood)) return exact();
    const pValue = chiSquareUpperTail(Math.max(0, 2 * (quadraticLikelihood - linearLikelihood)), 1);
    useQuadratic = pValue < 0.05 && -2 * quadraticLikelihood + 6 < -2 * linearLikelihood + 4;
  }
  if (Number.isNaN(target)) return Number.NaN;
  const readAt = target > max ? max : target < min ? min : target;
  const c = useQuadratic ? quadraticOut : linearOut;
  const logit = (c[0] as number) + (c[1] as number) * readAt + (useQuadratic ? (c[2] as number) * readAt * readAt : 0);
  return logit >= 0 ? 1 / (1 + Math.exp(-logit)) : Math.exp(logit) / (1 + Math.exp(logit));
}
