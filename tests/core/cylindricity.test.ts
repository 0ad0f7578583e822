import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { EigenvalueDecomposition, Matrix } from 'ml-matrix';
import { CYLINDRICAL_MISFIT, cylindricityFigures, cylindricityOf } from '../../src/core/cylindricity';
import { cylindricityOf as cylindricityViaResiduals } from '../../src/core/consistency/girdleResiduals';
import { analyzeFold, type FoldAnalysis } from '../../src/core/foldAnalysis';
import { createRandom } from '../../src/core/random';
import { cross, lineToVector, normalToPlane, normalize, planeNormal } from '../../src/core/vectors';
import { rotateAboutAxis } from '../../src/core/geometry';
import type { PlaneMeasurement, Vec3 } from '../../src/core/types';
import truth from '../../sample-maps/korvane/truth.json';
import { stations } from '../../sample-maps/korvane/index';
import { expectClose } from '../helpers/tolerance';

const DEG = Math.PI / 180;
const codes = (r: FoldAnalysis) => r.warnings.map((w) => w.code);

/** Planes of a cylindrical fold about `axis`: poles spread evenly over the girdle (profile angles 0..180°), `scatterDeg` off it. */
function girdlePlanes(axis: Vec3, n: number, scatterDeg: number, seed: number): PlaneMeasurement[] {
  const rng = createRandom(seed);
  const gauss = () => Math.sqrt(-2 * Math.log(1 - rng.next())) * Math.cos(2 * Math.PI * rng.next());
  const helper: Vec3 = Math.abs(axis.z) < 0.9 ? { x: 0, y: 0, z: 1 } : { x: 1, y: 0, z: 0 };
  const u = normalize(cross(axis, helper));
  const w = cross(axis, u);
  return Array.from({ length: n }, (_, i) => {
    const phi = (Math.PI * (i + rng.next())) / n;
    const e = scatterDeg * DEG * gauss();
    const inGirdle = { x: Math.cos(phi) * u.x + Math.sin(phi) * w.x, y: Math.cos(phi) * u.y + Math.sin(phi) * w.y, z: Math.cos(phi) * u.z + Math.sin(phi) * w.z };
    return normalToPlane(normalize({ x: Math.cos(e) * inGirdle.x + Math.sin(e) * axis.x, y: Math.cos(e) * inGirdle.y + Math.sin(e) * axis.y, z: Math.cos(e) * inGirdle.z + Math.sin(e) * axis.z }));
  });
}

const polesOf = (planes: readonly PlaneMeasurement[]) => Float64Array.from(planes.flatMap((p) => { const v = planeNormal(p); return [v.x, v.y, v.z]; }));

