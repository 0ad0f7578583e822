/**
 * SVG path data for the net: the frame (primitive, grid, ticks), great and small circles,
 * and point sets. Pure string builders, no DOM, so they run and are tested in Node.
 *
 * Net coordinates (netProjection.ts) have x east, y north and the primitive at radius 1; SVG
 * has y down. A `NetFrame` places the net: centre (cx, cy) and primitive radius r in viewBox
 * units, so a net point (x, y) is drawn at (cx + r·x, cy − r·y).
 */
import { greatCirclePath, smallCirclePath } from '../../core/geometry';
import { netRadius, projectPath, type NetKind, type NetPoint } from '../../core/netProjection';
import type { Line, Plane } from '../../core/types';

/** Where the net sits in the SVG viewBox. */
export interface NetFrame {
  readonly cx: number;
  readonly cy: number;
  /** Radius of the primitive circle. */
  readonly r: number;
}

/** Marker shapes, each centred on (0, 0). */
export type MarkerSymbol = 'square' | 'diamond' | 'triangle' | 'disc' | 'ring';

/**
 * SVG position of a net point.
 * @example netToSvg({x: 1, y: 0}, {cx: 200, cy: 200, r: 180}) // {x: 380, y: 200}: east on the right
 */
export function netToSvg(p: NetPoint, frame: NetFrame): { x: number; y: number } {
  return { x: frame.cx + frame.r * p.x, y: frame.cy - frame.r * p.y };
}

/**
 * Rounds a coordinate for path data; keeps "-0" out.
 * @example coord(1.23456, 2) // '1.23'
 */
export function coord(v: number, digits = 2): string {
  const k = 10 ** digits;
  const r = Math.round(v * k) / k;
  return String(r === 0 ? 0 : r);
}

/**
 * Path data for polylines in net coordinates (e.g. the parts from projectPath).
 * @example polylinePathData([[{x: 0, y: 0}, {x: 1, y: 0}]], {cx: 0, cy: 0, r: 10}) // 'M0 0L10 0'
 */
export function polylinePathData(parts: readonly (readonly NetPoint[])[], frame: NetFrame, digits = 2): string {
  let d = '';
  for (const part of parts) {
    if (part.length < 2) continue;
    part.forEach((p, i) => {
      d += `${i === 0 ? 'M' : 'L'}${coord(frame.cx + frame.r * p.x, digits)} ${coord(frame.cy - frame.r * p.y, digits)}`;
    });
  }
  return d;
}

/**
 * Great circle of a plane on the lower-hemisphere net: a curve from strike to strike through
 * the dip line (greatCirclePath, projected by projectPath).
 * @example greatCirclePathData({dipDirection: 90, dip: 90}, 'equal-area', frame) // a diameter N-S
 */
export function greatCirclePathData(plane: Plane, kind: NetKind, frame: NetFrame, steps = 90): string {
  return polylinePathData(projectPath(greatCirclePath(plane, steps), kind), frame);
}

/**
 * Great circles of many planes in one path, for drawing them as one element.
 * @example greatCirclesPathData([{dipDirection: 0, dip: 30}, {dipDirection: 90, dip: 60}], 'equal-area', frame)
 */
export function greatCirclesPathData(planes: readonly Plane[], kind: NetKind, frame: NetFrame, steps = 60): string {
  let d = '';
  for (const p of planes) d += greatCirclePathData(p, kind, frame, steps);
  return d;
}

/**
 * Small circle (cone) of half-angle `halfAngle` degrees about an axis; the part above the
 * horizontal is drawn through its opposite end, as lines have no sense.
 * @example smallCirclePathData({trend: 40, plunge: 25}, 5, 'equal-area', frame)
 */
export function smallCirclePathData(axis: Line, halfAngle: number, kind: NetKind, frame: NetFrame, steps = 180): string {
  return polylinePathData(projectPath(smallCirclePath(axis, halfAngle, steps), kind), frame);
}

/** Sub-units per viewBox unit in pointsPathData: coordinates are whole tenths. */
export const POINTS_SCALE = 10;

/**
 * Many points as one path of zero-length segments ("M x y h0"): with round caps and a stroke
 * width equal to the dot diameter each becomes a dot, so 10^5 poles are one DOM element.
 * `xy` holds net coordinates interleaved (x0, y0, x1, y1, ...), as projectVectors returns.
 * Coordinates are written as whole numbers of 1/POINTS_SCALE viewBox units (integers turn
 * into text several times faster than decimals, which matters at 10^5 points), so the path
 * is drawn with transform scale(1/POINTS_SCALE) and a stroke width POINTS_SCALE times larger.
 * @example pointsPathData(Float64Array.of(0, 0), {cx: 200, cy: 200, r: 180}) // 'M2000 2000h0'
 */
export function pointsPathData(xy: Float64Array, frame: NetFrame): string {
  const n = xy.length >> 1;
  const k = POINTS_SCALE;
  const cx = frame.cx * k;
  const cy = frame.cy * k;
  const r = frame.r * k;
  let d = '';
  for (let i = 0; i < n; i++) {
    d += `M${Math.round(cx + r * xy[2 * i])} ${Math.round(cy - r * xy[2 * i + 1])}h0`;
  }
  return d;
}

