/**
 * Fold analysis of a set of planes (and optionally lines): the pi axis from the best-fit
 * girdle of the poles, the fabric shape and strength, a bootstrap cone about the axis, the
 * beta axis from pairwise intersections, and Fisher statistics of measured lines with their
 * angle to the axis. The result is a plain JSON-friendly object with no NaN or Infinity in
 * it: what cannot be computed is null, and `warnings` says why in words.
 *
 * Results are aids to interpretation; users should defer to local codes and licensed
 * professional practice.
 */
import { axialAngle, lineToVector, poleOf, vectorToLine } from './vectors';
import { acosClamped, toDegrees } from './math';
import { assertPlanes, fitGirdleFromSums, type GirdleFit } from './girdle';
import { tensorSumsOfArray } from './orientationTensor';
import { readFabric, vollmerIndices, woodcockIndices, type FabricReading, type VollmerIndices } from './shapeIndices';
import { bootstrapAxisCone, BOOTSTRAP_DEFAULTS } from './bootstrap';
import { betaAxisOfNormals, BETA_DEFAULTS } from './betaAxis';
import { assertLines, fisherLines } from './fisher';
import { CYLINDRICAL_MISFIT, cylindricityFigures, type CylindricityFigures } from './cylindricity';
import type { Line, Plane, PlaneMeasurement, Vec3 } from './types';

/** What to analyse. */
export interface FoldAnalysisInput {
  readonly planes: readonly PlaneMeasurement[];
  /** Measured lines (hinges, intersection lineations) to compare with the axis. */
  readonly lines?: readonly Line[];
}

/** Options for `analyzeFold`. */
export interface FoldAnalysisOptions {
  /** Bootstrap resamples for the cone about the axis (default 500; 0 skips the cone, e.g. while a lasso is being drawn). */
  readonly bootstrap?: number;
  /** Seed for the bootstrap and for sampled beta pairs (default 1). */
  readonly seed?: number;
}

export type FoldWarningCode =
  | 'no-planes'
  | 'few-planes'
  | 'parallel-planes'
  | 'nearly-parallel-planes'
  | 'axis-undefined'
  | 'cluster-not-girdle'
  | 'uniform-spread'
  | 'wide-cone'
  | 'poor-girdle-fit'
  | 'beta-undefined'
  | 'few-lines';

/** A warning with a stable code and a sentence for people. */
export interface FoldWarning {
  readonly code: FoldWarningCode;
  readonly message: string;
}

/** Fisher statistics of the measured lines and their angle to the fold axis. */
export interface FoldLineSummary {
  readonly n: number;
  readonly mean: Line | null;
  readonly alpha95: number | null;
  readonly kappa: number | null;
  readonly R: number;
  /** Angle in degrees (0..90) between the mean line and the fold axis; null when either is undefined. */
  readonly angleToAxis: number | null;
}

/** Result of `analyzeFold`; JSON-friendly, never NaN or Infinity. */
export interface FoldAnalysis {
  /** Planes used. */
  readonly n: number;
  /** Fold (pi) axis, lower hemisphere; null when undefined (see warnings). */
  readonly axis: Line | null;
  /** The girdle plane (pole = axis); null with the axis. */
  readonly girdle: Plane | null;
  /** S1 >= S2 >= S3 of the poles' orientation tensor, summing to 1; null without planes. */
  readonly eigenvalues: readonly [number, number, number] | null;
  /** Eigenvectors as lower-hemisphere lines, in the order of the eigenvalues; null without planes. */
  readonly eigenvectors: readonly [Line, Line, Line] | null;
  /** Woodcock (1977) K and C; null entries where unbounded (see shapeIndices.ts). */
  readonly woodcock: { readonly K: number | null; readonly C: number | null } | null;
  /** Vollmer (1990) P, G, R. */
  readonly vollmer: VollmerIndices | null;
  /** Shape and strength of the pole fabric. */
  readonly fabric: FabricReading | null;
  /** The result in one or two plain sentences. */
  readonly reading: string;
  /**
   * How well one great circle fits the poles (cylindricity.ts): `misfit`, the RMS angular
   * distance of the poles from the girdle in degrees (asin √S3), `cylindricity` = S2/(S2 + S3),
   * and their class. Null without a defined axis.
   */
  readonly cylindricity: CylindricityFigures | null;
  /** Bootstrap 95% cone half-angle about the axis in degrees; null when not computed or undefined. */
  readonly cone95: number | null;
  /** Beta axis (axial mean of pairwise intersections); null when undefined. */
  readonly beta: Line | null;
  /** Present when `lines` were given. */
  readonly lines?: FoldLineSummary;
  readonly warnings: readonly FoldWarning[];
  /** What was computed and how, in words. */
  readonly method: string;
}

