import { eigenSymmetric3 } from '../eigen';
import { AXIS_DEGENERACY, fitGirdleToArray } from '../girdle';
import { acosClamped, normalizeAzimuth, toDegrees } from '../math';
import type { Line } from '../types';
import { lineToVector } from '../vectors';
import { buildPointIndex, nearestInto, nearestScratch } from './nearestNeighbours';

/**
 * The local fold axis: the pi axis (least eigenvector of the poles' orientation tensor; Ramsay
 * 1967, Woodcock 1977, as in girdle.ts) of the planes in a moving window, on a grid of nodes over
 * the map. Where one cylindrical fold holds, the local axes agree; where the fold is not
 * cylindrical (conical folds, refolded folds) or a fault separates domains, they turn, and
 * domainBoundaries.ts reads the places where they turn fastest as suggested domain boundaries.
 *
 * Window: the k planes nearest to the node (default), or all planes within a radius. The k
 * nearest are found on a kdbush index (nearestNeighbours.ts), so a node costs about log n + k,
 * not n; the tensor is summed over the window's poles in one pass.
 *
 * Cone (a fast stand-in for the bootstrap cone of bootstrap.ts): first-order perturbation of the
 * least eigenvector (the standard perturbation of a symmetric eigenproblem, e.g. Golub & Van Loan,
 * *Matrix Computations*, section 8.1; applied to orientation tensors by Prentice 1984, Biometrika
 * 71, and in Fisher, Lewis & Embleton 1987, section 3.2.5; citations from memory). Moving the
 * tensor T by dT moves e3 by sum over j = 1, 2 of (e_j·dT·e3)/(S3 - S_j) e_j. With T the mean of
 * n products p pᵀ, the variance of e_j·T·e3 is estimated from the window itself as
 * (1/n²)·Σ (p·e_j)²(p·e3)², so the angular standard error toward e_j is
 *   σ_j = sqrt(Σ (p·e_j)²(p·e3)²) / (n·(S_j - S3)),
 * and the reported cone is 2.448·max(σ1, σ2) (2.448 = sqrt of the 95% point of chi-square with
 * 2 degrees of freedom, the radius of a circular normal 95% cone; taking the larger σ makes it
 * conservative for an elongated cone, where the exact 95% point lies between 1.96 and 2.448 σ).
 * It assumes the window's poles are independent and the errors small (n of 20 or more); compare
 * with the bootstrap where it matters.
 */

/** The grid of nodes: nx × ny cells tiling the bounds, one node at the centre of each. */
export interface FieldGrid {
  /** West and south edges of the grid (corner of cell 0). */
  readonly minX: number;
  readonly minY: number;
  /** Cell size in x and y. */
  readonly dx: number;
  readonly dy: number;
  readonly nx: number;
  readonly ny: number;
}

/** Options of {@link localAxisField}. */
export interface LocalAxisFieldOptions {
  /** Nodes across and up the grid (default 40 × 40 over the points' bounding box). */
  readonly nx?: number;
  readonly ny?: number;
  /** Bounds [minX, minY, maxX, maxY] of the grid; default the points' bounding box. */
  readonly bounds?: readonly [number, number, number, number];
  /** Planes per window (k nearest; default 30). Ignored when `radius` is given. */
  readonly k?: number;
  /** Window radius in the units of the coordinates, instead of k nearest. */
  readonly radius?: number;
  /** Fewest planes for an axis (default 8); smaller windows give no axis. */
  readonly minCount?: number;
  /** k-nearest windows reaching farther than this give no axis (the node is outside the data). */
  readonly maxReach?: number;
  /** Axis to compare every local axis with; default the pi axis of all the planes. */
  readonly reference?: Line;
}

/**
 * Defaults of {@link LocalAxisFieldOptions}.
 * @example localAxisField(xy, poles, { ...FIELD_DEFAULTS, k: 50 })
 */
export const FIELD_DEFAULTS = Object.freeze({ nx: 40, ny: 40, k: 30, minCount: 8 });

/** 2.448 = sqrt(chi-square 95% point, 2 degrees of freedom) = sqrt(-2 ln 0.05). */
const CONE_FACTOR = Math.sqrt(-2 * Math.log(0.05));

/**
 * The local axis at every node, as typed arrays indexed by node (node = row·nx + col, row 0 in
 * the south); NaN where a node has no axis.
 */
