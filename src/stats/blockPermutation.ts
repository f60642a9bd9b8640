import type { RandomSource } from "./createRandom.js";
import { assertBlockArguments } from "./movingBlockBootstrap.js";

/**
 * Block permutation: a random reordering of the positions 0 … n − 1 that moves whole blocks of consecutive
 * positions, so that the serial dependence inside each block survives while any link to another series
 * kept in place is broken.
 *
 * The positions are cut into m = ceil(n / l) non-overlapping blocks {0 … l − 1}, {l … 2l − 1}, …, the last
 * one holding the remaining n − (m − 1)·l positions. The block order is shuffled uniformly (Fisher–Yates:
 * for i = m − 1 down to 1, block i is swapped with block `random.nextInt(i + 1)`), so each of the m! orders
 * has probability 1 / m!, and the blocks are written out in the new order, each block's positions in
 * ascending order. With l = 1 this is an ordinary uniform random permutation. Applied to one series
 * (for example the fire record by year) while the other (the index phases) stays in place, it gives the
 * null distribution of "no link, same serial dependence".
 *
 * @param n - number of positions, an integer of at least 1.
 * @param blockLength - l, the block length, an integer in 1 … n.
 * @param random - the random source (see {@link createRandom}); m − 1 integers are drawn from it.
 * @returns a new array holding every position 0 … n − 1 exactly once. With m = 1 (l = n) it is 0 … n − 1 in order.
 * @throws {@link StatsInputError} when n is not an integer of at least 1, or blockLength not an integer in 1 … n.
 * @example
 * ```ts
 * blockPermutationIndices(7, 3, createRandom(1)); // => e.g. [6, 0, 1, 2, 3, 4, 5] (blocks {0,1,2} {3,4,5} {6} reordered)
 * blockPermutationIndices(5, 5, createRandom(1)); // => [0, 1, 2, 3, 4]
 * ```
 * @see Kirch C. (2007) "Block permutation principles for the change analysis of dependent data", Journal of
 * Statistical Planning and Inference 137(7):2453–2474 (permuting non-overlapping blocks; from memory).
 * @see Durstenfeld R. (1964) "Algorithm 235: Random permutation", Communications of the ACM 7(7):420,
 * doi:10.1145/364520.364540 (the shuffle of the block order).
 */
export function blockPermutationIndices(n: number, blockLength: number, random: RandomSource): number[] {
  assertBlockArguments("blockPermutationIndices", n, blockLength);
  const blocks = Math.ceil(n / blockLength);
  const order = Array.from({ length: blocks }, (_, block) => block);
  for (let i = blocks - 1; i >= 1; i -= 1) {
    const j = random.nextInt(i + 1);
    const held = order[i] as number;
    order[i] = order[j] as number;
    order[j] = held;
  }
  const positions = new Array<number>(n);
  let filled = 0;
  for (const block of order) {
    const end = Math.min(n, (block + 1) * blockLength);
    for (let position = block * blockLength; position < end; position += 1) {
      positions[filled] = position;
      filled += 1;
    }
  }
  return positions;
}
