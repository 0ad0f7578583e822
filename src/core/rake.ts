/**
 * Rake (pitch): the angle, measured within a plane, between a line in that plane and the
 * strike. Rake 0 lies along the strike end it is measured from, 90 is the dip line, 180 the
 * other strike end. Text forms (`60`, `60NE`, `60 from NE`) are read by parseRake in notation.ts.
 */
import { asinClamped, normalizeAzimuth, toDegrees, toRadians } from './math';
import { NotationError, messageAzimuth, pickOpposite, type RakeFrom } from './notation';
import type { Line, Plane, Vec3 } from './types';
import { dot, lineToVector, planeNormal, vectorToLine } from './vectors';

/**
 * Azimuth of the strike end a rake is measured from: the right-hand-rule strike (dip
 * direction - 90, common practice) or the end lying in the named compass sector.
 */
function strikeEnd(plane: Plane, from: RakeFrom): number {
  const rhr = normalizeAzimuth(plane.dipDirection - 90);
  if (from === 'rhr-strike') return rhr;
  const end = pickOpposite(rhr, from);
  if (end === undefined) {
    const other = normalizeAzimuth(rhr + 180);
    throw new NotationError(
      from,
      `${from} lies across strike ${messageAzimuth(rhr)}/${messageAzimuth(other)} of plane ${messageAzimuth(plane.dipDirection)}/${plane.dip}, so it names neither end`,
      'compass letters naming one end of the strike line (or the right-hand-rule strike)',
      'strike end',
    );
  }
  return end;
}

/** Unit vectors of a plane: along the chosen strike end (horizontal) and down the dip. */
function planeAxes(plane: Plane, from: RakeFrom): { along: Vec3; down: Vec3 } {
  const s = toRadians(strikeEnd(plane, from));
  const dd = toRadians(plane.dipDirection);
  const dip = toRadians(plane.dip);
  return {
    along: { x: Math.cos(s), y: Math.sin(s), z: 0 },
    down: { x: Math.cos(dip) * Math.cos(dd), y: Math.cos(dip) * Math.sin(dd), z: Math.sin(dip) },
  };
}

function checkPlane(plane: Plane): void {
  if (!(plane.dipDirection >= 0 && plane.dipDirection < 360) || !(plane.dip >= 0 && plane.dip <= 90)) {
    throw new RangeError(`plane ${plane.dipDirection}/${plane.dip}: expected a dip direction in [0, 360) and a dip in [0, 90]`);
  }
}

/**
 * The line at a rake in a plane. The rake (0 to 180) is measured within the plane from the
 * right-hand-rule strike (default) or from the strike end named by compass letters, toward
 * the dip direction. The line is cos(rake)·(strike end) + sin(rake)·(down-dip unit vector),
 * which gives plunge = asin(sin dip · sin rake) (common practice). Horizontal results take
 * their trend in [0, 180) as vectorToLine does.
 * @example lineFromRake({dipDirection: 120, dip: 45}, 60) // {trend: 80.7685, plunge: 37.7612}
 * @example lineFromRake({dipDirection: 120, dip: 45}, 60, 'SW') // {trend: 159.2315, plunge: 37.7612}
 */
export function lineFromRake(plane: Plane, rakeDegrees: number, from: RakeFrom = 'rhr-strike'): Line {
  checkPlane(plane);
  if (!(rakeDegrees >= 0 && rakeDegrees <= 180)) throw new RangeError(`rake ${rakeDegrees}: expected 0 to 180`);
  const { along, down } = planeAxes(plane, from);
  const r = toRadians(rakeDegrees);
  const c = Math.cos(r);
  const s = Math.sin(r);
  return vectorToLine({ x: c * along.x + s * down.x, y: c * along.y + s * down.y, z: c * along.z + s * down.z });
}

export interface RakeOptions {
  /** Strike end the rake is measured from; default the right-hand-rule strike. */
  readonly from?: RakeFrom;
  /**
   * Largest angle in degrees allowed between the line and the plane; default 10, which
   * covers two readings each off by up to 5° (common practice reading precision).
   */
  readonly maxOffPlane?: number;
}

/**
 * Rake of a line in a plane, in [0, 180), measured from the right-hand-rule strike (or
 * `options.from`) toward the dip direction. A field line is seldom exactly in its plane: the
 * rake is that of its projection onto the plane, and a line more than `maxOffPlane` degrees
 * out of the plane throws a RangeError. A line along the strike has rake 0 (0 and 180 are one line).
 * @example rakeOf({dipDirection: 120, dip: 45}, {trend: 80.7685, plunge: 37.7612}) // 60.000
 */
export function rakeOf(plane: Plane, line: Line, options: RakeOptions = {}): number {
  checkPlane(plane);
  if (!(line.trend >= 0 && line.trend < 360) || !(line.plunge >= 0 && line.plunge <= 90)) {
    throw new RangeError(`line ${line.trend}/${line.plunge}: expected a trend in [0, 360) and a plunge in [0, 90]`);
  }
  const maxOff = options.maxOffPlane ?? 10;
  const u = lineToVector(line);
  const off = toDegrees(asinClamped(Math.abs(dot(u, planeNormal(plane)))));
  if (off > maxOff) {
    throw new RangeError(
      `line ${line.trend}/${line.plunge} is ${off.toFixed(1)}° out of plane ${plane.dipDirection}/${plane.dip}; expected a line in the plane (within ${maxOff}°)`,
    );
  }
  const { along, down } = planeAxes(plane, options.from ?? 'rhr-strike');
  let a = dot(u, along);
  let b = dot(u, down);
  // A line has no sense: take the half that points down the dip (b >= 0).
  if (b < 0) {
    a = -a;
    b = -b;
  }
  const rake = toDegrees(Math.atan2(b, a));
  // Same line at 0 and 180: report 0.
  return rake >= 180 - 1e-9 ? 0 : rake;
}
