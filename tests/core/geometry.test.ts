import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import { EigenvalueDecomposition, Matrix, SingularValueDecomposition, determinant } from 'ml-matrix';
import {
  angleBetweenLines,
  angleBetweenPlanes,
  apparentDip,
  greatCirclePath,
  intersectionOfPlanes,
  planeThroughLines,
  rotateAboutAxis,
  smallCirclePath,
} from '../../src/core/geometry';
import { angleBetweenVectors, axialAngle, cross, dot, lineToVector, norm, normalize, planeNormal, poleOf, vec3, vectorToLine } from '../../src/core/vectors';
import type { Line, Plane, Vec3 } from '../../src/core/types';
import { expectAzimuth, expectClose, expectDeepClose } from '../helpers/tolerance';

const trendArb = fc.double({ min: 0, max: 359.999, noNaN: true });
const plungeArb = fc.double({ min: 0, max: 90, noNaN: true });
const lineArb = fc.record({ trend: trendArb, plunge: plungeArb });
const planeArb = fc.record({ dipDirection: trendArb, dip: plungeArb });
const unitArb = fc
  .tuple(fc.double({ min: -1, max: 1, noNaN: true }), fc.double({ min: -1, max: 1, noNaN: true }), fc.double({ min: -1, max: 1, noNaN: true }))
  .filter(([x, y, z]) => Math.hypot(x, y, z) > 0.1)
  .map(([x, y, z]) => normalize(vec3(x, y, z)));

/** Angle in degrees between two vectors as atan2(|a × b|, a · b): accurate near 0° and 180°, where acos is not. */
const preciseAngle = (a: Vec3, b: Vec3): number => (Math.atan2(norm(cross(a, b)), dot(a, b)) * 180) / Math.PI;

/** Trend/plunge of a vector with the plunge from atan2 (vectorToLine's asin loses digits near vertical). */
const lineOf = (v: Vec3): Line => {
  const u = v.z < 0 ? vec3(-v.x, -v.y, -v.z) : v;
  const h = Math.hypot(u.x, u.y);
  return { trend: ((Math.atan2(u.y, u.x) * 180) / Math.PI + 360) % 360, plunge: (Math.atan2(u.z, h) * 180) / Math.PI };
};

/**
 * Null-space direction of the rows (each row a vector) computed by ml-matrix's SVD: the right
 * singular vector of the smallest singular value. An outside reference for cross products.
 */
function nullDirection(rows: Vec3[]): Vec3 {
  const padded = [...rows.map((r) => [r.x, r.y, r.z]), ...Array.from({ length: 3 - rows.length }, () => [0, 0, 0])];
  const svd = new SingularValueDecomposition(new Matrix(padded));
  const d = svd.diagonal;
  const k = d.indexOf(Math.min(...d));
  const v = svd.rightSingularVectors.getColumn(k);
  return vec3(v[0], v[1], v[2]);
}

