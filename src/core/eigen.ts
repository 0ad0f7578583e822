/**
 * Eigenvalues and eigenvectors of a real symmetric 3 x 3 matrix, such as an orientation
 * tensor.
 *
 * Method: cyclic Jacobi rotations (Jacobi 1846; Golub & Van Loan, *Matrix Computations*,
 * 4th ed., section 8.5, "cyclic Jacobi" with the stable symmetric 2 x 2 Schur step; from
 * memory). Jacobi is chosen over the closed-form cubic because it stays accurate when two
 * or three eigenvalues coincide (a perfect girdle, a perfect cluster, a uniform spread):
 * the eigenvectors it returns are orthonormal to rounding whatever the eigenvalue gaps,
 * where the analytic route loses the vectors of nearly equal roots.
 */
import type { Vec3 } from './types';

/** The six independent entries of a symmetric 3 x 3 matrix (north-east-down axes). */
export interface SymMatrix3 {
  readonly xx: number;
  readonly xy: number;
  readonly xz: number;
  readonly yy: number;
  readonly yz: number;
  readonly zz: number;
}

/** Eigen-decomposition of a symmetric 3 x 3 matrix. */
export interface SymmetricEigen3 {
  /** Eigenvalues, largest first. */
  readonly values: readonly [number, number, number];
  /**
   * Unit eigenvectors in the order of `values`, mutually orthogonal to rounding. Each is
   * given in its lower-hemisphere sense (z > 0; for z = 0, y > 0; for z = y = 0, x > 0)
   * so that the result is deterministic; an eigenvector has no sense of its own.
   */
  readonly vectors: readonly [Vec3, Vec3, Vec3];
}

const FIELDS = ['xx', 'xy', 'xz', 'yy', 'yz', 'zz'] as const;

/** Sweeps allowed; Jacobi on 3 x 3 converges quadratically, in 4 to 6 sweeps as a rule. */
const MAX_SWEEPS = 50;

/**
 * Eigenvalues (largest first) and orthonormal eigenvectors of a symmetric 3 x 3 matrix.
 * Throws a RangeError naming the entry when an entry is not a finite number.
 * @example
 * const { values, vectors } = eigenSymmetric3({ xx: 2, xy: 0, xz: 0, yy: 1, yz: 0, zz: 3 });
 * // values: [3, 2, 1]; vectors[0]: {x: 0, y: 0, z: 1}
 */
export function eigenSymmetric3(m: SymMatrix3): SymmetricEigen3 {
  for (const f of FIELDS) {
    if (!Number.isFinite(m[f])) throw new RangeError(`eigenSymmetric3: entry ${f} is ${String(m[f])} (expected a finite number)`);
  }
  // Work on the matrix divided by its largest entry, so that squares of subnormal or huge
  // entries can neither underflow to 0 nor overflow; the eigenvalues are scaled back at the end.
  const scale = Math.max(Math.abs(m.xx), Math.abs(m.xy), Math.abs(m.xz), Math.abs(m.yy), Math.abs(m.yz), Math.abs(m.zz));
  if (scale === 0) return { values: [0, 0, 0], vectors: [{ x: 1, y: 0, z: 0 }, { x: 0, y: 1, z: 0 }, { x: 0, y: 0, z: 1 }] };
  // Row-major working copy a[3*r + c] and accumulated rotations v (columns = eigenvectors).
  const a = [m.xx, m.xy, m.xz, m.xy, m.yy, m.yz, m.xz, m.yz, m.zz].map((x) => x / scale);
  const v = [1, 0, 0, 0, 1, 0, 0, 0, 1];
  const frob2 = a.reduce((s, x) => s + x * x, 0);

  for (let sweep = 0; sweep < MAX_SWEEPS; sweep++) {
    const off = a[1] * a[1] + a[2] * a[2] + a[5] * a[5];
    // Stop once the off-diagonal part is far below rounding of the diagonal (relative 1e-20).
    if (off === 0 || off <= 1e-40 * frob2) break;
    rotate(a, v, 0, 1);
    rotate(a, v, 0, 2);
    rotate(a, v, 1, 2);
  }

  const order = [0, 1, 2].sort((i, j) => a[4 * j] - a[4 * i]);
  const values = order.map((i) => a[4 * i] * scale) as [number, number, number];
  const vectors = order.map((i) => lowerSense(v[i], v[3 + i], v[6 + i])) as [Vec3, Vec3, Vec3];
  return { values, vectors };
}

/**
 * One Jacobi rotation in the (p, q) plane that zeroes a[p][q]: A <- Jᵀ A J, V <- V J.
 * Rotation angle from the stable form t = sgn(θ) / (|θ| + sqrt(θ² + 1)), θ = (a_qq - a_pp) / (2 a_pq)
 * (Golub & Van Loan, algorithm "sym.schur2"; from memory), which keeps |t| <= 1.
 */
function rotate(a: number[], v: number[], p: number, q: number): void {
  const apq = a[3 * p + q];
  if (apq === 0) return;
  const app = a[4 * p];
  const aqq = a[4 * q];
  const theta = (aqq - app) / (2 * apq);
  // For huge θ, θ² would overflow; t -> 1 / (2θ) is then exact to rounding.
  const t = Math.abs(theta) > 1e150 ? 1 / (2 * theta) : Math.sign(theta || 1) / (Math.abs(theta) + Math.sqrt(theta * theta + 1));
  const c = 1 / Math.sqrt(t * t + 1);
  const s = t * c;
  a[4 * p] = app - t * apq;
  a[4 * q] = aqq + t * apq;
  a[3 * p + q] = 0;
  a[3 * q + p] = 0;
  const r = 3 - p - q; // the third index
  const arp = a[3 * r + p];
  const arq = a[3 * r + q];
  a[3 * r + p] = a[3 * p + r] = c * arp - s * arq;
  a[3 * r + q] = a[3 * q + r] = s * arp + c * arq;
  for (let k = 0; k < 3; k++) {
    const vkp = v[3 * k + p];
    const vkq = v[3 * k + q];
    v[3 * k + p] = c * vkp - s * vkq;
    v[3 * k + q] = s * vkp + c * vkq;
  }
}

/** Sign choice that keeps the components exact (no rounding of near-zero z to zero). */
function lowerSense(x: number, y: number, z: number): Vec3 {
  const flip = z < 0 || (z === 0 && (y < 0 || (y === 0 && x < 0)));
  return flip ? { x: -x || 0, y: -y || 0, z: -z || 0 } : { x, y, z };
}
