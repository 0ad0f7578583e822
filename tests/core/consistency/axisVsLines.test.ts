import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { compareAxisWithLines } from '../../../src/core/consistency/axisVsLines';
import { expectAzimuth, expectClose } from '../../helpers/tolerance';
import { mulberry32 } from '../../helpers/prng';
import { foldStations, lineOf, ned, offAxis } from './synthetic';

describe('compareAxisWithLines', () => {
  it('compareAxisWithLines(axis, five lines) reports their Fisher mean, alpha95 and kappa as in the REFERENCES.md table, and a zero angle to an axis equal to that mean', () => {
    // REFERENCES.md "Fisher (1953) statistics for lines" (derived): lines 010/40, 020/45, 015/50,
    // 005/42, 025/48 -> R = 4.970583, k = 135.974, alpha95 = 6.585°, mean 014.71/45.22.
    const lines = [
      { trend: 10, plunge: 40, id: 'H1' },
      { trend: 20, plunge: 45, id: 'H2' },
      { trend: 15, plunge: 50, id: 'H3' },
      { trend: 5, plunge: 42, id: 'H4' },
      { trend: 25, plunge: 48, id: 'H5' },
    ];
    const r = compareAxisWithLines({ trend: 14.71, plunge: 45.22 }, lines, { cone95: 2 });
    expectAzimuth(r.all.mean!.trend, 14.71, 0.01, 'mean trend');
    expectClose(r.all.mean!.plunge, 45.22, 0.01, 'mean plunge');
    expectClose(r.all.alpha95!, 6.585, 0.001, 'alpha95');
    expectClose(r.all.kappa!, 135.974, 0.001, 'kappa');
    expect(r.all.angle!).toBeLessThan(0.01);
    expect(r.meanInsideAxisCone).toBe(true);
    expect(r.axisInsideLineCone).toBe(true);
    expect(r.flagged).toBe(0);
    expect(r.lines.map((l) => l.id)).toEqual(['H1', 'H2', 'H3', 'H4', 'H5']);
    expect(r.unflagged).toBe(r.all);
  });

  it('compareAxisWithLines(axis, [line θ from it]) measures θ and flags it exactly when θ exceeds the threshold (property)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0, max: 359.9, noNaN: true }),
        fc.double({ min: 0, max: 80, noNaN: true }),
        fc.double({ min: 0.5, max: 89.5, noNaN: true }),
        fc.double({ min: 1, max: 60, noNaN: true }),
        fc.integer({ min: 1, max: 10 ** 6 }),
        (trend, plunge, theta, threshold, seed) => {
          // A line built theta degrees from the axis (analytic answer: its angle is theta).
          fc.pre(Math.abs(theta - threshold) > 1e-6);
          const line = lineOf(offAxis(ned(trend, plunge), theta, mulberry32(seed)));
          const r = compareAxisWithLines({ trend, plunge }, [line], { threshold });
          expectClose(r.lines[0].angle, theta, 1e-6, 'angle');
          expect(r.lines[0].flagged).toBe(theta > threshold);
        },
      ),
      { numRuns: 400, seed: 5 },
    );
  });

  it('compareAxisWithLines(pi axis, hinges with 4 planted bad ones) flags exactly the planted ones at the default 15°', () => {
    const stations = foldStations({ seed: 21, n: 0, hinges: 60, badLines: 4, box: [0, 0, 1000, 1000], fold: () => ({ axis: { trend: 75, plunge: 12 }, swing: 50, wavelength: 1000, domain: 'a' }), lineSigma: 3 });
    const lines = stations.map((s) => ({ ...s.line!, id: s.id }));
    const r = compareAxisWithLines({ trend: 75, plunge: 12 }, lines);
    expect(r.threshold).toBe(15);
    expect(r.lines.filter((l) => l.flagged).map((l) => l.id)).toEqual(stations.filter((s) => s.bad).map((s) => s.id));
    // Without the bad ones the mean moves back toward the axis.
    expect(r.unflagged.angle!).toBeLessThan(r.all.angle!);
    expect(r.unflagged.angle!).toBeLessThan(1.5);
  });

  it('compareAxisWithLines(axis, tight lines 10° away, {cone95: 2}) finds the mean outside both cones and says the two point to different axes', () => {
    const rnd = mulberry32(4);
    const other = ned(95, 14); // about 10° from 085/14 (derived: same plunge, 10° of trend at 14° plunge is 9.7°)
    const lines = Array.from({ length: 30 }, () => lineOf(offAxis(other, 1.5 * rnd(), rnd)));
    const r = compareAxisWithLines({ trend: 85, plunge: 14 }, lines, { cone95: 2 });
    expect(r.all.angle!).toBeGreaterThan(9);
    expect(r.meanInsideAxisCone).toBe(false);
    expect(r.axisInsideLineCone).toBe(false);
    expect(r.flagged).toBe(0);
    expect(r.reading).toMatch(/different axes/);
  });

  it('compareAxisWithLines names a bad line, axis or option', () => {
    expect(() => compareAxisWithLines({ trend: 10, plunge: 95 }, [])).toThrow(/plunge 95/);
    expect(() => compareAxisWithLines({ trend: 10, plunge: 5 }, [{ trend: 10, plunge: -5 }])).toThrow(/lines\[0\]\.plunge: -5/);
    expect(() => compareAxisWithLines({ trend: 10, plunge: 5 }, [], { threshold: 0 })).toThrow(/threshold 0/);
    expect(() => compareAxisWithLines({ trend: 10, plunge: 5 }, [], { cone95: 120 })).toThrow(/cone95 120/);
    expect(compareAxisWithLines({ trend: 10, plunge: 5 }, []).reading).toBe('No measured lines to compare with the axis.');
  });
});
