import { checkAxis } from '../downPlunge';
import { angleBetweenPlanes } from '../geometry';
import { assertPlanes } from '../girdle';
import { acosClamped, toDegrees } from '../math';
import type { Line, Plane, Vec3 } from '../types';
import { cross, lineToVector, normalToPlane, vectorToLine } from '../vectors';
import { buildPointIndex, nearestInto, nearestScratch } from './nearestNeighbours';

/**
 * The attitude a layer should have where its contact crosses the ground, predicted from the fold
 * axis and the trace.
 *
 * A cylindrical surface contains the fold axis direction at every point (it is swept by lines
 * parallel to the axis; Ramsay 1967, common practice). Where the surface meets the ground, the
 * trace's tangent also lies in the surface. So the surface's tangent plane there is the plane
 * through the axis a and the 3D tangent t of the trace: its pole is a × t (the plane through two
 * lines, geometry.ts planeThroughLines; the idea is the classic three-point problem, solved with
 * the axis as one of the known directions). The tangent is taken in 3D, from the trace's vertices
 * with their heights (from the file or a DEM): t = P[i+1] - P[i-1] (central difference; one-sided
 * at the ends), so a trace that climbs a slope gets its true inclination.
 *
 * Where the trace runs nearly parallel to the axis, the plane is poorly fixed: an error ε in the
 * tangent turns the pole by about ε / sin(angle between t and a). Vertices where that angle is
 * under `minAngle` (default 20°, which at most triples a tangent error; Foldlens convention) get
 * no prediction.
 *
 * Positions are east-north-up metres (downPlunge.ts), one Float64Array of x, y, z triples per
 * trace piece (in order along the trace). The axis and the measured planes must be referred to the
 * same north as the positions (grid north in a projected frame; io/localFrame.ts gridAxis).
 */

/** Options of {@link predictAttitudes}. */
export interface PredictOptions {
  /** Least angle between the tangent and the axis for a prediction, degrees (default 20). */
  readonly minAngle?: number;
}

/**
 * Defaults of the predictions and comparisons: radius in metres, angles in degrees.
 * @example compareWithMeasured(predictions, stations, { radius: PREDICTION_DEFAULTS.radius })
 */
export const PREDICTION_DEFAULTS = Object.freeze({ minAngle: 20, radius: 150, threshold: 20 });

/** The predicted attitude at one trace vertex. */
export interface PredictedAttitude {
  readonly piece: number;
  readonly vertex: number;
  /** Position, east-north-up metres. */
  readonly position: readonly [number, number, number];
  /** 3D tangent of the trace as a line; null where the trace does not move (repeated vertex). */
  readonly tangent: Line | null;
  /** Angle between the tangent and the axis, degrees 0..90; null without a tangent. */
  readonly tangentToAxis: number | null;
  /** The plane through the axis and the tangent; null where the angle is under `minAngle`. */
  readonly plane: Plane | null;
}

/**
 * The attitude predicted at every vertex of every trace piece. Throws a RangeError naming the
 * piece and vertex of a non-finite coordinate, or a bad axis or option.
 * @example
 * predictAttitudes([traceXyz], {trend: 75, plunge: 12})[3].plane // {dipDirection, dip} at vertex 3
 */
export function predictAttitudes(pieces: readonly Float64Array[], axis: Line, options: PredictOptions = {}): PredictedAttitude[] {
  checkAxis(axis, 'predictAttitudes: axis');
  const minAngle = options.minAngle ?? PREDICTION_DEFAULTS.minAngle;
  if (!(minAngle >= 0 && minAngle < 90)) throw new RangeError(`predictAttitudes: minAngle ${String(minAngle)} (expected degrees from 0 to under 90)`);
  const a = lineToVector(axis);
  const out: PredictedAttitude[] = [];
  pieces.forEach((xyz, piece) => {
    if (!(xyz instanceof Float64Array) || xyz.length % 3 !== 0) throw new RangeError(`predictAttitudes: piece ${piece} is not a Float64Array of east, north, up triples`);
    for (let i = 0; i < xyz.length; i++) {
      if (!Number.isFinite(xyz[i])) throw new RangeError(`predictAttitudes: piece ${piece}, vertex ${Math.floor(i / 3)} has a non-finite ${'enu'[i % 3]} (${xyz[i]}); leave vertices without a height out`);
    }
    const n = xyz.length / 3;
    for (let v = 0; v < n; v++) {
      const lo = Math.max(0, v - 1);
      const hi = Math.min(n - 1, v + 1);
      // East-north-up difference to the north-east-down frame of directions (types.ts).
      const t: Vec3 = { x: xyz[3 * hi + 1] - xyz[3 * lo + 1], y: xyz[3 * hi] - xyz[3 * lo], z: -(xyz[3 * hi + 2] - xyz[3 * lo + 2]) };
      const len = Math.hypot(t.x, t.y, t.z);
      const position: [number, number, number] = [xyz[3 * v], xyz[3 * v + 1], xyz[3 * v + 2]];
      if (!(len > 0)) {
        out.push({ piece, vertex: v, position, tangent: null, tangentToAxis: null, plane: null });
        continue;
      }
      const angle = toDegrees(acosClamped(Math.abs(t.x * a.x + t.y * a.y + t.z * a.z) / len));
      const plane = angle >= minAngle && angle > 0 ? normalToPlane(cross(a, t)) : null;
      out.push({ piece, vertex: v, position, tangent: vectorToLine(t), tangentToAxis: angle, plane });
    }
  });
  return out;
}

