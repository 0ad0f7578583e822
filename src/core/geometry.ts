/**
 * Spherical geometry of lines and planes: the plane through two lines, the line shared by
 * two planes, angles, rotation about an axis, apparent dip, and the paths of great and
 * small circles for drawing on a net.
 *
 * Everything works on the north-east-down direction cosines of types.ts (x = north,
 * y = east, z = down). Lines and planes have no sense: results that are lines come back in
 * the lower hemisphere, angles between lines or planes are in [0, 90].
 */
import { EPSILON, normalizeAzimuth, toDegrees, toRadians } from './math';
import type { Line, Plane, Vec3 } from './types';
import { add, cross, dot, lineToVector, negate, norm, normalize, planeNormal, planeOf, scale, toLowerHemisphere } from './vectors';

/**
 * Default tolerance, in degrees, below which two lines (or two plane normals) count as
 * parallel. Unit-vector round-off is near 1e-14 rad, so 1e-6° (about 2e-8 rad) only catches
 * true parallels, never field data that merely lie close together.
 * @example
 * planeThroughLines(a, b, 10 * PARALLEL_TOLERANCE_DEGREES);
 */
export const PARALLEL_TOLERANCE_DEGREES = 1e-6;

const fmtLine = (l: Line): string => `${l.trend}/${l.plunge}`;
const fmtPlane = (p: Plane): string => `${p.dipDirection}/${p.dip}`;

/** Throws a RangeError naming the call, the field and the value unless the line is a valid trend/plunge. */
function checkLine(line: Line, what: string): void {
  if (!Number.isFinite(line?.trend)) throw new RangeError(`${what}.trend is ${String(line?.trend)}; expected a finite azimuth in degrees`);
  if (!Number.isFinite(line.plunge) || line.plunge < 0 || line.plunge > 90) {
    throw new RangeError(`${what}.plunge is ${String(line.plunge)}; expected a plunge from 0 to 90 degrees`);
  }
}

/** Throws a RangeError naming the call, the field and the value unless the plane is a valid dip direction/dip. */
function checkPlane(plane: Plane, what: string): void {
  if (!Number.isFinite(plane?.dipDirection)) {
    throw new RangeError(`${what}.dipDirection is ${String(plane?.dipDirection)}; expected a finite azimuth in degrees`);
  }
  if (!Number.isFinite(plane.dip) || plane.dip < 0 || plane.dip > 90) {
    throw new RangeError(`${what}.dip is ${String(plane.dip)}; expected a dip from 0 to 90 degrees`);
  }
}

/**
 * Trend/plunge of a vector, like vectorToLine in vectors.ts but with the plunge from
 * atan2(z, horizontal) rather than asin(z): near the vertical asin loses half the digits
 * (a pole at z = 1 − 1e-16 came out 8.5e-7° off vertical), atan2 keeps them all.
 */
function lineOfVector(v: Vec3): Line {
  const u = toLowerHemisphere(normalize(v));
  const horizontal = Math.hypot(u.x, u.y);
  const plunge = toDegrees(Math.atan2(u.z, horizontal));
  // A vertical line has no trend; report 0 (as vectorToLine does) rather than atan2 noise.
  const trend = horizontal < EPSILON ? 0 : normalizeAzimuth(toDegrees(Math.atan2(u.y, u.x)));
  return { trend, plunge };
}

/**
 * Acute angle between two axes in degrees, atan2(|a × b|, |a · b|): accurate at every angle,
 * where acos of the dot product loses digits near 0° (common numerical practice).
 */
function axisAngle(a: Vec3, b: Vec3): number {
  return toDegrees(Math.atan2(norm(cross(a, b)), Math.abs(dot(a, b))));
}

function checkSteps(steps: number, what: string): void {
  if (!Number.isInteger(steps) || steps < 1) throw new RangeError(`${what}: steps is ${String(steps)}; expected an integer of at least 1`);
}

/**
 * The plane that contains both lines: its normal is the cross product of the two line
 * vectors (common practice).
 *
 * @param toleranceDegrees lines closer than this count as parallel.
 * @throws RangeError when the lines are parallel (they share no single plane).
 * @example planeThroughLines({trend: 0, plunge: 0}, {trend: 90, plunge: 30}) // {dipDirection: 90, dip: 30}
 */
export function planeThroughLines(a: Line, b: Line, toleranceDegrees = PARALLEL_TOLERANCE_DEGREES): Plane {
  checkLine(a, 'planeThroughLines: a');
  checkLine(b, 'planeThroughLines: b');
  const n = cross(lineToVector(a), lineToVector(b));
  // |a x b| = sin(angle between the lines) for unit vectors.
  if (norm(n) <= Math.sin(toRadians(toleranceDegrees)) || norm(n) < EPSILON) {
    throw new RangeError(
      `planeThroughLines: lines ${fmtLine(a)} and ${fmtLine(b)} are parallel (within ${toleranceDegrees}°); two different lines are needed to fix a plane`,
    );
  }
  return planeOf(lineOfVector(n));
}

