import { describe, expect, it } from "vitest";
import fc from "fast-check";
import jStat from "jstat";
import { fisherExactTest } from "../../src/stats/fisherExactTest.js";
import { StatsInputError } from "../../src/stats/StatsInputError.js";
import { likeSexTwins, teaTasting } from "../fixtures/published/fisherExactExamples.js";

type TwoByTwo = [[number, number], [number, number]];

/** Fisher's p-values from hypergeometric probabilities written with jstat.combination (test-only library). */
function fisherWithJstat(table: TwoByTwo): { pTwoSided: number; pLess: number; pGreater: number } {
  const [[a, b], [c, d]] = table;
  const rowOne = a + b;
  const columnOne = a + c;
  const total = a + b + c + d;
  const probability = (x: number): number =>
    jStat.combination(rowOne, x) * jStat.combination(total - rowOne, columnOne - x) / jStat.combination(total, columnOne);
  const observed = probability(a);
  let pTwoSided = 0;
  let pLess = 0;
  let pGreater = 0;
  for (let x = Math.max(0, columnOne - (total - rowOne)); x <= Math.min(rowOne, columnOne); x += 1) {
    const p = probability(x);
    if (p <= observed * (1 + 1e-7)) pTwoSided += p;
    if (x <= a) pLess += p;
    if (x >= a) pGreater += p;
  }
  return { pTwoSided: Math.min(1, pTwoSided), pLess: Math.min(1, pLess), pGreater: Math.min(1, pGreater) };
}

describe("fisherExactTest(table, relativeTolerance = 1e-7)", () => {
  // Fisher (1935) The Design of Experiments, ch. II; Agresti (2002) CDA p. 91; R ?fisher.test (p = 0.2429).
  it("fisherExactTest([[3, 1], [1, 3]]) → pGreater 17/70 = 0.2429, pTwoSided 34/70 = 0.4857 (tea tasting)", () => {
    const result = fisherExactTest(teaTasting.table);
    expect(result.pGreater).toBeCloseTo(teaTasting.pGreater, 12);
    expect(result.pGreater).toBeCloseTo(teaTasting.pGreaterPrinted, 4);
    expect(result.pTwoSided).toBeCloseTo(teaTasting.pTwoSided, 12);
    expect(result.pTwoSided).toBeCloseTo(teaTasting.pTwoSidedPrinted, 4);
    expect(result.pLess).toBeCloseTo(teaTasting.pLess, 12);
  });

  it("fisherExactTest tea tasting: the five table probabilities are 1, 16, 36, 16, 1 of 70", () => {
    // pGreater at n11 = k minus pGreater at n11 = k + 1 isolates P(n11 = k).
    const tables: TwoByTwo[] = [0, 1, 2, 3, 4].map((k) => [[k, 4 - k], [4 - k, k]]);
    const tails = tables.map((table) => fisherExactTest(table).pGreater);
    teaTasting.probabilities.forEach((probability, k) => {
      const next = k < 4 ? (tails[k + 1] ?? 0) : 0;
      expect((tails[k] ?? Number.NaN) - next).toBeCloseTo(probability, 12);
    });
  });

  // R ?fisher.test "Convictions" (Fisher's like-sex twins): less 0.0004652, two-sided 0.0005367 (C, scipy).
  it("fisherExactTest([[2, 15], [10, 3]]) → pLess 0.0004652, pTwoSided 0.0005367 (like-sex twins)", () => {
    const result = fisherExactTest(likeSexTwins.table);
    expect(result.pLess).toBeCloseTo(likeSexTwins.pLess, 7);
    expect(result.pTwoSided).toBeCloseTo(likeSexTwins.pTwoSided, 7);
  });

  it("agrees with a jstat.combination hypergeometric on random tables", () => {
    fc.assert(
      fc.property(
        fc.tuple(fc.nat(25), fc.nat(25), fc.nat(25), fc.nat(25)),
        ([a, b, c, d]) => {
          const table: TwoByTwo = [[a, b], [c, d]];
          const result = fisherExactTest(table);
          const reference = fisherWithJstat(table);
          return (
            Math.abs(result.pTwoSided - reference.pTwoSided) < 1e-9 &&
            Math.abs(result.pLess - reference.pLess) < 1e-9 &&
            Math.abs(result.pGreater - reference.pGreater) < 1e-9
          );
        },
      ),
    );
  });

  it("property: every p-value is positive and pLess + pGreater ≥ 1 (p ≤ 1 is a clamp in the code, not asserted)", () => {
    fc.assert(
      fc.property(fc.tuple(fc.nat(60), fc.nat(60), fc.nat(60), fc.nat(60)), ([a, b, c, d]) => {
        const { pTwoSided, pLess, pGreater } = fisherExactTest([[a, b], [c, d]]);
        return [pTwoSided, pLess, pGreater].every((p) => p > 0) && pLess + pGreater >= 1 - 1e-12;
      }),
    );
  });

  it("fisherExactTest([[4, 0], [0, 4]]) → pGreater 1/70, pTwoSided 2/70 (the mirror table is counted)", () => {
    const result = fisherExactTest([[4, 0], [0, 4]]);
    expect(result.pGreater).toBeCloseTo(1 / 70, 14);
    expect(result.pTwoSided).toBeCloseTo(2 / 70, 14);
    // A larger tolerance admits tables up to that much more likely than the observed one: 16/70 ≤ (1/70)·17.
    expect(fisherExactTest([[4, 0], [0, 4]], 0.99).pTwoSided).toBeCloseTo(2 / 70, 14);
  });

  it("a zero margin leaves one possible table: all p-values are 1", () => {
    expect(fisherExactTest([[0, 0], [3, 5]])).toEqual({ pTwoSided: 1, pLess: 1, pGreater: 1 });
    expect(fisherExactTest([[0, 4], [0, 7]])).toEqual({ pTwoSided: 1, pLess: 1, pGreater: 1 });
    expect(fisherExactTest([[0, 0], [0, 0]])).toEqual({ pTwoSided: 1, pLess: 1, pGreater: 1 });
  });

  it.each([
    ["a negative count", [[-1, 2], [3, 4]]],
    ["a non-integer count", [[1.5, 2], [3, 4]]],
    ["a NaN count", [[Number.NaN, 2], [3, 4]]],
    ["three rows", [[1, 2], [3, 4], [5, 6]]],
    ["three columns", [[1, 2, 3], [3, 4, 5]]],
  ])("throws StatsInputError for %s", (_label, table) => {
    expect(() => fisherExactTest(table as unknown as TwoByTwo)).toThrow(StatsInputError);
  });

  it("throws StatsInputError for a relative tolerance outside [0, 1)", () => {
    expect(() => fisherExactTest([[1, 2], [3, 4]], -1e-7)).toThrow(StatsInputError);
    expect(() => fisherExactTest([[1, 2], [3, 4]], 1)).toThrow(StatsInputError);
  });
});
