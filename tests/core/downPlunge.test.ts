import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { Matrix } from 'ml-matrix';
import { checkAxis, profileFrame, profileToEnu, projectDownPlunge, projectPoint, type Enu } from '../../src/core/downPlunge';
import { lineInProfile, planeTraceInProfile } from '../../src/core/profileAttitude';
import { expectClose } from '../helpers/tolerance';

const TOL = 1e-9;
const r = (deg: number): number => (deg * Math.PI) / 180;

/**
 * The projection built a second, independent way: the textbook rotations Rz(t) (turning the
 * trend onto +y) then Rx(p) (turning the down-plunge direction onto +y), multiplied by ml-matrix.
 * The rotated frame's x, z, y are profile right, profile up and depth (common practice for
 * elementary rotations; Rz(t) maps (sin t, cos t, 0) to (0, 1, 0), Rx(p) maps (0, cos p, -sin p) to (0, 1, 0)).
 */
function byRotations(p: Enu, trend: number, plunge: number): [number, number, number] {
  const t = r(trend);
  const q = r(plunge);
  const rz = new Matrix([
    [Math.cos(t), -Math.sin(t), 0],
    [Math.sin(t), Math.cos(t), 0],
    [0, 0, 1],
  ]);
  const rx = new Matrix([
    [1, 0, 0],
    [0, Math.cos(q), -Math.sin(q)],
    [0, Math.sin(q), Math.cos(q)],
  ]);
  const out = rx.mmul(rz).mmul(Matrix.columnVector([...p])).to1DArray();
  return [out[0], out[2], out[1]];
}

describe('projectDownPlunge(xyz, axis) against reference values', () => {
  const rows: { axis: { trend: number; plunge: number }; p: Enu; expected: [number, number, number]; tol?: number; source: string }[] = [
    // REFERENCES.md "Profiles" (derived): axis 090/30.
    { axis: { trend: 90, plunge: 30 }, p: [100, 0, 0], expected: [0, 50, 86.603], tol: 5e-4, source: 'REFERENCES.md, derived' },
    { axis: { trend: 90, plunge: 30 }, p: [0, 0, 100], expected: [0, 86.603, -50], tol: 5e-4, source: 'REFERENCES.md, derived' },
    // Horizontal axis 000/00: a vertical section normal to the trend, seen looking north (derived
    // from the frame: u = east, v = up, a = north).
    { axis: { trend: 0, plunge: 0 }, p: [100, 0, 0], expected: [100, 0, 0], source: 'derived: x\' is east' },
    { axis: { trend: 0, plunge: 0 }, p: [0, 0, 100], expected: [0, 100, 0], source: 'derived: y\' is elevation' },
    { axis: { trend: 0, plunge: 0 }, p: [0, 100, 0], expected: [0, 0, 100], source: 'derived: depth is distance north' },
    // Horizontal axis 090/00, looking east: right is south (derived: u = (0, -1, 0)).
    { axis: { trend: 90, plunge: 0 }, p: [0, 100, 0], expected: [-100, 0, 0], source: 'derived: looking east, north is on the left' },
    { axis: { trend: 90, plunge: 0 }, p: [30, -40, 250], expected: [40, 250, 30], source: 'derived' },
    // Vertical axis, trend 000: the map itself seen from above (x' east, y' north, depth = -up).
    { axis: { trend: 0, plunge: 90 }, p: [120, -80, 500], expected: [120, -80, -500], source: 'derived: plunge 90 gives the map' },
    // Vertical axis with trend 090: the map turned so that east is up the page.
    { axis: { trend: 90, plunge: 90 }, p: [100, 0, 0], expected: [0, 100, 0], source: 'derived: u = (0,-1,0), v = (1,0,0)' },
    // Axis 180/45: a horizontal step of 100 m to the south (down the trend) is 70.71 m along the axis and 70.71 m up the profile.
    { axis: { trend: 180, plunge: 45 }, p: [0, -100, 0], expected: [0, 70.7107, 70.7107], tol: 1e-4, source: 'derived: 100 cos 45° and 100 sin 45°' },
    // Map distances along the trend shrink by sin(plunge) in the profile (REFERENCES.md, common practice): 1000 m down trend 075 at plunge 12.
    { axis: { trend: 75, plunge: 12 }, p: [1000 * Math.sin(r(75)), 1000 * Math.cos(r(75)), 0], expected: [0, 1000 * Math.sin(r(12)), 1000 * Math.cos(r(12))], source: 'REFERENCES.md, common practice' },
  ];
  for (const row of rows) {
    it(`projectDownPlunge([${row.p.join(', ')}], ${row.axis.trend}/${row.axis.plunge}) gives (${row.expected.join(', ')}) (${row.source})`, () => {
      const out = projectDownPlunge(new Float64Array(row.p), row.axis);
      row.expected.forEach((e, k) => expectClose(out[k], e, row.tol ?? TOL, ["x'", "y'", 'depth'][k]));
    });
  }

  it('projectDownPlunge(xyz, axis) agrees with the product of elementary rotations computed by ml-matrix on a table of points and axes', () => {
    const axes = [
      { trend: 0, plunge: 0 },
      { trend: 75, plunge: 12 },
      { trend: 100, plunge: 18 },
      { trend: 213.5, plunge: 47 },
      { trend: 359, plunge: 89.5 },
      { trend: 300, plunge: 90 },
    ];
    const points: Enu[] = [
      [1, 0, 0],
      [0, 1, 0],
      [0, 0, 1],
      [-350.5, 1200.25, 812],
      [2500, -1800, -40],
    ];
    for (const axis of axes) {
      const flat = new Float64Array(points.flat());
      const out = projectDownPlunge(flat, axis);
      points.forEach((p, i) => {
        const expected = byRotations(p, axis.trend, axis.plunge);
        expected.forEach((e, k) => expectClose(out[3 * i + k], e, 1e-9 * Math.max(1, Math.hypot(...p)), `axis ${axis.trend}/${axis.plunge}, point ${i}, component ${k}`));
      });
    }
  });
});

