import type { NetKind } from './netProjection';
/**
 * The grid over the net on which orientation density is evaluated, and what a density
 * evaluation returns. The counting itself lives in kamb.ts (Kamb 1959 counting) and
 * exponentialDensity.ts (Vollmer 1995 exponential smoothing); both fill this same grid.
 *
 * Grid layout: a square of `width` x `height` nodes over the net, row-major, row 0 along
 * the north edge and column 0 along the west edge, so that the values can be handed straight
 * to d3-contour (`contours().size([width, height])`) and its output drawn in screen
 * coordinates (y down = south). Net coordinates have x = east, y = north and the primitive
 * circle has radius 1.
 *
 * Nodes outside the primitive: the grid runs one node beyond the primitive on every side. Nodes
 * whose cell can touch the primitive (within √2 node spacings of it) hold the density of the
 * direction that the net's inverse formula gives when continued past the primitive. Past the
 * primitive that formula yields upper-hemisphere directions, and because the data are axial the
 * density there is that of the antipodal lower-hemisphere direction just inside the opposite side
 * of the primitive: the hemisphere-wrapped density. So a contour that reaches the primitive
 * crosses it smoothly. Nodes further out (towards the corners of the square) hold 0, below every
 * contour level, so d3-contour closes each polygon outside the circle (a segment across one cell
 * with both ends outside the unit circle dips inside it by at most step²/4). A renderer clips
 * the contours to the primitive circle.
 */
import { RAD, acosClamped, asinClamped } from './math';
import { lineToVector } from './vectors';
import type { Line } from './types';


/** Which density estimate filled the grid. */
export type DensityMethod = 'kamb' | 'exponential';

/**
 * How each node finds the data near it: `buckets` (default) looks only in a spatial bucketing
 * of the unit vectors; `all-pairs` tests every datum at every node (the slow reference).
 */
export type SearchStrategy = 'buckets' | 'all-pairs';

/** Options shared by the density estimates. */
export interface DensityOptions {
  /** Nodes across the primitive's diameter, an integer from 3 to 1001. Default 101 (odd, so a node sits at the centre). */
  readonly resolution?: number;
  /** Net the grid is laid over. Default 'equal-area'. */
  readonly net?: NetKind;
  /** Contour interval in multiples of sigma. Default 2: Kamb contours are drawn at 2-sigma intervals (common practice). */
  readonly interval?: number;
  /** Default 'buckets'; 'all-pairs' is the slow reference used by tests and benchmarks. */
  readonly strategy?: SearchStrategy;
}

/**
 * Density over the net, ready for d3-contour.
 *
 * `values` are densities in multiples of sigma: the count (or summed weight) at a node divided
 * by `sigma`, the standard deviation of that count for `n` directions drawn from a uniform
 * distribution. A uniform distribution has mean value `expected / sigma` (3 for both methods,
 * by construction of their counting areas). `levels` are the contour thresholds in the same
 * units: interval, 2·interval, ... up to the largest value.
 */
export interface DensityGrid {
  readonly method: DensityMethod;
  readonly net: NetKind;
  /** Number of directions counted. */
  readonly n: number;
  /** Nodes per row and per column (resolution + 2: one extra node beyond the primitive each side). */
  readonly width: number;
  readonly height: number;
  /** Row-major densities in multiples of sigma, length width·height; 0 at far nodes outside the primitive. */
  readonly values: Float64Array;
  /** Contour thresholds in multiples of sigma. */
  readonly levels: number[];
  /** Expected count (Kamb) or summed weight (exponential) at a node for uniform data. */
  readonly expected: number;
  /** Standard deviation of that count or weight for uniform data. */
  readonly sigma: number;
  /** Counting angle in degrees: the cap half-angle (Kamb) or the angle where the weight falls to 1/e (exponential). */
  readonly countingAngle: number;
  /** Exponent k of the exponential weight; undefined for Kamb counting. */
  readonly k?: number;
  /** Net x of column 0 and net y of row 0; net spacing between nodes. */
  readonly x0: number;
  readonly y0: number;
  readonly step: number;
}

/** Nodes of a grid over the net and their directions. */
export interface NetGridNodes {
  readonly net: NetKind;
  readonly width: number;
  readonly height: number;
  readonly x0: number;
  readonly y0: number;
  readonly step: number;
  /** Interleaved north-east-down unit vectors, one per node, row-major. */
  readonly directions: Float64Array;
  /** 1 for nodes whose density is evaluated (inside or next to the primitive), 0 for far nodes that hold 0. */
  readonly evaluated: Uint8Array;
}

