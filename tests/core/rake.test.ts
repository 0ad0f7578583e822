import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import { lineFromRake, rakeOf } from '../../src/core/rake';
import { NotationError, NotationProblem, formatRake, parsePlane, parseRake, tryParseRake, type Rake, type RakeFrom } from '../../src/core/notation';
import { DEG, RAD } from '../../src/core/math';
import { dot, lineToVector, planeNormal } from '../../src/core/vectors';
import type { Plane } from '../../src/core/types';
import { expectAzimuth, expectClose, expectDeepClose } from '../helpers/tolerance';

/**
 * Independent reference for a line at rake r from a horizontal strike end s in a plane of dip
 * d, by the standard spherical-trigonometry formulas (common practice; derived):
 *   plunge = asin(sin d · sin r);
 *   angle between strike end and trend, measured toward the dip direction, = atan2(cos d · sin r, cos r).
 * `toward` is +1 when the dip direction is clockwise of the strike end, -1 otherwise.
 */
function referenceLine(strikeEnd: number, toward: 1 | -1, dip: number, rake: number): { trend: number; plunge: number } {
  const d = dip * DEG;
  const r = rake * DEG;
  const plunge = Math.asin(Math.sin(d) * Math.sin(r)) * RAD;
  const swing = Math.atan2(Math.cos(d) * Math.sin(r), Math.cos(r)) * RAD;
  return { trend: (((strikeEnd + toward * swing) % 360) + 360) % 360, plunge };
}

describe('lineFromRake reference table', () => {
  const plane: Plane = { dipDirection: 120, dip: 45 }; // 030/45 by the right-hand rule
  const rows: { from: RakeFrom; rake: number; expected: { trend: number; plunge: number }; tol: number; source: string }[] = [
    // REFERENCES.md, Notations (derived): rake 60 from the RHR strike in 030/45 -> 080.7685/37.7612.
    { from: 'rhr-strike', rake: 60, expected: { trend: 80.7685, plunge: 37.7612 }, tol: 1e-4, source: 'REFERENCES.md' },
    // Definition (common practice): rake 90 is the dip line, 0 the strike.
    { from: 'rhr-strike', rake: 90, expected: { trend: 120, plunge: 45 }, tol: 1e-9, source: 'definition' },
    { from: 'rhr-strike', rake: 0, expected: { trend: 30, plunge: 0 }, tol: 1e-9, source: 'definition' },
    // Rake 180 is the other strike end, 210/00, the same line as 030/00.
    { from: 'rhr-strike', rake: 180, expected: { trend: 30, plunge: 0 }, tol: 1e-9, source: 'definition' },
    // Named ends: N, E and NE name the 030 end (same as the RHR strike here); S, W, SW the 210 end.
    { from: 'N', rake: 60, expected: { trend: 80.7685, plunge: 37.7612 }, tol: 1e-4, source: 'REFERENCES.md, same end' },
    { from: 'NE', rake: 60, expected: { trend: 80.7685, plunge: 37.7612 }, tol: 1e-4, source: 'REFERENCES.md, same end' },
    { from: 'SW', rake: 60, expected: referenceLine(210, -1, 45, 60), tol: 1e-9, source: 'standard formulas' },
    { from: 'W', rake: 30, expected: referenceLine(210, -1, 45, 30), tol: 1e-9, source: 'standard formulas' },
  ];
  for (const { from, rake, expected, tol } of rows) {
    it(`lineFromRake(120/45, ${rake}, '${from}') gives ${expected.trend.toFixed(4)}/${expected.plunge.toFixed(4)}`, () => {
      expectDeepClose(lineFromRake(plane, rake, from), expected, tol);
    });
  }

  it("lineFromRake(parsePlane('030/45', 'rhr'), 60) gives 080.7685/37.7612 (REFERENCES.md, derived)", () => {
    expectDeepClose(lineFromRake(parsePlane('030/45', 'rhr'), 60), { trend: 80.7685, plunge: 37.7612 }, 1e-4);
  });

  it("lineFromRake(120/45, 60, 'SE') throws a NotationError: SE lies across strike 030/210", () => {
    let err: unknown;
    try {
      lineFromRake(plane, 60, 'SE');
    } catch (e) {
      err = e;
    }
    expect(err).toBeInstanceOf(NotationError);
    expect((err as NotationError).message).toMatch(/SE lies across strike 030\/210/);
  });

  it('lineFromRake(120/45, 190) throws a RangeError naming the rake', () => {
    expect(() => lineFromRake(plane, 190)).toThrow(/rake 190: expected 0 to 180/);
    expect(() => lineFromRake({ dipDirection: 120, dip: 95 }, 10)).toThrow(RangeError);
  });

  it('lineFromRake on a vertical plane 090/90 gives plunge = rake up to 90 (plunge = asin(sin 90·sin r))', () => {
    expectDeepClose(lineFromRake({ dipDirection: 90, dip: 90 }, 35), { trend: 0, plunge: 35 }, 1e-9);
  });
});

