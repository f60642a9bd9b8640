/**
 * Statistics input error: the error thrown by every function in `src/stats` when its input breaks the
 * documented contract (a negative or non-integer count, a probability outside [0, 1], a table of the wrong
 * shape, mismatched lengths, a confidence level outside (0, 1)).
 *
 * Values that are mathematically undefined for valid input (for example a proportion with zero trials, or a
 * correlation of a constant series) are not errors: those functions return `NaN` and say so in their docs.
 *
 * @example
 * ```ts
 * try { wilsonInterval(-1, 10); } catch (error) { error instanceof StatsInputError; } // => true
 * ```
 */
export class StatsInputError extends Error {
  override name = "StatsInputError";
}
