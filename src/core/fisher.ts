/**
 * Fisher (1953, "Dispersion on a sphere", Proc. R. Soc. Lond. A 217, 295-305) statistics of
 * a set of directions: mean direction, resultant length R, precision estimate
 * kappa = (N - 1)/(N - R) and the 95% cone of confidence alpha95 about the mean,
 *   cos(alpha95) = 1 - ((N - R)/R)·((1/p)^(1/(N - 1)) - 1),  p = 0.05
 * (formula from memory; the same form is printed in the documentation of the R package
 * RFOC, function alpha95, after Davis 2002, *Statistics and Data Analysis in Geology*).
 *
 * Lines (lineations, hinges, poles) have no sense. For them (`axial: true`) each vector is
 * first turned to lie within 90° of the principal eigenvector of the sample's orientation
 * tensor, and then the vectors are summed: the tensor's principal axis does not depend on
 * the senses given, so the result is the same whichever end of each line was recorded.
 */
import { acosClamped, toDegrees } from './math';
import { eigenSymmetric3 } from './eigen';
import { tensorFromSums, tensorSumsOfVectors } from './orientationTensor';
import { lineToVector, vectorToLine } from './vectors';
import type { Line, Vec3 } from './types';

/** Fisher statistics; fields that cannot be computed are null and `notes` says why. */
export interface FisherStatistics {
  /** Number of directions used. */
  readonly n: number;
  /** Mean direction as a line (lower hemisphere), null when undefined. */
  readonly mean: Line | null;
  /** Mean unit vector (for axial data, in the lower hemisphere), null when undefined. */
  readonly meanVector: Vec3 | null;
  /** Length of the resultant of the unit vectors, 0..n. */
  readonly R: number;
  /** Precision estimate (N - 1)/(N - R); null for N < 2 or when all directions coincide (unbounded). */
  readonly kappa: number | null;
  /** Half-angle of the cone of confidence in degrees; null for N < 2 or when the cone is undefined. */
  readonly alpha95: number | null;
  /** Sentences explaining null fields. */
  readonly notes: readonly string[];
}

/** Options for `fisherStatistics`. */
export interface FisherOptions {
  /** Treat the vectors as lines without sense (default true: Foldlens measures lines). */
  readonly axial?: boolean;
  /** Probability outside the cone (default 0.05, giving alpha95). */
  readonly p?: number;
}

/**
 * Fisher (1953) statistics of unit vectors. Throws a RangeError naming the vector when a
 * component is not finite or a vector has zero length.
 * @example
 * fisherStatistics([v1, v2, v3]).alpha95 // cone half-angle in degrees
 */
export function fisherStatistics(vectors: readonly Vec3[], options: FisherOptions = {}): FisherStatistics {
  const axial = options.axial ?? true;
  const p = options.p ?? 0.05;
  if (!(p > 0 && p < 1)) throw new RangeError(`fisherStatistics: p = ${p} (expected a probability between 0 and 1)`);
  const n = vectors.length;
  const units = vectors.map((v, i) => {
    const len = Math.hypot(v.x, v.y, v.z);
    if (!Number.isFinite(len) || len === 0) {
      throw new RangeError(`vector ${i}: (${v.x}, ${v.y}, ${v.z}) is not a direction (expected a finite, non-zero vector)`);
    }
    return { x: v.x / len, y: v.y / len, z: v.z / len };
  });
  if (n === 0) return { n, mean: null, meanVector: null, R: 0, kappa: null, alpha95: null, notes: ['no directions given'] };

  // Axial data: orient every vector towards the principal eigenvector before summing.
  const ref = axial ? eigenSymmetric3(tensorFromSums(tensorSumsOfVectors(units))).vectors[0] : null;
  let sx = 0, sy = 0, sz = 0;
  for (const u of units) {
    const s = ref && u.x * ref.x + u.y * ref.y + u.z * ref.z < 0 ? -1 : 1;
    sx += s * u.x; sy += s * u.y; sz += s * u.z;
  }
  const R = Math.min(Math.hypot(sx, sy, sz), n);
  const notes: string[] = [];

  let meanVector: Vec3 | null = null;
  if (R > 1e-12 * n) {
    meanVector = { x: sx / R, y: sy / R, z: sz / R };
    if (axial && meanVector.z < 0) meanVector = { x: -meanVector.x, y: -meanVector.y, z: -meanVector.z };
  } else {
    notes.push('the directions cancel out (R = 0), so there is no mean direction');
  }
  const mean = meanVector ? vectorToLine(meanVector) : null;

  if (n < 2) {
    notes.push('kappa and alpha95 need at least 2 directions');
    return { n, mean, meanVector, R, kappa: null, alpha95: null, notes };
  }
  const spread = n - R;
  let kappa: number | null = null;
  let alpha95: number | null = null;
  if (spread <= 1e-12 * n) {
    notes.push('all directions coincide, so kappa is unbounded and alpha95 is 0');
    alpha95 = 0;
  } else {
    kappa = (n - 1) / spread;
    const cosA = 1 - (spread / R) * (Math.pow(1 / p, 1 / (n - 1)) - 1);
    if (meanVector === null || cosA < -1) {
      notes.push('the directions are too dispersed for a cone of confidence');
    } else {
      alpha95 = toDegrees(acosClamped(cosA));
      if (axial && alpha95 > 90) {
        notes.push(`the cone of confidence (${alpha95.toFixed(1)}°) is wider than 90°, which means nothing for lines`);
        alpha95 = null;
      }
    }
  }
  return { n, mean, meanVector, R, kappa, alpha95, notes };
}

/**
 * Fisher (1953) statistics of lines given as trend/plunge, treated as axes.
 * Throws a RangeError naming the row when a trend or plunge is out of range.
 * @example
 * fisherLines([{trend: 10, plunge: 40}, {trend: 20, plunge: 45}, {trend: 15, plunge: 50}]).mean
 * // about {trend: 15, plunge: 45}
 */
export function fisherLines(lines: readonly Line[], options: Omit<FisherOptions, 'axial'> = {}): FisherStatistics {
  assertLines(lines);
  return fisherStatistics(lines.map(lineToVector), { ...options, axial: true });
}

/**
 * Checks that every line has a finite trend and a plunge from 0 to 90; throws a RangeError
 * naming the first bad row and field otherwise. `label` names the array in messages.
 * @example assertLines([{trend: 10, plunge: -5}]) // throws "lines[0].plunge: -5 is not a plunge (expected 0 to 90)"
 */
export function assertLines(lines: readonly Line[], label = 'lines'): void {
  lines.forEach((l, i) => {
    if (l === null || typeof l !== 'object') throw new RangeError(`${label}[${i}]: ${String(l)} is not a line (expected {trend, plunge})`);
    if (typeof l.trend !== 'number' || !Number.isFinite(l.trend)) {
      throw new RangeError(`${label}[${i}].trend: ${String(l.trend)} is not a trend (expected a finite azimuth in degrees)`);
    }
    if (typeof l.plunge !== 'number' || !(l.plunge >= 0 && l.plunge <= 90)) {
      throw new RangeError(`${label}[${i}].plunge: ${String(l.plunge)} is not a plunge (expected 0 to 90)`);
    }
  });
}