/**
 * Default nodes across the primitive's diameter.
 * @example
 * const nodes = DEFAULT_DENSITY_RESOLUTION ** 2; // grid nodes before the circle is cut out
 */
export const DEFAULT_DENSITY_RESOLUTION = 101;

/**
 * Default contour interval in sigma (common practice for Kamb contours).
 * @example
 * const secondLevel = 2 * DEFAULT_CONTOUR_INTERVAL; // 4 sigma
 */
export const DEFAULT_CONTOUR_INTERVAL = 2;

/** Largest number of contour levels returned, so a tiny interval cannot produce a huge array. */
const MAX_LEVELS = 1000;

/** How far from unit length an input vector may be (squared length within 1 ± this). */
const UNIT_TOLERANCE = 1e-6;

/**
 * Direction (north-east-down unit vector) under a point of the lower-hemisphere net.
 * Equal-area: r = √2·sin(θ/2), equal-angle: r = tan(θ/2), θ = angle from the vertical, trend
 * = atan2(x, y) (Snyder 1987, polar forms scaled to a unit primitive). Past the primitive the
 * same formulas continue into the upper hemisphere; the equal-area formula stops at r = √2
 * (the upward vertical), so r is clamped there.
 * @example netInverse(0, 0, 'equal-area') // [0, 0, 1] (vertical)
 * @example netInverse(1, 0, 'equal-area') // ≈ [0, 1, 0] (horizontal, trend 090)
 */
export function netInverse(x: number, y: number, net: NetKind): [north: number, east: number, down: number] {
  const r = Math.hypot(x, y);
  if (r === 0) return [0, 0, 1];
  const theta = net === 'equal-area' ? 2 * asinClamped(r / Math.SQRT2) : 2 * Math.atan(r);
  const s = Math.sin(theta) / r;
  return [s * y, s * x, Math.cos(theta)];
}

/**
 * The nodes of a density grid: `resolution` nodes across the primitive's diameter plus one
 * node beyond it on every side.
 * @example netGridNodes(101, 'equal-area').width // 103
 */
export function netGridNodes(resolution: number, net: NetKind): NetGridNodes {
  checkResolution(resolution);
  checkNet(net);
  const width = resolution + 2;
  const height = width;
  const step = 2 / (resolution - 1);
  const x0 = -1 - step;
  const y0 = 1 + step;
  const directions = new Float64Array(width * height * 3);
  const evaluated = new Uint8Array(width * height);
  // A cell meets the primitive only if one of its corners is within a cell diagonal of it.
  const reach = 1 + Math.SQRT2 * step * (1 + 1e-9);
  for (let row = 0; row < height; row++) {
    const y = y0 - row * step;
    for (let col = 0; col < width; col++) {
      const x = x0 + col * step;
      const [n, e, d] = netInverse(x, y, net);
      const j = row * width + col;
      directions[3 * j] = n;
      directions[3 * j + 1] = e;
      directions[3 * j + 2] = d;
      evaluated[j] = Math.hypot(x, y) <= reach ? 1 : 0;
    }
  }
  return { net, width, height, x0, y0, step, directions, evaluated };
}

/**
 * Net coordinates (x east, y north, primitive radius 1) of a grid node; fractional indices
 * interpolate linearly.
 * @example gridNodeToNet(grid, 1, 1) // {x: -1, y: 1} (first node on the primitive's bounding square)
 */
export function gridNodeToNet(grid: Pick<DensityGrid, 'x0' | 'y0' | 'step'>, col: number, row: number): { x: number; y: number } {
  return { x: grid.x0 + col * grid.step, y: grid.y0 - row * grid.step };
}

/**
 * Net coordinates of a point of d3-contour output. d3-contour puts the value of node (col, row)
 * at (col + 0.5, row + 0.5) (seen with d3-contour 4.0.3), so half a cell is taken off first.
 * @example
 * const rings = contours().size([grid.width, grid.height]).thresholds(grid.levels)(Array.from(grid.values));
 * rings[0].coordinates[0][0].map((p) => contourPointToNet(grid, p));
 */
export function contourPointToNet(grid: Pick<DensityGrid, 'x0' | 'y0' | 'step'>, point: readonly number[]): { x: number; y: number } {
  return gridNodeToNet(grid, point[0] - 0.5, point[1] - 0.5);
}

/**
 * Contour thresholds interval, 2·interval, ... up to the largest value (at most 1000 levels).
 * @example contourLevels(Float64Array.of(0, 3, 7.5), 2) // [2, 4, 6]
 */
