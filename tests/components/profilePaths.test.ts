import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { exaggeratedAngle } from '../../src/core/apparentDip';
import { planeTraceInProfile } from '../../src/core/profileAttitude';
import { PathWriter, c1, dotsPathData, ringsPathData, runsPathData, runsPathDataBinned, tickEnds, ticksPathData, xyPathData } from '../../src/components/profile/profilePaths';
import type { ProfileAffine } from '../../src/components/profile/profileView';
import { expectClose } from '../helpers/tolerance';

const ID: ProfileAffine = { sx: 1, tx: 0, sy: -1, ty: 0 };
const deg = (r: number): number => (r * 180) / Math.PI;

/** Angle of a drawn tick from the page's right, degrees in (-90, 90], positive rising (SVG y down). */
function drawnAngle(e: [number, number, number, number]): number {
  const dx = e[2] - e[0];
  const dy = -(e[3] - e[1]);
  const a = deg(Math.atan2(dy, dx));
  return a > 90 ? a - 180 : a <= -90 ? a + 180 : a;
}

describe('apparent-dip ticks', () => {
  it('tickEnds along planeTraceInProfile(plane, axis) is drawn at the trace angle for any plane and axis at true scale (property)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0, max: 359.9, noNaN: true }),
        fc.double({ min: 0, max: 90, noNaN: true }),
        fc.double({ min: 0, max: 359.9, noNaN: true }),
        fc.double({ min: 0, max: 90, noNaN: true }),
        fc.double({ min: 0.01, max: 5, noNaN: true }),
        (dd, dip, trend, plunge, s) => {
          const t = planeTraceInProfile({ dipDirection: dd, dip }, { trend, plunge });
          if (!t) return true;
          const e = tickEnds(100, 50, t.dx, t.dy, { sx: s, tx: 10, sy: -s, ty: 400 }, 7);
          const d = Math.abs(drawnAngle(e) - t.angle);
          // Directions, so 180° apart is the same tick.
          return Math.min(d, 180 - d) < 1e-7 && Math.abs(Math.hypot(e[2] - e[0], e[3] - e[1]) - 14) < 1e-9;
        },
      ),
    );
  });

  const rows: { dip: number; beta: number; expected: number; source: string }[] = [
    // tan(apparent) = tan(true dip)·sin(angle between strike and section): REFERENCES.md "Profiles".
    { dip: 30, beta: 45, expected: 22.2077, source: 'REFERENCES.md, derived from the standard formula' },
    { dip: 45, beta: 30, expected: 26.5651, source: 'REFERENCES.md, derived from the standard formula' },
    { dip: 60, beta: 10, expected: 16.7396, source: 'REFERENCES.md, derived from the standard formula' },
  ];
  for (const row of rows) {
    it(`a tick of planeTraceInProfile(dip ${row.dip}, ${row.beta}° from the section) under a horizontal axis is drawn ${row.expected}° from the horizontal (${row.source})`, () => {
      // Axis 000/00: the profile is a vertical section toward 090 (right = east). A strike at β
      // from 090 is 090 - β, so the dip direction is 180 - β (derived from the RHR).
      const t = planeTraceInProfile({ dipDirection: 180 - row.beta, dip: row.dip }, { trend: 0, plunge: 0 })!;
      const e = tickEnds(0, 0, t.dx, t.dy, { sx: 0.3, tx: 0, sy: -0.3, ty: 0 }, 7);
      // It dips toward the south-east: down to the right in a section looking north.
      expectClose(drawnAngle(e), -row.expected, 1e-4, 'drawn angle');
    });
  }

  it('tickEnds with a vertical exaggeration ve draws an apparent dip α at atan(ve·tan α), the angle exaggeratedAngle(α, ve) gives', () => {
    for (const [alpha, ve] of [[10, 2], [30, 3], [45, 5], [80, 2]] as const) {
      const r = (alpha * Math.PI) / 180;
      // Section convention (profileData.ts): positive α goes down toward increasing distance.
      const e = tickEnds(0, 0, Math.cos(r), -Math.sin(r), { sx: 0.5, tx: 0, sy: -0.5 * ve, ty: 0 }, 7);
      const expected = deg(Math.atan(ve * Math.tan(r))); // derived: only heights are stretched
      expectClose(drawnAngle(e), -expected, 1e-9, `α ${alpha} at ×${ve}`);
      expectClose(exaggeratedAngle(alpha, ve), expected, 1e-9, 'core exaggeratedAngle');
    }
  });

  it('ticksPathData(xy, tick) leaves out stations whose tick is NaN (lines, planes without a trace)', () => {
    const d = ticksPathData(Float64Array.of(0, 0, 10, 10, 20, 20), Float64Array.of(1, 0, NaN, NaN, 0, 1), ID, 5);
    expect(d).toBe('M-5 0L5 0M20 -15L20 -25');
  });
});

