import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { EigenvalueDecomposition, Matrix } from 'ml-matrix';
import { fieldNode, fieldNodes, localAxisField, nodePosition } from '../../../src/core/consistency/localAxisField';
import { bootstrapAxisCone } from '../../../src/core/bootstrap';
import { fitGirdleToArray } from '../../../src/core/girdle';
import { mulberry32 } from '../../helpers/prng';
import { comb3, cross3, dot3, foldStations, ned, positionsAndPoles, profileBasis, unit3, type V3 } from './synthetic';

/** Acute angle in degrees as atan2(|a × b|, |a · b|), exact near 0° where acos loses digits. */
const angle = (a: V3, b: V3): number => (Math.atan2(Math.hypot(...cross3(a, b)), Math.abs(dot3(a, b))) * 180) / Math.PI;
const nodeAxis = (field: ReturnType<typeof localAxisField>, node: number): V3 => [field.axis[3 * node], field.axis[3 * node + 1], field.axis[3 * node + 2]];

describe('localAxisField', () => {
  it('localAxisField(xy, poles) gives every node the common axis when every pole is normal to it (property, noise-free)', () => {
    fc.assert(
      fc.property(fc.double({ min: 0, max: 359.9, noNaN: true }), fc.double({ min: 0, max: 89, noNaN: true }), fc.integer({ min: 1, max: 10 ** 6 }), (trend, plunge, seed) => {
        // Poles of planes that all contain the axis lie on its great circle (analytic answer: the axis).
        const rnd = mulberry32(seed);
        const a = ned(trend, plunge);
        const { up, right } = profileBasis(a);
        const n = 120;
        const xy = Float64Array.from({ length: 2 * n }, () => 1000 * rnd());
        const poles = new Float64Array(3 * n);
        for (let i = 0; i < n; i++) {
          const phi = Math.PI * rnd();
          poles.set(comb3(up, Math.cos(phi), right, Math.sin(phi)), 3 * i);
        }
        const field = localAxisField(xy, poles, { nx: 4, ny: 3, k: 20 });
        for (let node = 0; node < 12; node++) {
          expect(field.count[node]).toBe(20);
          expect(angle(nodeAxis(field, node), a)).toBeLessThan(1e-6);
          // angleToReference comes from acos, good to about 1e-6° near zero.
          expect(field.angleToReference[node]).toBeLessThan(1e-5);
        }
      }),
      { numRuns: 60, seed: 3 },
    );
  });

  it('localAxisField(xy, poles, {k}) at a node equals the least eigenvector of the k nearest poles found by sorting, solved by ml-matrix (outside reference)', () => {
    const stations = foldStations({ seed: 11, n: 2000, hinges: 0, box: [0, 0, 5000, 3000], fold: () => ({ axis: { trend: 75, plunge: 12 }, swing: 50, wavelength: 1300, domain: 'a' }) });
    const { xy, poles } = positionsAndPoles(stations);
    const field = localAxisField(xy, poles, { nx: 25, ny: 15, k: 40 });
    for (const node of [0, 7, 130, 201, 374]) {
      const [x, y] = nodePosition(field.grid, node);
      const near = Array.from({ length: xy.length / 2 }, (_, i) => i)
        .sort((a, b) => Math.hypot(xy[2 * a] - x, xy[2 * a + 1] - y) - Math.hypot(xy[2 * b] - x, xy[2 * b + 1] - y))
        .slice(0, 40);
      const m = new Matrix(near.map((i) => [poles[3 * i], poles[3 * i + 1], poles[3 * i + 2]]));
      const t = m.transpose().mmul(m).div(40);
      const evd = new EigenvalueDecomposition(t, { assumeSymmetric: true });
      const values = evd.realEigenvalues;
      const least = values.indexOf(Math.min(...values));
      const v = evd.eigenvectorMatrix.getColumn(least) as V3;
      expect(angle(nodeAxis(field, node), v)).toBeLessThan(1e-7);
      expect(field.eigenvalues[3 * node + 2]).toBeCloseTo(Math.min(...values), 12);
      expect(field.reach[node]).toBeCloseTo(Math.hypot(xy[2 * near[39]] - x, xy[2 * near[39] + 1] - y), 9);
    }
  });

  it('localAxisField(...).cone, the first-order cone, lies within 0.8 to 1.5 times the 2000-resample bootstrap cone of bootstrapAxisCone on the same poles', () => {
    // Comparison seen on 15 seeded sets (n 30 to 200, noise 2 to 8°): ratios 0.99 to 1.29.
    for (const [n, sigma, swing, seed] of [[30, 2, 50, 1], [50, 3, 40, 2], [100, 5, 30, 3], [40, 8, 60, 4], [200, 2, 20, 5]]) {
      const stations = foldStations({ seed, n, hinges: 0, box: [0, 0, 1000, 1000], fold: () => ({ axis: { trend: 40, plunge: 25 }, swing, wavelength: 700, domain: 'a' }), sigma });
      const { xy, poles } = positionsAndPoles(stations);
      const field = localAxisField(xy, poles, { nx: 1, ny: 1, k: n, bounds: [0, 0, 1000, 1000] });
      const boot = bootstrapAxisCone(poles, fitGirdleToArray(poles).axisVector, { samples: 2000, seed: 5 });
      const ratio = field.cone[0] / boot.cone!;
      expect(ratio).toBeGreaterThan(0.8);
      expect(ratio).toBeLessThan(1.5);
    }
  });

  it('localAxisField(xy, poles, {radius, minCount}) leaves nodes with too few planes without an axis, and fieldNode reports them with nulls', () => {
    const xy = new Float64Array([0, 0, 10, 0, 0, 10, 10, 10, 5, 5, 1000, 1000]);
    const a = ned(90, 10);
    const { up, right } = profileBasis(a);
    const poles = Float64Array.from([0, 0.5, 1, 1.5, 2, 2.5].flatMap((phi) => comb3(up, Math.cos(phi), right, Math.sin(phi))));
    const field = localAxisField(xy, poles, { nx: 2, ny: 2, radius: 30, minCount: 4, bounds: [0, 0, 1000, 1000] });
    // Node 0 (centre 250, 250) has no plane within 30; node 3 (750, 750) neither.
    expect(field.count[0]).toBe(0);
    const node = fieldNode(field, 0);
    expect(node.axis).toBeNull();
    expect(node.cone).toBeNull();
    expect(node.angleToReference).toBeNull();
    expect(JSON.parse(JSON.stringify(fieldNodes(field)))).toEqual(fieldNodes(field));
    // Radius mode over everything: all six planes, and the common axis.
    const wide = localAxisField(xy, poles, { nx: 1, ny: 1, radius: 5000, minCount: 4, bounds: [0, 0, 1000, 1000] });
    expect(wide.count[0]).toBe(6);
    expect(angle(nodeAxis(wide, 0), a)).toBeLessThan(1e-9);
  });

  it('localAxisField(xy, poles, {maxReach}) gives no axis where the k-th plane lies farther than maxReach', () => {
    const stations = foldStations({ seed: 2, n: 300, hinges: 0, box: [0, 0, 1000, 1000], fold: () => ({ axis: { trend: 10, plunge: 30 }, swing: 50, wavelength: 600, domain: 'a' }) });
    const { xy, poles } = positionsAndPoles(stations);
    const field = localAxisField(xy, poles, { nx: 3, ny: 1, k: 20, maxReach: 300, bounds: [0, 0, 6000, 1000] });
    // Nodes at x = 1000 (inside the data's reach) and x = 3000, 5000 (far outside it).
    expect(Number.isFinite(field.trend[0])).toBe(true);
    expect(Number.isNaN(field.trend[1])).toBe(true);
    expect(Number.isNaN(field.trend[2])).toBe(true);
    expect(field.reach[2]).toBeGreaterThan(300);
  });

  it('localAxisField(...) of a conical fold turns the local axis by more than half the cone angle somewhere, where a cylindrical fold of the same shape keeps it fixed', () => {
    // Conical fold: poles on the small circle 90° - δ from the cone axis c (Ramsay 1967; common
    // practice), position on the circle set by the fold phase. A window sees an arc of that circle;
    // the great circle through a short arc is tangent to the small circle there, and its pole lies
    // δ from c (derived: the great circle tangent at angle φ has pole cos δ·c - sin δ·(cos φ·up +
    // sin φ·right)); longer arcs tilt it by other amounts. The cylindrical fold (δ = 0) has one axis.
    const c = ned(80, 15);
    const { up, right } = profileBasis(c);
    const delta = (20 * Math.PI) / 180;
    const rnd = mulberry32(4);
    const n = 3000;
    const xy = new Float64Array(2 * n);
    const conical = new Float64Array(3 * n);
    const cylindrical = new Float64Array(3 * n);
    for (let i = 0; i < n; i++) {
      const x = 6000 * rnd();
      const y = 4000 * rnd();
      xy[2 * i] = x;
      xy[2 * i + 1] = y;
      // Fold phase along profile-right; the swing grows across the map so windows see different arcs.
      const phi = (Math.PI / 2.2) * Math.sin((2 * Math.PI * x) / 1500) * (0.3 + y / 4000);
      const ring = comb3(up, Math.cos(phi), right, Math.sin(phi));
      conical.set(unit3(comb3(c, Math.sin(delta), ring, Math.cos(delta))), 3 * i);
      cylindrical.set(ring, 3 * i);
    }
    const options = { nx: 30, ny: 20, k: 40 } as const;
    const cone = localAxisField(xy, conical, { ...options, reference: { trend: 80, plunge: 15 } });
    const cyl = localAxisField(xy, cylindrical, { ...options, reference: { trend: 80, plunge: 15 } });
    let coneMax = 0;
    let cylMax = 0;
    let defined = 0;
    for (let node = 0; node < 600; node++) {
      if (Number.isFinite(cone.angleToReference[node])) {
        coneMax = Math.max(coneMax, cone.angleToReference[node]);
        defined++;
      }
      if (Number.isFinite(cyl.angleToReference[node])) cylMax = Math.max(cylMax, cyl.angleToReference[node]);
    }
    expect(defined).toBeGreaterThan(500);
    expect(cylMax).toBeLessThan(1e-5);
    expect(coneMax).toBeGreaterThan(10);
  });

  it('localAxisField names the bad input: mismatched poles, non-finite values, bad k, bad grid', () => {
    const xy = new Float64Array([0, 0, 1, 1, 2, 2]);
    const poles = new Float64Array(9).fill(0.5);
    expect(() => localAxisField(xy, new Float64Array(6))).toThrow(/2 poles for 3 positions/);
    expect(() => localAxisField(xy, Float64Array.from([1, 0, 0, 0, Number.NaN, 0, 0, 0, 1]))).toThrow(/pole 1 has a non-finite component/);
    expect(() => localAxisField(xy, poles, { k: 2 })).toThrow(/k = 2/);
    expect(() => localAxisField(xy, poles, { nx: 0 })).toThrow(/nx = 0/);
    expect(() => localAxisField(xy, poles, { radius: -5 })).toThrow(/radius -5/);
    expect(() => localAxisField(new Float64Array([0, Number.POSITIVE_INFINITY]), new Float64Array(3))).toThrow(/position 0/);
    expect(() => fieldNode(localAxisField(xy, poles, { nx: 2, ny: 2 }), 4)).toThrow(/node 4 is not a node of the 2 × 2 grid/);
  });
});