export interface LocalAxisField {
  readonly grid: FieldGrid;
  readonly window: { readonly mode: 'nearest'; readonly k: number } | { readonly mode: 'radius'; readonly radius: number };
  readonly minCount: number;
  readonly maxReach: number | null;
  /** Planes in each window. */
  readonly count: Int32Array;
  /** Distance from the node to the farthest plane of its window. */
  readonly reach: Float64Array;
  /** Unit axis vectors (north-east-down, lower hemisphere), 3 per node. */
  readonly axis: Float64Array;
  readonly trend: Float64Array;
  readonly plunge: Float64Array;
  /** Fast 95% cone proxy in degrees (see the module comment). */
  readonly cone: Float64Array;
  /** Eigenvalues S1, S2, S3 (sum 1), 3 per node. */
  readonly eigenvalues: Float64Array;
  /** Angle (degrees, 0..90) between each local axis and `reference`. */
  readonly angleToReference: Float64Array;
  readonly reference: Line | null;
}

/** One node of the field as a plain JSON-friendly object. */
export interface FieldNode {
  readonly index: number;
  readonly col: number;
  readonly row: number;
  readonly x: number;
  readonly y: number;
  readonly n: number;
  readonly reach: number;
  readonly axis: Line | null;
  readonly cone: number | null;
  readonly eigenvalues: readonly [number, number, number] | null;
  readonly angleToReference: number | null;
}

/**
 * Computes the local axis field of planes at positions `xy` (flat x, y; projected metres) with
 * unit poles `poles` (flat north-east-down x, y, z, one per position). Throws a RangeError
 * naming the bad value for mismatched lengths, non-finite entries or bad options.
 * @example
 * const field = localAxisField(xy, poles, { nx: 100, ny: 100, k: 50 });
 * fieldNode(field, 0).axis // {trend, plunge} of the pi axis of the 50 planes nearest to node 0
 */
export function localAxisField(xy: ArrayLike<number>, poles: ArrayLike<number>, options: LocalAxisFieldOptions = {}): LocalAxisField {
  const n = xy.length / 2;
  if (xy.length % 2 !== 0) throw new RangeError(`localAxisField: xy has ${xy.length} numbers; expected x, y pairs`);
  if (poles.length !== 3 * n) throw new RangeError(`localAxisField: ${poles.length / 3} poles for ${n} positions; expected one pole per position`);
  for (let i = 0; i < poles.length; i++) {
    if (!Number.isFinite(poles[i])) throw new RangeError(`localAxisField: pole ${Math.floor(i / 3)} has a non-finite component (${poles[i]})`);
  }
  const grid = fieldGrid(xy, options);
  const radius = options.radius;
  if (radius !== undefined && !(radius > 0 && Number.isFinite(radius))) throw new RangeError(`localAxisField: radius ${String(radius)} is not a positive distance`);
  const k = options.k ?? FIELD_DEFAULTS.k;
  if (!(Number.isInteger(k) && k >= 3)) throw new RangeError(`localAxisField: k = ${String(k)} (expected a whole number of at least 3)`);
  const minCount = options.minCount ?? FIELD_DEFAULTS.minCount;
  if (!(Number.isInteger(minCount) && minCount >= 3)) throw new RangeError(`localAxisField: minCount = ${String(minCount)} (expected a whole number of at least 3)`);
  const maxReach = options.maxReach ?? null;
  if (maxReach !== null && !(maxReach > 0)) throw new RangeError(`localAxisField: maxReach ${String(maxReach)} is not a positive distance`);

  let reference: Line | null = options.reference ?? null;
  if (reference === null && n >= 3) {
    const fit = fitGirdleToArray(poles);
    reference = fit.axisDefined ? fit.axis : null;
  }
  const ref = reference ? lineToVector(reference) : null;

  const index = buildPointIndex(xy);
  const nodes = grid.nx * grid.ny;
  const out = {
    count: new Int32Array(nodes),
    reach: new Float64Array(nodes).fill(Number.NaN),
    axis: new Float64Array(3 * nodes).fill(Number.NaN),
    trend: new Float64Array(nodes).fill(Number.NaN),
    plunge: new Float64Array(nodes).fill(Number.NaN),
    cone: new Float64Array(nodes).fill(Number.NaN),
    eigenvalues: new Float64Array(3 * nodes).fill(Number.NaN),
    angleToReference: new Float64Array(nodes).fill(Number.NaN),
  };
  const scratch = nearestScratch(k);
  const within = radius === undefined ? null : new Int32Array(Math.max(1, n));
  for (let row = 0; row < grid.ny; row++) {
    const y = grid.minY + (row + 0.5) * grid.dy;
    for (let col = 0; col < grid.nx; col++) {
      const x = grid.minX + (col + 0.5) * grid.dx;
      const node = row * grid.nx + col;
      let ids: Int32Array;
      let count: number;
      let reach2 = 0;
      if (within) {
        count = n === 0 ? 0 : index.tree.withinInto(x, y, radius!, within);
        ids = within;
        for (let m = 0; m < count; m++) {
          const j = ids[m];
          const ddx = xy[2 * j] - x;
          const ddy = xy[2 * j + 1] - y;
          reach2 = Math.max(reach2, ddx * ddx + ddy * ddy);
        }
      } else {
        count = nearestInto(index, x, y, scratch);
        ids = scratch.ids;
        for (let m = 0; m < count; m++) reach2 = Math.max(reach2, scratch.d2[m]);
      }
      out.count[node] = count;
      out.reach[node] = count > 0 ? Math.sqrt(reach2) : Number.NaN;
      if (count < minCount || (maxReach !== null && Math.sqrt(reach2) > maxReach)) continue;
      windowAxis(poles, ids, count, node, out, ref);
    }
  }
  return { grid, window: radius === undefined ? { mode: 'nearest', k } : { mode: 'radius', radius }, minCount, maxReach, ...out, reference };
}