describe('cylindricity', () => {
  it('cylindricityOf(poles) gives as misfit the RMS sine distance from the girdle that ml-matrix\'s least eigenvector defines (outside reference)', () => {
    const planes = girdlePlanes(lineToVector({ trend: 60, plunge: 20 }), 150, 5, 1);
    const X = new Matrix(planes.map((p) => { const v = planeNormal(p); return [v.x, v.y, v.z]; }));
    const evd = new EigenvalueDecomposition(X.transpose().mmul(X).div(planes.length), { assumeSymmetric: true });
    const least = evd.realEigenvalues.indexOf(Math.min(...evd.realEigenvalues));
    const axis = evd.eigenvectorMatrix.getColumn(least);
    // Distance of a pole from the girdle: asin|p·a| (girdle.ts); RMS of its sine (derived in cylindricity.ts).
    const rmsSine = Math.sqrt(X.to2DArray().reduce((s, p) => s + (p[0] * axis[0] + p[1] * axis[1] + p[2] * axis[2]) ** 2, 0) / planes.length);
    const c = cylindricityOf(polesOf(planes));
    expectClose(c.misfit, Math.asin(rmsSine) / DEG, 1e-9, 'misfit');
    expect(c.shape).toBe('cylindrical');
    expect(cylindricityViaResiduals).toBe(cylindricityOf); // one implementation, re-exported for the consistency checks
  });

  it('cylindricityOf(poles) of a conical fold with half-apex 90° - δ gives misfit δ (property, derived)', () => {
    fc.assert(
      fc.property(fc.double({ min: 1, max: 30, noNaN: true }), fc.double({ min: 0, max: 359, noNaN: true }), fc.double({ min: 0, max: 80, noNaN: true }), (delta, trend, plunge) => {
        // Poles all round the small circle δ off the great circle normal to the cone axis: by symmetry
        // the best girdle is that great circle and every pole lies δ from it (derived).
        const cone = lineToVector({ trend, plunge });
        const start = normalize(cross(cone, Math.abs(cone.z) < 0.9 ? { x: 0, y: 0, z: 1 } : { x: 1, y: 0, z: 0 }));
        const tilted = normalize({ x: Math.cos(delta * DEG) * start.x + Math.sin(delta * DEG) * cone.x, y: Math.cos(delta * DEG) * start.y + Math.sin(delta * DEG) * cone.y, z: Math.cos(delta * DEG) * start.z + Math.sin(delta * DEG) * cone.z });
        const poles = Float64Array.from(Array.from({ length: 36 }, (_, k) => rotateAboutAxis(tilted, cone, 10 * k)).flatMap((v) => [v.x, v.y, v.z]));
        expectClose(cylindricityOf(poles).misfit, delta, 1e-6, 'misfit of a cone');
      }),
      { numRuns: 100, seed: 3 },
    );
  });

  it('cylindricityFigures(eigenvalues) classes misfits at the 6° and 10° limits', () => {
    // asin √S3 = misfit, so S3 = sin²(misfit) (derived).
    const at = (misfit: number, s2 = 0.4) => cylindricityFigures([1 - s2 - Math.sin(misfit * DEG) ** 2, s2, Math.sin(misfit * DEG) ** 2]);
    expect(at(5.9).shape).toBe('cylindrical');
    expect(at(6.1).shape).toBe('nearly-cylindrical');
    expect(at(10.1).shape).toBe('not-cylindrical');
    expect(at(3, 0.015).shape).toBe('cylindrical-weak-girdle'); // S2/(S2+S3) = 0.015/0.0177 = 0.85 < 0.9
    expectClose(at(7).misfit, 7, 1e-9, 'misfit');
  });
});

