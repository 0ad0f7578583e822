/**
 * Compass letters (N, NE, E, ... NW) and quadrant bearings (N30E, S55W), shared by dip quadrants,
 * line bearings and the named end a pitch is measured from.
 *
 * Meaning of the letters, chosen so that one rule serves every use and never guesses:
 * - two letters (NE, SE, SW, NW) name a closed quarter of the compass: within 45° of 045, 135,
 *   225 or 315, boundaries included;
 * - one letter (N, E, S, W) names an open half: less than 90° from 000, 090, 180 or 270.
 * A strike line has two opposite ends and a plane two possible dip directions; letters pick
 * the one of such a pair that lies in their sector, and are rejected when neither does (the
 * letters then lie along the strike, e.g. NE for strike 030, rather than across it).
 */
import { azimuthDifference, normalizeAzimuth } from '../math';

/**
 * The eight compass letters that quadrant notations may use.
 * @example
 * COMPASS_POINTS.includes('NE') // true
 */
export const COMPASS_POINTS = ['N', 'NE', 'E', 'SE', 'S', 'SW', 'W', 'NW'] as const;
/** One of the eight compass letters, upper case. */
export type CompassPoint = (typeof COMPASS_POINTS)[number];

/** Slack for sector boundaries, so that 090 read back from "000/45" plus 90 stays inside NE. */
const SECTOR_SLACK = 1e-9;

/**
 * Whether a word (upper case) is one of the eight compass letters.
 * @example isCompassPoint('SE') // true
 */
export function isCompassPoint(word: string): word is CompassPoint {
  return (COMPASS_POINTS as readonly string[]).includes(word);
}

/**
 * Azimuth of the centre of a compass sector.
 * @example compassCentre('SE') // 135
 */
export function compassCentre(point: CompassPoint): number {
  return COMPASS_POINTS.indexOf(point) * 45;
}

/**
 * Whether an azimuth lies in the sector named by the letters (quarter closed, half open; see above).
 * @example inSector(120, 'SE') // true
 * @example inSector(90, 'NE') // true: quarters include their boundaries
 */
export function inSector(azimuth: number, point: CompassPoint): boolean {
  const off = azimuthDifference(azimuth, compassCentre(point));
  return point.length === 2 ? off <= 45 + SECTOR_SLACK : off < 90 - SECTOR_SLACK;
}

/**
 * Of the two opposite azimuths `azimuth` and `azimuth + 180`, the one in the sector named by
 * the letters, or undefined when neither lies in it. Both can never lie in one sector.
 * @example pickOpposite(120, 'NW') // 300
 * @example pickOpposite(120, 'NE') // undefined: NE lies along strike 030
 */
export function pickOpposite(azimuth: number, point: CompassPoint): number | undefined {
  const a = normalizeAzimuth(azimuth);
  if (inSector(a, point)) return a;
  const b = normalizeAzimuth(a + 180);
  return inSector(b, point) ? b : undefined;
}

/**
 * The compass letters for an azimuth: one letter when it is exactly cardinal, else its quarter.
 * @example sectorOf(120) // 'SE'
 * @example sectorOf(90) // 'E'
 */
export function sectorOf(azimuth: number): CompassPoint {
  const a = normalizeAzimuth(azimuth);
  if (a % 90 === 0) return COMPASS_POINTS[(a / 90) * 2];
  return COMPASS_POINTS[Math.floor(a / 90) * 2 + 1];
}

/**
 * Azimuth of a quadrant bearing (angle 0 to 90 from N or S toward E or W); common practice.
 * @example bearingToAzimuth('S', 55, 'E') // 125
 */
export function bearingToAzimuth(from: 'N' | 'S', angle: number, toward: 'E' | 'W'): number {
  if (from === 'N') return toward === 'E' ? angle : normalizeAzimuth(360 - angle);
  return toward === 'E' ? 180 - angle : 180 + angle;
}

/** A quadrant bearing split into its parts. */
export interface QuadrantBearing {
  readonly from: 'N' | 'S';
  readonly angle: number;
  readonly toward: 'E' | 'W';
}

/**
 * Quadrant bearing of an azimuth in [0, 360). East-west directions are written from N
 * (N90E, N90W) and due south as S0E, so each azimuth has one spelling.
 * @example azimuthToBearing(125) // {from: 'S', angle: 55, toward: 'E'}
 */
export function azimuthToBearing(azimuth: number): QuadrantBearing {
  const a = normalizeAzimuth(azimuth);
  if (a <= 90) return { from: 'N', angle: a, toward: 'E' };
  if (a <= 180) return { from: 'S', angle: 180 - a, toward: 'E' };
  if (a < 270) return { from: 'S', angle: a - 180, toward: 'W' };
  return { from: 'N', angle: 360 - a, toward: 'W' };
}
