/**
 * The orientation tensor T = (1/N)·Σ x xᵀ of N unit vectors (Scheidegger 1965, USGS Prof.
 * Paper 525-C; Watson 1966; Woodcock 1977, GSA Bulletin 88; from memory). Its eigenvalues
 * are the mean squared direction cosines on its eigenvectors and sum to 1 for unit vectors.
 *
 * Besides the one-shot forms, the tensor is kept as running sums (`TensorSums`) so that a
 * selection can grow and shrink without refitting from scratch: adding or removing a vector
 * adds or subtracts its six products. Since x xᵀ = (-x)(-x)ᵀ, the sense of each vector
 * does not matter, which is what axial data (poles, lines) need.
 *
 * Hot paths read interleaved Float64Arrays [x0, y0, z0, x1, y1, z1, ...] and allocate
 * nothing per vector.
 */
import type { Vec3 } from './types';
import type { SymMatrix3 } from './eigen';

/** Running sums of the six products of a set of vectors, and how many were summed. */
export interface TensorSums {
  readonly xx: number;
  readonly xy: number;
  readonly xz: number;
  readonly yy: number;
  readonly yz: number;
  readonly zz: number;
  /** Count of vectors summed (removals subtract). */
  readonly n: number;
}

/**
 * Sums of no vectors: the start of a selection.
 * @example addVectorToSums(EMPTY_TENSOR_SUMS, {x: 0, y: 0, z: 1}).zz // 1
 */
export const EMPTY_TENSOR_SUMS: TensorSums = Object.freeze({ xx: 0, xy: 0, xz: 0, yy: 0, yz: 0, zz: 0, n: 0 });

/**
 * Sums of the products of an array of vectors.
 * @example tensorSumsOfVectors([{x: 1, y: 0, z: 0}]) // {xx: 1, xy: 0, ..., n: 1}
 */
export function tensorSumsOfVectors(vectors: readonly Vec3[]): TensorSums {
  let xx = 0, xy = 0, xz = 0, yy = 0, yz = 0, zz = 0;
  for (const { x, y, z } of vectors) {
    xx += x * x; xy += x * y; xz += x * z;
    yy += y * y; yz += y * z; zz += z * z;
  }
  const sums = { xx, xy, xz, yy, yz, zz, n: vectors.length };
  if (!sumsAreFinite(sums)) {
    const i = vectors.findIndex((v) => !(Number.isFinite(v.x) && Number.isFinite(v.y) && Number.isFinite(v.z)));
    const v = vectors[i];
    throw new RangeError(`vector ${i}: (${v.x}, ${v.y}, ${v.z}) has a component that is not a finite number`);
  }
  return sums;
}

/**
 * Sums of the products of interleaved vectors [x0, y0, z0, x1, ...]; with `indices`, only the
 * vectors at those positions (vector positions, not array offsets; repeats count again).
 * Throws on a length that is not a multiple of 3, an index out of range, or a non-finite entry.
 * @example tensorSumsOfArray(new Float64Array([0, 0, 1, 0, 0, -1])) // {zz: 2, n: 2, others 0}
 */
export function tensorSumsOfArray(xyz: ArrayLike<number>, indices?: ArrayLike<number>): TensorSums {
  return accumulate(EMPTY_TENSOR_SUMS, xyz, indices, 1);
}

/**
 * Adds one vector to running sums (returns new sums).
 * @example addVectorToSums(EMPTY_TENSOR_SUMS, {x: 0, y: 1, z: 0}).yy // 1
 */
export function addVectorToSums(sums: TensorSums, v: Vec3): TensorSums {
  return offsetSums(sums, v, 1);
}

/**
 * Removes one vector from running sums (returns new sums). The vector must have been added
 * before: the sums cannot tell.
 * @example removeVectorFromSums(addVectorToSums(EMPTY_TENSOR_SUMS, v), v).n // 0
 */
export function removeVectorFromSums(sums: TensorSums, v: Vec3): TensorSums {
  return offsetSums(sums, v, -1);
}

/**
 * Adds the vectors at `indices` of an interleaved array to running sums (returns new sums).
 * This is the incremental update a lasso uses when points enter the selection.
 * @example addIndicesToSums(sums, poles, [4, 17, 18])
 */
export function addIndicesToSums(sums: TensorSums, xyz: ArrayLike<number>, indices: ArrayLike<number>): TensorSums {
  return accumulate(sums, xyz, indices, 1);
}

/**
 * Removes the vectors at `indices` of an interleaved array from running sums (returns new
 * sums): the update when points leave a selection. They must have been added before.
 * @example removeIndicesFromSums(sums, poles, [17])
 */
export function removeIndicesFromSums(sums: TensorSums, xyz: ArrayLike<number>, indices: ArrayLike<number>): TensorSums {
  return accumulate(sums, xyz, indices, -1);
}

/**
 * Sums of two disjoint sets together.
 * @example addTensorSums(sumsA, sumsB).n // sumsA.n + sumsB.n
 */
export function addTensorSums(a: TensorSums, b: TensorSums): TensorSums {
  return { xx: a.xx + b.xx, xy: a.xy + b.xy, xz: a.xz + b.xz, yy: a.yy + b.yy, yz: a.yz + b.yz, zz: a.zz + b.zz, n: a.n + b.n };
}

