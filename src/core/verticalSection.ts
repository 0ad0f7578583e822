import { apparentPlungeInSection } from './apparentDip';
import { checkAxis, profileFrame } from './downPlunge';
import { normalizeAzimuth, toDegrees, toRadians } from './math';
import type { Line } from './types';

/**
 * Vertical sections along a polyline drawn on the map, in projected metres (x east, y north,
 * z up; the same frame as the axis azimuths, i.e. grid north when the frame is a map grid).
 *
 * Each segment of the polyline is a vertical plane. Distance along the section ("chainage")
 * runs from the first vertex; a section is drawn with distance to the right and up as up.
 *
 * Points off the section are projected onto it ALONG THE PLUNGE, not perpendicular to it:
 * each point P moves along the axis a until it meets the plane of a segment,
 * P + s·a with s = -((P - A)·n) / (a·n) for the segment's horizontal normal n (derived: a line
 * meets a plane). In a cylindrical fold this carries a surface along itself, so data from a
 * swath either side of the line stack up on the surface's true trace in the section — the
 * reason for projecting along the plunge (common practice). A perpendicular projection would
 * smear them by (distance off the line) × tan(apparent plunge).
 *
 * An axis parallel (or nearly) to a segment's plane never meets it: that is an error, raised
 * before anything is projected, naming the segment.
 */

/** A map position [x, y] in projected metres. */
export type MapPoint = readonly [number, number];

/** A validated section line. */
export interface SectionLine {
  readonly vertices: readonly MapPoint[];
  /** Distance along the section at each vertex (0 at the first). */
  readonly chainage: readonly number[];
  readonly length: number;
  /** Azimuth of each segment, degrees clockwise from the frame's north, [0, 360). */
  readonly azimuths: readonly number[];
}

/** A point of the section line at a given distance. */
export interface SectionSample {
  readonly distance: number;
  readonly x: number;
  readonly y: number;
  /** Index of the segment the point lies on (the later one at a bend). */
  readonly segment: number;
}

/** A sample of the topographic profile. */
export interface TopoPoint extends SectionSample {
  /** Ground height in metres, null where the terrain model has no value. */
  readonly elevation: number | null;
  /** elevation × vertical exaggeration: the y to draw. */
  readonly plotY: number | null;
}

/** Options of {@link projectAlongPlunge}. */
export interface AlongPlungeOptions {
  /** Half-width of the swath in metres: points farther from the section line on the map are left out. Default Infinity. */
  readonly swath?: number;
  /** Multiplies output y only (never distances or elevations). Default 1. */
  readonly verticalExaggeration?: number;
  /** Smallest angle in degrees allowed between the axis and a segment's plane. Default 1. */
  readonly minAngle?: number;
}

/**
 * Code in {@link SectionProjection.segment} for a point farther from the section than the swath.
 * @example const skipped = projection.segment.filter((s) => s === OUTSIDE_SWATH).length;
 */
export const OUTSIDE_SWATH = -1;
/**
 * Code in {@link SectionProjection.segment} for a point whose axis-parallel line passes beyond the section's ends.
 * @example const beyondEnds = projection.segment.filter((s) => s === MISSES_SECTION).length;
 */
export const MISSES_SECTION = -2;

/** Points projected along the plunge onto a section, index for index with the input. */
export interface SectionProjection {
  /** Distance along the section of the point where the point's axis-parallel line meets it (NaN if not projected). */
  readonly distance: Float64Array;
  /** Height of that meeting point, metres (NaN if not projected). */
  readonly elevation: Float64Array;
  /** elevation × vertical exaggeration (NaN if not projected). */
  readonly plotY: Float64Array;
  /** Metres moved along the axis to reach the section; positive is down the plunge (NaN if not projected). */
  readonly offset: Float64Array;
  /** Horizontal map distance from the section line, metres (always set for finite input). */
  readonly mapDistance: Float64Array;
  /** Segment met, or OUTSIDE_SWATH (-1), or MISSES_SECTION (-2: in the swath, but the projection passes beyond the ends of every segment). */
  readonly segment: Int32Array;
  readonly projected: number;
  readonly outsideSwath: number;
  readonly missed: number;
  /** Apparent plunge of the axis in each segment's plane (orthographic; apparentDip.ts), degrees, positive toward increasing distance. */
  readonly axisApparentPlunge: readonly number[];
}

/**
 * Validates a polyline drawn on the map as a section line.
 * @example sectionLine([[0, 0], [1000, 0]]).azimuths // [90]
 */
