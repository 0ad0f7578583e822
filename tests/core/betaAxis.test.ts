import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import { betaAxis, betaAxisOfNormals } from '../../src/core/betaAxis';
import { createRandom } from '../../src/core/random';
import { axialAngle, cross, lineToVector, normalToPlane, normalize, planeNormal } from '../../src/core/vectors';
import type { Plane, Vec3 } from '../../src/core/types';
import { expectAzimuth, expectClose } from '../helpers/tolerance';

function planesContaining(a: Vec3, phis: readonly number[]): Plane[] {
  const helper: Vec3 = Math.abs(a.z) < 0.9 ? { x: 0, y: 0, z: 1 } : { x: 1, y: 0, z: 0 };
  const u = normalize(cross(a, helper));
  const w = cross(a, u);
  return phis.map((phi) => normalToPlane({ x: Math.cos(phi) * u.x + Math.sin(phi) * w.x, y: Math.cos(phi) * u.y + Math.sin(phi) * w.y, z: Math.cos(phi) * u.z + Math.sin(phi) * w.z }));
}

const normalsOf = (planes: readonly Plane[]): Float64Array => Float64Array.from(planes.flatMap((p) => { const v = planeNormal(p); return [v.x, v.y, v.z]; }));

describe('betaAxis', () => {
  // The intersection of two limbs; values from /work/shared/REFERENCES.md (derived, apparent-dip formula).
  const rows = [
    { planes: [{ dipDirection: 120, dip: 40 }, { dipDirection: 240, dip: 40 }], axis: { trend: 180, plunge: 22.76 }, tol: 0.001 },
    { planes: [{ dipDirection: 60, dip: 30 }, { dipDirection: 330, dip: 50 }], axis: { trend: 34.15, plunge: 27.46 }, tol: 0.006 },
  ];
  for (const { planes, axis, tol } of rows) {
    it(`betaAxis(${planes.map((p) => `${p.dipDirection}/${p.dip}`).join(', ')}) is their intersection ${axis.trend}/${axis.plunge}`, () => {
      const b = betaAxis(planes);
      expectAzimuth(b.axis!.trend, axis.trend, tol, 'trend');
      expectClose(b.axis!.plunge, axis.plunge, tol, 'plunge');
      expect(b).toMatchObject({ pairsTotal: 1, pairsUsed: 1, pairsSkipped: 0, sampled: false });
    });
  }

  it('betaAxis of planes sharing a line returns that line (property, noise-free, analytic)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0, max: 359.999, noNaN: true }),
        fc.double({ min: 0, max: 90, noNaN: true }),
        fc.array(fc.double({ min: 0, max: Math.PI, noNaN: true }), { minLength: 2, maxLength: 25 }),
        (trend, plunge, phis) => {
          const spread = Math.max(...phis.map((p) => Math.abs(Math.sin(p - phis[0]))));
          fc.pre(spread > Math.sin((11 * Math.PI) / 180)); // at least one pair beyond the 10° cut
          const axis = lineToVector({ trend, plunge });
          const b = betaAxis(planesContaining(axis, phis));
          // 1e-5°: acos near 0 resolves angles only to about 1e-6°.
          expect(axialAngle(b.vector!, axis)).toBeLessThan(1e-5);
        },
      ),
      { numRuns: 300, seed: 41 },
    );
  });

  it('betaAxis skips pairs closer than minAngle and says so when none is left', () => {
    const planes = [{ dipDirection: 90, dip: 30 }, { dipDirection: 90, dip: 35 }, { dipDirection: 270, dip: 30 }];
    // 90/30 vs 90/35 are 5° apart (skipped at the default 10°); both cut 270/30 at a steep angle.
    const b = betaAxis(planes);
    expect(b).toMatchObject({ pairsTotal: 3, pairsUsed: 2, pairsSkipped: 1 });
    expectAzimuth(b.axis!.trend, 0, 1e-9, 'trend');
    expectClose(b.axis!.plunge, 0, 1e-9, 'plunge');
    const none = betaAxis(planes.slice(0, 2));
    expect(none.axis).toBeNull();
    expect(none.note).toMatch(/less than 10° apart/);
    expect(betaAxis(planes.slice(0, 2), { minAngle: 1 }).axis).not.toBeNull();
  });

  it('betaAxis with more pairs than maxPairs samples them reproducibly from the seed', () => {
    const rng = createRandom(42);
    const axis = lineToVector({ trend: 300, plunge: 15 });
    const planes = planesContaining(axis, Array.from({ length: 400 }, () => Math.PI * rng.next())).map((p, i) => ({ ...p, dip: Math.min(90, p.dip + (i % 3) - 1) }));
    const a = betaAxisOfNormals(normalsOf(planes), { maxPairs: 2000, seed: 3 });
    const b = betaAxisOfNormals(normalsOf(planes), { maxPairs: 2000, seed: 3 });
    const c = betaAxisOfNormals(normalsOf(planes), { maxPairs: 2000, seed: 4 });
    expect(a).toMatchObject({ sampled: true, pairsExamined: 2000, pairsTotal: (400 * 399) / 2 });
    expect(a.pairsUsed + a.pairsSkipped).toBe(2000);
    expect(b).toEqual(a);
    expect(c.axis).not.toEqual(a.axis);
    // With ±1° of dip noise the sampled mean still lies near the common line.
    expect(axialAngle(a.vector!, axis)).toBeLessThan(3);
  });

  it('betaAxis of fewer than 2 planes has no axis and says why', () => {
    expect(betaAxis([]).note).toMatch(/fewer than 2 planes/);
    expect(betaAxis([{ dipDirection: 10, dip: 10 }])).toMatchObject({ axis: null, pairsTotal: 0 });
  });

  it('betaAxis rejects bad options and bad planes with messages that name them', () => {
    expect(() => betaAxis([], { minAngle: 90 })).toThrow(/minAngle: 90/);
    expect(() => betaAxis([], { maxPairs: 0 })).toThrow(/maxPairs: 0/);
    expect(() => betaAxis([{ dipDirection: 10, dip: -1 }])).toThrow(/planes\[0\]\.dip: -1/);
    expect(() => betaAxisOfNormals(new Float64Array(5))).toThrow(/length 5/);
  });
});
