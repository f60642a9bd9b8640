import { describe, expect, it } from "vitest";
import fc from "fast-check";
import jStat from "jstat";
import { breslowDayTest } from "../../src/stats/breslowDayTest.js";
import { StatsInputError } from "../../src/stats/StatsInputError.js";
import {
  cervicalCancerByPartners,
  discolorationByAge,
  migraineByGender,
} from "../fixtures/published/breslowDayExamples.js";

type Stratum = readonly (readonly number[])[];

/**
 * Independent recomputation from Breslow & Day (1980) §4.4: Mantel–Haenszel ψ; the expected top-left cell under ψ
 * found by bisection on the odds-ratio equation A(n₀ − m₁ + A) = ψ(n₁ − A)(m₁ − A) (not the quadratic formula);
 * the variance 1/(1/A + 1/B + 1/C + 1/D); Tarone's term; the p-value from jstat's chi-square CDF.
 */
function reference(tables: readonly Stratum[], tarone = false) {
  const usable = tables.filter((t) => {
    const [a, b, c, d] = [t[0]![0]!, t[0]![1]!, t[1]![0]!, t[1]![1]!];
    return a + b > 0 && c + d > 0 && a + c > 0 && b + d > 0;
  });
  let numerator = 0;
  let denominator = 0;
  for (const t of usable) {
    const n = t[0]![0]! + t[0]![1]! + t[1]![0]! + t[1]![1]!;
    numerator += (t[0]![0]! * t[1]![1]!) / n;
    denominator += (t[0]![1]! * t[1]![0]!) / n;
  }
  const psi = numerator / denominator;
  let statistic = 0;
  let observed = 0;
  let expectedTotal = 0;
  let varianceTotal = 0;
  for (const t of usable) {
    const [a, b, c, d] = [t[0]![0]!, t[0]![1]!, t[1]![0]!, t[1]![1]!];
    const n1 = a + b;
    const n0 = c + d;
    const m1 = a + c;
    let low = Math.max(0, m1 - n0);
    let high = Math.min(n1, m1);
    // f(A) = A(n₀ − m₁ + A) − ψ(n₁ − A)(m₁ − A) rises from negative to positive across (low, high)
    for (let step = 0; step < 200; step += 1) {
      const middle = (low + high) / 2;
      const value = middle * (n0 - m1 + middle) - psi * (n1 - middle) * (m1 - middle);
      if (value > 0) high = middle;
      else low = middle;
    }
    const expected = (low + high) / 2;
    const variance = 1 / (1 / expected + 1 / (n1 - expected) + 1 / (m1 - expected) + 1 / (n0 - m1 + expected));
    statistic += (a - expected) ** 2 / variance;
    observed += a;
    expectedTotal += expected;
    varianceTotal += variance;
  }
  if (tarone) statistic -= (observed - expectedTotal) ** 2 / varianceTotal;
  const df = usable.length - 1;
  return { statistic, df, pValue: 1 - jStat.chisquare.cdf(statistic, df), commonOddsRatio: psi };
}

