import { describe, expect, it } from 'vitest';
import { apparentDipAngle, apparentDipInSection, apparentPlungeInSection, exaggeratedAngle } from '../../src/core/apparentDip';
import { MISSES_SECTION, OUTSIDE_SWATH, pointAt, projectAlongPlunge, sectionLine, sectionSamples, topographicProfile } from '../../src/core/verticalSection';
import { mulberry32 } from '../helpers/prng';
import { expectClose } from '../helpers/tolerance';

const r = (deg: number): number => (deg * Math.PI) / 180;

describe('apparentDipAngle(trueDip, strikeToSection)', () => {
  // REFERENCES.md "Profiles" (derived from tan(apparent) = tan(true dip)·sin(angle between strike and section line)).
  // Rows are (true dip, angle between strike and section) -> apparent dip.
  const rows = [
    { dip: 30, beta: 45, expected: 22.2077, tol: 1e-4 }, // REFERENCES.md
    { dip: 45, beta: 30, expected: 26.5651, tol: 1e-4 }, // REFERENCES.md
    { dip: 60, beta: 10, expected: 16.7396, tol: 1e-4 }, // REFERENCES.md
    { dip: 40, beta: 90, expected: 40, tol: 1e-12 }, // section along the dip direction shows the true dip (common practice)
    { dip: 40, beta: 0, expected: 0, tol: 1e-12 }, // section along the strike shows a level trace (common practice)
    { dip: 90, beta: 20, expected: 90, tol: 1e-12 }, // a vertical plane looks vertical in any section it crosses (derived)
    { dip: 30, beta: 135, expected: 22.2077, tol: 1e-4 }, // only |sin β| counts (derived)
  ];
  for (const row of rows) {
    it(`apparentDipAngle(${row.dip}, ${row.beta}) is ${row.expected}°`, () => {
      expectClose(apparentDipAngle(row.dip, row.beta), row.expected, row.tol, 'apparent dip');
    });
  }

  it('apparentDipAngle(90, 0) is NaN: a vertical plane striking along the section holds the section and has no trace in it', () => {
    expect(Number.isNaN(apparentDipAngle(90, 0))).toBe(true);
  });

  it('apparentDipAngle rejects a dip outside 0 to 90', () => {
    expect(() => apparentDipAngle(95, 10)).toThrow(/true dip 95 is not a dip/);
  });
});

describe('apparentDipInSection(plane, sectionAzimuth)', () => {
  it('apparentDipInSection gives the REFERENCES.md rows with the sign of the side the plane dips to', () => {
    // Strike 030, dip 30 SE (dip direction 120): sections 45° from the strike, at azimuth 075 and 255.
    expectClose(apparentDipInSection({ dipDirection: 120, dip: 30 }, 75), 22.2077, 1e-4, 'toward increasing distance');
    expectClose(apparentDipInSection({ dipDirection: 120, dip: 30 }, 255), -22.2077, 1e-4, 'toward the start');
    // (45, 30): strike 000, dip direction 090, section 030.
    expectClose(apparentDipInSection({ dipDirection: 90, dip: 45 }, 30), 26.5651, 1e-4, '(45, 30)');
    // (60, 10): strike 100, dip direction 190, section 110.
    expectClose(apparentDipInSection({ dipDirection: 190, dip: 60 }, 110), 16.7396, 1e-4, '(60, 10)');
  });
});

describe('apparentPlungeInSection(line, sectionAzimuth)', () => {
  const rows = [
    // tan α = tan p / cos(θ - t) (derived, module comment): tan 30° / cos 45° = 0.816497 -> 39.2315°.
    { line: { trend: 90, plunge: 30 }, az: 135, expected: 39.2315, tol: 1e-4 },
    { line: { trend: 90, plunge: 30 }, az: 90, expected: 30, tol: 1e-12 }, // section along the trend shows the true plunge (common practice)
    { line: { trend: 90, plunge: 30 }, az: 270, expected: -30, tol: 1e-12 }, // plunging toward the start of the section
    { line: { trend: 90, plunge: 30 }, az: 0, expected: 90, tol: 1e-12 }, // a section normal to the trend shows the line end-on, vertical
    { line: { trend: 75, plunge: 0 }, az: 120, expected: 0, tol: 1e-12 }, // a level line stays level
  ];
  for (const row of rows) {
    it(`apparentPlungeInSection(${row.line.trend}/${row.line.plunge}, section ${row.az}) is ${row.expected}°`, () => {
      expectClose(apparentPlungeInSection(row.line, row.az), row.expected, row.tol, 'apparent plunge');
    });
  }

  it('exaggeratedAngle(angle, k) follows tan α\' = k tan α and leaves level and vertical alone', () => {
    expectClose(exaggeratedAngle(10, 2), (Math.atan(2 * Math.tan(r(10))) * 180) / Math.PI, 1e-12, '10° at 2x');
    expectClose(exaggeratedAngle(0, 5), 0, 1e-12, 'level');
    expectClose(exaggeratedAngle(90, 5), 90, 1e-12, 'vertical');
    expect(() => exaggeratedAngle(10, 0)).toThrow(/vertical exaggeration 0/);
  });
});

