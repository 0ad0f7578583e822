import type { Line } from '../core/types';
import { normalizeAzimuth } from '../core/math';
import { builtInCrs, CrsError, fromLonLat, gridConvergence, toLonLat, utmZoneFor, type Crs } from './crs';

/**
 * A local metric frame for profiles: the UTM zone (WGS 84) of the data's centre, with an origin
 * near the data so profile numbers stay small. Positions become east-north-up metres relative
 * to the origin (easting - E0, northing - N0, height), the input of core/downPlunge.ts.
 *
 * Azimuths: attitudes are referred to true north, the frame's axes to grid north. They differ
 * by the grid convergence γ (true = grid + γ, crs.ts); over a district γ hardly changes, so
 * one value at the origin is used: grid trend = true trend - γ. Over a UTM zone |γ| stays under
 * about 3° at mid latitudes; the value used is reported so it can be checked.
 */

/** A local frame. */
export interface LocalFrame {
  readonly crs: Crs;
  /** Grid coordinates of the origin in metres (whole metres); heights keep their own datum (origin height 0). */
  readonly originEasting: number;
  readonly originNorthing: number;
  /** Longitude and latitude of the origin. */
  readonly originLon: number;
  readonly originLat: number;
  /** Grid convergence at the origin, degrees (true azimuth = grid azimuth + convergence). */
  readonly convergence: number;
}

/**
 * Chooses the frame for points given as a flat [lon0, lat0, lon1, lat1, ...] array: the UTM zone
 * of their mean position (or `crs` when given), origin at their mean position rounded to the metre.
 * Non-finite pairs are skipped; throws CrsError when none is left.
 * @example chooseLocalFrame(new Float64Array([15.0, 24.62, 15.01, 24.63])).crs.code // 'EPSG:32633'
 */
export function chooseLocalFrame(lonLat: ArrayLike<number>, crs?: Crs): LocalFrame {
  let sumLon = 0;
  let sumLat = 0;
  let count = 0;
  for (let i = 0; i + 1 < lonLat.length; i += 2) {
    const lon = lonLat[i];
    const lat = lonLat[i + 1];
    if (!Number.isFinite(lon) || !Number.isFinite(lat)) continue;
    sumLon += lon;
    sumLat += lat;
    count++;
  }
  if (count === 0) throw new CrsError('no point with a longitude and latitude to place a local frame at');
  const lon = sumLon / count;
  const lat = sumLat / count;
  const frameCrs = crs ?? builtInCrs(utmZoneFor(lon, lat).epsg);
  if (!frameCrs || frameCrs.geographic) throw new CrsError(`the local frame needs a projected CRS in metres; ${frameCrs?.code ?? 'none'} is not one`);
  const centre = fromLonLat(lon, lat, frameCrs);
  const originEasting = Math.round(centre.x);
  const originNorthing = Math.round(centre.y);
  const origin = toLonLat(originEasting, originNorthing, frameCrs);
  return {
    crs: frameCrs,
    originEasting,
    originNorthing,
    originLon: origin.lon,
    originLat: origin.lat,
    convergence: gridConvergence(origin.lon, origin.lat, frameCrs),
  };
}

/**
 * East-north-up metres relative to the origin, for flat lon/lat pairs and their heights (NaN
 * heights stay NaN). `out` receives n triples.
 * @example lonLatToLocal(frame, new Float64Array([15, 24.62]), new Float64Array([800])) // [e, n, 800]
 */
export function lonLatToLocal(frame: LocalFrame, lonLat: ArrayLike<number>, heights: ArrayLike<number>, out?: Float64Array): Float64Array {
  const n = Math.floor(lonLat.length / 2);
  if (heights.length !== n) throw new RangeError(`lonLatToLocal: ${n} positions but ${heights.length} heights`);
  const target = out ?? new Float64Array(3 * n);
  for (let i = 0; i < n; i++) {
    const lon = lonLat[2 * i];
    const lat = lonLat[2 * i + 1];
    if (!Number.isFinite(lon) || !Number.isFinite(lat)) {
      target[3 * i] = target[3 * i + 1] = Number.NaN;
    } else {
      const p = fromLonLat(lon, lat, frame.crs);
      target[3 * i] = p.x - frame.originEasting;
      target[3 * i + 1] = p.y - frame.originNorthing;
    }
    target[3 * i + 2] = heights[i];
  }
  return target;
}

/**
 * One point's place in the frame: metres east and north of the frame's origin.
 * @example const { x, y } = pointInFrame(frame, station.lon, station.lat); // metres east and north of the origin
 */
export function pointInFrame(frame: LocalFrame, lon: number, lat: number): { x: number; y: number } {
  const p = lonLatToLocal(frame, [lon, lat], [0]);
  return { x: p[0], y: p[1] };
}

/**
 * An axis referred to true north, turned to the frame's grid north: trend - convergence.
 * @example gridAxis(frame, { trend: 74.994, plunge: 12 }) // { trend: 75.000..., plunge: 12 } at Korvane
 */
export function gridAxis(frame: LocalFrame, axis: Line): Line {
  return { trend: normalizeAzimuth(axis.trend - frame.convergence), plunge: axis.plunge };
}