describe("breslowDayTest(tables, { tarone })", () => {
  // SAS/STAT User's Guide, PROC FREQ example "Cochran-Mantel-Haenszel Statistics" (migraine by gender): data V;
  // Breslow–Day 1.4929, DF 1, p 0.2218 and MH common odds ratio 3.3132 as printed are from memory (M).
  it("migraine trial by gender → Breslow–Day 1.4929, df 1, p 0.2218, MH OR 3.3132 (SAS PROC FREQ example, M)", () => {
    const result = breslowDayTest(migraineByGender.tables);
    expect(result.statistic).toBeCloseTo(migraineByGender.fromMemory.statistic, 4);
    expect(result.df).toBe(1);
    expect(result.pValue).toBeCloseTo(migraineByGender.fromMemory.pValue, 4);
    expect(result.commonOddsRatio).toBeCloseTo(migraineByGender.fromMemory.commonOddsRatio, 4);
    expect(result.tarone).toBe(false);
    expect(result.droppedStrata).toEqual([]);
  });

  // Course notes P8120 "Breslow-Day", R DescTools::BreslowDayTest output (V).
  it("tooth discoloration by age → X² = 0.57493, df 1, p 0.4483 (R DescTools output, V)", () => {
    const result = breslowDayTest(discolorationByAge.tables);
    expect(result.statistic).toBeCloseTo(discolorationByAge.printed.statistic, 5);
    expect(result.df).toBe(discolorationByAge.printed.df);
    expect(result.pValue).toBeCloseTo(discolorationByAge.printed.pValue, 4);
  });

  it("cervical cancer and smoking by partners → X² = 4.2069, df 1, p 0.04026 (R DescTools output, V)", () => {
    const result = breslowDayTest(cervicalCancerByPartners.tables);
    expect(result.statistic).toBeCloseTo(cervicalCancerByPartners.printed.statistic, 4);
    expect(result.df).toBe(cervicalCancerByPartners.printed.df);
    expect(result.pValue).toBeCloseTo(cervicalCancerByPartners.printed.pValue, 5);
  });

  it("agrees with the bisection recomputation and jstat on the three published tables, with and without Tarone", () => {
    for (const tables of [migraineByGender.tables, discolorationByAge.tables, cervicalCancerByPartners.tables]) {
      for (const tarone of [false, true]) {
        const result = breslowDayTest(tables, { tarone });
        const expected = reference(tables, tarone);
        expect(result.statistic).toBeCloseTo(expected.statistic, 10);
        expect(result.pValue).toBeCloseTo(expected.pValue, 10);
        expect(result.commonOddsRatio).toBeCloseTo(expected.commonOddsRatio, 12);
        expect(result.tarone).toBe(tarone);
      }
    }
  });

  it("identical strata → statistic 0 and p 1; MH OR equals the stratum odds ratio", () => {
    const stratum = [
      [12, 8],
      [5, 15],
    ];
    const result = breslowDayTest([stratum, stratum, stratum]);
    expect(result.statistic).toBeCloseTo(0, 12);
    expect(result.df).toBe(2);
    expect(result.pValue).toBeCloseTo(1, 10);
    expect(result.commonOddsRatio).toBeCloseTo((12 * 15) / (8 * 5), 12);
  });

  it("strata with opposite odds ratios (9 and 1/9) → small p", () => {
    const result = breslowDayTest([
      [
        [30, 10],
        [10, 30],
      ],
      [
        [10, 30],
        [30, 10],
      ],
    ]);
    expect(result.statistic).toBeGreaterThan(20);
    expect(result.pValue).toBeLessThan(1e-5);
    expect(result.commonOddsRatio).toBeCloseTo(1, 12);
  });

  it("a stratum with a zero margin is dropped and listed; df counts the usable strata", () => {
    const tables = [
      ...migraineByGender.tables,
      [
        [0, 0],
        [4, 6],
      ],
    ];
    const result = breslowDayTest(tables);
    expect(result.droppedStrata).toEqual([2]);
    expect(result.df).toBe(1);
    expect(result.statistic).toBeCloseTo(breslowDayTest(migraineByGender.tables).statistic, 12);
  });

  it("a zero cell inside positive margins is kept (expected cells stay positive)", () => {
    const tables = [
      [
        [0, 10],
        [5, 12],
      ],
      [
        [6, 9],
        [4, 11],
      ],
    ];
    const result = breslowDayTest(tables);
    const expected = reference(tables);
    expect(result.droppedStrata).toEqual([]);
    expect(result.statistic).toBeCloseTo(expected.statistic, 10);
    expect(Number.isFinite(result.statistic)).toBe(true);
  });

  it("fewer than two usable strata → NaN statistic and p with reason 'not enough data'", () => {
    const one = breslowDayTest([migraineByGender.tables[0]!]);
    expect(Number.isNaN(one.statistic)).toBe(true);
    expect(Number.isNaN(one.pValue)).toBe(true);
    expect(one.df).toBe(0);
    expect(one.reason).toMatch(/not enough data/);
    const dropped = breslowDayTest([
      migraineByGender.tables[0]!,
      [
        [0, 3],
        [0, 5],
      ],
    ]);
    expect(dropped.reason).toMatch(/not enough data/);
    expect(dropped.droppedStrata).toEqual([1]);
  });

  it("a common odds ratio of 0 (b·c products only) → NaN with reason", () => {
    const result = breslowDayTest([
      [
        [0, 4],
        [3, 5],
      ],
      [
        [0, 6],
        [2, 7],
      ],
    ]);
    expect(result.commonOddsRatio).toBe(0);
    expect(Number.isNaN(result.statistic)).toBe(true);
    expect(result.reason).toMatch(/0 or infinite/);
  });

  it("throws StatsInputError on no strata, a table that is not 2 × 2, or a negative or non-finite count", () => {
    expect(() => breslowDayTest([])).toThrow(StatsInputError);
    expect(() => breslowDayTest([[[1, 2, 3], [4, 5, 6]]])).toThrow(/2 × 2/);
    expect(() => breslowDayTest([[[1, 2]], [[1, 2]]])).toThrow(/2 × 2/);
    expect(() => breslowDayTest([[[1, -2], [3, 4]], [[1, 2], [3, 4]]])).toThrow(/non-negative/);
    expect(() => breslowDayTest([[[1, Number.NaN], [3, 4]], [[1, 2], [3, 4]]])).toThrow(/finite/);
  });

  it("property: matches the recomputation for random 2 × 2 × K tables, and Tarone's statistic never exceeds Breslow–Day (fixed seed)", () => {
    const count = fc.integer({ min: 1, max: 60 });
    const stratum = fc.tuple(count, count, count, count).map(([a, b, c, d]) => [
      [a, b],
      [c, d],
    ]);
    fc.assert(
      fc.property(fc.array(stratum, { minLength: 2, maxLength: 6 }), (tables) => {
        const plain = breslowDayTest(tables);
        const corrected = breslowDayTest(tables, { tarone: true });
        const expected = reference(tables);
        return (
          Math.abs(plain.statistic - expected.statistic) < 1e-8 * (1 + expected.statistic) &&
          Math.abs(plain.pValue - expected.pValue) < 1e-8 &&
          plain.df === tables.length - 1 &&
          corrected.statistic <= plain.statistic + 1e-12 &&
          corrected.statistic >= 0
        );
      }),
      { seed: 20261206, numRuns: 300 },
    );
  });
});
