import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import { EigenvalueDecomposition, Matrix } from 'ml-matrix';
import {
  assertPlanes,
  distanceFromGirdle,
  distancesFromGirdle,
  fitGirdle,
  fitGirdleFromSums,
  fitGirdleToArray,
  fitGirdleToPlanes,
  girdleAxis,
} from '../../src/core/girdle';
import { addIndicesToSums, tensorSumsOfArray, removeIndicesFromSums } from '../../src/core/orientationTensor';
import { createRandom } from '../../src/core/random';
import { axialAngle, cross, lineToVector, normalToPlane, normalize, planeNormal, poleOf } from '../../src/core/vectors';
import type { Plane, Vec3 } from '../../src/core/types';
import { expectAzimuth, expectClose, expectDeepClose } from '../helpers/tolerance';

/** Unit vectors u, w completing a right-handed frame with unit a. */
function frame(a: Vec3): [Vec3, Vec3] {
  const helper: Vec3 = Math.abs(a.z) < 0.9 ? { x: 0, y: 0, z: 1 } : { x: 1, y: 0, z: 0 };
  const u = normalize(cross(a, helper));
  return [u, cross(a, u)];
}

/** The plane containing axis a whose normal makes angle phi (radians) with u in the profile. */
function planeContaining(a: Vec3, phi: number): Plane {
  const [u, w] = frame(a);
  return normalToPlane({ x: Math.cos(phi) * u.x + Math.sin(phi) * w.x, y: Math.cos(phi) * u.y + Math.sin(phi) * w.y, z: Math.cos(phi) * u.z + Math.sin(phi) * w.z });
}

const interleave = (vs: readonly Vec3[]): Float64Array => Float64Array.from(vs.flatMap((v) => [v.x, v.y, v.z]));

