import { chiSquareUpperTail } from "./chiSquareIndependence.js";
import { StatsInputError } from "./StatsInputError.js";

/** Result of {@link logisticRegression}. Every number is NaN (and `reason` says why) when the model is not identifiable. */
export interface LogisticRegressionFit {
  /** [intercept, b1, b2, …] on the logit scale, in predictor order. */
  readonly coefficients: readonly number[];
  /** √ of the diagonal of `covariance`, same order as `coefficients`. */
  readonly standardErrors: readonly number[];
  /** Inverse of the Fisher information XᵀWX at the returned estimate (for Firth: at the penalized estimate). */
  readonly covariance: readonly (readonly number[])[];
  /** Log-likelihood of the returned fit; for Firth the penalized one, ℓ(β) + ½·ln|XᵀWX|. */
  readonly logLikelihood: number;
  /**
   * Intercept-only model fitted by the same method. For maximum likelihood ℓ at logit(ȳ); for Firth the
   * penalized log-likelihood maximized over the intercept with the slopes held at 0 and the penalty taken from
   * the full design (Heinze & Schemper 2002, §2).
   */
  readonly nullLogLikelihood: number;
  /** 2·(logLikelihood − nullLogLikelihood): the (penalized) likelihood-ratio statistic. */
  readonly likelihoodRatio: number;
  /** Chi-square upper tail of `likelihoodRatio` with df = number of predictors. */
  readonly pValue: number;
  /** Newton (or Firth-modified scoring) iterations of the returned fit. */
  readonly iterations: number;
  /**
   * True when both the largest step and the change in (penalized) log-likelihood fell below the tolerance (for
   * Firth: in the full fit and in the restricted null fit).
   */
  readonly converged: boolean;
  /** True when the maximum-likelihood fit shows complete or quasi-complete separation. */
  readonly separation: boolean;
  readonly method: "maximum likelihood" | "Firth penalized likelihood";
  /** Present only when the fit could not be computed (all numbers NaN): what is wrong with the data. */
  readonly reason?: string;
}

/** Options of {@link logisticRegression}. */
export interface LogisticRegressionOptions {
  /** Fit by Firth's penalized likelihood even when maximum likelihood would do (default false). */
  readonly firth?: boolean;
  /** Convergence tolerance for both the largest coefficient step and the change in log-likelihood (default 1e-10). */
  readonly tolerance?: number;
  /** Largest number of iterations of each fit (default 100). */
  readonly maxIterations?: number;
}

const DEFAULT_TOLERANCE = 1e-10;
const DEFAULT_MAX_ITERATIONS = 100;
/** Largest absolute change of any coefficient in one Firth step (as in Heinze & Ploner's logistf). */
const FIRTH_MAX_STEP = 5;
const MAX_STEP_HALVINGS = 40;
/** A fitted probability this close to 0 or 1 counts as collapsed when maximum likelihood fails to converge. */
const COLLAPSE_PROBABILITY = 1e-8;
/** Relative size below which a design column left after Gram–Schmidt counts as a linear combination of the others. */
const RANK_TOLERANCE = 1e-9;

