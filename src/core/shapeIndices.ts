/**
 * Shape and strength of a fabric from the eigenvalues S1 >= S2 >= S3 (sum 1) of its
 * orientation tensor.
 *
 * - Woodcock (1977, GSA Bulletin 88, "Specification of fabric shapes using an eigenvalue
 *   method"; from memory): K = ln(S1/S2) / ln(S2/S3) (K < 1 girdles, K > 1 clusters) and
 *   strength C = ln(S1/S3).
 * - Vollmer (1990, GSA Bulletin 102, "An application of eigenvalue methods to structural
 *   domain analysis"; from memory): point P = S1 - S2, girdle G = 2(S2 - S3), random
 *   R = 3·S3, with P + G + R = 1.
 *
 * K and C contain logarithms of ratios that are unbounded when S3 or S2 = S3 reaches zero
 * (every pole on one great circle; a rotationally symmetric cluster). Rather than report
 * Infinity or NaN, such values are `null` and a sentence in `note` says why.
 */

/** Eigenvalues S1 >= S2 >= S3, summing to 1. */
export type Eigenvalues3 = readonly [number, number, number];

/**
 * Eigenvalues below this (after normalising to sum 1) are treated as zero. Sums of up to
 * about 10^6 unit vectors round to near 1e-13, so anything below 1e-10 is rounding, not data.
 * @example woodcockIndices([0.5, 0.5, EIGENVALUE_FLOOR / 2]).C // null
 */
export const EIGENVALUE_FLOOR = 1e-10;

/**
 * Two eigenvalues closer than this relative amount are treated as equal (the ratio's
 * logarithm would be rounding noise).
 * @example woodcockIndices([0.8, 0.1, 0.1 * (1 - EIGENVALUE_TIE / 2)]).K // null
 */
export const EIGENVALUE_TIE = 1e-9;

/** Woodcock (1977) shape K and strength C; `null` where unbounded or undefined, see `note`. */
export interface WoodcockIndices {
  readonly K: number | null;
  readonly C: number | null;
  /** Why K or C is null (or why K is 0 by limit), in words; null when both are ordinary numbers. */
  readonly note: string | null;
}

/** Vollmer (1990) point, girdle and random components, summing to 1. */
export interface VollmerIndices {
  readonly P: number;
  readonly G: number;
  readonly R: number;
}

export type FabricShape = 'cluster' | 'girdle' | 'uniform';
export type FabricStrength = 'weak' | 'moderate' | 'strong' | 'perfect';

/** A plain-words reading of the eigenvalues. */
export interface FabricReading {
  readonly shape: FabricShape;
  /** Strength from Woodcock's C; null for a uniform spread, where it would mean nothing. */
  readonly strength: FabricStrength | null;
  /** One sentence, e.g. "moderate girdle (K = 0.42, C = 2.9)". */
  readonly text: string;
}

/**
 * Sorts eigenvalues largest first, clears rounding negatives (down to -1e-9 of the sum) to 0
 * and divides by their sum. Throws on non-finite values, real negatives or a zero sum.
 * @example normalizeEigenvalues([1, 3, 6]) // [0.6, 0.3, 0.1]
 */
export function normalizeEigenvalues(values: readonly number[]): [number, number, number] {
  if (values.length !== 3) throw new RangeError(`eigenvalues: got ${values.length} values (expected 3)`);
  values.forEach((v, i) => {
    if (!Number.isFinite(v)) throw new RangeError(`eigenvalues[${i}]: ${v} is not a finite number`);
  });
  const sum = values[0] + values[1] + values[2];
  if (!(sum > 0)) throw new RangeError(`eigenvalues: sum ${sum} is not positive (expected a tensor of at least one vector)`);
  const s = [...values].sort((a, b) => b - a).map((v, i) => {
    if (v < -1e-9 * sum) throw new RangeError(`eigenvalues: ${v} is negative (an orientation tensor has none)`);
    return Math.max(v, 0) / sum;
  });
  return [s[0], s[1], s[2]];
}

