import { fitResponseCurve, readResponseCurve } from "../calibrate/fitResponseCurve.js";
import { chiSquareUpperTail } from "../stats/chiSquareIndependence.js";

/** Convergence tolerance and iteration cap of logisticRegression (C1), which this must reproduce. */
const TOLERANCE = 1e-10;
const MAX_ITERATIONS = 100;
/** Fewest years of the rarer outcome before fitResponseCurve tries the quadratic form (10 per slope). */
export const QUADRATIC_MIN_RARER = 20;
/** Below this relative Gram–Schmidt remainder the design is left to logisticRegression's own rank check. */
const RANK_MARGIN = 1e-6;

/** Reusable buffers of {@link readFastResponseCurve} (one per design). */
export interface CurveScratch {
  readonly x: Float64Array;
  readonly y: Uint8Array;
  /** Warm starts: the last linear and quadratic coefficients (a start only; the optimum does not depend on it). */
  readonly linearStart: Float64Array;
  readonly quadraticStart: Float64Array;
  /** Information matrices at the last fits, and whether each last fit is the optimum of the same fire record. */
  readonly linearInformation: Float64Array;
  readonly quadraticInformation: Float64Array;
  readonly hasPrevious: Uint8Array;
  /** Left-out window [start, end) of the last fits. */
  readonly previousWindow: Int32Array;
}

export function curveScratch(size: number): CurveScratch {
  return {
    x: new Float64Array(size),
    y: new Uint8Array(size),
    linearStart: new Float64Array(2),
    quadraticStart: new Float64Array(3),
    linearInformation: new Float64Array(9),
    quadraticInformation: new Float64Array(9),
    hasPrevious: new Uint8Array(2),
    previousWindow: new Int32Array(2),
  };
}

/**
 * The fold being fitted, for the warm step: the index values and fire outcome by position, and the fold's
 * left-out window. With it, a fit that follows an earlier fit of the same index and fire record starts with one
 * Newton step computed only from the years that entered and left the left-in set (the earlier fit's score is
 * zero at its optimum, so the new score and information differ only by those years).
 */
export interface CurveFold {
  readonly values: Float64Array;
  readonly fire: Uint8Array;
  readonly start: number;
  readonly end: number;
}

/**
 * The curve rule's reading (fitResponseCurve then readResponseCurve, as the outlook uses them) at `value`,
 * computed fast for the hindcast's folds: the same models fitted by the same criterion — maximum likelihood by
 * Newton–Raphson with step halving, stopped when both the largest step and the change in log-likelihood are
 * below 1e-10; the quadratic form tried when the rarer outcome has at least 20 years and the index at least
 * 3 distinct values, and used only when its likelihood-ratio p < 0.05 and its AIC is lower — but on typed
 * arrays, from a warm start, and without step halving (see newton). The log-likelihood is strictly concave, so the optimum (to rounding) does not
 * depend on the start. Whenever the plain maximum-likelihood path does not apply — separated outcomes (Firth's
 * penalized fit is then used), non-convergence, a nearly singular design — the case is handed to
 * fitResponseCurve itself, so the rule is always the outlook's.
 *
 * @param m - number of cases in scratch.x / scratch.y (the left-in years with a value of the index).
 * @param value - the held-out year's index value (finite).
 * @returns the fitted probability at the value clamped to the cases' range, or NaN when no curve can be
 *   fitted (fitResponseCurve gives null).
 */