/**
 * Binary logistic regression by maximum likelihood (Newton–Raphson, which for the logit link is iteratively
 * reweighted least squares), with Firth's penalized likelihood when maximum likelihood has no finite solution.
 *
 * The model is logit P(yᵢ = 1) = β₀ + β₁xᵢ₁ + … + β_p x_ip. Each Newton step solves (XᵀWX)δ = Xᵀ(y − π) with
 * W = diag(πᵢ(1 − πᵢ)), halving the step while the log-likelihood would fall; it stops when both the largest
 * |δ| and the change in log-likelihood are below the tolerance. Standard errors are √ of the diagonal of
 * (XᵀWX)⁻¹ at the estimate. The likelihood-ratio statistic 2(ℓ̂ − ℓ̂₀) against the intercept-only model is
 * referred to chi-square with p degrees of freedom (upper tail).
 *
 * Separation: with one predictor the data are checked directly — (quasi-)complete separation means some cut c
 * has every event at x ≥ c and every non-event at x ≤ c (or the reverse), which includes all outcomes equal;
 * with several predictors it is recognised when Newton–Raphson does not converge while fitted probabilities
 * collapse to 0 or 1. When separation is found, or maximum likelihood does not converge, or `firth` is set,
 * the model is refitted by Firth's penalized likelihood ℓ(β) + ½·ln|XᵀWX| (the Jeffreys-prior penalty), whose
 * gradient is the modified score Σ (yᵢ − πᵢ + hᵢ(½ − πᵢ))xᵢ with hᵢ the diagonal of the weighted hat matrix. It is
 * maximized by Newton's method with the exact Hessian of the penalized log-likelihood (Fisher scoring with XᵀWX
 * where that Hessian is not negative definite), with step halving and the same two-part stopping rule. Its
 * estimates are finite under separation (also when all outcomes are equal). The Firth likelihood-ratio
 * test is the penalized one of Heinze & Schemper: the null fit maximizes the same penalized likelihood over the
 * intercept with the slopes fixed at 0.
 *
 * @param predictors - one row per case with the p ≥ 1 predictor values, WITHOUT an intercept column (a quadratic
 *   term is a second column, e.g. [x, x²]); all rows the same length, all values finite.
 * @param outcomes - the binary outcome of each case (true = event), same length as `predictors`.
 * @param options - `firth` forces the penalized fit; `tolerance` (> 0, default 1e-10); `maxIterations`
 *   (integer ≥ 1, default 100).
 * @returns the fit (see {@link LogisticRegressionFit}); `method` says which likelihood was maximized and
 *   `separation` whether maximum likelihood had no finite estimate. Degenerate case: when the model is not
 *   identifiable — fewer cases than coefficients, a constant predictor, or predictors that are linear
 *   combinations of each other (a singular information matrix) — every number is NaN, `converged` is false and
 *   `reason` says which; a constant predictor cannot be told apart from the intercept.
 * @throws {StatsInputError} if there are no cases, the lengths differ, a row has no predictor or a different
 *   length, a value is not finite, or an option is out of range.
 * @example
 * ```ts
 * // Space shuttle O-ring thermal distress (any incident) on launch temperature (°F), 23 launches
 * // (data of Dalal, Fowlkes & Hoadley 1989; the fit as printed by R glm for this example)
 * logisticRegression(temperatures.map((t) => [t]), incidents);
 * // => { coefficients: [15.043, -0.2322], standardErrors: [7.379, 0.1082], method: "maximum likelihood", … }
 * ```
 * @see Dalal S.R., Fowlkes E.B., Hoadley B. (1989) "Risk analysis of the space shuttle: pre-Challenger prediction
 *   of failure", Journal of the American Statistical Association 84(408):945–957 (the example's data).
 * @see Agresti A. (2013) Categorical Data Analysis, 3rd ed., Wiley, §4.6 and §5.1 (Newton–Raphson / IRLS for
 *   logistic regression, likelihood-ratio tests).
 * @see Albert A., Anderson J.A. (1984) "On the existence of maximum likelihood estimates in logistic regression
 *   models", Biometrika 71(1):1–10, doi:10.1093/biomet/71.1.1 (complete and quasi-complete separation).
 * @see Firth D. (1993) "Bias reduction of maximum likelihood estimates", Biometrika 80(1):27–38,
 *   doi:10.1093/biomet/80.1.27.
 * @see Heinze G., Schemper M. (2002) "A solution to the problem of separation in logistic regression",
 *   Statistics in Medicine 21(16):2409–2419, doi:10.1002/sim.1047.
 */
