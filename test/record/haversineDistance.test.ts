import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { haversineDistance, MEAN_EARTH_RADIUS_KM } from "../../src/record/haversineDistance.js";

const BNA = Object.freeze({ latitude: 36.12, longitude: -86.67 });
const LAX = Object.freeze({ latitude: 33.94, longitude: -118.4 });

/** Independent second implementation: the spherical law of cosines, d = R·acos(sin φ₁ sin φ₂ + cos φ₁ cos φ₂ cos Δλ). */
function lawOfCosines(a: { latitude: number; longitude: number }, b: { latitude: number; longitude: number }, radius: number): number {
  const rad = Math.PI / 180;
  const cosine =
    Math.sin(a.latitude * rad) * Math.sin(b.latitude * rad) +
    Math.cos(a.latitude * rad) * Math.cos(b.latitude * rad) * Math.cos((b.longitude - a.longitude) * rad);
  return radius * Math.acos(Math.max(-1, Math.min(1, cosine)));
}

describe("haversineDistance(a, b, radiusKm)", () => {
  // Rosetta Code, task "Haversine formula": BNA (36.12, -86.67) to LAX (33.94, -118.40).
  // Value as quoted by many repository tests of that task; the same digits were recomputed in Python and Node.
  it("haversineDistance(BNA, LAX) with R = 6371.0 km → 2886.4444428379834 km (Rosetta Code)", () => {
    expect(MEAN_EARTH_RADIUS_KM).toBe(6371.0);
    expect(haversineDistance(BNA, LAX)).toBeCloseTo(2886.4444428379834, 9);
  });

  it("haversineDistance(BNA, LAX, 6372.8) → 2887.2599506071106 km (Rosetta Code)", () => {
    expect(haversineDistance(BNA, LAX, 6372.8)).toBeCloseTo(2887.2599506071106, 9);
  });

  it("agrees with the spherical law of cosines for points more than 1 km apart (fast-check)", () => {
    const point = fc.record({
      latitude: fc.double({ min: -90, max: 90, noNaN: true }),
      longitude: fc.double({ min: -180, max: 180, noNaN: true }),
    });
    fc.assert(
      fc.property(point, point, (a, b) => {
        const expected = lawOfCosines(a, b, MEAN_EARTH_RADIUS_KM);
        fc.pre(expected > 1);
        expect(Math.abs(haversineDistance(a, b) - expected)).toBeLessThan(1e-6 * expected + 1e-3);
      }),
      { numRuns: 500, seed: 11 },
    );
  });

  it("is symmetric, 0 for the same point, πR for antipodes, and 1° of latitude = πR/180", () => {
    expect(haversineDistance(LAX, BNA)).toBe(haversineDistance(BNA, LAX));
    expect(haversineDistance(BNA, BNA)).toBe(0);
    expect(haversineDistance({ latitude: 0, longitude: 0 }, { latitude: 0, longitude: 180 })).toBeCloseTo(Math.PI * 6371, 9);
    expect(haversineDistance({ latitude: 45, longitude: 10 }, { latitude: 46, longitude: 10 })).toBeCloseTo((Math.PI * 6371) / 180, 9);
  });

  it("throws RangeError for a latitude beyond ±90, a longitude beyond ±180, NaN, or a radius ≤ 0", () => {
    expect(() => haversineDistance({ latitude: 91, longitude: 0 }, BNA)).toThrow(RangeError);
    expect(() => haversineDistance(BNA, { latitude: 0, longitude: -181 })).toThrow(RangeError);
    expect(() => haversineDistance({ latitude: Number.NaN, longitude: 0 }, BNA)).toThrow(RangeError);
    expect(() => haversineDistance(BNA, LAX, 0)).toThrow(RangeError);
  });
});
