import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { analogYears } from "../../src/outlook/analogYears.js";

describe("analogYears(current, moments, candidates, k)", () => {
  it("ranks by Euclidean distance in z-scores (hand-computed)", () => {
    const moments = new Map([["ENSO", { mean: 0, sd: 1 }], ["NAO", { mean: 0, sd: 2 }]]);
    const current = new Map([["ENSO", 1], ["NAO", 2]]);
    const candidates = [
      { year: 1901, values: new Map([["ENSO", 1], ["NAO", 2]]) }, // distance 0
      { year: 1902, values: new Map([["ENSO", 0], ["NAO", 2]]) }, // distance 1
      { year: 1903, values: new Map([["ENSO", 1], ["NAO", 0]]) }, // (0, −1) → 1
      { year: 1904, values: new Map([["ENSO", 4], ["NAO", 6]]) }, // (3, 2) → √13
      { year: 1905, values: new Map([["ENSO", 1]]) }, // missing NAO: not a candidate
    ];
    const result = analogYears(current, moments, candidates, 3);
    expect(result.map((a) => a.year)).toEqual([1901, 1902, 1903]);
    expect(result.map((a) => a.distance)).toEqual([0, 1, 1]);
  });

  it("agrees with a brute-force search over every candidate", () => {
    fc.assert(
      fc.property(
        fc.array(fc.tuple(fc.double({ min: -3, max: 3, noNaN: true }), fc.double({ min: -3, max: 3, noNaN: true })), { minLength: 1, maxLength: 40 }),
        fc.integer({ min: 1, max: 12 }),
        (points, k) => {
          const candidates = points.map(([x, y], i) => ({ year: 1800 + i, values: new Map([["X", x], ["Y", y]]) }));
          const moments = new Map([["X", { mean: 0.1, sd: 1.3 }], ["Y", { mean: -0.2, sd: 0.7 }]]);
          const current = new Map([["X", 0.5], ["Y", -1]]);
          const brute = candidates
            .map((c) => ({
              year: c.year,
              distance: Math.hypot(((c.values.get("X") as number) - 0.5) / 1.3, ((c.values.get("Y") as number) + 1) / 0.7),
            }))
            .sort((a, b) => a.distance - b.distance || a.year - b.year)
            .slice(0, k);
          const found = analogYears(current, moments, candidates, k);
          // Same distances in the same order; years may differ only between equal distances
          // (the brute force uses Math.hypot, whose last bit can differ from a square root of sums).
          expect(found).toHaveLength(brute.length);
          found.forEach((a, i) => expect(a.distance).toBeCloseTo(brute[i]?.distance as number, 12));
          const bruteDistance = new Map(brute.map((b) => [b.year, b.distance]));
          for (const a of found) {
            const own = bruteDistance.get(a.year) ?? Math.hypot(((candidates[a.year - 1800]?.values.get("X") as number) - 0.5) / 1.3, ((candidates[a.year - 1800]?.values.get("Y") as number) + 1) / 0.7);
            expect(own).toBeCloseTo(a.distance, 12);
          }
        },
      ),
      { numRuns: 100, seed: 1 },
    );
  });
});
