import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { checkClosures, findClosures, type ClosurePiece, type PlacedSensedLine, type PlacedVotingPlane } from '../../../src/core/consistency/closures';
import { contactTraces, levelGroundClosures as closuresOnLevelGround, surfaceBedding } from './synthetic';

/**
 * Fold closures on the map against the plunge. The outside answer is the analytic geometry of
 * synthetic.ts (contact F = v - A sin(2π u/λ) = level, traced where it meets the ground) and the
 * map rule of the trade: on gently sloping ground antiform closures point down the plunge and
 * synform closures up it (common practice). With v = s·sin p + z·cos p (derived, closures.ts),
 * on level ground z = z0 the trace is s(u) = (A sin(2π u/λ) + level - z0 cos p)/sin p, so its
 * turning points lie at u = λ/4 + kλ/2: maxima of s (pointing down the plunge) at the crests
 * (antiforms, k even), minima at the troughs (synforms, k odd).
 */

const BOX = [-2000, -1500, 2000, 1500] as const;
const A = 150;
const WAVELENGTH = 1000;
const LEVEL = 650;

interface Expected {
  readonly u: number;
  readonly s: number;
  readonly x: number;
  readonly y: number;
  readonly sense: 'antiform' | 'synform';
}

/** Trace pieces of the synthetic contact over the given terrain. */
function traces(axis: { trend: number; plunge: number }, terrain: (x: number, y: number) => number, amplitude = A, wavelength = WAVELENGTH): ClosurePiece[] {
  return contactTraces({ axis, amplitude, wavelength, level: LEVEL, box: BOX, cell: 20, terrain }).map((xyz) => ({ surface: 'contact 650', xyz }));
}

/** Map frame helpers for an axis: s along the trend, u across it (profile right). */
function frame(trend: number) {
  const t = (trend * Math.PI) / 180;
  return {
    s: (x: number, y: number) => x * Math.sin(t) + y * Math.cos(t),
    u: (x: number, y: number) => x * Math.cos(t) - y * Math.sin(t),
    xy: (u: number, s: number): [number, number] => [u * Math.cos(t) + s * Math.sin(t), -u * Math.sin(t) + s * Math.cos(t)],
  };
}

/** The analytic closures on level ground z0 whose apex lies in the box (synthetic.ts). */
const levelGroundClosures = (axis: { trend: number; plunge: number }, z0: number): Expected[] =>
  closuresOnLevelGround({ axis, amplitude: A, wavelength: WAVELENGTH, level: LEVEL, z0, box: BOX });

const inside = (e: { x: number; y: number }, margin: number): boolean => e.x > BOX[0] + margin && e.x < BOX[2] - margin && e.y > BOX[1] + margin && e.y < BOX[3] - margin;

/** Bedding of the synthetic contact's family at random places, with 2° of noise (synthetic.ts). */
const bedding = (axis: { trend: number; plunge: number }, count: number, seed: number): PlacedVotingPlane[] =>
  surfaceBedding({ axis, amplitude: A, wavelength: WAVELENGTH, box: BOX, count, seed });

/** A hinge reading at each expected closure, with the given sense. */
function hingesAt(closures: readonly Expected[], axis: { trend: number; plunge: number }, sense: (e: Expected, i: number) => 'antiform' | 'synform'): PlacedSensedLine[] {
  return closures.map((e, i) => ({ x: e.x, y: e.y, trend: axis.trend, plunge: axis.plunge, sense: sense(e, i), id: `H${i + 1}` }));
}

