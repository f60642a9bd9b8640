import { StatsInputError } from "./StatsInputError.js";

/**
 * One pooled block of the pool-adjacent-violators algorithm: a run of adjacent distinct x values whose
 * fitted value is the weighted mean of their responses.
 */
interface PooledBlock {
  /** Sum of weights (here: number of cases) in the block. */
  weight: number;
  /** Weighted mean of the responses in the block: the block's fitted value. */
  mean: number;
  /** Number of distinct-x groups merged into this block. */
  groups: number;
}

/**
 * Weighted pool-adjacent-violators fit over groups already in increasing order of x: the least-squares
 * non-decreasing sequence for the group means `means` with weights `weights`. Internal helper shared with
 * the CORP reliability curve, which refits it for every resample.
 *
 * @param means - the response mean of each group, in increasing order of x.
 * @param weights - the positive weight (case count) of each group.
 * @returns the fitted (pooled) value of each group, non-decreasing.
 */
export function poolAdjacentViolators(means: readonly number[], weights: readonly number[]): number[] {
  const blocks: PooledBlock[] = [];
  for (let group = 0; group < means.length; group += 1) {
    let current: PooledBlock = { weight: weights[group] as number, mean: means[group] as number, groups: 1 };
    // Pool backwards while the previous block's mean exceeds the current one (an adjacent violator).
    while (blocks.length > 0 && (blocks[blocks.length - 1] as PooledBlock).mean > current.mean) {
      const previous = blocks.pop() as PooledBlock;
      const weight = previous.weight + current.weight;
      current = {
        weight,
        mean: (previous.weight * previous.mean + current.weight * current.mean) / weight,
        groups: previous.groups + current.groups,
      };
    }
    blocks.push(current);
  }
  const fitted: number[] = [];
  for (const block of blocks) {
    for (let member = 0; member < block.groups; member += 1) {
      fitted.push(block.mean);
    }
  }
  return fitted;
}

/** Reusable buffers of {@link poolAdjacentViolatorsInto} for up to `size` groups. */
export interface PavScratch {
  readonly weight: Float64Array;
  readonly mean: Float64Array;
  readonly groups: Int32Array;
}

/** Allocates {@link PavScratch} for up to `size` groups. */
export function pavScratch(size: number): PavScratch {
  return { weight: new Float64Array(size), mean: new Float64Array(size), groups: new Int32Array(size) };
}

/**
 * {@link poolAdjacentViolators} without allocating, for resampling loops: the same blocks, pooled in the same
 * order with the same arithmetic (so bit for bit the same fitted values), written to `out[offset + stride·g]`
 * for group g = 0 … count − 1.
 *
 * @param means - group means, ascending x, read at 0 … count − 1.
 * @param weights - group weights, same layout.
 * @param count - number of groups (at most the scratch size).
 * @param out - where the fitted values go.
 * @param offset - position of group 0's value in `out`.
 * @param stride - distance between consecutive groups' values in `out`.
 * @param scratch - buffers from {@link pavScratch}.
 * @example
 * const out = new Float64Array(3);
 * poolAdjacentViolatorsInto([0.5, 0.2, 0.9], [1, 1, 2], 3, out, 0, 1, pavScratch(3)); // out => [0.35, 0.35, 0.9]
 */
export function poolAdjacentViolatorsInto(
  means: ArrayLike<number>,
  weights: ArrayLike<number>,
  count: number,
  out: Float64Array,
  offset: number,
  stride: number,
  scratch: PavScratch,
): void {
  const { weight, mean, groups } = scratch;
  let top = 0;
  for (let group = 0; group < count; group += 1) {
    let currentWeight = weights[group] as number;
    let currentMean = means[group] as number;
    let currentGroups = 1;
    while (top > 0 && (mean[top - 1] as number) > currentMean) {
      top -= 1;
      const previousWeight = weight[top] as number;
      const pooled = previousWeight + currentWeight;
      currentMean = (previousWeight * (mean[top] as number) + currentWeight * currentMean) / pooled;
      currentWeight = pooled;
      currentGroups += groups[top] as number;
    }
    weight[top] = currentWeight;
    mean[top] = currentMean;
    groups[top] = currentGroups;
    top += 1;
  }
  let position = offset;
  for (let block = 0; block < top; block += 1) {
    const value = mean[block] as number;
    for (let member = groups[block] as number; member > 0; member -= 1) {
      out[position] = value;
      position += stride;
    }
  }
}

