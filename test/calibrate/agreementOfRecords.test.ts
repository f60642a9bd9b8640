import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { agreementOfRecords } from "../../src/calibrate/agreementOfRecords.js";

/** Cohen's kappa of a 2 × 2 table by the closed form 2(ad − bc) / ((a + b)(b + d) + (a + c)(c + d)), written here. */
function closedFormKappa(a: number, b: number, c: number, d: number): number {
  return (2 * (a * d - b * c)) / ((a + b) * (b + d) + (a + c) * (c + d));
}

describe("agreementOfRecords(counts) — Cohen's kappa", () => {
  it("50 cases, 20 both yes, 5 and 10 discordant, 15 both no → pₒ = 0.7, pₑ = 0.5, kappa = 0.4", () => {
    // The two-reader grant-proposal example of the usual textbook presentation of Cohen (1960); from memory.
    const result = agreementOfRecords({ both: 20, fireScarOnly: 5, modernOnly: 10, neither: 15 });
    expect(result.agreementShare).toBeCloseTo(0.7, 12);
    expect(result.kappa).toBeCloseTo(0.4, 12);
  });

  it("20 patients, 12 both yes, 2 and 4 discordant, 2 both no → pₒ = 0.7, pₑ = 0.62, kappa = 0.08 / 0.38 = 0.2105", () => {
    // Worked example of a two-doctor diagnosis table (easycalculation.com, "Cohen's kappa index", read during this work).
    const result = agreementOfRecords({ both: 12, fireScarOnly: 2, modernOnly: 4, neither: 2 });
    expect(result.agreementShare).toBeCloseTo(0.7, 12);
    expect(result.kappa).toBeCloseTo(0.08 / 0.38, 12);
  });

  it("agrees with the closed form 2(ad − bc)/((a+b)(b+d)+(a+c)(c+d)) on random tables", () => {
    fc.assert(
      fc.property(fc.nat(40), fc.nat(40), fc.nat(40), fc.nat(40), (a, b, c, d) => {
        const result = agreementOfRecords({ both: a, fireScarOnly: b, modernOnly: c, neither: d });
        const n = a + b + c + d;
        if (n === 0) return result.kappa === null && result.agreementShare === null;
        const denominator = (a + b) * (b + d) + (a + c) * (c + d);
        if (denominator === 0) return result.kappa === null && typeof result.reason === "string";
        return Math.abs((result.kappa as number) - closedFormKappa(a, b, c, d)) < 1e-12 && Math.abs((result.agreementShare as number) - (a + d) / n) < 1e-12;
      }),
      { seed: 20270310, numRuns: 500 },
    );
  });

  it("no shared years → null with a reason; every year in one class → kappa null with a reason", () => {
    expect(agreementOfRecords({ both: 0, fireScarOnly: 0, modernOnly: 0, neither: 0 })).toEqual({ agreementShare: null, kappa: null, reason: "no year is in both records" });
    const same = agreementOfRecords({ both: 0, fireScarOnly: 0, modernOnly: 0, neither: 12 });
    expect(same.agreementShare).toBe(1);
    expect(same.kappa).toBeNull();
    expect(same.reason).toMatch(/kappa is not defined/);
  });

  it("throws RangeError for a negative or fractional count", () => {
    expect(() => agreementOfRecords({ both: -1, fireScarOnly: 0, modernOnly: 0, neither: 0 })).toThrow(RangeError);
    expect(() => agreementOfRecords({ both: 1.5, fireScarOnly: 0, modernOnly: 0, neither: 0 })).toThrow(RangeError);
  });
});
