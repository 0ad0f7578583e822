/**
 * Best-fit girdle (great circle) to poles of folded planes, and the fold axis it implies.
 *
 * Poles to the planes of a cylindrical fold lie on the great circle perpendicular to the
 * fold axis, so the axis is the direction the poles avoid: the eigenvector of the least
 * eigenvalue S3 of the poles' orientation tensor (the "pi axis"; Ramsay 1967, *Folding and
 * Fracturing of Rocks*; Woodcock 1977; common practice). The girdle is the plane whose
 * pole is that axis; it minimises the sum of squared sines of the poles' distances to it.
 */
import { asinClamped, toDegrees } from './math';
import { eigenSymmetric3 } from './eigen';
import { tensorFromSums, tensorSumsOfArray, tensorSumsOfVectors, type TensorSums } from './orientationTensor';
import { normalizeEigenvalues } from './shapeIndices';
import { planeNormal, planeOf, vectorToLine } from './vectors';
import type { Line, Plane, Vec3 } from './types';

/**
 * The axis is taken as undefined when S2 - S3 (eigenvalues summing to 1) is at or below this:
 * the least eigenvector is then free to turn in the S2-S3 plane (all poles parallel, or a
 * rotationally symmetric spread), and any answer would be rounding noise.
 * @example fit.eigenvalues[1] - fit.eigenvalues[2] > AXIS_DEGENERACY // same as fit.axisDefined
 */
export const AXIS_DEGENERACY = 1e-9;

/** A fitted girdle. */
export interface GirdleFit {
  /** Number of poles fitted. */
  readonly n: number;
  /** Fold (pi) axis, lower hemisphere: eigenvector of the least eigenvalue. */
  readonly axis: Line;
  /** Unit vector of the axis, lower hemisphere. */
  readonly axisVector: Vec3;
  /** The girdle plane, whose pole is the axis. */
  readonly girdle: Plane;
  /** False when S2 - S3 <= AXIS_DEGENERACY: the axis direction is then arbitrary. */
  readonly axisDefined: boolean;
  /** Eigenvalues S1 >= S2 >= S3, summing to 1. */
  readonly eigenvalues: readonly [number, number, number];
  /** Unit eigenvectors in the order of `eigenvalues`, lower hemisphere. */
  readonly eigenvectors: readonly [Vec3, Vec3, Vec3];
}

/**
 * Fits the girdle from running tensor sums of unit poles (the lasso's fast path: no pass over
 * the poles). Throws when the sums hold no poles.
 * @example fitGirdleFromSums(tensorSumsOfArray(poles)).axis // {trend, plunge}
 */
export function fitGirdleFromSums(sums: TensorSums): GirdleFit {
  const { values, vectors } = eigenSymmetric3(tensorFromSums(sums));
  // Dividing by the sum (not by n alone) keeps S1 + S2 + S3 = 1 even after many add/remove updates.
  const eigenvalues = normalizeEigenvalues(values);
  const axisVector = vectors[2];
  return {
    n: sums.n,
    axis: vectorToLine(axisVector),
    axisVector,
    girdle: planeOf(vectorToLine(axisVector)),
    axisDefined: eigenvalues[1] - eigenvalues[2] > AXIS_DEGENERACY,
    eigenvalues,
    eigenvectors: vectors,
  };
}

/**
 * Fits the girdle to unit pole vectors.
 * @example fitGirdle(poles).axis // the pi axis as trend/plunge
 */
export function fitGirdle(poles: readonly Vec3[]): GirdleFit {
  return fitGirdleFromSums(tensorSumsOfVectors(poles));
}

/**
 * Fits the girdle to interleaved unit poles [x0, y0, z0, x1, ...].
 * @example fitGirdleToArray(new Float64Array([...])).girdle
 */
export function fitGirdleToArray(xyz: ArrayLike<number>): GirdleFit {
  return fitGirdleFromSums(tensorSumsOfArray(xyz));
}

/**
 * Fits the girdle to the poles of planes.
 * @example fitGirdleToPlanes([{dipDirection: 90, dip: 30}, {dipDirection: 270, dip: 30}, {dipDirection: 90, dip: 70}]).axis
 * // {trend: 0, plunge: 0} (the three planes share the horizontal north-south line)
 */
export function fitGirdleToPlanes(planes: readonly Plane[]): GirdleFit {
  assertPlanes(planes);
  return fitGirdleFromSums(tensorSumsOfVectors(planes.map(planeNormal)));
}

/**
 * Checks that every plane has a finite dip direction and a dip from 0 to 90; throws a
 * RangeError naming the first bad row and field otherwise. `label` names the array in messages.
 * @example assertPlanes([{dipDirection: 120, dip: 95}]) // throws "planes[0].dip: 95 is not a dip (expected 0 to 90)"
 */
export function assertPlanes(planes: readonly Plane[], label = 'planes'): void {
  planes.forEach((p, i) => {
    if (p === null || typeof p !== 'object') throw new RangeError(`${label}[${i}]: ${String(p)} is not a plane (expected {dipDirection, dip})`);
    if (typeof p.dipDirection !== 'number' || !Number.isFinite(p.dipDirection)) {
      throw new RangeError(`${label}[${i}].dipDirection: ${String(p.dipDirection)} is not a dip direction (expected a finite azimuth in degrees)`);
    }
    if (typeof p.dip !== 'number' || !(p.dip >= 0 && p.dip <= 90)) {
      throw new RangeError(`${label}[${i}].dip: ${String(p.dip)} is not a dip (expected 0 to 90)`);
    }
  });
}

/**
 * The pi axis of unit poles, as a lower-hemisphere line.
 * @example girdleAxis(polesOfPlanesSharingALine) // that line
 */
export function girdleAxis(poles: readonly Vec3[]): Line {
  return fitGirdle(poles).axis;
}

/**
 * Angular distance in degrees (0..90) of a pole from the girdle whose pole is `axis`:
 * asin(|pole · axis|) for unit vectors.
 * @example distanceFromGirdle({x: 0, y: 0, z: 1}, {x: 1, y: 0, z: 0}) // 0
 */
export function distanceFromGirdle(pole: Vec3, axis: Vec3): number {
  const lengths = Math.hypot(pole.x, pole.y, pole.z) * Math.hypot(axis.x, axis.y, axis.z);
  // A zero or non-finite vector has no direction: 0/0 would give NaN.
  if (!(lengths > 0 && Number.isFinite(lengths))) throw new RangeError(`distanceFromGirdle: pole (${pole.x}, ${pole.y}, ${pole.z}) and axis (${axis.x}, ${axis.y}, ${axis.z}); expected two non-zero finite vectors`);
  const d = Math.abs(pole.x * axis.x + pole.y * axis.y + pole.z * axis.z) / lengths;
  return toDegrees(asinClamped(d));
}

/**
 * Distances in degrees of interleaved unit poles from the girdle of `axis` (unit), one per pole.
 * @example distancesFromGirdle(poles, fit.axisVector) // Float64Array of degrees
 */
export function distancesFromGirdle(xyz: ArrayLike<number>, axis: Vec3): Float64Array {
  if (xyz.length % 3 !== 0) throw new RangeError(`interleaved poles: length ${xyz.length} is not a multiple of 3`);
  const out = new Float64Array(xyz.length / 3);
  for (let i = 0; i < out.length; i++) {
    const d = xyz[3 * i] * axis.x + xyz[3 * i + 1] * axis.y + xyz[3 * i + 2] * axis.z;
    out[i] = toDegrees(asinClamped(Math.abs(d)));
  }
  return out;
}
