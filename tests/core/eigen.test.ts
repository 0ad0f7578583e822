import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import { EigenvalueDecomposition, Matrix } from 'ml-matrix';
import { eigenSymmetric3, type SymMatrix3 } from '../../src/core/eigen';
import { expectClose } from '../helpers/tolerance';

type M3 = number[][];

const toRows = (m: SymMatrix3): M3 => [
  [m.xx, m.xy, m.xz],
  [m.xy, m.yy, m.yz],
  [m.xz, m.yz, m.zz],
];

/** Reference decomposition from ml-matrix (JAMA's tred2/tql2), eigenvalues largest first. */
function reference(m: SymMatrix3): { values: number[]; vectors: number[][] } {
  const evd = new EigenvalueDecomposition(new Matrix(toRows(m)), { assumeSymmetric: true });
  const V = evd.eigenvectorMatrix;
  const pairs = evd.realEigenvalues.map((value, k) => ({ value, vector: [V.get(0, k), V.get(1, k), V.get(2, k)] }));
  pairs.sort((a, b) => b.value - a.value);
  return { values: pairs.map((p) => p.value), vectors: pairs.map((p) => p.vector) };
}

/** R·diag(d)·Rᵀ for the rotation of a unit quaternion (w, x, y, z). */
function rotated(q: number[], d: number[]): SymMatrix3 {
  const [w, x, y, z] = q;
  const R = [
    [1 - 2 * (y * y + z * z), 2 * (x * y - w * z), 2 * (x * z + w * y)],
    [2 * (x * y + w * z), 1 - 2 * (x * x + z * z), 2 * (y * z - w * x)],
    [2 * (x * z - w * y), 2 * (y * z + w * x), 1 - 2 * (x * x + y * y)],
  ];
  const e = (i: number, j: number) => R[i][0] * d[0] * R[j][0] + R[i][1] * d[1] * R[j][1] + R[i][2] * d[2] * R[j][2];
  return flush({ xx: e(0, 0), xy: e(0, 1), xz: e(0, 2), yy: e(1, 1), yz: e(1, 2), zz: e(2, 2) });
}

/**
 * ml-matrix squares entries inside tred2/tql2: subnormal entries make it throw a TypeError, and
 * entries 1e10 times smaller than the largest can underflow there. So the reference comparisons
 * flush entries below 1e-100 to zero; tiny and subnormal inputs are tested on their own below.
 */
function flush(m: SymMatrix3): SymMatrix3 {
  const f = (x: number) => (Math.abs(x) < 1e-100 ? 0 : x);
  return { xx: f(m.xx), xy: f(m.xy), xz: f(m.xz), yy: f(m.yy), yz: f(m.yz), zz: f(m.zz) };
}

const projector = (vs: number[][]): M3 =>
  [0, 1, 2].map((i) => [0, 1, 2].map((j) => vs.reduce((s, v) => s + v[i] * v[j], 0)));

/** Compares with ml-matrix: eigenvalues to 1e-10 of the largest |eigenvalue|, eigenvectors up to sign,
 *  or, for eigenvalues closer than 1e-6 (relative), the subspace they span. */
function expectMatchesReference(m: SymMatrix3): void {
  const ours = eigenSymmetric3(m);
  const ref = reference(m);
  const scale = Math.max(...ref.values.map(Math.abs), 1e-300);
  ours.values.forEach((v, k) => expectClose(v, ref.values[k], 1e-10 * scale, `eigenvalue ${k}`));
  // Group eigenvalues into clusters of (nearly) equal values.
  const groups: number[][] = [];
  for (let k = 0; k < 3; k++) {
    const last = groups[groups.length - 1];
    if (last && Math.abs(ref.values[last[last.length - 1]] - ref.values[k]) <= 1e-6 * scale) last.push(k);
    else groups.push([k]);
  }
  const oursV = ours.vectors.map((v) => [v.x, v.y, v.z]);
  for (const g of groups) {
    const P = projector(g.map((k) => oursV[k]));
    const Q = projector(g.map((k) => ref.vectors[k]));
    for (let i = 0; i < 3; i++) for (let j = 0; j < 3; j++) expectClose(P[i][j], Q[i][j], 1e-8, `projector of eigenvectors ${g.join(',')}`);
  }
  // Orthonormality and residual of our own vectors.
  const A = toRows(m);
  for (let k = 0; k < 3; k++) {
    for (let l = 0; l < 3; l++) {
      const d = oursV[k][0] * oursV[l][0] + oursV[k][1] * oursV[l][1] + oursV[k][2] * oursV[l][2];
      expectClose(d, k === l ? 1 : 0, 1e-13, `v${k}·v${l}`);
    }
    for (let i = 0; i < 3; i++) {
      const Av = A[i][0] * oursV[k][0] + A[i][1] * oursV[k][1] + A[i][2] * oursV[k][2];
      expectClose(Av, ours.values[k] * oursV[k][i], 1e-13 * scale, `(A v - λ v)[${i}] for eigenpair ${k}`);
    }
  }
}

const entry = fc.double({ min: -10, max: 10, noNaN: true, noDefaultInfinity: true });
const quaternion = fc
  .tuple(fc.double({ min: -1, max: 1, noNaN: true }), fc.double({ min: -1, max: 1, noNaN: true }), fc.double({ min: -1, max: 1, noNaN: true }), fc.double({ min: -1, max: 1, noNaN: true }))
  .filter((q) => Math.hypot(...q) > 0.1)
  .map((q) => {
    const n = Math.hypot(...q);
    return q.map((c) => c / n);
  });

