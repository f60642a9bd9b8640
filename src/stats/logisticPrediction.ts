import normalQuantile from "@stdlib/stats-base-dists-normal-quantile";
import type { LogisticRegressionFit } from "./logisticRegression.js";
import { StatsInputError } from "./StatsInputError.js";

/** Fitted probability with its interval, from {@link logisticPrediction}. */
export interface LogisticPrediction {
  /** Fitted probability expit(η) at the row. */
  readonly estimate: number;
  /** Lower limit expit(η − z·se). */
  readonly lower: number;
  /** Upper limit expit(η + z·se). */
  readonly upper: number;
}

/**
 * Fitted probability of a logistic regression at one predictor row, with a Wald confidence interval built on the
 * logit scale and mapped back.
 *
 * With x = [1, row] and the fitted coefficients b, the linear predictor is η = bᵀx and its standard error is
 * se = √(xᵀVx), V being the fit's covariance matrix (inverse information). The estimate is expit(η) =
 * 1/(1 + e^(−η)) and the limits are expit(η − z·se) and expit(η + z·se) with z = Φ⁻¹((1 + level)/2). Because
 * the interval is formed on the logit scale it always lies inside (0, 1) and contains the estimate; nothing is
 * clamped (limits may round to exactly 0 or 1 in floating point only when |η ± z·se| exceeds about 37).
 *
 * @param fit - a fit from `logisticRegression` (maximum likelihood or Firth; the covariance is used as given).
 * @param row - the predictor values WITHOUT the intercept, in the order of the fit (same length as the fit's
 *   predictors), finite.
 * @param level - two-sided confidence level, strictly between 0 and 1 (default 0.95).
 * @returns `{ estimate, lower, upper }` with 0 ≤ lower ≤ estimate ≤ upper ≤ 1. Degenerate case: when the fit
 *   could not be computed (its coefficients are NaN, e.g. a constant predictor) all three are NaN.
 * @throws {StatsInputError} if the row length does not match the fit, a value is not finite, or level is not
 *   strictly between 0 and 1.
 * @example
 * ```ts
 * // Space shuttle O-ring data (Dalal, Fowlkes & Hoadley 1989): logit = 15.043 − 0.2322·temperature; at 31 °F
 * // the fitted probability of an incident is 0.9996 (as in Agresti 2007, An Introduction to Categorical Data
 * // Analysis, 2nd ed., quoted from memory)
 * logisticPrediction(logisticRegression(temperatures.map((t) => [t]), incidents), [31]);
 * // => { estimate: 0.99961, lower: 0.4816, upper: 0.9999999 }
 * ```
 * @see Hosmer D.W., Lemeshow S., Sturdivant R.X. (2013) Applied Logistic Regression, 3rd ed., Wiley, §1.4
 *   (confidence interval for the logit and for the fitted value, eqs. 1.7–1.8).
 * @see Agresti A. (2013) Categorical Data Analysis, 3rd ed., Wiley, §5.2.
 */
export function logisticPrediction(fit: LogisticRegressionFit, row: readonly number[], level = 0.95): LogisticPrediction {
  if (row.length !== fit.coefficients.length - 1) {
    throw new StatsInputError(
      `the prediction row needs ${fit.coefficients.length - 1} predictor value${fit.coefficients.length === 2 ? "" : "s"} (got ${row.length})`,
    );
  }
  row.forEach((value, index) => {
    if (!Number.isFinite(value)) throw new StatsInputError(`prediction row values must be finite (value ${index} is ${value})`);
  });
  if (!(level > 0 && level < 1)) {
    throw new StatsInputError(`confidence level must be strictly between 0 and 1 (got ${level})`);
  }
  const x = [1, ...row];
  let linear = 0;
  let variance = 0;
  x.forEach((value, r) => {
    linear += value * (fit.coefficients[r] ?? Number.NaN);
    x.forEach((other, c) => {
      variance += value * (fit.covariance[r]?.[c] ?? Number.NaN) * other;
    });
  });
  if (!Number.isFinite(linear) || !Number.isFinite(variance)) {
    return { estimate: Number.NaN, lower: Number.NaN, upper: Number.NaN };
  }
  // xᵀVx ≥ 0 for a positive-definite V; a tiny negative value is rounding.
  const standardError = Math.sqrt(Math.max(0, variance));
  const z = normalQuantile((1 + level) / 2, 0, 1);
  return {
    estimate: expit(linear),
    lower: expit(linear - z * standardError),
    upper: expit(linear + z * standardError),
  };
}

function expit(linear: number): number {
  return linear >= 0 ? 1 / (1 + Math.exp(-linear)) : Math.exp(linear) / (1 + Math.exp(linear));
}
