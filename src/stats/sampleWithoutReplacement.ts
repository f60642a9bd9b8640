import type { RandomSource } from "./createRandom.js";
import { StatsInputError } from "./StatsInputError.js";

/**
 * Simple random sample without replacement (partial Fisher–Yates shuffle): draws k distinct elements of the
 * pool, every k-subset and every order of it being equally likely.
 *
 * A copy of the pool is shuffled in place for its first k positions only: for position i = 0 … k − 1 an index
 * j is drawn uniformly from i … n − 1 (`i + random.nextInt(n − i)`) and elements i and j are swapped; the first
 * k elements of the copy are the sample. Cost O(n) for the copy plus O(k) random integers. "Distinct" refers to
 * positions: a pool with repeated values can return repeated values.
 *
 * @param pool - the population to draw from; not modified.
 * @param k - sample size, an integer in 0 … pool.length.
 * @param random - the random source (see {@link createRandom}); k integers are drawn from it.
 * @returns a new array of k elements in the order drawn; an empty array when k = 0.
 * @throws {@link StatsInputError} when k is not an integer in 0 … pool.length.
 * @example
 * ```ts
 * sampleWithoutReplacement([1700, 1701, 1702, 1703], 2, createRandom(7)); // => two distinct years of the four
 * sampleWithoutReplacement(["a", "b", "c"], 3, createRandom(1)).sort(); // => ["a", "b", "c"]
 * ```
 * @see Durstenfeld R. (1964) "Algorithm 235: Random permutation", Communications of the ACM 7(7):420,
 * doi:10.1145/364520.364540.
 * @see Knuth D.E. (1997) The Art of Computer Programming, vol. 2: Seminumerical Algorithms, 3rd ed.,
 * Addison-Wesley, §3.4.2, Algorithm P.
 */
export function sampleWithoutReplacement<T>(pool: readonly T[], k: number, random: RandomSource): T[] {
  const poolSize = pool.length;
  if (!Number.isInteger(k) || k < 0 || k > poolSize) {
    throw new StatsInputError(
      `sampleWithoutReplacement: k must be an integer in 0…${poolSize} (got ${String(k)})`,
    );
  }
  const shuffled = pool.slice();
  for (let position = 0; position < k; position += 1) {
    const chosen = position + random.nextInt(poolSize - position);
    const held = shuffled[position] as T;
    shuffled[position] = shuffled[chosen] as T;
    shuffled[chosen] = held;
  }
  shuffled.length = k;
  return shuffled;
}