describe('intersectionOfPlanes', () => {
  // Reference table: {a, b, expected, tol}; every row names its source.
  const rows: { a: Plane; b: Plane; expected: Line; tol: number; source: string }[] = [
    // REFERENCES.md (derived): symmetric limbs; by hand tan(plunge) = tan 40°·cos 60° gives 22.760°.
    { a: { dipDirection: 120, dip: 40 }, b: { dipDirection: 240, dip: 40 }, expected: { trend: 180, plunge: 22.76 }, tol: 1e-3, source: 'REFERENCES.md' },
    // REFERENCES.md (derived), given to two decimals.
    { a: { dipDirection: 60, dip: 30 }, b: { dipDirection: 330, dip: 50 }, expected: { trend: 34.15, plunge: 27.46 }, tol: 6e-3, source: 'REFERENCES.md' },
    // Two vertical planes meet in a vertical line (common practice).
    { a: { dipDirection: 0, dip: 90 }, b: { dipDirection: 90, dip: 90 }, expected: { trend: 0, plunge: 90 }, tol: 1e-9, source: 'common practice' },
    // A horizontal plane meets any other plane along that plane's strike (common practice).
    { a: { dipDirection: 0, dip: 0 }, b: { dipDirection: 90, dip: 30 }, expected: { trend: 0, plunge: 0 }, tol: 1e-9, source: 'common practice' },
  ];
  for (const { a, b, expected, tol, source } of rows) {
    it(`intersectionOfPlanes(${a.dipDirection}/${a.dip}, ${b.dipDirection}/${b.dip}) is ${expected.trend}/${expected.plunge} (${source})`, () => {
      const got = intersectionOfPlanes(a, b);
      // A vertical line's trend is arbitrary: compare the plunge only then.
      if (expected.plunge === 90) expectClose(got.plunge, 90, tol, 'plunge');
      else expectDeepClose(got, expected, tol);
    });
  }

  it('intersectionOfPlanes(a, b) matches the null space of the two poles from ml-matrix SVD (reference library)', () => {
    fc.assert(
      fc.property(planeArb, planeArb, (a, b) => {
        fc.pre(axialAngle(planeNormal(a), planeNormal(b)) > 1);
        const got = lineToVector(intersectionOfPlanes(a, b));
        const ref = nullDirection([planeNormal(a), planeNormal(b)]);
        expectClose(axialAngle(got, ref), 0, 1e-5, 'angle to SVD null vector');
      }),
    );
  });

  it('intersectionOfPlanes(a, b) lies in both planes: 90° from both poles (property)', () => {
    fc.assert(
      fc.property(planeArb, planeArb, (a, b) => {
        fc.pre(angleBetweenPlanes(a, b) > 0.5);
        const l = intersectionOfPlanes(a, b);
        expectClose(angleBetweenLines(l, poleOf(a)), 90, 1e-9, 'angle to pole of a');
        expectClose(angleBetweenLines(l, poleOf(b)), 90, 1e-9, 'angle to pole of b');
        expect(l.plunge).toBeGreaterThanOrEqual(0);
      }),
    );
  });

  it('intersectionOfPlanes(p, p) and of opposite-dipping horizontal planes throws a RangeError naming the planes', () => {
    expect(() => intersectionOfPlanes({ dipDirection: 30, dip: 40 }, { dipDirection: 30, dip: 40 })).toThrow(/30\/40 and 30\/40 are parallel/);
    expect(() => intersectionOfPlanes({ dipDirection: 30, dip: 0 }, { dipDirection: 210, dip: 0 })).toThrow(RangeError);
  });

  it('intersectionOfPlanes rejects a dip of 95 with an error naming the field and value', () => {
    expect(() => intersectionOfPlanes({ dipDirection: 30, dip: 95 }, { dipDirection: 0, dip: 10 })).toThrow(/a\.dip is 95; expected a dip from 0 to 90/);
  });
});

