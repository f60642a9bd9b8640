import hypergeometricPmf from "@stdlib/stats-base-dists-hypergeometric-pmf";
import { StatsInputError } from "./StatsInputError.js";

/**
 * Fisher's exact test for a 2 × 2 contingency table (conditional on both margins).
 *
 * With the margins fixed, the top-left count X follows a hypergeometric distribution: for a table
 * [[a, b], [c, d]] with n = a + b + c + d, P(X = x) = C(a + b, x)·C(c + d, a + c − x)/C(n, a + c), for x from
 * max(0, a + c − (c + d)) to min(a + b, a + c). The one-sided p-values are pLess = P(X ≤ a) (odds ratio below 1)
 * and pGreater = P(X ≥ a) (odds ratio above 1), each summed directly so small tails keep their precision.
 * The two-sided p-value sums the probabilities of all tables no more likely than the observed one,
 * P(X = x) ≤ P(X = a)·(1 + relativeTolerance) — the convention of R's `fisher.test`, whose tolerance guards
 * against rounding splitting tables of equal probability.
 *
 * @param table - [[a, b], [c, d]], non-negative integer counts.
 * @param relativeTolerance - relative slack for "no more likely than the observed table", ≥ 0 and < 1
 *   (default 1e-7, as in R).
 * @returns `{ pTwoSided, pLess, pGreater }`, each in (0, 1]. Degenerate case: when a margin is zero only one
 *   table is possible and all three p-values are 1.
 * @throws {StatsInputError} if the table is not 2 × 2, a count is negative, non-integer or not finite, or the
 *   tolerance is outside [0, 1).
 * @example
 * ```ts
 * // Fisher (1935), the lady tasting tea: three of four milk-first cups identified
 * fisherExactTest([[3, 1], [1, 3]]); // => { pTwoSided: 0.4857 (34/70), pLess: 0.9857, pGreater: 0.2429 (17/70) }
 * ```
 * @see Fisher R.A. (1935) The Design of Experiments, Oliver & Boyd, Edinburgh, ch. II (the lady tasting tea).
 * @see Agresti A. (2002) Categorical Data Analysis, 2nd ed., Wiley, §3.5.1–3.5.2, p. 91–93.
 */
export function fisherExactTest(
  table: readonly [readonly [number, number], readonly [number, number]],
  relativeTolerance = 1e-7,
): { pTwoSided: number; pLess: number; pGreater: number } {
  if (table.length !== 2 || table.some((row) => row.length !== 2)) {
    throw new StatsInputError("Fisher's exact test needs a 2 × 2 table");
  }
  const cells = [table[0][0], table[0][1], table[1][0], table[1][1]];
  cells.forEach((count) => {
    if (!Number.isInteger(count) || count < 0) {
      throw new StatsInputError(`2 × 2 table counts must be non-negative integers (got ${count})`);
    }
  });
  if (!(relativeTolerance >= 0 && relativeTolerance < 1)) {
    throw new StatsInputError(`relativeTolerance must be in [0, 1) (got ${relativeTolerance})`);
  }
  const [a, b, c, d] = cells as [number, number, number, number];
  const total = a + b + c + d;
  const firstRowTotal = a + b;
  const firstColumnTotal = a + c;
  const smallest = Math.max(0, firstColumnTotal - (c + d));
  const largest = Math.min(firstRowTotal, firstColumnTotal);

  const observedProbability = hypergeometricPmf(a, total, firstRowTotal, firstColumnTotal);
  const threshold = observedProbability * (1 + relativeTolerance);
  let pLess = 0;
  let pGreater = 0;
  let pTwoSided = 0;
  for (let x = smallest; x <= largest; x += 1) {
    const probability = hypergeometricPmf(x, total, firstRowTotal, firstColumnTotal);
    if (x <= a) pLess += probability;
    if (x >= a) pGreater += probability;
    if (probability <= threshold) pTwoSided += probability;
  }
  return { pTwoSided: Math.min(1, pTwoSided), pLess: Math.min(1, pLess), pGreater: Math.min(1, pGreater) };
}
