import fc from "fast-check";
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

  it("the latitude sweep finds exactly the pairs of measuring every pair, in the same order (fast-check)", () => {
    const site = fc.record({ latitude: fc.double({ min: -90, max: 90, noNaN: true }), longitude: fc.double({ min: -180, max: 180, noNaN: true }) });
    // Clustered points, so that close pairs are common.
    const clustered = fc.record({ latitude: fc.double({ min: 44, max: 45, noNaN: true }), longitude: fc.double({ min: -141, max: -140, noNaN: true }) });
    fc.assert(
      fc.property(fc.array(fc.oneof(site, clustered), { maxLength: 40 }), fc.double({ min: 0, max: 3000, noNaN: true }), (points, threshold) => {
        const sites = points.map((p, i) => ({ id: `s${i}`, ...p }));
        const brute: { a: string; b: string; distanceKm: number; order: number }[] = [];
        let order = 0;
        for (let i = 0; i < sites.length; i++) {
          for (let j = i + 1; j < sites.length; j++) {
            const distanceKm = haversineDistance(sites[i] as (typeof sites)[number], sites[j] as (typeof sites)[number]);
            if (distanceKm < threshold) brute.push({ a: `s${i}`, b: `s${j}`, distanceKm, order });
            order++;
          }
        }
        brute.sort((x, y) => x.distanceKm - y.distanceKm || x.order - y.order);
        expect(closeSitePairs(sites, threshold)).toEqual(brute.map(({ a, b, distanceKm }) => ({ a, b, distanceKm })));
      }),
      { numRuns: 300, seed: 20261203 },
    );
  });

  it("handles 130,000 sites spread over a continent-sized box without exhausting the stack or time", () => {
    const sites = Array.from({ length: 130_000 }, (_, i) => ({ id: `s${i}`, latitude: -60 + ((i * 7919) % 120_000) / 1000, longitude: -180 + ((i * 104_729) % 360_000) / 1000 }));
    const pairs = closeSitePairs(sites, 1);
    for (const pair of pairs) expect(pair.distanceKm).toBeLessThan(1);
  });
});