export function logisticRegression(
  predictors: readonly (readonly number[])[],
  outcomes: readonly boolean[],
  options: LogisticRegressionOptions = {},
): LogisticRegressionFit {
  const tolerance = options.tolerance ?? DEFAULT_TOLERANCE;
  const maxIterations = options.maxIterations ?? DEFAULT_MAX_ITERATIONS;
  validate(predictors, outcomes, tolerance, maxIterations);

  const design = predictors.map((row) => [1, ...row]);
  const y: number[] = outcomes.map((outcome) => (outcome ? 1 : 0));
  const coefficientCount = design[0]?.length ?? 0;
  const predictorCount = coefficientCount - 1;

  const rankProblem = identifiabilityProblem(design, predictors);
  if (rankProblem !== null) return notIdentifiable(coefficientCount, rankProblem);

  const allEqual = y.every((value) => value === y[0]);
  const separatedDirectly =
    allEqual || (predictorCount === 1 && separatedOnOnePredictor(predictors.map((row) => row[0] ?? 0), y));
  // No finite maximum-likelihood estimate exists when the direct check finds separation, so skip that fit.
  const maximumLikelihood = separatedDirectly
    ? null
    : newtonFit(design, y, allFree(coefficientCount), false, tolerance, maxIterations);
  const collapsed = (maximumLikelihood?.fitted ?? []).some(
    (probability) => probability < COLLAPSE_PROBABILITY || probability > 1 - COLLAPSE_PROBABILITY,
  );
  const separation =
    separatedDirectly || (predictorCount > 1 && maximumLikelihood !== null && !maximumLikelihood.converged && collapsed);

  if (!options.firth && !separation && maximumLikelihood !== null && maximumLikelihood.converged) {
    const eventCount = y.reduce((sum, value) => sum + value, 0);
    const mean = eventCount / y.length;
    const nullLogLikelihood = eventCount * Math.log(mean) + (y.length - eventCount) * Math.log(1 - mean);
    return assemble(maximumLikelihood, nullLogLikelihood, predictorCount, separation, "maximum likelihood");
  }

  const penalized = newtonFit(design, y, allFree(coefficientCount), true, tolerance, maxIterations);
  const interceptOnly = allFree(coefficientCount).map((_, index) => index === 0);
  const penalizedNull = newtonFit(design, y, interceptOnly, true, tolerance, maxIterations);
  const both = { ...penalized, converged: penalized.converged && penalizedNull.converged };
  return assemble(both, penalizedNull.logLikelihood, predictorCount, separation, "Firth penalized likelihood");
}

interface NewtonResult {
  coefficients: number[];
  covariance: number[][];
  logLikelihood: number;
  fitted: number[];
  iterations: number;
  converged: boolean;
}

function assemble(
  fit: NewtonResult,
  nullLogLikelihood: number,
  predictorCount: number,
  separation: boolean,
  method: LogisticRegressionFit["method"],
): LogisticRegressionFit {
  // The fit maximizes the same objective over a larger set, so a tiny negative difference is rounding.
  const likelihoodRatio = Math.max(0, 2 * (fit.logLikelihood - nullLogLikelihood));
  return {
    coefficients: fit.coefficients,
    standardErrors: fit.covariance.map((row, index) => Math.sqrt(row[index] ?? Number.NaN)),
    covariance: fit.covariance,
    logLikelihood: fit.logLikelihood,
    nullLogLikelihood,
    likelihoodRatio,
    pValue: Number.isFinite(likelihoodRatio) ? chiSquareUpperTail(likelihoodRatio, predictorCount) : Number.NaN,
    iterations: fit.iterations,
    converged: fit.converged,
    separation,
    method,
  };
}

function notIdentifiable(coefficientCount: number, reason: string): LogisticRegressionFit {
  const nan = Array.from({ length: coefficientCount }, () => Number.NaN);
  return {
    coefficients: nan,
    standardErrors: nan,
    covariance: nan.map(() => nan),
    logLikelihood: Number.NaN,
    nullLogLikelihood: Number.NaN,
    likelihoodRatio: Number.NaN,
    pValue: Number.NaN,
    iterations: 0,
    converged: false,
    separation: false,
    method: "maximum likelihood",
    reason,
  };
}