describe('planeThroughLines', () => {
  const rows: { a: Line; b: Line; expected: Plane; tol: number; source: string }[] = [
    // A horizontal north line and a line plunging 30 east span the plane striking north, dipping 30 east (common practice).
    { a: { trend: 0, plunge: 0 }, b: { trend: 90, plunge: 30 }, expected: { dipDirection: 90, dip: 30 }, tol: 1e-9, source: 'common practice' },
    // Inverse of the REFERENCES.md limb row: the hinge 180/22.760 and the strike line 030/00 of limb 120/40.
    { a: { trend: 180, plunge: 22.760476 }, b: { trend: 30, plunge: 0 }, expected: { dipDirection: 120, dip: 40 }, tol: 1e-5, source: 'REFERENCES.md (derived)' },
  ];
  for (const { a, b, expected, tol, source } of rows) {
    it(`planeThroughLines(${a.trend}/${a.plunge}, ${b.trend}/${b.plunge}) is ${expected.dipDirection}/${expected.dip} (${source})`, () => {
      expectDeepClose(planeThroughLines(a, b), expected, tol);
    });
  }

  it('planeThroughLines(a, b) contains both lines and its pole is the ml-matrix SVD null vector (property, reference library)', () => {
    fc.assert(
      fc.property(lineArb, lineArb, (a, b) => {
        fc.pre(angleBetweenLines(a, b) > 1);
        const p = planeThroughLines(a, b);
        expectClose(angleBetweenLines(poleOf(p), a), 90, 1e-9, 'pole to a');
        expectClose(angleBetweenLines(poleOf(p), b), 90, 1e-9, 'pole to b');
        const ref = nullDirection([lineToVector(a), lineToVector(b)]);
        expectClose(axialAngle(planeNormal(p), ref), 0, 1e-5, 'pole to SVD null vector');
      }),
    );
  });

  it('planeThroughLines of parallel lines (010/20 twice, 090/00 and 270/00) throws a RangeError saying they are parallel', () => {
    expect(() => planeThroughLines({ trend: 10, plunge: 20 }, { trend: 10, plunge: 20 })).toThrow(/10\/20 and 10\/20 are parallel/);
    expect(() => planeThroughLines({ trend: 90, plunge: 0 }, { trend: 270, plunge: 0 })).toThrow(RangeError);
    // Within the tolerance argument: 0.5° apart counts as parallel when told to use 1°.
    expect(() => planeThroughLines({ trend: 10, plunge: 20 }, { trend: 10.5, plunge: 20 }, 1)).toThrow(/within 1°/);
  });

  it('planeThroughLines rejects a plunge of -5 and a NaN trend, naming the field', () => {
    expect(() => planeThroughLines({ trend: 10, plunge: -5 }, { trend: 0, plunge: 0 })).toThrow(/a\.plunge is -5/);
    expect(() => planeThroughLines({ trend: 0, plunge: 0 }, { trend: Number.NaN, plunge: 0 })).toThrow(/b\.trend is NaN/);
  });

  it('a pole is 90° from every line in its plane: angleBetweenLines(poleOf(p), l) = 90 (property)', () => {
    fc.assert(
      fc.property(planeArb, unitArb, (plane, w) => {
        const n = planeNormal(plane);
        // Project a random vector into the plane (w minus its component along the normal).
        const inPlane = vec3(w.x - dot(w, n) * n.x, w.y - dot(w, n) * n.y, w.z - dot(w, n) * n.z);
        fc.pre(norm(inPlane) > 0.05);
        expectClose(angleBetweenLines(poleOf(plane), lineOf(inPlane)), 90, 1e-9);
      }),
    );
  });
});

describe('angleBetweenLines / angleBetweenPlanes', () => {
  const lineRows = [
    { a: { trend: 0, plunge: 0 }, b: { trend: 90, plunge: 0 }, expected: 90 }, // common practice: orthogonal horizontals
    { a: { trend: 0, plunge: 30 }, b: { trend: 0, plunge: 60 }, expected: 30 }, // same vertical plane: plunges subtract
    { a: { trend: 0, plunge: 30 }, b: { trend: 180, plunge: 30 }, expected: 60 }, // 120° between vectors; lines have no sense -> 60
    { a: { trend: 10, plunge: 20 }, b: { trend: 190, plunge: 20 }, expected: 40 }, // opposite trends: vectors 180 - 2·20 = 140° apart -> 40
  ];
  for (const { a, b, expected } of lineRows) {
    it(`angleBetweenLines(${a.trend}/${a.plunge}, ${b.trend}/${b.plunge}) is ${expected} (common practice)`, () => {
      expectClose(angleBetweenLines(a, b), expected, 1e-9);
    });
  }

  const planeRows = [
    // Same strike, dips 30 E and 50 W: the planes meet at 180 - 30 - 50 = 100°, acute 80° (common practice).
    { a: { dipDirection: 90, dip: 30 }, b: { dipDirection: 270, dip: 50 }, expected: 80 },
    // Horizontal and vertical planes are at right angles (common practice).
    { a: { dipDirection: 0, dip: 0 }, b: { dipDirection: 45, dip: 90 }, expected: 90 },
    // Same strike, same dip direction: dips subtract (common practice).
    { a: { dipDirection: 200, dip: 20 }, b: { dipDirection: 200, dip: 65 }, expected: 45 },
  ];
  for (const { a, b, expected } of planeRows) {
    it(`angleBetweenPlanes(${a.dipDirection}/${a.dip}, ${b.dipDirection}/${b.dip}) is ${expected} (common practice)`, () => {
      expectClose(angleBetweenPlanes(a, b), expected, 1e-9);
    });
  }

  it('angleBetweenLines(a, b) stays in [0, 90] and equals the smaller of the vector angle and its supplement (property)', () => {
    fc.assert(
      fc.property(lineArb, lineArb, (a, b) => {
        const got = angleBetweenLines(a, b);
        const vAngle = preciseAngle(lineToVector(a), lineToVector(b));
        expect(got).toBeGreaterThanOrEqual(0);
        expect(got).toBeLessThanOrEqual(90);
        expectClose(got, Math.min(vAngle, 180 - vAngle), 1e-6);
      }),
    );
  });
});

