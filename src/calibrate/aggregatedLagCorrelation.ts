import { correlationTest } from "../stats/correlationTest.js";
import { effectiveSampleSize } from "../stats/effectiveSampleSize.js";
import { lag1Autocorrelation } from "../stats/lag1Autocorrelation.js";
import { pearsonCorrelation } from "../stats/pearsonCorrelation.js";
import type { AggregatedLagResult } from "./types.js";

/**
 * Aggregated lag correlation: fire activity and an index averaged in non-overlapping blocks of
 * `blockYears` years (five-year blocks are common practice), then Pearson r between the activity
 * block b and the index block b + lag, at lags −maxLag…+maxLag (a negative lag: the index block
 * comes before the fire block). The p-value is two-sided from a t test with the effective sample
 * size of two autocorrelated series, N(1 − r₁r₂)/(1 + r₁r₂) with r₁, r₂ the lag-1
 * autocorrelations of the paired block series (Bretherton C.S. et al. 1999, "The effective number
 * of spatial degrees of freedom of a time-varying field", J. Climate 12:1990–2009).
 *
 * Blocks start at `first`; a block's value is the mean of the years it has (an activity block needs
 * at least half its years, an index block likewise, or it is missing). Fewer than three block pairs
 * at a lag gives null with a reason.
 */
export function aggregatedLagCorrelation(input: {
  readonly first: number;
  readonly last: number;
  readonly activity: ReadonlyMap<number, number>;
  readonly index: ReadonlyMap<number, number>;
  readonly blockYears: number;
  readonly maxLag: number;
}): AggregatedLagResult {
  const { first, last, blockYears, maxLag } = input;
  const blockCount = Math.floor((last - first + 1) / blockYears);
  const activityBlocks = blockMeans(input.activity, first, blockYears, blockCount);
  const indexBlocks = blockMeans(input.index, first, blockYears, blockCount);
  const lags: number[] = [];
  const r: (number | null)[] = [];
  const pValue: (number | null)[] = [];
  const effectiveN: (number | null)[] = [];
  for (let lag = -maxLag; lag <= maxLag; lag += 1) {
    lags.push(lag);
    const fire: number[] = [];
    const climate: number[] = [];
    for (let block = 0; block < blockCount; block += 1) {
      const a = activityBlocks[block];
      const c = indexBlocks[block + lag];
      if (a === undefined || c === undefined || a === null || c === null) continue;
      fire.push(a);
      climate.push(c);
    }
    const correlation = fire.length >= 3 ? pearsonCorrelation(fire, climate) : NaN;
    if (!Number.isFinite(correlation)) {
      r.push(null);
      pValue.push(null);
      effectiveN.push(null);
      continue;
    }
    const r1 = lag1Autocorrelation(fire);
    const r2 = lag1Autocorrelation(climate);
    const nEff = Number.isFinite(r1) && Number.isFinite(r2) ? effectiveSampleSize(fire.length, r1, r2) : fire.length;
    const test = correlationTest(correlation, nEff);
    r.push(correlation);
    pValue.push(Number.isFinite(test.pValue) ? test.pValue : null);
    effectiveN.push(nEff);
  }
  const result: AggregatedLagResult = { blockYears, blocks: blockCount, lags, r, pValue, effectiveN };
  return r.every((value) => value === null)
    ? { ...result, reason: `fewer than three ${blockYears}-year blocks with both fire activity and index values` }
    : result;
}

function blockMeans(values: ReadonlyMap<number, number>, first: number, blockYears: number, count: number): (number | null)[] {
  const out: (number | null)[] = [];
  for (let block = 0; block < count; block += 1) {
    let sum = 0;
    let n = 0;
    for (let year = first + block * blockYears; year < first + (block + 1) * blockYears; year += 1) {
      const value = values.get(year);
      if (value === undefined) continue;
      sum += value;
      n += 1;
    }
    out.push(n * 2 >= blockYears ? sum / n : null);
  }
  return out;
}
