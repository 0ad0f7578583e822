import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import { Matrix } from 'ml-matrix';
import {
  EMPTY_TENSOR_SUMS,
  addIndicesToSums,
  addTensorSums,
  addVectorToSums,
  orientationTensor,
  orientationTensorOfArray,
  removeIndicesFromSums,
  removeVectorFromSums,
  subtractTensorSums,
  tensorFromSums,
  tensorSumsOfArray,
  tensorSumsOfVectors,
  type TensorSums,
} from '../../src/core/orientationTensor';
import { createRandom } from '../../src/core/random';
import type { Vec3 } from '../../src/core/types';
import { expectDeepClose } from '../helpers/tolerance';

function randomUnitVectors(n: number, seed: number): Vec3[] {
  const rng = createRandom(seed);
  const out: Vec3[] = [];
  while (out.length < n) {
    const x = 2 * rng.next() - 1, y = 2 * rng.next() - 1, z = 2 * rng.next() - 1;
    const r = Math.hypot(x, y, z);
    if (r > 0.1 && r <= 1) out.push({ x: x / r, y: y / r, z: z / r });
  }
  return out;
}

const interleave = (vs: readonly Vec3[]): Float64Array => Float64Array.from(vs.flatMap((v) => [v.x, v.y, v.z]));
const sumsAsList = (s: TensorSums) => [s.xx, s.xy, s.xz, s.yy, s.yz, s.zz, s.n];

describe('orientationTensor', () => {
  it('orientationTensor(vectors) equals XᵀX/N computed with ml-matrix for 500 random unit vectors', () => {
    const vs = randomUnitVectors(500, 1);
    const X = new Matrix(vs.map((v) => [v.x, v.y, v.z]));
    // Reference: general-purpose matrix product from ml-matrix.
    const ref = X.transpose().mmul(X).div(vs.length);
    const T = orientationTensor(vs);
    expectDeepClose([T.xx, T.xy, T.xz, T.yy, T.yz, T.zz], [ref.get(0, 0), ref.get(0, 1), ref.get(0, 2), ref.get(1, 1), ref.get(1, 2), ref.get(2, 2)], 1e-14);
  });

  it('orientationTensorOfArray(xyz) equals orientationTensor(vectors) and has trace 1 for unit vectors', () => {
    const vs = randomUnitVectors(300, 2);
    const a = orientationTensorOfArray(interleave(vs));
    const b = orientationTensor(vs);
    expectDeepClose(a, b, 1e-15);
    expectDeepClose(a.xx + a.yy + a.zz, 1, 1e-14);
  });

  it('tensorSumsOfVectors gives the same sums for x and -x (axial data need no sense)', () => {
    const vs = randomUnitVectors(50, 3);
    const flipped = vs.map((v, i) => (i % 2 ? { x: -v.x, y: -v.y, z: -v.z } : v));
    expectDeepClose(sumsAsList(tensorSumsOfVectors(flipped)), sumsAsList(tensorSumsOfVectors(vs)), 1e-13);
  });

  it('tensorSumsOfArray(xyz, indices) sums only the listed vectors, counting repeats again', () => {
    const vs = randomUnitVectors(20, 4);
    const indices = [3, 7, 7, 19];
    expectDeepClose(sumsAsList(tensorSumsOfArray(interleave(vs), indices)), sumsAsList(tensorSumsOfVectors(indices.map((i) => vs[i]))), 1e-14);
  });

  it('addIndicesToSums / removeIndicesFromSums track any sequence of selection changes like a fresh sum (property)', () => {
    const vs = randomUnitVectors(200, 5);
    const xyz = interleave(vs);
    fc.assert(
      fc.property(fc.array(fc.array(fc.integer({ min: 0, max: 199 }), { maxLength: 40 }), { maxLength: 12 }), (steps) => {
        let sums = EMPTY_TENSOR_SUMS;
        const selected = new Set<number>();
        for (const step of steps) {
          // Toggle each index of the step: selected ones leave, others enter (a lasso redraw).
          const uniq = [...new Set(step)];
          const leaving = uniq.filter((i) => selected.has(i));
          const entering = uniq.filter((i) => !selected.has(i));
          sums = removeIndicesFromSums(addIndicesToSums(sums, xyz, entering), xyz, leaving);
          leaving.forEach((i) => selected.delete(i));
          entering.forEach((i) => selected.add(i));
        }
        const fresh = tensorSumsOfArray(xyz, [...selected]);
        expectDeepClose(sumsAsList(sums), sumsAsList(fresh), 1e-12);
      }),
      { numRuns: 200, seed: 7 },
    );
  });

  it('addVectorToSums then removeVectorFromSums returns to the starting sums', () => {
    const [a, b] = randomUnitVectors(2, 6);
    const start = addVectorToSums(EMPTY_TENSOR_SUMS, a);
    expectDeepClose(sumsAsList(removeVectorFromSums(addVectorToSums(start, b), b)), sumsAsList(start), 1e-15);
  });

  it('addTensorSums and subtractTensorSums combine disjoint sets', () => {
    const vs = randomUnitVectors(30, 8);
    const left = tensorSumsOfVectors(vs.slice(0, 10));
    const right = tensorSumsOfVectors(vs.slice(10));
    const all = tensorSumsOfVectors(vs);
    expectDeepClose(sumsAsList(addTensorSums(left, right)), sumsAsList(all), 1e-13);
    expectDeepClose(sumsAsList(subtractTensorSums(all, left)), sumsAsList(right), 1e-13);
  });

  it('tensorFromSums of no vectors throws, naming the count', () => {
    expect(() => tensorFromSums(EMPTY_TENSOR_SUMS)).toThrow(/0 vectors \(expected at least 1\)/);
  });

  it('tensorSumsOfArray rejects a ragged array, a bad index and a non-finite component with messages that name them', () => {
    expect(() => tensorSumsOfArray(new Float64Array(4))).toThrow(/length 4 is not a multiple of 3/);
    expect(() => tensorSumsOfArray(new Float64Array(6), [0, 2])).toThrow(/indices\[1\]: 2 is not a vector position/);
    expect(() => tensorSumsOfArray(new Float64Array(6), [0.5])).toThrow(/indices\[0\]: 0.5/);
    expect(() => tensorSumsOfArray(new Float64Array([0, 0, 1, 0, Number.NaN, 0]))).toThrow(/vector 1, component y is NaN/);
    expect(() => tensorSumsOfVectors([{ x: 1, y: 0, z: 0 }, { x: Infinity, y: 0, z: 0 }])).toThrow(/vector 1/);
  });
});
