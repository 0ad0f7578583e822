/**
 * Description of a two-limbed fold from the attitudes of its limbs: limb maxima, interlimb
 * angle, axial-plane estimate, and the classes of Fleuty (1964, "The description of folds",
 * Proc. Geol. Assoc. 75, 461-492).
 *
 * Method (Foldlens's choices, stated so they can be checked):
 * 1. Axis: the pi axis of all poles (girdle.ts), or one given by the caller.
 * 2. Limbs: every pole is projected onto the profile plane (perpendicular to the axis) and
 *    read as an axial angle there, doubled so that a pole and its antipode agree. The poles
 *    sweep one arc of that circle, from one limb through the hinge to the other, so the circle
 *    is cut in the empty arc beyond the limbs, unrolled, and split into two limbs by two-means
 *    along the unrolled arc; where several gaps could be that empty arc, the split whose limbs'
 *    facing normals (step 4) agree best is kept (see `splitLimbs`). This copes with limbs of
 *    unequal size, broad hinges and tight folds.
 * 3. Limb maxima: the MODE of each limb's poles along the girdle, not their mean. Each pole's
 *    angle about the axis in the profile plane (its position along the girdle) is smoothed by a
 *    circular kernel density (von Mises kernel, bandwidth 4° by default) and the densest angle of
 *    each limb is its maximum (limbModes.ts). The two limbs lie on either side of the hinge (the
 *    split of step 2), so these are the two strongest modes separated by the hinge. A rounded
 *    hinge adds a tail of poles between the limbs that pulls a mean pole inward (and the
 *    interlimb angle open) but barely moves a mode. A limb of fewer than 5 planes keeps its
 *    axial mean pole (principal eigenvector of its poles' tensor): the density of so few readings
 *    has no meaningful mode. The mean poles and the interlimb angle they give are reported too.
 * 4. Facing: the side a limb faces (towards younger beds) is the upward normal of a plane,
 *    or the downward one when the plane is flagged `overturned`. A limb faces the side of its
 *    maximum (and of its mean pole) that the sum of its planes' facing normals points to (a vote, which copes
 *    with steep limbs read with dips on both sides of vertical). A vertical plane has no up
 *    or down: it is taken to face its recorded dip direction (the limit of a steep plane
 *    dipping that way, right way up), or the opposite way when flagged overturned.
 * 5. Interlimb angle, measured in the profile plane as Fleuty defines it: 180° minus the
 *    angle between the two limb maxima's facing normals, after projecting both onto the profile
 *    plane. For an upright fold with limbs dipping 30° either way this gives 120°; for a
 *    recumbent fold whose lower limb is flagged overturned it gives about 0°.
 *    Without overturned flags every limb counts as right way up, which is right for upright
 *    and inclined folds but reads a recumbent isoclinal fold as a gentle one.
 * 6. Axial plane: the plane through the axis that bisects the limb maxima (the limb bisector);
 *    its normal is the difference of the two facing normals (both in the profile plane). For an
 *    inclined asymmetric fold the true axial surface (through the hinges of successive layers)
 *    can differ from the bisector by several degrees: on the sheared Korvane sample folds the
 *    bisector is 6° (west) and 10° (east) off the planted axial surface (derived from
 *    truth.json's profile: the surface through the hinges leans atan(shear) in the profile, the
 *    limb bisector only by half the difference of the two limbs' dips in the profile).
 *
 * Results are aids to interpretation; defer to local codes and licensed professional practice.
 */
import { acosClamped, toDegrees } from './math';
import { eigenSymmetric3 } from './eigen';
import { assertPlanes, fitGirdle } from './girdle';
import { assertLines } from './fisher';
import { axialMode, LIMB_MODE_BANDWIDTH } from './limbModes';
import { tensorFromSums, tensorSumsOfVectors } from './orientationTensor';
import { cross, dot, lineToVector, normalToPlane, planeNormal, planeOf, vectorToLine } from './vectors';
import type { Line, Plane, PlaneMeasurement, Vec3 } from './types';

/** Hinge plunge classes of Fleuty (1964). */
export type HingePlungeClass = 'horizontal' | 'gently plunging' | 'moderately plunging' | 'steeply plunging' | 'vertical';
/** Axial-surface dip classes of Fleuty (1964). */
export type AxialSurfaceClass = 'recumbent' | 'gently inclined' | 'moderately inclined' | 'steeply inclined' | 'upright';
/** Interlimb angle classes of Fleuty (1964). */
export type InterlimbClass = 'isoclinal' | 'tight' | 'close' | 'open' | 'gentle';