/**
 * Poles all within this many degrees of their mean are parallel within reading precision
 * (about ±2°, common practice), and earn the 'nearly-parallel-planes' warning.
 * @example analyzeFold({ planes: [{dipDirection: 100, dip: 30}, {dipDirection: 101, dip: 30.5}, {dipDirection: 100, dip: 31}] }).warnings
 */
export const PARALLEL_SPREAD_DEGREES = 2;

/**
 * A cone wider than this (degrees) earns the 'wide-cone' warning: the axis is then poorly
 * constrained (Foldlens convention).
 * @example result.cone95 !== null && result.cone95 > WIDE_CONE_DEGREES
 */
export const WIDE_CONE_DEGREES = 20;

/** S1 above 1 - this means every pole is on one line (all planes parallel). */
const PARALLEL_S1 = 1e-9;

const DEFER = 'Results are aids to interpretation; defer to local codes and licensed professional practice.';

/**
 * Analyses folded planes: the pi axis, fabric shape, bootstrap cone, beta axis and, when
 * lines are given, their Fisher mean and angle to the axis. Throws a RangeError naming the
 * row and field of the first bad plane or line.
 * @example
 * const result = analyzeFold({ planes: [{dipDirection: 120, dip: 40}, {dipDirection: 240, dip: 40}, {dipDirection: 180, dip: 25}] });
 * result.axis // about {trend: 180, plunge: 22.8}
 */
export function analyzeFold(input: FoldAnalysisInput, options: FoldAnalysisOptions = {}): FoldAnalysis {
  if (input === null || typeof input !== 'object' || !Array.isArray(input.planes)) {
    throw new RangeError('analyzeFold: input.planes is missing (expected an array of {dipDirection, dip})');
  }
  assertPlanes(input.planes, 'planes');
  if (input.lines !== undefined) {
    if (!Array.isArray(input.lines)) throw new RangeError('analyzeFold: input.lines is not an array (expected {trend, plunge} rows)');
    assertLines(input.lines, 'lines');
  }
  const poles = new Float64Array(input.planes.length * 3);
  input.planes.forEach((p, i) => {
    const v = lineToVector(poleOf(p));
    poles[3 * i] = v.x; poles[3 * i + 1] = v.y; poles[3 * i + 2] = v.z;
  });
  return analyzeFoldPoles(poles, { ...options, lines: input.lines });
}

/**
 * `analyzeFold` on interleaved unit poles [x0, y0, z0, x1, ...] (the fast path for a live
 * selection; pass `bootstrap: 0` while the selection is changing).
 * @example analyzeFoldPoles(poles, { bootstrap: 0 }).axis
 */
