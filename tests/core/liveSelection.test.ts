import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { booleanPointInPolygon, point, polygon } from '@turf/turf';
import { pointInRing, ringGrowthFlips } from '../../src/core/polygon';
import { LiveSelection } from '../../src/core/liveSelection';
import { tensorSumsOfArray } from '../../src/core/orientationTensor';
import { mulberry32 } from '../helpers/prng';

function randomPoints(n: number, seed: number): Float64Array {
  const rnd = mulberry32(seed);
  const xy = new Float64Array(2 * n);
  for (let i = 0; i < xy.length; i++) xy[i] = rnd();
  return xy;
}

function randomPoles(n: number, seed: number): Float64Array {
  const rnd = mulberry32(seed);
  const out = new Float64Array(3 * n);
  for (let i = 0; i < n; i++) {
    const z = rnd();
    const a = rnd() * 2 * Math.PI;
    const r = Math.sqrt(1 - z * z);
    out.set([r * Math.cos(a), r * Math.sin(a), z], 3 * i);
  }
  return out;
}

const walk = fc.array(fc.tuple(fc.double({ min: 0, max: 1, noNaN: true }), fc.double({ min: 0, max: 1, noNaN: true })), { minLength: 3, maxLength: 40 });

describe('pointInRing', () => {
  it('pointInRing agrees with turf booleanPointInPolygon on star-shaped polygons (external reference: @turf/turf)', () => {
    const rnd = mulberry32(7);
    for (let k = 0; k < 200; k++) {
      const m = 3 + Math.floor(rnd() * 12);
      const ring: number[] = [];
      for (let j = 0; j < m; j++) {
        const a = (j / m) * 2 * Math.PI;
        const r = 0.1 + 0.4 * rnd();
        ring.push(0.5 + r * Math.cos(a), 0.5 + r * Math.sin(a));
      }
      const coords = [];
      for (let j = 0; j < m; j++) coords.push([ring[2 * j], ring[2 * j + 1]]);
      const poly = polygon([[...coords, coords[0]]]);
      for (let q = 0; q < 50; q++) {
        const x = rnd();
        const y = rnd();
        expect(pointInRing(x, y, ring)).toBe(booleanPointInPolygon(point([x, y]), poly));
      }
    }
  });

  it('ringGrowthFlips marks exactly the points whose membership changes when a vertex is appended (property)', () => {
    fc.assert(
      fc.property(walk, fc.double({ min: 0, max: 1, noNaN: true }), fc.double({ min: 0, max: 1, noNaN: true }), (verts, x, y) => {
        const ring = verts.flat();
        const [cx, cy] = [verts[verts.length - 1][0] * 0.5 + 0.2, verts[0][1] * 0.7 + 0.1];
        const before = pointInRing(x, y, ring);
        const after = pointInRing(x, y, [...ring, cx, cy]);
        const flip = ringGrowthFlips(x, y, ring[0], ring[1], ring[ring.length - 2], ring[ring.length - 1], cx, cy);
        return (before !== after) === flip;
      }),
    );
  });
});

describe('LiveSelection', () => {
  const n = 3000;
  const xy = randomPoints(n, 11);
  const poles = randomPoles(n, 12);

  it('LiveSelection.addLassoVertex gives exactly the membership of the finished ring, for self-crossing lassos too (property)', () => {
    const sel = new LiveSelection(xy, poles);
    fc.assert(
      fc.property(walk, (verts) => {
        sel.begin('replace');
        for (const [x, y] of verts) sel.addLassoVertex(x, y);
        const ring = verts.flat();
        for (let i = 0; i < n; i++) {
          if (sel.flags[i] !== Number(pointInRing(xy[2 * i], xy[2 * i + 1], ring))) return false;
        }
        return true;
      }),
      { numRuns: 60 },
    );
  });

  it('LiveSelection keeps tensor sums equal to the sums of the selected poles', () => {
    const sel = new LiveSelection(xy, poles);
    sel.begin('replace');
    const rnd = mulberry32(3);
    for (let k = 0; k < 300; k++) sel.addLassoVertex(0.5 + 0.4 * Math.cos(k / 20) * rnd(), 0.5 + 0.4 * Math.sin(k / 20));
    const expected = tensorSumsOfArray(poles, sel.selectedIndices());
    const got = sel.tensorSums();
    expect(got.n).toBe(expected.n);
    for (const key of ['xx', 'xy', 'xz', 'yy', 'yz', 'zz'] as const) expect(Math.abs(got[key] - expected[key])).toBeLessThan(1e-9);
  });

  it('LiveSelection combines shapes with add and subtract', () => {
    const sel = new LiveSelection(xy, null);
    const left = [0, 0, 0.5, 0, 0.5, 1, 0, 1];
    const bottom = [0, 0, 1, 0, 1, 0.5, 0, 0.5];
    sel.begin('replace');
    sel.setShape(left);
    sel.begin('add');
    sel.setShape(bottom);
    for (let i = 0; i < n; i++) expect(sel.flags[i]).toBe(Number(pointInRing(xy[2 * i], xy[2 * i + 1], left) || pointInRing(xy[2 * i], xy[2 * i + 1], bottom)));
    sel.begin('subtract');
    sel.setShape(bottom);
    for (let i = 0; i < n; i++) expect(sel.flags[i]).toBe(Number(pointInRing(xy[2 * i], xy[2 * i + 1], left) && !pointInRing(xy[2 * i], xy[2 * i + 1], bottom)));
    expect(sel.selectedCount).toBe(sel.selectedIndices().length);
  });

  it('LiveSelection.cancel restores the selection from before the gesture', () => {
    const sel = new LiveSelection(xy, poles);
    sel.begin('replace');
    sel.setShape([0, 0, 0.5, 0, 0.5, 0.5, 0, 0.5]);
    const before = sel.flags.slice();
    const sumsBefore = sel.tensorSums();
    sel.begin('replace');
    sel.setShape([0.5, 0.5, 1, 0.5, 1, 1, 0.5, 1]);
    expect(sel.flags).not.toEqual(before);
    sel.cancel();
    expect(sel.flags).toEqual(before);
    expect(sel.tensorSums().n).toBe(sumsBefore.n);
  });

  it('LiveSelection skips points without a pole in the tensor sums but still selects them', () => {
    const p = new Float64Array([0, 0, 1, NaN, NaN, NaN]);
    const sel = new LiveSelection(new Float64Array([0.1, 0.1, 0.2, 0.2]), p);
    sel.begin('replace');
    sel.setShape([0, 0, 1, 0, 1, 1, 0, 1]);
    expect(sel.selectedCount).toBe(2);
    expect(sel.tensorSums().n).toBe(1);
  });

  it('LiveSelection with no points works and selects nothing', () => {
    const sel = new LiveSelection(new Float64Array(0), null);
    sel.begin('replace');
    sel.addLassoVertex(0, 0);
    sel.addLassoVertex(1, 0);
    sel.addLassoVertex(1, 1);
    expect(sel.selectedCount).toBe(0);
  });
});
