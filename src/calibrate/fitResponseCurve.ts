import { chiSquareUpperTail } from "../stats/chiSquareIndependence.js";
import { logisticRegression, type LogisticRegressionFit } from "../stats/logisticRegression.js";
import type { QuadraticResponse, ResponseCurve, ResponseCurvePoint } from "./types.js";

/** Number of points at which the fitted curve and its band are reported, evenly spaced over the calibration range. */
export const CURVE_POINTS = 41;

/** The 0.975 quantile of the standard normal distribution (the 95% Wald band), to 16 digits. */
const Z_975 = 1.959963984540054;

/** How the band of a response curve is computed (stated in the JSON beside the points). */
export const CURVE_BAND =
  "pointwise 95% Wald interval on the logit scale (fitted logit ± 1.96 standard errors from the coefficients' covariance), transformed to probability";

/** Fewest events (and non-events) per coefficient besides the intercept before the quadratic form is tried. */
const EVENTS_PER_PREDICTOR = 10;

/** The rule for reporting the quadratic form (stated in the JSON). */
export const QUADRATIC_RULE =
  "a quadratic term is tried when the rarer outcome has at least 20 years (10 per slope coefficient, Peduzzi et al. 1996) and the index has at least 3 distinct values, and is reported only when it is clearly better than the straight logit: likelihood-ratio test of the quadratic term p < 0.05 (chi-square, 1 df) AND a lower AIC, both fits by the same method";

export interface ResponseCurveOptions {
  /** Report the curve at {@link CURVE_POINTS} values (default true). */
  readonly points?: boolean;
}

export type ResponseCurveResult =
  | { readonly curve: ResponseCurve; readonly reason?: undefined }
  | { readonly curve: null; readonly reason: string };

/**
 * Logistic response curve of high-fire year on the index value: the odds of a high-fire year as a
 * smooth function of how strong the index is, instead of one number per phase.
 *
 * Fits logit P(high-fire year) = intercept + slope × value by maximum likelihood (Newton–Raphson, i.e.
 * iteratively reweighted least squares, to 1e-10), refitted by Firth's penalized likelihood when the
 * maximum-likelihood fit shows separation or does not converge (the result says which method gave it).
 * The p-value is the likelihood-ratio test of the slope (chi-square, 1 df). The curve is reported at
 * {@link CURVE_POINTS} evenly spaced values from the smallest to the largest calibration value, each with a
 * pointwise 95% Wald band on the logit scale: logit ± 1.96 × √(rowᵀ Σ row), with Σ the covariance of the
 * coefficients, then transformed back to probability. A quadratic-logit form (intercept + b1 value +
 * b2 value²) is tried when there is enough data and reported only when it is clearly better
 * ({@link QUADRATIC_RULE}); otherwise `quadratic` is null with a reason that gives the test.
 *
 * @param values - the index value of each calibration year (finite numbers)
 * @param outcomes - whether each of those years was a high-fire year, same length
 * @param options - `points: false` leaves the reported curve points out (`points: []`), for callers that
 *   only read the curve at one value (the outlook's rule, resampling); the fit is the same
 * @returns the fitted curve; degenerate cases give `curve: null` and a reason: no years, no high-fire year or
 *   no other year (nothing to fit), fewer than two distinct index values, or a fit that the logistic
 *   regression cannot identify or that does not converge
 * @throws RangeError when the lengths differ or a value is not finite (a programming error)
 * @example
 * fitResponseCurve([-1, -0.5, 0, 0.5, 1, 1.5], [false, false, true, false, true, true]);
 * // => { curve: { intercept, slope > 0, pValue, points: 41 × { value, estimate, lower, upper }, … } }
 * @see Agresti A. (2013) Categorical Data Analysis, 3rd ed., Wiley, §4.6 and §5.1 (logistic regression by
 *   Newton–Raphson; likelihood-ratio tests; Wald intervals for the fitted probability, §4.2.5).
 * @see Firth D. (1993) "Bias reduction of maximum likelihood estimates", Biometrika 80(1):27–38.
 * @see Akaike H. (1974) "A new look at the statistical model identification", IEEE Transactions on
 *   Automatic Control 19(6):716–723 (AIC).
 * @see Peduzzi P., Concato J., Kemper E., Holford T.R., Feinstein A.R. (1996) "A simulation study of the
 *   number of events per variable in logistic regression analysis", Journal of Clinical Epidemiology
 *   49(12):1373–1379 (at least 10 events per predictor).
 */