/**
 * The line common to two planes (e.g. a fold hinge from two limbs, an intersection
 * lineation): the cross product of the poles (common practice), in the lower hemisphere.
 *
 * @param toleranceDegrees planes whose poles are closer than this count as parallel.
 * @throws RangeError when the planes are parallel (they share no single line).
 * @example intersectionOfPlanes({dipDirection: 120, dip: 40}, {dipDirection: 240, dip: 40}) // {trend: 180, plunge: 22.76}
 */
export function intersectionOfPlanes(a: Plane, b: Plane, toleranceDegrees = PARALLEL_TOLERANCE_DEGREES): Line {
  checkPlane(a, 'intersectionOfPlanes: a');
  checkPlane(b, 'intersectionOfPlanes: b');
  const l = cross(planeNormal(a), planeNormal(b));
  if (norm(l) <= Math.sin(toRadians(toleranceDegrees)) || norm(l) < EPSILON) {
    throw new RangeError(
      `intersectionOfPlanes: planes ${fmtPlane(a)} and ${fmtPlane(b)} are parallel (within ${toleranceDegrees}°); they have no single line in common`,
    );
  }
  return lineOfVector(l);
}

/**
 * Acute angle between two lines in degrees, in [0, 90]: lines have no sense, so 010/20 and
 * 190/20 are 40° apart, not 140°.
 * @example angleBetweenLines({trend: 0, plunge: 30}, {trend: 180, plunge: 30}) // 60
 */
export function angleBetweenLines(a: Line, b: Line): number {
  checkLine(a, 'angleBetweenLines: a');
  checkLine(b, 'angleBetweenLines: b');
  return axisAngle(lineToVector(a), lineToVector(b));
}

/**
 * Acute angle between two planes in degrees, in [0, 90]: the angle between their poles,
 * which equals the dihedral angle (common practice).
 * @example angleBetweenPlanes({dipDirection: 90, dip: 30}, {dipDirection: 270, dip: 50}) // 80
 */
export function angleBetweenPlanes(a: Plane, b: Plane): number {
  checkPlane(a, 'angleBetweenPlanes: a');
  checkPlane(b, 'angleBetweenPlanes: b');
  return axisAngle(planeNormal(a), planeNormal(b));
}

/**
 * Rotates v about an axis through the origin by `degrees` (Rodrigues' rotation formula:
 * v' = v cos θ + (k × v) sin θ + k (k · v)(1 − cos θ), k the unit axis).
 *
 * Sense: a positive angle turns clockwise when you look along the axis, in the direction it
 * points (the right-hand rule about the axis in the right-handed north-east-down frame). So
 * about the downward vertical (0, 0, 1), +90° turns north into east: trends increase, as on
 * a compass seen from above. The axis need not be a unit vector; its length is ignored.
 *
 * @throws RangeError for a zero or non-finite axis or a non-finite angle.
 * @example rotateAboutAxis({x: 1, y: 0, z: 0}, {x: 0, y: 0, z: 1}, 90) // {x: 0, y: 1, z: 0} (north -> east)
 */
export function rotateAboutAxis(v: Vec3, axis: Vec3, degrees: number): Vec3 {
  if (!Number.isFinite(degrees)) throw new RangeError(`rotateAboutAxis: degrees is ${String(degrees)}; expected a finite angle`);
  if (!(norm(axis) > EPSILON && Number.isFinite(norm(axis)))) {
    throw new RangeError(`rotateAboutAxis: axis (${axis.x}, ${axis.y}, ${axis.z}) has no direction; expected a non-zero finite vector`);
  }
  const k = normalize(axis);
  const t = toRadians(degrees);
  const c = Math.cos(t);
  const s = Math.sin(t);
  return add(add(scale(v, c), scale(cross(k, v), s)), scale(k, dot(k, v) * (1 - c)));
}

/**
 * Apparent dip of a plane in a vertical section along `azimuth`, in degrees:
 * tan(apparent) = tan(dip) · cos(azimuth − dip direction), the standard formula (written
 * with the angle to the strike it reads tan(dip) · sin(angle to strike)).
 *
 * Signed: positive when the plane's trace goes down toward `azimuth`, negative when it rises
 * toward it (it then dips toward azimuth + 180), zero along the strike.
 *
 * @throws RangeError for a vertical plane seen along its own strike (the section is the plane
 *   itself, so no single apparent dip exists).
 * @example apparentDip({dipDirection: 90, dip: 45}, 150) // 26.565 (60° from the dip direction)
 */
