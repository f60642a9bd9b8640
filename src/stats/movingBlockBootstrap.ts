import type { RandomSource } from "./createRandom.js";
import { StatsInputError } from "./StatsInputError.js";

/**
 * Moving-block bootstrap (Künsch 1989): one resample of the positions 0 … n − 1 of a serially dependent
 * series, made of whole runs of consecutive positions so that the dependence within a block survives.
 *
 * The n − l + 1 overlapping blocks of length l are {s, s + 1, …, s + l − 1} for s = 0 … n − l. Blocks are
 * drawn independently and uniformly with replacement (start s = `random.nextInt(n − l + 1)`), ceil(n / l) of
 * them, concatenated in the order drawn, and the concatenation is cut to its first n positions. With l = 1
 * this is the ordinary (independent) bootstrap of Efron (1979). A caller applies the returned positions to
 * every series that must stay paired (for example forecast and outcome of the same year).
 *
 * @param n - length of the series, an integer of at least 1.
 * @param blockLength - l, the block length, an integer in 1 … n.
 * @param random - the random source (see {@link createRandom}); ceil(n / l) integers are drawn from it.
 * @returns a new array of n positions in 0 … n − 1 (with repeats); every l-long stretch starting at a
 *   multiple of l is a run of consecutive positions (the last one may be cut short). With l = n the result is
 *   0 … n − 1 in order, the only block there is.
 * @throws {@link StatsInputError} when n is not an integer of at least 1, or blockLength not an integer in 1 … n.
 * @example
 * ```ts
 * movingBlockBootstrapIndices(7, 3, createRandom(1)); // => e.g. [2, 3, 4, 0, 1, 2, 4] (runs of 3, cut to 7)
 * movingBlockBootstrapIndices(4, 4, createRandom(1)); // => [0, 1, 2, 3]
 * ```
 * @see Künsch H.R. (1989) "The jackknife and the bootstrap for general stationary observations", Annals of
 * Statistics 17(3):1217–1241, doi:10.1214/aos/1176347265 (the moving-block bootstrap, §2).
 * @see Wilks D.S. (1997) "Resampling hypothesis tests for autocorrelated fields", Journal of Climate
 * 10(1):65–82 (the moving-blocks bootstrap for climate series; choice of block length).
 */
export function movingBlockBootstrapIndices(n: number, blockLength: number, random: RandomSource): number[] {
  assertBlockArguments("movingBlockBootstrapIndices", n, blockLength);
  const starts = n - blockLength + 1;
  const positions = new Array<number>(n);
  let filled = 0;
  while (filled < n) {
    const start = random.nextInt(starts);
    for (let offset = 0; offset < blockLength && filled < n; offset += 1) {
      positions[filled] = start + offset;
      filled += 1;
    }
  }
  return positions;
}

/** Shared argument check of the block resamplers (n ≥ 1, 1 ≤ blockLength ≤ n, both integers). */
export function assertBlockArguments(name: string, n: number, blockLength: number): void {
  if (!Number.isSafeInteger(n) || n < 1) {
    throw new StatsInputError(`${name}: n must be an integer of at least 1 (got ${String(n)})`);
  }
  if (!Number.isSafeInteger(blockLength) || blockLength < 1 || blockLength > n) {
    throw new StatsInputError(`${name}: blockLength must be an integer in 1…${n} (got ${String(blockLength)})`);
  }
}
