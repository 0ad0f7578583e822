import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import { EigenvalueDecomposition, Matrix } from 'ml-matrix';
import { analyzeFold, analyzeFoldPoles, type FoldAnalysis } from '../../src/core/foldAnalysis';
import { createRandom } from '../../src/core/random';
import { axialAngle, cross, lineToVector, normalToPlane, normalize, planeNormal, vectorToLine } from '../../src/core/vectors';
import type { Line, PlaneMeasurement, Vec3 } from '../../src/core/types';
import { expectAzimuth, expectClose, expectDeepClose } from '../helpers/tolerance';

/** Planes containing `axis`, spread over profile angles 0..180°, with gaussian out-of-girdle scatter. */
function foldPlanes(axis: Line, n: number, scatterDeg: number, seed: number, spanDeg = 180): PlaneMeasurement[] {
  const rng = createRandom(seed);
  const a = lineToVector(axis);
  const helper: Vec3 = Math.abs(a.z) < 0.9 ? { x: 0, y: 0, z: 1 } : { x: 1, y: 0, z: 0 };
  const u = normalize(cross(a, helper));
  const w = cross(a, u);
  return Array.from({ length: n }, () => {
    const phi = ((spanDeg * Math.PI) / 180) * rng.next();
    const e = ((scatterDeg * Math.PI) / 180) * Math.sqrt(-2 * Math.log(1 - rng.next())) * Math.cos(2 * Math.PI * rng.next());
    const c = Math.cos(e), s = Math.sin(e);
    return normalToPlane({
      x: c * (Math.cos(phi) * u.x + Math.sin(phi) * w.x) + s * a.x,
      y: c * (Math.cos(phi) * u.y + Math.sin(phi) * w.y) + s * a.y,
      z: c * (Math.cos(phi) * u.z + Math.sin(phi) * w.z) + s * a.z,
    });
  });
}

const codes = (r: FoldAnalysis) => r.warnings.map((w) => w.code);

/** Every number anywhere in a value is finite. */
function expectAllFinite(value: unknown, path = 'result'): void {
  if (typeof value === 'number') {
    if (!Number.isFinite(value)) expect.fail(`${path} is ${value}`);
  } else if (Array.isArray(value)) {
    value.forEach((v, i) => expectAllFinite(v, `${path}[${i}]`));
  } else if (value && typeof value === 'object') {
    for (const [k, v] of Object.entries(value)) expectAllFinite(v, `${path}.${k}`);
  }
}