export function fitResponseCurve(
  values: readonly number[],
  outcomes: readonly boolean[],
  options: ResponseCurveOptions = {},
): ResponseCurveResult {
  if (values.length !== outcomes.length) throw new RangeError("fitResponseCurve: values and outcomes differ in length");
  for (const value of values) if (!Number.isFinite(value)) throw new RangeError(`fitResponseCurve: value ${value} is not finite`);
  const n = values.length;
  if (n === 0) return { curve: null, reason: "no calibration years with a value of this index" };
  const events = outcomes.filter(Boolean).length;
  if (events === 0) return { curve: null, reason: "no high-fire year among the calibration years with a value of this index" };
  if (events === n) return { curve: null, reason: "every calibration year with a value of this index is a high-fire year" };
  let min = Infinity;
  let max = -Infinity;
  for (const value of values) {
    if (value < min) min = value;
    if (value > max) max = value;
  }
  if (!(max > min)) return { curve: null, reason: "the index has the same value in every calibration year, so no slope can be fitted" };
  const linear = logisticRegression(
    values.map((value) => [value]),
    outcomes,
  );
  const problem = fitProblem(linear);
  if (problem !== null) return { curve: null, reason: problem };
  const [intercept, slope] = linear.coefficients as [number, number];
  const covariance = linear.covariance;
  const grid = options.points === false ? [] : gridOf(min, max);
  const points = grid.map((value) => pointAt(linear.coefficients, covariance, [1, value], value));
  const aic = -2 * linear.logLikelihood + 2 * 2;
  const quadraticResult = fitQuadratic(values, outcomes, linear, aic, grid, events);
  return {
    curve: {
      intercept,
      slope,
      standardErrors: [linear.standardErrors[0] as number, linear.standardErrors[1] as number],
      covariance,
      likelihoodRatio: linear.likelihoodRatio,
      pValue: linear.pValue,
      method: linear.method,
      separation: linear.separation,
      converged: linear.converged,
      iterations: linear.iterations,
      aic,
      years: n,
      fireYears: events,
      range: { min, max },
      band: CURVE_BAND,
      level: 0.95,
      points,
      quadratic: quadraticResult.quadratic,
      ...(quadraticResult.reason === undefined ? {} : { quadraticReason: quadraticResult.reason }),
      quadraticRule: QUADRATIC_RULE,
    },
  };
}

/** A curve read at one value: the estimate and 95% band, with the value clamped to the calibration range. */
export interface CurveReading {
  readonly value: number;
  readonly readAt: number;
  readonly beyondRange: "above" | "below" | null;
  readonly estimate: number;
  readonly lower: number;
  readonly upper: number;
  readonly form: "linear" | "quadratic";
}

/**
 * Reads a response curve at a value: the quadratic form when it was reported, else the straight logit,
 * with the pointwise 95% Wald band on the logit scale. A value beyond the calibration range is not
 * extrapolated: the curve is read at the nearest end of the range and `beyondRange` says so.
 *
 * Formula: with the row r = [1, v] (or [1, v, v²]) at the read value v, logit = bᵀr, se = √(rᵀ Σ r), and the
 * estimate and band are expit(logit) and expit(logit ∓ 1.96 se).
 *
 * @param curve - a fitted curve (see {@link fitResponseCurve})
 * @param value - the value to read at (finite)
 * @returns the reading; there is no degenerate case once a curve exists
 * @throws RangeError when the value is not finite
 * @example
 * // O-ring fit (Agresti 2007, Table 5.10 data): 31 °F lies below the coldest launch, so the curve is read at 53 °F
 * readResponseCurve(fitResponseCurve(temperatures, distress).curve, 31);
 * // => { value: 31, readAt: 53, beyondRange: "below", estimate: 0.939, … }
 * @see Agresti A. (2013) Categorical Data Analysis, 3rd ed., Wiley, §4.2.5 (Wald interval for the fitted probability).
 */
