import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { thinningZooms } from '../../src/map/zoomThinning';

/** Cell of a point at a zoom, for cells of `px` CSS px on 512 px tiles (MapLibre's zoom). */
const cellOf = (x: number, y: number, z: number, px: number) => `${Math.floor((x * 512 * 2 ** z) / px)}:${Math.floor((y * 512 * 2 ** z) / px)}`;

describe('thinningZooms', () => {
  // Synthetic points with an answer by hand: cells of 64 px, so at zoom 0 the world is 8 x 8
  // cells, at zoom 1 16 x 16.
  it('thinningZooms(xy, options) keeps the first point of each cell and lets the second in where the cells split', () => {
    const xy = new Float64Array([
      0.01, 0.01, // A: first in cell (0, 0) at zoom 0
      0.1, 0.01, // B: same zoom-0 cell as A (0.1 * 8 = 0.8), own cell from zoom 1 (0.1 * 16 = 1.6)
      0.01, 0.012, // C: same cell as A down to zoom 3 at least (only 0.002 apart): from fullZoom
      0.9, 0.9, // D: alone
      NaN, NaN, // not drawn
    ]);
    const from = thinningZooms(xy, { minZoom: 0, fullZoom: 4, cellPx: () => [64, 64] });
    expect(Array.from(from)).toEqual([0, 1, 4, 0, Infinity]);
  });

  it('thinningZooms keeps at most one point per cell at every zoom, and one in every cell that has points (property, fixed cells)', () => {
    fc.assert(
      fc.property(fc.array(fc.tuple(fc.double({ min: 0, max: 0.999, noNaN: true }), fc.double({ min: 0, max: 0.999, noNaN: true })), { minLength: 1, maxLength: 200 }), fc.integer({ min: 8, max: 80 }), (pts, px) => {
        const xy = new Float64Array(pts.flat());
        const from = thinningZooms(xy, { minZoom: 0, fullZoom: 6, cellPx: () => [px, px] });
        for (let z = 0; z < 6; z++) {
          const kept = new Set<string>();
          const occupied = new Set<string>();
          pts.forEach(([x, y], i) => {
            const c = cellOf(x, y, z, px);
            occupied.add(c);
            if (from[i] <= z) {
              expect(kept.has(c), `two points kept in cell ${c} at zoom ${z}`).toBe(false);
              kept.add(c);
            }
          });
          expect(kept.size).toBe(occupied.size);
        }
      }),
      { numRuns: 60 },
    );
  });

  it('thinningZooms never takes a point back when zooming in (property, cells that grow with zoom)', () => {
    fc.assert(
      fc.property(fc.array(fc.tuple(fc.double({ min: 0, max: 0.999, noNaN: true }), fc.double({ min: 0, max: 0.999, noNaN: true })), { minLength: 1, maxLength: 200 }), (pts) => {
        const xy = new Float64Array(pts.flat());
        const from = thinningZooms(xy, { minZoom: 2, fullZoom: 9, cellPx: (z) => [6 + 3 * z, 4 + 2 * z] });
        for (const z of from) {
          expect(Number.isInteger(z)).toBe(true);
          expect(z).toBeGreaterThanOrEqual(2);
          expect(z).toBeLessThanOrEqual(9);
        }
        // The points kept at a zoom are a subset of those kept one zoom closer: the count never falls.
        for (let z = 2; z < 9; z++) expect(from.filter((f) => f <= z).length).toBeLessThanOrEqual(from.filter((f) => f <= z + 1).length);
      }),
      { numRuns: 40 },
    );
  });

  it('thinningZooms says which argument is wrong', () => {
    expect(() => thinningZooms(new Float64Array([0.5, 0.5]), { minZoom: 3, fullZoom: 2, cellPx: () => [8, 8] })).toThrow(/minZoom 3 and fullZoom 2/);
    expect(() => thinningZooms(new Float64Array([0.5, 0.5]), { minZoom: 0, fullZoom: 2, cellPx: () => [0, 8] })).toThrow(/cell 0 × 8 px at zoom 0/);
    expect(() => thinningZooms(new Float64Array([0.5, 0.5]), { minZoom: 25, fullZoom: 26, cellPx: () => [1, 1] })).toThrow(/too many cells/);
  });
});
