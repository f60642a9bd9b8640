import jStat from "jstat";
import { describe, expect, it } from "vitest";
import { aggregatedLagCorrelation } from "../../src/calibrate/aggregatedLagCorrelation.js";

describe("aggregatedLagCorrelation({ first, last, activity, index, blockYears, maxLag })", () => {
  // 40 years → 8 five-year blocks; activity blocks are the index blocks shifted by one block.
  const years = Array.from({ length: 40 }, (_, i) => 1900 + i);
  const blockIndex = [0.1, -0.4, 0.9, 0.3, -1.2, 0.5, 1.1, -0.7];
  const index = new Map(years.map((year, i) => [year, blockIndex[Math.floor(i / 5)] as number]));
  const activity = new Map(years.map((year, i) => [year, (blockIndex[Math.floor(i / 5) - 1] ?? 0) * 2 + 3]));
  const result = aggregatedLagCorrelation({ first: 1900, last: 1939, activity, index, blockYears: 5, maxLag: 2 });

  it("averages non-overlapping blocks and finds r = 1 when the index block leads by one", () => {
    expect(result.blocks).toBe(8);
    expect(result.lags).toEqual([-2, -1, 0, 1, 2]);
    expect(result.r[1]).toBeCloseTo(1, 12);
  });

  it("agrees with jstat's Pearson r on the paired block means at lag 0", () => {
    const fire = blockIndex.map((_, b) => (blockIndex[b - 1] ?? 0) * 2 + 3);
    expect(result.r[2]).toBeCloseTo(jStat.corrcoeff(fire, blockIndex), 12);
  });

  it("is null with a reason when fewer than three blocks pair up", () => {
    const short = aggregatedLagCorrelation({ first: 1900, last: 1909, activity, index, blockYears: 5, maxLag: 1 });
    expect(short.r).toEqual([null, null, null]);
    expect(short.reason).toMatch(/fewer than three/);
  });
});
