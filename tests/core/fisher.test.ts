import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import { assertLines, fisherLines, fisherStatistics } from '../../src/core/fisher';
import { axialAngle, cross, lineToVector, normalize, vectorToLine } from '../../src/core/vectors';
import type { Line, Vec3 } from '../../src/core/types';
import { expectAzimuth, expectClose } from '../helpers/tolerance';

const lines = (rows: number[][]): Line[] => rows.map(([trend, plunge]) => ({ trend, plunge }));

describe('fisherLines', () => {
  // Check values: /work/shared/REFERENCES.md, "Fisher (1953) statistics for lines" (derived from the
  // published formula R = |Σx|, k = (N-1)/(N-R), cos a95 = 1 - ((N-R)/R)(20^(1/(N-1)) - 1)).
  // No published worked example was read here; these are constructed checks.
  const rows = [
    {
      name: '4 lines plunging 80 toward 000/090/180/270',
      input: lines([[0, 80], [90, 80], [180, 80], [270, 80]]),
      R: 3.939231, kappa: 49.3673, alpha95: 13.2067, mean: { trend: null, plunge: 90 },
      tol: { R: 1e-6, kappa: 1e-4, alpha95: 1e-4, angle: 1e-9 },
    },
    {
      name: 'lines 010/40, 020/45, 015/50, 005/42, 025/48',
      input: lines([[10, 40], [20, 45], [15, 50], [5, 42], [25, 48]]),
      R: 4.970583, kappa: 135.974, alpha95: 6.585, mean: { trend: 14.71, plunge: 45.22 },
      tol: { R: 1e-6, kappa: 1e-3, alpha95: 1e-3, angle: 0.005 },
    },
  ];
  for (const { name, input, R, kappa, alpha95, mean, tol } of rows) {
    it(`fisherLines(${name}) gives R ${R}, kappa ${kappa}, alpha95 ${alpha95}°`, () => {
      const f = fisherLines(input);
      expect(f.n).toBe(input.length);
      expectClose(f.R, R, tol.R, 'R');
      expectClose(f.kappa as number, kappa, tol.kappa, 'kappa');
      expectClose(f.alpha95 as number, alpha95, tol.alpha95, 'alpha95');
      expectClose(f.mean!.plunge, mean.plunge, tol.angle, 'mean plunge');
      if (mean.trend !== null) expectAzimuth(f.mean!.trend, mean.trend, tol.angle, 'mean trend');
    });
  }

  it('fisherLines gives the same result whichever end of each line was recorded (axial data)', () => {
    const input = lines([[10, 40], [20, 45], [15, 50], [5, 42], [25, 48]]);
    const vs = input.map(lineToVector);
    const flipped = vs.map((v, i) => (i % 2 ? { x: -v.x, y: -v.y, z: -v.z } : v));
    const a = fisherStatistics(vs);
    const b = fisherStatistics(flipped);
    expectClose(b.R, a.R, 1e-12, 'R');
    expectClose(axialAngle(a.meanVector!, b.meanVector!), 0, 1e-6, 'angle between means');
  });

  it('fisherLines averages lines across the horizontal: 090/02 and 270/02 have a horizontal mean, not a steep one', () => {
    // 270/02 is the line 090/-02 seen from the other end, so the two lie 4° apart about 090/00 (derived).
    const f = fisherLines(lines([[90, 2], [270, 2]]));
    expectClose(f.mean!.plunge, 0, 1e-9, 'mean plunge');
    expectClose(f.R, 2 * Math.cos((2 * Math.PI) / 180), 1e-12, 'R = 2 cos 2°');
  });

  it('fisherLines of a cone of lines about any axis returns that axis with R = N·cos(half-angle) (property, analytic)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0, max: 359.99, noNaN: true }),
        fc.double({ min: 0, max: 90, noNaN: true }),
        fc.double({ min: 1, max: 40, noNaN: true }),
        fc.integer({ min: 3, max: 12 }),
        (trend, plunge, half, count) => {
          const axis = lineToVector({ trend, plunge });
          const helper: Vec3 = Math.abs(axis.z) < 0.9 ? { x: 0, y: 0, z: 1 } : { x: 1, y: 0, z: 0 };
          const u = normalize(cross(axis, helper));
          const w = cross(axis, u);
          const t = (half * Math.PI) / 180;
          const vs = Array.from({ length: count }, (_, k) => {
            const phi = (2 * Math.PI * k) / count;
            const c = Math.cos(t), s = Math.sin(t);
            return { x: c * axis.x + s * (Math.cos(phi) * u.x + Math.sin(phi) * w.x), y: c * axis.y + s * (Math.cos(phi) * u.y + Math.sin(phi) * w.y), z: c * axis.z + s * (Math.cos(phi) * u.z + Math.sin(phi) * w.z) };
          });
          const f = fisherLines(vs.map(vectorToLine));
          expectClose(f.R, count * Math.cos(t), 1e-9, 'R');
          expectClose(axialAngle(f.meanVector!, axis), 0, 1e-5, 'angle from axis');
          expectClose(f.kappa as number, (count - 1) / (count - count * Math.cos(t)), 1e-6 * (f.kappa as number), 'kappa');
        },
      ),
      { numRuns: 300, seed: 5 },
    );
  });

  it('fisherLines of one line gives its mean but null kappa and alpha95, with a reason', () => {
    const f = fisherLines(lines([[120, 30]]));
    expectAzimuth(f.mean!.trend, 120, 1e-9);
    expect(f.kappa).toBeNull();
    expect(f.alpha95).toBeNull();
    expect(f.notes.join(' ')).toMatch(/at least 2/);
  });

  it('fisherLines of identical lines gives alpha95 = 0 and kappa = null (unbounded), never Infinity', () => {
    const f = fisherLines(lines([[45, 10], [45, 10], [45, 10]]));
    expect(f.alpha95).toBe(0);
    expect(f.kappa).toBeNull();
  });

  it('fisherLines of widely spread lines returns alpha95 = null rather than a cone wider than 90°', () => {
    const f = fisherLines(lines([[0, 0], [90, 0], [0, 90]]));
    expect(f.alpha95).toBeNull();
    expect(f.notes.join(' ')).toMatch(/90°|dispersed/);
  });

  it('fisherStatistics with axial: false lets opposite vectors cancel (R = 0, no mean)', () => {
    const f = fisherStatistics([{ x: 1, y: 0, z: 0 }, { x: -1, y: 0, z: 0 }], { axial: false });
    expectClose(f.R, 0, 1e-15);
    expect(f.mean).toBeNull();
    expect(f.alpha95).toBeNull();
  });

  it('fisherStatistics of no vectors returns n = 0 and nulls', () => {
    expect(fisherStatistics([])).toMatchObject({ n: 0, mean: null, kappa: null, alpha95: null });
  });

  it('fisherLines and assertLines reject a bad plunge or trend naming the row', () => {
    expect(() => fisherLines(lines([[10, 20], [30, 95]]))).toThrow(/lines\[1\]\.plunge: 95 is not a plunge \(expected 0 to 90\)/);
    expect(() => assertLines([{ trend: Number.NaN, plunge: 3 }])).toThrow(/lines\[0\]\.trend: NaN/);
    expect(() => fisherStatistics([{ x: 0, y: 0, z: 0 }])).toThrow(/vector 0/);
  });
});
