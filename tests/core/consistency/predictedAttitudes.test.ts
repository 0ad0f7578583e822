import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { compareWithMeasured, predictAttitudes } from '../../../src/core/consistency/predictedAttitudes';
import { angleBetweenPlanes } from '../../../src/core/geometry';
import { expectAzimuth, expectClose } from '../../helpers/tolerance';
import { comb3, contactTraces, cross3, ned, planeOfNormal, unit3, type V3 } from './synthetic';

/** East-north-up points along a straight line through the origin in the north-east-down direction d. */
function straightTrace(d: V3, spacing = 10, count = 5): Float64Array {
  const out: number[] = [];
  for (let i = 0; i < count; i++) out.push(d[1] * spacing * i, d[0] * spacing * i, -d[2] * spacing * i);
  return Float64Array.from(out);
}

describe('predictAttitudes', () => {
  // Reference rows: REFERENCES.md "Orientation tensor" (derived): limbs 120/40 and 240/40 meet in
  // 180/22.760; limbs 060/30 and 330/50 meet in 034.15/27.46. A trace along a limb's strike, with
  // that line as the axis, must give back the limb.
  const rows = [
    { axis: { trend: 180, plunge: 22.76 }, strike: 30, expected: { dipDirection: 120, dip: 40 }, tol: 0.01 }, // REFERENCES.md, limb 120/40
    { axis: { trend: 180, plunge: 22.76 }, strike: 150, expected: { dipDirection: 240, dip: 40 }, tol: 0.01 }, // REFERENCES.md, limb 240/40
    { axis: { trend: 34.15, plunge: 27.46 }, strike: 330, expected: { dipDirection: 60, dip: 30 }, tol: 0.02 }, // REFERENCES.md, limb 060/30 (axis given to 0.01°)
    { axis: { trend: 34.15, plunge: 27.46 }, strike: 60, expected: { dipDirection: 330, dip: 50 }, tol: 0.02 }, // REFERENCES.md, limb 330/50
  ];
  for (const row of rows) {
    it(`predictAttitudes([trace along ${row.strike}°], ${row.axis.trend}/${row.axis.plunge}) gives the limb ${row.expected.dipDirection}/${row.expected.dip} (REFERENCES.md)`, () => {
      const predictions = predictAttitudes([straightTrace(ned(row.strike, 0))], row.axis);
      expect(predictions.length).toBe(5);
      for (const p of predictions) {
        expectAzimuth(p.plane!.dipDirection, row.expected.dipDirection, row.tol, 'dip direction');
        expectClose(p.plane!.dip, row.expected.dip, row.tol, 'dip');
      }
    });
  }

  it('predictAttitudes([straight 3D trace in a plane that contains the axis], axis) gives back that plane (property)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0, max: 359.9, noNaN: true }),
        fc.double({ min: 0, max: 80, noNaN: true }),
        fc.double({ min: 0, max: Math.PI, noNaN: true }),
        fc.double({ min: 0.45, max: Math.PI - 0.45, noNaN: true }),
        (trend, plunge, turn, along) => {
          // The plane: normal n ⊥ a; the trace direction t = cos(along)·a + sin(along)·(n × a), in the plane.
          const a = ned(trend, plunge);
          const helper: V3 = Math.abs(a[2]) < 0.9 ? [0, 0, 1] : [1, 0, 0];
          const u = unit3(cross3(a, helper));
          const w = cross3(a, u);
          const n = comb3(u, Math.cos(turn), w, Math.sin(turn));
          const t = comb3(a, Math.cos(along), cross3(n, a), Math.sin(along));
          const plane = planeOfNormal(n);
          for (const p of predictAttitudes([straightTrace(t)], { trend, plunge })) {
            expect(p.plane).not.toBeNull();
            expect(angleBetweenPlanes(p.plane!, plane)).toBeLessThan(1e-6);
          }
        },
      ),
      { numRuns: 400, seed: 8 },
    );
  });

  it('predictAttitudes gives no plane where the trace runs within minAngle of the axis, or does not move', () => {
    const axis = { trend: 75, plunge: 12 };
    const near = predictAttitudes([straightTrace(ned(80, 12))], axis);
    expect(near.every((p) => p.plane === null && p.tangentToAxis! < 20)).toBe(true);
    const still = predictAttitudes([new Float64Array([5, 5, 5, 5, 5, 5])], axis);
    expect(still.map((p) => p.tangent)).toEqual([null, null]);
    expect(predictAttitudes([straightTrace(ned(80, 12))], axis, { minAngle: 1 }).every((p) => p.plane !== null)).toBe(true);
  });

  it('compareWithMeasured(predictions along synthetic contacts, the contact surface\u2019s own tangent planes) agrees to a median of 1°', () => {
    // Contact F = v - 150 sin(2π u/1000) = level (synthetic.ts); its tangent plane at a point has
    // the normal ∇F = ∇v - 150·(2π/1000)·cos(2π u/1000)·∇u (derived), the outside answer here.
    const axis = { trend: 60, plunge: 20 };
    const t = (axis.trend * Math.PI) / 180;
    const p = (axis.plunge * Math.PI) / 180;
    const terrain = (x: number, y: number): number => 800 + 90 * Math.cos((2 * Math.PI * x) / 1100) + 0.02 * y;
    const pieces = contactTraces({ axis, amplitude: 150, wavelength: 1000, level: 650, box: [-2000, -1500, 2000, 1500], cell: 20, terrain });
    const measured = pieces.flatMap((xyz) => {
      const out = [];
      for (let i = 0; i < xyz.length; i += 3 * 7) {
        const [x, y] = [xyz[i], xyz[i + 1]];
        const u = x * Math.cos(t) - y * Math.sin(t);
        const k = 150 * ((2 * Math.PI) / 1000) * Math.cos((2 * Math.PI * u) / 1000);
        // ∇F in east-north-up, then to north-east-down for the plane.
        const e = Math.sin(p) * Math.sin(t) - k * Math.cos(t);
        const n = Math.sin(p) * Math.cos(t) + k * Math.sin(t);
        const up = Math.cos(p);
        out.push({ ...planeOfNormal([n, e, -up]), x: x + 3, y: y - 2, id: `M${out.length}` });
      }
      return out;
    });
    const check = compareWithMeasured(predictAttitudes(pieces, axis), measured, { radius: 50 });
    expect(check.comparisons.length).toBeGreaterThan(0.8 * measured.length);
    expect(check.medianAngle!).toBeLessThan(1);
    expect(check.comparisons.every((c) => c.distance <= 50)).toBe(true);
  });

  it('compareWithMeasured leaves out planes farther than the radius, flags large differences, and names bad input', () => {
    const predictions = predictAttitudes([straightTrace(ned(30, 0))], { trend: 180, plunge: 22.76 });
    const check = compareWithMeasured(
      predictions,
      [
        { x: 1, y: 1, dipDirection: 120, dip: 40, id: 'ok' },
        { x: 2, y: 2, dipDirection: 120, dip: 80, id: 'steep' },
        { x: 5000, y: 0, dipDirection: 120, dip: 40, id: 'far' },
      ],
      { radius: 100, threshold: 20 },
    );
    expect(check.comparisons.map((c) => [c.id, c.flagged])).toEqual([
      ['ok', false],
      ['steep', true],
    ]);
    expectClose(check.comparisons[1].angle, 40, 0.02, 'angle 120/40 to 120/80');
    expect(() => compareWithMeasured(predictions, [{ x: Number.NaN, y: 0, dipDirection: 10, dip: 10, id: 'B7' }])).toThrow(/measured\[0\] \(B7\): position \(NaN, 0\)/);
    expect(() => compareWithMeasured(predictions, [], { radius: 0 })).toThrow(/radius 0/);
    expect(() => predictAttitudes([new Float64Array([0, 0, Number.NaN])], { trend: 0, plunge: 0 })).toThrow(/piece 0, vertex 0 has a non-finite u/);
  });
});
