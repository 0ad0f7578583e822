/**
 * Coordinates of the district: local metres <-> UTM zone 33N <-> WGS 84 longitude/latitude,
 * through proj4, and the grid convergence that turns grid azimuths into true azimuths.
 */
import proj4 from 'proj4';
import { CRS, FRAME } from './district';

const utm = proj4(CRS.proj4, 'WGS84');

/**
 * Local metres to UTM easting, northing.
 * @example localToUtm(0, 0) // [497000, 2721000]
 */
export const localToUtm = (x: number, y: number): [number, number] => [FRAME.easting0 + x, FRAME.northing0 + y];

/**
 * UTM easting, northing to local metres.
 * @example utmToLocal(500000, 2723000) // [3000, 2000]
 */
export const utmToLocal = (e: number, n: number): [number, number] => [e - FRAME.easting0, n - FRAME.northing0];

/**
 * UTM zone 33N to [longitude, latitude] in degrees (proj4, WGS 84).
 * @example utmToLonLat(500000, 2723000) // [15, 24.62...]
 */
export const utmToLonLat = (e: number, n: number): [number, number] => utm.forward([e, n]) as [number, number];

/**
 * [longitude, latitude] to UTM zone 33N easting, northing.
 * @example lonLatToUtm(15, 24.62) // [500000, 2722872...]
 */
export const lonLatToUtm = (lon: number, lat: number): [number, number] => utm.inverse([lon, lat]) as [number, number];

/**
 * Rounds to 6 decimals (about 0.1 m of latitude), enough for a 40 m DEM.
 * @example round6(14.97036494) // 14.970365
 */
export const round6 = (v: number): number => Math.round(v * 1e6) / 1e6;

/**
 * Grid azimuth (degrees, clockwise from grid north) of true north at a UTM point: true azimuth =
 * grid azimuth - this value. Found numerically by stepping 0.001 degree north in latitude; near
 * the central meridian it is a few hundredths of a degree at most.
 * @example gridAzimuthOfTrueNorth(500000, 2723000) // about 0
 */
export function gridAzimuthOfTrueNorth(e: number, n: number): number {
  const [lon, lat] = utmToLonLat(e, n);
  const [e2, n2] = lonLatToUtm(lon, lat + 0.001);
  return (Math.atan2(e2 - e, n2 - n) * 180) / Math.PI;
}
