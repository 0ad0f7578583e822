import KDBush from 'kdbush';

/**
 * k nearest neighbours of planar points, on a kdbush index.
 *
 * kdbush (Agafonkin) keeps points kd-sorted in flat arrays: the range [left, right] splits at
 * its middle item m = (left + right) >> 1 on the x axis, then y, then x..., and ranges of at
 * most `nodeSize` items are leaves. kdbush itself answers box and radius queries; the k-nearest
 * search here walks the same layout with the classic branch-and-bound of Friedman, Bentley &
 * Finkel (1977, "An algorithm for finding best matches in logarithmic expected time", ACM TOMS
 * 3, 209-226; from memory): visit the half that holds the query first, keep the k best so far
 * in a max-heap, and skip a half whose splitting line is farther away than the k-th best.
 * (geokdbush's `around` does the same on the sphere with a priority queue of boxes.)
 *
 * Distances are Euclidean in the units of the coordinates (projected metres for a map).
 */

/** A built index over planar points. */
export interface PointIndex {
  readonly size: number;
  /** The kdbush tree (ids and coordinates in kd order). */
  readonly tree: KDBush;
}

/**
 * Builds the index over flat [x0, y0, x1, y1, ...] coordinates. Throws a RangeError naming the
 * first point with a non-finite coordinate.
 * @example const index = buildPointIndex(new Float64Array([0, 0, 10, 0, 0, 10]));
 */
export function buildPointIndex(xy: ArrayLike<number>, nodeSize = 16): PointIndex {
  if (xy.length % 2 !== 0) throw new RangeError(`point index: ${xy.length} numbers is not a list of x, y pairs`);
  const n = xy.length / 2;
  for (let i = 0; i < xy.length; i++) {
    if (!Number.isFinite(xy[i])) throw new RangeError(`point index: point ${i >> 1} has a non-finite ${i % 2 === 0 ? 'x' : 'y'} (${xy[i]})`);
  }
  // kdbush needs at least one item to be searchable; an empty index answers with nothing.
  const tree = new KDBush(Math.max(n, 1), nodeSize);
  for (let i = 0; i < n; i++) tree.add(xy[2 * i], xy[2 * i + 1]);
  if (n === 0) tree.add(0, 0);
  tree.finish();
  return { size: n, tree };
}

/** Scratch space for repeated k-nearest queries with the same k (no allocation per query). */
export interface NearestScratch {
  readonly k: number;
  /** Squared distances of the found points (a max-heap while searching, unordered after). */
  readonly d2: Float64Array;
  /** Their ids. */
  readonly ids: Int32Array;
  /** Traversal stack: left, right, axis and lower bound (squared distance) per entry. */
  readonly stack: Float64Array;
}

/**
 * Scratch space for k-nearest queries.
 * @example const scratch = nearestScratch(50);
 */
export function nearestScratch(k: number): NearestScratch {
  if (!(Number.isInteger(k) && k >= 1)) throw new RangeError(`k nearest: k = ${String(k)} (expected a whole number of at least 1)`);
  // Depth of the tree is at most about log2(2^32) = 32; two entries are pushed per level.
  return { k, d2: new Float64Array(k), ids: new Int32Array(k), stack: new Float64Array(4 * 80) };
}

/**
 * Finds the min(k, size) points nearest to (qx, qy). Their ids and squared distances are left
 * in `scratch.ids` / `scratch.d2` (first `count` entries, in no particular order); returns the
 * count. Ties at the k-th distance are broken by the order of the search.
 * @example
 * const s = nearestScratch(2);
 * const count = nearestInto(index, 1, 1, s); // s.ids.subarray(0, count): the two nearest points
 */
export function nearestInto(index: PointIndex, qx: number, qy: number, scratch: NearestScratch): number {
  const { tree } = index;
  const ids = tree.ids;
  const coords = tree.coords;
  const nodeSize = tree.nodeSize;
  const k = scratch.k;
  const heapD = scratch.d2;
  const heapI = scratch.ids;
  const stack = scratch.stack;
  if (index.size === 0) return 0;
  let count = 0;
  let sp = 0;
  stack[sp++] = 0;
  stack[sp++] = index.size - 1;
  stack[sp++] = 0;
  stack[sp++] = 0;
  while (sp > 0) {
    const bound = stack[--sp];
    const axis = stack[--sp];
    const right = stack[--sp];
    const left = stack[--sp];
    if (count === k && bound >= heapD[0]) continue;
    if (right - left <= nodeSize) {
      for (let i = left; i <= right; i++) {
        const dx = coords[2 * i] - qx;
        const dy = coords[2 * i + 1] - qy;
        count = offer(heapD, heapI, count, k, dx * dx + dy * dy, ids[i]);
      }
      continue;
    }
    const m = (left + right) >> 1;
    const x = coords[2 * m];
    const y = coords[2 * m + 1];
    const dx = x - qx;
    const dy = y - qy;
    count = offer(heapD, heapI, count, k, dx * dx + dy * dy, ids[m]);
    const delta = axis === 0 ? qx - x : qy - y;
    const farBound = Math.max(bound, delta * delta);
    // Push the far half first so that the near half is searched first.
    if (delta < 0) {
      stack[sp++] = m + 1; stack[sp++] = right; stack[sp++] = 1 - axis; stack[sp++] = farBound;
      stack[sp++] = left; stack[sp++] = m - 1; stack[sp++] = 1 - axis; stack[sp++] = bound;
    } else {
      stack[sp++] = left; stack[sp++] = m - 1; stack[sp++] = 1 - axis; stack[sp++] = farBound;
      stack[sp++] = m + 1; stack[sp++] = right; stack[sp++] = 1 - axis; stack[sp++] = bound;
    }
  }
  return count;
}

/**
 * The ids of the min(k, size) points nearest to (qx, qy), nearest first (a convenience over
 * {@link nearestInto} for single queries).
 * @example nearestPoints(buildPointIndex(new Float64Array([0, 0, 5, 0, 9, 0])), 6, 0, 2) // [1, 2]
 */
export function nearestPoints(index: PointIndex, qx: number, qy: number, k: number): number[] {
  const s = nearestScratch(k);
  const count = nearestInto(index, qx, qy, s);
  const order = Array.from({ length: count }, (_, i) => i).sort((a, b) => s.d2[a] - s.d2[b] || s.ids[a] - s.ids[b]);
  return order.map((i) => s.ids[i]);
}

/** Adds a candidate to the bounded max-heap (root = farthest kept); returns the new count. */
function offer(heapD: Float64Array, heapI: Int32Array, count: number, k: number, d2: number, id: number): number {
  if (count < k) {
    // Sift up.
    let i = count;
    while (i > 0) {
      const parent = (i - 1) >> 1;
      if (heapD[parent] >= d2) break;
      heapD[i] = heapD[parent];
      heapI[i] = heapI[parent];
      i = parent;
    }
    heapD[i] = d2;
    heapI[i] = id;
    return count + 1;
  }
  if (d2 >= heapD[0]) return count;
  // Replace the root and sift down.
  let i = 0;
  for (;;) {
    const l = 2 * i + 1;
    if (l >= k) break;
    const r = l + 1;
    const c = r < k && heapD[r] > heapD[l] ? r : l;
    if (heapD[c] <= d2) break;
    heapD[i] = heapD[c];
    heapI[i] = heapI[c];
    i = c;
  }
  heapD[i] = d2;
  heapI[i] = id;
  return count;
}