export function sectionLine(vertices: readonly MapPoint[]): SectionLine {
  if (vertices.length < 2) throw new RangeError(`a section line needs at least 2 vertices, got ${vertices.length}`);
  vertices.forEach((v, i) => {
    if (!Array.isArray(v) || v.length < 2 || !Number.isFinite(v[0]) || !Number.isFinite(v[1])) {
      throw new RangeError(`section vertex ${i + 1}: ${JSON.stringify(v)} is not a pair of finite map coordinates [x, y]`);
    }
  });
  const chainage = [0];
  const azimuths: number[] = [];
  for (let i = 1; i < vertices.length; i++) {
    const dx = vertices[i][0] - vertices[i - 1][0];
    const dy = vertices[i][1] - vertices[i - 1][1];
    const length = Math.hypot(dx, dy);
    if (!(length > 1e-9)) throw new RangeError(`section segment ${i} (vertices ${i} and ${i + 1}) has zero length; remove the repeated vertex`);
    chainage.push(chainage[i - 1] + length);
    azimuths.push(normalizeAzimuth(toDegrees(Math.atan2(dx, dy))));
  }
  return { vertices: vertices.map((v) => [v[0], v[1]] as const), chainage, length: chainage[chainage.length - 1], azimuths };
}

/**
 * Points along the section every `spacing` metres from the start, plus every bend and the end.
 * @example sectionSamples(sectionLine([[0, 0], [250, 0]]), 100).map((s) => s.distance) // [0, 100, 200, 250]
 */
export function sectionSamples(section: SectionLine, spacing: number, maxSamples = 1_000_000): SectionSample[] {
  if (!(spacing > 0 && Number.isFinite(spacing))) throw new RangeError(`sample spacing ${String(spacing)} is not a positive number of metres`);
  const count = Math.floor(section.length / spacing) + section.vertices.length + 1;
  if (count > maxSamples) throw new RangeError(`spacing ${spacing} m along a ${section.length.toFixed(1)} m section gives ${count} samples, more than ${maxSamples}; use a larger spacing`);
  const distances: number[] = [];
  for (let k = 0; k * spacing < section.length - 1e-9; k++) distances.push(k * spacing);
  for (const c of section.chainage.slice(1)) distances.push(c);
  distances.sort((a, b) => a - b);
  const out: SectionSample[] = [];
  for (const d of distances) {
    if (out.length > 0 && d - out[out.length - 1].distance < 1e-9) continue;
    out.push(pointAt(section, d));
  }
  return out;
}

/**
 * The map point at a distance along the section (clamped to its ends).
 * @example pointAt(sectionLine([[0, 0], [0, 100]]), 40) // { distance: 40, x: 0, y: 40, segment: 0 }
 */
export function pointAt(section: SectionLine, distance: number): SectionSample {
  const d = Math.min(Math.max(distance, 0), section.length);
  const last = section.azimuths.length - 1;
  let k = 0;
  while (k < last && d >= section.chainage[k + 1]) k++;
  const a = section.vertices[k];
  const b = section.vertices[k + 1];
  const t = (d - section.chainage[k]) / (section.chainage[k + 1] - section.chainage[k]);
  return { distance: d, x: a[0] + t * (b[0] - a[0]), y: a[1] + t * (b[1] - a[1]), segment: k };
}

/**
 * The ground profile along the section: heights from `heightAt(x, y)` (a terrain model
 * sampler; null where it has no value, kept as null, never zero).
 * @example topographicProfile(sectionLine([[0, 0], [100, 0]]), 50, () => 500) // three points at 500 m
 */
export function topographicProfile(
  section: SectionLine,
  spacing: number,
  heightAt: (x: number, y: number) => number | null,
  options: { readonly verticalExaggeration?: number } = {},
): TopoPoint[] {
  const ve = checkExaggeration(options.verticalExaggeration);
  return sectionSamples(section, spacing).map((s) => {
    const h = heightAt(s.x, s.y);
    const elevation = h === null || !Number.isFinite(h) ? null : h;
    return { ...s, elevation, plotY: elevation === null ? null : elevation * ve };
  });
}

/**
 * Projects points (x, y, z triples in the section's frame) onto the section along the plunge
 * of `axis` (trend referred to the frame's north). Throws a RangeError when the axis lies
 * within `minAngle` of a segment's plane (a vertical axis lies in every vertical plane).
 * @example
 * const s = sectionLine([[0, 0], [1000, 0]]);
 * projectAlongPlunge(s, new Float64Array([500, 100, 0]), { trend: 0, plunge: 45 }).elevation[0] // 100
 */