describe('profileFrame(axis)', () => {
  it('profileFrame(axis) is orthonormal and right-handed with u × v = -a (the observer looks along +a)', () => {
    for (const axis of [{ trend: 0, plunge: 0 }, { trend: 75, plunge: 12 }, { trend: 245, plunge: 63 }, { trend: 10, plunge: 90 }]) {
      const { axis: a, right: u, up: v } = profileFrame(axis);
      const dot = (p: Enu, q: Enu) => p[0] * q[0] + p[1] * q[1] + p[2] * q[2];
      for (const [p, q] of [[a, u], [a, v], [u, v]] as const) expectClose(dot(p, q), 0, 1e-15, 'dot');
      for (const w of [a, u, v]) expectClose(dot(w, w), 1, 1e-15, 'length');
      const uxv: Enu = [u[1] * v[2] - u[2] * v[1], u[2] * v[0] - u[0] * v[2], u[0] * v[1] - u[1] * v[0]];
      uxv.forEach((c, k) => expectClose(c, -a[k], 1e-15, `u × v + a, component ${k}`));
      // Up is up (or level for a vertical axis) and the axis points down or level.
      expect(v[2]).toBeGreaterThanOrEqual(0);
      expect(a[2]).toBeLessThanOrEqual(0);
    }
  });

  it('profileFrame({trend: 0, plunge: 30}) puts east on the right of an observer looking north and down', () => {
    const { right, axis } = profileFrame({ trend: 0, plunge: 30 });
    expect(right).toEqual([1, -0, 0]);
    expectClose(axis[1], Math.cos(r(30)), 1e-15, 'north part of the axis');
  });
});

