import { acosClamped, normalizeAzimuth, toDegrees, toRadians, EPSILON } from './math';
import type { Line, Plane, Vec3 } from './types';

/**
 * Vector from components.
 * @example
 * const north = vec3(1, 0, 0);
 */
export const vec3 = (x: number, y: number, z: number): Vec3 => ({ x, y, z });

/**
 * Dot product of two vectors.
 * @example
 * dot(vec3(1, 0, 0), vec3(0, 1, 0)) // 0
 */
export const dot = (a: Vec3, b: Vec3): number => a.x * b.x + a.y * b.y + a.z * b.z;

/**
 * Cross product a x b (right-handed; with north, east, down axes, north x east = down).
 * @example
 * cross(vec3(1, 0, 0), vec3(0, 1, 0)) // {x: 0, y: 0, z: 1}
 */
export const cross = (a: Vec3, b: Vec3): Vec3 => ({
  x: a.y * b.z - a.z * b.y,
  y: a.z * b.x - a.x * b.z,
  z: a.x * b.y - a.y * b.x,
});

/**
 * Euclidean length of a vector.
 * @example
 * norm(vec3(3, 4, 0)) // 5
 */
export const norm = (a: Vec3): number => Math.hypot(a.x, a.y, a.z);

/**
 * A vector times a number.
 * @example
 * scale(vec3(1, 2, 3), 2) // {x: 2, y: 4, z: 6}
 */
export const scale = (a: Vec3, k: number): Vec3 => ({ x: a.x * k, y: a.y * k, z: a.z * k });

/**
 * Sum of two vectors.
 * @example
 * add(vec3(1, 0, 0), vec3(0, 1, 0)) // {x: 1, y: 1, z: 0}
 */
export const add = (a: Vec3, b: Vec3): Vec3 => ({ x: a.x + b.x, y: a.y + b.y, z: a.z + b.z });

/**
 * The opposite vector (the same axis, other sense).
 * @example
 * negate(vec3(1, -2, 0)) // {x: -1, y: 2, z: 0}
 */
export const negate = (a: Vec3): Vec3 => ({ x: -a.x, y: -a.y, z: -a.z });

/**
 * Unit vector along a. Throws on a zero vector: callers decide what "no direction" means.
 * @example normalize(vec3(0, 3, 4)) // {x: 0, y: 0.6, z: 0.8}
 */
export function normalize(a: Vec3): Vec3 {
  const n = norm(a);
  if (!(n > EPSILON)) throw new RangeError('cannot normalise a zero-length vector');
  return scale(a, 1 / n);
}

/**
 * Flips a vector into the lower hemisphere (z >= 0); horizontal vectors keep trend in [0, 180).
 * @example
 * toLowerHemisphere(vec3(0, 0, -1)) // {x: 0, y: 0, z: 1} (vertical line, plunge 90)
 */
export function toLowerHemisphere(a: Vec3): Vec3 {
  if (a.z > EPSILON) return a;
  if (a.z < -EPSILON) return negate(a);
  // Horizontal: choose the representative with trend in [0, 180) so the answer is unique.
  const trend = normalizeAzimuth(toDegrees(Math.atan2(a.y, a.x)));
  return trend >= 180 - 1e-9 ? { x: -a.x, y: -a.y, z: 0 } : { x: a.x, y: a.y, z: 0 };
}

/**
 * Direction cosines of a line (north-east-down).
 * @example lineToVector({trend: 90, plunge: 0}) // {x: 0, y: 1, z: 0}
 */
export function lineToVector(line: Line): Vec3 {
  const t = toRadians(line.trend);
  const p = toRadians(line.plunge);
  return { x: Math.cos(p) * Math.cos(t), y: Math.cos(p) * Math.sin(t), z: Math.sin(p) };
}

/**
 * Trend and plunge of a vector; upward vectors are flipped to the lower hemisphere first,
 * since a line has no sense. Throws on a zero vector.
 * @example vectorToLine({x: 0, y: 0, z: 1}) // {trend: 0, plunge: 90}
 */
export function vectorToLine(v: Vec3): Line {
  const u = toLowerHemisphere(normalize(v));
  // atan2 rather than asin(z): asin loses precision near the vertical (and so does acos near horizontal).
  const horizontal = Math.hypot(u.x, u.y);
  const plunge = toDegrees(Math.atan2(u.z, horizontal));
  // For a vertical line the trend is undefined; report 0 rather than atan2 noise.
  const trend = horizontal < 1e-12 ? 0 : normalizeAzimuth(toDegrees(Math.atan2(u.y, u.x)));
  return { trend, plunge };
}

/**
 * Pole (normal) of a plane as a lower-hemisphere line: trend = dip direction + 180,
 * plunge = 90 - dip (common practice).
 * @example poleOf({dipDirection: 120, dip: 45}) // {trend: 300, plunge: 45}
 */
export function poleOf(plane: Plane): Line {
  return { trend: normalizeAzimuth(plane.dipDirection + 180), plunge: 90 - plane.dip };
}

/**
 * The plane whose pole is the given line.
 * @example planeOf({trend: 300, plunge: 45}) // {dipDirection: 120, dip: 45}
 */
export function planeOf(pole: Line): Plane {
  return { dipDirection: normalizeAzimuth(pole.trend + 180), dip: 90 - pole.plunge };
}

/**
 * Unit normal of a plane, pointing into the lower hemisphere.
 * @example
 * planeNormal({ dipDirection: 90, dip: 90 }) // about {x: 0, y: -1, z: 0}: a horizontal pole trending 270
 */
export function planeNormal(plane: Plane): Vec3 {
  return lineToVector(poleOf(plane));
}

/**
 * The plane whose normal is v (any sense).
 * @example
 * normalToPlane(vec3(0, 0, 1)).dip // 0: a vertical pole belongs to a horizontal plane
 */
export function normalToPlane(v: Vec3): Plane {
  return planeOf(vectorToLine(v));
}

/**
 * Angle in degrees between two vectors, in [0, 180]. Throws a RangeError when either has no
 * direction (zero length) or is not finite: there is no angle to give.
 * @example
 * angleBetweenVectors(vec3(1, 0, 0), vec3(-1, 0, 0)) // 180
 */
export function angleBetweenVectors(a: Vec3, b: Vec3): number {
  return toDegrees(acosClamped(dot(a, b) / lengths(a, b, 'angleBetweenVectors')));
}

/**
 * Angle in degrees between two axes (lines without sense), in [0, 90]. Throws a RangeError
 * like {@link angleBetweenVectors}.
 * @example
 * axialAngle(vec3(1, 0, 0), vec3(-1, 0, 0)) // 0: the same axis
 */
export function axialAngle(a: Vec3, b: Vec3): number {
  return toDegrees(acosClamped(Math.abs(dot(a, b)) / lengths(a, b, 'axialAngle')));
}

/** |a|·|b|, or a RangeError naming the call when it is zero or not finite (0/0 would be NaN). */
function lengths(a: Vec3, b: Vec3, what: string): number {
  const n = norm(a) * norm(b);
  if (!(n > 0 && Number.isFinite(n))) {
    throw new RangeError(`${what}: (${a.x}, ${a.y}, ${a.z}) and (${b.x}, ${b.y}, ${b.z}); expected two non-zero finite vectors`);
  }
  return n;
}
