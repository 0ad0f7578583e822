import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { EigenvalueDecomposition, Matrix } from 'ml-matrix';
import { cylindricityOf, girdleResiduals, GIRDLE_RESIDUAL_DEFAULTS } from '../../../src/core/consistency/girdleResiduals';
import { angleBetweenLines } from '../../../src/core/geometry';
import { expectClose } from '../../helpers/tolerance';
import { mulberry32 } from '../../helpers/prng';
import { comb3, foldStations, ned, planeOfNormal, positionsAndPoles, profileBasis, unit3 } from './synthetic';

describe('girdleResiduals', () => {
  it('girdleResiduals(planes that all contain one line) puts every pole on the girdle and reads the fold as cylindrical (property, noise-free)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0, max: 359.9, noNaN: true }),
        fc.double({ min: 0, max: 85, noNaN: true }),
        fc.array(fc.double({ min: -1.2, max: 1.2, noNaN: true }), { minLength: 4, maxLength: 40 }),
        (trend, plunge, phis) => {
          // Poles of planes containing the axis are normal to it: distance 0 (analytic answer).
          fc.pre(Math.max(...phis) - Math.min(...phis) > 0.5);
          const a = ned(trend, plunge);
          const { up, right } = profileBasis(a);
          const planes = phis.map((phi) => planeOfNormal(comb3(up, Math.cos(phi), right, Math.sin(phi))));
          const r = girdleResiduals(planes);
          expect(angleBetweenLines(r.axis!, { trend, plunge })).toBeLessThan(1e-4);
          for (const p of r.residuals) expect(p.distance!).toBeLessThan(1e-4);
          expect(r.outliers).toBe(0);
          expect(r.cylindricity!.misfit).toBeLessThan(1e-3);
          expect(r.cylindricity!.shape).toBe('cylindrical');
        },
      ),
      { numRuns: 300, seed: 9 },
    );
  });

  it('girdleResiduals(poles on a small circle δ off the girdle) measures every distance and the RMS misfit as δ, flags none, and reads the fold as not cylindrical above 10° (property: conical fold)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0, max: 359.9, noNaN: true }),
        fc.double({ min: 0, max: 80, noNaN: true }),
        fc.double({ min: 1, max: 30, noNaN: true }),
        fc.integer({ min: 3, max: 36 }),
        fc.double({ min: 0, max: 2 * Math.PI, noNaN: true }),
        (trend, plunge, delta, n, start) => {
          // Poles sin δ·c + cos δ·(cos φ·up + sin φ·right), φ equally spaced round the circle: the
          // tensor is cos²δ/2 in the circle's plane and sin²δ along c, so for δ < 35.26° the least
          // eigenvector is c and every pole lies δ from the girdle; S3 = sin²δ, misfit = δ (derived).
          const c = ned(trend, plunge);
          const { up, right } = profileBasis(c);
          const d = (delta * Math.PI) / 180;
          const planes = Array.from({ length: n }, (_, i) => {
            const phi = start + (2 * Math.PI * i) / n;
            return planeOfNormal(unit3(comb3(c, Math.sin(d), comb3(up, Math.cos(phi), right, Math.sin(phi)), Math.cos(d))));
          });
          const r = girdleResiduals(planes);
          expect(angleBetweenLines(r.axis!, { trend, plunge })).toBeLessThan(1e-4);
          for (const p of r.residuals) expectClose(p.distance!, delta, 1e-6, 'distance');
          expect(r.outliers).toBe(0);
          expectClose(r.cylindricity!.misfit, delta, 1e-6, 'misfit');
          expect(r.cylindricity!.shape).toBe(delta <= 6 ? 'cylindrical' : delta <= 10 ? 'nearly-cylindrical' : 'not-cylindrical');
        },
      ),
      { numRuns: 300, seed: 10 },
    );
  });

  it('GIRDLE_RESIDUAL_DEFAULTS.madToSigma is 1/Φ⁻¹(3/4), the normal-consistency constant of the MAD (Φ⁻¹(0.75) = 0.6744898, standard normal tables)', () => {
    expectClose(GIRDLE_RESIDUAL_DEFAULTS.madToSigma, 1 / 0.6744897501960817, 1e-4, 'MAD constant');
  });

  it('girdleResiduals(20 000 poles with 3° normal scatter off one girdle).sigma recovers 3° within 2%', () => {
    const rnd = mulberry32(6);
    const a = ned(40, 30);
    const { up, right } = profileBasis(a);
    const gauss = (): number => Math.sqrt(-2 * Math.log(1 - rnd())) * Math.cos(2 * Math.PI * rnd());
    const planes = Array.from({ length: 20000 }, () => {
      const phi = 2 * Math.PI * rnd();
      const off = (3 * Math.PI * gauss()) / 180;
      return planeOfNormal(unit3(comb3(comb3(up, Math.cos(phi), right, Math.sin(phi)), Math.cos(off), a, Math.sin(off))));
    });
    const r = girdleResiduals(planes);
    expectClose(r.sigma!, 3, 0.06, 'sigma');
    expect(r.threshold).toBeCloseTo(3.5 * r.sigma!, 9);
  });

  it('girdleResiduals(bedding with 20 planted bad readings among 400) flags exactly the planted ones', () => {
    // Clean readings lie at most 2.5σ = 5° off the planted girdle (truncated noise, synthetic.ts), at the
    // the 5° floor of the rule; planted ones lie 25° or more off, above any threshold 3.5·σ̂ can reach here.
    for (const seed of [1, 2, 3, 4, 5, 6]) {
      const stations = foldStations({ seed, n: 400, hinges: 0, badPlanes: 20, box: [0, 0, 3000, 2000], fold: () => ({ axis: { trend: 75, plunge: 12 }, swing: 50, wavelength: 1300, domain: 'a' }), sigma: 2 });
      const planes = stations.map((s) => ({ ...s.plane!, id: s.id }));
      const r = girdleResiduals(planes);
      expect(r.residuals.filter((p) => p.flagged).map((p) => p.id)).toEqual(stations.filter((s) => s.bad).map((s) => s.id));
      // The refit without them recovers the planted axis.
      expect(angleBetweenLines(r.axis!, { trend: 75, plunge: 12 })).toBeLessThan(1);
      expect(r.cylindricityWithoutOutliers!.shape).toBe('cylindrical');
    }
  });

  it('girdleResiduals(planes, {maxAngle}) flags by the given angle instead of the robust rule', () => {
    const stations = foldStations({ seed: 4, n: 100, hinges: 0, box: [0, 0, 1000, 1000], fold: () => ({ axis: { trend: 10, plunge: 20 }, swing: 60, wavelength: 800, domain: 'a' }), sigma: 3 });
    const planes = stations.map((s) => s.plane!);
    const r = girdleResiduals(planes, { maxAngle: 2 });
    expect(r.rule).toBe('user');
    expect(r.threshold).toBe(2);
    for (const p of r.residuals) expect(p.flagged).toBe(p.distance! > 2);
  });

  it('cylindricityOf(poles) gives S2/(S2+S3) and asin(√S3) from the eigenvalues that ml-matrix finds for the same tensor (outside reference)', () => {
    const stations = foldStations({ seed: 12, n: 300, hinges: 0, box: [0, 0, 1000, 1000], fold: () => ({ axis: { trend: 300, plunge: 40 }, swing: 40, wavelength: 800, domain: 'a' }), sigma: 4 });
    const { poles } = positionsAndPoles(stations);
    const m = new Matrix(Array.from({ length: poles.length / 3 }, (_, i) => [poles[3 * i], poles[3 * i + 1], poles[3 * i + 2]]));
    const values = new EigenvalueDecomposition(m.transpose().mmul(m).div(poles.length / 3), { assumeSymmetric: true }).realEigenvalues.sort((p, q) => q - p);
    const c = cylindricityOf(poles);
    expectClose(c.cylindricity, values[1] / (values[1] + values[2]), 1e-10, 'cylindricity');
    expectClose(c.misfit, (Math.asin(Math.sqrt(values[2])) * 180) / Math.PI, 1e-8, 'misfit');
    expectClose(c.vollmer.G, 2 * (values[1] - values[2]), 1e-10, 'Vollmer G');
  });

  it('girdleResiduals says why when there is no girdle, and names bad input', () => {
    expect(girdleResiduals([{ dipDirection: 10, dip: 20 }, { dipDirection: 50, dip: 30 }]).reading).toMatch(/at least 3 are needed/);
    const flat = girdleResiduals([{ dipDirection: 10, dip: 20 }, { dipDirection: 10, dip: 20 }, { dipDirection: 10, dip: 20 }]);
    expect(flat.axis).toBeNull();
    expect(flat.residuals.every((p) => p.distance === null)).toBe(true);
    expect(() => girdleResiduals([{ dipDirection: 10, dip: 95 }])).toThrow(/planes\[0\]\.dip: 95/);
    expect(() => girdleResiduals([], { madFactor: -1 })).toThrow(/madFactor -1/);
    expect(() => girdleResiduals([], { maxAngle: 0 })).toThrow(/maxAngle 0/);
  });
});
