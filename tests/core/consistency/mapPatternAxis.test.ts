import { describe, expect, it } from 'vitest';
import { defaultScatterRadius, profileCoherence, searchMapAxis, traceScatter } from '../../../src/core/consistency/mapPatternAxis';
import { angleBetweenLines } from '../../../src/core/geometry';
import { contactTraces } from './synthetic';

/**
 * Synthetic map: a cylindrical fold with axis 060/20 (stratigraphic height F = v - 150 sin(2π u/1000),
 * REFERENCES.md profile frame) under terrain with north-south valleys 90 m deep, so that contacts
 * cross valleys in Vs and pieces of one surface lie at different depths along the axis. The traces
 * are found by marching squares (synthetic.ts), not by the code under test: the planted axis is the
 * outside answer.
 */
const AXIS = { trend: 60, plunge: 20 };
const BOX = [-2000, -1500, 2000, 1500] as const;
const valleys = (x: number, y: number): number => 800 + 90 * Math.cos((2 * Math.PI * x) / 1100) + 40 * Math.sin((2 * Math.PI * y) / 1700) + 0.02 * y;

function surfaces(terrain: (x: number, y: number) => number, levels: readonly number[]): Float64Array[] {
  return levels
    .map((level) => {
      const pieces = contactTraces({ axis: AXIS, amplitude: 150, wavelength: 1000, level, box: BOX, cell: 40, terrain });
      const out = new Float64Array(pieces.reduce((n, p) => n + p.length, 0));
      let o = 0;
      for (const p of pieces) {
        out.set(p, o);
        o += p.length;
      }
      return out;
    })
    .filter((s) => s.length > 0);
}

const LEVELS = [450, 650, 850, 1050];

describe('map pattern against the plunge', () => {
  const traces = surfaces(valleys, LEVELS);

  it('traceScatter(traces, planted axis) is under 0.5 m, and 5° off the axis it is over 10 times larger', () => {
    expect(traces.length).toBe(4);
    const radius = defaultScatterRadius(traces, AXIS);
    const right = traceScatter(traces, AXIS, { radius }).scatter!;
    // Stated tolerance: the traces are straight between marching-squares crossings of a 40 m grid.
    expect(right).toBeLessThan(0.5);
    for (const wrong of [{ trend: 65, plunge: 20 }, { trend: 60, plunge: 25 }]) expect(traceScatter(traces, wrong, { radius }).scatter!).toBeGreaterThan(10 * right);
  });

  it('profileCoherence(traces, planted axis) finds no tilted axis that does better, and a contrast well above 1.5', () => {
    const c = profileCoherence(traces, AXIS);
    expect(c.atBest).toBe(true);
    expect(c.nearBest).toBe(true);
    expect(c.constrained).toBe(true);
    expect(c.contrast!).toBeGreaterThan(5);
    expect(c.ring.length).toBe(16);
    expect(c.ring.every((r) => angleBetweenLines(r.axis, AXIS) > 2.99 && angleBetweenLines(r.axis, AXIS) < 6.01)).toBe(true);
    expect(c.reading).toMatch(/agrees with the axis/);
  });

  it('profileCoherence(traces, axis 4° off) is not at the best: a tilted axis toward the planted one gives less scatter', () => {
    const c = profileCoherence(traces, { trend: 64.2, plunge: 20 });
    expect(c.atBest).toBe(false);
    expect(c.best!.scatter).toBeLessThan(c.scatter!);
    expect(angleBetweenLines(c.best!.axis, AXIS)).toBeLessThan(angleBetweenLines({ trend: 64.2, plunge: 20 }, AXIS));
  });

  it('searchMapAxis(traces, start 10-15° off) finds the planted axis from the map alone within 0.5°, constrained in all directions', () => {
    // Stated tolerance: the search ends at a lattice spacing of 0.19°, and the traces' own
    // discretisation (40 m grid) leaves a few tenths of a degree.
    for (const start of [{ trend: 72, plunge: 14 }, { trend: 50, plunge: 29 }]) {
      expect(angleBetweenLines(start, AXIS)).toBeGreaterThan(10);
      const s = searchMapAxis(traces, start, { maxAngle: 20, step: 4 });
      expect(angleBetweenLines(s.axis!, AXIS)).toBeLessThan(0.5);
      expect(s.constraint).toBe('all-directions');
      expect(s.atRim).toBe(false);
      expect(s.angleToStart!).toBeGreaterThan(9.5);
    }
  });

  it('profileCoherence and searchMapAxis on traces over flat ground say the traces do not constrain the axis', () => {
    // Over flat ground each contact is one plane curve, which projects to one smooth curve down any
    // axis (profileScatter.ts): the map pattern then carries no information on the axis.
    const flat = surfaces(() => 800, LEVELS);
    expect(flat.length).toBeGreaterThan(1);
    const c = profileCoherence(flat, AXIS);
    expect(c.constrained).toBe(false);
    expect(c.reading).toMatch(/do not constrain the axis/);
    const s = searchMapAxis(flat, AXIS, { maxAngle: 10, step: 4 });
    expect(s.constraint).toBe('none');
    expect(s.reading).toMatch(/no axis can be read from the map pattern alone/);
  });

  it('profileCoherence and searchMapAxis name bad input', () => {
    expect(() => profileCoherence([], AXIS)).toThrow(/no trace surfaces given/);
    expect(() => profileCoherence([new Float64Array([0, 0, Number.NaN])], AXIS)).toThrow(/surface 0, point 0 has a non-finite u \(NaN\)/);
    expect(() => profileCoherence(traces, { trend: 10, plunge: 100 })).toThrow(/plunge 100/);
    expect(() => profileCoherence(traces, AXIS, { rings: [0] })).toThrow(/rings \[0\]/);
    expect(() => searchMapAxis(traces, AXIS, { maxAngle: 0 })).toThrow(/maxAngle 0/);
    expect(() => searchMapAxis(traces, AXIS, { radius: -1 })).toThrow(/radius -1/);
  });
});
