import { toRadians } from './math';
import type { Line } from './types';

/**
 * Down-plunge projection: the down-structure view of Mackin (1950, "The down-structure method
 * of viewing geologic maps", Journal of Geology 58, 55-72; citation from memory): every point is moved parallel to
 * the fold axis onto the plane normal to the axis (the profile plane). Orthographic, so in a
 * cylindrical fold every point of one surface lands on one curve, the fold's profile.
 *
 * Frame: positions are east-north-up metres (NOT the north-east-down frame of directions in
 * types.ts), relative to an origin the caller chooses. With the axis trend t and plunge p
 * (REFERENCES.md "Profiles", derived from the definition of trend and plunge):
 *
 * ```text
 * axis          a = (cos p sin t, cos p cos t, -sin p)   points down the plunge
 * profile right u = (cos t, -sin t, 0)                    horizontal, azimuth t + 90
 * profile up    v = (sin p sin t, sin p cos t, cos p)     normal to the axis, upward
 * x' = P·u,  y' = P·v,  depth = P·a
 * ```
 *
 * View and handedness: the observer looks DOWN THE PLUNGE, along +a (looking at a 075/12 axis,
 * one faces ENE and looks slightly downward). "Right" is to the observer's right hand: the
 * horizontal direction 90° clockwise from the trend seen from above (looking north, right is
 * east). u × v = -a, so (u, v, -a) is right-handed with -a pointing at the observer. Depth
 * grows down the plunge: features with larger depth lie farther from the observer.
 *
 * Special cases: plunge 0 gives a vertical section normal to the trend (x' horizontal to the
 * right, y' = elevation, depth = distance along the trend); plunge 90 gives the map itself
 * seen from above (x' and y' are the map rotated by the trend: trend 0 gives x' = east,
 * y' = north) with depth = -elevation. Map distances along the trend shrink by sin(plunge)
 * in the profile (common practice).
 */

/** A position or direction in east-north-up metres: [east, north, up]. */
export type Enu = readonly [number, number, number];

/** The three unit vectors of the profile frame, east-north-up. */
export interface ProfileFrame {
  /** Down the plunge (the viewing direction). */
  readonly axis: Enu;
  /** Profile right: horizontal, 90° clockwise from the trend. */
  readonly right: Enu;
  /** Profile up: normal to the axis, in the vertical plane through it. */
  readonly up: Enu;
}

/** One point in the profile. */
export interface ProfilePoint {
  /** x' = P·u, metres to the right. */
  readonly x: number;
  /** y' = P·v, metres up in the profile plane. */
  readonly y: number;
  /** P·a, metres down the plunge from the origin's profile plane (colour-coding, ordering). */
  readonly depth: number;
}

/**
 * Checks an axis for projection; throws a RangeError naming the bad value.
 * @example checkAxis({ trend: 75, plunge: 12 }) // no error
 */
export function checkAxis(axis: Line, what = 'fold axis'): void {
  if (!Number.isFinite(axis.trend)) throw new RangeError(`${what}: trend ${String(axis.trend)} is not an azimuth (a number of degrees)`);
  if (!(axis.plunge >= 0 && axis.plunge <= 90)) throw new RangeError(`${what}: plunge ${String(axis.plunge)} is not a plunge (0 to 90 degrees)`);
}

/**
 * The profile frame of an axis (east-north-up unit vectors).
 * @example profileFrame({ trend: 90, plunge: 30 }).up // [0.5, 0, 0.866...]
 */
export function profileFrame(axis: Line): ProfileFrame {
  checkAxis(axis);
  const t = toRadians(axis.trend);
  const p = toRadians(axis.plunge);
  const st = Math.sin(t);
  const ct = Math.cos(t);
  const sp = Math.sin(p);
  const cp = Math.cos(p);
  return {
    axis: [cp * st, cp * ct, -sp],
    right: [ct, -st, 0],
    up: [sp * st, sp * ct, cp],
  };
}

/**
 * Projects n positions down the plunge. `xyz` holds n east-north-up triples in metres relative
 * to an origin; `out` (optional, length >= xyz.length, may be `xyz` itself) receives n triples
 * (x', y', depth). Non-finite inputs give non-finite outputs at the same index: nothing is
 * dropped or reordered. Built for 10^6 vertices: one pass, no allocation when `out` is given.
 * @example
 * projectDownPlunge(new Float64Array([100, 0, 0]), { trend: 90, plunge: 30 })
 * // Float64Array [0, 50, 86.60...]  (REFERENCES.md, axis 090/30)
 */
export function projectDownPlunge(xyz: Float64Array, axis: Line, out?: Float64Array): Float64Array {
  if (xyz.length % 3 !== 0) throw new RangeError(`projectDownPlunge: xyz has ${xyz.length} numbers; expected east, north, up triples (a multiple of 3)`);
  const target = out ?? new Float64Array(xyz.length);
  if (target.length < xyz.length) throw new RangeError(`projectDownPlunge: out has ${target.length} numbers; expected at least ${xyz.length}`);
  const { axis: a, right: u, up: v } = profileFrame(axis);
  const [ax, ay, az] = a;
  const [ux, uy] = u;
  const [vx, vy, vz] = v;
  for (let i = 0; i < xyz.length; i += 3) {
    // Read all three before writing, so out === xyz is safe.
    const e = xyz[i];
    const n = xyz[i + 1];
    const h = xyz[i + 2];
    target[i] = e * ux + n * uy;
    target[i + 1] = e * vx + n * vy + h * vz;
    target[i + 2] = e * ax + n * ay + h * az;
  }
  return target;
}

/**
 * The inverse of {@link projectDownPlunge}: P = x'·u + y'·v + depth·a. The frame is
 * orthonormal, so this is the transpose of the forward matrix.
 * @example profileToEnu(projectDownPlunge(p, axis), axis) // p again, to rounding
 */
export function profileToEnu(profile: Float64Array, axis: Line, out?: Float64Array): Float64Array {
  if (profile.length % 3 !== 0) throw new RangeError(`profileToEnu: profile has ${profile.length} numbers; expected x', y', depth triples (a multiple of 3)`);
  const target = out ?? new Float64Array(profile.length);
  if (target.length < profile.length) throw new RangeError(`profileToEnu: out has ${target.length} numbers; expected at least ${profile.length}`);
  const { axis: a, right: u, up: v } = profileFrame(axis);
  for (let i = 0; i < profile.length; i += 3) {
    const x = profile[i];
    const y = profile[i + 1];
    const d = profile[i + 2];
    target[i] = x * u[0] + y * v[0] + d * a[0];
    target[i + 1] = x * u[1] + y * v[1] + d * a[1];
    target[i + 2] = x * u[2] + y * v[2] + d * a[2];
  }
  return target;
}

/**
 * One position projected down the plunge.
 * @example projectPoint([0, 0, 100], { trend: 90, plunge: 30 }) // { x: 0, y: 86.60..., depth: -50 }
 */
export function projectPoint(p: Enu, axis: Line): ProfilePoint {
  const r = projectDownPlunge(new Float64Array(p), axis);
  return { x: r[0], y: r[1], depth: r[2] };
}