describe('rakeOf', () => {
  const plane: Plane = { dipDirection: 120, dip: 45 };
  it('rakeOf(120/45, 080.7685/37.7612) gives 60 (REFERENCES.md, derived)', () => {
    expectClose(rakeOf(plane, { trend: 80.7685, plunge: 37.7612 }), 60, 1e-3);
  });
  it("rakeOf(120/45, 080.7685/37.7612, {from: 'SW'}) gives 120, measured from the other strike end", () => {
    expectClose(rakeOf(plane, { trend: 80.7685, plunge: 37.7612 }, { from: 'SW' }), 120, 1e-3);
  });
  it('rakeOf of a horizontal line along the strike gives 0 from either end', () => {
    expectClose(rakeOf(plane, { trend: 210, plunge: 0 }), 0, 1e-9);
    expectClose(rakeOf(plane, { trend: 30, plunge: 0 }, { from: 'S' }), 0, 1e-9);
  });
  it('rakeOf of a line 20° out of the plane throws a RangeError that names the angle', () => {
    // The pole-ward tilt: dip line of 120/65 is 20° from plane 120/45.
    expect(() => rakeOf(plane, { trend: 120, plunge: 65 })).toThrow(/20\.0° out of plane 120\/45/);
    expectClose(rakeOf(plane, { trend: 120, plunge: 65 }, { maxOffPlane: 25 }), 90, 1e-9);
  });
});

describe('parseRake and formatRake', () => {
  // Forms documented in src/core/notation.ts (our grammar).
  const rows: { text: string; expected: Rake }[] = [
    { text: '60', expected: { angle: 60, from: 'rhr-strike' } },
    { text: '60°', expected: { angle: 60, from: 'rhr-strike' } },
    { text: '60E', expected: { angle: 60, from: 'E' } },
    { text: '60 ne', expected: { angle: 60, from: 'NE' } },
    { text: '35 from SW', expected: { angle: 35, from: 'SW' } },
    { text: '180', expected: { angle: 180, from: 'rhr-strike' } },
  ];
  for (const { text, expected } of rows) {
    it(`parseRake(${JSON.stringify(text)}) gives ${JSON.stringify(expected)}`, () => {
      expect(parseRake(text)).toEqual(expected);
    });
  }
  const rejected: { text: string; problem: RegExp }[] = [
    { text: '190', problem: /rake 190 is more than 180/ },
    { text: '60 from', problem: /"from" is not followed by compass letters/ },
    { text: '60 from NNE', problem: /"NNE" is not a strike end/ },
    { text: '60g', problem: /grads/ },
    { text: '', problem: /empty/ },
    { text: '60 E x', problem: /unexpected "x" after the rake/ },
  ];
  for (const { text, problem } of rejected) {
    it(`parseRake(${JSON.stringify(text)}) throws a NotationError matching ${problem}`, () => {
      expect(() => parseRake(text)).toThrow(NotationError);
      expect(() => parseRake(text)).toThrow(problem);
    });
  }
  it('tryParseRake("190") returns a NotationProblem and tryParseRake("60NE") the rake', () => {
    expect((tryParseRake('190') as NotationProblem).problem).toBe('rake 190 is more than 180');
    expect(tryParseRake('60NE')).toEqual({ angle: 60, from: 'NE' });
  });
  it("formatRake({angle: 60, from: 'NE'}) writes 60NE and formatRake({angle: 60, from: 'rhr-strike'}) writes 60", () => {
    expect(formatRake({ angle: 60, from: 'NE' })).toBe('60NE');
    expect(formatRake({ angle: 60, from: 'rhr-strike' })).toBe('60');
    expect(parseRake(formatRake({ angle: 12.5, from: 'SW' }, 1))).toEqual({ angle: 12.5, from: 'SW' });
  });
});

describe('rake properties', () => {
  const planeArb = fc.record({
    dipDirection: fc.double({ min: 0, max: 360, maxExcluded: true, noNaN: true }),
    dip: fc.oneof(fc.constant(90), fc.double({ min: 1, max: 90, noNaN: true })),
  });
  const rakeArb = fc.double({ min: 0.01, max: 179.99, noNaN: true });

  it('lineFromRake(plane, r) lies in the plane and matches the standard formulas for plunge and trend', () => {
    fc.assert(
      fc.property(planeArb, rakeArb, (plane, r) => {
        const line = lineFromRake(plane, r);
        expectClose(dot(lineToVector(line), planeNormal(plane)), 0, 1e-12, 'line . normal');
        const ref = referenceLine(plane.dipDirection - 90, 1, plane.dip, r);
        expectClose(line.plunge, ref.plunge, 1e-9, 'plunge');
        if (ref.plunge < 89.999) expectAzimuth(line.trend, ref.trend, 1e-6, 'trend');
      }),
    );
  });

  it('rakeOf(plane, lineFromRake(plane, r)) returns r, and from the opposite end 180 - r', () => {
    fc.assert(
      fc.property(planeArb, rakeArb, (plane, r) => {
        const line = lineFromRake(plane, r);
        expectClose(rakeOf(plane, line), r, 1e-7, 'rake');
        // The RHR strike end lies in the sector of sectorOf(strike); the other end in the opposite one.
        const rhr = (plane.dipDirection + 270) % 360;
        const other: RakeFrom = rhr < 90 || rhr >= 270 ? 'S' : 'N';
        if (Math.abs(Math.cos(rhr * DEG)) > 1e-6) expectClose(rakeOf(plane, line, { from: other }), 180 - r, 1e-7, 'rake from the other end');
      }),
    );
  });
});
