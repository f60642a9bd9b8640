import { haversineDistance, MEAN_EARTH_RADIUS_KM, type GeoPoint } from "./haversineDistance.js";

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
 * Cost: sites are swept in order of latitude and a pair is measured only while their latitudes
 * differ by less than the threshold (the great-circle distance is at least R·|Δlatitude|, so no
 * close pair is missed): about n log n plus the pairs within one latitude band, instead of
 * n(n−1)/2. The result is the same as measuring every pair.
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
  if (sites.length < 2) return [];
  for (const site of sites) {
    if (!Number.isFinite(site.latitude) || Math.abs(site.latitude) > 90) {
      throw new RangeError(`latitude must be between -90 and 90 (found ${site.latitude})`);
    }
    if (!Number.isFinite(site.longitude) || Math.abs(site.longitude) > 180) {
      throw new RangeError(`longitude must be between -180 and 180 (found ${site.longitude})`);
    }
  }
  // Sweep in latitude order. Great-circle distance ≥ R·|Δφ| (φ in radians), so once the latitude
  // gap alone reaches the threshold no later site in the sweep can be closer; a tiny margin keeps
  // rounding from cutting off a pair right at the threshold.
  const byLatitude = Array.from({ length: sites.length }, (_, i) => i).sort(
    (x, y) => (sites[x] as GeoPoint).latitude - (sites[y] as GeoPoint).latitude || x - y,
  );
  const cutoff = thresholdKm * (1 + 1e-9) + 1e-9;
  const pairs: { a: string; b: string; distanceKm: number; first: number; second: number }[] = [];
  for (let p = 0; p < byLatitude.length; p++) {
    const i = byLatitude[p] as number;
    const latitude = (sites[i] as GeoPoint).latitude;
    for (let q = p + 1; q < byLatitude.length; q++) {
      const j = byLatitude[q] as number;
      const gapKm = (((sites[j] as GeoPoint).latitude - latitude) * Math.PI * MEAN_EARTH_RADIUS_KM) / 180;
      if (gapKm > cutoff) break;
      const first = Math.min(i, j);
      const second = Math.max(i, j);
      const a = sites[first] as GeoPoint & { id: string };
      const b = sites[second] as GeoPoint & { id: string };
      const distanceKm = haversineDistance(a, b);
      if (distanceKm < thresholdKm) pairs.push({ a: a.id, b: b.id, distanceKm, first, second });
    }
  }
  // Closest first, then in input order of the pair (the order of measuring every pair i < j).
  pairs.sort((x, y) => x.distanceKm - y.distanceKm || x.first - y.first || x.second - y.second);
  return pairs.map(({ a, b, distanceKm }) => ({ a, b, distanceKm }));
}