describe('sectionLine, sectionSamples and topographicProfile', () => {
  it('sectionLine(vertices) gives chainage and segment azimuths of a bent line', () => {
    const s = sectionLine([[0, 0], [300, 400], [300, 0]]);
    expect(s.chainage).toEqual([0, 500, 900]);
    expectClose(s.azimuths[0], (Math.atan2(300, 400) * 180) / Math.PI, 1e-12, 'first segment');
    expect(s.azimuths[1]).toBe(180);
  });

  it('sectionLine rejects fewer than two vertices, non-numbers and repeated vertices, naming them', () => {
    expect(() => sectionLine([[0, 0]])).toThrow(/at least 2 vertices, got 1/);
    expect(() => sectionLine([[0, 0], [Number.NaN, 1]])).toThrow(/section vertex 2/);
    expect(() => sectionLine([[0, 0], [5, 5], [5, 5]])).toThrow(/segment 2 \(vertices 2 and 3\) has zero length/);
  });

  it('sectionSamples(section, spacing) samples every spacing from the start plus each bend and the end', () => {
    const s = sectionLine([[0, 0], [0, 250], [100, 250]]);
    expect(sectionSamples(s, 100).map((p) => p.distance)).toEqual([0, 100, 200, 250, 300, 350]);
    expect(pointAt(s, 300)).toEqual({ distance: 300, x: 50, y: 250, segment: 1 });
    expect(() => sectionSamples(s, 0)).toThrow(/spacing 0 is not a positive number/);
    expect(() => sectionSamples(s, 1e-6)).toThrow(/use a larger spacing/);
  });

  it('topographicProfile gives the heights of the sampler, null (not 0) where it has none, and scales only plotY', () => {
    const s = sectionLine([[0, 0], [400, 0]]);
    // Ground z = 500 + 0.1 x (a plane: any interpolation reproduces it), no data east of x = 350.
    const heightAt = (x: number): number | null => (x > 350 ? null : 500 + 0.1 * x);
    const p = topographicProfile(s, 100, heightAt, { verticalExaggeration: 3 });
    expect(p.map((q) => q.elevation)).toEqual([500, 510, 520, 530, null]);
    expect(p.map((q) => q.plotY)).toEqual([1500, 1530, 1560, 1590, null]);
    expect(p.map((q) => q.distance)).toEqual([0, 100, 200, 300, 400]);
  });
});