describe('analyzeFold', () => {
  it('analyzeFold of a noisy girdle about 040/25 finds the axis inside its cone, with eigenvalues matching ml-matrix', () => {
    const planes = foldPlanes({ trend: 40, plunge: 25 }, 120, 4, 1);
    const r = analyzeFold({ planes });
    expect(r.n).toBe(120);
    expect(codes(r)).toEqual([]);
    expect(r.fabric?.shape).toBe('girdle');
    expect(r.cone95).not.toBeNull();
    expect(axialAngle(lineToVector(r.axis!), lineToVector({ trend: 40, plunge: 25 }))).toBeLessThan(r.cone95! * 1.5);
    // Reference: ml-matrix eigenvalues of the poles' tensor XᵀX/N.
    const X = new Matrix(planes.map((p) => { const v = planeNormal(p); return [v.x, v.y, v.z]; }));
    const ref = new EigenvalueDecomposition(X.transpose().mmul(X).div(planes.length), { assumeSymmetric: true }).realEigenvalues.sort((a, b) => b - a);
    expectDeepClose(r.eigenvalues, ref, 1e-12);
    expectDeepClose(r.eigenvectors![2], r.axis, 1e-9);
    expectDeepClose(normalToPlane(lineToVector(r.axis!)), r.girdle, 1e-9);
    expect(axialAngle(lineToVector(r.beta!), lineToVector({ trend: 40, plunge: 25 }))).toBeLessThan(3);
    expect(r.reading).toMatch(/^The poles form a strong girdle \(K = [\d.]+, C = [\d.]+\); the fold axis \(pi axis\) is \d{3}\/\d{2} \(95% cone [\d.]+°\)\.$/);
    expect(r.reading).toContain(`${String(Math.round(r.axis!.trend)).padStart(3, '0')}/${Math.round(r.axis!.plunge)}`);
  });

  it('analyzeFold of limbs 120/40 and 240/40 gives axis and beta 180/22.76 (REFERENCES.md, derived) and warns of few planes', () => {
    const r = analyzeFold({ planes: [{ dipDirection: 120, dip: 40 }, { dipDirection: 240, dip: 40 }] });
    expectAzimuth(r.axis!.trend, 180, 0.001);
    expectClose(r.axis!.plunge, 22.76, 0.001);
    expectAzimuth(r.beta!.trend, 180, 0.001);
    expectClose(r.beta!.plunge, 22.76, 0.001);
    expect(codes(r)).toContain('few-planes');
    expect(r.cone95).toBeNull();
  });

  it('analyzeFold with lines gives their Fisher statistics (REFERENCES.md, derived) and the angle to the axis', () => {
    const planes = foldPlanes({ trend: 15, plunge: 45 }, 60, 3, 2);
    const lines = [[10, 40], [20, 45], [15, 50], [5, 42], [25, 48]].map(([trend, plunge]) => ({ trend, plunge }));
    const r = analyzeFold({ planes, lines });
    expectClose(r.lines!.R, 4.970583, 1e-6, 'R');
    expectClose(r.lines!.kappa!, 135.974, 1e-3, 'kappa');
    expectClose(r.lines!.alpha95!, 6.585, 1e-3, 'alpha95');
    expectAzimuth(r.lines!.mean!.trend, 14.71, 0.005);
    expectClose(r.lines!.angleToAxis!, axialAngle(lineToVector(r.lines!.mean!), lineToVector(r.axis!)), 1e-6, 'angleToAxis');
  });

  // Warning cases: each row is a constructed situation and the codes it must raise.
  const rows: { name: string; planes: PlaneMeasurement[]; lines?: Line[]; expected: string[]; axisNull: boolean }[] = [
    { name: 'no planes', planes: [], expected: ['no-planes'], axisNull: true },
    { name: 'one plane', planes: [{ dipDirection: 10, dip: 20 }], expected: ['few-planes', 'parallel-planes'], axisNull: true },
    { name: 'three identical planes', planes: Array(3).fill({ dipDirection: 200, dip: 55 }), expected: ['parallel-planes'], axisNull: true },
    {
      name: 'planes within 1° of each other',
      planes: [{ dipDirection: 100, dip: 30 }, { dipDirection: 101, dip: 30.5 }, { dipDirection: 100.5, dip: 29.6 }, { dipDirection: 99.5, dip: 30.2 }],
      expected: ['nearly-parallel-planes', 'cluster-not-girdle', 'beta-undefined', 'wide-cone'],
      axisNull: false,
    },
    {
      // Poles plunging 60 toward 000/090/180/270: S2 = S3 by symmetry (derived), so no least direction.
      name: 'planes dipping 30 toward 180, 270, 000, 090',
      planes: [180, 270, 0, 90].map((dipDirection) => ({ dipDirection, dip: 30 })),
      expected: ['axis-undefined', 'cluster-not-girdle', 'beta-undefined'],
      axisNull: true,
    },
    { name: 'a cluster with 10° scatter', planes: foldPlanes({ trend: 0, plunge: 0 }, 80, 10, 3, 20), expected: ['cluster-not-girdle'], axisNull: false },
    {
      name: 'planes of uniformly spread poles',
      planes: Array.from({ length: 400 }, (_, i) => { const r = createRandom(i + 1); return { dipDirection: 360 * r.next(), dip: (Math.acos(r.next()) * 180) / Math.PI }; }),
      expected: ['uniform-spread', 'wide-cone'],
      axisNull: false,
    },
    { name: 'a girdle with an empty list of lines', planes: foldPlanes({ trend: 90, plunge: 10 }, 30, 3, 4), lines: [], expected: [], axisNull: false },
    { name: 'a girdle with one line', planes: foldPlanes({ trend: 90, plunge: 10 }, 30, 3, 4), lines: [{ trend: 90, plunge: 10 }], expected: ['few-lines'], axisNull: false },
  ];
  for (const { name, planes, lines, expected, axisNull } of rows) {
    it(`analyzeFold(${name}) warns ${expected.join(', ')}${axisNull ? ' and has no axis' : ''}`, () => {
      const r = analyzeFold({ planes, lines }, { bootstrap: 200 });
      expect(codes(r).sort()).toEqual([...expected].sort());
      expect(r.axis === null).toBe(axisNull);
      expect(r.girdle === null).toBe(axisNull);
      for (const w of r.warnings) expect(w.message.length).toBeGreaterThan(20);
      expectAllFinite(r);
    });
  }

  it('analyzeFold never returns NaN or Infinity for 0 to 5 planes with duplicates and 0 to 3 lines (property)', () => {
    const plane = fc.oneof(
      fc.constantFrom({ dipDirection: 0, dip: 0 }, { dipDirection: 90, dip: 90 }, { dipDirection: 270, dip: 90 }, { dipDirection: 45, dip: 45 }, { dipDirection: 360, dip: 10 }),
      fc.record({ dipDirection: fc.double({ min: 0, max: 360, noNaN: true }), dip: fc.double({ min: 0, max: 90, noNaN: true }) }),
    );
    const line = fc.record({ trend: fc.double({ min: 0, max: 360, noNaN: true }), plunge: fc.double({ min: 0, max: 90, noNaN: true }) });
    fc.assert(
      fc.property(fc.array(plane, { maxLength: 5 }), fc.array(fc.integer({ min: 0, max: 4 }), { maxLength: 3 }), fc.option(fc.array(line, { maxLength: 3 }), { nil: undefined }), (base, dupIdx, lines) => {
        const planes = [...base, ...dupIdx.filter((i) => i < base.length).map((i) => base[i])].slice(0, 5);
        const r = analyzeFold({ planes, lines }, { bootstrap: 30, seed: 3 });
        expectAllFinite(r);
        expect(JSON.parse(JSON.stringify(r))).toEqual(r);
        if (r.eigenvalues) expectClose(r.eigenvalues[0] + r.eigenvalues[1] + r.eigenvalues[2], 1, 1e-12, 'sum of eigenvalues');
        expect(r.n).toBe(planes.length);
      }),
      { numRuns: 400, seed: 51 },
    );
  });

  it('analyzeFold gives the same result for the same seed, and analyzeFoldPoles agrees with it', () => {
    const planes = foldPlanes({ trend: 250, plunge: 40 }, 50, 6, 5);
    const a = analyzeFold({ planes }, { seed: 8 });
    expect(analyzeFold({ planes }, { seed: 8 })).toEqual(a);
    const poles = Float64Array.from(planes.flatMap((p) => { const v = planeNormal(p); return [v.x, v.y, v.z]; }));
    expect(analyzeFoldPoles(poles, { seed: 8 })).toEqual(a);
  });

  it('analyzeFold with bootstrap: 0 leaves cone95 null and says so in the method text', () => {
    const r = analyzeFold({ planes: foldPlanes({ trend: 10, plunge: 10 }, 20, 3, 6) }, { bootstrap: 0 });
    expect(r.cone95).toBeNull();
    expect(r.method).toMatch(/No bootstrap cone/);
    expect(r.method).toMatch(/defer to local codes and licensed professional practice/);
    expectDeepClose(vectorToLine(lineToVector(r.axis!)), r.axis, 1e-12);
  });

  it('analyzeFold rejects bad input with messages that name the row, field and value', () => {
    expect(() => analyzeFold({ planes: [{ dipDirection: 10, dip: 20 }, { dipDirection: 10, dip: 20 }, { dipDirection: 10, dip: 95 }] })).toThrow(
      /planes\[2\]\.dip: 95 is not a dip \(expected 0 to 90\)/,
    );
    expect(() => analyzeFold({ planes: [], lines: [{ trend: 10, plunge: -3 }] })).toThrow(/lines\[0\]\.plunge: -3/);
    expect(() => analyzeFold({} as never)).toThrow(/input\.planes is missing/);
    expect(() => analyzeFold({ planes: [] }, { bootstrap: -1 })).toThrow(/bootstrap: -1/);
    expect(() => analyzeFold({ planes: [] }, { seed: 1.5 })).toThrow(/seed: 1.5/);
    expect(() => analyzeFoldPoles(new Float64Array(4))).toThrow(/length 4 is not a multiple of 3/);
  });
});
