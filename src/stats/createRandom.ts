import { uniformFloat64 } from "pure-rand/distribution/uniformFloat64";
import { uniformInt } from "pure-rand/distribution/uniformInt";
import { xoroshiro128plus } from "pure-rand/generator/xoroshiro128plus";
import { StatsInputError } from "./StatsInputError.js";

/**
 * Random source: the only way randomness enters `src/stats`. Every resampling function takes one as an
 * argument, so a caller (or a test) decides the generator and its seed.
 */
export interface RandomSource {
  /**
   * Uniform random integer in 0 … maxExclusive − 1, without modulo bias.
   *
   * @param maxExclusive - number of possible values, an integer in 1 … 2^53 − 1.
   * @throws {@link StatsInputError} when maxExclusive is not such an integer.
   */
  nextInt(maxExclusive: number): number;
  /** Uniform random number in [0, 1): a multiple of 2^−53 (53 random bits). */
  nextFloat(): number;
}

/** Outputs discarded after seeding so that nearby seeds give unrelated streams (see the doc comment). */
const WARM_UP_OUTPUTS = 32;

/**
 * Seeded random source (xoroshiro128+ pseudorandom generator): builds a {@link RandomSource} from an integer
 * seed, so the same seed always yields the same sequence of integers and floats.
 *
 * The generator is xoroshiro128+ as implemented by pure-rand 8 (`xoroshiro128plus(seed)`); integers come from
 * pure-rand's rejection-sampling `uniformInt` (no modulo bias) and floats from `uniformFloat64`
 * (value = a·2^−26 + b·2^−53 from two 26- and 27-bit draws). pure-rand seeds the 128-bit state from the seed
 * taken as a 32-bit two's-complement integer (`seed | 0`), whose first outputs barely depend on the seed, so
 * the first 32 outputs are discarded before use. Seeds that agree modulo 2^32 give the same stream.
 *
 * @param seed - an integer (any safe integer; only its low 32 bits are used).
 * @returns a stateful random source; each call advances its stream. There is no degenerate case.
 * @throws {@link StatsInputError} when seed is not a safe integer.
 * @example
 * ```ts
 * const random = createRandom(42);
 * random.nextInt(6); // an integer 0 … 5, the same one on every run with seed 42
 * random.nextFloat(); // a number in [0, 1)
 * ```
 * @see Blackman D., Vigna S. (2021) "Scrambled linear pseudorandom number generators", ACM Transactions on
 * Mathematical Software 47(4):36, doi:10.1145/3460772 (xoroshiro128+).
 * @see Lemire D. (2019) "Fast random integer generation in an interval", ACM Transactions on Modeling and
 * Computer Simulation 29(1):3, doi:10.1145/3230636 (why rejection sampling is needed for unbiased integers).
 */
export function createRandom(seed: number): RandomSource {
  if (!Number.isSafeInteger(seed)) {
    throw new StatsInputError(`createRandom: seed must be a safe integer (got ${String(seed)})`);
  }
  const generator = xoroshiro128plus(seed | 0);
  for (let output = 0; output < WARM_UP_OUTPUTS; output += 1) {
    generator.next();
  }
  return {
    nextInt(maxExclusive: number): number {
      if (!Number.isSafeInteger(maxExclusive) || maxExclusive < 1) {
        throw new StatsInputError(
          `nextInt: maxExclusive must be an integer of at least 1 (got ${String(maxExclusive)})`,
        );
      }
      return uniformInt(generator, 0, maxExclusive - 1);
    },
    nextFloat(): number {
      return uniformFloat64(generator);
    },
  };
}