/** The grid implied by the options and the points. */
function fieldGrid(xy: ArrayLike<number>, options: LocalAxisFieldOptions): FieldGrid {
  const nx = options.nx ?? FIELD_DEFAULTS.nx;
  const ny = options.ny ?? FIELD_DEFAULTS.ny;
  for (const [name, v] of [['nx', nx], ['ny', ny]] as const) {
    if (!(Number.isInteger(v) && v >= 1 && v <= 4096)) throw new RangeError(`localAxisField: ${name} = ${String(v)} (expected a whole number of nodes from 1 to 4096)`);
  }
  let bounds = options.bounds;
  if (bounds === undefined) {
    let minX = Infinity, minY = Infinity, maxX = -Infinity, maxY = -Infinity;
    for (let i = 0; i < xy.length; i += 2) {
      const x = xy[i], y = xy[i + 1];
      if (!Number.isFinite(x) || !Number.isFinite(y)) throw new RangeError(`localAxisField: position ${i / 2} is (${x}, ${y}); expected finite coordinates`);
      if (x < minX) minX = x;
      if (x > maxX) maxX = x;
      if (y < minY) minY = y;
      if (y > maxY) maxY = y;
    }
    if (!(minX <= maxX)) throw new RangeError('localAxisField: no positions, so no bounds for the grid (give bounds)');
    bounds = [minX, minY, maxX, maxY];
  }
  const [minX, minY, maxX, maxY] = bounds;
  if (![minX, minY, maxX, maxY].every(Number.isFinite) || !(maxX >= minX && maxY >= minY)) {
    throw new RangeError(`localAxisField: bounds [${bounds.join(', ')}] are not [minX, minY, maxX, maxY] with max >= min`);
  }
  // A grid over points on one line still needs cells of some size.
  const w = maxX - minX || 1;
  const h = maxY - minY || 1;
  return { minX: maxX > minX ? minX : minX - 0.5, minY: maxY > minY ? minY : minY - 0.5, dx: w / nx, dy: h / ny, nx, ny };
}

interface FieldArrays {
  readonly axis: Float64Array;
  readonly trend: Float64Array;
  readonly plunge: Float64Array;
  readonly cone: Float64Array;
  readonly eigenvalues: Float64Array;
  readonly angleToReference: Float64Array;
}