function validate(
  predictors: readonly (readonly number[])[],
  outcomes: readonly boolean[],
  tolerance: number,
  maxIterations: number,
): void {
  if (predictors.length === 0) {
    throw new StatsInputError("logistic regression needs at least one case (got none)");
  }
  if (predictors.length !== outcomes.length) {
    throw new StatsInputError(
      `logistic regression needs one outcome per predictor row (got ${predictors.length} rows and ${outcomes.length} outcomes)`,
    );
  }
  const width = predictors[0]?.length ?? 0;
  if (width === 0) {
    throw new StatsInputError("logistic regression needs at least one predictor per row (row 0 is empty)");
  }
  predictors.forEach((row, rowIndex) => {
    if (row.length !== width) {
      throw new StatsInputError(
        `logistic regression rows must have equal length (row 0 has ${width} values, row ${rowIndex} has ${row.length})`,
      );
    }
    row.forEach((value, columnIndex) => {
      if (!Number.isFinite(value)) {
        throw new StatsInputError(
          `logistic regression predictors must be finite (row ${rowIndex}, column ${columnIndex} is ${value})`,
        );
      }
    });
  });
  outcomes.forEach((outcome, index) => {
    if (typeof outcome !== "boolean") {
      throw new StatsInputError(`logistic regression outcomes must be true or false (outcome ${index} is ${String(outcome)})`);
    }
  });
  if (!(tolerance > 0) || !Number.isFinite(tolerance)) {
    throw new StatsInputError(`tolerance must be a positive finite number (got ${tolerance})`);
  }
  if (!Number.isInteger(maxIterations) || maxIterations < 1) {
    throw new StatsInputError(`maxIterations must be an integer ≥ 1 (got ${maxIterations})`);
  }
}

/** Why the design [1, X] is not of full column rank, or null when it is. */
function identifiabilityProblem(design: number[][], predictors: readonly (readonly number[])[]): string | null {
  const caseCount = design.length;
  const coefficientCount = design[0]?.length ?? 0;
  if (caseCount < coefficientCount) {
    return `not enough data: ${caseCount} case${caseCount === 1 ? "" : "s"} for ${coefficientCount} coefficients`;
  }
  for (let column = 0; column < coefficientCount - 1; column += 1) {
    const first = predictors[0]?.[column] ?? 0;
    if (predictors.every((row) => row[column] === first)) {
      return `predictor ${column + 1} is constant (${first} in every case), so its slope cannot be told apart from the intercept`;
    }
  }
  // Modified Gram–Schmidt on the columns of the design: a column whose remainder is tiny relative to its own
  // length is (numerically) a linear combination of the columns before it.
  const basis: number[][] = [];
  for (let column = 0; column < coefficientCount; column += 1) {
    const vector = design.map((row) => row[column] ?? 0);
    const length = Math.hypot(...vector);
    for (const unit of basis) {
      const projection = dot(unit, vector);
      for (let index = 0; index < caseCount; index += 1) vector[index] = (vector[index] ?? 0) - projection * (unit[index] ?? 0);
    }
    const remainder = Math.hypot(...vector);
    if (!(remainder > RANK_TOLERANCE * length)) {
      return `predictor ${column} is a linear combination of the intercept and the predictors before it (singular information matrix)`;
    }
    basis.push(vector.map((value) => value / remainder));
  }
  return null;
}

/**
 * Direct check for (quasi-)complete separation with one predictor: a cut c with all events at x ≥ c and all
 * non-events at x ≤ c, or the reverse (Albert & Anderson 1984). All outcomes equal is separated too.
 */
function separatedOnOnePredictor(x: readonly number[], y: readonly number[]): boolean {
  let eventMin = Number.POSITIVE_INFINITY;
  let eventMax = Number.NEGATIVE_INFINITY;
  let nonEventMin = Number.POSITIVE_INFINITY;
  let nonEventMax = Number.NEGATIVE_INFINITY;
  x.forEach((value, index) => {
    if (y[index] === 1) {
      eventMin = Math.min(eventMin, value);
      eventMax = Math.max(eventMax, value);
    } else {
      nonEventMin = Math.min(nonEventMin, value);
      nonEventMax = Math.max(nonEventMax, value);
    }
  });
  if (!Number.isFinite(eventMin) || !Number.isFinite(nonEventMin)) return true;
  return nonEventMax <= eventMin || eventMax <= nonEventMin;
}

function allFree(count: number): boolean[] {
  return Array.from({ length: count }, () => true);
}

/**
 * Newton–Raphson for the log-likelihood (penalized = false) or for Firth's penalized log-likelihood (penalized =
 * true: exact Hessian, Fisher scoring where that is not negative definite), over the coefficients marked free (the
 * others stay at 0), with step halving.
 */