export function readFastResponseCurve(scratch: CurveScratch, m: number, value: number, fold?: CurveFold): number {
  const { x, y } = scratch;
  const previous = scratch.hasPrevious;
  const hadLinear = previous[0] === 1;
  const hadQuadratic = previous[1] === 1;
  previous[0] = 0;
  previous[1] = 0;
  if (m === 0) return Number.NaN;
  let events = 0;
  let min = Infinity;
  let max = -Infinity;
  let eventMin = Infinity;
  let eventMax = -Infinity;
  let otherMin = Infinity;
  let otherMax = -Infinity;
  let distinct = 0;
  let first = 0;
  let second = 0;
  for (let i = 0; i < m; i += 1) {
    const v = x[i] as number;
    if (v < min) min = v;
    if (v > max) max = v;
    if (y[i] === 1) {
      events += 1;
      if (v < eventMin) eventMin = v;
      if (v > eventMax) eventMax = v;
    } else {
      if (v < otherMin) otherMin = v;
      if (v > otherMax) otherMax = v;
    }
    if (distinct < 3) {
      if (distinct === 0) {
        first = v;
        distinct = 1;
      } else if (distinct === 1) {
        if (v !== first) {
          second = v;
          distinct = 2;
        }
      } else if (v !== first && v !== second) distinct = 3;
    }
  }
  if (events === 0 || events === m || !(max > min)) return Number.NaN;
  const separated = otherMax <= eventMin || eventMax <= otherMin;
  if (separated || relativeRemainder(x, m, 2) < RANK_MARGIN) return slowReading(scratch, m, value);
  if (fold !== undefined && hadLinear) warmStep(scratch, fold, 2);
  const linear = newton(x, y, m, 2, scratch.linearStart);
  if (linear === null) return slowReading(scratch, m, value);
  scratch.linearInformation.set(information);
  let useQuadratic = false;
  const rarer = Math.min(events, m - events);
  if (rarer >= QUADRATIC_MIN_RARER && distinct >= 3) {
    if (relativeRemainder(x, m, 3) < RANK_MARGIN) return slowReading(scratch, m, value);
    if (fold !== undefined && hadQuadratic) warmStep(scratch, fold, 3);
    const quadratic = newton(x, y, m, 3, scratch.quadraticStart);
    if (quadratic === null) return slowReading(scratch, m, value);
    scratch.quadraticInformation.set(information);
    previous[1] = 1;
    const likelihoodRatio = Math.max(0, 2 * (quadratic - linear));
    const pValue = chiSquareUpperTail(likelihoodRatio, 1);
    const linearAic = -2 * linear + 2 * 2;
    const quadraticAic = -2 * quadratic + 2 * 3;
    useQuadratic = pValue < 0.05 && quadraticAic < linearAic;
  }
  previous[0] = 1;
  if (fold !== undefined) {
    scratch.previousWindow[0] = fold.start;
    scratch.previousWindow[1] = fold.end;
  } else {
    previous[0] = 0;
    previous[1] = 0;
  }
  const readAt = value > max ? max : value < min ? min : value;
  const c = useQuadratic ? scratch.quadraticStart : scratch.linearStart;
  let logit = 0;
  logit += (c[0] as number) * 1;
  logit += (c[1] as number) * readAt;
  if (useQuadratic) logit += (c[2] as number) * (readAt * readAt);
  return logit >= 0 ? 1 / (1 + Math.exp(-logit)) : Math.exp(logit) / (1 + Math.exp(logit));
}

/**
 * One Newton step from the last fit's optimum to this fold's, from the years that entered (left out before, in
 * now) and left (in before, left out now) only; skipped when it would be large (the ordinary iteration follows
 * either way and decides convergence).
 */
function warmStep(scratch: CurveScratch, fold: CurveFold, size: 2 | 3): void {
  const b = size === 2 ? scratch.linearStart : scratch.quadraticStart;
  const previousInformation = size === 2 ? scratch.linearInformation : scratch.quadraticInformation;
  const previousStart = scratch.previousWindow[0] as number;
  const previousEnd = scratch.previousWindow[1] as number;
  information.set(previousInformation);
  score.fill(0);
  const c0 = b[0] as number;
  const c1 = b[1] as number;
  const c2 = size === 3 ? (b[2] as number) : 0;
  const add = (position: number, sign: number) => {
    const v = fold.values[position] as number;
    if (Number.isNaN(v)) return;
    const v2 = v * v;
    const linear = c0 + c1 * v + c2 * v2;
    const e = Math.exp(-Math.abs(linear));
    const inverse = 1 / (1 + e);
    const outcome = fold.fire[position] as number;
    const residual = linear >= 0 ? (outcome === 1 ? e * inverse : -inverse) : outcome === 1 ? inverse : -e * inverse;
    const weight = sign * e * inverse * inverse;
    score[0] = (score[0] as number) + sign * residual;
    score[1] = (score[1] as number) + sign * residual * v;
    information[0] = (information[0] as number) + weight;
    information[1] = (information[1] as number) + weight * v;
    information[4] = (information[4] as number) + weight * v2;
    if (size === 3) {
      score[2] = (score[2] as number) + sign * residual * v2;
      information[2] = (information[2] as number) + weight * v2;
      information[5] = (information[5] as number) + weight * v2 * v;
      information[8] = (information[8] as number) + weight * v2 * v2;
    }
  };
  for (let position = previousStart; position < previousEnd; position += 1) if (position < fold.start || position >= fold.end) add(position, 1);
  for (let position = fold.start; position < fold.end; position += 1) if (position < previousStart || position >= previousEnd) add(position, -1);
  const step = solve(size);
  if (step === null) return;
  const largest = Math.max(Math.abs(step[0] as number), Math.abs(step[1] as number), size === 3 ? Math.abs(step[2] as number) : 0);
  if (!(largest < 0.5)) return;
  b[0] = c0 + (step[0] as number);
  b[1] = c1 + (step[1] as number);
  if (size === 3) b[2] = c2 + (step[2] as number);
}

