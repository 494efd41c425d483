// Great-circle distance on a sphere of the Earth's mean radius (haversine formula).

/** Mean Earth radius R1 = 6 371 008.8 m (IUGG; Moritz 2000, Geodetic Reference System 1980). */
export const EARTH_MEAN_RADIUS_M = 6_371_008.8;

export function haversineMetres(a: { lat: number; lon: number }, b: { lat: number; lon: number }): number {
  const rad = Math.PI / 180;
  const dLat = (b.lat - a.lat) * rad;
  const dLon = (b.lon - a.lon) * rad;
  const h = Math.sin(dLat / 2) ** 2 + Math.cos(a.lat * rad) * Math.cos(b.lat * rad) * Math.sin(dLon / 2) ** 2;
  return 2 * EARTH_MEAN_RADIUS_M * Math.asin(Math.min(1, Math.sqrt(h)));
}