describe('projectAlongPlunge(section, xyz, axis)', () => {
  it('projectAlongPlunge moves a point along the axis, not perpendicular to the section (hand-computed example)', () => {
    // Section along the x axis (azimuth 090); axis 000/45; point 100 m north of the line at height 0.
    // Moving up the plunge by 100/cos 45° = 141.42 m reaches the section 100 m higher (derived).
    const s = sectionLine([[0, 0], [1000, 0]]);
    const p = projectAlongPlunge(s, new Float64Array([500, 100, 0]), { trend: 0, plunge: 45 });
    expectClose(p.distance[0], 500, 1e-9, 'distance');
    expectClose(p.elevation[0], 100, 1e-9, 'elevation');
    expectClose(p.offset[0], -141.4214, 1e-4, 'offset (up the plunge)');
    expectClose(p.mapDistance[0], 100, 1e-9, 'map distance');
    expect(p.segment[0]).toBe(0);
  });

  it('projectAlongPlunge puts every point of a plane containing the axis on one line whose slope is the apparent dip (30, 45) -> 22.2077° of REFERENCES.md', () => {
    // Plane striking 000, dipping 30° east; section at azimuth 045, 45° from the strike (REFERENCES.md row (30, 45)).
    const strike = [0, 1, 0];
    const dipVec = [Math.cos(r(30)), 0, -Math.sin(r(30))];
    // An axis in the plane, 40° of pitch from the strike: a = cos 40°·strike + sin 40°·dip.
    const a = strike.map((c, k) => Math.cos(r(40)) * c + Math.sin(r(40)) * dipVec[k]);
    const axis = { trend: (Math.atan2(a[0], a[1]) * 180) / Math.PI, plunge: (Math.asin(-a[2]) * 180) / Math.PI };
    const rnd = mulberry32(3);
    const pts: number[] = [];
    for (let i = 0; i < 200; i++) {
      const sAlong = 2000 * rnd() - 1000;
      const tDown = 2000 * rnd() - 1000;
      const onPlane = [5000, 5000, 800];
      pts.push(...onPlane.map((c, k) => c + sAlong * strike[k] + tDown * dipVec[k]));
    }
    const section = sectionLine([[3000, 3000], [7000, 7000]]);
    const p = projectAlongPlunge(section, new Float64Array(pts), axis, { swath: 1500 });
    expect(p.projected).toBeGreaterThan(50);
    // Slope of the line through the projected points: elevation falls toward increasing distance (the plane dips east, the section runs NE).
    const tanApparent = Math.tan(r(22.2077));
    let ref = -1;
    for (let i = 0; i < p.segment.length; i++) {
      if (p.segment[i] < 0) continue;
      if (ref < 0) {
        ref = i;
        continue;
      }
      const slope = (p.elevation[i] - p.elevation[ref]) / (p.distance[i] - p.distance[ref]);
      if (Math.abs(p.distance[i] - p.distance[ref]) > 50) expectClose(slope, -tanApparent, 1e-5, `slope between projected points ${ref} and ${i}`);
    }
    expectClose(apparentDipInSection({ dipDirection: 90, dip: 30 }, 45), 22.2077, 1e-4, 'the same value from the formula');
  });

  it('projectAlongPlunge leaves points beyond the swath out (segment -1) and counts points whose projection passes beyond the section ends (segment -2)', () => {
    const s = sectionLine([[0, 0], [1000, 0]]);
    const p = projectAlongPlunge(s, new Float64Array([500, 300, 0, 500, 50, 0, 990, 60, 0]), { trend: 45, plunge: 20 }, { swath: 100 });
    expect(p.segment[0]).toBe(OUTSIDE_SWATH);
    expect(p.segment[1]).toBe(0);
    // Up the plunge is toward the SW (225): from (990, 60) the path meets y = 0 at x = 930, inside the section;
    // from (990, -60) the path runs down the plunge to the NE and meets y = 0 at x = 1050, beyond the end (derived).
    expect(p.segment[2]).toBe(0);
    expectClose(p.distance[2], 930, 1e-9, 'distance of the third point');
    const q = projectAlongPlunge(s, new Float64Array([990, -60, 0]), { trend: 45, plunge: 20 }, { swath: 100 });
    expect(q.segment[0]).toBe(MISSES_SECTION);
    expect([p.projected, p.outsideSwath, p.missed, q.missed]).toEqual([2, 1, 0, 1]);
  });

  it('projectAlongPlunge on a bent section chooses the segment reached by the shortest move along the axis', () => {
    const s = sectionLine([[0, 0], [1000, 0], [1000, 1000]]);
    // Axis 060/10 from (900, 500, 700): the east segment (x = 1000) is 100 m away across, reached after
    // s = 100 / (cos 10° sin 60°) m along the axis; the south segment (y = 0) would need 500 / (cos 10° cos 60°) m (derived).
    const p = projectAlongPlunge(s, new Float64Array([900, 500, 700]), { trend: 60, plunge: 10 }, { swath: 200 });
    const move = 100 / (Math.cos(r(10)) * Math.sin(r(60)));
    expect(p.segment[0]).toBe(1);
    expectClose(p.offset[0], move, 1e-9, 'move down the plunge');
    expectClose(p.distance[0], 1000 + 500 + move * Math.cos(r(10)) * Math.cos(r(60)), 1e-9, 'chainage on the second segment');
    expectClose(p.elevation[0], 700 - move * Math.sin(r(10)), 1e-9, 'elevation after moving down the plunge');
    // Apparent plunge of the axis in each segment: tan α = tan p / cos(θ - t) (derived, apparentDip.ts).
    expectClose(p.axisApparentPlunge[0], (Math.atan(Math.tan(r(10)) / Math.cos(r(30))) * 180) / Math.PI, 1e-9, 'first segment');
    expectClose(p.axisApparentPlunge[1], (Math.atan(Math.tan(r(10)) / Math.cos(r(60))) * 180) / Math.PI, 1e-9, 'second segment');
  });

  it('projectAlongPlunge with verticalExaggeration scales only plotY', () => {
    const s = sectionLine([[0, 0], [1000, 0]]);
    const pts = new Float64Array([500, 100, 650]);
    const one = projectAlongPlunge(s, pts, { trend: 10, plunge: 30 });
    const three = projectAlongPlunge(s, pts, { trend: 10, plunge: 30 }, { verticalExaggeration: 3 });
    expect(three.distance[0]).toBe(one.distance[0]);
    expect(three.elevation[0]).toBe(one.elevation[0]);
    expectClose(three.plotY[0], 3 * one.elevation[0], 1e-9, 'plotY');
  });

  it('projectAlongPlunge refuses an axis parallel to a segment and a vertical axis with an error that names the segment', () => {
    const s = sectionLine([[0, 0], [1000, 0]]);
    expect(() => projectAlongPlunge(s, new Float64Array(3), { trend: 90, plunge: 30 })).toThrow(/makes 0\.00° with the plane of section segment 1 \(azimuth 90\.0\).*draw the section across the trend/);
    expect(() => projectAlongPlunge(s, new Float64Array(3), { trend: 270.5, plunge: 0 })).toThrow(/section segment 1/);
    expect(() => projectAlongPlunge(s, new Float64Array(3), { trend: 0, plunge: 90 })).toThrow(/is vertical, so it lies in every vertical section/);
    expect(() => projectAlongPlunge(s, new Float64Array(4), { trend: 0, plunge: 30 })).toThrow(/multiple of 3/);
    expect(() => projectAlongPlunge(s, new Float64Array(3), { trend: 0, plunge: 30 }, { swath: -5 })).toThrow(/swath half-width -5/);
  });
});