/**
 * Many points as one path of small upward triangles of side about `size`.
 * @example trianglesPathData(Float64Array.of(0, 0), {cx: 0, cy: 0, r: 100}, 8)
 */
export function trianglesPathData(xy: Float64Array, frame: NetFrame, size: number): string {
  // Equilateral, centred on its centroid: apex R above, base R/2 below (R = side/sqrt 3).
  const R = size / Math.sqrt(3);
  const h = size / 2;
  let d = '';
  for (let i = 0; i < xy.length >> 1; i++) {
    const x = frame.cx + frame.r * xy[2 * i];
    const y = frame.cy - frame.r * xy[2 * i + 1];
    d += `M${coord(x)} ${coord(y - R)}L${coord(x + h)} ${coord(y + R / 2)}L${coord(x - h)} ${coord(y + R / 2)}Z`;
  }
  return d;
}

/**
 * Path data of a marker of about `size` across, centred on (0, 0).
 * @example markerPathData('square', 10) // 'M-5 -5h10v10h-10Z'
 */
export function markerPathData(symbol: MarkerSymbol, size: number): string {
  const h = size / 2;
  switch (symbol) {
    case 'square':
      return `M${coord(-h)} ${coord(-h)}h${coord(size)}v${coord(size)}h${coord(-size)}Z`;
    case 'diamond':
      return `M0 ${coord(-h * 1.25)}L${coord(h)} 0L0 ${coord(h * 1.25)}L${coord(-h)} 0Z`;
    case 'triangle': {
      // Equilateral, centred on its centroid.
      const R = size / Math.sqrt(3);
      return `M0 ${coord(-R)}L${coord(h)} ${coord(R / 2)}L${coord(-h)} ${coord(R / 2)}Z`;
    }
    case 'ring':
    case 'disc':
      // One shape; a ring is a disc drawn without fill.
      return circlePathData(0, 0, h);
    default:
      throw new RangeError(`markerPathData: symbol "${String(symbol)}" is not known; expected square, diamond, triangle, disc or ring`);
  }
}

/**
 * A full circle as path data (two arcs).
 * @example circlePathData(0, 0, 1) // 'M1 0A1 1 0 1 0 -1 0A1 1 0 1 0 1 0Z'
 */
export function circlePathData(cx: number, cy: number, r: number): string {
  return `M${coord(cx + r)} ${coord(cy)}A${coord(r)} ${coord(r)} 0 1 0 ${coord(cx - r)} ${coord(cy)}A${coord(r)} ${coord(r)} 0 1 0 ${coord(cx + r)} ${coord(cy)}Z`;
}

/**
 * A 10° polar grid: circles of equal plunge every 10° (10° to 80°) and lines of equal trend
 * every 10° from the 80° circle out to the primitive (kept clear of the centre so it stays readable).
 * @example gridPathData('equal-area', {cx: 200, cy: 200, r: 180})
 */
export function gridPathData(kind: NetKind, frame: NetFrame, spacing = 10): string {
  if (!(Number.isInteger(spacing) && spacing > 0 && 90 % spacing === 0)) {
    throw new RangeError(`gridPathData: spacing ${String(spacing)} is not usable; expected a whole divisor of 90 degrees`);
  }
  let d = '';
  for (let plunge = spacing; plunge < 90; plunge += spacing) d += circlePathData(frame.cx, frame.cy, frame.r * netRadius(plunge, kind));
  const inner = frame.r * netRadius(90 - spacing, kind);
  for (let trend = 0; trend < 360; trend += spacing) {
    const t = (trend * Math.PI) / 180;
    const sx = Math.sin(t);
    const sy = -Math.cos(t);
    d += `M${coord(frame.cx + inner * sx)} ${coord(frame.cy + inner * sy)}L${coord(frame.cx + frame.r * sx)} ${coord(frame.cy + frame.r * sy)}`;
  }
  return d;
}

/**
 * Tick marks outside the primitive at north, east, south and west, plus a small centre cross.
 * @example ticksPathData({cx: 200, cy: 200, r: 180}, 8)
 */
export function ticksPathData(frame: NetFrame, length: number): string {
  const { cx, cy, r } = frame;
  const e = r + length;
  return [
    `M${coord(cx)} ${coord(cy - r)}V${coord(cy - e)}`,
    `M${coord(cx + r)} ${coord(cy)}H${coord(cx + e)}`,
    `M${coord(cx)} ${coord(cy + r)}V${coord(cy + e)}`,
    `M${coord(cx - r)} ${coord(cy)}H${coord(cx - e)}`,
  ].join('');
}

/**
 * A small cross at the centre of the net.
 * @example centreCrossPathData({cx: 200, cy: 200, r: 180}, 5) // 'M195 200H205M200 195V205'
 */
export function centreCrossPathData(frame: NetFrame, half: number): string {
  return `M${coord(frame.cx - half)} ${coord(frame.cy)}H${coord(frame.cx + half)}M${coord(frame.cx)} ${coord(frame.cy - half)}V${coord(frame.cy + half)}`;
}