describe('rotateAboutAxis', () => {
  const north = vec3(1, 0, 0);
  const east = vec3(0, 1, 0);
  const down = vec3(0, 0, 1);

  it('rotateAboutAxis(north, down, 90) is east: positive turns clockwise looking down the axis (sense as documented)', () => {
    expectDeepClose(rotateAboutAxis(north, down, 90), { x: 0, y: 1, z: 0 }, 1e-12);
  });

  it('rotateAboutAxis(down, north, 90) is west: looking north along the axis, down (6 o\'clock) turns clockwise to the left', () => {
    expectDeepClose(rotateAboutAxis(down, north, 90), { x: 0, y: -1, z: 0 }, 1e-12);
  });

  it('rotateAboutAxis(line 040/10, down, 25) adds 25 to the trend and keeps the plunge (compass turn seen from above)', () => {
    expectDeepClose(vectorToLine(rotateAboutAxis(lineToVector({ trend: 40, plunge: 10 }), vec3(0, 0, 5), 25)), { trend: 65, plunge: 10 }, 1e-9);
  });

  it('rotateAboutAxis(dip line 090/30, strike 000/00, -30) is 090/00: untilting bedding about its strike (common practice)', () => {
    const back = vectorToLine(rotateAboutAxis(lineToVector({ trend: 90, plunge: 30 }), lineToVector({ trend: 0, plunge: 0 }), -30));
    expectDeepClose(back, { trend: 90, plunge: 0 }, 1e-9);
  });

  it('rotateAboutAxis builds a proper rotation: ml-matrix finds R·Rᵀ = I, det 1, trace 1 + 2cos θ, the axis as the eigenvalue-1 vector and sin θ·k in the skew part (reference library)', () => {
    fc.assert(
      fc.property(unitArb, fc.double({ min: 1, max: 179, noNaN: true }), (axis, deg) => {
        const t = (deg * Math.PI) / 180;
        // Columns of R are the images of north, east and down.
        const cols = [north, east, down].map((e) => rotateAboutAxis(e, axis, deg));
        const R = new Matrix([0, 1, 2].map((r) => cols.map((c) => [c.x, c.y, c.z][r])));
        const I = R.mmul(R.transpose());
        for (let i = 0; i < 3; i++) for (let j = 0; j < 3; j++) expectClose(I.get(i, j), i === j ? 1 : 0, 1e-12, `R·Rᵀ[${i}][${j}]`);
        expectClose(determinant(R), 1, 1e-12, 'determinant');
        // Rotation matrix identities (standard linear algebra, Euler's rotation theorem):
        // tr R = 1 + 2 cos θ; (R + Rᵀ)/2 = cos θ·I + (1 − cos θ)·k kᵀ has eigenvalue 1 along k;
        // (R − Rᵀ)/2 = sin θ·[k]×, whose entries give sin θ·k with the sign of the sense of turn.
        expectClose(R.trace(), 1 + 2 * Math.cos(t), 1e-12, 'trace');
        const sym = R.clone().add(R.transpose()).div(2); // ml-matrix add/div work in place
        // Symmetric solver on purpose: the general one in ml-matrix can cycle on permutation-like matrices.
        const evd = new EigenvalueDecomposition(sym, { assumeSymmetric: true });
        const k = evd.realEigenvalues.indexOf(Math.max(...evd.realEigenvalues));
        expectClose(evd.realEigenvalues[k], 1, 1e-12, 'largest eigenvalue');
        const ev = evd.eigenvectorMatrix.getColumn(k);
        expectClose(axialAngle(vec3(ev[0], ev[1], ev[2]), axis), 0, 1e-5, 'eigenvector to axis');
        const skew = vec3(R.get(2, 1) - R.get(1, 2), R.get(0, 2) - R.get(2, 0), R.get(1, 0) - R.get(0, 1));
        expectDeepClose(skew, { x: 2 * Math.sin(t) * axis.x, y: 2 * Math.sin(t) * axis.y, z: 2 * Math.sin(t) * axis.z }, 1e-12, 'skew part');
      }),
    );
  });

  it('rotateAboutAxis preserves lengths and angles, keeps the axis, undoes with -θ and is the identity at 360 (property)', () => {
    fc.assert(
      fc.property(unitArb, unitArb, unitArb, fc.double({ min: -720, max: 720, noNaN: true }), fc.double({ min: 0.1, max: 10, noNaN: true }), (u, v, axis, deg, len) => {
        const lu = vec3(u.x * len, u.y * len, u.z * len);
        const ru = rotateAboutAxis(lu, axis, deg);
        const rv = rotateAboutAxis(v, axis, deg);
        expectClose(norm(ru), len, 1e-9 * len, 'length');
        expectClose(preciseAngle(ru, rv), preciseAngle(lu, v), 1e-9, 'angle');
        expectDeepClose(rotateAboutAxis(axis, axis, deg), axis, 1e-12, 'axis');
        expectDeepClose(rotateAboutAxis(rotateAboutAxis(v, axis, deg), axis, -deg), v, 1e-12, 'undo');
        expectDeepClose(rotateAboutAxis(v, axis, 360), v, 1e-12, '360');
      }),
    );
  });

  it('rotateAboutAxis with a zero axis or an infinite angle throws a RangeError saying what was expected', () => {
    expect(() => rotateAboutAxis(north, vec3(0, 0, 0), 10)).toThrow(/axis \(0, 0, 0\) has no direction/);
    expect(() => rotateAboutAxis(north, down, Number.POSITIVE_INFINITY)).toThrow(/degrees is Infinity/);
  });
});

