import { haversineDistance, type GeoPoint } from "./haversineDistance.js";

/** Two sites closer together than a threshold distance. */
export interface SitePair {
  /** Site ids; `a` comes before `b` in the input order. */
  readonly a: string;
  readonly b: string;
  /** Great-circle distance in km (haversine, mean Earth radius 6371.0 km). */
  readonly distanceKm: number;
}

/**
 * Close site pairs: every pair of sites whose great-circle distance is less than `thresholdKm`,
 * closest first. Fire scars at sites close together may record the same fires, so such sites may
 * not be independent evidence of a fire year. Treating sites 40 km apart as independent (the
 * default of `methods.independenceKm`) is common practice in fire-history work; there is no
 * published source for that distance.
 *
 * Cost: n(n−1)/2 distance computations for n sites.
 *
 * @param sites - sites with an id and a position (decimal degrees); ids should be unique
 * @param thresholdKm - pairs strictly closer than this (km, ≥ 0) are returned
 * @returns the close pairs sorted by distance, then by input order; empty when no pair is close
 *   or there are fewer than two sites
 * @throws RangeError when `thresholdKm` is negative or not a number, or a coordinate is out of range
 * @example
 * closeSitePairs([{ id: "A", latitude: 45, longitude: -110 }, { id: "B", latitude: 45.1, longitude: -110 }], 40);
 * // => [{ a: "A", b: "B", distanceKm: 11.11949266445603 }]
 */
export function closeSitePairs(
  sites: readonly (GeoPoint & { readonly id: string })[],
  thresholdKm: number,
): SitePair[] {
  if (Number.isNaN(thresholdKm) || thresholdKm < 0) {
    throw new RangeError(`thresholdKm must be ≥ 0 (found ${thresholdKm})`);
  }
  const pairs: (SitePair & { order: number })[] = [];
  let order = 0;
  for (let i = 0; i < sites.length; i++) {
    for (let j = i + 1; j < sites.length; j++) {
      const a = sites[i] as GeoPoint & { id: string };
      const b = sites[j] as GeoPoint & { id: string };
      const distanceKm = haversineDistance(a, b);
      if (distanceKm < thresholdKm) pairs.push({ a: a.id, b: b.id, distanceKm, order });
      order++;
    }
  }
  pairs.sort((x, y) => x.distanceKm - y.distanceKm || x.order - y.order);
  return pairs.map(({ a, b, distanceKm }) => ({ a, b, distanceKm }));
}
