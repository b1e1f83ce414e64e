// Great-circle distance on a sphere. Good to about half a percent against the
// WGS-84 ellipsoid, which is far finer than a virtual route needs.

/**
 * IUGG mean Earth radius R1 = (2a + b) / 3 of the GRS 80 ellipsoid (which
 * WGS-84 matches to the millimetre here): Moritz, "Geodetic Reference System 1980".
 */
export const EARTH_MEAN_RADIUS_M = 6_371_008.8;

export interface LatLon {
  lat: number;
  lon: number;
}

const RAD = Math.PI / 180;

export function haversineM(a: LatLon, b: LatLon): number {
  const dLat = (b.lat - a.lat) * RAD;
  const dLon = (b.lon - a.lon) * RAD;
  const h = Math.sin(dLat / 2) ** 2 + Math.cos(a.lat * RAD) * Math.cos(b.lat * RAD) * Math.sin(dLon / 2) ** 2;
  return 2 * EARTH_MEAN_RADIUS_M * Math.asin(Math.min(1, Math.sqrt(h)));
}