describe('apparentDip', () => {
  // REFERENCES.md (derived from the standard formula tan(apparent) = tan(dip)·sin(angle to strike)).
  // Its pairs are (true dip, angle between strike and section): tan 30°·sin 45° -> 22.2077 and
  // tan 60°·sin 10° -> 16.7396; the other order would give 26.5651 and 8.6822.
  const rows = [
    { dip: 30, toStrike: 45, expected: 22.2077, tol: 1e-4 },
    { dip: 45, toStrike: 30, expected: 26.5651, tol: 1e-4 },
    { dip: 60, toStrike: 10, expected: 16.7396, tol: 1e-4 },
  ];
  for (const { dip, toStrike, expected, tol } of rows) {
    it(`apparentDip({dipDirection: 130, dip: ${dip}}, strike + ${toStrike}) is ${expected} (REFERENCES.md)`, () => {
      const plane = { dipDirection: 130, dip };
      // Section lines on either side of the dip direction, toStrike away from each end of the strike.
      expectClose(apparentDip(plane, 40 + toStrike), expected, tol, 'from strike 040');
      expectClose(apparentDip(plane, 220 - toStrike), expected, tol, 'from strike 220');
      // Looking the other way along the same section the plane rises by the same angle.
      expectClose(apparentDip(plane, 220 + toStrike), -expected, tol, 'reverse direction');
    });
  }

  it('apparentDip is the full dip along the dip direction, 0 along strike and negative (rising) on the far side (common practice)', () => {
    expectClose(apparentDip({ dipDirection: 130, dip: 35 }, 130), 35, 1e-12, 'along dip');
    expectClose(apparentDip({ dipDirection: 130, dip: 35 }, 40), 0, 1e-12, 'along strike');
    expectClose(apparentDip({ dipDirection: 130, dip: 35 }, 310), -35, 1e-12, 'up dip');
    expectClose(apparentDip({ dipDirection: 130, dip: 90 }, 131), 90, 1e-9, 'vertical plane');
  });

  it('apparentDip(plane, az) equals the plunge of the line the plane shares with the vertical plane along az (property)', () => {
    fc.assert(
      fc.property(fc.record({ dipDirection: trendArb, dip: fc.double({ min: 1, max: 89, noNaN: true }) }), trendArb, (plane, az) => {
        fc.pre(Math.abs(Math.cos(((az - plane.dipDirection) * Math.PI) / 180)) > 0.01);
        const section = { dipDirection: az + 90, dip: 90 };
        const l = intersectionOfPlanes(plane, section);
        expectClose(Math.abs(apparentDip(plane, az)), l.plunge, 1e-8);
      }),
    );
  });

  it('apparentDip of a vertical plane along its own strike throws a RangeError naming the azimuth and the plane', () => {
    expect(() => apparentDip({ dipDirection: 130, dip: 90 }, 40)).toThrow(/azimuth 40 runs along the strike of the vertical plane 130\/90/);
  });
});

