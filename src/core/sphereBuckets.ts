/**
 * Spatial bucketing of axes (unit vectors without sense) so that a density node only looks at
 * the data near it instead of at all of them.
 *
 * Both ends of every axis (+v and -v) go into a uniform 3D grid of cubic cells over [-1, 1]³,
 * stored compactly (counting sort: `cellStart` offsets into `entries`). An entry is the axis
 * index i for +v and ~i (= -i - 1) for -v. A query for the axes within a cap of cosine c > 0
 * around a unit vector u scans only the cells meeting the box u ± chord, where chord =
 * √(2 - 2c) is the straight-line distance from u to the cap's rim: every end inside the cap
 * lies inside that box. Because c > 0 at most one end of an axis lies in the cap, and the
 * signed dot product s·(u·v) of that end equals |u·v| exactly (negation is exact in floating
 * point), so bucketed sums see exactly the same terms as the all-pairs loop.
 */

/** Bucketed axes; build with {@link bucketAxes}. */
export interface SphereBuckets {
  /** The interleaved unit vectors that were bucketed (not copied). */
  readonly vectors: Float64Array;
  readonly cellsPerAxis: number;
  readonly cellSize: number;
  /** Offsets into entries: cell j holds entries[cellStart[j] .. cellStart[j + 1]). */
  readonly cellStart: Int32Array;
  /** Signed axis indices: i for +v, ~i for -v. */
  readonly entries: Int32Array;
}

/** Upper bound on cells per axis (128³ offsets = 8 MB); smaller cells than that stop paying off. */
const MAX_CELLS_PER_AXIS = 48;

/**
 * Slack added to the squared chord: covers input vectors up to 1e-6 off unit length and
 * rounding in the dot product, so the box never misses an end that the cap test accepts.
 */
const CHORD_SLACK = 1e-5;

/**
 * Buckets both ends of each axis into cubic cells of at least `cellSize` (the query chord is a
 * good choice: each query then scans at most 3 cells per axis).
 * @example
 * const b = bucketAxes(Float64Array.of(0, 0, 1), 0.1);
 * b.entries.length // 2 (both ends)
 */
export function bucketAxes(vectors: Float64Array, cellSize: number): SphereBuckets {
  if (!(cellSize > 0)) throw new RangeError(`cell size ${String(cellSize)} is not usable; expected a positive length`);
  const cellsPerAxis = Math.max(1, Math.min(MAX_CELLS_PER_AXIS, Math.floor(2 / cellSize)));
  const size = 2 / cellsPerAxis;
  const n = vectors.length / 3;
  const cellOf = new Int32Array(2 * n);
  const cellStart = new Int32Array(cellsPerAxis ** 3 + 1);
  for (let i = 0; i < n; i++) {
    const x = vectors[3 * i];
    const y = vectors[3 * i + 1];
    const z = vectors[3 * i + 2];
    const plus = cellIndex(x, y, z, size, cellsPerAxis);
    const minus = cellIndex(-x, -y, -z, size, cellsPerAxis);
    cellOf[2 * i] = plus;
    cellOf[2 * i + 1] = minus;
    cellStart[plus + 1]++;
    cellStart[minus + 1]++;
  }
  for (let j = 1; j < cellStart.length; j++) cellStart[j] += cellStart[j - 1];
  const fill = cellStart.slice(0, -1);
  const entries = new Int32Array(2 * n);
  for (let i = 0; i < n; i++) {
    entries[fill[cellOf[2 * i]]++] = i;
    entries[fill[cellOf[2 * i + 1]]++] = ~i;
  }
  return { vectors, cellsPerAxis, cellSize: size, cellStart, entries };
}

/**
 * Chord from a unit vector to the rim of the cap of cosine `minCos`, with slack for rounding.
 * @example capChord(0) // ≈ 1.414 (a hemisphere)
 */
export function capChord(minCos: number): number {
  return Math.sqrt(Math.max(0, 2 - 2 * minCos) + CHORD_SLACK);
}

/**
 * Sum of weight(|u·v|) over the axes v with |u·v| >= minCos (minCos > 0), visiting only the
 * buckets near u. `weight` receives |u·v|.
 * @example
 * const b = bucketAxes(Float64Array.of(0, 0, 1, 0, 0, -1), capChord(0.9));
 * sumNearAxis(b, 0, 0, 1, 0.9, () => 1) // 2 (both count: axes have no sense)
 */
export function sumNearAxis(
  buckets: SphereBuckets,
  ux: number,
  uy: number,
  uz: number,
  minCos: number,
  weight: (cosAngle: number) => number,
): number {
  if (!(minCos > 0)) throw new RangeError(`cap cosine ${String(minCos)} is not usable for a bucketed search; expected a value above 0`);
  const { vectors, cellsPerAxis: g, cellSize, cellStart, entries } = buckets;
  const reach = capChord(minCos);
  const x0 = cellCoord(ux - reach, cellSize, g);
  const x1 = cellCoord(ux + reach, cellSize, g);
  const y0 = cellCoord(uy - reach, cellSize, g);
  const y1 = cellCoord(uy + reach, cellSize, g);
  const z0 = cellCoord(uz - reach, cellSize, g);
  const z1 = cellCoord(uz + reach, cellSize, g);
  let sum = 0;
  for (let cx = x0; cx <= x1; cx++) {
    for (let cy = y0; cy <= y1; cy++) {
      const rowBase = (cx * g + cy) * g;
      // Cells along z are contiguous, so one run of entries covers z0..z1.
      const end = cellStart[rowBase + z1 + 1];
      for (let e = cellStart[rowBase + z0]; e < end; e++) {
        const entry = entries[e];
        const i = entry < 0 ? ~entry : entry;
        const d = ux * vectors[3 * i] + uy * vectors[3 * i + 1] + uz * vectors[3 * i + 2];
        const c = entry < 0 ? -d : d;
        if (c >= minCos) sum += weight(c);
      }
    }
  }
  return sum;
}

/**
 * The all-pairs reference: sum of weight(|u·v|) over every axis v with |u·v| >= minCos.
 * @example sumAllAxes(Float64Array.of(0, 0, 1, 1, 0, 0), 0, 0, 1, 0.9, () => 1) // 1
 */
export function sumAllAxes(
  vectors: Float64Array,
  ux: number,
  uy: number,
  uz: number,
  minCos: number,
  weight: (cosAngle: number) => number,
): number {
  let sum = 0;
  for (let i = 0; i < vectors.length; i += 3) {
    const c = Math.abs(ux * vectors[i] + uy * vectors[i + 1] + uz * vectors[i + 2]);
    if (c >= minCos) sum += weight(c);
  }
  return sum;
}

function cellCoord(t: number, size: number, g: number): number {
  const c = Math.floor((t + 1) / size);
  return c < 0 ? 0 : c >= g ? g - 1 : c;
}

function cellIndex(x: number, y: number, z: number, size: number, g: number): number {
  return (cellCoord(x, size, g) * g + cellCoord(y, size, g)) * g + cellCoord(z, size, g);
}
