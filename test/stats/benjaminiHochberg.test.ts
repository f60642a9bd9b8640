import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { benjaminiHochberg } from "../../src/stats/benjaminiHochberg.js";
import { StatsInputError } from "../../src/stats/StatsInputError.js";
import {
  benjaminiHochberg1995Adjusted,
  benjaminiHochberg1995PValues,
  benjaminiHochberg1995RejectedAt05,
} from "../fixtures/published/benjaminiHochberg1995.js";

/** The BH step-up rule as stated in the paper: reject H(1)…H(k) for the largest k with p(k) ≤ k·q/m. */
function stepUpRejections(pValues: readonly number[], q: number): number {
  const sorted = [...pValues].sort((left, right) => left - right);
  let largest = 0;
  sorted.forEach((p, index) => {
    if (p <= ((index + 1) * q) / sorted.length) largest = index + 1;
  });
  return largest;
}

describe("benjaminiHochberg(pValues)", () => {
  // Benjamini & Hochberg (1995) JRSS B 57:289–300, §4: 15 p-values, four rejected at q = 0.05 (V-secondary).
  it("benjaminiHochberg(BH 1995 example) rejects the four smallest of 15 at q = 0.05", () => {
    const adjusted = benjaminiHochberg(benjaminiHochberg1995PValues);
    expect(adjusted.filter((q) => q <= 0.05)).toHaveLength(benjaminiHochberg1995RejectedAt05);
    expect(stepUpRejections(benjaminiHochberg1995PValues, 0.05)).toBe(benjaminiHochberg1995RejectedAt05);
    expect(adjusted.slice(0, 4).every((q) => q <= 0.05)).toBe(true);
  });

  it("benjaminiHochberg(BH 1995 example) gives the adjusted p-values 0.0015, 0.003, 0.0095, 0.0356, … (C)", () => {
    const adjusted = benjaminiHochberg(benjaminiHochberg1995PValues);
    adjusted.forEach((q, index) => expect(q).toBeCloseTo(benjaminiHochberg1995Adjusted[index] ?? Number.NaN, 4));
    // ranks 6 and 7 tie through the step-up minimum: min(0.0278·15/6, 0.0298·15/7) = 0.0298·15/7
    expect(adjusted[5]).toBe(adjusted[6]);
    expect(adjusted[5]).toBeCloseTo((0.0298 * 15) / 7, 14);
  });

  it("returns results in the input order, not sorted order", () => {
    const shuffled = [0.5719, 0.0001, 1.0, 0.0095, 0.0459];
    const adjusted = benjaminiHochberg(shuffled);
    const sortedAdjusted = benjaminiHochberg([0.0001, 0.0095, 0.0459, 0.5719, 1.0]);
    expect(adjusted).toEqual([sortedAdjusted[3], sortedAdjusted[0], sortedAdjusted[4], sortedAdjusted[1], sortedAdjusted[2]]);
  });

  it("NaN entries stay NaN and are not counted in m", () => {
    const adjusted = benjaminiHochberg([0.01, Number.NaN, 0.04, Number.NaN]);
    expect(adjusted[1]).toBeNaN();
    expect(adjusted[3]).toBeNaN();
    // m = 2: q = min(2·0.01/1, 2·0.04/2) = 0.02 and 0.04
    expect(adjusted[0]).toBeCloseTo(0.02, 15);
    expect(adjusted[2]).toBeCloseTo(0.04, 15);
  });

  it("degenerate input: [] → [], a single p-value is unchanged, all NaN stays all NaN", () => {
    expect(benjaminiHochberg([])).toEqual([]);
    expect(benjaminiHochberg([0.03])).toEqual([0.03]);
    expect(benjaminiHochberg([Number.NaN, Number.NaN]).every(Number.isNaN)).toBe(true);
  });

  it("ties receive equal adjusted values: [0.02, 0.02, 0.02] → all 0.02", () => {
    expect(benjaminiHochberg([0.02, 0.02, 0.02])).toEqual([0.02, 0.02, 0.02]);
  });

  it("caps at 1: [0.9, 0.95] → [0.95, 0.95] and m·p > 1 is never returned", () => {
    expect(benjaminiHochberg([0.9, 0.95])).toEqual([0.95, 0.95]);
    expect(benjaminiHochberg([0.7, 0.8, 0.6]).every((q) => q <= 1)).toBe(true);
  });

  it("property: q ≥ p, q ≤ 1, and q is monotone in p", () => {
    fc.assert(
      fc.property(fc.array(fc.double({ min: 0, max: 1, noNaN: true }), { maxLength: 60 }), (pValues) => {
        const adjusted = benjaminiHochberg(pValues);
        const pairs = pValues.map((p, index) => ({ p, q: adjusted[index] ?? Number.NaN }));
        const ordered = [...pairs].sort((left, right) => left.p - right.p);
        return (
          pairs.every(({ p, q }) => q >= p && q <= 1) &&
          ordered.every((pair, index) => index === 0 || pair.q >= (ordered[index - 1]?.q ?? 0))
        );
      }),
    );
  });

  it("property: q ≤ α exactly for the hypotheses the step-up rule rejects at α", () => {
    fc.assert(
      fc.property(
        fc.array(fc.double({ min: 0, max: 1, noNaN: true }), { minLength: 1, maxLength: 40 }),
        fc.constantFrom(0.01, 0.05, 0.1, 0.2),
        (pValues, alpha) => benjaminiHochberg(pValues).filter((q) => q <= alpha).length === stepUpRejections(pValues, alpha),
      ),
    );
  });

  it.each([[[-0.1]], [[1.01]], [[Number.POSITIVE_INFINITY]], [[0.2, Number.NEGATIVE_INFINITY]]])(
    "benjaminiHochberg(%j) throws StatsInputError",
    (pValues) => {
      expect(() => benjaminiHochberg(pValues)).toThrow(StatsInputError);
    },
  );
});
