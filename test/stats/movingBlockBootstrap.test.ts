import jStat from "jstat";
import { describe, expect, it } from "vitest";
import { createRandom, type RandomSource } from "../../src/stats/createRandom.js";
import { movingBlockBootstrapIndices } from "../../src/stats/movingBlockBootstrap.js";
import { StatsInputError } from "../../src/stats/StatsInputError.js";

/** A scripted random source: returns the given integers in turn (checked against maxExclusive). */
function scripted(integers: readonly number[]): RandomSource & { calls: number } {
  const source = {
    calls: 0,
    nextInt(maxExclusive: number): number {
      const value = integers[source.calls];
      source.calls += 1;
      if (value === undefined || value >= maxExclusive) {
        throw new Error(`scripted source: no valid value for nextInt(${maxExclusive})`);
      }
      return value;
    },
    nextFloat(): number {
      throw new Error("scripted source: nextFloat not expected");
    },
  };
  return source;
}

describe("movingBlockBootstrapIndices(n, blockLength, random)", () => {
  it("movingBlockBootstrapIndices(7, 3, scripted 4, 0, 2) → [4, 5, 6, 0, 1, 2, 2] from ceil(7/3) = 3 draws over 5 starts", () => {
    const random = scripted([4, 0, 2]);
    expect(movingBlockBootstrapIndices(7, 3, random)).toEqual([4, 5, 6, 0, 1, 2, 2]);
    expect(random.calls).toBe(3);
  });

  it("every block is a run of consecutive positions inside 0 … n − 1 (independent check on 500 resamples)", () => {
    const random = createRandom(3);
    for (let draw = 0; draw < 500; draw += 1) {
      const n = 5 + (draw % 40);
      const blockLength = 1 + (draw % Math.min(n, 7));
      const positions = movingBlockBootstrapIndices(n, blockLength, random);
      expect(positions).toHaveLength(n);
      for (let start = 0; start < n; start += blockLength) {
        const first = positions[start] as number;
        expect(first).toBeGreaterThanOrEqual(0);
        expect(first).toBeLessThanOrEqual(n - blockLength);
        for (let offset = 1; offset < blockLength && start + offset < n; offset += 1) {
          expect(positions[start + offset]).toBe(first + offset);
        }
      }
    }
  });

  it("block starts are uniform over the n − l + 1 overlapping blocks (chi-square via jstat, 60,000 blocks)", () => {
    const random = createRandom(11);
    const n = 12;
    const blockLength = 4;
    const counts = new Array<number>(n - blockLength + 1).fill(0);
    for (let draw = 0; draw < 20_000; draw += 1) {
      const positions = movingBlockBootstrapIndices(n, blockLength, random);
      for (let start = 0; start < n; start += blockLength) {
        const first = positions[start] as number;
        counts[first] = (counts[first] as number) + 1;
      }
    }
    const total = counts.reduce((sum, count) => sum + count, 0);
    expect(total).toBe(60_000);
    const expected = total / counts.length;
    const statistic = counts.reduce((sum, count) => sum + (count - expected) ** 2 / expected, 0);
    expect(1 - jStat.chisquare.cdf(statistic, counts.length - 1)).toBeGreaterThan(1e-4);
  });

  it("expected count of position t is (n/l)·min(t + 1, l, n − t, n − l + 1)/(n − l + 1): the end effect of the moving-block bootstrap", () => {
    // Künsch H.R. (1989) Ann. Statist. 17:1217–1241, §2; Lahiri S.N. (2003) "Resampling Methods for Dependent
    // Data", Springer, §2.5 (observations near the ends of the series get less weight; from memory).
    // Every one of the n/l blocks starts uniformly among n − l + 1 starts; position t lies in c_t of the blocks.
    const n = 10;
    const blockLength = 5;
    const starts = n - blockLength + 1;
    const resamples = 30_000;
    const random = createRandom(17);
    const counts = new Array<number>(n).fill(0);
    for (let draw = 0; draw < resamples; draw += 1) {
      for (const position of movingBlockBootstrapIndices(n, blockLength, random)) counts[position] = (counts[position] as number) + 1;
    }
    for (let t = 0; t < n; t += 1) {
      const covering = Math.min(t + 1, blockLength, n - t, starts);
      const expected = ((n / blockLength) * covering) / starts;
      // Per resample the count of t is a sum of 2 independent Bernoulli(covering/starts); standard error of the mean:
      const p = covering / starts;
      const standardError = Math.sqrt((2 * p * (1 - p)) / resamples);
      expect(Math.abs((counts[t] as number) / resamples - expected)).toBeLessThan(5 * standardError + 1e-12);
    }
  });

  it("movingBlockBootstrapIndices(n, 1, random) is the ordinary bootstrap: each position uniform (chi-square via jstat)", () => {
    const random = createRandom(23);
    const counts = new Array<number>(6).fill(0);
    for (let draw = 0; draw < 10_000; draw += 1) {
      for (const position of movingBlockBootstrapIndices(6, 1, random)) counts[position] = (counts[position] as number) + 1;
    }
    const expected = 60_000 / 6;
    const statistic = counts.reduce((sum, count) => sum + (count - expected) ** 2 / expected, 0);
    expect(1 - jStat.chisquare.cdf(statistic, 5)).toBeGreaterThan(1e-4);
  });

  it("movingBlockBootstrapIndices(4, 4, random) is [0, 1, 2, 3]; same seed gives the same resample, another seed another", () => {
    expect(movingBlockBootstrapIndices(4, 4, createRandom(5))).toEqual([0, 1, 2, 3]);
    expect(movingBlockBootstrapIndices(200, 5, createRandom(5))).toEqual(movingBlockBootstrapIndices(200, 5, createRandom(5)));
    expect(movingBlockBootstrapIndices(200, 5, createRandom(5))).not.toEqual(movingBlockBootstrapIndices(200, 5, createRandom(6)));
  });

  describe("contract breaks", () => {
    it("n = 0, n = 2.5, blockLength = 0, blockLength > n and blockLength = 1.5 throw StatsInputError", () => {
      const random = createRandom(1);
      expect(() => movingBlockBootstrapIndices(0, 1, random)).toThrow(StatsInputError);
      expect(() => movingBlockBootstrapIndices(2.5, 1, random)).toThrow(StatsInputError);
      expect(() => movingBlockBootstrapIndices(5, 0, random)).toThrow(StatsInputError);
      expect(() => movingBlockBootstrapIndices(5, 6, random)).toThrow(StatsInputError);
      expect(() => movingBlockBootstrapIndices(5, 1.5, random)).toThrow(StatsInputError);
    });
  });
});
