import { describe, expect, it } from "vitest";
import { closeSitePairs } from "../../src/record/closeSitePairs.js";
import { haversineDistance } from "../../src/record/haversineDistance.js";

// The four sites of test/fixtures/regions/valid.
const SITES = Object.freeze([
  { id: "A", latitude: 45.0, longitude: -140.0 },
  { id: "B", latitude: 45.1, longitude: -140.0 },
  { id: "C", latitude: 46.0, longitude: -141.0 },
  { id: "D", latitude: 44.0, longitude: -139.0 },
]);

describe("closeSitePairs(sites, thresholdKm)", () => {
  it("closeSitePairs(4 sites, 40) → only A–B, 0.1° of latitude = 6371·π/1800 km apart", () => {
    expect(closeSitePairs(SITES, 40)).toEqual([{ a: "A", b: "B", distanceKm: expect.closeTo((6371 * Math.PI) / 1800, 9) }]);
  });

  it("returns every pair under a large threshold, closest first, with distances from haversineDistance", () => {
    const pairs = closeSitePairs(SITES, 1000);
    expect(pairs).toHaveLength(6);
    expect(pairs.map((p) => p.distanceKm)).toEqual([...pairs.map((p) => p.distanceKm)].sort((x, y) => x - y));
    for (const pair of pairs) {
      const a = SITES.find((s) => s.id === pair.a);
      const b = SITES.find((s) => s.id === pair.b);
      if (a === undefined || b === undefined) throw new Error("unknown id");
      expect(pair.distanceKm).toBe(haversineDistance(a, b));
    }
  });

  it("is strict: a pair exactly at the threshold is not close; 0 km returns nothing", () => {
    const distance = haversineDistance(SITES[0] as (typeof SITES)[number], SITES[1] as (typeof SITES)[number]);
    expect(closeSitePairs(SITES.slice(0, 2), distance)).toEqual([]);
    expect(closeSitePairs(SITES, 0)).toEqual([]);
  });

  it("returns nothing for fewer than two sites and throws RangeError for a negative threshold", () => {
    expect(closeSitePairs([], 40)).toEqual([]);
    expect(closeSitePairs(SITES.slice(0, 1), 40)).toEqual([]);
    expect(() => closeSitePairs(SITES, -1)).toThrow(RangeError);
  });
});