/**
 * Class boundaries, degrees; each class is the half-open interval [from, to) except the last,
 * which includes its upper end. Fleuty (1964) boundaries from memory; the isoclinal cut of
 * 5° is Foldlens's (Fleuty's isoclinal is an interlimb angle of zero; two limb readings of
 * about ±2° each cannot resolve less than about 5°).
 * @example HINGE_PLUNGE_CLASSES.map((c) => c.from) // [0, 10, 30, 60, 80]
 */
export const HINGE_PLUNGE_CLASSES: readonly { readonly from: number; readonly name: HingePlungeClass }[] = [
  { from: 0, name: 'horizontal' }, // [0, 10)
  { from: 10, name: 'gently plunging' }, // [10, 30)
  { from: 30, name: 'moderately plunging' }, // [30, 60)
  { from: 60, name: 'steeply plunging' }, // [60, 80)
  { from: 80, name: 'vertical' }, // [80, 90]
];
/**
 * Axial-surface dip classes, half-open [from, next from), the last closed at 90 (Fleuty 1964, from memory).
 * @example AXIAL_SURFACE_CLASSES[4] // {from: 80, name: 'upright'}
 */
export const AXIAL_SURFACE_CLASSES: readonly { readonly from: number; readonly name: AxialSurfaceClass }[] = [
  { from: 0, name: 'recumbent' }, // [0, 10)
  { from: 10, name: 'gently inclined' }, // [10, 30)
  { from: 30, name: 'moderately inclined' }, // [30, 60)
  { from: 60, name: 'steeply inclined' }, // [60, 80)
  { from: 80, name: 'upright' }, // [80, 90]
];
/**
 * Interlimb angle classes, half-open [from, next from), the last closed at 180 (Fleuty 1964, from
 * memory; isoclinal below 5° is Foldlens's cut).
 * @example INTERLIMB_CLASSES[3] // {from: 70, name: 'open'}
 */
export const INTERLIMB_CLASSES: readonly { readonly from: number; readonly name: InterlimbClass }[] = [
  { from: 0, name: 'isoclinal' }, // [0, 5)
  { from: 5, name: 'tight' }, // [5, 30)
  { from: 30, name: 'close' }, // [30, 70)
  { from: 70, name: 'open' }, // [70, 120)
  { from: 120, name: 'gentle' }, // [120, 180]
];

/**
 * Limbs with fewer planes than this keep their mean pole as their maximum (Foldlens convention:
 * a kernel density of 1 to 4 readings has a mode at one reading, not at the limb).
 * @example d.limbs[0].n < MIN_LIMB_MODE_PLANES ? 'mean' : 'mode'
 */
export const MIN_LIMB_MODE_PLANES = 5;

/** One limb of the fold. */
export interface FoldLimb {
  /** Planes in this limb. */
  readonly n: number;
  /** Limb maximum: the densest pole direction of the limb along the girdle (see `estimate`), lower hemisphere. */
  readonly pole: Line;
  /** The plane of the limb maximum. */
  readonly plane: Plane;
  /** 'mode' (kernel density mode along the girdle) or 'mean' (axial mean pole, for limbs of fewer than 5 planes). */
  readonly estimate: 'mode' | 'mean';
  /** Axial mean pole of the limb (principal eigenvector of its poles' tensor), lower hemisphere. */
  readonly meanPole: Line;
  /** From the `overturned` flags of its planes. */
  readonly facing: 'right way up' | 'overturned' | 'mixed';
}

/** A described fold. */
export interface FoldDescription {
  readonly ok: true;
  readonly axis: Line;
  readonly limbs: readonly [FoldLimb, FoldLimb];
  /** Degrees, 0..180, in the profile plane, between the limb maxima (modes). */
  readonly interlimbAngle: number;
  /** The same angle between the limbs' mean poles, which rounded hinges pull open; for comparison. */
  readonly interlimbAngleOfMeans: number;
  /** Kernel bandwidth of the limb modes, degrees. */
  readonly bandwidth: number;
  /** The limb bisector: the plane through the axis bisecting the limb maxima. Null when the limbs face the same way (interlimb angle 180°: no fold to bisect). */
  readonly axialPlane: Plane | null;
  readonly classes: {
    readonly hingePlunge: HingePlungeClass;
    readonly axialSurface: AxialSurfaceClass | null;
    readonly interlimb: InterlimbClass;
  };
  /** Planes whose pole lies along the axis (they have no trace in the profile), left out of both limbs. */
  readonly unassigned: number;
  /** The description in words. */
  readonly text: string;
  /** How the limbs, interlimb angle and axial plane were found, in words. */
  readonly method: string;
}

