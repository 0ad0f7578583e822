/**
 * Planes and lines written as text, in forms the parsers read back exactly (see ../notation.ts).
 */
import { normalizeAzimuth } from '../math';
import type { Line, PlaneMeasurement } from '../types';
import { azimuthToBearing, sectorOf } from './compass';
import type { LineNotation } from './line';
import type { PlaneNotation } from './plane';

/** Plane notations that can be written (all but `auto`). */
export type PlaneFormat = Exclude<PlaneNotation, 'auto'>;
/** Line notations that can be written (all but `auto`). */
export type LineFormat = Exclude<LineNotation, 'auto'>;

export interface FormatOptions {
  /** Decimal places for every angle, 0 to 6; default 0 (whole degrees, as read in the field). */
  readonly decimals?: number;
}

function decimalsOf(options: FormatOptions | undefined): number {
  const d = options?.decimals ?? 0;
  if (!Number.isInteger(d) || d < 0 || d > 6) throw new RangeError(`decimals must be a whole number from 0 to 6, got ${d}`);
  return d;
}

/** x rounded to d decimals the way toFixed writes it, so every later step works on what is printed. */
const roundTo = (x: number, d: number): number => Number(x.toFixed(d));

/** An azimuth rounded to d decimals and wrapped, so 359.6 at 0 decimals becomes 0, never 360. */
function roundAzimuth(a: number, d: number): number {
  const r = roundTo(normalizeAzimuth(a), d);
  return r >= 360 ? 0 : r;
}

/** Writes x with d decimals and the integer part padded to `width` digits: 30.5 -> "030.5". */
function padded(x: number, d: number, width: number): string {
  const s = (x === 0 ? 0 : x).toFixed(d);
  const dot = s.indexOf('.');
  return s.padStart(dot < 0 ? width : width + s.length - dot, '0');
}

const azimuthText = (a: number, d: number): string => padded(roundAzimuth(a, d), d, 3);
const inclinationText = (x: number, d: number): string => padded(roundTo(x, d), d, 2);

function bearingText(azimuth: number, d: number): string {
  const b = azimuthToBearing(azimuth);
  return `${b.from}${padded(roundTo(b.angle, d), d, 2)}${b.toward}`;
}

function checkPlane(plane: PlaneMeasurement): void {
  if (!(plane.dipDirection >= 0 && plane.dipDirection < 360) || !(plane.dip >= 0 && plane.dip <= 90)) {
    throw new RangeError(`cannot write plane ${plane.dipDirection}/${plane.dip}: expected a dip direction in [0, 360) and a dip in [0, 90]`);
  }
}

/**
 * Writes a plane. Azimuths have three integer digits (`030`), dips and bearing angles two
 * (`05`, `N05E`). `strike-quadrant` writes the right-hand-rule strike and the quarter holding
 * the dip direction (one letter when the dip direction is due N, E, S or W); `quadrant` writes
 * the strike as a bearing from north (`N30E`, `N60W`; east-west as `N90E`). A horizontal plane
 * is written with the dip direction it carries and dip 00; a vertical one with the side it
 * carries. An overturned plane gets a trailing ` OT`. Everything written parses back with the
 * same notation to the rounded values.
 * @example formatPlane({dipDirection: 120, dip: 45}, 'strike-quadrant') // '030/45SE'
 * @example formatPlane({dipDirection: 120, dip: 45}, 'quadrant') // 'N30E 45SE'
 * @example formatPlane({dipDirection: 120, dip: 45, overturned: true}, 'dipdir') // '120/45 OT'
 */
export function formatPlane(plane: PlaneMeasurement, notation: PlaneFormat, options?: FormatOptions): string {
  checkPlane(plane);
  const d = decimalsOf(options);
  // Round the dip direction first and derive strike and letters from the rounded value, so the
  // letters always agree with the strike as printed.
  const dd = roundAzimuth(plane.dipDirection, d);
  const dip = inclinationText(plane.dip, d);
  const strike = normalizeAzimuth(dd - 90);
  let body: string;
  switch (notation) {
    case 'dipdir':
      body = `${azimuthText(dd, d)}/${dip}`;
      break;
    case 'rhr':
      body = `${azimuthText(strike, d)}/${dip}`;
      break;
    case 'strike-quadrant':
      body = `${azimuthText(strike, d)}/${dip}${sectorOf(dd)}`;
      break;
    case 'quadrant': {
      // A strike is a line without sense: write its north end (N..E or N..W), east-west as N90E.
      const northEnd = strike > 90 && strike < 270 ? strike - 180 : strike === 270 ? 90 : strike;
      body = `${bearingText(northEnd, d)} ${dip}${sectorOf(dd)}`;
      break;
    }
    default:
      throw new RangeError(`unknown plane notation ${String(notation)}: expected dipdir, rhr, strike-quadrant or quadrant`);
  }
  return plane.overturned === true ? `${body} OT` : body;
}

/**
 * Writes a line: `azimuth` as `125/20`, `quadrant` as `S55E 20` (the bearing is the direction
 * of plunge; east-west as N90E/N90W, due south as S00E).
 * @example formatLine({trend: 125, plunge: 20}, 'azimuth') // '125/20'
 * @example formatLine({trend: 125, plunge: 20}, 'quadrant') // 'S55E 20'
 */
export function formatLine(line: Line, notation: LineFormat, options?: FormatOptions): string {
  if (!(line.trend >= 0 && line.trend < 360) || !(line.plunge >= 0 && line.plunge <= 90)) {
    throw new RangeError(`cannot write line ${line.trend}/${line.plunge}: expected a trend in [0, 360) and a plunge in [0, 90]`);
  }
  const d = decimalsOf(options);
  const trend = roundAzimuth(line.trend, d);
  const plunge = inclinationText(line.plunge, d);
  switch (notation) {
    case 'azimuth':
      return `${azimuthText(trend, d)}/${plunge}`;
    case 'quadrant':
      return `${bearingText(trend, d)} ${plunge}`;
    default:
      throw new RangeError(`unknown line notation ${String(notation)}: expected azimuth or quadrant`);
  }
}
