/**
 * Mean radius of the Earth in kilometres: the IUGG mean radius R₁ = (2a + b) / 3 of the
 * ellipsoid (6371.0088 km for GRS 80), rounded to 6371.0 km as is usual for spherical distances.
 *
 * @see Moritz H. (2000) "Geodetic Reference System 1980", Journal of Geodesy 74:128–133 (mean radius R₁).
 */
export const MEAN_EARTH_RADIUS_KM = 6371.0;

/** A point on the Earth in decimal degrees (WGS 84 latitude and longitude). */
export interface GeoPoint {
  /** −90 (south pole) … 90 (north pole). */
  readonly latitude: number;
  /** −180 … 180, east positive. */
  readonly longitude: number;
}

const radians = (degrees: number): number => (degrees * Math.PI) / 180;

/**
 * Haversine great-circle distance: the shortest distance over a sphere of radius R between two
 * points given by latitude φ and longitude λ.
 * a = sin²(Δφ/2) + cos φ₁ · cos φ₂ · sin²(Δλ/2), distance = 2R · asin(√a).
 * The haversine form stays accurate for points close together, where the spherical law of
 * cosines loses precision. On the sphere the error against the ellipsoid is up to about 0.5 %.
 *
 * @param a - first point; latitude −90…90, longitude −180…180 (decimal degrees)
 * @param b - second point, same ranges
 * @param radiusKm - radius of the sphere in km, > 0 (default {@link MEAN_EARTH_RADIUS_KM})
 * @returns the distance in km, 0 ≤ d ≤ πR; 0 for the same point
 * @throws RangeError when a coordinate is not finite or out of range, or the radius is not > 0
 * @example
 * // Nashville BNA (36.12, -86.67) to Los Angeles LAX (33.94, -118.40), Rosetta Code "Haversine formula"
 * haversineDistance({ latitude: 36.12, longitude: -86.67 }, { latitude: 33.94, longitude: -118.4 });
 * // => 2886.4444428379834
 * @see Sinnott R.W. (1984) "Virtues of the haversine", Sky and Telescope 68(2):159.
 * @see Rosetta Code, task "Haversine formula" (worked example BNA–LAX).
 */
export function haversineDistance(a: GeoPoint, b: GeoPoint, radiusKm: number = MEAN_EARTH_RADIUS_KM): number {
  for (const point of [a, b]) {
    if (!Number.isFinite(point.latitude) || Math.abs(point.latitude) > 90) {
      throw new RangeError(`latitude must be between -90 and 90 (found ${point.latitude})`);
    }
    if (!Number.isFinite(point.longitude) || Math.abs(point.longitude) > 180) {
      throw new RangeError(`longitude must be between -180 and 180 (found ${point.longitude})`);
    }
  }
  if (!Number.isFinite(radiusKm) || radiusKm <= 0) throw new RangeError(`radius must be > 0 km (found ${radiusKm})`);
  const deltaLatitude = radians(b.latitude - a.latitude);
  const deltaLongitude = radians(b.longitude - a.longitude);
  const haversine =
    Math.sin(deltaLatitude / 2) ** 2 +
    Math.cos(radians(a.latitude)) * Math.cos(radians(b.latitude)) * Math.sin(deltaLongitude / 2) ** 2;
  // Rounding can push the haversine a hair above 1 for antipodal points; asin needs ≤ 1.
  return 2 * radiusKm * Math.asin(Math.sqrt(Math.min(1, haversine)));
}