/** Why a fold could not be described. */
export interface FoldDescriptionFailure {
  readonly ok: false;
  readonly reason: string;
}

/** Options for `describeFold`. */
export interface FoldDescriptionOptions {
  /** Use this axis instead of the pi axis of the planes. */
  readonly axis?: Line;
  /** Kernel bandwidth of the limb modes in degrees (default {@link LIMB_MODE_BANDWIDTH}, 4). */
  readonly bandwidth?: number;
}

/**
 * Fleuty (1964) hinge class of a plunge in degrees.
 * @example hingePlungeClass(27) // 'gently plunging'
 */
export function hingePlungeClass(plunge: number): HingePlungeClass {
  return classify(plunge, 90, HINGE_PLUNGE_CLASSES, 'plunge');
}

/**
 * Fleuty (1964) class of an axial-surface dip in degrees.
 * @example axialSurfaceClass(85) // 'upright'
 */
export function axialSurfaceClass(dip: number): AxialSurfaceClass {
  return classify(dip, 90, AXIAL_SURFACE_CLASSES, 'axial-surface dip');
}

/**
 * Fleuty (1964) class of an interlimb angle in degrees.
 * @example interlimbClass(100) // 'open'
 */
export function interlimbClass(angle: number): InterlimbClass {
  return classify(angle, 180, INTERLIMB_CLASSES, 'interlimb angle');
}

/**
 * Describes a two-limbed fold from its planes. Throws a RangeError naming the row of a bad
 * plane; returns `{ok: false, reason}` when the data do not make two limbs about an axis.
 * @example
 * const d = describeFold([{dipDirection: 90, dip: 30}, {dipDirection: 270, dip: 30}]);
 * if (d.ok) d.interlimbAngle // 120
 */
