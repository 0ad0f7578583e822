/**
 * Description of a two-limbed fold from the attitudes of its limbs: limb maxima, interlimb
 * angle, axial-plane estimate, and the classes of Fleuty (1964, "The description of folds",
 * Proc. Geol. Assoc. 75, 461-492).
 *
 * Method (Foldlens's choices, stated so they can be checked):
 * 1. Axis: the pi axis of all poles (girdle.ts), or one given by the caller.
 * 2. Limbs: every pole is projected onto the profile plane (perpendicular to the axis) and
 *    read as an axial angle there. Angles are doubled so that a pole and its antipode agree,
 *    and the poles are split by the sign of that angle measured from S1's eigenvector, the
 *    direction between the two limbs for limbs of comparable size. The split is then refined
 *    by two-means on the doubled angles (each pole joins the nearer limb mean, until no pole
 *    moves), which also copes with limbs of unequal size.
 * 3. Limb maxima: each limb's axial mean pole (principal eigenvector of its poles' tensor),
 *    also given as the plane of that pole.
 * 4. Facing: the side a limb faces (towards younger beds) is the upward normal of a plane,
 *    or the downward one when the plane is flagged `overturned`. A limb faces the side of its
 *    mean pole that the sum of its planes' facing normals points to (a vote, which copes
 *    with steep limbs read with dips on both sides of vertical). A vertical plane has no up
 *    or down: it is taken to face its recorded dip direction (the limit of a steep plane
 *    dipping that way, right way up), or the opposite way when flagged overturned.
 * 5. Interlimb angle, measured in the profile plane as Fleuty defines it: 180° minus the
 *    angle between the two limbs' facing normals, after projecting both onto the profile
 *    plane. For an upright fold with limbs dipping 30° either way this gives 120°; for a
 *    recumbent fold whose lower limb is flagged overturned it gives about 0°.
 *    Without overturned flags every limb counts as right way up, which is right for upright
 *    and inclined folds but reads a recumbent isoclinal fold as a gentle one.
 * 6. Axial plane: the plane through the axis that bisects the interlimb angle; its normal is
 *    the difference of the two facing normals (both in the profile plane).
 *
 * Results are aids to interpretation; defer to local codes and licensed professional practice.
 */
import { acosClamped, toDegrees } from './math';
import { eigenSymmetric3 } from './eigen';
import { assertPlanes, fitGirdle } from './girdle';
import { assertLines } from './fisher';
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

/** One limb of the fold. */
export interface FoldLimb {
  /** Planes in this limb. */
  readonly n: number;
  /** Axial mean pole (limb maximum), lower hemisphere. */
  readonly pole: Line;
  /** The plane of the mean pole. */
  readonly plane: Plane;
  /** From the `overturned` flags of its planes. */
  readonly facing: 'right way up' | 'overturned' | 'mixed';
}

/** A described fold. */
export interface FoldDescription {
  readonly ok: true;
  readonly axis: Line;
  readonly limbs: readonly [FoldLimb, FoldLimb];
  /** Degrees, 0..180, in the profile plane. */
  readonly interlimbAngle: number;
  /** Null when the limbs face the same way (interlimb angle 180°: no fold to bisect). */
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

  // Profile-plane frame: u along S1's eigenvector (between the limbs), w = a × u.
  const u = unitOrNull(reject(fit.eigenvectors[0], a)) ?? unitOrNull(reject(fit.eigenvectors[1], a)) ?? anyPerpendicular(a);
  const w = cross(a, u);

