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

/**
 * Independent adjusted values straight from the definition, O(m²), no sorting or running minimum:
 * q_i = min over every j with p_j ≥ p_i of min(1, m·p_j / r_j), where r_j = #{k : p_k ≤ p_j} is the rank of
 * p_j with ties sharing their highest rank (Benjamini & Hochberg 1995; adjusted values as in Wright S.P. (1992)
 * "Adjusted p-values for simultaneous inference", Biometrics 48(4):1005–1013 — the form is from memory).
 */
function definitionAdjusted(pValues: readonly number[]): number[] {
  const defined = pValues.filter((p) => !Number.isNaN(p));
  const m = defined.length;
  return pValues.map((p) => {
    if (Number.isNaN(p)) return Number.NaN;
    let smallest = 1;
    for (const other of defined) {
      if (other < p) continue;
      const rank = defined.filter((value) => value <= other).length;
      smallest = Math.min(smallest, (m * other) / rank);
    }
    return smallest;
  });
}

/**
 * Ten p-values with their BH-adjusted values as printed by the R package multtest (Pollard K.S., Dudoit S.,
 * van der Laan M.J., `mt.rawp2adjp(rawp, "BH")`), reproduced to 16 digits as `res_multtest1` (columns rawp and
 * BH) in statsmodels' statsmodels/stats/tests/test_multi.py. Sorted ascending.
 */
const MULTTEST_RAW = Object.freeze([
  5.23656777208e-5, 2.8140506198e-4, 1.49877310796e-2, 2.02732688798e-2, 1.77096952723e-1, 6.42193923795e-1,
  6.80845947633e-1, 7.1626938238e-1, 8.38541367553e-1, 9.67833824309e-1,
]);
const MULTTEST_BH = Object.freeze([
  5.2365677720800005e-4, 1.4070253098999999e-3, 4.995910359866667e-2, 5.0683172199499998e-2,
  3.5419390544599999e-1, 8.9533672797500008e-1, 8.9533672797500008e-1, 8.9533672797500008e-1,
  9.3171263061444454e-1, 9.67833824309e-1,
]);

describe("benjaminiHochberg(pValues)", () => {
  // Benjamini & Hochberg (1995) JRSS B 57:289–300, §4: 15 p-values, four rejected at q = 0.05 (V-secondary).
  it("benjaminiHochberg(BH 1995 example) rejects the four smallest of 15 at q = 0.05", () => {
    const adjusted = benjaminiHochberg(benjaminiHochberg1995PValues);
    expect(adjusted.filter((q) => q <= 0.05)).toHaveLength(benjaminiHochberg1995RejectedAt05);
    expect(stepUpRejections(benjaminiHochberg1995PValues, 0.05)).toBe(benjaminiHochberg1995RejectedAt05);
    expect(adjusted.slice(0, 4).every((q) => q <= 0.05)).toBe(true);
  });

  it("benjaminiHochberg(BH 1995 example) gives the adjusted p-values 0.0015, 0.003, 0.0095, 0.0356, … (derived)", () => {
    // The paper prints the rejections, not adjusted values: these are recomputed (4 decimals), checked here
    // against the definition implemented independently below as well.
    const adjusted = benjaminiHochberg(benjaminiHochberg1995PValues);
    adjusted.forEach((q, index) => expect(q).toBeCloseTo(benjaminiHochberg1995Adjusted[index] ?? Number.NaN, 4));
    definitionAdjusted(benjaminiHochberg1995PValues).forEach((q, index) =>
      expect(adjusted[index]).toBeCloseTo(q, 15),
    );
    // ranks 6 and 7 tie through the step-up minimum: min(0.0278·15/6, 0.0298·15/7) = 0.0298·15/7
    expect(adjusted[5]).toBe(adjusted[6]);
    expect(adjusted[5]).toBeCloseTo((0.0298 * 15) / 7, 14);
  });

  it("benjaminiHochberg(10 p-values) → the BH column printed by R multtest mt.rawp2adjp (16 digits)", () => {
    const adjusted = benjaminiHochberg(MULTTEST_RAW);
    adjusted.forEach((q, index) => expect(q).toBeCloseTo(MULTTEST_BH[index] as number, 14));
    // shuffled input gives the same values in the shuffled order
    const order = [7, 2, 9, 0, 5, 3, 8, 1, 6, 4];
    const shuffled = benjaminiHochberg(order.map((index) => MULTTEST_RAW[index] as number));
    shuffled.forEach((q, position) => expect(q).toBeCloseTo(MULTTEST_BH[order[position] as number] as number, 14));
  });

  it("agrees with the O(m²) definition on random p-values with ties and NaN (fast-check, fixed seed)", () => {
    fc.assert(
      fc.property(
        fc.array(
          fc.oneof(
            fc.integer({ min: 0, max: 1000 }).map((step) => step / 1000),
            fc.constant(Number.NaN),
            fc.double({ min: 0, max: 1, noNaN: true }),
          ),
          { maxLength: 50 },
        ),
        (pValues) => {
          const actual = benjaminiHochberg(pValues);
          const expected = definitionAdjusted(pValues);
          return actual.every((q, index) => {
            const reference = expected[index] as number;
            return Number.isNaN(reference) ? Number.isNaN(q) : Math.abs(q - reference) <= 1e-12;
          });
        },
      ),
      { seed: 1995, numRuns: 400 },
    );
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

  it("caps at 1 and takes the step-up minimum: [0.9, 0.95] → [0.95, 0.95]; [0.7, 0.8, 0.6] → all 0.8", () => {
    expect(benjaminiHochberg([0.9, 0.95])).toEqual([0.95, 0.95]);
    // m·p/rank: 0.6·3/1 = 1.8 (capped), 0.7·3/2 = 1.05 (capped), 0.8·3/3 = 0.8; the minimum from above is 0.8
    expect(benjaminiHochberg([0.7, 0.8, 0.6])).toEqual([0.8, 0.8, 0.8]);
    expect(benjaminiHochberg([0.9, 0.2])).toEqual([0.9, 0.4]);
  });

  it("property: q ≥ p and q is monotone in p", () => {
    fc.assert(
      fc.property(fc.array(fc.double({ min: 0, max: 1, noNaN: true }), { maxLength: 60 }), (pValues) => {
        const adjusted = benjaminiHochberg(pValues);
        const pairs = pValues.map((p, index) => ({ p, q: adjusted[index] ?? Number.NaN }));
        const ordered = [...pairs].sort((left, right) => left.p - right.p);
        return (
          pairs.every(({ p, q }) => q >= p) &&
          ordered.every((pair, index) => index === 0 || pair.q >= (ordered[index - 1]?.q ?? 0))
        );
      }),
      { seed: 289 },
    );
  });

  it("property: q ≤ α exactly for the hypotheses the step-up rule rejects at α", () => {
    fc.assert(
      fc.property(
        fc.array(fc.double({ min: 0, max: 1, noNaN: true }), { minLength: 1, maxLength: 40 }),
        fc.constantFrom(0.01, 0.05, 0.1, 0.2),
        (pValues, alpha) => benjaminiHochberg(pValues).filter((q) => q <= alpha).length === stepUpRejections(pValues, alpha),
      ),
      { seed: 300 },
    );
  });

  it.each([[[-0.1]], [[1.01]], [[Number.POSITIVE_INFINITY]], [[0.2, Number.NEGATIVE_INFINITY]]])(
    "benjaminiHochberg(%j) throws StatsInputError",
    (pValues) => {
      expect(() => benjaminiHochberg(pValues)).toThrow(StatsInputError);
    },
  );
});