export function describeFold(planes: readonly PlaneMeasurement[], options: FoldDescriptionOptions = {}): FoldDescription | FoldDescriptionFailure {
  assertPlanes(planes);
  if (options.axis !== undefined) assertLines([options.axis], 'options.axis');
  const bandwidth = options.bandwidth ?? LIMB_MODE_BANDWIDTH;
  if (!(bandwidth > 0 && bandwidth <= 90)) throw new RangeError(`describeFold options.bandwidth: ${String(bandwidth)} (expected degrees above 0, up to 90)`);
  if (planes.length < 2) return { ok: false, reason: `a fold needs planes on two limbs (got ${planes.length} plane${planes.length === 1 ? '' : 's'})` };

  const poles = planes.map(planeNormal);
  const fit = fitGirdle(poles);
  let a: Vec3;
  if (options.axis !== undefined) {
    a = lineToVector(options.axis);
  } else {
    if (!fit.axisDefined || fit.eigenvalues[0] > 1 - 1e-9) return { ok: false, reason: 'the planes define no fold axis (all parallel, or S2 = S3)' };
    a = fit.axisVector;
  }

  // Profile-plane frame: u along S1's eigenvector, w = a × u (any frame would do).
  const u = unitOrNull(reject(fit.eigenvectors[0], a)) ?? unitOrNull(reject(fit.eigenvectors[1], a)) ?? anyPerpendicular(a);
  const w = cross(a, u);

  // Profile angle of each pole (an axis: θ and θ + 180° agree) and of its facing normal (step 4;
  // the same line with a sense); NaN marks a pole along the axis (no profile trace).
  const poleAngles = poles.map((p) => {
    const pu = dot(p, u), pw = dot(p, w);
    return Math.hypot(pu, pw) < 1e-9 ? Number.NaN : Math.atan2(pw, pu);
  });
  const facingAngles = poleAngles.map((t, i) => (planes[i].overturned ? t : t + Math.PI));
  const unassigned = poleAngles.filter(Number.isNaN).length;
  const side = splitLimbs(poleAngles, facingAngles);
  const limbPoles = [0, 1].map((k) => poles.filter((_, i) => side[i] === k));
  if (limbPoles[0].length === 0 || limbPoles[1].length === 0) {
    return { ok: false, reason: 'all poles fall on one limb: the planes do not outline two limbs about the axis' };
  }
  const limbPlanes = [0, 1].map((k) => planes.filter((_, i) => side[i] === k));
  const limbAngles = [0, 1].map((k) => poleAngles.filter((_, i) => side[i] === k));

  const limbs = [0, 1].map((k) => describeLimb(limbPoles[k], limbPlanes[k], limbAngles[k], u, w, bandwidth)) as [LimbWork, LimbWork];
  const fA = unitOrNull(reject(limbs[0].facingVector, a));
  const fB = unitOrNull(reject(limbs[1].facingVector, a));
  const mA = unitOrNull(reject(limbs[0].meanFacingVector, a));
  const mB = unitOrNull(reject(limbs[1].meanFacingVector, a));
  if (fA === null || fB === null || mA === null || mB === null) return { ok: false, reason: 'a limb mean lies along the axis, so the limb has no trace in the profile plane' };

  const interlimbAngle = 180 - toDegrees(acosClamped(dot(fA, fB)));
  const interlimbAngleOfMeans = 180 - toDegrees(acosClamped(dot(mA, mB)));
  const bisectorNormal = unitOrNull({ x: fA.x - fB.x, y: fA.y - fB.y, z: fA.z - fB.z });
  const axialPlane = bisectorNormal === null ? null : normalToPlane(bisectorNormal);
  const axis = vectorToLine(a);
  const classes = {
    hingePlunge: hingePlungeClass(axis.plunge),
    axialSurface: axialPlane === null ? null : axialSurfaceClass(axialPlane.dip),
    interlimb: interlimbClass(interlimbAngle),
  };
  const publicLimbs = limbs.map((l) => l.limb) as [FoldLimb, FoldLimb];
  return {
    ok: true,
    axis,
    limbs: publicLimbs,
    interlimbAngle,
    interlimbAngleOfMeans,
    bandwidth,
    axialPlane,
    classes,
    unassigned,
    text: describeInWords(axis, axialPlane, interlimbAngle, interlimbAngleOfMeans, classes, publicLimbs, unassigned),
    method:
      `Limbs: the poles' angles about the axis in the profile plane, split at the hinge. Limb maxima: the mode of each limb's angles (von Mises kernel density on doubled angles, bandwidth ${bandwidth}°), or the mean pole for a limb of fewer than ${MIN_LIMB_MODE_PLANES} planes. ` +
      'Interlimb angle: 180° minus the angle between the limb maxima\'s facing normals in the profile plane; classes of Fleuty (1964). ' +
      'Axial plane: the limb bisector through the axis, which can differ from the true axial surface of an inclined or asymmetric fold.',
  };
}

interface LimbWork {
  readonly limb: FoldLimb;
  /** Facing normal of the limb maximum. */
  readonly facingVector: Vec3;
  /** Facing normal of the limb's mean pole. */
  readonly meanFacingVector: Vec3;
}

/**
 * One limb: its mean pole, its maximum (the mode of its profile angles `angles`, radians from u
 * toward w), and which way each faces.
 */
function describeLimb(poles: readonly Vec3[], planes: readonly PlaneMeasurement[], angles: readonly number[], u: Vec3, w: Vec3, bandwidth: number): LimbWork {
  const mean = eigenSymmetric3(tensorFromSums(tensorSumsOfVectors(poles))).vectors[0];
  const theta = poles.length >= MIN_LIMB_MODE_PLANES ? axialMode(angles, bandwidth) : null;
  const mode = theta === null ? mean : { x: Math.cos(theta) * u.x + Math.sin(theta) * w.x, y: Math.cos(theta) * u.y + Math.sin(theta) * w.y, z: Math.cos(theta) * u.z + Math.sin(theta) * w.z };
  // Vote: the facing normal of each plane is -pole (upward) or +pole when overturned.
  const facingOf = (m: Vec3): Vec3 => {
    let vote = 0;
    poles.forEach((p, i) => {
      vote += (planes[i].overturned ? 1 : -1) * dot(p, m);
    });
    return vote > 0 ? m : { x: -m.x, y: -m.y, z: -m.z };
  };
  const flagged = planes.filter((p) => p.overturned === true).length;
  const facing = flagged === 0 ? 'right way up' : flagged === planes.length ? 'overturned' : 'mixed';
  const pole = vectorToLine(mode);
  return {
    limb: { n: poles.length, pole, plane: planeOf(pole), estimate: theta === null ? 'mean' : 'mode', meanPole: vectorToLine(mean), facing },
    facingVector: facingOf(mode),
    meanFacingVector: facingOf(mean),
  };
}