describe('greatCirclePath / smallCirclePath', () => {
  it('greatCirclePath(090/30, 2) runs from the strike 000 through the dip line 090/30 to 180', () => {
    const path = greatCirclePath({ dipDirection: 90, dip: 30 }, 2);
    expect(path).toHaveLength(3);
    expectDeepClose(vectorToLine(path[0]), { trend: 0, plunge: 0 }, 1e-9);
    expectDeepClose(vectorToLine(path[1]), { trend: 90, plunge: 30 }, 1e-9);
    expectDeepClose(path[2], { x: -1, y: 0, z: 0 }, 1e-12);
  });

  it('greatCirclePath(plane, steps) gives steps + 1 unit vectors, all in the lower hemisphere and 90° from the pole (property)', () => {
    fc.assert(
      fc.property(planeArb, fc.integer({ min: 1, max: 50 }), (plane, steps) => {
        const path = greatCirclePath(plane, steps);
        expect(path).toHaveLength(steps + 1);
        const n = planeNormal(plane);
        for (const v of path) {
          expectClose(norm(v), 1, 1e-12, 'length');
          expect(v.z).toBeGreaterThanOrEqual(-1e-15);
          expectClose(angleBetweenVectors(v, n), 90, 1e-9, 'angle to pole');
        }
      }),
    );
  });

  it('smallCirclePath(axis, a, steps) is closed and every point is a° from the axis (property)', () => {
    fc.assert(
      fc.property(lineArb, fc.double({ min: 0, max: 180, noNaN: true }), fc.integer({ min: 3, max: 60 }), (axis, half, steps) => {
        const path = smallCirclePath(axis, half, steps);
        expect(path).toHaveLength(steps + 1);
        expect(path[steps]).toEqual(path[0]);
        for (const v of path) expectClose(preciseAngle(v, lineToVector(axis)), half, 1e-9, 'angle to axis');
      }),
    );
  });

  it('smallCirclePath(vertical axis, 30, 4) starts at 180/60 and turns clockwise seen from above (trends 180, 270, 000, 090)', () => {
    const trends = smallCirclePath({ trend: 0, plunge: 90 }, 30, 4).map((v) => vectorToLine(v));
    [180, 270, 0, 90, 180].forEach((t, i) => {
      expectAzimuth(trends[i].trend, t, 1e-9, `point ${i} trend`);
      expectClose(trends[i].plunge, 60, 1e-9, `point ${i} plunge`);
    });
  });

  it('smallCirclePath about a horizontal axis keeps its upper-hemisphere points as they are (negative z)', () => {
    const path = smallCirclePath({ trend: 0, plunge: 0 }, 30, 8);
    expect(path.some((v) => v.z < -0.1)).toBe(true);
  });

  it('greatCirclePath and smallCirclePath reject steps 0 or 2.5 and a half-angle of 200 with errors naming the value', () => {
    expect(() => greatCirclePath({ dipDirection: 0, dip: 10 }, 0)).toThrow(/steps is 0/);
    expect(() => smallCirclePath({ trend: 0, plunge: 10 }, 10, 2.5)).toThrow(/steps is 2.5/);
    expect(() => smallCirclePath({ trend: 0, plunge: 10 }, 200)).toThrow(/halfAngleDegrees is 200/);
  });
});