function slowReading(scratch: CurveScratch, m: number, value: number): number {
  const values = Array.from(scratch.x.subarray(0, m));
  const outcomes = Array.from(scratch.y.subarray(0, m), (outcome) => outcome === 1);
  const fitted = fitResponseCurve(values, outcomes);
  return fitted.curve === null ? Number.NaN : readResponseCurve(fitted.curve, value).estimate;
}

/** Gram–Schmidt remainder of the last column of [1, x, x²] (first `columns` of them) relative to its length. */
function relativeRemainder(x: Float64Array, m: number, columns: 2 | 3): number {
  // Column norms and projections in closed form: center x (and x² after removing 1 and x).
  let s1 = 0;
  for (let i = 0; i < m; i += 1) s1 += x[i] as number;
  const mean = s1 / m;
  let sxx = 0;
  let length2 = 0;
  for (let i = 0; i < m; i += 1) {
    const d = (x[i] as number) - mean;
    sxx += d * d;
    length2 += (x[i] as number) * (x[i] as number);
  }
  if (columns === 2) return Math.sqrt(sxx) / Math.sqrt(length2);
  let sq = 0;
  let sqx = 0;
  let length4 = 0;
  for (let i = 0; i < m; i += 1) {
    const v = x[i] as number;
    sq += v * v;
    length4 += v * v * v * v;
  }
  const meanSq = sq / m;
  let residual2 = 0;
  for (let i = 0; i < m; i += 1) {
    const d = (x[i] as number) - mean;
    sqx += ((x[i] as number) * (x[i] as number) - meanSq) * d;
  }
  const slope = sxx > 0 ? sqx / sxx : 0;
  for (let i = 0; i < m; i += 1) {
    const v = x[i] as number;
    const r = v * v - meanSq - slope * (v - mean);
    residual2 += r * r;
  }
  return Math.sqrt(residual2) / Math.sqrt(length4);
}

/**
 * Maximum-likelihood logistic fit of the first `m` cases (logit P(y = 1) = b0 + b1·x, + b2·x² when `size` is 3)
 * by the same Newton–Raphson as the hindcast's folds (see newton), from `coefficients` (updated in place to the
 * optimum). No separation or rank check is made here: the caller makes them first.
 *
 * @param informationOut - receives the information matrix at the optimum (3×3 row-major; entries 0, 1, 2, 4, 5
 *   and 8 are filled).
 * @returns the log-likelihood at the optimum, or null when the iteration did not converge.
 */
export function fitLogisticCases(x: Float64Array, y: Uint8Array, m: number, size: 2 | 3, coefficients: Float64Array, informationOut: Float64Array): number | null {
  const result = newton(x, y, m, size, coefficients);
  if (result !== null) informationOut.set(information);
  return result;
}

/**
 * The design checks readFastResponseCurve makes before its plain maximum-likelihood path, on the first `m` cases:
 * the relative Gram–Schmidt remainder of the last column of [1, x, x²] (its first `columns` columns) is at
 * least 1e-6 (times `margin`), i.e. the design is not nearly singular.
 */
export function designIsRegular(x: Float64Array, m: number, columns: 2 | 3, margin = 1): boolean {
  return relativeRemainder(x, m, columns) >= margin * RANK_MARGIN;
}

/** Below this largest step the iteration is in Newton's quadratic convergence region: no step halving needed. */
const CLOSE = 1e-3;
/** A step below this is followed (quadratic convergence) by one below the tolerance: compute the log-likelihood. */
const LIKELY_LAST = 1e-4;
/** A Newton step below this is taken as the last: the point after it is the optimum to about 1e-13. */
const ACCEPT = 3e-7;
const MAX_STEP_HALVINGS = 40;

/**
 * Maximum likelihood of logit P(y = 1) = b0 + b1·x (+ b2·x²) by Newton–Raphson with step halving from
 * `coefficients` (updated in place), stopped when the largest step is below 1e-10: a Newton step that small
 * means the score is zero to rounding, i.e. the unique optimum of the strictly concave log-likelihood, the
 * point logisticRegression converges to. Once the steps are small (below 1e-3) the log-likelihood is computed
 * only where it is needed. If the warm start fails the fit is retried from 0. Returns the log-likelihood at the
 * optimum, or null when it did not converge (the caller then uses the reference fit).
 */
