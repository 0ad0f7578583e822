import { describe, it, expect } from 'vitest';
import { bootstrapAxisCone } from '../../src/core/bootstrap';
import { fitGirdleToArray } from '../../src/core/girdle';
import { createRandom } from '../../src/core/random';
import { expectClose } from '../helpers/tolerance';

/**
 * Poles of a girdle (the horizontal great circle) about the vertical axis: azimuth uniform, angular
 * distance from the girdle normal with standard deviation sigma (Box-Muller normal deviates).
 */
function noisyGirdle(n: number, sigmaDeg: number, seed: number): Float64Array {
  const rng = createRandom(seed);
  const xyz = new Float64Array(3 * n);
  const s = (sigmaDeg * Math.PI) / 180;
  for (let i = 0; i < n; i++) {
    const phi = Math.PI * rng.next();
    const e = s * Math.sqrt(-2 * Math.log(1 - rng.next())) * Math.cos(2 * Math.PI * rng.next());
    xyz[3 * i] = Math.cos(phi) * Math.cos(e);
    xyz[3 * i + 1] = Math.sin(phi) * Math.cos(e);
    xyz[3 * i + 2] = Math.sin(e);
  }
  return xyz;
}

/**
 * Expected 95% cone, derived here by first-order perturbation of the least eigenvector: with poles
 * spread evenly round the girdle (S1 = S2 = 1/2) and out-of-girdle angles of s.d. sigma, each of the
 * two tilt components of the axis has variance 2·sigma²/n, so the squared tilt is (2·sigma²/n)·chi²(2)
 * and its 95th percentile gives cone = sigma·sqrt(2·(-2 ln 0.05)/n).
 */
const analyticCone = (sigmaDeg: number, n: number): number => sigmaDeg * Math.sqrt((2 * -2 * Math.log(0.05)) / n);

function meanCone(n: number, maxDraws: number): number {
  const cones = [0, 1, 2, 3].map((k) => {
    const xyz = noisyGirdle(n, 5, 100 + k);
    return bootstrapAxisCone(xyz, fitGirdleToArray(xyz).axisVector, { seed: k + 1, maxDraws }).cone as number;
  });
  return cones.reduce((a, b) => a + b, 0) / cones.length;
}

describe('bootstrapAxisCone', () => {
  it('bootstrapAxisCone of a girdle with 5° scatter and n = 400 is near the analytic 0.865° (derived, mean of 4 data sets, 10%)', () => {
    const expected = analyticCone(5, 400);
    expectClose(expected, 0.8654, 1e-4, 'analytic value');
    expectClose(meanCone(400, 20_000), expected, 0.1 * expected, 'mean bootstrap cone');
  });

  it('bootstrapAxisCone with n = 60000 above maxDraws (m-out-of-n, rescaled by sqrt(m/n)) is near the analytic 0.0707° (10%)', () => {
    const expected = analyticCone(5, 60_000);
    expectClose(meanCone(60_000, 6000), expected, 0.1 * expected, 'mean rescaled cone');
  });

  it('bootstrapAxisCone gives the same cone for the same seed and reports how it drew', () => {
    const xyz = noisyGirdle(200, 8, 7);
    const axis = fitGirdleToArray(xyz).axisVector;
    const a = bootstrapAxisCone(xyz, axis, { seed: 9, samples: 200 });
    const b = bootstrapAxisCone(xyz, axis, { seed: 9, samples: 200 });
    const c = bootstrapAxisCone(xyz, axis, { seed: 10, samples: 200 });
    expect(b).toEqual(a);
    expect(c.cone).not.toBe(a.cone);
    expect(a).toMatchObject({ samples: 200, seed: 9, confidence: 0.95, drawsPerSample: 200, rescaled: false, degenerateSamples: 0, note: null });
  });

  it('bootstrapAxisCone at a higher confidence gives a wider cone', () => {
    const xyz = noisyGirdle(150, 6, 8);
    const axis = fitGirdleToArray(xyz).axisVector;
    const c95 = bootstrapAxisCone(xyz, axis, { seed: 2 }).cone as number;
    const c99 = bootstrapAxisCone(xyz, axis, { seed: 2, confidence: 0.99 }).cone as number;
    expect(c99).toBeGreaterThan(c95);
  });

  it('bootstrapAxisCone of fewer than 3 poles returns null with a reason', () => {
    const r = bootstrapAxisCone(new Float64Array([1, 0, 0, 0, 1, 0]), { x: 0, y: 0, z: 1 });
    expect(r.cone).toBeNull();
    expect(r.note).toMatch(/at least 3 poles \(got 2\)/);
  });

  it('bootstrapAxisCone counts resamples with an undefined axis as 90°', () => {
    // Two distinct poles among three: any resample drawing one pole only has no axis.
    const xyz = new Float64Array([1, 0, 0, 1, 0, 0, 0, 1, 0]);
    const r = bootstrapAxisCone(xyz, { x: 0, y: 0, z: 1 }, { seed: 1 });
    expect(r.degenerateSamples).toBeGreaterThan(0);
    expect(r.cone).toBe(90);
  });

  it('bootstrapAxisCone rejects bad options and non-finite poles with messages that name them', () => {
    const xyz = noisyGirdle(10, 5, 1);
    const axis = { x: 0, y: 0, z: 1 };
    expect(() => bootstrapAxisCone(xyz, axis, { samples: 0 })).toThrow(/samples: 0/);
    expect(() => bootstrapAxisCone(xyz, axis, { confidence: 1 })).toThrow(/confidence: 1/);
    expect(() => bootstrapAxisCone(xyz, axis, { seed: 0.5 })).toThrow(/0.5 is not an integer/);
    expect(() => bootstrapAxisCone(xyz, { x: 0, y: 0, z: 0 })).toThrow(/axis/);
    const bad = Float64Array.from(xyz);
    bad[7] = Number.NaN;
    expect(() => bootstrapAxisCone(bad, axis)).toThrow(/pole 2, component y is NaN/);
  });
});