describe('findClosures', () => {
  const axis = { trend: 60, plunge: 20 };
  const level = () => 800;

  it('findClosures(contact on level ground, 060/20) finds every analytic closure, antiforms pointing down the plunge and synforms up it (common practice)', () => {
    const expected = levelGroundClosures(axis, 800);
    const found = findClosures(traces(axis, level), axis);
    const f = frame(axis.trend);
    expect(found.length).toBeGreaterThan(3);
    for (const c of found) {
      expect(c.kind).toBe('fold');
      const e = expected.reduce((best, q) => (Math.hypot(q.x - c.position[0], q.y - c.position[1]) < Math.hypot(best.x - c.position[0], best.y - c.position[1]) ? q : best));
      // Within one cell of the 20 m tracing grid.
      expect(Math.abs(f.u(c.position[0], c.position[1]) - e.u)).toBeLessThan(25);
      expect(Math.abs(f.s(c.position[0], c.position[1]) - e.s)).toBeLessThan(5);
      expect(c.traceSense).toBe(e.sense);
      expect(c.points).toBe(e.sense === 'antiform' ? 'down-plunge' : 'up-plunge');
      expect(c.ruleHolds).toBe(true);
    }
    for (const e of expected.filter((q) => inside(q, 150))) {
      expect(found.some((c) => Math.hypot(c.position[0] - e.x, c.position[1] - e.y) < 30), `closure at u = ${e.u} not found`).toBe(true);
    }
    // From crest to trough the trace runs 2A/sin p along the trend (derived): the widest extent.
    expect(Math.abs(Math.max(...found.map((c) => c.extent)) - (2 * A) / Math.sin((axis.plunge * Math.PI) / 180))).toBeLessThan(10);
  });

  it('findClosures on level ground obeys the map rule for any trend and plunge (property)', () => {
    fc.assert(
      fc.property(fc.double({ min: 0, max: 359.9, noNaN: true }), fc.double({ min: 10, max: 40, noNaN: true }), (trend, plunge) => {
        const a = { trend, plunge };
        const found = findClosures(traces(a, level), a);
        const f = frame(trend);
        for (const c of found) {
          expect(c.kind).toBe('fold');
          expect(c.points === 'down-plunge').toBe(c.traceSense === 'antiform');
          // Crests at u = λ/4 + kλ, troughs at u = 3λ/4 + kλ.
          const phase = (((f.u(c.position[0], c.position[1]) / WAVELENGTH) % 1) + 1) % 1;
          expect(Math.abs(phase - (c.traceSense === 'antiform' ? 0.25 : 0.75))).toBeLessThan(0.03);
        }
      }),
      { numRuns: 12, seed: 71 },
    );
  });

  it('findClosures gives the same closures whichever way a trace is written, and wherever a ring starts (property)', () => {
    // A closed outcrop elongated along the trend on level ground: x = 1200 sin θ along 090, y = -300 cos θ.
    const a = { trend: 90, plunge: 10 };
    const ring = (start: number, reverse: boolean): Float64Array => {
      const pts: number[][] = [];
      for (let k = 0; k < 72; k++) {
        const th = (2 * Math.PI * ((start + (reverse ? -k : k) + 720) % 72)) / 72;
        pts.push([1200 * Math.sin(th), -300 * Math.cos(th), 0]);
      }
      pts.push(pts[0]);
      return Float64Array.from(pts.flat());
    };
    fc.assert(
      fc.property(fc.integer({ min: 0, max: 71 }), fc.boolean(), (start, reverse) => {
        const found = findClosures([{ xyz: ring(start, reverse) }], a);
        const summary = found.map((c) => [Math.round(c.position[0]), c.points, c.traceSense]).sort((p, q) => Number(p[0]) - Number(q[0]));
        // Analytic: the east end (x = 1200) is the maximum of s = x, the west end its minimum.
        expect(summary).toEqual([
          [-1200, 'up-plunge', 'synform'],
          [1200, 'down-plunge', 'antiform'],
        ]);
      }),
      { numRuns: 40, seed: 5 },
    );
  });

  it('findClosures(contact on ground falling toward the plunge at 35°, axis plunging 20°) finds the map rule reversed: antiform closures point up the plunge', () => {
    // v = s (sin p - tan β cos p) + z0 cos p, negative slope for β > p (derived): crests become minima of s.
    const f = frame(axis.trend);
    const steep = (x: number, y: number) => 800 - Math.tan((35 * Math.PI) / 180) * f.s(x, y);
    const found = findClosures(traces(axis, steep), axis);
    expect(found.length).toBeGreaterThan(3);
    for (const c of found) {
      expect(c.kind).toBe('fold');
      expect(c.ruleHolds).toBe(false);
      expect(c.points).toBe(c.traceSense === 'antiform' ? 'up-plunge' : 'down-plunge');
      const phase = (((f.u(c.position[0], c.position[1]) / WAVELENGTH) % 1) + 1) % 1;
      expect(Math.abs(phase - (c.traceSense === 'antiform' ? 0.25 : 0.75))).toBeLessThan(0.03);
    }
  });

  it('findClosures(one limb crossing a valley) reports the V as a topographic turn, never a fold closure (rule of Vs)', () => {
    // λ = 200 km: within the box the surface is a plane (A sin(2πu/λ) ≈ 0.1 u), one limb only; A = 0: a
    // limb that lies flat in the profile. The valley runs along the trend at u = 0, 150 m deep.
    const f = frame(axis.trend);
    const valley = (x: number, y: number) => 800 - 150 * Math.exp(-((f.u(x, y) / 250) ** 2));
    for (const amplitude of [(0.1 * 200_000) / (2 * Math.PI), 0]) {
      const found = findClosures(traces(axis, valley, amplitude, 200_000), axis);
      expect(found.length).toBeGreaterThan(0);
      expect(found.every((c) => c.kind === 'topographic' && c.traceSense === null)).toBe(true);
    }
  });

  it('findClosures(a trace that goes out and back along one inclined limb) reports a topographic turn although v turns too', () => {
    // Any polyline on the surface is the trace of some ground. On the limb v = u + 100 (profile
    // slope 1, containing the axis), the point goes out to u = 600 and back while drifting 200 m
    // down the plunge: P = u·right + v·up + w·axis with u = 600 sin(πτ), w = 200τ (downPlunge.ts
    // frame). Then s = w cos p + v sin p turns (extent about 120 m) and v peaks at τ = 0.5, but
    // the trace never crosses a hinge: u turns back at the same place.
    const t = (axis.trend * Math.PI) / 180;
    const p = (axis.plunge * Math.PI) / 180;
    const right = [Math.cos(t), -Math.sin(t), 0];
    const up = [Math.sin(p) * Math.sin(t), Math.sin(p) * Math.cos(t), Math.cos(p)];
    const down = [Math.cos(p) * Math.sin(t), Math.cos(p) * Math.cos(t), -Math.sin(p)];
    const pts: number[] = [];
    for (let k = 0; k <= 100; k++) {
      const tau = k / 100;
      const u = 600 * Math.sin(Math.PI * tau);
      const v = u + 100;
      const w = 200 * tau;
      for (let i = 0; i < 3; i++) pts.push(u * right[i] + v * up[i] + w * down[i]);
    }
    const found = findClosures([{ xyz: Float64Array.from(pts) }], axis);
    expect(found.length).toBe(1);
    expect(found[0].points).toBe('down-plunge');
    expect(found[0].kind).toBe('topographic');
  });

  it('findClosures names a non-finite vertex and a bad depth', () => {
    expect(() => findClosures([{ xyz: new Float64Array([0, 0, 0, 1, Number.NaN, 0, 2, 2, 2]) }], axis)).toThrow(/piece 0, vertex 1 has a non-finite n/);
    expect(() => findClosures([], axis, { depth: -5 })).toThrow(/depth -5/);
    expect(() => findClosures([], { trend: 10, plunge: 95 })).toThrow(/plunge 95/);
  });
});

