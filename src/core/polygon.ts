/**
 * Planar point-in-polygon tests on flat coordinate arrays ([x0, y0, x1, y1, ...]), even-odd rule.
 * The even-odd rule is what makes the live lasso incremental: adding a vertex to a ring flips
 * exactly the points inside one triangle (see liveSelection.ts).
 */

/**
 * Whether (x, y) lies inside the closed ring (even-odd rule; the ring need not repeat its first vertex).
 * Points exactly on an edge may fall either way, as in every crossing-number test.
 * @example pointInRing(0.5, 0.5, new Float64Array([0, 0, 1, 0, 1, 1, 0, 1])) // true
 */
export function pointInRing(x: number, y: number, ring: ArrayLike<number>): boolean {
  let inside = false;
  const n = ring.length >> 1;
  for (let i = 0, j = n - 1; i < n; j = i++) {
    const xi = ring[2 * i];
    const yi = ring[2 * i + 1];
    const xj = ring[2 * j];
    const yj = ring[2 * j + 1];
    if (yi > y !== yj > y && x < ((xj - xi) * (y - yi)) / (yj - yi) + xi) inside = !inside;
  }
  return inside;
}

/**
 * The parity change of {@link pointInRing} when vertex c is appended to a ring that starts at a
 * and ends at b: true exactly for the points inside triangle abc. Each edge is evaluated with
 * the operands in the order pointInRing uses for it (closing edge b->a as (a, b), new edges as
 * (c, b) and (a, c)), so the floating-point result is bit-identical to recomputing the ring.
 * @example ringGrowthFlips(0.2, 0.2, 0, 0, 1, 0, 0, 1) // true
 */
export function ringGrowthFlips(x: number, y: number, ax: number, ay: number, bx: number, by: number, cx: number, cy: number): boolean {
  let flip = false;
  // Old closing edge: pointInRing sees it with i = first vertex (a), j = last vertex (b).
  if (ay > y !== by > y && x < ((bx - ax) * (y - ay)) / (by - ay) + ax) flip = !flip;
  // New edge b -> c: i = c, j = b.
  if (cy > y !== by > y && x < ((bx - cx) * (y - cy)) / (by - cy) + cx) flip = !flip;
  // New closing edge: i = a, j = c.
  if (ay > y !== cy > y && x < ((cx - ax) * (y - ay)) / (cy - ay) + ax) flip = !flip;
  return flip;
}

/**
 * Bounding box [minX, minY, maxX, maxY] of a flat coordinate array.
 * @example
 * boundsOf([0, 0, 4, 2, 1, 5]) // [0, 0, 4, 5]
 */
export function boundsOf(coords: ArrayLike<number>): [number, number, number, number] {
  let minX = Infinity;
  let minY = Infinity;
  let maxX = -Infinity;
  let maxY = -Infinity;
  for (let i = 0; i < coords.length; i += 2) {
    const x = coords[i];
    const y = coords[i + 1];
    if (x < minX) minX = x;
    if (x > maxX) maxX = x;
    if (y < minY) minY = y;
    if (y > maxY) maxY = y;
  }
  return [minX, minY, maxX, maxY];
}
