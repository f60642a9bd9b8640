import jStat from "jstat";
import { describe, expect, it } from "vitest";
import { createRandom, type RandomSource } from "../../src/stats/createRandom.js";
import { sampleWithoutReplacement } from "../../src/stats/sampleWithoutReplacement.js";
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

describe("sampleWithoutReplacement(pool, k, random)", () => {
  it("sampleWithoutReplacement(pool, 3, random) returns 3 distinct members and leaves pool unchanged", () => {
    const pool = Object.freeze([1701, 1702, 1703, 1704, 1705, 1706, 1707]);
    const sample = sampleWithoutReplacement(pool, 3, createRandom(5));
    expect(sample).toHaveLength(3);
    expect(new Set(sample).size).toBe(3);
    for (const year of sample) {
      expect(pool).toContain(year);
    }
    expect(pool).toEqual([1701, 1702, 1703, 1704, 1705, 1706, 1707]);
  });

  it("sampleWithoutReplacement(pool, 0, random) is [] and k = pool.length gives a permutation", () => {
    const pool = ["a", "b", "c", "d"];
    expect(sampleWithoutReplacement(pool, 0, createRandom(1))).toEqual([]);
    expect(sampleWithoutReplacement(pool, 4, createRandom(1)).sort()).toEqual(["a", "b", "c", "d"]);
  });

  it("partial Fisher–Yates: scripted offsets 2, 0 on [a, b, c, d] give [c, b] using exactly k draws", () => {
    // Position 0 swaps with 0 + 2 → [c, b, a, d]; position 1 swaps with 1 + 0 → unchanged. Sample = [c, b].
    const random = scripted([2, 0]);
    expect(sampleWithoutReplacement(["a", "b", "c", "d"], 2, random)).toEqual(["c", "b"]);
    expect(random.calls).toBe(2);
  });

  it("sampleWithoutReplacement(pool, k, random) with one seed is reproducible and differs across seeds", () => {
    const pool = Array.from({ length: 300 }, (_, index) => 1700 + index);
    expect(sampleWithoutReplacement(pool, 30, createRandom(9))).toEqual(
      sampleWithoutReplacement(pool, 30, createRandom(9)),
    );
    expect(sampleWithoutReplacement(pool, 30, createRandom(9))).not.toEqual(
      sampleWithoutReplacement(pool, 30, createRandom(10)),
    );
  });

  it("every 2-subset of 5 is equally likely (10 subsets, chi-square via jstat, 50,000 samples)", () => {
    const random = createRandom(21);
    const counts = new Map<string, number>();
    for (let draw = 0; draw < 50_000; draw += 1) {
      const key = sampleWithoutReplacement([0, 1, 2, 3, 4], 2, random)
        .sort((a, b) => a - b)
        .join(",");
      counts.set(key, (counts.get(key) ?? 0) + 1);
    }
    expect(counts.size).toBe(10);
    const observed = [...counts.values()];
    const expected = 50_000 / 10;
    const statistic = observed.reduce((sum, count) => sum + (count - expected) ** 2 / expected, 0);
    expect(1 - jStat.chisquare.cdf(statistic, 9)).toBeGreaterThan(1e-4);
  });

  it("both orders of a drawn pair are equally likely (first position uniform)", () => {
    const random = createRandom(22);
    const firstCounts = new Array<number>(4).fill(0);
    for (let draw = 0; draw < 40_000; draw += 1) {
      const [first] = sampleWithoutReplacement([0, 1, 2, 3], 2, random);
      firstCounts[first as number] = (firstCounts[first as number] as number) + 1;
    }
    const statistic = firstCounts.reduce((sum, count) => sum + (count - 10_000) ** 2 / 10_000, 0);
    expect(1 - jStat.chisquare.cdf(statistic, 3)).toBeGreaterThan(1e-4);
  });

  describe("contract breaks", () => {
    it("k > pool.length, k < 0 and k = 1.5 throw StatsInputError", () => {
      const random = createRandom(1);
      expect(() => sampleWithoutReplacement([1, 2], 3, random)).toThrow(StatsInputError);
      expect(() => sampleWithoutReplacement([1, 2], -1, random)).toThrow(StatsInputError);
      expect(() => sampleWithoutReplacement([1, 2], 1.5, random)).toThrow(StatsInputError);
    });
  });
});
