import jStat from "jstat";
import { describe, expect, it } from "vitest";
import { blockPermutationIndices } from "../../src/stats/blockPermutation.js";
import { createRandom, type RandomSource } from "../../src/stats/createRandom.js";
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

/** The blocks of a permutation as the runs of consecutive positions it is made of (split where a run breaks). */
function runsOf(positions: readonly number[]): number[][] {
  const runs: number[][] = [];
  for (const position of positions) {
    const last = runs[runs.length - 1];
    if (last !== undefined && (last[last.length - 1] as number) + 1 === position) last.push(position);
    else runs.push([position]);
  }
  return runs;
}

describe("blockPermutationIndices(n, blockLength, random)", () => {
  it("blockPermutationIndices(7, 3, scripted 0, 1) → blocks {6} {3,4,5} {0,1,2}: [6, 3, 4, 5, 0, 1, 2]", () => {
    // Fisher–Yates over block order [0, 1, 2]: i = 2 swaps with j = 0 → [2, 1, 0]; i = 1 with j = 1 keeps it.
    const random = scripted([0, 1]);
    expect(blockPermutationIndices(7, 3, random)).toEqual([6, 3, 4, 5, 0, 1, 2]);
    expect(random.calls).toBe(2);
  });

  it("covers every position 0 … n − 1 exactly once, made of the fixed blocks of l (independent check, 500 draws)", () => {
    const random = createRandom(4);
    for (let draw = 0; draw < 500; draw += 1) {
      const n = 3 + (draw % 50);
      const blockLength = 1 + (draw % Math.min(n, 6));
      const positions = blockPermutationIndices(n, blockLength, random);
      expect([...positions].sort((a, b) => a - b)).toEqual(Array.from({ length: n }, (_, index) => index));
      // Every written block starts at a multiple of l and runs to the next multiple (or to n).
      let cursor = 0;
      while (cursor < n) {
        const first = positions[cursor] as number;
        expect(first % blockLength).toBe(0);
        const end = Math.min(n, first + blockLength);
        for (let position = first; position < end; position += 1) {
          expect(positions[cursor]).toBe(position);
          cursor += 1;
        }
      }
      // Runs of consecutive positions are unions of whole blocks (never a block split across runs).
      for (const run of runsOf(positions)) expect((run[0] as number) % blockLength).toBe(0);
    }
  });

  it("all 4! = 24 orders of 4 blocks are equally likely (chi-square via jstat, 48,000 draws)", () => {
    const random = createRandom(12);
    const counts = new Map<string, number>();
    for (let draw = 0; draw < 48_000; draw += 1) {
      const key = blockPermutationIndices(11, 3, random).join(",");
      counts.set(key, (counts.get(key) ?? 0) + 1);
    }
    expect(counts.size).toBe(24);
    const expected = 48_000 / 24;
    const statistic = [...counts.values()].reduce((sum, count) => sum + (count - expected) ** 2 / expected, 0);
    expect(1 - jStat.chisquare.cdf(statistic, 23)).toBeGreaterThan(1e-4);
  });

  it("blockPermutationIndices(n, 1, random) is a uniform permutation: P(position 0 lands at slot j) = 1/n (chi-square via jstat)", () => {
    const random = createRandom(13);
    const slots = new Array<number>(8).fill(0);
    for (let draw = 0; draw < 40_000; draw += 1) {
      const slot = blockPermutationIndices(8, 1, random).indexOf(0);
      slots[slot] = (slots[slot] as number) + 1;
    }
    const statistic = slots.reduce((sum, count) => sum + (count - 5000) ** 2 / 5000, 0);
    expect(1 - jStat.chisquare.cdf(statistic, 7)).toBeGreaterThan(1e-4);
  });

  it("blockPermutationIndices(5, 5, random) is [0 … 4] with no draw; same seed → same order, another seed → another", () => {
    const random = scripted([]);
    expect(blockPermutationIndices(5, 5, random)).toEqual([0, 1, 2, 3, 4]);
    expect(random.calls).toBe(0);
    expect(blockPermutationIndices(291, 5, createRandom(8))).toEqual(blockPermutationIndices(291, 5, createRandom(8)));
    expect(blockPermutationIndices(291, 5, createRandom(8))).not.toEqual(blockPermutationIndices(291, 5, createRandom(9)));
  });

  describe("contract breaks", () => {
    it("n = 0, blockLength = 0, blockLength > n and non-integers throw StatsInputError", () => {
      const random = createRandom(1);
      expect(() => blockPermutationIndices(0, 1, random)).toThrow(StatsInputError);
      expect(() => blockPermutationIndices(4, 0, random)).toThrow(StatsInputError);
      expect(() => blockPermutationIndices(4, 5, random)).toThrow(StatsInputError);
      expect(() => blockPermutationIndices(4.5, 2, random)).toThrow(StatsInputError);
    });
  });
});