function describeInWords(
  axis: Line,
  axialPlane: Plane | null,
  interlimb: number,
  interlimbOfMeans: number,
  classes: FoldDescription['classes'],
  limbs: readonly [FoldLimb, FoldLimb],
  unassigned: number,
): string {
  const words: string[] = [classes.hingePlunge, ...(classes.axialSurface === null ? [] : [classes.axialSurface]), classes.interlimb];
  const first = `${capitalize(words.join(', '))} fold (Fleuty 1964 classes): hinge ${fmt(axis.trend, 3)}/${fmt(axis.plunge, 2)}`;
  const ap = axialPlane === null ? ', axial plane undefined' : `, axial plane (limb bisector) ${fmt(axialPlane.dipDirection, 3)}/${fmt(axialPlane.dip, 2)} (dip direction/dip)`;
  const sentences = [`${first}${ap}, interlimb angle ${Math.round(interlimb)}°.`];
  sentences.push(
    `Limb maxima ${limbs.map((l) => `${fmt(l.plane.dipDirection, 3)}/${fmt(l.plane.dip, 2)} (${l.n} plane${l.n === 1 ? '' : 's'}${l.estimate === 'mean' ? ', mean pole' : ''})`).join(' and ')}.`,
  );
  // Foldlens convention: a 5° difference is worth saying (a broad, rounded hinge).
  if (Math.abs(interlimbOfMeans - interlimb) >= 5) {
    sentences.push(`The limbs' mean poles, pulled toward the hinge, would give ${Math.round(interlimbOfMeans)}°: the hinge zone is broad.`);
  }
  if (unassigned > 0) sentences.push(`${unassigned} plane${unassigned === 1 ? ' lies' : 's lie'} across the axis and belong${unassigned === 1 ? 's' : ''} to neither limb.`);
  if (limbs.every((l) => l.facing === 'right way up')) {
    sentences.push('No plane is flagged overturned, so both limbs were taken as right way up; an overturned limb would change the interlimb angle.');
  }
  sentences.push('Results are aids to interpretation; defer to local codes and licensed professional practice.');
  return sentences.join(' ');
}

function classify<T extends string>(value: number, max: number, table: readonly { readonly from: number; readonly name: T }[], what: string): T {
  if (!(value >= 0 && value <= max)) throw new RangeError(`${what}: ${value} is out of range (expected 0 to ${max} degrees)`);
  let name = table[0].name;
  for (const row of table) if (value >= row.from) name = row.name;
  return name;
}

/** Gaps at least this share of the widest are tried as the anti-hinge (Foldlens convention). */
const ANTI_HINGE_GAP_SHARE = 0.25;
/** At most this many gaps are tried. */
const ANTI_HINGE_CANDIDATES = 8;

/**
 * Splits planes into two limbs, sides 0 and 1, from the profile angles of their poles (radians,
 * axial; NaN: no trace, side -1) and of their facing normals (radians, full circle).
 *
 * On doubled pole angles (so that θ and θ + 180° agree) the poles of a fold sweep one arc, from
 * one limb through the hinge to the other; the rest of the circle, beyond the limbs (the
 * "anti-hinge"), stays empty. So the circle is cut in the middle of an empty arc, the angles are
 * unrolled from there onto a line, where the limbs are the two ends and the hinge lies between,
 * and the line is split where the two parts have the least summed squared deviation from their
 * means (two-means in one dimension, solved exactly from prefix sums).
 *
 * Which empty arc: usually the widest, but a tight fold with few hinge readings can show a gap
 * inside the hinge as wide as the anti-hinge, and cutting there pairs the two limbs (their poles
 * are close across the anti-hinge). So every gap at least a quarter as wide as the widest (at most 8,
 * widest first) is tried, and the split kept is the one whose two limbs' facing normals agree
 * best: the largest R0 + R1, the lengths of the two limbs' resultant facing vectors in the
 * profile (two limbs of a fold face apart; limbs paired across the anti-hinge cancel). Pole
 * axes rather than facing normals decide what is contiguous, so that a steep reading with its
 * dip recorded on the other side of vertical stays with its limb.
 */