export function projectAlongPlunge(section: SectionLine, xyz: Float64Array, axis: Line, options: AlongPlungeOptions = {}): SectionProjection {
  checkAxis(axis);
  if (xyz.length % 3 !== 0) throw new RangeError(`projectAlongPlunge: xyz has ${xyz.length} numbers; expected x, y, z triples (a multiple of 3)`);
  const swath = options.swath ?? Infinity;
  if (!(swath >= 0)) throw new RangeError(`swath half-width ${String(swath)} is not a distance in metres (0 or more)`);
  const ve = checkExaggeration(options.verticalExaggeration);
  const minAngle = options.minAngle ?? 1;
  if (!(minAngle > 0 && minAngle < 90)) throw new RangeError(`minAngle ${String(minAngle)} must be between 0 and 90 degrees`);

  const [ax, ay, az] = profileFrame(axis).axis;
  const m = section.azimuths.length;
  const seg = segmentsOf(section);
  for (let k = 0; k < m; k++) {
    // sin(angle between the axis and the vertical plane of the segment) = |a·n|.
    const sinAngle = Math.abs(ax * seg.nx[k] + ay * seg.ny[k]);
    if (sinAngle < Math.sin(toRadians(minAngle))) {
      const what = axis.plunge >= 90 - 1e-9 ? 'is vertical, so it lies in every vertical section' : `makes ${toDegrees(Math.asin(Math.min(1, sinAngle))).toFixed(2)}° with the plane of section segment ${k + 1} (azimuth ${section.azimuths[k].toFixed(1)})`;
      throw new RangeError(
        `the fold axis ${axis.trend}/${axis.plunge} ${what}: points moved along the plunge would not meet the section (at least ${minAngle}° needed); draw the section across the trend of the axis`,
      );
    }
  }

  const n = xyz.length / 3;
  const distance = new Float64Array(n).fill(Number.NaN);
  const elevation = new Float64Array(n).fill(Number.NaN);
  const plotY = new Float64Array(n).fill(Number.NaN);
  const offset = new Float64Array(n).fill(Number.NaN);
  const mapDistance = new Float64Array(n);
  const segment = new Int32Array(n);
  let projected = 0;
  let outsideSwath = 0;
  let missed = 0;
  for (let i = 0; i < n; i++) {
    const px = xyz[3 * i];
    const py = xyz[3 * i + 1];
    const pz = xyz[3 * i + 2];
    let nearest = Infinity;
    for (let k = 0; k < m; k++) nearest = Math.min(nearest, pointSegmentDistance(px, py, seg, k));
    mapDistance[i] = nearest;
    if (!(nearest <= swath)) {
      segment[i] = OUTSIDE_SWATH;
      outsideSwath++;
      continue;
    }
    let best = -1;
    let bestS = Infinity;
    let bestC = 0;
    for (let k = 0; k < m; k++) {
      const rx = px - seg.x0[k];
      const ry = py - seg.y0[k];
      const s = -(rx * seg.nx[k] + ry * seg.ny[k]) / (ax * seg.nx[k] + ay * seg.ny[k]);
      const c = rx * seg.dx[k] + ry * seg.dy[k] + s * (ax * seg.dx[k] + ay * seg.dy[k]);
      const tol = 1e-9 * Math.max(1, seg.length[k]);
      if (c < -tol || c > seg.length[k] + tol) continue;
      if (Math.abs(s) < Math.abs(bestS)) {
        best = k;
        bestS = s;
        bestC = Math.min(Math.max(c, 0), seg.length[k]);
      }
    }
    if (best < 0) {
      segment[i] = MISSES_SECTION;
      missed++;
      continue;
    }
    segment[i] = best;
    distance[i] = section.chainage[best] + bestC;
    elevation[i] = pz + bestS * az;
    plotY[i] = elevation[i] * ve;
    offset[i] = bestS;
    projected++;
  }
  const axisApparentPlunge = section.azimuths.map((azimuth) => apparentPlungeInSection(axis, azimuth));
  return { distance, elevation, plotY, offset, mapDistance, segment, projected, outsideSwath, missed, axisApparentPlunge };
}

interface Segments {
  readonly x0: Float64Array;
  readonly y0: Float64Array;
  /** Unit direction along the segment. */
  readonly dx: Float64Array;
  readonly dy: Float64Array;
  /** Unit horizontal normal (direction turned 90° anticlockwise). */
  readonly nx: Float64Array;
  readonly ny: Float64Array;
  readonly length: Float64Array;
}

function segmentsOf(section: SectionLine): Segments {
  const m = section.azimuths.length;
  const s: Segments = {
    x0: new Float64Array(m),
    y0: new Float64Array(m),
    dx: new Float64Array(m),
    dy: new Float64Array(m),
    nx: new Float64Array(m),
    ny: new Float64Array(m),
    length: new Float64Array(m),
  };
  for (let k = 0; k < m; k++) {
    const [x0, y0] = section.vertices[k];
    const [x1, y1] = section.vertices[k + 1];
    const length = section.chainage[k + 1] - section.chainage[k];
    s.x0[k] = x0;
    s.y0[k] = y0;
    s.dx[k] = (x1 - x0) / length;
    s.dy[k] = (y1 - y0) / length;
    s.nx[k] = -s.dy[k];
    s.ny[k] = s.dx[k];
    s.length[k] = length;
  }
  return s;
}

function pointSegmentDistance(px: number, py: number, s: Segments, k: number): number {
  const rx = px - s.x0[k];
  const ry = py - s.y0[k];
  const t = Math.min(Math.max(rx * s.dx[k] + ry * s.dy[k], 0), s.length[k]);
  return Math.hypot(rx - t * s.dx[k], ry - t * s.dy[k]);
}

function checkExaggeration(ve: number | undefined): number {
  const k = ve ?? 1;
  if (!(k > 0 && Number.isFinite(k))) throw new RangeError(`vertical exaggeration ${String(ve)} is not a positive number`);
  return k;
}
