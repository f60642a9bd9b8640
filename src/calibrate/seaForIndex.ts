import { benjaminiHochberg } from "../stats/benjaminiHochberg.js";
import { createRandom } from "../stats/createRandom.js";
import { superposedEpochAnalysis } from "../stats/superposedEpochAnalysis.js";
import type { IndexSeries } from "../workspace/types.js";
import type { SeaResult } from "./types.js";

/**
 * Superposed epoch analysis of one index around the fire years (Haurwitz M.W., Brier G.W. 1981,
 * "A critique of the superposed epoch analysis method", Monthly Weather Review 109:2074–2079;
 * Prager M.H., Hoenig J.M. 1989, "Superposed epoch analysis: a randomization test of environmental
 * effects on recruitment…", Trans. Am. Fish. Soc. 118:608–618; Adams J.B., Mann M.E., Ammann C.M.
 * 2003, "Proxy evidence for an El Niño-like response to volcanic forcing", Nature 426:274–278).
 *
 * The index is taken over the calibration period widened by the lag window, so fire years near
 * the ends keep their windows when the index extends beyond the period. Baseline: the mean of the
 * index over those years. The random stream is seeded from the region seed and the index name.
 */
export function seaForIndex(input: {
  readonly series: IndexSeries;
  readonly first: number;
  readonly last: number;
  readonly eventYears: readonly number[];
  readonly firstLag: number;
  readonly lastLag: number;
  readonly draws: number;
  readonly seed: number;
  /** The calibration years: the random draws take their key years from these only. */
  readonly poolYears: readonly number[];
}): SeaResult {
  const years: number[] = [];
  const values: (number | null)[] = [];
  input.series.years.forEach((year, i) => {
    if (year >= input.first + input.firstLag && year <= input.last + input.lastLag) {
      years.push(year);
      values.push(input.series.values[i] ?? null);
    }
  });
  const streamSeed = indexSeed(input.seed, input.series.name);
  const out = superposedEpochAnalysis({
    years,
    values,
    eventYears: input.eventYears,
    firstLag: input.firstLag,
    lastLag: input.lastLag,
    draws: input.draws,
    random: createRandom(streamSeed),
    poolYears: input.poolYears,
  });
  const finite = (value: number): number | null => (Number.isFinite(value) ? value : null);
  const pair = (value: readonly [number, number]): [number, number] | null =>
    Number.isFinite(value[0]) && Number.isFinite(value[1]) ? [value[0], value[1]] : null;
  const pValue = out.pValue.map(finite);
  const qValue = benjaminiHochberg(out.pValue).map(finite);
  const result: SeaResult = {
    lags: out.lags,
    mean: out.composite.map(finite),
    ci95: out.ci95.map(pair),
    ci99: out.ci99.map(pair),
    pValue,
    qValue,
    eventYears: out.eventsUsed,
    poolYears: out.poolSize,
    draws: input.draws,
    seed: streamSeed,
    baseline: `mean of the index over ${input.first + input.firstLag}–${input.last + input.lastLag} (the calibration period widened by the lag window)`,
    sampling: "the same number of years as fire years used, drawn at random without replacement from the calibration years whose whole lag window has index values",
    percentileRule: "2.5/97.5 and 0.5/99.5 percentiles of the random composites (Hyndman & Fan type 7); two-sided p = (b + 1)/(draws + 1)",
  };
  return out.reason === null ? result : { ...result, reason: out.reason };
}

/** A 32-bit seed for one index's random stream: the region seed mixed with an FNV-1a hash of the name. */
export function indexSeed(seed: number, name: string): number {
  let hash = 0x811c9dc5;
  for (const char of name) {
    hash ^= char.codePointAt(0) ?? 0;
    hash = Math.imul(hash, 0x01000193) >>> 0;
  }
  return (hash ^ (seed >>> 0)) >>> 0;
}