function newtonFit(
  design: number[][],
  y: number[],
  free: boolean[],
  penalized: boolean,
  tolerance: number,
  maxIterations: number,
): NewtonResult {
  const coefficientCount = free.length;
  const freeIndices = free.flatMap((isFree, index) => (isFree ? [index] : []));
  let coefficients = Array.from({ length: coefficientCount }, () => 0);
  let state = evaluate(design, y, coefficients, penalized);
  let converged = false;
  let iterations = 0;
  while (iterations < maxIterations && !converged) {
    iterations += 1;
    const score = penalized ? firthScore(design, state) : plainScore(design, state.residuals);
    const freeScore = freeIndices.map((index) => score[index] ?? 0);
    const block = (matrix: number[][]) => freeIndices.map((row) => freeIndices.map((column) => matrix[row]?.[column] ?? 0));
    // Maximum likelihood: Newton–Raphson, whose Hessian for the logit link is −XᵀWX. Firth: Newton on the penalized
    // log-likelihood with its exact Hessian where that is negative definite, else Fisher scoring with XᵀWX.
    let step: number[] | null = null;
    if (penalized) {
      const curvature = penalizedNegativeHessian(design, state);
      if (curvature !== null) step = solve(block(curvature), freeScore);
    }
    step ??= solve(block(state.information), freeScore);
    if (step === null || step.some((value) => !Number.isFinite(value))) break;
    let scale = 1;
    if (penalized) {
      const largest = Math.max(...step.map(Math.abs));
      if (largest > FIRTH_MAX_STEP) scale = FIRTH_MAX_STEP / largest;
    }
    let candidate = coefficients;
    let candidateState = state;
    let halvings = 0;
    for (; halvings <= MAX_STEP_HALVINGS; halvings += 1) {
      candidate = coefficients.slice();
      freeIndices.forEach((index, position) => {
        candidate[index] = (candidate[index] ?? 0) + scale * (step[position] ?? 0);
      });
      candidateState = evaluate(design, y, candidate, penalized);
      if (candidateState.logLikelihood >= state.logLikelihood - tolerance) break;
      scale /= 2;
    }
    if (halvings > MAX_STEP_HALVINGS || !Number.isFinite(candidateState.logLikelihood)) break;
    const largestStep = Math.max(...freeIndices.map((index) => Math.abs((candidate[index] ?? 0) - (coefficients[index] ?? 0))));
    const change = Math.abs(candidateState.logLikelihood - state.logLikelihood);
    coefficients = candidate;
    state = candidateState;
    converged = largestStep < tolerance && change < tolerance;
  }
  const inverse = invert(state.information);
  return {
    coefficients,
    covariance: inverse ?? state.information.map((row) => row.map(() => Number.NaN)),
    logLikelihood: state.logLikelihood,
    fitted: state.fitted,
    iterations,
    converged,
  };
}

interface FitState {
  fitted: number[];
  /** yᵢ − πᵢ computed without cancellation (from expit(−η) when yᵢ = 1), so it does not round to 0 as π → 1. */
  residuals: number[];
  weights: number[];
  information: number[][];
  logLikelihood: number;
}

function evaluate(design: number[][], y: number[], coefficients: number[], penalized: boolean): FitState {
  const coefficientCount = coefficients.length;
  const fitted: number[] = [];
  const residuals: number[] = [];
  const weights: number[] = [];
  const information = Array.from({ length: coefficientCount }, () => Array.from({ length: coefficientCount }, () => 0));
  let logLikelihood = 0;
  design.forEach((row, caseIndex) => {
    const linear = dot(row, coefficients);
    // ℓᵢ = yᵢη − ln(1 + e^η), written so that neither exp overflows.
    logLikelihood += (y[caseIndex] ?? 0) * linear - softplus(linear);
    const probability = expit(linear);
    const expNegative = Math.exp(-Math.abs(linear));
    const weight = expNegative / ((1 + expNegative) * (1 + expNegative));
    fitted.push(probability);
    residuals.push((y[caseIndex] ?? 0) === 1 ? expit(-linear) : -probability);
    weights.push(weight);
    for (let r = 0; r < coefficientCount; r += 1) {
      const informationRow = information[r] as number[];
      for (let c = 0; c < coefficientCount; c += 1) {
        informationRow[c] = (informationRow[c] ?? 0) + weight * (row[r] ?? 0) * (row[c] ?? 0);
      }
    }
  });
  if (penalized) {
    const logDeterminant = logDeterminantOf(information);
    logLikelihood = logDeterminant === null ? Number.NEGATIVE_INFINITY : logLikelihood + logDeterminant / 2;
  }
  return { fitted, residuals, weights, information, logLikelihood };
}