export function apparentDip(plane: Plane, azimuth: number): number {
  checkPlane(plane, 'apparentDip: plane');
  if (!Number.isFinite(azimuth)) throw new RangeError(`apparentDip: azimuth is ${String(azimuth)}; expected a finite azimuth in degrees`);
  // Each azimuth reduced first (exact in floating point), so the difference cannot overflow.
  const cosDelta = Math.cos(toRadians((azimuth % 360) - (plane.dipDirection % 360)));
  const dip = toRadians(plane.dip);
  // atan2 form of tan(a) = tan(d)·cos(Δ) so that a vertical plane (tan d infinite) gives ±90.
  const rise = Math.sin(dip) * cosDelta;
  const run = Math.cos(dip);
  if (Math.abs(cosDelta) < 1e-12 && Math.abs(run) < 1e-12) {
    throw new RangeError(
      `apparentDip: azimuth ${azimuth} runs along the strike of the vertical plane ${fmtPlane(plane)}; the section is the plane itself and has no single apparent dip`,
    );
  }
  return toDegrees(Math.atan2(rise, run));
}

/**
 * Points along the great circle of a plane, as unit vectors: the lower-hemisphere half
 * circle from the strike (right-hand rule: dip direction − 90) through the dip line to the
 * opposite strike. Returns `steps + 1` vectors, the first and last horizontal.
 * @example greatCirclePath({dipDirection: 90, dip: 30}, 2) // [north, 090/30, south]
 */
export function greatCirclePath(plane: Plane, steps = 90): Vec3[] {
  checkPlane(plane, 'greatCirclePath: plane');
  checkSteps(steps, 'greatCirclePath');
  const strike = lineToVector({ trend: normalizeAzimuth(plane.dipDirection - 90), plunge: 0 });
  const dipLine = lineToVector({ trend: plane.dipDirection, plunge: plane.dip });
  const out: Vec3[] = [];
  for (let i = 0; i <= steps; i++) {
    // Exact end points: the last is the opposite strike, not cos(π)·strike + 1e-16·dip.
    if (i === steps) {
      out.push(negate(strike));
      break;
    }
    const phi = (Math.PI * i) / steps;
    out.push(add(scale(strike, Math.cos(phi)), scale(dipLine, Math.sin(phi))));
  }
  return out;
}

/**
 * Points along the small circle (cone) of half-angle `halfAngleDegrees` about an axis, as
 * unit vectors: a full closed circle of `steps + 1` points whose last point repeats the first.
 * It starts where the axis, tipped `halfAngle` further down in its own vertical plane (past the
 * vertical if need be), points, and turns clockwise looking along the axis (the sense of rotateAboutAxis).
 * Points above the horizontal are returned as they are; projectPath decides how to draw them.
 *
 * @throws RangeError unless 0 <= halfAngleDegrees <= 180 and steps is an integer >= 1.
 * @example smallCirclePath({trend: 0, plunge: 90}, 30, 4) // five points at plunge 60
 */
export function smallCirclePath(axis: Line, halfAngleDegrees: number, steps = 180): Vec3[] {
  checkLine(axis, 'smallCirclePath: axis');
  checkSteps(steps, 'smallCirclePath');
  if (!Number.isFinite(halfAngleDegrees) || halfAngleDegrees < 0 || halfAngleDegrees > 180) {
    throw new RangeError(`smallCirclePath: halfAngleDegrees is ${String(halfAngleDegrees)}; expected an angle from 0 to 180 degrees`);
  }
  const a = lineToVector(axis);
  const t = toRadians(axis.trend);
  const p = toRadians(axis.plunge);
  // u: unit vector at right angles to the axis in its vertical plane, on the downward side
  // (trend t, plunge p + 90, written out so it stays defined for a vertical axis).
  const u: Vec3 = { x: -Math.sin(p) * Math.cos(t), y: -Math.sin(p) * Math.sin(t), z: Math.cos(p) };
  const w = cross(a, u); // completes a right-handed set (a, u, w), so u -> w is the positive sense
  const alpha = toRadians(halfAngleDegrees);
  const ca = Math.cos(alpha);
  const sa = Math.sin(alpha);
  const out: Vec3[] = [];
  for (let i = 0; i < steps; i++) {
    const phi = (2 * Math.PI * i) / steps;
    out.push(add(scale(a, ca), scale(add(scale(u, Math.cos(phi)), scale(w, Math.sin(phi))), sa)));
  }
  out.push(out[0]);
  return out;
}