/**
 * Woodcock (1977) K = ln(S1/S2)/ln(S2/S3) and C = ln(S1/S3), without Infinity or NaN.
 * - S3 below `EIGENVALUE_FLOOR`: C = null (unbounded). K = 0 when S2 is above the floor (the
 *   limit as S3 -> 0: a perfect girdle), null when S2 is also zero (one point: 0/0).
 * - S2 and S3 equal within `EIGENVALUE_TIE`: K = null (unbounded; a rotationally symmetric
 *   cluster, or a uniform spread when S1 is equal too).
 * @example woodcockIndices([0.6, 0.3, 0.1]) // {K: 0.630930, C: 1.791759, note: null}
 */
export function woodcockIndices(values: readonly number[]): WoodcockIndices {
  const [s1, s2, s3] = normalizeEigenvalues(values);
  if (s3 < EIGENVALUE_FLOOR) {
    if (s2 < EIGENVALUE_FLOOR) {
      return { K: null, C: null, note: 'S2 = S3 = 0: every vector is parallel to one line, so K (0/0) and C are undefined' };
    }
    return { K: 0, C: null, note: 'S3 = 0: every vector lies on one great circle, so C is unbounded and K = 0 (its limit)' };
  }
  const C = Math.log(s1 / s3);
  if (s2 - s3 <= EIGENVALUE_TIE * s2) {
    const what = s1 - s3 <= EIGENVALUE_TIE * s1 ? 'S1 = S2 = S3: a uniform spread' : 'S2 = S3: a rotationally symmetric cluster';
    return { K: null, C, note: `${what}, so K is unbounded` };
  }
  return { K: Math.log(s1 / s2) / Math.log(s2 / s3), C, note: null };
}

/**
 * Vollmer (1990) P = S1 - S2, G = 2(S2 - S3), R = 3·S3.
 * @example vollmerIndices([0.6, 0.3, 0.1]) // {P: 0.3, G: 0.4, R: 0.3}
 */
export function vollmerIndices(values: readonly number[]): VollmerIndices {
  const [s1, s2, s3] = normalizeEigenvalues(values);
  return { P: s1 - s2, G: 2 * (s2 - s3), R: 3 * s3 };
}

/**
 * Cut values of Woodcock's C for the strength words. Foldlens's own convention, not a
 * published table: C = 2 is S1 about 7 times S3, C = 4 about 55 times.
 * @example readFabric([0.6, 0.38, 0.02]).strength // 'moderate' (C = 3.4 is between the cuts)
 */
export const STRENGTH_CUTS = Object.freeze({ moderate: 2, strong: 4 });

/**
 * Reads the eigenvalues in plain words. Foldlens convention, built on the two published
 * schemes (the rule itself is our choice, stated here so it can be checked):
 * 1. uniform when Vollmer's random component R is the largest of P, G, R (the data plot
 *    nearest the random corner of Vollmer's triangle);
 * 2. otherwise cluster when Woodcock's K > 1 (or K unbounded), girdle when K <= 1
 *    (K = 1 is Woodcock's dividing line);
 * 3. strength from C: weak below 2, moderate from 2, strong from 4, perfect when C is unbounded.
 * @example readFabric([0.6, 0.3, 0.1]).text // "weak girdle (K = 0.63, C = 1.79)"
 */
export function readFabric(values: readonly number[]): FabricReading {
  const w = woodcockIndices(values);
  const v = vollmerIndices(values);
  if (v.R >= v.P && v.R >= v.G) {
    return { shape: 'uniform', strength: null, text: `uniform spread, no clear preferred orientation (P = ${v.P.toFixed(2)}, G = ${v.G.toFixed(2)}, R = ${v.R.toFixed(2)})` };
  }
  const shape: FabricShape = w.K === null || w.K > 1 ? 'cluster' : 'girdle';
  const strength: FabricStrength =
    w.C === null ? 'perfect' : w.C >= STRENGTH_CUTS.strong ? 'strong' : w.C >= STRENGTH_CUTS.moderate ? 'moderate' : 'weak';
  const k = w.K === null ? 'unbounded' : w.K.toFixed(2);
  const c = w.C === null ? 'unbounded' : w.C.toFixed(2);
  return { shape, strength, text: `${strength} ${shape} (K = ${k}, C = ${c})` };
}