describe('one path per layer', () => {
  it('runsPathData(xyd, runStarts) writes one subpath per run, breaks at a NaN vertex and never bridges runs', () => {
    const xyd = Float64Array.of(0, 0, 0, 10, 0, 0, 20, 0, 0, /* run 2 */ 100, 5, 0, NaN, 5, 0, 120, 5, 0, 130, 5, 0);
    const d = runsPathData(xyd, Int32Array.of(0, 3, 7), ID);
    expect(d).toBe('M0 0L10 0L20 0M120 -5L130 -5');
    expect(d).not.toContain('NaN');
  });

  it('runsPathData draws a one-vertex run as a zero-length segment (a round-capped dot)', () => {
    expect(runsPathData(Float64Array.of(3, 4, 0), Int32Array.of(0, 1), ID)).toBe('M3 -4h0');
  });

  it('runsPathData(..., {cull}) leaves out segments wholly beyond one edge of the box and lifts the pen', () => {
    const xyd = Float64Array.of(-500, 0, 0, -400, 0, 0, 50, 0, 0, 60, 0, 0);
    const d = runsPathData(xyd, Int32Array.of(0, 4), { sx: 1, tx: 0, sy: -1, ty: 50 }, { cull: { left: 0, top: 0, width: 100, height: 100 } });
    expect(d).toBe('M-400 50L50 50L60 50');
  });

  it('runsPathDataBinned splits a run where the distance along the axis changes bin, each stretch in its own path', () => {
    const xyd = Float64Array.of(0, 0, 0, 10, 0, 0.2, 20, 0, 1.6, 30, 0, 1.9);
    const d = runsPathDataBinned(xyd, Int32Array.of(0, 4), ID, 2, (v) => v);
    // Means: 0.1 (bin 0), 0.9 (bin 0), 1.75 (bin 1).
    expect(d).toEqual(['M0 0L10 0L20 0', 'M20 0L30 0']);
  });

  it('dotsPathData and ringsPathData draw one marker per selected station in one string', () => {
    const xy = Float64Array.of(0, 0, 1, 1, 2, 2);
    expect(dotsPathData(xy, ID, (k) => k !== 1)).toBe('M0 0h0M2 -2h0');
    expect(ringsPathData(xy, ID, 2, (k) => k === 1).match(/M/g)).toHaveLength(1);
  });

  it('xyPathData(ground) breaks the ground line where the DEM gives no height', () => {
    expect(xyPathData(Float64Array.of(0, 10, 5, 11, 10, NaN, 15, 12, 20, 13), ID)).toBe('M0 -10L5 -11M15 -12L20 -13');
  });

  it('PathWriter writes every coordinate exactly as c1(v) does (property)', () => {
    fc.assert(
      fc.property(fc.array(fc.double({ min: -1e7, max: 1e7, noNaN: true }), { minLength: 2, maxLength: 40 }), (vs) => {
        const w = new PathWriter();
        let expected = '';
        for (let i = 0; i + 1 < vs.length; i += 2) {
          w.line(vs[i], vs[i + 1]);
          expected += `L${c1(vs[i])} ${c1(vs[i + 1])}`;
        }
        return w.toString() === expected;
      }),
    );
  });

  it('c1(v) rounds to a tenth and never writes -0', () => {
    expect(c1(-0.04)).toBe('0');
    expect(c1(12.345)).toBe('12.3');
  });

  it('runsPathData for 10^6 vertices builds one string with one subpath per run', () => {
    const n = 1_000_000;
    const xyd = new Float64Array(3 * n);
    for (let i = 0; i < n; i++) {
      xyd[3 * i] = i % 1000;
      xyd[3 * i + 1] = Math.floor(i / 1000);
    }
    const starts = Int32Array.from({ length: 1001 }, (_, r) => r * 1000);
    const d = runsPathData(xyd, starts, ID);
    expect(d.split('M')).toHaveLength(1001);
  });
});
