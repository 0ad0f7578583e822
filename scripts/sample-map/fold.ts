/**
 * The analytic fold geometry of one structural domain (see FoldDomainDesign in district.ts).
 * Vectors here are east-north-up in local metres; `toNed` converts to the north-east-down frame
 * of src/core.
 */
import type { Vec3 } from '../../src/core/types';
import type { FoldDomainDesign } from './district';

export type Enu = readonly [number, number, number];

/** A domain ready for evaluation: its design plus the stratigraphic offset that ties it to the other. */
export interface FoldDomain extends FoldDomainDesign {
  readonly offset: number;
}

const D2R = Math.PI / 180;

/**
 * Profile frame of a fold axis (trend t, plunge p), east-north-up:
 * axis a = (cos p sin t, cos p cos t, -sin p); profile right u = (cos t, -sin t, 0);
 * profile up v = (sin p sin t, sin p cos t, cos p). The same frame as the down-plunge
 * projection in REFERENCES.md (derived there from the definition of a plunging line).
 * @example profileFrame({trend: 90, plunge: 0}).u // [0, -1, 0]: right of an east-looking observer is south
 */
export function profileFrame(axis: { trend: number; plunge: number }): { a: Enu; u: Enu; v: Enu } {
  const t = axis.trend * D2R;
  const p = axis.plunge * D2R;
  return {
    a: [Math.cos(p) * Math.sin(t), Math.cos(p) * Math.cos(t), -Math.sin(p)],
    u: [Math.cos(t), -Math.sin(t), 0],
    v: [Math.sin(p) * Math.sin(t), Math.sin(p) * Math.cos(t), Math.cos(p)],
  };
}

const dot = (p: Enu, q: Enu): number => p[0] * q[0] + p[1] * q[1] + p[2] * q[2];

/**
 * Profile curve h(xi) = A asin(r sin theta) / asin(r), theta = 2 pi xi / lambda + phase, and its
 * slope dh/dxi. A rounded chevron: r -> 0 is a sine, r -> 1 a triangle wave (our own choice of
 * shape; any smooth periodic curve would do).
 * @example profileCurve(domain, 0) // {h, slope, theta}
 */
export function profileCurve(d: FoldDomainDesign, xi: number): { h: number; slope: number; theta: number } {
  const k = (2 * Math.PI) / d.wavelength;
  const theta = k * xi + d.phaseDeg * D2R;
  const s = Math.sin(theta);
  const norm = Math.asin(d.r);
  const h = (d.amplitude * Math.asin(d.r * s)) / norm;
  const slope = (d.amplitude * k * d.r * Math.cos(theta)) / (norm * Math.sqrt(1 - d.r * d.r * s * s));
  return { h, slope, theta };
}

/**
 * u, v (and w along the axis) of a local point (x, y, z) in the domain's profile frame, from its origin.
 * @example profileCoordinates(domain, ...domain.origin) // {u: 0, v: 0, w: 0}
 */
export function profileCoordinates(d: FoldDomainDesign, x: number, y: number, z: number): { u: number; v: number; w: number } {
  const f = profileFrame(d.axisGrid);
  const p: Enu = [x - d.origin[0], y - d.origin[1], z - d.origin[2]];
  return { u: dot(p, f.u), v: dot(p, f.v), w: dot(p, f.a) };
}

/**
 * Stratigraphic height F = v - h(u - shear v) + offset: constant on each bedding surface,
 * increasing upward through the succession.
 * @example stratHeight(domain, 1500, 2000, 800)
 */
export function stratHeight(d: FoldDomain, x: number, y: number, z: number): number {
  const { u, v } = profileCoordinates(d, x, y, z);
  return v - profileCurve(d, u - d.shear * v).h + d.offset;
}

/**
 * Gradient of F (east-north-up): the bedding normal, pointing stratigraphically up. Since F
 * depends on u and v only, the normal is always perpendicular to the axis: the folding is
 * exactly cylindrical. dF/du = -h', dF/dv = 1 + shear h'.
 * @example stratGradient(domain, 1500, 2000, 800)
 */
export function stratGradient(d: FoldDomain, x: number, y: number, z: number): Enu {
  const f = profileFrame(d.axisGrid);
  const { u, v } = profileCoordinates(d, x, y, z);
  const { slope } = profileCurve(d, u - d.shear * v);
  const gu = -slope;
  const gv = 1 + d.shear * slope;
  return [gu * f.u[0] + gv * f.v[0], gu * f.u[1] + gv * f.v[1], gu * f.u[2] + gv * f.v[2]];
}

/**
 * Elevation at which the surface F = level passes over local (x, y). F increases monotonically
 * with z (dF/dz = cos(plunge)(1 + shear h') > 0 because shear * max|h'| < 1), so Newton's method
 * converges: the ratio of slopes stays below 2, making each step a contraction.
 * @example surfaceElevation(domain, 0, 3000, 2000) // metres above sea level
 */
export function surfaceElevation(d: FoldDomain, level: number, x: number, y: number): number {
  const f = profileFrame(d.axisGrid);
  let z = d.origin[2];
  for (let i = 0; i < 60; i++) {
    const g = stratHeight(d, x, y, z) - level;
    const { u, v } = profileCoordinates(d, x, y, z);
    const dz = f.v[2] * (1 + d.shear * profileCurve(d, u - d.shear * v).slope);
    const step = g / dz;
    z -= step;
    if (Math.abs(step) < 1e-9) break;
  }
  return z;
}

/**
 * Normal of the axial surfaces (planes xi = constant, which contain the axis and the direction
 * shear * u + v), east-north-up.
 * @example axialSurfaceNormal(domain)
 */
export function axialSurfaceNormal(d: FoldDomainDesign): Enu {
  const f = profileFrame(d.axisGrid);
  // The gradient of xi = u - shear v is u - shear v: normal to the axial planes.
  return [f.u[0] - d.shear * f.v[0], f.u[1] - d.shear * f.v[1], f.u[2] - d.shear * f.v[2]];
}

/**
 * East-north-up to the north-east-down frame of src/core.
 * @example toNed([1, 2, 3]) // {x: 2, y: 1, z: -3}
 */
export const toNed = (e: Enu): Vec3 => ({ x: e[1], y: e[0], z: -e[2] });