describe('eigenSymmetric3', () => {
  it('eigenSymmetric3 of a diagonal matrix returns its entries largest first with the axes as vectors', () => {
    const { values, vectors } = eigenSymmetric3({ xx: 2, xy: 0, xz: 0, yy: 1, yz: 0, zz: 3 });
    expect(values).toEqual([3, 2, 1]);
    expect(vectors).toEqual([{ x: 0, y: 0, z: 1 }, { x: 1, y: 0, z: 0 }, { x: 0, y: 1, z: 0 }]);
  });

  it('eigenSymmetric3 matches ml-matrix on 3000 random symmetric matrices (values to 1e-10, vectors up to sign)', () => {
    fc.assert(
      fc.property(fc.tuple(entry, entry, entry, entry, entry, entry), ([xx, xy, xz, yy, yz, zz]) => {
        expectMatchesReference(flush({ xx, xy, xz, yy, yz, zz }));
      }),
      { numRuns: 3000, seed: 11 },
    );
  });

  it('eigenSymmetric3 matches ml-matrix on 2000 near-degenerate matrices R·diag(a, a + 1e-9, b)·Rᵀ (subspace of the close pair)', () => {
    fc.assert(
      fc.property(quaternion, fc.double({ min: -5, max: 5, noNaN: true }), fc.double({ min: 0.1, max: 5, noNaN: true }), fc.boolean(), (q, a, gap, below) => {
        const b = below ? a - gap : a + gap;
        expectMatchesReference(rotated(q, [a, a + 1e-9, b]));
      }),
      { numRuns: 2000, seed: 12 },
    );
  });

  it('eigenSymmetric3 matches ml-matrix on exactly repeated and triple eigenvalues R·diag(a, a, b)·Rᵀ and R·diag(a, a, a)·Rᵀ', () => {
    fc.assert(
      fc.property(quaternion, fc.double({ min: -5, max: 5, noNaN: true }), fc.double({ min: -5, max: 5, noNaN: true }), (q, a, b) => {
        expectMatchesReference(rotated(q, [a, a, b]));
        expectMatchesReference(rotated(q, [a, a, a]));
      }),
      { numRuns: 1000, seed: 13 },
    );
  });

  it('eigenSymmetric3 matches ml-matrix on orientation-tensor-like matrices with a tiny least eigenvalue', () => {
    fc.assert(
      fc.property(quaternion, fc.double({ min: 0.34, max: 1, noNaN: true }), fc.double({ min: 0, max: 1e-12, noNaN: true }), (q, s1, s3) => {
        const s2 = Math.max(0, 1 - s1 - s3);
        expectMatchesReference(rotated(q, [s1, s2, s3]));
      }),
      { numRuns: 1000, seed: 14 },
    );
  });

  it('eigenSymmetric3 of the zero matrix returns zeros and the coordinate axes', () => {
    const { values, vectors } = eigenSymmetric3({ xx: 0, xy: 0, xz: 0, yy: 0, yz: 0, zz: 0 });
    expect(values).toEqual([0, 0, 0]);
    expect(vectors).toEqual([{ x: 1, y: 0, z: 0 }, { x: 0, y: 1, z: 0 }, { x: 0, y: 0, z: 1 }]);
  });

  it('eigenSymmetric3 handles entries of very different magnitude (1e-150 to 1e150) like ml-matrix', () => {
    for (const s of [1e-150, 1e-20, 1e20, 1e150]) {
      expectMatchesReference({ xx: 3 * s, xy: s, xz: 0.5 * s, yy: 2 * s, yz: 0.25 * s, zz: s });
    }
  });

  it('eigenSymmetric3 of a matrix with subnormal entries d gives d, 0, -d (analytic: [[0,0,0],[0,0,d],[0,d,0]])', () => {
    const d = 1e-313;
    const { values, vectors } = eigenSymmetric3({ xx: 0, xy: 0, xz: 0, yy: 0, yz: d, zz: 0 });
    expect(values).toEqual([d, 0, -d]);
    expectClose(Math.abs(vectors[0].y), Math.SQRT1_2, 1e-12, 'first eigenvector y');
    expectClose(Math.abs(vectors[1].x), 1, 1e-12, 'second eigenvector x');
  });

  it('eigenSymmetric3 gives eigenvectors in the lower hemisphere (z >= 0)', () => {
    const { vectors } = eigenSymmetric3({ xx: 1, xy: 0.3, xz: -0.4, yy: 2, yz: 0.7, zz: 0.5 });
    for (const v of vectors) expect(v.z).toBeGreaterThanOrEqual(0);
  });

  it('eigenSymmetric3 throws a RangeError naming a non-finite entry', () => {
    expect(() => eigenSymmetric3({ xx: 1, xy: Number.NaN, xz: 0, yy: 1, yz: 0, zz: 1 })).toThrow(/entry xy is NaN/);
    expect(() => eigenSymmetric3({ xx: 1, xy: 0, xz: 0, yy: 1, yz: 0, zz: Infinity })).toThrow(/entry zz is Infinity/);
  });
});
