/**
 * Beta axis: the fold axis estimated from the lines in which the folded planes intersect one
 * another, pair by pair (the "beta diagram"; Ramsay 1967, *Folding and Fracturing of Rocks*;
 * common practice). For a cylindrical fold every pair of limb planes meets in the axis.
 *
 * The pairwise intersections are lines without sense, so they are averaged as axes: the
 * estimate is the principal eigenvector of the orientation tensor of the unit intersection
 * vectors (see orientationTensor.ts).
 *
 * Two documented choices:
 * - Near-parallel pairs are skipped. Their intersection is set by reading error rather than by
 *   the fold: for planes theta apart, a reading error of e moves the intersection by about
 *   e / sin(theta). With the default `minAngle` of 10°, a 2° reading error (common practice
 *   for a compass-clinometer) moves a kept intersection by at most about 12°.
 * - The number of pairs grows as n²/2, so above `maxPairs` (default 20,000, i.e. every pair of
 *   up to 200 planes) a seeded random sample of `maxPairs` pairs is used instead, drawn
 *   uniformly with replacement; the result is reproducible from `seed`.
 */
import { DEG } from './math';
import { eigenSymmetric3 } from './eigen';
import { assertPlanes, AXIS_DEGENERACY } from './girdle';
import { createRandom } from './random';
import { normalizeEigenvalues } from './shapeIndices';
import { planeNormal, vectorToLine } from './vectors';
import type { Line, Plane, Vec3 } from './types';

/** Options for the beta axis. */
export interface BetaAxisOptions {
  /** Pairs of planes less than this many degrees apart are skipped (default 10). */
  readonly minAngle?: number;
  /** Above this many pairs, a random sample of this many is used (default 20,000). */
  readonly maxPairs?: number;
  /** Seed for the sample of pairs (default 1). */
  readonly seed?: number;
}

/** Beta axis with an account of the pairs behind it. */
export interface BetaAxisResult {
  /** Axial mean of the intersections, lower hemisphere; null when no pair could be used or the mean is undefined. */
  readonly axis: Line | null;
  /** Unit vector of the axis (lower hemisphere), null with `axis`. */
  readonly vector: Vec3 | null;
  /** n(n - 1)/2 for n planes. */
  readonly pairsTotal: number;
  /** Pairs looked at: all of them, or the random sample. */
  readonly pairsExamined: number;
  /** Pairs whose intersection entered the mean. */
  readonly pairsUsed: number;
  /** Pairs skipped as closer than `minAngle`. */
  readonly pairsSkipped: number;
  /** True when a random sample of pairs was used. */
  readonly sampled: boolean;
  /** Eigenvalues (sum 1) of the intersections' tensor, null when no pair was used. */
  readonly eigenvalues: readonly [number, number, number] | null;
  /** Why `axis` is null, else null. */
  readonly note: string | null;
}

/**
 * Defaults of `BetaAxisOptions`.
 * @example betaAxis(planes, { ...BETA_DEFAULTS, minAngle: 15 })
 */
export const BETA_DEFAULTS = Object.freeze({ minAngle: 10, maxPairs: 20_000, seed: 1 });

/**
 * Beta axis of planes given by dip direction and dip.
 * @example
 * betaAxis([{dipDirection: 120, dip: 40}, {dipDirection: 240, dip: 40}]).axis // {trend: 180, plunge: 22.76}
 */
export function betaAxis(planes: readonly Plane[], options: BetaAxisOptions = {}): BetaAxisResult {
  assertPlanes(planes);
  const xyz = new Float64Array(planes.length * 3);
  planes.forEach((p, i) => {
    const v = planeNormal(p);
    xyz[3 * i] = v.x; xyz[3 * i + 1] = v.y; xyz[3 * i + 2] = v.z;
  });
  return betaAxisOfNormals(xyz, options);
}