describe('analyzeFold girdle fit and the poor-girdle-fit warning', () => {
  it('analyzeFold of one cylindrical fold with 2.5° scatter reports its misfit and no poor-girdle-fit warning', () => {
    const r = analyzeFold({ planes: girdlePlanes(lineToVector({ trend: 40, plunge: 25 }), 200, 2.5, 2) }, { bootstrap: 100 });
    expect(codes(r)).toEqual([]);
    // Misfit of Gaussian scatter σ off the girdle: √E[sin² e] ≈ σ (derived, small σ).
    expectClose(r.cylindricity!.misfit, 2.5, 0.5, 'misfit');
    expect(r.cylindricity!.cylindricity).toBeGreaterThan(0.99);
    expect(r.cylindricity!.shape).toBe('cylindrical');
  });

  it('analyzeFold of two pooled cylindrical domains with axes 20-30° apart warns poor-girdle-fit, with the misfit the two girdles predict (property, analytic)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 20, max: 30, noNaN: true }),
        fc.double({ min: 0, max: 359, noNaN: true }),
        fc.double({ min: 0, max: 60, noNaN: true }),
        fc.double({ min: 0, max: 359, noNaN: true }),
        fc.integer({ min: 1, max: 1e6 }),
        (delta, trend, plunge, turn, seed) => {
          const a = lineToVector({ trend, plunge });
          // The second axis: the first turned delta about a direction perpendicular to it.
          const about = rotateAboutAxis(normalize(cross(a, Math.abs(a.z) < 0.9 ? { x: 0, y: 0, z: 1 } : { x: 1, y: 0, z: 0 })), a, turn);
          const b = rotateAboutAxis(a, about, delta);
          const planes = [...girdlePlanes(a, 120, 2.5, seed), ...girdlePlanes(b, 120, 2.5, seed + 1)];
          const r = analyzeFold({ planes }, { bootstrap: 50 });
          expect(codes(r)).toContain('poor-girdle-fit');
          // Analytic: for poles spread evenly over two girdles whose axes are δ apart, T = I/2 - (aaᵀ + bbᵀ)/4,
          // whose least eigenvalue (along a + b) is sin²(δ/2)/2; scatter σ off each girdle adds about sin²σ.
          const predicted = Math.asin(Math.sqrt(Math.sin((delta / 2) * DEG) ** 2 / 2 + Math.sin(2.5 * DEG) ** 2)) / DEG;
          expectClose(r.cylindricity!.misfit, predicted, 0.6, 'misfit of two pooled girdles');
          // The reason for the warning: with 240 poles the bootstrap cone is small although the poles share no axis.
          expect(r.cone95!).toBeLessThan(r.cylindricity!.misfit);
          const w = r.warnings.find((x) => x.code === 'poor-girdle-fit')!;
          expect(w.message).toMatch(/pool domains with different axes/);
          expect(w.message).toContain(`${r.cylindricity!.misfit.toFixed(1)}°`);
        },
      ),
      { numRuns: 25, seed: 11 },
    );
  });

  it('analyzeFold of two pooled domains with axes 5° apart stays below the 6° limit and does not warn', () => {
    const a = lineToVector({ trend: 75, plunge: 12 });
    const b = lineToVector({ trend: 80, plunge: 12 }); // 4.9° apart (derived: acos of the dot product)
    const r = analyzeFold({ planes: [...girdlePlanes(a, 120, 2.5, 5), ...girdlePlanes(b, 120, 2.5, 6)] }, { bootstrap: 0 });
    expect(r.cylindricity!.misfit).toBeLessThan(CYLINDRICAL_MISFIT);
    expect(codes(r)).not.toContain('poor-girdle-fit');
  });

  it('analyzeFold of a cluster of poles warns only cluster-not-girdle, not poor-girdle-fit', () => {
    const rng = createRandom(4);
    const planes = Array.from({ length: 60 }, () => ({ dipDirection: 120 + 12 * (rng.next() - 0.5), dip: 40 + 12 * (rng.next() - 0.5) }));
    const r = analyzeFold({ planes }, { bootstrap: 0 });
    expect(codes(r)).toContain('cluster-not-girdle');
    expect(codes(r)).not.toContain('poor-girdle-fit');
  });

  it('analyzeFold of parallel planes has no cylindricity figure and no NaN', () => {
    const r = analyzeFold({ planes: Array(4).fill({ dipDirection: 10, dip: 30 }) });
    expect(r.cylindricity).toBeNull();
  });

  it('analyzeFold of each Korvane sample domain does not warn poor-girdle-fit; the two domains pooled (axes 24.9° apart) do', () => {
    const bad = new Set(truth.plantedBadRows.map((row) => row.id));
    // Domain of a station from the fault trace in truth.json, as tests/sample-map/axes.test.ts.
    const [[ax, ay], [bx, by]] = truth.fault.traceUtm;
    const domainOf = (s: Readonly<Record<string, string>>) => ((bx - ax) * (Number(s.northing) - ay) - (by - ay) * (Number(s.easting) - ax) >= 0 ? 'west' : 'east');
    const bedding = stations.filter((s) => !bad.has(s.station_id) && s.kind === 'bedding');
    const planesOf = (rows: typeof bedding) => rows.map((s) => ({ dipDirection: Number(s.dip_direction), dip: Number(s.dip) }));
    for (const domain of truth.domains) {
      const r = analyzeFold({ planes: planesOf(bedding.filter((s) => domainOf(s) === domain.id)) }, { bootstrap: 100 });
      expect(codes(r), domain.id).not.toContain('poor-girdle-fit');
      // The sample's readings scatter 2° in dip and 2-5° in dip direction (truth.json "noise").
      expect(r.cylindricity!.misfit).toBeLessThan(3);
    }
    const pooled = analyzeFold({ planes: planesOf(bedding) }, { bootstrap: 100 });
    expect(truth.angleBetweenAxes).toBeCloseTo(24.868, 3);
    expect(codes(pooled)).toContain('poor-girdle-fit');
    expect(pooled.cone95!).toBeLessThan(3);
  });
});
