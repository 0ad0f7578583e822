import { checkAxis } from '../downPlunge';
import { assertPlanes, fitGirdleToArray } from '../girdle';
import { asinClamped, toDegrees } from '../math';
import { cylindricityOf, type Cylindricity } from '../cylindricity';
import type { Line, Plane } from '../types';
import { lineToVector, planeNormal } from '../vectors';

/**
 * Poles against their girdle: how far each planar reading lies from the best-fit great circle,
 * which readings stand out, and how cylindrical the fold is.
 *
 * Distance of a pole p from the girdle whose pole is the axis a: d = asin|p·a| (girdle.ts).
 *
 * Outliers, robustly. The distances are measured from the girdle, where the distance is zero by
 * construction, so their median absolute deviation about zero is simply MAD = median(d). For
 * normal scatter about the girdle, σ̂ = 1.4826·MAD estimates the standard deviation (Hampel
 * 1974, JASA 69; Rousseeuw & Croux 1993, JASA 88: the constant 1/Φ⁻¹(3/4); from memory). A
 * reading is flagged when d > max(k·σ̂, minAngle), k = 3.5 by default: a robust "k sigma" rule,
 * with k chosen so that under normal scatter about one honest reading in 2000 is flagged (the
 * two-sided normal tail beyond 3.5σ is 0.00047, from published normal tables; at the familiar
 * 3σ it would be one in 370, several in a typical data set), and with a floor (default 5°, about
 * twice the reading precision of a compass-clinometer, common practice) so that near-perfect data
 * do not flag honest 3° readings. A user angle
 * (`maxAngle`) replaces the rule. Outliers pull a least-squares girdle toward themselves, so the
 * girdle is fitted to all poles, the flagged ones set aside, the girdle refitted to the rest, and
 * the distances and flags taken once more against the refitted girdle (one reweighting step).
 *
 * Cylindricity (misfit = RMS distance from the girdle, cylindricity = S2/(S2 + S3)) is computed in
 * core/cylindricity.ts, which the fold analysis shares; it is re-exported here.
 */

/** A planar reading with an optional id (station id) for messages. */
export interface MeasuredPlane extends Plane {
  readonly id?: string;
}

/** Options of {@link girdleResiduals}. */
export interface GirdleResidualOptions {
  /** Measure against this axis's girdle instead of fitting one (no refit). */
  readonly axis?: Line;
  /** k of the robust rule d > k·σ̂ (default 3.5). */
  readonly madFactor?: number;
  /** Floor of the robust threshold in degrees (default 5). */
  readonly minAngle?: number;
  /** A user angle in degrees: flag d > maxAngle instead of the robust rule. */
  readonly maxAngle?: number;
}

/**
 * Defaults of {@link GirdleResidualOptions}; 1.4826 is the normal-consistency constant of the MAD.
 * @example girdleResiduals(planes, { madFactor: GIRDLE_RESIDUAL_DEFAULTS.madFactor })
 */
export const GIRDLE_RESIDUAL_DEFAULTS = Object.freeze({ madFactor: 3.5, minAngle: 5, madToSigma: 1.4826 });

export { CYLINDRICAL_MISFIT, NEARLY_CYLINDRICAL_MISFIT, WEAK_GIRDLE_CYLINDRICITY, cylindricityOf, type Cylindricity } from '../cylindricity';

/** One reading against the girdle. */
export interface PlaneResidual {
  readonly index: number;
  readonly id?: string;
  readonly plane: Plane;
  /** Angular distance of the pole from the girdle, degrees 0..90; null when there is no girdle. */
  readonly distance: number | null;
  readonly flagged: boolean;
}

/** The result of {@link girdleResiduals}; JSON-friendly. */
export interface GirdleResiduals {
  readonly n: number;
  /** Axis fitted to all poles (or the axis given); null when undefined. */
  readonly axisAll: Line | null;
  /** Axis the distances are measured from: refitted without the flagged readings, or `axisAll`. */
  readonly axis: Line | null;
  readonly residuals: readonly PlaneResidual[];
  readonly rule: 'robust' | 'user';
  /** Flagging threshold in degrees. */
  readonly threshold: number;
  /** Median distance (the MAD about the girdle) and σ̂ = 1.4826·MAD, degrees. */
  readonly medianDistance: number | null;
  readonly sigma: number | null;
  readonly outliers: number;
  /** Of all readings. */
  readonly cylindricity: Cylindricity | null;
  /** Of the readings not flagged; null when none is flagged. */
  readonly cylindricityWithoutOutliers: Cylindricity | null;
  readonly reading: string;
}

/**
 * Distances of planar readings from their girdle, robust outlier flags and cylindricity. Throws
 * a RangeError naming the bad plane or option.
 * @example
 * const r = girdleResiduals(planes);
 * r.residuals.filter((p) => p.flagged).map((p) => p.id) // the readings that do not fit the girdle
 */