export function analyzeFoldPoles(poles: ArrayLike<number>, options: FoldAnalysisOptions & { readonly lines?: readonly Line[] } = {}): FoldAnalysis {
  const samples = options.bootstrap ?? BOOTSTRAP_DEFAULTS.samples;
  const seed = options.seed ?? BOOTSTRAP_DEFAULTS.seed;
  if (!(Number.isInteger(samples) && samples >= 0)) throw new RangeError(`analyzeFold bootstrap: ${samples} (expected a whole number of resamples, 0 to skip)`);
  if (!Number.isInteger(seed)) throw new RangeError(`analyzeFold seed: ${seed} (expected a whole number)`);

  if (poles.length % 3 !== 0) throw new RangeError(`analyzeFold poles: length ${poles.length} is not a multiple of 3 (expected x, y, z per pole)`);
  const n = poles.length / 3;
  const warnings: FoldWarning[] = [];

  if (n === 0) {
    warnings.push({ code: 'no-planes', message: 'No planes were given, so there is no girdle and no fold axis.' });
    const linesSummary = options.lines === undefined ? undefined : summarizeLines(options.lines, null, warnings);
    return {
      n, axis: null, girdle: null, eigenvalues: null, eigenvectors: null, woodcock: null, vollmer: null, fabric: null,
      reading: 'No planes to analyse.', cylindricity: null, cone95: null, beta: null, ...(linesSummary && { lines: linesSummary }), warnings,
      method: methodText(0, samples, seed, null),
    };
  }

  const fit = fitGirdleFromSums(tensorSumsOfArray(poles));
  const [s1] = fit.eigenvalues;
  const woodcock = woodcockIndices(fit.eigenvalues);
  const vollmer = vollmerIndices(fit.eigenvalues);
  const fabric = readFabric(fit.eigenvalues);
  const parallel = s1 > 1 - PARALLEL_S1;

  if (n < 3) {
    warnings.push({
      code: 'few-planes',
      message: `Only ${n} plane${n === 1 ? '' : 's'}: at least 3 are needed to test whether the poles form a girdle; with 2, the axis is simply their intersection.`,
    });
  }
  let axisDefined = fit.axisDefined;
  if (parallel) {
    axisDefined = false;
    warnings.push({
      code: 'parallel-planes',
      message: 'All planes are parallel (their poles coincide), so they define no fold axis: any line in the planes would fit.',
    });
  } else if (!fit.axisDefined) {
    warnings.push({
      code: 'axis-undefined',
      message: 'The two smaller eigenvalues are equal (S2 = S3), so the direction of least pole density is not unique and the axis is undefined.',
    });
  } else {
    const spread = maxSpreadDegrees(poles, fit);
    if (spread < PARALLEL_SPREAD_DEGREES) {
      warnings.push({
        code: 'nearly-parallel-planes',
        message: `All poles lie within ${spread.toFixed(2)}° of their mean, inside the reading precision of about ${PARALLEL_SPREAD_DEGREES}°, so the axis reported is not constrained by the data.`,
      });
    }
  }
  if (!parallel && fabric.shape === 'uniform') {
    warnings.push({ code: 'uniform-spread', message: `The poles are spread almost uniformly (${fabric.text}); they do not outline a girdle, so any fold axis from them is weak.` });
  } else if (!parallel && fabric.shape === 'cluster') {
    warnings.push({
      code: 'cluster-not-girdle',
      message: `The poles form a cluster rather than a girdle (Woodcock K ${woodcock.K === null ? 'is unbounded' : `= ${woodcock.K.toFixed(2)} > 1`}), so the axis within the girdle is weakly defined.`,
    });
  }

  // Misfit from the eigenvalues already at hand: O(1), so the live fit while drawing keeps it.
  const cylindricity = axisDefined ? cylindricityFigures(fit.eigenvalues) : null;
  // Only for a girdle: a cluster or a uniform spread already has its own warning.
  if (cylindricity && n >= 3 && fabric.shape === 'girdle' && cylindricity.misfit > CYLINDRICAL_MISFIT) {
    warnings.push({
      code: 'poor-girdle-fit',
      message:
        `The poles scatter ${cylindricity.misfit.toFixed(1)}° (root mean square) from the best-fit great circle, more than the ${CYLINDRICAL_MISFIT}° that reading scatter explains, ` +
        'so they do not share one fold axis: the selection may pool domains with different axes, or the fold is conical or refolded. ' +
        'The axis is then an average and its 95% cone, which assumes one cylindrical fold, understates the uncertainty. Select one domain at a time.',
    });
  }

  let cone95: number | null = null;
  if (axisDefined && samples > 0 && n >= 3) {
    cone95 = bootstrapAxisCone(poles, fit.axisVector, { samples, seed }).cone;
    if (cone95 !== null && cone95 > WIDE_CONE_DEGREES) {
      warnings.push({ code: 'wide-cone', message: `The 95% bootstrap cone about the axis is ${cone95.toFixed(1)}° wide, so the axis is poorly constrained.` });
    }
  }

  const beta = betaAxisOfNormals(poles, { seed });
  if (beta.axis === null && n >= 2 && !parallel) warnings.push({ code: 'beta-undefined', message: `No beta axis: ${beta.note ?? 'undefined'}.` });

  const axis = axisDefined ? fit.axis : null;
  const lines = options.lines === undefined ? undefined : summarizeLines(options.lines, axisDefined ? fit.axisVector : null, warnings);
  return {
    n,
    axis,
    girdle: axisDefined ? fit.girdle : null,
    eigenvalues: fit.eigenvalues,
    eigenvectors: fit.eigenvectors.map(vectorToLine) as [Line, Line, Line],
    woodcock: { K: woodcock.K, C: woodcock.C },
    vollmer,
    fabric,
    reading: readingText(fabric, axis, parallel, cone95),
    cylindricity,
    cone95,
    beta: beta.axis,
    ...(lines && { lines }),
    warnings,
    method: methodText(n, samples, seed, beta),
  };
}