describe('projectDownPlunge options and errors', () => {
  it('projectDownPlunge(xyz, axis, xyz) may work in place and gives what a separate output gets', () => {
    const xyz = new Float64Array([10, 20, 30, -5, 7, 900]);
    const separate = projectDownPlunge(xyz, { trend: 30, plunge: 40 });
    const same = projectDownPlunge(xyz, { trend: 30, plunge: 40 }, xyz);
    expect(same).toBe(xyz);
    expect(Array.from(same)).toEqual(Array.from(separate));
  });

  it('projectDownPlunge keeps NaN where a position is missing and never drops or moves other points', () => {
    const out = projectDownPlunge(new Float64Array([Number.NaN, 0, 0, 100, 0, 0]), { trend: 90, plunge: 30 });
    expect(Number.isNaN(out[0])).toBe(true);
    expectClose(out[4], 50, 1e-12, "y' of the second point");
  });

  it('projectDownPlunge rejects a length that is not triples, a short out array and a plunge outside 0 to 90', () => {
    expect(() => projectDownPlunge(new Float64Array(4), { trend: 0, plunge: 0 })).toThrow(/4 numbers.*multiple of 3/);
    expect(() => projectDownPlunge(new Float64Array(6), { trend: 0, plunge: 0 }, new Float64Array(3))).toThrow(/out has 3 numbers; expected at least 6/);
    expect(() => projectDownPlunge(new Float64Array(3), { trend: 0, plunge: 95 })).toThrow(/plunge 95 is not a plunge/);
    expect(() => checkAxis({ trend: Number.NaN, plunge: 10 })).toThrow(/trend NaN/);
  });
});

describe('projectDownPlunge properties (fast-check)', () => {
  const coord = fc.double({ min: -5000, max: 5000, noNaN: true });
  const point = fc.tuple(coord, coord, coord);
  const axis = fc.record({ trend: fc.double({ min: 0, max: 360, noNaN: true, maxExcluded: true }), plunge: fc.double({ min: 0, max: 90, noNaN: true }) });

  it("projectDownPlunge keeps |P|: x'^2 + y'^2 + depth^2 = |P|^2 (the frame is orthonormal)", () => {
    fc.assert(
      fc.property(point, axis, (p, ax) => {
        const [x, y, d] = projectDownPlunge(new Float64Array(p), ax);
        const n2 = p[0] ** 2 + p[1] ** 2 + p[2] ** 2;
        return Math.abs(x * x + y * y + d * d - n2) <= 1e-9 * Math.max(1, n2);
      }),
    );
  });

  it('projectDownPlunge preserves distances within the profile plane: the 2D distance is |(P - Q) × a|, the 3D distance with the along-axis part removed', () => {
    fc.assert(
      fc.property(point, point, axis, (p, q, ax) => {
        const out = projectDownPlunge(new Float64Array([...p, ...q]), ax);
        const d2 = Math.hypot(out[0] - out[3], out[1] - out[4]);
        const a = profileFrame(ax).axis;
        const diff = [p[0] - q[0], p[1] - q[1], p[2] - q[2]];
        // |diff × a| is the part of diff normal to the axis (no cancellation, unlike sqrt(|d|² - along²)).
        const across = Math.hypot(diff[1] * a[2] - diff[2] * a[1], diff[2] * a[0] - diff[0] * a[2], diff[0] * a[1] - diff[1] * a[0]);
        return Math.abs(d2 - across) <= 1e-9 * Math.max(1, Math.hypot(...diff));
      }),
    );
  });

  it('projectDownPlunge gives two points on one line parallel to the axis the same profile position', () => {
    fc.assert(
      fc.property(point, axis, fc.double({ min: -3000, max: 3000, noNaN: true }), (p, ax, s) => {
        const a = profileFrame(ax).axis;
        const out = projectDownPlunge(new Float64Array([...p, p[0] + s * a[0], p[1] + s * a[1], p[2] + s * a[2]]), ax);
        const tol = 1e-12 * (Math.hypot(...p) + Math.abs(s) + 1) * 10;
        return Math.abs(out[0] - out[3]) < tol && Math.abs(out[1] - out[4]) < tol && Math.abs(out[5] - out[2] - s) < tol;
      }),
    );
  });

  it('profileToEnu(projectDownPlunge(P)) gives P back', () => {
    fc.assert(
      fc.property(point, axis, (p, ax) => {
        const back = profileToEnu(projectDownPlunge(new Float64Array(p), ax), ax);
        return p.every((c, k) => Math.abs(back[k] - c) <= 1e-9 * Math.max(1, Math.abs(c)));
      }),
    );
  });
});