/** A measured plane at a map position (east, north metres in the same frame as the traces). */
export interface PlacedPlane extends Plane {
  readonly x: number;
  readonly y: number;
  readonly id?: string;
}

/** Options of {@link compareWithMeasured}. */
export interface CompareOptions {
  /** Compare a measured plane with the nearest predicted vertex within this map distance, metres (default 150). */
  readonly radius?: number;
  /** Flag comparisons that differ by more than this, degrees (default 20). */
  readonly threshold?: number;
}

/** One measured plane against the nearest prediction. */
export interface AttitudeComparison {
  /** Position of the measured plane in the input. */
  readonly index: number;
  readonly id?: string;
  readonly measured: Plane;
  readonly predicted: Plane;
  readonly piece: number;
  readonly vertex: number;
  /** Map distance from the plane to the vertex, metres. */
  readonly distance: number;
  /** Angle between the planes (between their poles), degrees 0..90. */
  readonly angle: number;
  readonly flagged: boolean;
}

/** Result of {@link compareWithMeasured}. */
export interface PredictionCheck {
  readonly radius: number;
  readonly threshold: number;
  readonly predicted: number;
  readonly comparisons: readonly AttitudeComparison[];
  /** Median angle of the comparisons, degrees; null without any. */
  readonly medianAngle: number | null;
  readonly flagged: number;
  readonly reading: string;
}

/**
 * Compares measured planes with the predicted attitude at the nearest trace vertex (with a
 * prediction) within `radius` on the map. Planes with no such vertex are not compared.
 * @example compareWithMeasured(predictAttitudes(pieces, axis), bedding).medianAngle // degrees
 */
export function compareWithMeasured(predictions: readonly PredictedAttitude[], measured: readonly PlacedPlane[], options: CompareOptions = {}): PredictionCheck {
  const radius = options.radius ?? PREDICTION_DEFAULTS.radius;
  const threshold = options.threshold ?? PREDICTION_DEFAULTS.threshold;
  if (!(radius > 0 && Number.isFinite(radius))) throw new RangeError(`compareWithMeasured: radius ${String(radius)} is not a positive distance in metres`);
  if (!(threshold > 0 && threshold <= 90)) throw new RangeError(`compareWithMeasured: threshold ${String(threshold)} (expected degrees above 0, up to 90)`);
  assertPlanes(measured, 'measured');
  measured.forEach((m, i) => {
    if (!Number.isFinite(m.x) || !Number.isFinite(m.y)) throw new RangeError(`measured[${i}]${m.id !== undefined ? ` (${m.id})` : ''}: position (${m.x}, ${m.y}) is not a pair of finite coordinates`);
  });
  const usable = predictions.filter((p) => p.plane !== null);
  const xy = new Float64Array(2 * usable.length);
  usable.forEach((p, i) => {
    xy[2 * i] = p.position[0];
    xy[2 * i + 1] = p.position[1];
  });
  const index = buildPointIndex(xy);
  const scratch = nearestScratch(1);
  const comparisons: AttitudeComparison[] = [];
  measured.forEach((m, i) => {
    if (nearestInto(index, m.x, m.y, scratch) === 0) return;
    const distance = Math.sqrt(scratch.d2[0]);
    if (distance > radius) return;
    const p = usable[scratch.ids[0]];
    const predicted = p.plane!;
    const plane = { dipDirection: m.dipDirection, dip: m.dip };
    const angle = angleBetweenPlanes(plane, predicted);
    comparisons.push({ index: i, ...(m.id !== undefined && { id: m.id }), measured: plane, predicted, piece: p.piece, vertex: p.vertex, distance, angle, flagged: angle > threshold });
  });
  const angles = comparisons.map((c) => c.angle).sort((p, q) => p - q);
  const medianAngle = angles.length === 0 ? null : angles.length % 2 === 1 ? angles[angles.length >> 1] : (angles[angles.length / 2 - 1] + angles[angles.length / 2]) / 2;
  const flagged = comparisons.filter((c) => c.flagged).length;
  const reading =
    comparisons.length === 0
      ? `No measured plane lies within ${radius} m of a trace vertex with a prediction.`
      : `${comparisons.length} measured plane${comparisons.length === 1 ? '' : 's'} within ${radius} m of a trace: median ${medianAngle!.toFixed(1)}° from the attitude the axis and the trace predict; ${flagged} differ by more than ${threshold}°.`;
  return { radius, threshold, predicted: usable.length, comparisons, medianAngle, flagged, reading };
}
