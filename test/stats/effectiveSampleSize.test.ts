import { describe, expect, it } from "vitest";
import fc from "fast-check";
import jStat from "jstat";
import { effectiveSampleSize } from "../../src/stats/effectiveSampleSize.js";
import { lag1Autocorrelation } from "../../src/stats/lag1Autocorrelation.js";
import { StatsInputError } from "../../src/stats/StatsInputError.js";
import { brethertonEffectiveSampleSizeChecks } from "../fixtures/published/correlationExamples.js";

describe("effectiveSampleSize(n, r1, r2)", () => {
  // Bretherton et al. (1999) J. Climate 12:1990–2009, §5: N(1 − r₁r₂)/(1 + r₁r₂). Values C only (derived).
  it.each(brethertonEffectiveSampleSizeChecks)("effectiveSampleSize($n, $r1, $r2) → $effectiveN", ({ n, r1, r2, effectiveN }) => {
    expect(effectiveSampleSize(n, r1, r2)).toBeCloseTo(effectiveN, 4);
  });

  it("matches Bartlett's large-lag variance: 1/N_eff = (1/N)(1 + r₁r₂)/(1 − r₁r₂), SE 0.12910 at N = 100, r = 0.5", () => {
    // REFERENCES.md §9: Bartlett SE = 0.12910 for N = 100, r₁ = r₂ = 0.5 (C).
    expect(Math.sqrt(1 / effectiveSampleSize(100, 0.5, 0.5))).toBeCloseTo(0.1291, 5);
  });

  it("agrees with the formula written independently, for positive products", () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 3, max: 1000 }),
        fc.double({ min: 0.001, max: 0.999, noNaN: true }),
        fc.double({ min: 0.001, max: 0.999, noNaN: true }),
        fc.boolean(),
        (n, a, b, bothNegative) => {
          const [r1, r2] = bothNegative ? [-a, -b] : [a, b];
          const expected = (n * (1 - a * b)) / (1 + a * b);
          const actual = effectiveSampleSize(n, r1, r2);
          return Math.abs(actual - expected) < 1e-9 * n && actual > 0 && actual < n;
        },
      ),
    );
  });

  it("caps at n when r₁r₂ ≤ 0 (never credits more pairs than observed): effectiveSampleSize(50, 0.4, −0.3) → 50", () => {
    expect(effectiveSampleSize(50, 0.4, -0.3)).toBe(50);
    expect(effectiveSampleSize(50, 0, 0.9)).toBe(50);
    expect(effectiveSampleSize(50, -0.8, 0.8)).toBe(50);
  });

  it("has no lower clamp: effectiveSampleSize(10, 0.9, 0.9) → 10·0.19/1.81 ≈ 1.0497, and r₁r₂ = 1 gives 0", () => {
    expect(effectiveSampleSize(10, 0.9, 0.9)).toBeCloseTo((10 * 0.19) / 1.81, 12);
    expect(effectiveSampleSize(10, 1, 1)).toBe(0);
    expect(effectiveSampleSize(0, 0.5, 0.5)).toBe(0);
  });

  it("shrinks N for two persistent AR(1)-like series built from a seeded recurrence", () => {
    // x_t = 0.7 x_{t−1} + e_t with e_t from a fixed linear congruential sequence (Park–Miller minimal standard)
    let state = 12345;
    const uniform = (): number => {
      state = (state * 48271) % 2147483647;
      return state / 2147483647;
    };
    const series = (): number[] => {
      const values: number[] = [0];
      for (let t = 1; t < 400; t += 1) values.push(0.7 * (values[t - 1] ?? 0) + jStat.normal.inv(uniform(), 0, 1));
      return values;
    };
    const r1 = lag1Autocorrelation(series());
    const r2 = lag1Autocorrelation(series());
    expect(r1).toBeGreaterThan(0.5);
    expect(r2).toBeGreaterThan(0.5);
    const effective = effectiveSampleSize(400, r1, r2);
    expect(effective).toBeLessThan(400 * 0.6);
    expect(effective).toBeGreaterThan(400 * 0.2);
  });

  it("NaN autocorrelation (a constant series) gives NaN", () => {
    expect(effectiveSampleSize(30, Number.NaN, 0.4)).toBeNaN();
    expect(effectiveSampleSize(30, 0.4, Number.NaN)).toBeNaN();
  });

  it("throws StatsInputError for negative or infinite n and for r outside [−1, 1]", () => {
    expect(() => effectiveSampleSize(-1, 0.2, 0.2)).toThrow(StatsInputError);
    expect(() => effectiveSampleSize(Number.POSITIVE_INFINITY, 0.2, 0.2)).toThrow(StatsInputError);
    expect(() => effectiveSampleSize(Number.NaN, 0.2, 0.2)).toThrow(StatsInputError);
    expect(() => effectiveSampleSize(30, 1.2, 0.2)).toThrow(StatsInputError);
    expect(() => effectiveSampleSize(30, 0.2, -1.5)).toThrow(StatsInputError);
  });
});