function splitLimbs(angles: readonly number[], facing: readonly number[]): number[] {
  const TWO_PI = 2 * Math.PI;
  const order = angles.map((t, i) => i).filter((i) => !Number.isNaN(angles[i]));
  const none = angles.map(() => -1);
  if (order.length === 0) return none;
  // Doubled angles in [0, 2π), and the facing normals as unit vectors, computed once.
  const doubled = new Float64Array(angles.length);
  const facingCos = new Float64Array(angles.length);
  const facingSin = new Float64Array(angles.length);
  for (const i of order) {
    doubled[i] = 2 * angles[i] - TWO_PI * Math.floor((2 * angles[i]) / TWO_PI);
    facingCos[i] = Math.cos(facing[i]);
    facingSin[i] = Math.sin(facing[i]);
  }
  order.sort((i, j) => doubled[i] - doubled[j] || i - j);
  const m = order.length;
  const width = new Float64Array(m); // width[k]: the gap after order[k]
  let widest = 0;
  for (let k = 0; k < m; k++) {
    width[k] = (k + 1 < m ? doubled[order[k + 1]] : doubled[order[0]] + TWO_PI) - doubled[order[k]];
    if (width[k] > widest) widest = width[k];
  }
  const candidates: number[] = [];
  for (let k = 0; k < m; k++) if (width[k] >= ANTI_HINGE_GAP_SHARE * widest) candidates.push(k);
  candidates.sort((a, b) => width[b] - width[a] || a - b);

  let best = none;
  let bestScore = -1;
  for (const k of candidates.slice(0, ANTI_HINGE_CANDIDATES)) {
    const side = splitUnrolled(order, (k + 1) % m, doubled, angles.length);
    let c0 = 0, s0 = 0, c1 = 0, s1 = 0;
    for (const i of order) {
      if (side[i] === 0) { c0 += facingCos[i]; s0 += facingSin[i]; } else { c1 += facingCos[i]; s1 += facingSin[i]; }
    }
    const score = Math.hypot(c0, s0) + Math.hypot(c1, s1);
    if (score > bestScore + 1e-9 * Math.max(1, bestScore)) {
      bestScore = score;
      best = side;
    }
  }
  return best;
}

/**
 * Two-means on the doubled angles (sorted in `order`) unrolled from order[first]: side 0 before
 * the split of least summed squares, side 1 after it, -1 for angles not in `order`.
 */
function splitUnrolled(order: readonly number[], first: number, doubled: Float64Array, count: number): number[] {
  const TWO_PI = 2 * Math.PI;
  const m = order.length;
  const base = doubled[order[first]];
  const sum = new Float64Array(m + 1), sq = new Float64Array(m + 1);
  for (let k = 0; k < m; k++) {
    const d = doubled[order[(first + k) % m]];
    const x = d - base + (d < base ? TWO_PI : 0);
    sum[k + 1] = sum[k] + x;
    sq[k + 1] = sq[k] + x * x;
  }
  const sse = (a: number, b: number): number => sq[b] - sq[a] - (sum[b] - sum[a]) ** 2 / (b - a);
  let cut = m; // one point: everything on limb 0
  let bestSse = Infinity;
  for (let k = 1; k < m; k++) {
    const e = sse(0, k) + sse(k, m);
    if (k === 1 || e < bestSse - 1e-12 * Math.max(1, bestSse)) {
      bestSse = e;
      cut = k;
    }
  }
  const side = new Array<number>(count).fill(-1);
  for (let k = 0; k < m; k++) side[order[(first + k) % m]] = k < cut ? 0 : 1;
  return side;
}

function reject(v: Vec3, a: Vec3): Vec3 {
  const d = dot(v, a);
  return { x: v.x - d * a.x, y: v.y - d * a.y, z: v.z - d * a.z };
}

function unitOrNull(v: Vec3): Vec3 | null {
  const n = Math.hypot(v.x, v.y, v.z);
  return n < 1e-9 ? null : { x: v.x / n, y: v.y / n, z: v.z / n };
}

function anyPerpendicular(a: Vec3): Vec3 {
  const helper = Math.abs(a.z) < 0.9 ? { x: 0, y: 0, z: 1 } : { x: 1, y: 0, z: 0 };
  return unitOrNull(cross(a, helper)) as Vec3;
}

function fmt(value: number, digits: number): string {
  return String(Math.round(value) % (digits === 3 ? 360 : 1000)).padStart(digits, '0');
}

function capitalize(s: string): string {
  return s.charAt(0).toUpperCase() + s.slice(1);
}
