import geomagnetism from 'geomagnetism';
import { normalizeAzimuth } from '../core/math';
import type { AzimuthCorrection } from '../core/station';
import { gridConvergence, type Crs } from './crs';

/**
 * Corrections that refer a measured azimuth to true north:
 * - magnetic declination from the World Magnetic Model (NOAA/BGS), through the `geomagnetism`
 *   package (models WMM2015, WMM2020, WMM2025), true = magnetic + declination, east positive;
 * - a declination typed by the user, same sign convention;
 * - grid convergence, for azimuths read against grid north: true = grid + convergence
 *   (see `gridConvergence` in crs.ts for the sign).
 * Each comes back as an {@link AzimuthCorrection} to store with the station.
 */

/** First and last instants the bundled models cover (the package's model dates, UTC). */
export const WMM_SPAN = { start: new Date('2014-12-15T07:00:00.000Z'), end: new Date('2029-11-13T03:00:00.000Z') } as const;

/**
 * The only error these functions throw: a date outside the models, a position that is not one,
 * or a typed declination out of range.
 * @example try { wmmDeclination(45, 15, 0, new Date('2040-01-01')); } catch (e) { (e as DeclinationError).message }
 */
export class DeclinationError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'DeclinationError';
  }
}

/**
 * Magnetic declination in degrees (east positive) from the World Magnetic Model at latitude,
 * longitude (degrees), height above the ellipsoid in km and a date. Dates outside
 * {@link WMM_SPAN} throw {@link DeclinationError}; there is no silent fallback to the nearest model.
 * Height above sea level may stand in for height above the ellipsoid: the difference (under
 * about 100 m) changes the declination far less than 0.01°.
 * @example wmmDeclination(80, 0, 0, new Date(Date.UTC(2025, 0, 1))) // { degrees: 1.28..., model: 'WMM2025' }
 */
export function wmmDeclination(lat: number, lon: number, heightKm: number, date: Date): { degrees: number; model: string } {
  if (!(Math.abs(lat) <= 90) || !Number.isFinite(lon)) throw new DeclinationError(`(${lat}, ${lon}) is not a latitude and longitude`);
  if (!Number.isFinite(heightKm)) throw new DeclinationError(`${heightKm} is not a height in km`);
  const t = date.getTime();
  if (!Number.isFinite(t)) throw new DeclinationError('the date is not a valid date');
  if (t < WMM_SPAN.start.getTime() || t > WMM_SPAN.end.getTime()) {
    throw new DeclinationError(
      `${isoDay(date)} is outside the World Magnetic Models available here (${isoDay(WMM_SPAN.start)} to ${isoDay(WMM_SPAN.end)}); give the declination yourself`,
    );
  }
  let model: ReturnType<typeof geomagnetism.model>;
  try {
    model = geomagnetism.model(date);
  } catch (e) {
    throw new DeclinationError(`no World Magnetic Model for ${isoDay(date)}: ${(e as Error).message}`);
  }
  const degrees = model.point([lat, lon, heightKm]).decl;
  if (!Number.isFinite(degrees)) throw new DeclinationError(`the World Magnetic Model gives no declination at (${lat}, ${lon})`);
  return { degrees, model: model.name.replace('-', '') };
}

/**
 * The declination correction for a station, as stored: type `magnetic-declination`,
 * degrees to add, and the model and date in `source`.
 * @example magneticCorrection(45, 15, 0.2, new Date('2025-06-01')).source // 'WMM2025 at 2025-06-01'
 */
export function magneticCorrection(lat: number, lon: number, heightKm: number, date: Date): AzimuthCorrection {
  const { degrees, model } = wmmDeclination(lat, lon, heightKm, date);
  return { type: 'magnetic-declination', degrees, source: `${model} at ${isoDay(date)}` };
}

/**
 * A declination typed by the user (east positive, -180 to 180), as stored.
 * @example userDeclination(-2.5) // { type: 'user-declination', degrees: -2.5, source: 'declination given by the user' }
 */
export function userDeclination(degrees: number): AzimuthCorrection {
  if (!Number.isFinite(degrees) || Math.abs(degrees) > 180) throw new DeclinationError(`${degrees} is not a declination: expected degrees from -180 to 180, east positive`);
  return { type: 'user-declination', degrees, source: 'declination given by the user' };
}

/**
 * The grid-to-true correction at a point, as stored: the grid convergence of `crs` there.
 * @example convergenceCorrection(16, 45, builtInCrs(32633)!).degrees // ≈ 0.707
 */
export function convergenceCorrection(lon: number, lat: number, crs: Crs): AzimuthCorrection {
  return { type: 'grid-convergence', degrees: gridConvergence(lon, lat, crs), source: `grid convergence of ${crs.code}` };
}

/**
 * An azimuth with corrections added, in [0, 360).
 * @example correctAzimuth(358, [{ type: 'user-declination', degrees: 3, source: '' }]) // 1
 */
export function correctAzimuth(azimuth: number, corrections: readonly AzimuthCorrection[]): number {
  return normalizeAzimuth(corrections.reduce((a, c) => a + c.degrees, azimuth));
}

/**
 * Reads a date written as ISO 8601 (YYYY-MM-DD, optionally with a time); returns undefined for
 * anything else, since 03/04/2025 means different days in different countries.
 * A date without a time is taken as midnight UTC.
 * @example parseIsoDate('2025-06-01')?.toISOString() // '2025-06-01T00:00:00.000Z'
 */
export function parseIsoDate(text: string): Date | undefined {
  const t = text.trim();
  const m = /^(\d{4})-(\d{2})-(\d{2})(?:[T ](\d{2}):(\d{2})(?::(\d{2})(?:\.\d+)?)?(Z|[+-]\d{2}:?\d{2})?)?$/.exec(t);
  if (!m) return undefined;
  const [y, mo, d] = [Number(m[1]), Number(m[2]), Number(m[3])];
  if (mo < 1 || mo > 12 || d < 1 || d > 31) return undefined;
  const date = m[4] === undefined ? new Date(Date.UTC(y, mo - 1, d)) : new Date(m[7] === undefined ? `${t.replace(' ', 'T')}Z` : t.replace(' ', 'T'));
  // Reject 2025-02-30 and the like, which Date would roll over into March.
  if (Number.isNaN(date.getTime()) || (m[4] === undefined && date.getUTCDate() !== d)) return undefined;
  return date;
}

function isoDay(date: Date): string {
  return Number.isFinite(date.getTime()) ? date.toISOString().slice(0, 10) : String(date);
}