export function girdleResiduals(planes: readonly MeasuredPlane[], options: GirdleResidualOptions = {}): GirdleResiduals {
  assertPlanes(planes, 'planes');
  const madFactor = options.madFactor ?? GIRDLE_RESIDUAL_DEFAULTS.madFactor;
  const minAngle = options.minAngle ?? GIRDLE_RESIDUAL_DEFAULTS.minAngle;
  if (!(madFactor > 0 && Number.isFinite(madFactor))) throw new RangeError(`girdleResiduals: madFactor ${String(madFactor)} (expected a positive number, e.g. 3)`);
  if (!(minAngle >= 0 && minAngle <= 90)) throw new RangeError(`girdleResiduals: minAngle ${String(minAngle)} (expected degrees from 0 to 90)`);
  if (options.maxAngle !== undefined && !(options.maxAngle > 0 && options.maxAngle <= 90)) {
    throw new RangeError(`girdleResiduals: maxAngle ${String(options.maxAngle)} (expected degrees above 0, up to 90)`);
  }
  if (options.axis !== undefined) checkAxis(options.axis, 'girdleResiduals: axis');
  const n = planes.length;
  const poles = new Float64Array(3 * n);
  planes.forEach((p, i) => {
    const v = planeNormal(p);
    poles[3 * i] = v.x;
    poles[3 * i + 1] = v.y;
    poles[3 * i + 2] = v.z;
  });
  const rule = options.maxAngle === undefined ? 'robust' : 'user';
  const empty = (reading: string): GirdleResiduals => ({
    n, axisAll: null, axis: null, residuals: planes.map((p, index) => ({ index, ...(p.id !== undefined && { id: p.id }), plane: plainPlane(p), distance: null, flagged: false })),
    rule, threshold: options.maxAngle ?? minAngle, medianDistance: null, sigma: null, outliers: 0,
    cylindricity: n > 0 ? cylindricityOf(poles) : null, cylindricityWithoutOutliers: null, reading,
  });
  if (n < 3 && options.axis === undefined) return empty(`Only ${n} plane${n === 1 ? '' : 's'}: at least 3 are needed to fit a girdle.`);

  let axisAll: Line | null;
  let axisVec: { x: number; y: number; z: number } | null;
  if (options.axis !== undefined) {
    axisAll = { trend: options.axis.trend, plunge: options.axis.plunge };
    axisVec = lineToVector(axisAll);
  } else {
    const fit = fitGirdleToArray(poles);
    axisAll = fit.axisDefined ? fit.axis : null;
    axisVec = fit.axisDefined ? fit.axisVector : null;
  }
  if (axisVec === null || axisAll === null) return empty('The girdle is undefined (S2 = S3): the poles have no best great circle.');

  let judged = judge(poles, axisVec, madFactor, minAngle, options.maxAngle);
  let axis = axisAll;
  if (options.axis === undefined && judged.outliers > 0 && n - judged.outliers >= 3) {
    const keep = keptPoles(poles, judged.flags);
    const refit = fitGirdleToArray(keep);
    if (refit.axisDefined) {
      axis = refit.axis;
      judged = judge(poles, refit.axisVector, madFactor, minAngle, options.maxAngle);
    }
  }
  const residuals = planes.map((p, index): PlaneResidual => ({
    index,
    ...(p.id !== undefined && { id: p.id }),
    plane: plainPlane(p),
    distance: judged.distances[index],
    flagged: judged.flags[index] === 1,
  }));
  const cylindricity = cylindricityOf(poles);
  const clean = judged.outliers > 0 && n - judged.outliers >= 3 ? cylindricityOf(keptPoles(poles, judged.flags)) : null;
  return {
    n,
    axisAll,
    axis,
    residuals,
    rule,
    threshold: judged.threshold,
    medianDistance: judged.median,
    sigma: judged.sigma,
    outliers: judged.outliers,
    cylindricity,
    cylindricityWithoutOutliers: clean,
    reading: residualReading(n, judged, rule, madFactor, minAngle, cylindricity, clean),
  };
}

interface Judged {
  readonly distances: Float64Array;
  readonly flags: Uint8Array;
  readonly outliers: number;
  readonly threshold: number;
  readonly median: number;
  readonly sigma: number;
}

function judge(poles: Float64Array, a: { x: number; y: number; z: number }, madFactor: number, minAngle: number, maxAngle: number | undefined): Judged {
  const n = poles.length / 3;
  const distances = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    distances[i] = toDegrees(asinClamped(Math.abs(poles[3 * i] * a.x + poles[3 * i + 1] * a.y + poles[3 * i + 2] * a.z)));
  }
  const median = medianOf(distances);
  const sigma = GIRDLE_RESIDUAL_DEFAULTS.madToSigma * median;
  const threshold = maxAngle ?? Math.max(madFactor * sigma, minAngle);
  const flags = new Uint8Array(n);
  let outliers = 0;
  for (let i = 0; i < n; i++) {
    if (distances[i] > threshold) {
      flags[i] = 1;
      outliers++;
    }
  }
  return { distances, flags, outliers, threshold, median, sigma };
}

function keptPoles(poles: Float64Array, flags: Uint8Array): Float64Array {
  const out: number[] = [];
  for (let i = 0; i < flags.length; i++) if (!flags[i]) out.push(poles[3 * i], poles[3 * i + 1], poles[3 * i + 2]);
  return Float64Array.from(out);
}

function medianOf(values: Float64Array): number {
  const s = Float64Array.from(values).sort();
  const m = s.length >> 1;
  return s.length % 2 === 1 ? s[m] : (s[m - 1] + s[m]) / 2;
}

const plainPlane = (p: Plane): Plane => ({ dipDirection: p.dipDirection, dip: p.dip });

function residualReading(n: number, j: Judged, rule: 'robust' | 'user', madFactor: number, minAngle: number, all: Cylindricity, clean: Cylindricity | null): string {
  const how =
    rule === 'user'
      ? `more than ${j.threshold.toFixed(1)}° (the angle given)`
      : `more than ${j.threshold.toFixed(1)}° (${madFactor} × the robust spread σ̂ = 1.4826 × median distance ${j.median.toFixed(1)}°, at least ${minAngle}°)`;
  const outliers = j.outliers === 0 ? `No plane lies ${how} from the girdle.` : `${j.outliers} of ${n} planes lie ${how} from the girdle.`;
  return `${outliers} ${(clean ?? all).reading}`;
}