/** Fits the window's girdle and writes axis, eigenvalues, cone proxy and angle to the reference. */
function windowAxis(poles: ArrayLike<number>, ids: Int32Array, count: number, node: number, out: FieldArrays, ref: { x: number; y: number; z: number } | null): void {
  let xx = 0, xy = 0, xz = 0, yy = 0, yz = 0, zz = 0;
  for (let m = 0; m < count; m++) {
    const o = 3 * ids[m];
    const px = poles[o], py = poles[o + 1], pz = poles[o + 2];
    xx += px * px; xy += px * py; xz += px * pz;
    yy += py * py; yz += py * pz; zz += pz * pz;
  }
  const { values, vectors } = eigenSymmetric3({ xx, xy, xz, yy, yz, zz });
  const total = values[0] + values[1] + values[2];
  const s1 = values[0] / total, s2 = values[1] / total, s3 = Math.max(0, values[2] / total);
  out.eigenvalues[3 * node] = s1;
  out.eigenvalues[3 * node + 1] = s2;
  out.eigenvalues[3 * node + 2] = s3;
  if (!(s2 - s3 > AXIS_DEGENERACY)) return;
  const [e1, e2, e3] = vectors;
  out.axis[3 * node] = e3.x;
  out.axis[3 * node + 1] = e3.y;
  out.axis[3 * node + 2] = e3.z;
  const horizontal = Math.hypot(e3.x, e3.y);
  out.plunge[node] = toDegrees(Math.atan2(e3.z, horizontal));
  out.trend[node] = horizontal < 1e-12 ? 0 : normalizeAzimuth(toDegrees(Math.atan2(e3.y, e3.x)));
  // Second pass: the fourth moments that the first-order cone needs.
  let m13 = 0, m23 = 0;
  for (let m = 0; m < count; m++) {
    const o = 3 * ids[m];
    const px = poles[o], py = poles[o + 1], pz = poles[o + 2];
    const a1 = px * e1.x + py * e1.y + pz * e1.z;
    const a2 = px * e2.x + py * e2.y + pz * e2.z;
    const a3 = px * e3.x + py * e3.y + pz * e3.z;
    m13 += a1 * a1 * a3 * a3;
    m23 += a2 * a2 * a3 * a3;
  }
  const sigma1 = Math.sqrt(m13) / (count * (s1 - s3));
  const sigma2 = Math.sqrt(m23) / (count * (s2 - s3));
  out.cone[node] = Math.min(90, toDegrees(CONE_FACTOR * Math.max(sigma1, sigma2)));
  if (ref) out.angleToReference[node] = toDegrees(acosClamped(Math.abs(e3.x * ref.x + e3.y * ref.y + e3.z * ref.z)));
}

/**
 * Position of a node (the centre of its cell).
 * @example nodePosition(field.grid, 0) // [minX + dx/2, minY + dy/2]
 */
export function nodePosition(grid: FieldGrid, node: number): [number, number] {
  const col = node % grid.nx;
  const row = Math.floor(node / grid.nx);
  return [grid.minX + (col + 0.5) * grid.dx, grid.minY + (row + 0.5) * grid.dy];
}

/**
 * One node as a JSON-friendly object (null where undefined).
 * @example fieldNode(field, 12).axis // {trend: 75.2, plunge: 11.8} or null
 */
export function fieldNode(field: LocalAxisField, node: number): FieldNode {
  const { grid } = field;
  if (!(Number.isInteger(node) && node >= 0 && node < grid.nx * grid.ny)) throw new RangeError(`fieldNode: node ${String(node)} is not a node of the ${grid.nx} × ${grid.ny} grid`);
  const [x, y] = nodePosition(grid, node);
  const defined = Number.isFinite(field.trend[node]);
  const ev = field.eigenvalues;
  return {
    index: node,
    col: node % grid.nx,
    row: Math.floor(node / grid.nx),
    x,
    y,
    n: field.count[node],
    reach: finiteOrNull(field.reach[node]) ?? 0,
    axis: defined ? { trend: field.trend[node], plunge: field.plunge[node] } : null,
    cone: finiteOrNull(field.cone[node]),
    eigenvalues: Number.isFinite(ev[3 * node]) ? [ev[3 * node], ev[3 * node + 1], ev[3 * node + 2]] : null,
    angleToReference: finiteOrNull(field.angleToReference[node]),
  };
}

/**
 * Every node as a JSON-friendly object, in node order.
 * @example fieldNodes(field).filter((n) => n.axis !== null).length
 */
export function fieldNodes(field: LocalAxisField): FieldNode[] {
  return Array.from({ length: field.grid.nx * field.grid.ny }, (_, i) => fieldNode(field, i));
}

const finiteOrNull = (v: number): number | null => (Number.isFinite(v) ? v : null);