function newton(x: Float64Array, y: Uint8Array, m: number, size: 2 | 3, coefficients: Float64Array): number | null {
  const b = coefficients;
  const warm = Number.isFinite(b[0] as number) && Number.isFinite(b[1] as number) && (size === 2 || Number.isFinite(b[2] as number));
  if (warm) {
    const result = newtonFrom(x, y, m, size, b);
    if (result !== null) return result;
  }
  b.fill(0);
  return newtonFrom(x, y, m, size, b);
}

function newtonFrom(x: Float64Array, y: Uint8Array, m: number, size: 2 | 3, b: Float64Array): number | null {
  let previousStep = Infinity;
  let logLikelihood = evaluate(x, y, m, size, b[0] as number, b[1] as number, size === 3 ? (b[2] as number) : 0, true);
  if (!Number.isFinite(logLikelihood)) return null;
  let known = true;
  for (let iteration = 0; iteration < MAX_ITERATIONS; iteration += 1) {
    const step = solve(size);
    if (step === null) return null;
    const s0 = step[0] as number;
    const s1 = step[1] as number;
    const s2 = size === 3 ? (step[2] as number) : 0;
    const largest = Math.max(Math.abs(s0), Math.abs(s1), Math.abs(s2));
    if (!Number.isFinite(largest)) return null;
    const base0 = b[0] as number;
    const base1 = b[1] as number;
    const base2 = size === 3 ? (b[2] as number) : 0;
    if (largest < TOLERANCE || (known && largest < ACCEPT)) {
      // Newton converges quadratically: after a step of size s the error is of order s² (below 1e-13 here), and
      // the log-likelihood there is ℓ + ½ gᵀs (g = Hs), to the same order.
      const ascent = (score[0] as number) * s0 + (score[1] as number) * s1 + (size === 3 ? (score[2] as number) * s2 : 0);
      b[0] = base0 + s0;
      b[1] = base1 + s1;
      if (size === 3) b[2] = base2 + s2;
      return known ? logLikelihood + 0.5 * ascent : evaluate(x, y, m, size, b[0] as number, b[1] as number, size === 3 ? (b[2] as number) : 0, true);
    }
    const close = previousStep < CLOSE && largest < CLOSE;
    let scale = 1;
    let halvings = 0;
    let candidate = 0;
    for (; halvings <= MAX_STEP_HALVINGS; halvings += 1) {
      b[0] = base0 + scale * s0;
      b[1] = base1 + scale * s1;
      if (size === 3) b[2] = base2 + scale * s2;
      // Close to the optimum the log-likelihood is only needed where the next step is likely the last.
      const needed = !close || largest < LIKELY_LAST;
      candidate = evaluate(x, y, m, size, b[0] as number, b[1] as number, size === 3 ? (b[2] as number) : 0, needed);
      known = needed;
      if (close || (Number.isFinite(candidate) && candidate >= logLikelihood - TOLERANCE)) break;
      scale /= 2;
    }
    if (halvings > MAX_STEP_HALVINGS) return null;
    logLikelihood = candidate;
    previousStep = largest * scale;
  }
  return null;
}

/** Score and information at the last evaluation (sums over the cases). */
const score = new Float64Array(3);
const information = new Float64Array(9);
const stepOut = new Float64Array(3);

/** Log-likelihood at (c0, c1, c2) (0 unless asked for), leaving the score and information there in the module buffers. */
function evaluate(x: Float64Array, y: Uint8Array, m: number, size: 2 | 3, c0: number, c1: number, c2: number, withLikelihood: boolean): number {
  return size === 2 ? evaluateLinear(x, y, m, c0, c1, withLikelihood) : evaluateQuadratic(x, y, m, c0, c1, c2, withLikelihood);
}

