import { profileFrame, type Enu } from './downPlunge';
import { toDegrees } from './math';
import type { Line, Plane, Vec3 } from './types';
import { lineToVector, planeNormal } from './vectors';

/**
 * Attitudes seen in the down-plunge profile (see downPlunge.ts for the frame).
 *
 * A plane appears as its trace in the profile plane: the line where the two planes meet,
 * direction n × a (n the plane's normal, a the axis), drawn as an apparent-dip tick at the
 * station. In a cylindrical fold every bedding plane contains the axis, so the tick is tangent
 * to the profile curve there. A line appears as a point (a line parallel to the axis projects
 * to a point; any other line to a short segment whose length is the sine of its angle to the
 * axis, reported so lines far from the axis can be flagged).
 */

/** A plane's trace in the profile. */
export interface ProfileTrace {
  /** Unit direction of the trace in profile coordinates (right, up), with dx >= 0 (dy = 1 when vertical). */
  readonly dx: number;
  readonly dy: number;
  /** Angle of the trace from profile right, degrees in (-90, 90]; positive rises to the right. */
  readonly angle: number;
  /** Angle between the plane and the axis, degrees in [0, 90]: 0 when the plane contains the axis. */
  readonly axisToPlane: number;
}

/** A line seen down the plunge. */
export interface ProfileLineMark {
  /** Orthographic projection of the unit line direction onto the profile (right, up), dx >= 0; its length is sin(angleToAxis). */
  readonly dx: number;
  readonly dy: number;
  /** Angle between the line and the axis, degrees in [0, 90]. */
  readonly angleToAxis: number;
}

/** North-east-down direction (types.ts) to east-north-up (downPlunge.ts). */
const toEnu = (v: Vec3): Enu => [v.y, v.x, -v.z];

const dot = (p: Enu, q: Enu): number => p[0] * q[0] + p[1] * q[1] + p[2] * q[2];

/** Orients a 2D direction so that it points right (or straight up when vertical). */
function rightward(dx: number, dy: number): [number, number] {
  return dx < 0 || (dx === 0 && dy < 0) ? [-dx, -dy] : [dx, dy];
}

/**
 * The apparent-dip tick of a plane in the profile of `axis`, or null for a plane normal to the
 * axis (it is parallel to the profile plane and has no trace in it). With a horizontal axis the
 * profile is a vertical section normal to the trend and `angle` is the classical apparent dip
 * (tan α = tan δ · sin β; REFERENCES.md), negative when the plane descends to the right.
 * @example planeTraceInProfile({ dipDirection: 90, dip: 30 }, { trend: 0, plunge: 0 }).angle // -30
 */
export function planeTraceInProfile(plane: Plane, axis: Line): ProfileTrace | null {
  const f = profileFrame(axis);
  const n = toEnu(planeNormal(plane));
  const a = f.axis;
  // n × a lies in the plane (normal to n) and in the profile plane (normal to a).
  const d: Enu = [n[1] * a[2] - n[2] * a[1], n[2] * a[0] - n[0] * a[2], n[0] * a[1] - n[1] * a[0]];
  const length = Math.hypot(d[0], d[1], d[2]);
  if (length < 1e-12) return null;
  const [dx, dy] = rightward(dot(d, f.right) / length, dot(d, f.up) / length);
  const angle = toDegrees(Math.atan2(dy, dx));
  // |n·a| = sin(angle between plane and axis); |n × a| = its cosine.
  const axisToPlane = toDegrees(Math.atan2(Math.abs(dot(n, a)), length));
  return { dx, dy, angle, axisToPlane };
}

/**
 * How a measured line looks in the profile of `axis`: it is plotted as a point at its station;
 * `angleToAxis` says how far it is from being parallel to the axis.
 * @example lineInProfile({ trend: 75, plunge: 12 }, { trend: 75, plunge: 12 }).angleToAxis // 0
 */
export function lineInProfile(line: Line, axis: Line): ProfileLineMark {
  const f = profileFrame(axis);
  const l = toEnu(lineToVector(line));
  const [dx, dy] = rightward(dot(l, f.right), dot(l, f.up));
  // atan2 of the across and along parts: precise at both ends, unlike asin or acos alone.
  const angleToAxis = toDegrees(Math.atan2(Math.hypot(dx, dy), Math.abs(dot(l, f.axis))));
  return { dx, dy, angleToAxis };
}