/**
 * Sums of set a without its subset b.
 * @example subtractTensorSums(all, removed)
 */
export function subtractTensorSums(a: TensorSums, b: TensorSums): TensorSums {
  return { xx: a.xx - b.xx, xy: a.xy - b.xy, xz: a.xz - b.xz, yy: a.yy - b.yy, yz: a.yz - b.yz, zz: a.zz - b.zz, n: a.n - b.n };
}

/**
 * The orientation tensor T = sums / n. Throws when n < 1 (no vectors: no tensor).
 * @example tensorFromSums(tensorSumsOfVectors([{x: 1, y: 0, z: 0}, {x: 0, y: 1, z: 0}])) // xx 0.5, yy 0.5
 */
export function tensorFromSums(sums: TensorSums): SymMatrix3 {
  if (!(sums.n >= 1)) throw new RangeError(`orientation tensor: ${sums.n} vectors (expected at least 1)`);
  const k = 1 / sums.n;
  return { xx: sums.xx * k, xy: sums.xy * k, xz: sums.xz * k, yy: sums.yy * k, yz: sums.yz * k, zz: sums.zz * k };
}

/**
 * Orientation tensor T = (1/N)·Σ x xᵀ of unit vectors.
 * @example orientationTensor([{x: 0, y: 0, z: 1}]) // {xx: 0, ..., zz: 1}
 */
export function orientationTensor(vectors: readonly Vec3[]): SymMatrix3 {
  return tensorFromSums(tensorSumsOfVectors(vectors));
}

/**
 * Orientation tensor of interleaved unit vectors [x0, y0, z0, x1, ...] (fast path).
 * @example orientationTensorOfArray(new Float64Array([1, 0, 0, 0, 1, 0])) // xx 0.5, yy 0.5
 */
export function orientationTensorOfArray(xyz: ArrayLike<number>): SymMatrix3 {
  return tensorFromSums(tensorSumsOfArray(xyz));
}

function offsetSums(s: TensorSums, v: Vec3, sign: 1 | -1): TensorSums {
  if (!(Number.isFinite(v.x) && Number.isFinite(v.y) && Number.isFinite(v.z))) {
    throw new RangeError(`vector (${v.x}, ${v.y}, ${v.z}) has a component that is not a finite number`);
  }
  return {
    xx: s.xx + sign * v.x * v.x, xy: s.xy + sign * v.x * v.y, xz: s.xz + sign * v.x * v.z,
    yy: s.yy + sign * v.y * v.y, yz: s.yz + sign * v.y * v.z, zz: s.zz + sign * v.z * v.z,
    n: s.n + sign,
  };
}

function accumulate(start: TensorSums, xyz: ArrayLike<number>, indices: ArrayLike<number> | undefined, sign: 1 | -1): TensorSums {
  if (xyz.length % 3 !== 0) {
    throw new RangeError(`interleaved vectors: length ${xyz.length} is not a multiple of 3 (expected x, y, z per vector)`);
  }
  const count = xyz.length / 3;
  let xx = 0, xy = 0, xz = 0, yy = 0, yz = 0, zz = 0;
  let n: number;
  if (indices === undefined) {
    for (let o = 0; o < xyz.length; o += 3) {
      const x = xyz[o], y = xyz[o + 1], z = xyz[o + 2];
      xx += x * x; xy += x * y; xz += x * z;
      yy += y * y; yz += y * z; zz += z * z;
    }
    n = count;
  } else {
    for (let k = 0; k < indices.length; k++) {
      const i = indices[k];
      // One comparison pair per vector; it also rejects NaN and fractional positions below.
      if (!(i >= 0 && i < count) || i !== Math.floor(i)) {
        throw new RangeError(`indices[${k}]: ${i} is not a vector position (expected an integer from 0 to ${count - 1})`);
      }
      const o = 3 * i;
      const x = xyz[o], y = xyz[o + 1], z = xyz[o + 2];
      xx += x * x; xy += x * y; xz += x * z;
      yy += y * y; yz += y * z; zz += z * z;
    }
    n = indices.length;
  }
  const part = { xx, xy, xz, yy, yz, zz, n };
  if (!sumsAreFinite(part)) throw nonFiniteError(xyz);
  return sign === 1 ? addTensorSums(start, part) : subtractTensorSums(start, part);
}

function sumsAreFinite(s: TensorSums): boolean {
  return Number.isFinite(s.xx + s.xy + s.xz + s.yy + s.yz + s.zz);
}

/** Found only after the fast loop failed, so the check costs nothing on good data. */
function nonFiniteError(xyz: ArrayLike<number>): RangeError {
  for (let o = 0; o < xyz.length; o++) {
    if (!Number.isFinite(xyz[o])) {
      return new RangeError(`interleaved vectors: vector ${Math.floor(o / 3)}, component ${'xyz'[o % 3]} is ${xyz[o]} (expected a finite number)`);
    }
  }
  return new RangeError('interleaved vectors: the sums overflowed (components too large)');
}