export function readResponseCurve(curve: ResponseCurve, value: number): CurveReading {
  if (!Number.isFinite(value)) throw new RangeError(`readResponseCurve: value ${value} is not finite`);
  const beyondRange = value > curve.range.max ? "above" : value < curve.range.min ? "below" : null;
  const readAt = beyondRange === "above" ? curve.range.max : beyondRange === "below" ? curve.range.min : value;
  const quadratic = curve.quadratic;
  const point =
    quadratic === null
      ? pointAt([curve.intercept, curve.slope], curve.covariance, [1, readAt], readAt)
      : pointAt(quadratic.coefficients, quadratic.covariance, [1, readAt, readAt * readAt], readAt);
  return { value, readAt, beyondRange, estimate: point.estimate, lower: point.lower, upper: point.upper, form: quadratic === null ? "linear" : "quadratic" };
}

function fitQuadratic(
  values: readonly number[],
  outcomes: readonly boolean[],
  linear: LogisticRegressionFit,
  linearAic: number,
  grid: readonly number[],
  events: number,
): { quadratic: QuadraticResponse | null; reason?: string } {
  const rarer = Math.min(events, values.length - events);
  if (rarer < 2 * EVENTS_PER_PREDICTOR) {
    return { quadratic: null, reason: `not tried: the rarer outcome has ${rarer} years, fewer than ${2 * EVENTS_PER_PREDICTOR}` };
  }
  if (new Set(values).size < 3) return { quadratic: null, reason: "not tried: fewer than 3 distinct index values" };
  const fit = logisticRegression(
    values.map((value) => [value, value * value]),
    outcomes,
  );
  const problem = fitProblem(fit);
  if (problem !== null) return { quadratic: null, reason: `not reported: ${problem}` };
  if (fit.method !== linear.method) {
    return { quadratic: null, reason: `not reported: the straight and quadratic fits used different methods (${linear.method}, ${fit.method}), so they cannot be compared` };
  }
  const likelihoodRatio = Math.max(0, 2 * (fit.logLikelihood - linear.logLikelihood));
  const pValue = chiSquareUpperTail(likelihoodRatio, 1);
  const aic = -2 * fit.logLikelihood + 2 * 3;
  if (!(pValue < 0.05 && aic < linearAic)) {
    return {
      quadratic: null,
      reason: `not clearly better than the straight logit: likelihood-ratio p = ${pValue.toPrecision(2)}, AIC ${aic.toFixed(1)} against ${linearAic.toFixed(1)}`,
    };
  }
  const coefficients = fit.coefficients as readonly [number, number, number];
  return {
    quadratic: {
      coefficients: [coefficients[0], coefficients[1], coefficients[2]],
      standardErrors: [fit.standardErrors[0] as number, fit.standardErrors[1] as number, fit.standardErrors[2] as number],
      likelihoodRatio,
      pValue,
      aic,
      method: fit.method,
      points: grid.map((value) => pointAt(coefficients, fit.covariance, [1, value, value * value], value)),
      covariance: fit.covariance,
    },
  };
}

function fitProblem(fit: LogisticRegressionFit): string | null {
  if (fit.reason !== undefined) return `the logistic regression cannot be fitted: ${fit.reason}`;
  if (!fit.converged) return `the logistic regression did not converge (${fit.method}, ${fit.iterations} iterations)`;
  if (!fit.coefficients.every(Number.isFinite) || !fit.standardErrors.every(Number.isFinite)) {
    return "the logistic regression gave no finite estimate";
  }
  return null;
}

function gridOf(min: number, max: number): number[] {
  const grid: number[] = [];
  for (let i = 0; i < CURVE_POINTS; i += 1) grid.push(i === CURVE_POINTS - 1 ? max : min + ((max - min) * i) / (CURVE_POINTS - 1));
  return grid;
}

function pointAt(
  coefficients: readonly number[],
  covariance: readonly (readonly number[])[],
  row: readonly number[],
  value: number,
): ResponseCurvePoint {
  let logit = 0;
  for (let i = 0; i < row.length; i += 1) logit += (coefficients[i] as number) * (row[i] as number);
  let variance = 0;
  for (let i = 0; i < row.length; i += 1) {
    for (let j = 0; j < row.length; j += 1) variance += (row[i] as number) * ((covariance[i] as readonly number[])[j] as number) * (row[j] as number);
  }
  const half = Z_975 * Math.sqrt(Math.max(0, variance));
  return { value, estimate: logistic(logit), lower: logistic(logit - half), upper: logistic(logit + half) };
}

function logistic(logit: number): number {
  return logit >= 0 ? 1 / (1 + Math.exp(-logit)) : Math.exp(logit) / (1 + Math.exp(logit));
}