/**
 * Isotonic regression by the pool-adjacent-violators algorithm (PAV): the non-decreasing fit of y on x
 * that minimizes the sum of squared errors.
 *
 * Cases are ordered by x; cases with equal x are pooled first into one group (their mean response, weighted
 * by their count), so equal x always get equal fitted values. Going up in x, whenever a group's mean is
 * below the mean of the block before it (an adjacent violator) the two are pooled into one block whose value
 * is their weighted mean, and pooling continues backwards until the block means are non-decreasing. Each
 * case's fitted value is the mean of its block. For binary y the fitted values are the maximum-likelihood
 * non-decreasing event probabilities (Ayer et al. 1955).
 *
 * @param x - the ordering variable, finite numbers (any order; ties allowed).
 * @param y - the responses, finite numbers (0/1 for a binary outcome), one per x.
 * @returns the fitted value for each input case, in input order; `[]` for empty input. The fit is a
 *   non-decreasing step function of x; with all x equal every fitted value is the mean of y.
 * @throws {@link StatsInputError} when x and y differ in length or hold a value that is not finite.
 * @example
 * ```ts
 * // Robert & Casella (2004), Monte Carlo Statistical Methods, 2nd ed., exercise 1.18 (from memory):
 * isotonicRegression([1, 2, 3, 4], [23, 27, 25, 28]); // => [23, 26, 26, 28]
 * ```
 * @see Ayer M., Brunk H.D., Ewing G.M., Reid W.T., Silverman E. (1955) "An empirical distribution function
 *   for sampling with incomplete information", Annals of Mathematical Statistics 26(4):641–647.
 * @see Barlow R.E., Bartholomew D.J., Bremner J.M., Brunk H.D. (1972) Statistical Inference under Order
 *   Restrictions, Wiley, London, chapter 1 (the pool-adjacent-violators algorithm).
 */
export function isotonicRegression(x: readonly number[], y: readonly number[]): number[] {
  if (x.length !== y.length) {
    throw new StatsInputError(`isotonicRegression: x and y differ in length (${x.length} and ${y.length})`);
  }
  for (let index = 0; index < x.length; index += 1) {
    if (!Number.isFinite(x[index]) || !Number.isFinite(y[index])) {
      throw new StatsInputError(
        `isotonicRegression: x and y must be finite numbers (position ${index}: x ${String(x[index])}, ` +
          `y ${String(y[index])})`,
      );
    }
  }
  const order = x.map((_, index) => index).sort((a, b) => (x[a] as number) - (x[b] as number) || a - b);
  // Pool cases with equal x into groups (in increasing x).
  const groupOfCase = new Array<number>(x.length);
  const means: number[] = [];
  const weights: number[] = [];
  let previousX = Number.NaN;
  let sum = 0;
  let count = 0;
  for (const index of order) {
    const value = x[index] as number;
    if (count > 0 && value !== previousX) {
      means.push(sum / count);
      weights.push(count);
      sum = 0;
      count = 0;
    }
    previousX = value;
    sum += y[index] as number;
    count += 1;
    groupOfCase[index] = means.length;
  }
  if (count > 0) {
    means.push(sum / count);
    weights.push(count);
  }
  const fittedGroups = poolAdjacentViolators(means, weights);
  return groupOfCase.map((group) => fittedGroups[group] as number);
}
