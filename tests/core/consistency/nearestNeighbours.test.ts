import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import KDBush from 'kdbush';
import { buildPointIndex, nearestInto, nearestPoints, nearestScratch } from '../../../src/core/consistency/nearestNeighbours';
import { mulberry32 } from '../../helpers/prng';

/** The k nearest by the plainest method: sort every point by distance (ties by id). */
function bruteNearest(xy: Float64Array, qx: number, qy: number, k: number): number[] {
  const n = xy.length / 2;
  return Array.from({ length: n }, (_, i) => i)
    .sort((a, b) => Math.hypot(xy[2 * a] - qx, xy[2 * a + 1] - qy) - Math.hypot(xy[2 * b] - qx, xy[2 * b + 1] - qy) || a - b)
    .slice(0, k);
}

describe('nearestPoints', () => {
  it('nearestPoints(index, x, y, k) returns the same points, in the same order, as sorting every point by distance (property)', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 1, max: 400 }),
        fc.integer({ min: 1, max: 60 }),
        fc.integer({ min: 1, max: 2 ** 31 - 1 }),
        fc.constantFrom(2, 4, 16, 64),
        (n, k, seed, nodeSize) => {
          const rnd = mulberry32(seed);
          // Integer coordinates on a small grid make ties common, which is the hard case for order.
          const xy = Float64Array.from({ length: 2 * n }, () => Math.floor(rnd() * 50));
          const qx = rnd() * 50;
          const qy = rnd() * 50;
          const index = buildPointIndex(xy, nodeSize);
          const found = nearestPoints(index, qx, qy, k);
          const brute = bruteNearest(xy, qx, qy, k);
          expect(found.length).toBe(Math.min(k, n));
          // Ties at the k-th distance may pick different ids: compare the distances, then the ids strictly closer.
          const d = (i: number): number => Math.hypot(xy[2 * i] - qx, xy[2 * i + 1] - qy);
          expect(found.map(d)).toEqual(brute.map(d));
          const kth = d(brute[brute.length - 1]);
          expect(new Set(found.filter((i) => d(i) < kth))).toEqual(new Set(brute.filter((i) => d(i) < kth)));
        },
      ),
      { numRuns: 300, seed: 7 },
    );
  });

  it('nearestInto(index, x, y, scratch) finds exactly the points that kdbush.within finds inside the k-th distance (kdbush 4.1 as the outside reference)', () => {
    const rnd = mulberry32(99);
    const n = 5000;
    const xy = Float64Array.from({ length: 2 * n }, () => 1000 * rnd());
    const index = buildPointIndex(xy);
    const reference = new KDBush(n);
    for (let i = 0; i < n; i++) reference.add(xy[2 * i], xy[2 * i + 1]);
    reference.finish();
    const scratch = nearestScratch(25);
    for (let q = 0; q < 200; q++) {
      const qx = 1000 * rnd();
      const qy = 1000 * rnd();
      const count = nearestInto(index, qx, qy, scratch);
      expect(count).toBe(25);
      const ids = Array.from(scratch.ids.subarray(0, count)).sort((a, b) => a - b);
      // sqrt then square can round below the k-th squared distance: widen by a part in 10^12.
      const reach = Math.sqrt(Math.max(...scratch.d2.subarray(0, count))) * (1 + 1e-12);
      expect(reference.within(qx, qy, reach).sort((a, b) => a - b)).toEqual(ids);
    }
  });

  it('nearestPoints(buildPointIndex([]), x, y, k) finds nothing, and buildPointIndex names a non-finite coordinate', () => {
    expect(nearestPoints(buildPointIndex(new Float64Array(0)), 0, 0, 3)).toEqual([]);
    expect(() => buildPointIndex(new Float64Array([0, 0, 1, Number.NaN]))).toThrow(/point 1 has a non-finite y \(NaN\)/);
    expect(() => buildPointIndex(new Float64Array([0, 0, 1]))).toThrow(/not a list of x, y pairs/);
    expect(() => nearestScratch(0)).toThrow(/k = 0/);
  });
});
