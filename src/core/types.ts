/**
 * Orientation types shared by every part of Foldlens.
 *
 * Convention (stated once, used everywhere): direction cosines are in a right-handed
 * north-east-down frame, x = north, y = east, z = down. Azimuths (trend, dip direction,
 * strike) are degrees clockwise from north in [0, 360); plunge and dip are degrees below
 * the horizontal in [0, 90]. A line with plunge 0 is horizontal; a lower-hemisphere unit
 * vector has z >= 0.
 *
 * Angles at the API are degrees; internal arithmetic is in radians (see math.ts).
 */

/** A unit (or general) vector in the north-east-down frame. */
export interface Vec3 {
  readonly x: number; // north
  readonly y: number; // east
  readonly z: number; // down
}

/** A line (lineation, hinge, pole, axis): trend and plunge in degrees. */
export interface Line {
  readonly trend: number;
  readonly plunge: number;
}

/** A plane (bedding, foliation, fault...): dip direction and dip in degrees. */
export interface Plane {
  readonly dipDirection: number;
  readonly dip: number;
}

/**
 * Kinds of planar measurement the trade records.
 * @example
 * PLANE_KINDS.length // 9
 */
export const PLANE_KINDS = ['bedding', 'foliation', 'cleavage', 'joint', 'fault', 'vein', 'axial-plane', 'contact', 'plane'] as const;
export type PlaneKind = (typeof PLANE_KINDS)[number];

/**
 * Kinds of linear measurement the trade records.
 * @example
 * LINE_KINDS.includes('intersection') // true
 */
export const LINE_KINDS = ['lineation', 'hinge', 'intersection', 'slickenline', 'mineral-lineation', 'line'] as const;
export type LineKind = (typeof LINE_KINDS)[number];

export type MeasurementKind = PlaneKind | LineKind;

/**
 * Whether a kind is planar.
 * @example
 * isPlaneKind('bedding') // true
 * isPlaneKind('hinge') // false
 */
export function isPlaneKind(kind: string): kind is PlaneKind {
  return (PLANE_KINDS as readonly string[]).includes(kind);
}

/**
 * Whether a kind is linear.
 * @example
 * isLineKind('hinge') // true
 */
export function isLineKind(kind: string): kind is LineKind {
  return (LINE_KINDS as readonly string[]).includes(kind);
}

/**
 * A planar measurement as recorded. `overturned` is carried as a flag and never folded
 * into the numbers: the attitude stays the attitude of the surface as it lies now.
 */
export interface PlaneMeasurement extends Plane {
  readonly overturned?: boolean;
}

/** Sense of a hinge where known. */
export type FoldSense = 'antiform' | 'synform' | 'unknown';
