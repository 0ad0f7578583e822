import { DEG, clamp } from './math';

/**
 * Latitude limit of Web Mercator (EPSG:3857), degrees.
 * @example
 * const lat = clamp(latitude, -MERCATOR_MAX_LATITUDE, MERCATOR_MAX_LATITUDE);
 */
export const MERCATOR_MAX_LATITUDE = 85.0511287798066;

/**
 * Longitude/latitude to Web Mercator in the unit square (x east 0..1, y south 0..1), the
 * frame MapLibre uses internally. Straight lines on a flat map stay straight here, so a
 * polygon drawn on screen is a polygon in these coordinates at any bearing or pitch
 * (a perspective view of a plane maps lines to lines).
 * @example lonLatToMercator(0, 0) // [0.5, 0.5]
 */
export function lonLatToMercator(lon: number, lat: number): [number, number] {
  const phi = clamp(lat, -MERCATOR_MAX_LATITUDE, MERCATOR_MAX_LATITUDE) * DEG;
  const x = (lon + 180) / 360;
  const y = 0.5 - Math.log(Math.tan(Math.PI / 4 + phi / 2)) / (2 * Math.PI);
  return [x, y];
}

/**
 * Web Mercator unit-square coordinates back to longitude/latitude.
 * @example mercatorToLonLat(0.5, 0.5) // [0, 0]
 */
export function mercatorToLonLat(x: number, y: number): [number, number] {
  const lon = x * 360 - 180;
  const lat = (2 * Math.atan(Math.exp((0.5 - y) * 2 * Math.PI)) - Math.PI / 2) / DEG;
  return [lon, lat];
}
