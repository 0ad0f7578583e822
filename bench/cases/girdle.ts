/**
 * Girdle fit (orientation tensor and its least eigenvector, the fold axis) for 10^5 poles:
 * the one-pass tensor sums and 3 x 3 Jacobi solver of src/core/girdle.ts against the general
 * route a reader would write with ml-matrix: an n x 3 Matrix, transpose·mmul, and ml-matrix's
 * EigenvalueDecomposition. The check compares the axes and eigenvalues of the two.
 */
import { EigenvalueDecomposition, Matrix } from 'ml-matrix';
import { fitGirdleToArray, type GirdleFit } from '../../src/core/girdle';
import type { BenchCase } from '../harness';
import { foldedPoles } from './data';
import { lazy } from './lazy';

const poles = lazy(() => foldedPoles(100_000, 3));
/** The same poles as an n x 3 array of rows, built untimed (the input ml-matrix takes). */
const rows = lazy(() => {
  const p = poles();
  return Array.from({ length: p.length / 3 }, (_, i) => [p[3 * i], p[3 * i + 1], p[3 * i + 2]]);
});

interface GeneralFit {
  readonly values: number[];
  readonly axis: number[];
}

/** Orientation tensor T = MᵀM / n and its eigen-decomposition through ml-matrix. */
function generalFit(data: number[][]): GeneralFit {
  const m = new Matrix(data);
  const t = m.transpose().mmul(m).div(data.length);
  const evd = new EigenvalueDecomposition(t, { assumeSymmetric: true });
  const values = evd.realEigenvalues;
  const least = values.indexOf(Math.min(...values));
  return { values: [...values].sort((a, b) => b - a), axis: evd.eigenvectorMatrix.getColumn(least) };
}

export const girdleCase: BenchCase = {
  name: 'girdle fit, 10^5 poles',
  unit: 'ms',
  setup: () => void rows(),
  run: () => fitGirdleToArray(poles()),
  baseline: { name: 'ml-matrix tensor + EVD', run: () => generalFit(rows()), warmups: 1, repetitions: 5 },
  budget: { minRatio: 20 },
  check: (fast, general) => {
    const f = fast as GirdleFit;
    const g = general as GeneralFit;
    const v = f.axisVector;
    const [gx, gy, gz] = g.axis;
    // atan2(|v × g|, |v · g|): acos of a cosine near 1 cannot resolve angles below about 1e-8 rad.
    const sin = Math.hypot(v.y * gz - v.z * gy, v.z * gx - v.x * gz, v.x * gy - v.y * gx);
    const angle = (Math.atan2(sin, Math.abs(v.x * gx + v.y * gy + v.z * gz)) * 180) / Math.PI;
    if (!(angle < 1e-9)) return `axes differ by ${angle}°`;
    for (let i = 0; i < 3; i++) {
      if (!(Math.abs(f.eigenvalues[i] - g.values[i]) < 1e-9)) return `eigenvalue ${i + 1}: ${f.eigenvalues[i]} against ${g.values[i]}`;
    }
    return undefined;
  },
};
