/**
 * Net projections: unit vectors (north-east-down, see types.ts) to points of the unit disc
 * and back. Two kinds, both the polar aspect of a map projection of the sphere with the
 * centre of the net at the pole (Snyder 1987, *Map Projections: A Working Manual*, USGS
 * Professional Paper 1395, polar aspects of the sphere):
 *
 * - 'equal-area' (Lambert azimuthal equal-area, the Schmidt net): Snyder's rho = 2R·sin(c/2),
 *   scaled by 1/(R·sqrt 2) so the primitive (c = 90°) has radius 1: r = sqrt(2)·sin(c/2).
 * - 'equal-angle' (stereographic, the Wulff net): Snyder's rho = 2R·tan(c/2) (k0 = 1),
 *   scaled by 1/(2R): r = tan(c/2).
 *
 * Here c is the angle between the vector and the centre of the net: straight down for the
 * lower hemisphere, straight up for the upper, so c = 90° − plunge.
 *
 * Screen convention: x = east, y = north, primitive radius 1 (callers that draw in SVG flip
 * y). The upper hemisphere is seen from above like the lower one: north up, east right.
 *
 * With zc = cos c the formulas need no trigonometry (derived: 2 sin²(c/2) = 1 − cos c and
 * sin c = 2 sin(c/2) cos(c/2)): equal-area (x, y) = (e, n)/sqrt(1 + zc), equal-angle
 * (x, y) = (e, n)/(1 + zc), where (n, e) are the north and east components of the vector.
 */
import { EPSILON } from './math';
import type { Line, Vec3 } from './types';
import { lineToVector } from './vectors';

/** Which net: equal-area (Lambert azimuthal, Schmidt net) or equal-angle (stereographic, Wulff net). */
export type NetKind = 'equal-area' | 'equal-angle';

/** Which half of the sphere the net shows. */
export type Hemisphere = 'lower' | 'upper';

/** A point on the net: x east, y north, primitive radius 1. */
export interface NetPoint {
  readonly x: number;
  readonly y: number;
}

/** What projectPath does with the part of a path in the hemisphere the net does not show. */
export interface ProjectPathOptions {
  /**
   * 'flip' (default): plot it through its opposite end, as lines have no sense; the path then
   * jumps across the net where it crosses the primitive. 'omit': leave that part out.
   */
  readonly otherHemisphere?: 'flip' | 'omit';
}

/** How far (in z or in radius) a point may stray past the primitive and still count as on it. */
const PRIMITIVE_TOLERANCE = 1e-12;

function checkKind(kind: string, what: string): void {
  if (kind !== 'equal-area' && kind !== 'equal-angle') {
    throw new RangeError(`${what}: kind is "${String(kind)}"; expected "equal-area" or "equal-angle"`);
  }
}

/** +1 when the net shows the lower hemisphere (centre z = +1), −1 for the upper. */
function hemisphereSign(hemisphere: string, what: string): 1 | -1 {
  if (hemisphere === 'lower') return 1;
  if (hemisphere === 'upper') return -1;
  throw new RangeError(`${what}: hemisphere is "${String(hemisphere)}"; expected "lower" or "upper"`);
}

/** Length of v, or a RangeError naming the vector when it has no finite direction. */
function checkedLength(v: Vec3, what: string): number {
  const n = Math.hypot(v?.x, v?.y, v?.z);
  if (!Number.isFinite(n) || !(n > EPSILON)) {
    throw new RangeError(`${what} is (${v?.x}, ${v?.y}, ${v?.z}); expected a non-zero finite vector`);
  }
  return n;
}

/**
 * Projects unit components (n, e, zc) with zc = cos(angle from the centre) >= about 0, no flip.
 * Snyder (1987) polar aspects, rewritten without trigonometry (see the file comment).
 */
function projectUnit(n: number, e: number, zc: number, equalArea: boolean): NetPoint {
  const k = equalArea ? 1 / Math.sqrt(1 + zc) : 1 / (1 + zc);
  return { x: e * k, y: n * k };
}

/**
 * Radius on the net (primitive radius 1) of a line with the given plunge:
 * sqrt(2)·sin(c/2) for equal-area, tan(c/2) for equal-angle, c = 90° − plunge (Snyder 1987,
 * polar aspects, scaled to the primitive). Handy for drawing plunge rings.
 * @example netRadius(30, 'equal-area') // 0.7071068
 */
export function netRadius(plungeDegrees: number, kind: NetKind): number {
  checkKind(kind, 'netRadius');
  if (!Number.isFinite(plungeDegrees) || plungeDegrees < 0 || plungeDegrees > 90) {
    throw new RangeError(`netRadius: plunge is ${String(plungeDegrees)}; expected a plunge from 0 to 90 degrees`);
  }
  const half = ((90 - plungeDegrees) * Math.PI) / 360;
  return kind === 'equal-area' ? Math.SQRT2 * Math.sin(half) : Math.tan(half);
}