function evaluateLinear(x: Float64Array, y: Uint8Array, m: number, c0: number, c1: number, withLikelihood: boolean): number {
  let logLikelihood = 0;
  let g0 = 0;
  let g1 = 0;
  let h00 = 0;
  let h01 = 0;
  let h11 = 0;
  for (let i = 0; i < m; i += 1) {
    const v = x[i] as number;
    const linear = c0 + c1 * v;
    const e = Math.exp(-Math.abs(linear));
    const inverse = 1 / (1 + e);
    const outcome = y[i] as number;
    if (withLikelihood) logLikelihood += outcome * linear - (Math.max(linear, 0) + Math.log1p(e));
    // π = expit(η); y − π without cancellation: expit(−η) when y = 1.
    const residual = linear >= 0 ? (outcome === 1 ? e * inverse : -inverse) : outcome === 1 ? inverse : -e * inverse;
    const weight = e * inverse * inverse;
    g0 += residual;
    g1 += residual * v;
    h00 += weight;
    h01 += weight * v;
    h11 += weight * v * v;
  }
  score[0] = g0;
  score[1] = g1;
  information[0] = h00;
  information[1] = h01;
  information[4] = h11;
  return logLikelihood;
}

function evaluateQuadratic(x: Float64Array, y: Uint8Array, m: number, c0: number, c1: number, c2: number, withLikelihood: boolean): number {
  let logLikelihood = 0;
  let g0 = 0;
  let g1 = 0;
  let g2 = 0;
  let h00 = 0;
  let h01 = 0;
  let h02 = 0;
  let h11 = 0;
  let h12 = 0;
  let h22 = 0;
  for (let i = 0; i < m; i += 1) {
    const v = x[i] as number;
    const v2 = v * v;
    const linear = c0 + c1 * v + c2 * v2;
    const e = Math.exp(-Math.abs(linear));
    const inverse = 1 / (1 + e);
    const outcome = y[i] as number;
    if (withLikelihood) logLikelihood += outcome * linear - (Math.max(linear, 0) + Math.log1p(e));
    const residual = linear >= 0 ? (outcome === 1 ? e * inverse : -inverse) : outcome === 1 ? inverse : -e * inverse;
    const weight = e * inverse * inverse;
    const wv = weight * v;
    const wv2 = weight * v2;
    g0 += residual;
    g1 += residual * v;
    g2 += residual * v2;
    h00 += weight;
    h01 += wv;
    h02 += wv2;
    h11 += wv * v;
    h12 += wv2 * v;
    h22 += wv2 * v2;
  }
  score[0] = g0;
  score[1] = g1;
  score[2] = g2;
  information[0] = h00;
  information[1] = h01;
  information[2] = h02;
  information[4] = h11;
  information[5] = h12;
  information[8] = h22;
  return logLikelihood;
}

/** Solves information · step = score (2×2 or 3×3, symmetric positive definite); null when singular. */
function solve(size: 2 | 3): Float64Array | null {
  return solveInformation(information, score, size, stepOut) ? stepOut : null;
}

/**
 * Solves matrix · out = rhs for a symmetric positive definite 2×2 or 3×3 information matrix (row-major 3×3
 * storage, entries 0, 1, 2, 4, 5 and 8 read): the 2×2 by its determinant, the 3×3 by Cholesky.
 *
 * @returns false when the matrix is singular or not positive definite (out is then not meaningful).
 */
export function solveInformation(matrix: Float64Array, rhs: Float64Array, size: 2 | 3, out: Float64Array): boolean {
  const a = matrix[0] as number;
  const b = matrix[1] as number;
  const d = matrix[4] as number;
  if (size === 2) {
    const determinant = a * d - b * b;
    if (!(determinant > 0) || !Number.isFinite(determinant)) return false;
    out[0] = (d * (rhs[0] as number) - b * (rhs[1] as number)) / determinant;
    out[1] = (a * (rhs[1] as number) - b * (rhs[0] as number)) / determinant;
    return true;
  }
  const c = matrix[2] as number;
  const e = matrix[5] as number;
  const f = matrix[8] as number;
  // Cholesky of [[a, b, c], [b, d, e], [c, e, f]].
  const l00 = Math.sqrt(a);
  const l10 = b / l00;
  const l20 = c / l00;
  const l11sq = d - l10 * l10;
  if (!(l11sq > 0)) return false;
  const l11 = Math.sqrt(l11sq);
  const l21 = (e - l20 * l10) / l11;
  const l22sq = f - l20 * l20 - l21 * l21;
  if (!(l22sq > 0) || !Number.isFinite(l22sq)) return false;
  const l22 = Math.sqrt(l22sq);
  const z0 = (rhs[0] as number) / l00;
  const z1 = ((rhs[1] as number) - l10 * z0) / l11;
  const z2 = ((rhs[2] as number) - l20 * z0 - l21 * z1) / l22;
  out[2] = z2 / l22;
  out[1] = (z1 - l21 * (out[2] as number)) / l11;
  out[0] = (z0 - l10 * (out[1] as number) - l20 * (out[2] as number)) / l00;
  return true;
}