function plainScore(design: number[][], residuals: number[]): number[] {
  const coefficientCount = design[0]?.length ?? 0;
  const score = Array.from({ length: coefficientCount }, () => 0);
  design.forEach((row, caseIndex) => {
    const residual = residuals[caseIndex] ?? 0;
    for (let r = 0; r < coefficientCount; r += 1) score[r] = (score[r] ?? 0) + residual * (row[r] ?? 0);
  });
  return score;
}

/** Firth's modified score Σ (yᵢ − πᵢ + hᵢ(½ − πᵢ))xᵢ, hᵢ = wᵢ xᵢᵀ(XᵀWX)⁻¹xᵢ (full design). */
function firthScore(design: number[][], state: FitState): number[] {
  const coefficientCount = design[0]?.length ?? 0;
  const inverse = invert(state.information);
  const score = Array.from({ length: coefficientCount }, () => 0);
  if (inverse === null) return score.map(() => Number.NaN);
  design.forEach((row, caseIndex) => {
    const probability = state.fitted[caseIndex] ?? 0;
    const leverage = (state.weights[caseIndex] ?? 0) * quadraticForm(inverse, row);
    const residual = (state.residuals[caseIndex] ?? 0) + leverage * (0.5 - probability);
    for (let r = 0; r < coefficientCount; r += 1) score[r] = (score[r] ?? 0) + residual * (row[r] ?? 0);
  });
  return score;
}

/**
 * −∇²[ℓ(β) + ½ ln|I(β)|] with I = XᵀWX: I − ½[tr(I⁻¹I_rs) − tr(I⁻¹I_s I⁻¹I_r)], where I_r = Σ wᵢ(1 − 2πᵢ)x_ir xᵢxᵢᵀ and
 * I_rs = Σ wᵢ(1 − 6πᵢ + 6πᵢ²)x_ir x_is xᵢxᵢᵀ are the derivatives of I. Null when I is singular.
 */
function penalizedNegativeHessian(design: number[][], state: FitState): number[][] | null {
  const size = design[0]?.length ?? 0;
  const inverse = invert(state.information);
  if (inverse === null) return null;
  const firstDerivatives = Array.from({ length: size }, () =>
    Array.from({ length: size }, () => Array.from({ length: size }, () => 0)),
  );
  const traceSecond = Array.from({ length: size }, () => Array.from({ length: size }, () => 0));
  design.forEach((row, caseIndex) => {
    const probability = state.fitted[caseIndex] ?? 0;
    const weight = state.weights[caseIndex] ?? 0;
    const first = weight * (1 - 2 * probability);
    const second = weight * (1 - 6 * probability + 6 * probability * probability);
    const leverageLike = quadraticForm(inverse, row);
    for (let r = 0; r < size; r += 1) {
      const derivative = firstDerivatives[r] as number[][];
      const xr = row[r] ?? 0;
      for (let a = 0; a < size; a += 1) {
        const derivativeRow = derivative[a] as number[];
        for (let b = 0; b < size; b += 1) {
          derivativeRow[b] = (derivativeRow[b] ?? 0) + first * xr * (row[a] ?? 0) * (row[b] ?? 0);
        }
      }
      const traceRow = traceSecond[r] as number[];
      for (let c = 0; c < size; c += 1) traceRow[c] = (traceRow[c] ?? 0) + second * xr * (row[c] ?? 0) * leverageLike;
    }
  });
  const products = firstDerivatives.map((derivative) => multiply(inverse, derivative));
  return state.information.map((informationRow, r) =>
    informationRow.map((value, c) => {
      let traceOfProducts = 0;
      const left = products[c] as number[][];
      const right = products[r] as number[][];
      for (let a = 0; a < size; a += 1) {
        for (let b = 0; b < size; b += 1) traceOfProducts += (left[a]?.[b] ?? 0) * (right[b]?.[a] ?? 0);
      }
      return value - 0.5 * ((traceSecond[r]?.[c] ?? 0) - traceOfProducts);
    }),
  );
}