describe('checkClosures', () => {
  const axis = { trend: 60, plunge: 20 };
  const level = () => 800;
  const expected = levelGroundClosures(axis, 800);

  it('checkClosures(level-ground contact, hinge readings of the right sense at each closure) judges every fold closure and finds none that disagrees', () => {
    const check = checkClosures(traces(axis, level), axis, { lines: hingesAt(expected, axis, (e) => e.sense) });
    expect(check.folds).toBeGreaterThan(3);
    expect(check.judged).toBe(check.folds);
    expect(check.disagreeing).toBe(0);
    expect(check.closures.every((c) => c.senseFrom === 'hinges' && c.agrees === true)).toBe(true);
  });

  it('checkClosures flags exactly the closure whose hinge reading was planted with the wrong sense', () => {
    const wrong = expected.findIndex((e) => inside(e, 300));
    const lines = hingesAt(expected, axis, (e, i) => (i === wrong ? (e.sense === 'antiform' ? 'synform' : 'antiform') : e.sense));
    const check = checkClosures(traces(axis, level), axis, { lines });
    const bad = check.closures.filter((c) => c.agrees === false);
    expect(bad.length).toBe(1);
    expect(bad[0].hinges.ids).toEqual([`H${wrong + 1}`]);
    expect(Math.hypot(bad[0].position[0] - expected[wrong].x, bad[0].position[1] - expected[wrong].y)).toBeLessThan(30);
    expect(bad[0].reading).toMatch(/but the hinge reading nearby \(H\d+\) say/);
  });

  it('checkClosures reads the sense from limb dips where no hinge was read: all agree, and all disagree when the axis is given plunging the other way', () => {
    const pieces = traces(axis, level);
    const planes = bedding(axis, 900, 12);
    const check = checkClosures(pieces, axis, { planes });
    expect(check.judged).toBeGreaterThanOrEqual(Math.ceil(0.8 * check.folds));
    expect(check.disagreeing).toBe(0);
    expect(check.closures.filter((c) => c.agrees !== null).every((c) => c.senseFrom === 'limb-dips')).toBe(true);
    // 240/20: the same line, plunging the other way. The limb dips still say the same sense; the
    // closures now point the wrong way for it.
    const reversed = { trend: 240, plunge: 20 };
    const wrong = checkClosures(pieces, reversed, { planes });
    expect(wrong.judged).toBeGreaterThan(0);
    expect(wrong.disagreeing).toBe(wrong.judged);
  });

  it('checkClosures on ground that reverses the map rule raises no disagreement for hinges of the right sense', () => {
    const f = frame(axis.trend);
    const steep = (x: number, y: number) => 800 - Math.tan((35 * Math.PI) / 180) * f.s(x, y);
    const pieces = traces(axis, steep);
    const folds = findClosures(pieces, axis);
    const lines = folds.map((c, i) => ({ x: c.hingePosition![0], y: c.hingePosition![1], trend: 60, plunge: 20, sense: c.traceSense!, id: `H${i}` }));
    // The sense written on the hinges is the analytic one (crests at u = λ/4 are antiforms), not the trace's own reading.
    for (const l of lines) {
      const phase = (((f.u(l.x, l.y) / WAVELENGTH) % 1) + 1) % 1;
      expect(l.sense).toBe(Math.abs(phase - 0.25) < 0.05 ? 'antiform' : 'synform');
    }
    const check = checkClosures(pieces, axis, { lines });
    expect(check.disagreeing).toBe(0);
    expect(check.ruleReversed).toBe(check.folds);
    expect(check.reading).toMatch(/map rule reverses/);
  });

  it('checkClosures names a bad reading position or option', () => {
    expect(() => checkClosures([], axis, { planes: [{ x: Number.NaN, y: 0, dipDirection: 10, dip: 10, id: 'B7' }] })).toThrow(/planes\[0\] \(B7\): position/);
    expect(() => checkClosures([], axis, {}, { radius: 0 })).toThrow(/radius 0/);
    expect(() => checkClosures([], axis, {}, { agreement: 0.4 })).toThrow(/agreement 0.4/);
  });
});
