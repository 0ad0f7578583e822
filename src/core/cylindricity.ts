/**
 * How cylindrical a set of poles is: how far they lie from their best-fit great circle (the
 * girdle) and how much of their spread runs along it. Shared by the fold analysis (its
 * 'poor-girdle-fit' warning) and the consistency check of a domain (consistency/girdleResiduals.ts).
 *
 * With S1 >= S2 >= S3 the eigenvalues of the poles' orientation tensor (sum 1) and e3 the axis,
 * Si = mean of (p·ei)², and the distance of a pole p from the girdle is d = asin|p·e3|, so (derived):
 * - S3 = mean sin²(d): the spread of the poles off the girdle; asin(√S3) is the RMS (in sine)
 *   distance from the girdle, in degrees: `misfit`.
 * - 1 - S1 = S2 + S3 is the spread of the poles away from their mean pole; S2 of it lies along
 *   the girdle and S3 across it. `cylindricity` = S2/(S2 + S3) = 1 - S3/(S2 + S3) is the share of
 *   the spread that lies along the girdle: 1 for poles exactly on a great circle, 0.5 when the
 *   spread has no preferred great circle (a round cluster or a uniform spread).
 * Woodcock (1977) K, C and Vollmer (1990) P, G, R come from shapeIndices.ts. For a conical fold,
 * whose poles lie on a small circle at 90° - δ from the cone axis, every pole lies δ from the
 * best girdle and the misfit is δ (derived). Two cylindrical domains pooled, with axes δ apart
 * and poles spread evenly along each girdle, give a misfit of roughly δ/(2√2) (derived: a pole at
 * angle φ from the line where the girdles cross lies about (δ/2)·|sin φ| off the mean girdle), so
 * axes 20-30° apart give 7-11° on top of the reading scatter. A misfit well above the reading
 * precision is therefore the sign of a non-cylindrical fold or of several domains pooled.
 */
import { fitGirdleToArray } from './girdle';
import { asinClamped, toDegrees } from './math';
import { readFabric, vollmerIndices, woodcockIndices, type FabricReading, type VollmerIndices } from './shapeIndices';

/**
 * Misfit (degrees) up to which poles count as on one great circle; about twice or thrice the
 * reading precision of a compass-clinometer (±2°, common practice), so that honest reading
 * scatter stays below it (Foldlens convention). Above it the fold analysis warns
 * 'poor-girdle-fit'.
 * @example cylindricityOf(poles).misfit <= CYLINDRICAL_MISFIT
 */
export const CYLINDRICAL_MISFIT = 6;
/**
 * Misfit (degrees) up to which a fold counts as nearly cylindrical (Foldlens convention).
 * @example cylindricityOf(poles).misfit <= NEARLY_CYLINDRICAL_MISFIT
 */
export const NEARLY_CYLINDRICAL_MISFIT = 10;
/**
 * Below this cylindricity the poles spread so little along the girdle that the girdle is weakly
 * defined (Foldlens convention).
 * @example cylindricityOf(poles).cylindricity < WEAK_GIRDLE_CYLINDRICITY
 */
export const WEAK_GIRDLE_CYLINDRICITY = 0.9;

/** The class of a set of poles by its misfit and cylindricity. */
export type CylindricityShape = 'cylindrical' | 'cylindrical-weak-girdle' | 'nearly-cylindrical' | 'not-cylindrical';

/** The two cylindricity figures and their class. */
export interface CylindricityFigures {
  /** S2/(S2 + S3), 0.5..1. */
  readonly cylindricity: number;
  /** asin(√S3) in degrees: RMS distance of the poles from the girdle. */
  readonly misfit: number;
  readonly shape: CylindricityShape;
}

/** How cylindrical a set of poles is, with the fabric figures and a reading. */
export interface Cylindricity extends CylindricityFigures {
  readonly n: number;
  readonly eigenvalues: readonly [number, number, number];
  readonly woodcock: { readonly K: number | null; readonly C: number | null };
  readonly vollmer: VollmerIndices;
  readonly fabric: FabricReading;
  /** In words. */
  readonly reading: string;
}

/**
 * Cylindricity and misfit from the eigenvalues S1 >= S2 >= S3 (sum 1) of the poles' orientation
 * tensor, in O(1): the fold analysis already has them.
 * @example cylindricityFigures([0.6, 0.395, 0.005]) // {cylindricity: 0.9875, misfit: 4.05, shape: 'cylindrical'}
 */
export function cylindricityFigures(eigenvalues: readonly [number, number, number]): CylindricityFigures {
  const [, s2, s3] = eigenvalues;
  const spread = s2 + s3;
  const cylindricity = spread > 0 ? s2 / spread : 0.5;
  const misfit = toDegrees(asinClamped(Math.sqrt(Math.max(0, s3))));
  const shape: CylindricityShape =
    misfit <= CYLINDRICAL_MISFIT ? (cylindricity >= WEAK_GIRDLE_CYLINDRICITY ? 'cylindrical' : 'cylindrical-weak-girdle') : misfit <= NEARLY_CYLINDRICAL_MISFIT ? 'nearly-cylindrical' : 'not-cylindrical';
  return { cylindricity, misfit, shape };
}

/**
 * Cylindricity figures of interleaved unit poles [x0, y0, z0, x1, ...] (see the module comment).
 * @example cylindricityOf(poles).misfit // RMS distance from the girdle in degrees
 */
export function cylindricityOf(poles: ArrayLike<number>): Cylindricity {
  const fit = fitGirdleToArray(poles);
  const { cylindricity, misfit, shape } = cylindricityFigures(fit.eigenvalues);
  const wood = woodcockIndices(fit.eigenvalues);
  const fabric = readFabric(fit.eigenvalues);
  const figures = `cylindricity S2/(S2+S3) = ${cylindricity.toFixed(3)}, RMS distance from the girdle ${misfit.toFixed(1)}°`;
  const reading =
    shape === 'cylindrical'
      ? `Cylindrical: the poles lie close to one great circle (${figures}).`
      : shape === 'cylindrical-weak-girdle'
        ? `The poles lie close to one great circle but spread little along it (${figures}), so the girdle, and the axis, are weakly defined: the fold is gentle or only one limb was measured.`
        : shape === 'nearly-cylindrical'
          ? `Nearly cylindrical: the poles scatter somewhat off one great circle (${figures}); look for a curved hinge or two domains pooled.`
          : `Not cylindrical: the poles lie well off any one great circle (${figures}). The fold may be conical or refolded, or the area may hold more than one domain.`;
  return { n: fit.n, eigenvalues: fit.eigenvalues, cylindricity, misfit, woodcock: { K: wood.K, C: wood.C }, vollmer: vollmerIndices(fit.eigenvalues), fabric, shape, reading };
}
