import { describe, expect, it } from "vitest";
import fc from "fast-check";
import jStat from "jstat";
import { effectiveSampleSize } from "../../src/stats/effectiveSampleSize.js";
import { createRandom } from "../../src/stats/createRandom.js";
import { lag1Autocorrelation } from "../../src/stats/lag1Autocorrelation.js";
import { StatsInputError } from "../../src/stats/StatsInputError.js";
import { brethertonEffectiveSampleSizeChecks } from "../fixtures/published/correlationExamples.js";

describe("effectiveSampleSize(n, r1, r2)", () => {
  // Bretherton et al. (1999) J. Climate 12:1990–2009, §5: N(1 − r₁r₂)/(1 + r₁r₂). Values C only (derived).
  it.each(brethertonEffectiveSampleSizeChecks)("effectiveSampleSize($n, $r1, $r2) → $effectiveN", ({ n, r1, r2, effectiveN }) => {
    expect(effectiveSampleSize(n, r1, r2)).toBeCloseTo(effectiveN, 4);
  });

  it("matches Bartlett's large-lag variance: 1/N_eff = (1/N)(1 + r₁r₂)/(1 − r₁r₂), SE 0.12910 at N = 100, r = 0.5", () => {
    // Bartlett M.S. (1935) "Some aspects of the time-correlation problem in regard to tests of significance",
    // JRSS 98(3):536–543: Var(r_xy) ≈ (1/N) Σⱼ ρ_xx(j)ρ_yy(j) for independent series (form from memory);
    // SE = √(1/60) = 0.12910 here is derived, not a printed number.
    expect(Math.sqrt(1 / effectiveSampleSize(100, 0.5, 0.5))).toBeCloseTo(0.1291, 5);
  });

  it("equals N divided by Bartlett's sum Σⱼ ρ₁(j)ρ₂(j) over j = −∞…∞, summed term by term for AR(1) series", () => {
    // Bretherton et al. (1999) §5 obtain N(1 − r₁r₂)/(1 + r₁r₂) from this sum with ρ(j) = r^|j| (AR(1); the
    // derivation route is from memory); here the sum is added up numerically (|j| ≤ 2000), not in closed form.
    for (const [r1, r2] of [[0.5, 0.5], [0.3, 0.6], [0.9, 0.8], [-0.4, -0.7], [0.05, 0.99]] as const) {
      let sum = 0;
      for (let lag = -2000; lag <= 2000; lag += 1) sum += r1 ** Math.abs(lag) * r2 ** Math.abs(lag);
      expect(effectiveSampleSize(250, r1, r2)).toBeCloseTo(250 / sum, 9);
    }
  });

  it("1/N_eff predicts the spread of the correlation of two independent simulated AR(1) series (N = 200, φ = 0.6)", () => {
    // Monte Carlo check of the formula's meaning: for independent series, Var(r) ≈ 1/N_eff
    // (Bretherton et al. 1999, §5). N_eff = 200 · 0.64/1.36 = 94.12, so Var(r) ≈ 0.01063 (√ ≈ 0.1031).
    const random = createRandom(1999);
    const normal = (): number => jStat.normal.inv(Math.min(1 - 1e-12, random.nextFloat() + 1e-12), 0, 1);
    const series = (phi: number): number[] => {
      const values = [normal() / Math.sqrt(1 - phi * phi)];
      for (let t = 1; t < 200; t += 1) values.push(phi * (values[t - 1] as number) + normal());
      return values;
    };
    const correlations = Array.from({ length: 1500 }, () => jStat.corrcoeff(series(0.6), series(0.6)));
    const observedVariance = jStat.variance(correlations);
    const predicted = 1 / effectiveSampleSize(200, 0.6, 0.6);
    // sampling error of a variance from 1500 draws ≈ √(2/1500) ≈ 3.7 %; finite-N bias of a few per cent
    expect(Math.abs(observedVariance / predicted - 1)).toBeLessThan(0.15);
    // and clearly not the white-noise value 1/N (which is 47 % smaller)
    expect(observedVariance).toBeGreaterThan(1.5 / 200);
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
      { seed: 1990 },
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