describe('fitGirdle', () => {
  it('girdleAxis(poles) returns the common line of planes that share it, to 0.01° (property, noise-free)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0, max: 359.999, noNaN: true }),
        fc.double({ min: 0, max: 90, noNaN: true }),
        fc.array(fc.double({ min: 0, max: Math.PI, noNaN: true }), { minLength: 2, maxLength: 40 }),
        (trend, plunge, phis) => {
          // Poles of planes sharing a line lie on the great circle whose pole is that line, so the
          // fit must return it (analytic answer). Require two planes at least 1° apart.
          const spread = Math.max(...phis.map((p) => Math.abs(Math.sin(p - phis[0]))));
          fc.pre(spread > Math.sin(Math.PI / 180));
          const axis = lineToVector({ trend, plunge });
          const planes = phis.map((phi) => planeContaining(axis, phi));
          const fit = fitGirdleToPlanes(planes);
          expect(fit.axisDefined).toBe(true);
          expect(axialAngle(fit.axisVector, axis)).toBeLessThan(0.01);
          expect(axialAngle(lineToVector(girdleAxis(planes.map(planeNormal))), axis)).toBeLessThan(0.01);
          for (const p of planes) expect(distanceFromGirdle(planeNormal(p), fit.axisVector)).toBeLessThan(0.01);
        },
      ),
      { numRuns: 500, seed: 21 },
    );
  });

  // Two planes: the girdle through two poles has the planes' intersection as its pole.
  // Values from /work/shared/REFERENCES.md (derived with the apparent-dip formula).
  const rows = [
    { planes: [{ dipDirection: 120, dip: 40 }, { dipDirection: 240, dip: 40 }], axis: { trend: 180, plunge: 22.76 }, tol: 0.001 },
    { planes: [{ dipDirection: 60, dip: 30 }, { dipDirection: 330, dip: 50 }], axis: { trend: 34.15, plunge: 27.46 }, tol: 0.006 },
  ];
  for (const { planes, axis, tol } of rows) {
    it(`fitGirdleToPlanes(${planes.map((p) => `${p.dipDirection}/${p.dip}`).join(', ')}) has axis ${axis.trend}/${axis.plunge}`, () => {
      const fit = fitGirdleToPlanes(planes);
      expectAzimuth(fit.axis.trend, axis.trend, tol, 'trend');
      expectClose(fit.axis.plunge, axis.plunge, tol, 'plunge');
      // The girdle is the plane whose pole is the axis.
      expectDeepClose(poleOf(fit.girdle), fit.axis, 1e-9);
    });
  }

  it('fitGirdle(poles) axis matches the least eigenvector from ml-matrix for noisy poles', () => {
    const rng = createRandom(31);
    const axis = lineToVector({ trend: 215, plunge: 35 });
    const [u, w] = frame(axis);
    const poles = Array.from({ length: 400 }, () => {
      const phi = Math.PI * rng.next();
      const e = 0.15 * (rng.next() - 0.5);
      return normalize({ x: Math.cos(phi) * u.x + Math.sin(phi) * w.x + e * axis.x, y: Math.cos(phi) * u.y + Math.sin(phi) * w.y + e * axis.y, z: Math.cos(phi) * u.z + Math.sin(phi) * w.z + e * axis.z });
    });
    const X = new Matrix(poles.map((p) => [p.x, p.y, p.z]));
    // Reference: ml-matrix eigen-decomposition of XᵀX/N; its smallest eigenvalue comes first.
    const evd = new EigenvalueDecomposition(X.transpose().mmul(X).div(poles.length), { assumeSymmetric: true });
    const k = evd.realEigenvalues.indexOf(Math.min(...evd.realEigenvalues));
    const ref = { x: evd.eigenvectorMatrix.get(0, k), y: evd.eigenvectorMatrix.get(1, k), z: evd.eigenvectorMatrix.get(2, k) };
    const fit = fitGirdle(poles);
    expectClose(axialAngle(fit.axisVector, ref), 0, 1e-6, 'angle to ml-matrix axis');
    expectClose(fit.eigenvalues[2], Math.min(...evd.realEigenvalues), 1e-12, 'S3');
    expectClose(fit.eigenvalues[0] + fit.eigenvalues[1] + fit.eigenvalues[2], 1, 1e-12, 'S1 + S2 + S3');
    expect(axialAngle(fit.axisVector, axis)).toBeLessThan(2);
  });

  it('fitGirdleFromSums after lasso-style add/remove equals a fresh fit of the selection', () => {
    const rng = createRandom(32);
    const poles = Array.from({ length: 300 }, () => normalize({ x: rng.next() - 0.5, y: rng.next() - 0.5, z: rng.next() }));
    const xyz = interleave(poles);
    const first = Array.from({ length: 120 }, (_, i) => i);
    const leave = Array.from({ length: 40 }, (_, i) => 2 * i);
    const sums = removeIndicesFromSums(addIndicesToSums(tensorSumsOfArray(xyz, first), xyz, [200, 201, 202]), xyz, leave);
    const kept = [...first.filter((i) => !leave.includes(i)), 200, 201, 202];
    const a = fitGirdleFromSums(sums);
    const b = fitGirdleToArray(interleave(kept.map((i) => poles[i])));
    expectDeepClose(a.eigenvalues, b.eigenvalues, 1e-12);
    expectClose(axialAngle(a.axisVector, b.axisVector), 0, 1e-6, 'axis angle');
  });

  it('fitGirdleToPlanes of parallel planes reports axisDefined = false', () => {
    const fit = fitGirdleToPlanes([{ dipDirection: 30, dip: 40 }, { dipDirection: 30, dip: 40 }, { dipDirection: 30, dip: 40 }]);
    expect(fit.axisDefined).toBe(false);
    expectClose(fit.eigenvalues[0], 1, 1e-12, 'S1');
  });

  it('distanceFromGirdle gives the angle of a pole above the great circle (analytic: pole at 25° from it)', () => {
    const axis = lineToVector({ trend: 0, plunge: 0 });
    const t = (25 * Math.PI) / 180;
    expectClose(distanceFromGirdle({ x: Math.sin(t), y: 0, z: Math.cos(t) }, axis), 25, 1e-9);
    expectClose(distanceFromGirdle({ x: -Math.sin(t), y: Math.cos(t), z: 0 }, axis), 25, 1e-9);
  });

  it('distancesFromGirdle(xyz, axis) gives one distance per pole, equal to distanceFromGirdle', () => {
    const poles = [lineToVector({ trend: 10, plunge: 20 }), lineToVector({ trend: 200, plunge: 70 }), lineToVector({ trend: 90, plunge: 0 })];
    const axis = lineToVector({ trend: 45, plunge: 30 });
    const d = distancesFromGirdle(interleave(poles), axis);
    expect(d.length).toBe(3);
    poles.forEach((p, i) => expectClose(d[i], distanceFromGirdle(p, axis), 1e-12, `pole ${i}`));
  });

  it('fitGirdleToPlanes and assertPlanes reject a bad dip or dip direction naming the row', () => {
    expect(() => fitGirdleToPlanes([{ dipDirection: 10, dip: 20 }, { dipDirection: 10, dip: 91 }])).toThrow(/planes\[1\]\.dip: 91 is not a dip \(expected 0 to 90\)/);
    expect(() => assertPlanes([{ dipDirection: Infinity, dip: 3 }], 'bedding')).toThrow(/bedding\[0\]\.dipDirection: Infinity/);
    expect(() => fitGirdleFromSums(tensorSumsOfArray(new Float64Array(0)))).toThrow(/0 vectors/);
  });
});