  // Doubled profile angle of each pole; NaN marks a pole along the axis (no profile trace).
  const doubled = poles.map((p) => {
    const pu = dot(p, u), pw = dot(p, w);
    return Math.hypot(pu, pw) < 1e-9 ? Number.NaN : 2 * Math.atan2(pw, pu);
  });
  const unassigned = doubled.filter(Number.isNaN).length;
  let side = doubled.map((t) => (Number.isNaN(t) ? -1 : Math.sin(t) >= 0 ? 1 : 0));
  for (let iter = 0; iter < 50; iter++) {
    const cA = circularMean(doubled, side, 0);
    const cB = circularMean(doubled, side, 1);
    if (cA === null || cB === null) break;
    const next = doubled.map((t) => (Number.isNaN(t) ? -1 : Math.cos(t - cB) > Math.cos(t - cA) ? 1 : 0));
    if (next.every((s, i) => s === side[i])) break;
    side = next;
  }
  const limbPoles = [0, 1].map((k) => poles.filter((_, i) => side[i] === k));
  if (limbPoles[0].length === 0 || limbPoles[1].length === 0) {
    return { ok: false, reason: 'all poles fall on one limb: the planes do not outline two limbs about the axis' };
  }
  const limbPlanes = [0, 1].map((k) => planes.filter((_, i) => side[i] === k));

  const limbs = [0, 1].map((k) => describeLimb(limbPoles[k], limbPlanes[k])) as [LimbWork, LimbWork];
  const fA = unitOrNull(reject(limbs[0].facingVector, a));
  const fB = unitOrNull(reject(limbs[1].facingVector, a));
  if (fA === null || fB === null) return { ok: false, reason: 'a limb mean lies along the axis, so the limb has no trace in the profile plane' };

  const interlimbAngle = 180 - toDegrees(acosClamped(dot(fA, fB)));
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
    axialPlane,
    classes,
    unassigned,
    text: describeInWords(axis, axialPlane, interlimbAngle, classes, publicLimbs, unassigned),
  };
}

interface LimbWork {
  readonly limb: FoldLimb;
  readonly facingVector: Vec3;
}

function describeLimb(poles: readonly Vec3[], planes: readonly PlaneMeasurement[]): LimbWork {
  const m = eigenSymmetric3(tensorFromSums(tensorSumsOfVectors(poles))).vectors[0];
  // Vote: the facing normal of each plane is -pole (upward) or +pole when overturned.
  let vote = 0;
  poles.forEach((p, i) => {
    vote += (planes[i].overturned ? 1 : -1) * dot(p, m);
  });
  const facingVector = vote > 0 ? m : { x: -m.x, y: -m.y, z: -m.z };
  const flagged = planes.filter((p) => p.overturned === true).length;
  const facing = flagged === 0 ? 'right way up' : flagged === planes.length ? 'overturned' : 'mixed';
  const pole = vectorToLine(m);
  return { limb: { n: poles.length, pole, plane: planeOf(pole), facing }, facingVector };
}

function describeInWords(
  axis: Line,
  axialPlane: Plane | null,
  interlimb: number,
  classes: FoldDescription['classes'],
  limbs: readonly [FoldLimb, FoldLimb],
  unassigned: number,
): string {
  const words: string[] = [classes.hingePlunge, ...(classes.axialSurface === null ? [] : [classes.axialSurface]), classes.interlimb];
  const first = `${capitalize(words.join(', '))} fold (Fleuty 1964 classes): hinge ${fmt(axis.trend, 3)}/${fmt(axis.plunge, 2)}`;
  const ap = axialPlane === null ? ', axial plane undefined' : `, axial plane ${fmt(axialPlane.dipDirection, 3)}/${fmt(axialPlane.dip, 2)} (dip direction/dip)`;
  const sentences = [`${first}${ap}, interlimb angle ${Math.round(interlimb)}°.`];
  sentences.push(
    `Limb maxima ${limbs.map((l) => `${fmt(l.plane.dipDirection, 3)}/${fmt(l.plane.dip, 2)} (${l.n} plane${l.n === 1 ? '' : 's'})`).join(' and ')}.`,
  );
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

function circularMean(angles: readonly number[], side: readonly number[], k: number): number | null {
  let c = 0, s = 0, count = 0;
  angles.forEach((t, i) => {
    if (side[i] === k) { c += Math.cos(t); s += Math.sin(t); count++; }
  });
  return count === 0 || Math.hypot(c, s) < 1e-12 ? null : Math.atan2(s, c);
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