/**
 * Projects a vector (any length; its direction is used) onto the net. A vector pointing into
 * the hemisphere the net does not show is flipped first: lines have no sense. A horizontal
 * vector is kept as given and lands on the primitive.
 *
 * @throws RangeError for a zero or non-finite vector, or an unknown kind or hemisphere.
 * @example projectVector({x: 1, y: 0, z: 0}, 'equal-area') // {x: 0, y: 1}: north at the top
 */
export function projectVector(v: Vec3, kind: NetKind, hemisphere: Hemisphere = 'lower'): NetPoint {
  checkKind(kind, 'projectVector');
  const s = hemisphereSign(hemisphere, 'projectVector');
  const len = checkedLength(v, 'projectVector: v');
  const flip = s * v.z < 0 ? -1 : 1;
  const f = flip / len;
  return projectUnit(v.x * f, v.y * f, s * v.z * f, kind === 'equal-area');
}

/**
 * Projects a line given as trend/plunge onto the net.
 * @example projectLine({trend: 90, plunge: 0}, 'equal-angle') // {x: 1, y: 0}: east on the right
 */
export function projectLine(line: Line, kind: NetKind, hemisphere: Hemisphere = 'lower'): NetPoint {
  if (!Number.isFinite(line?.trend)) throw new RangeError(`projectLine: trend is ${String(line?.trend)}; expected a finite azimuth in degrees`);
  if (!Number.isFinite(line.plunge) || line.plunge < 0 || line.plunge > 90) {
    throw new RangeError(`projectLine: plunge is ${String(line.plunge)}; expected a plunge from 0 to 90 degrees`);
  }
  return projectVector(lineToVector(line), kind, hemisphere);
}

/**
 * The unit vector, in the chosen hemisphere, that projects to a point of the net (the inverse
 * of projectVector). Returns null for a point outside the primitive (radius > 1), which is the
 * ordinary case of a pointer beyond the net, not an error.
 *
 * Equal-area inverse: zc = 1 − r², horizontal part scaled by sqrt(2 − r²); equal-angle:
 * zc = (1 − r²)/(1 + r²), horizontal part scaled by 2/(1 + r²) (derived by solving the
 * forward formulas in the file comment for the vector).
 *
 * @throws RangeError for non-finite coordinates or an unknown kind or hemisphere.
 * @example unprojectPoint({x: 0, y: 0}, 'equal-area') // {x: 0, y: 0, z: 1}: straight down
 */
export function unprojectPoint(p: NetPoint, kind: NetKind, hemisphere: Hemisphere = 'lower'): Vec3 | null {
  checkKind(kind, 'unprojectPoint');
  const s = hemisphereSign(hemisphere, 'unprojectPoint');
  if (!Number.isFinite(p?.x) || !Number.isFinite(p?.y)) {
    throw new RangeError(`unprojectPoint: point is (${p?.x}, ${p?.y}); expected finite net coordinates`);
  }
  const r2raw = p.x * p.x + p.y * p.y;
  if (r2raw > 1 + 2 * PRIMITIVE_TOLERANCE) return null;
  const r2 = Math.min(r2raw, 1); // a point a rounding error outside the primitive sits on it
  let zc: number;
  let f: number;
  if (kind === 'equal-area') {
    zc = 1 - r2;
    f = Math.sqrt(2 - r2);
  } else {
    zc = (1 - r2) / (1 + r2);
    f = 2 / (1 + r2);
  }
  return { x: p.y * f, y: p.x * f, z: s * zc };
}

/**
 * Fast projection of many vectors held in a typed array: `xyz` holds n vectors interleaved
 * (x0, y0, z0, x1, ...); the result holds n points interleaved (x0, y0, x1, y1, ...). Same
 * rules as projectVector. Pass `out` (length at least 2n) to reuse a buffer; it is the only
 * argument written to.
 *
 * @throws RangeError when xyz.length is not a multiple of 3, out is too short, or a vector is
 *   zero or non-finite (the error gives its index).
 * @example projectVectors(new Float64Array([0, 0, 1, 1, 0, 0]), 'equal-area') // Float64Array [0, 0, 0, 1]
 */
export function projectVectors(xyz: Float64Array, kind: NetKind, out?: Float64Array, hemisphere: Hemisphere = 'lower'): Float64Array {
  checkKind(kind, 'projectVectors');
  const s = hemisphereSign(hemisphere, 'projectVectors');
  if (xyz.length % 3 !== 0) {
    throw new RangeError(`projectVectors: xyz has length ${xyz.length}; expected a multiple of 3 (x, y, z per vector)`);
  }
  const n = xyz.length / 3;
  const result = out ?? new Float64Array(2 * n);
  if (result.length < 2 * n) throw new RangeError(`projectVectors: out has length ${result.length}; expected at least ${2 * n} (2 per vector)`);
  const equalArea = kind === 'equal-area';
  for (let i = 0; i < n; i++) {
    const vx = xyz[3 * i];
    const vy = xyz[3 * i + 1];
    const vz = xyz[3 * i + 2];
    const len = Math.sqrt(vx * vx + vy * vy + vz * vz);
    if (!(len > EPSILON) || !Number.isFinite(len)) {
      throw new RangeError(`projectVectors: vector ${i} is (${vx}, ${vy}, ${vz}); expected a non-zero finite vector`);
    }
    const f = (s * vz < 0 ? -1 : 1) / len;
    const zc = s * vz * f;
    // Inlined projectUnit: this loop runs over 10^5 points per redraw.
    const k = equalArea ? 1 / Math.sqrt(1 + zc) : 1 / (1 + zc);
    result[2 * i] = vy * f * k;
    result[2 * i + 1] = vx * f * k;
  }
  return result;
}