function multiply(left: readonly (readonly number[])[], right: readonly (readonly number[])[]): number[][] {
  return left.map((row) =>
    (right[0] ?? []).map((_, c) => row.reduce((sum, value, k) => sum + value * (right[k]?.[c] ?? 0), 0)),
  );
}

function expit(linear: number): number {
  return linear >= 0 ? 1 / (1 + Math.exp(-linear)) : Math.exp(linear) / (1 + Math.exp(linear));
}

function softplus(linear: number): number {
  return Math.max(linear, 0) + Math.log1p(Math.exp(-Math.abs(linear)));
}

function dot(left: readonly number[], right: readonly number[]): number {
  let sum = 0;
  for (let index = 0; index < left.length; index += 1) sum += (left[index] ?? 0) * (right[index] ?? 0);
  return sum;
}

function quadraticForm(matrix: readonly (readonly number[])[], vector: readonly number[]): number {
  let sum = 0;
  matrix.forEach((row, r) => {
    sum += (vector[r] ?? 0) * dot(row, vector);
  });
  return sum;
}

/** Cholesky factor L (lower) of a symmetric positive-definite matrix, or null when it is not positive definite. */
function cholesky(matrix: readonly (readonly number[])[]): number[][] | null {
  const size = matrix.length;
  const lower = Array.from({ length: size }, () => Array.from({ length: size }, () => 0));
  for (let r = 0; r < size; r += 1) {
    const lowerRow = lower[r] as number[];
    for (let c = 0; c <= r; c += 1) {
      const otherRow = lower[c] as number[];
      let sum = matrix[r]?.[c] ?? 0;
      for (let k = 0; k < c; k += 1) sum -= (lowerRow[k] ?? 0) * (otherRow[k] ?? 0);
      if (r === c) {
        if (!(sum > 0) || !Number.isFinite(sum)) return null;
        lowerRow[c] = Math.sqrt(sum);
      } else {
        lowerRow[c] = sum / (otherRow[c] ?? Number.NaN);
      }
    }
  }
  return lower;
}

function solve(matrix: readonly (readonly number[])[], vector: readonly number[]): number[] | null {
  const lower = cholesky(matrix);
  if (lower === null) return null;
  const size = vector.length;
  const forward = Array.from({ length: size }, () => 0);
  for (let r = 0; r < size; r += 1) {
    let sum = vector[r] ?? 0;
    for (let k = 0; k < r; k += 1) sum -= (lower[r]?.[k] ?? 0) * (forward[k] ?? 0);
    forward[r] = sum / (lower[r]?.[r] ?? Number.NaN);
  }
  const solution = Array.from({ length: size }, () => 0);
  for (let r = size - 1; r >= 0; r -= 1) {
    let sum = forward[r] ?? 0;
    for (let k = r + 1; k < size; k += 1) sum -= (lower[k]?.[r] ?? 0) * (solution[k] ?? 0);
    solution[r] = sum / (lower[r]?.[r] ?? Number.NaN);
  }
  return solution;
}

function invert(matrix: readonly (readonly number[])[]): number[][] | null {
  const size = matrix.length;
  const columns: number[][] = [];
  for (let c = 0; c < size; c += 1) {
    const column = solve(
      matrix,
      Array.from({ length: size }, (_, r) => (r === c ? 1 : 0)),
    );
    if (column === null) return null;
    columns.push(column);
  }
  // Symmetrize: the inverse of a symmetric matrix is symmetric; rounding may differ in the last digit.
  return Array.from({ length: size }, (_, r) =>
    Array.from({ length: size }, (_, c) => ((columns[c]?.[r] ?? 0) + (columns[r]?.[c] ?? 0)) / 2),
  );
}

function logDeterminantOf(matrix: readonly (readonly number[])[]): number | null {
  const lower = cholesky(matrix);
  if (lower === null) return null;
  return 2 * lower.reduce((sum, row, index) => sum + Math.log(row[index] ?? Number.NaN), 0);
}