export function contourLevels(values: Float64Array, interval: number): number[] {
  if (!(Number.isFinite(interval) && interval > 0)) {
    throw new RangeError(`contour interval ${String(interval)} is not usable; expected a positive number of sigma`);
  }
  let max = -Infinity;
  for (let i = 0; i < values.length; i++) if (values[i] > max) max = values[i];
  const levels: number[] = [];
  for (let i = 1; i * interval <= max && levels.length < MAX_LEVELS; i++) levels.push(i * interval);
  return levels;
}

/**
 * Interleaved north-east-down unit vectors of lines (trend and plunge in degrees).
 * @example axesFromLines([{trend: 90, plunge: 0}]) // Float64Array [≈0, 1, 0]
 */
export function axesFromLines(lines: readonly Line[]): Float64Array {
  const out = new Float64Array(lines.length * 3);
  lines.forEach((line, i) => {
    const { trend, plunge } = line ?? ({} as Line);
    if (!(Number.isFinite(trend) && trend >= 0 && trend <= 360)) {
      throw new RangeError(`line ${i}, field trend: ${String(trend)} is not a trend; expected degrees from 0 to 360`);
    }
    if (!(Number.isFinite(plunge) && plunge >= 0 && plunge <= 90)) {
      throw new RangeError(`line ${i}, field plunge: ${String(plunge)} is not a plunge; expected degrees from 0 to 90`);
    }
    const v = lineToVector(line);
    out[3 * i] = v.x;
    out[3 * i + 1] = v.y;
    out[3 * i + 2] = v.z;
  });
  return out;
}

/**
 * Checks density input and returns it as interleaved unit vectors (the same array when it is
 * already one). Vectors may point into either hemisphere: the data are treated as axes.
 * @example readAxes([{trend: 0, plunge: 90}]) // Float64Array [0, 0, 1]
 */
export function readAxes(input: Float64Array | readonly Line[]): Float64Array {
  const vectors = input instanceof Float64Array ? input : axesFromLines(input);
  if (vectors.length === 0) throw new RangeError('density needs at least one direction; got none');
  if (vectors.length % 3 !== 0) {
    throw new RangeError(`direction array length ${vectors.length} is not a multiple of 3; expected interleaved x, y, z`);
  }
  for (let i = 0; i < vectors.length; i += 3) {
    const x = vectors[i];
    const y = vectors[i + 1];
    const z = vectors[i + 2];
    const len2 = x * x + y * y + z * z;
    if (!(Math.abs(len2 - 1) <= UNIT_TOLERANCE)) {
      throw new RangeError(
        `direction ${i / 3} (${x}, ${y}, ${z}) has length ${Math.sqrt(len2)}; expected a unit vector (length 1 ± ${UNIT_TOLERANCE / 2})`,
      );
    }
  }
  return vectors;
}

/**
 * Cap half-angle in degrees for a cosine threshold.
 * @example capAngleDegrees(0.5) // 60
 */
export function capAngleDegrees(minCos: number): number {
  return acosClamped(minCos) * RAD;
}

/**
 * Density options with defaults applied; throws a RangeError naming a bad option and its value.
 * @example resolveDensityOptions({}) // {resolution: 101, net: 'equal-area', interval: 2, strategy: 'buckets'}
 */
export function resolveDensityOptions(options: DensityOptions): Required<DensityOptions> {
  const resolved = {
    resolution: options.resolution ?? DEFAULT_DENSITY_RESOLUTION,
    net: options.net ?? 'equal-area',
    interval: options.interval ?? DEFAULT_CONTOUR_INTERVAL,
    strategy: options.strategy ?? 'buckets',
  } as const;
  checkResolution(resolved.resolution);
  checkNet(resolved.net);
  if (!(Number.isFinite(resolved.interval) && resolved.interval > 0)) {
    throw new RangeError(`option interval: ${String(resolved.interval)} is not usable; expected a positive number of sigma`);
  }
  if (resolved.strategy !== 'buckets' && resolved.strategy !== 'all-pairs') {
    throw new RangeError(`option strategy: "${String(resolved.strategy)}" is not known; expected "buckets" or "all-pairs"`);
  }
  return resolved;
}

function checkResolution(resolution: number): void {
  if (!(Number.isInteger(resolution) && resolution >= 3 && resolution <= 1001)) {
    throw new RangeError(`option resolution: ${String(resolution)} is not usable; expected a whole number of nodes from 3 to 1001`);
  }
}

function checkNet(net: string): void {
  if (net !== 'equal-area' && net !== 'equal-angle') {
    throw new RangeError(`option net: "${String(net)}" is not known; expected "equal-area" or "equal-angle"`);
  }
}