/**
 * Beta axis of planes given by interleaved unit normals [x0, y0, z0, x1, ...] (poles; sense
 * does not matter).
 * @example betaAxisOfNormals(poles, { seed: 7 }).pairsUsed
 */
export function betaAxisOfNormals(xyz: ArrayLike<number>, options: BetaAxisOptions = {}): BetaAxisResult {
  const minAngle = options.minAngle ?? BETA_DEFAULTS.minAngle;
  const maxPairs = options.maxPairs ?? BETA_DEFAULTS.maxPairs;
  const seed = options.seed ?? BETA_DEFAULTS.seed;
  if (!(minAngle >= 0 && minAngle < 90)) throw new RangeError(`betaAxis minAngle: ${minAngle} (expected degrees from 0 to below 90)`);
  if (!(Number.isInteger(maxPairs) && maxPairs >= 1)) throw new RangeError(`betaAxis maxPairs: ${maxPairs} (expected a whole number of at least 1)`);
  if (xyz.length % 3 !== 0) throw new RangeError(`interleaved normals: length ${xyz.length} is not a multiple of 3`);

  const n = xyz.length / 3;
  const pairsTotal = (n * (n - 1)) / 2;
  const sampled = pairsTotal > maxPairs;
  const minSin = Math.sin(minAngle * DEG);
  let xx = 0, xy = 0, xz = 0, yy = 0, yz = 0, zz = 0;
  let used = 0;
  let skipped = 0;

  const take = (i: number, j: number): void => {
    const ax = xyz[3 * i], ay = xyz[3 * i + 1], az = xyz[3 * i + 2];
    const bx = xyz[3 * j], by = xyz[3 * j + 1], bz = xyz[3 * j + 2];
    // Intersection direction a × b; its length is the sine of the angle between the planes.
    const cx = ay * bz - az * by, cy = az * bx - ax * bz, cz = ax * by - ay * bx;
    const len = Math.sqrt(cx * cx + cy * cy + cz * cz);
    if (!(len >= minSin) || len === 0) {
      skipped++;
      return;
    }
    const ux = cx / len, uy = cy / len, uz = cz / len;
    xx += ux * ux; xy += ux * uy; xz += ux * uz;
    yy += uy * uy; yz += uy * uz; zz += uz * uz;
    used++;
  };

  if (sampled) {
    const rng = createRandom(seed);
    for (let k = 0; k < maxPairs; k++) {
      // Uniform over unordered pairs of distinct planes: j is drawn from the n - 1 others.
      const i = rng.nextInt(n);
      let j = rng.nextInt(n - 1);
      if (j >= i) j++;
      take(i, j);
    }
  } else {
    for (let i = 0; i < n; i++) for (let j = i + 1; j < n; j++) take(i, j);
  }

  const base = { pairsTotal, pairsExamined: sampled ? maxPairs : pairsTotal, pairsUsed: used, pairsSkipped: skipped, sampled };
  if (!Number.isFinite(xx + xy + xz + yy + yz + zz)) throw new RangeError('interleaved normals: a component is not a finite number');
  if (used === 0) {
    const why = n < 2 ? 'fewer than 2 planes, so there is no intersection' : `every pair of planes is less than ${minAngle}° apart, so no intersection is reliable`;
    return { ...base, axis: null, vector: null, eigenvalues: null, note: why };
  }
  const k = 1 / used;
  const eig = eigenSymmetric3({ xx: xx * k, xy: xy * k, xz: xz * k, yy: yy * k, yz: yz * k, zz: zz * k });
  const eigenvalues = normalizeEigenvalues(eig.values);
  if (eigenvalues[0] - eigenvalues[1] <= AXIS_DEGENERACY) {
    return { ...base, axis: null, vector: null, eigenvalues, note: 'the intersections spread evenly about more than one direction, so their mean is undefined' };
  }
  const vector = eig.vectors[0];
  return { ...base, axis: vectorToLine(vector), vector, eigenvalues, note: null };
}
