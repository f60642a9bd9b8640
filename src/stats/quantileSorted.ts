import { StatsInputError } from "./StatsInputError.js";

/**
 * Sample quantile of sorted data, Hyndman & Fan type 7 (linear interpolation between order statistics; the
 * default of R's `quantile`, of NumPy's `percentile` and of spreadsheet `PERCENTILE.INC`).
 *
 * For n sorted values x₍₁₎ ≤ … ≤ x₍ₙ₎ and probability p, let h = (n − 1)·p, j = ⌊h⌋ and g = h − j; the
 * quantile is x₍ⱼ₊₁₎ + g·(x₍ⱼ₊₂₎ − x₍ⱼ₊₁₎) (one-based order statistics), so p = 0 gives the minimum and
 * p = 1 the maximum. Ties need no special rule: equal order statistics interpolate to themselves.
 *
 * @param sorted - the sample sorted ascending (finite numbers); the order is checked, the array not modified.
 * @param p - the probability, a number in [0, 1].
 * @returns the type-7 quantile; `NaN` when `sorted` is empty (no quantile is defined).
 * @throws {@link StatsInputError} when p is not in [0, 1] or `sorted` is not ascending or holds NaN.
 * @example
 * ```ts
 * const years = Array.from({ length: 30 }, (_, i) => i + 1); // 1 … 30
 * quantileSorted(years, 1 / 3); // => 10.667 (lower tercile boundary)
 * quantileSorted(years, 2 / 3); // => 20.333 (upper tercile boundary)
 * ```
 * @see Hyndman R.J., Fan Y. (1996) "Sample quantiles in statistical packages", The American Statistician
 * 50(4):361–365, doi:10.1080/00031305.1996.10473566 (definition 7).
 */
export function quantileSorted(sorted: readonly number[], p: number): number {
  if (!(p >= 0 && p <= 1)) {
    throw new StatsInputError(`quantileSorted: p must be in [0, 1] (got ${String(p)})`);
  }
  const count = sorted.length;
  for (let index = 0; index < count; index += 1) {
    const value = sorted[index] as number;
    if (Number.isNaN(value) || (index > 0 && value < (sorted[index - 1] as number))) {
      throw new StatsInputError(
        `quantileSorted: values must be sorted ascending and not NaN (position ${index}: ${String(value)})`,
      );
    }
  }
  if (count === 0) {
    return Number.NaN;
  }
  const position = (count - 1) * p;
  const lowerIndex = Math.floor(position);
  const fraction = position - lowerIndex;
  const lowerValue = sorted[lowerIndex] as number;
  if (fraction === 0) {
    return lowerValue;
  }
  const upperValue = sorted[lowerIndex + 1] as number;
  return lowerValue + fraction * (upperValue - lowerValue);
}