describe('projectPoint', () => {
  it('projectPoint([0, 0, 100], 090/30) gives the second REFERENCES.md row as an object', () => {
    const p = projectPoint([0, 0, 100], { trend: 90, plunge: 30 });
    expectClose(p.x, 0, 1e-12, "x'");
    expectClose(p.y, 86.6025, 1e-4, "y'");
    expectClose(p.depth, -50, 1e-12, 'depth');
  });
});

describe('planeTraceInProfile and lineInProfile', () => {
  // Apparent dip table of REFERENCES.md (derived): rows are (true dip, angle between strike and section) -> apparent dip.
  // With a horizontal axis the profile is the vertical section normal to the trend; a plane whose
  // strike makes the angle β with that section shows tan α = tan δ sin β.
  const rows = [
    { dip: 30, beta: 45, expected: 22.2077 },
    { dip: 45, beta: 30, expected: 26.5651 },
    { dip: 60, beta: 10, expected: 16.7396 },
  ];
  for (const { dip, beta, expected } of rows) {
    it(`planeTraceInProfile(dip ${dip}, strike ${beta}° from the section, horizontal axis) has |angle| ${expected}° (REFERENCES.md apparent dip)`, () => {
      // Axis 000/00: section azimuth 090. Strike at 090 - beta, dipping to the south-east side (dip direction = strike + 90).
      const strike = 90 - beta;
      const t = planeTraceInProfile({ dipDirection: strike + 90, dip }, { trend: 0, plunge: 0 })!;
      expectClose(Math.abs(t.angle), expected, 1e-4, 'apparent dip');
      // Dipping toward the east side (the right): the trace descends to the right.
      expect(t.angle).toBeLessThan(0);
    });
  }

  it('planeTraceInProfile gives planes that contain the axis (a cylindrical fold) axisToPlane 0 and a unit direction', () => {
    // Limbs 120/40 and 240/40 share the line 180/22.760 (REFERENCES.md, derived).
    for (const limb of [{ dipDirection: 120, dip: 40 }, { dipDirection: 240, dip: 40 }]) {
      const t = planeTraceInProfile(limb, { trend: 180, plunge: 22.76 })!;
      expectClose(t.axisToPlane, 0, 2e-3, 'angle between limb and axis');
      expectClose(Math.hypot(t.dx, t.dy), 1, 1e-12, 'unit trace');
      expect(t.dx).toBeGreaterThanOrEqual(0);
    }
    // Symmetric limbs look symmetric down the plunge: opposite trace angles.
    const a = planeTraceInProfile({ dipDirection: 120, dip: 40 }, { trend: 180, plunge: 22.76 })!;
    const b = planeTraceInProfile({ dipDirection: 240, dip: 40 }, { trend: 180, plunge: 22.76 })!;
    expectClose(a.angle, -b.angle, 2e-3, 'symmetric limbs');
  });

  it('planeTraceInProfile returns null for a plane normal to the axis (it is the profile plane itself)', () => {
    // Pole of the plane = the axis 075/12 -> plane 255/78 (common practice: dip = 90 - plunge).
    expect(planeTraceInProfile({ dipDirection: 255, dip: 78 }, { trend: 75, plunge: 12 })).toBeNull();
  });

  it('lineInProfile(axis, axis) is a point and a line 30° from the axis has angleToAxis 30', () => {
    const same = lineInProfile({ trend: 75, plunge: 12 }, { trend: 75, plunge: 12 });
    expectClose(same.angleToAxis, 0, 1e-9, 'angle');
    expectClose(Math.hypot(same.dx, same.dy), 0, 1e-12, 'projected length');
    const off = lineInProfile({ trend: 105, plunge: 0 }, { trend: 75, plunge: 0 });
    expectClose(off.angleToAxis, 30, 1e-9, 'angle');
    expectClose(Math.hypot(off.dx, off.dy), 0.5, 1e-12, 'projected length = sin 30°');
  });
});