interface PathPart {
  points: NetPoint[];
  /** +1 in the shown hemisphere, −1 in the other (plotted flipped). */
  side: 1 | -1;
}

/**
 * Projects a path of vectors (a great or small circle from geometry.ts) for drawing,
 * splitting it where it crosses the primitive. Each crossing point is found on the great-circle
 * arc between the two neighbouring vectors, so every part ends exactly on the primitive.
 * With the default 'flip', the part in the other hemisphere is drawn through its opposite
 * ends, so it re-enters at the diametrically opposite point of the primitive. A vertex lying on
 * the primitive belongs to the part it is in (so a lower-hemisphere great circle drawn on the
 * upper net stays one arc). A closed path (last vector equal to the first) whose two ends fall
 * in one part is joined back into one polyline.
 *
 * @throws RangeError for a zero or non-finite vector (naming its index), or an unknown kind,
 *   hemisphere or option.
 * @example projectPath(smallCirclePath({trend: 0, plunge: 0}, 30), 'equal-area') // two arcs, near north and near south
 */
export function projectPath(
  vectors: readonly Vec3[],
  kind: NetKind,
  hemisphere: Hemisphere = 'lower',
  options: ProjectPathOptions = {},
): NetPoint[][] {
  checkKind(kind, 'projectPath');
  const s = hemisphereSign(hemisphere, 'projectPath');
  const mode = options.otherHemisphere ?? 'flip';
  if (mode !== 'flip' && mode !== 'omit') {
    throw new RangeError(`projectPath: otherHemisphere is "${String(mode)}"; expected "flip" or "omit"`);
  }
  const equalArea = kind === 'equal-area';
  // Projects a unit vector u as seen from `side`: side −1 means the opposite end is plotted.
  const plot = (u: Vec3, side: 1 | -1): NetPoint => projectUnit(side * u.x, side * u.y, side * s * u.z, equalArea);

  const units = vectors.map((v, i) => {
    const len = checkedLength(v, `projectPath: vectors[${i}]`);
    return { x: v.x / len, y: v.y / len, z: v.z / len };
  });
  if (units.length === 0) return [];

  // Side of a vertex: +1 shown, -1 other hemisphere. A vertex on the primitive belongs to both,
  // so it keeps the side of the part it is in (the first such vertex looks ahead).
  const strictSide = (u: Vec3): 0 | 1 | -1 => (s * u.z > PRIMITIVE_TOLERANCE ? 1 : s * u.z < -PRIMITIVE_TOLERANCE ? -1 : 0);
  const firstOff = units.find((u) => strictSide(u) !== 0);
  const startSide: 1 | -1 = firstOff === undefined ? 1 : (strictSide(firstOff) as 1 | -1);
  const parts: PathPart[] = [];
  let current: PathPart = { points: [plot(units[0], startSide)], side: startSide };
  for (let i = 1; i < units.length; i++) {
    const a = units[i - 1];
    const b = units[i];
    const side = strictSide(b) === 0 ? current.side : (strictSide(b) as 1 | -1);
    if (side !== current.side) {
      let c: Vec3;
      if (strictSide(a) === 0) {
        c = a; // a already lies on the primitive and closes the current part
      } else {
        // Point of the arc a-b where z = 0: a·|zb| + b·|za| (its z cancels, and both weights are
        // positive so it lies between a and b). Set z to exactly 0 so it sits on the primitive.
        const cx = a.x * Math.abs(b.z) + b.x * Math.abs(a.z);
        const cy = a.y * Math.abs(b.z) + b.y * Math.abs(a.z);
        const h = Math.hypot(cx, cy);
        if (!(h > EPSILON)) {
          throw new RangeError(`projectPath: vectors[${i - 1}] and vectors[${i}] are opposite; the path between them is undefined`);
        }
        c = { x: cx / h, y: cy / h, z: 0 };
        current.points.push(plot(c, current.side));
      }
      parts.push(current);
      current = { points: [plot(c, side)], side };
    }
    current.points.push(plot(b, side));
  }
  parts.push(current);

  const first = units[0];
  const last = units[units.length - 1];
  const closed = Math.abs(first.x - last.x) + Math.abs(first.y - last.y) + Math.abs(first.z - last.z) < 1e-12;
  if (closed && parts.length > 1 && parts[0].side === parts[parts.length - 1].side) {
    // The circle started mid-arc: the last part runs on into the first.
    const tail = parts.pop() as PathPart;
    parts[0] = { points: tail.points.concat(parts[0].points.slice(1)), side: tail.side };
  }
  return parts.filter((p) => mode === 'flip' || p.side === 1).map((p) => p.points);
}