function summarizeLines(lines: readonly Line[], axis: Vec3 | null, warnings: FoldWarning[]): FoldLineSummary {
  const f = fisherLines(lines);
  // No lines at all is not a problem to warn about (most selections have none); one line is.
  if (f.n === 1) warnings.push({ code: 'few-lines', message: `Only ${f.n} line${f.n === 1 ? '' : 's'}: a Fisher cone of confidence needs at least 2.` });
  return {
    n: f.n,
    mean: f.mean,
    alpha95: f.alpha95,
    kappa: f.kappa,
    R: f.R,
    angleToAxis: f.meanVector && axis ? axialAngle(f.meanVector, axis) : null,
  };
}

/** Largest angle (degrees) between a pole and the principal eigenvector. */
function maxSpreadDegrees(poles: ArrayLike<number>, fit: GirdleFit): number {
  const e = fit.eigenvectors[0];
  let minCos = 1;
  for (let o = 0; o < poles.length; o += 3) {
    const c = Math.abs(poles[o] * e.x + poles[o + 1] * e.y + poles[o + 2] * e.z);
    if (c < minCos) minCos = c;
  }
  return toDegrees(acosClamped(minCos));
}

function formatLine(l: Line): string {
  return `${String(Math.round(l.trend) % 360).padStart(3, '0')}/${String(Math.round(l.plunge)).padStart(2, '0')}`;
}

function readingText(fabric: FabricReading, axis: Line | null, parallel: boolean, cone: number | null): string {
  if (parallel) return 'All planes are parallel; they define no fold axis.';
  const coneText = cone === null ? '' : ` (95% cone ${cone.toFixed(1)}°)`;
  if (fabric.shape === 'uniform') return `The poles are spread almost uniformly (${fabric.text}); no fold axis can be read from them.`;
  const axisText = axis === null ? 'the fold axis is undefined' : `the fold axis (pi axis) is ${formatLine(axis)}${coneText}`;
  if (fabric.shape === 'cluster') return `The poles form a ${fabric.text}, not a girdle; ${axis === null ? axisText : `${axisText}, but it is weakly defined`}.`;
  return `The poles form a ${fabric.text}; ${axisText}.`;
}

function methodText(n: number, samples: number, seed: number, beta: ReturnType<typeof betaAxisOfNormals> | null): string {
  const parts = [
    `Poles to ${n} plane${n === 1 ? '' : 's'} were summed into the orientation tensor T = (1/N)·Σ p pᵀ; its eigenvalues are S1 ≥ S2 ≥ S3 (sum 1).`,
    'The fold axis (pi axis) is the eigenvector of the least eigenvalue S3, the pole of the best-fit girdle.',
    'Fabric shape and strength: Woodcock (1977) K = ln(S1/S2)/ln(S2/S3), C = ln(S1/S3); Vollmer (1990) P = S1 − S2, G = 2(S2 − S3), R = 3·S3.',
    `Fit of one great circle: misfit = asin √S3, the RMS angular distance of the poles from the girdle, and cylindricity = S2/(S2 + S3); a misfit above ${CYLINDRICAL_MISFIT}° is warned of.`,
    samples > 0
      ? `The 95% cone is the 95th percentile of the angles between the axis and the axes of ${samples} bootstrap resamples of the poles (seed ${seed}; at most ${BOOTSTRAP_DEFAULTS.maxDraws} poles drawn per resample, angles rescaled by √(m/n) above that).`
      : 'No bootstrap cone was computed.',
    beta === null
      ? ''
      : `The beta axis is the axial mean of the intersections of ${beta.sampled ? `a seeded random sample of ${beta.pairsExamined} of the ${beta.pairsTotal}` : `all ${beta.pairsTotal}`} pairs of planes, skipping ${beta.pairsSkipped} pair${beta.pairsSkipped === 1 ? '' : 's'} less than ${BETA_DEFAULTS.minAngle}° apart.`,
    'Lines, when given, are averaged as axes with Fisher (1953) statistics.',
    DEFER,
  ];
  return parts.filter((p) => p !== '').join(' ');
}
