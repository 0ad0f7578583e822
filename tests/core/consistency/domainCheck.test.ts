import { describe, expect, it } from 'vitest';
import { checkDomain, type DomainPlane } from '../../../src/core/consistency/domainCheck';
import { analyzeFold } from '../../../src/core/foldAnalysis';
import { angleBetweenLines } from '../../../src/core/geometry';
import { comb3, contactTraces, foldStations, jitter, levelGroundClosures, lineOf, ned, planeOfNormal, profileBasis, surfaceBedding, unit3, type SynthStation } from './synthetic';
import { mulberry32 } from '../../helpers/prng';

const AXIS = { trend: 60, plunge: 20 };
const BOX = [-2000, -1500, 2000, 1500] as const;
const terrain = (x: number, y: number): number => 800 + 90 * Math.cos((2 * Math.PI * x) / 1100) + 40 * Math.sin((2 * Math.PI * y) / 1700) + 0.02 * y;

function domainInput(stations: readonly SynthStation[]) {
  return {
    planes: stations.filter((s) => s.plane).map((s): DomainPlane => ({ ...s.plane!, id: s.id, x: s.x, y: s.y })),
    lines: stations.filter((s) => s.line).map((s) => ({ ...s.line!, id: s.id })),
  };
}

const surfaces = [450, 650, 850, 1050].map((level) => ({ name: `contact ${level}`, pieces: contactTraces({ axis: AXIS, amplitude: 150, wavelength: 1000, level, box: BOX, cell: 40, terrain }) }));

describe('checkDomain', () => {
  it('checkDomain(one cylindrical domain with 12 bad bedding readings and 3 bad hinges among 300 and 40) flags exactly the planted readings, reads the fold as cylindrical, and agrees with the map pattern', () => {
    const stations = foldStations({ seed: 31, n: 300, hinges: 40, badPlanes: 12, badLines: 3, box: BOX, fold: () => ({ axis: AXIS, swing: 50, wavelength: 1000, domain: 'a' }), sigma: 2, lineSigma: 3 });
    const check = checkDomain({ id: 'a', name: 'Domain A', ...domainInput(stations), surfaces }, { bootstrap: 200, searchAxis: false });
    const bad = (kind: string): string[] => stations.filter((s) => s.bad && s.kind === kind).map((s) => s.id);
    const flag = (code: string) => check.flags.find((f) => f.code === code);
    expect(flag('planes-off-girdle')!.ids).toEqual(bad('bedding'));
    expect(flag('lines-off-axis')!.ids).toEqual(bad('hinge'));
    expect(flag('not-cylindrical')).toBeUndefined();
    expect(flag('map-pattern-prefers-other-axis')).toBeUndefined();
    expect(check.girdle.cylindricityWithoutOutliers!.shape).toBe('cylindrical');
    expect(angleBetweenLines(check.girdle.axis!, AXIS)).toBeLessThan(1);
    expect(check.mapPattern!.coherence!.nearBest).toBe(true);
    expect(check.mapPattern!.search).toBeNull();
    // The same numbers as the fold analysis itself.
    const fold = analyzeFold({ planes: check.girdle.residuals.map((r) => r.plane), lines: check.lines!.lines.map((l) => l.line) }, { bootstrap: 200 });
    expect(check.axis).toEqual(fold.axis);
    expect(check.cone95).toBe(fold.cone95);
  });

  it('checkDomain(cylindrical domain) finds the map-only axis within 0.5° of the planted one, and raises no map-axis flag', () => {
    const stations = foldStations({ seed: 32, n: 200, hinges: 0, box: BOX, fold: () => ({ axis: AXIS, swing: 50, wavelength: 1000, domain: 'a' }) });
    const check = checkDomain({ id: 'a', name: 'A', ...domainInput(stations), surfaces }, { bootstrap: 100, searchAngle: 15 });
    expect(angleBetweenLines(check.mapPattern!.search!.axis!, AXIS)).toBeLessThan(0.5);
    expect(check.flags.map((f) => f.code)).not.toContain('map-axis-differs');
    expect(check.mapPattern!.predictions!.comparisons.length).toBeGreaterThan(0);
  });

  it('checkDomain(domain, {convergence}) with positions on a grid turned by the convergence gives the same map-pattern numbers as true-north positions', () => {
    // A point at true azimuth θ lies at grid azimuth θ - γ (io/localFrame.ts: true = grid + γ).
    const gamma = 2.5;
    const g = (gamma * Math.PI) / 180;
    const toGrid = (xyz: Float64Array): Float64Array => {
      const out = new Float64Array(xyz.length);
      for (let i = 0; i < xyz.length; i += 3) {
        out[i] = xyz[i] * Math.cos(g) - xyz[i + 1] * Math.sin(g);
        out[i + 1] = xyz[i] * Math.sin(g) + xyz[i + 1] * Math.cos(g);
        out[i + 2] = xyz[i + 2];
      }
      return out;
    };
    const stations = foldStations({ seed: 33, n: 150, hinges: 0, box: BOX, fold: () => ({ axis: AXIS, swing: 50, wavelength: 1000, domain: 'a' }) });
    const input = domainInput(stations);
    const trueNorth = checkDomain({ id: 'a', name: 'A', ...input, surfaces }, { bootstrap: 0, searchAxis: false });
    const gridPlanes = input.planes.map((p) => {
      const [x, y] = toGrid(new Float64Array([p.x!, p.y!, 0]));
      return { ...p, x, y };
    });
    const grid = checkDomain(
      { id: 'a', name: 'A', planes: gridPlanes, lines: input.lines, surfaces: surfaces.map((s) => ({ ...s, pieces: s.pieces.map(toGrid) })), convergence: gamma },
      { bootstrap: 0, searchAxis: false },
    );
    expect(grid.mapPattern!.coherence!.scatter!).toBeCloseTo(trueNorth.mapPattern!.coherence!.scatter!, 9);
    expect(grid.mapPattern!.predictions!.medianAngle!).toBeCloseTo(trueNorth.mapPattern!.predictions!.medianAngle!, 9);
  });

  it('checkDomain(a conical fold) flags it as not cylindrical and flags no single plane', () => {
    // Poles on the small circle 70° from the cone axis: every pole lies 20° off the best girdle
    // (derived, girdleResiduals.ts), so the fold is not cylindrical while no reading stands out.
    const c = ned(80, 15);
    const { up, right } = profileBasis(c);
    const rnd = mulberry32(5);
    const planes: DomainPlane[] = Array.from({ length: 120 }, (_, i) => {
      const phi = 2 * Math.PI * rnd();
      return { ...planeOfNormal(unit3(comb3(c, Math.sin(Math.PI / 9), comb3(up, Math.cos(phi), right, Math.sin(phi)), Math.cos(Math.PI / 9)))), id: `C${i}` };
    });
    const check = checkDomain({ id: 'cone', name: 'Conical', planes, lines: [] }, { bootstrap: 0 });
    expect(check.flags.map((f) => f.code)).toEqual(['not-cylindrical']);
    expect(check.girdle.cylindricity!.misfit).toBeGreaterThan(15);
    expect(check.mapPattern).toBeNull();
  });

  it('checkDomain(level-ground contact, bedding of its fold, hinges that say antiform or synform) flags only the closure whose hinge was planted with the wrong sense, in any grid frame', () => {
    // Closures on level ground: antiforms point down the plunge (common practice; analytic positions in synthetic.ts).
    const spec = { axis: AXIS, amplitude: 150, wavelength: 1000 };
    const level = 650;
    const closures = levelGroundClosures({ ...spec, level, z0: 800, box: BOX });
    const wrong = closures.findIndex((c) => Math.abs(c.x) < 1500 && Math.abs(c.y) < 1000);
    const lines = closures.map((c, i) => ({ ...AXIS, x: c.x, y: c.y, id: `H${i + 1}`, sense: i === wrong ? (c.sense === 'antiform' ? ('synform' as const) : ('antiform' as const)) : c.sense }));
    const planes = surfaceBedding({ ...spec, box: BOX, count: 300, seed: 9 });
    const pieces = contactTraces({ ...spec, level, box: BOX, cell: 20, terrain: () => 800 });
    const check = checkDomain({ id: 'a', name: 'A', planes, lines, surfaces: [{ name: 'contact 650', pieces }] }, { bootstrap: 0, searchAxis: false });
    const flag = check.flags.find((f) => f.code === 'closures-disagree');
    expect(flag?.ids).toEqual([`H${wrong + 1}`]);
    expect(check.mapPattern!.closures!.disagreeing).toBe(1);
    expect(check.mapPattern!.closures!.judged).toBeGreaterThan(3);
    // The same positions on a grid turned by 2.5° (true = grid + γ, io/localFrame.ts) give the same judgement.
    const g = (2.5 * Math.PI) / 180;
    const turn = (x: number, y: number): [number, number] => [x * Math.cos(g) - y * Math.sin(g), x * Math.sin(g) + y * Math.cos(g)];
    const grid = checkDomain(
      {
        id: 'a',
        name: 'A',
        planes: planes.map((p) => ({ ...p, ...Object.fromEntries(['x', 'y'].map((k, i) => [k, turn(p.x, p.y)[i]])) })),
        lines: lines.map((l) => ({ ...l, ...Object.fromEntries(['x', 'y'].map((k, i) => [k, turn(l.x, l.y)[i]])) })),
        surfaces: [{ name: 'contact 650', pieces: pieces.map((xyz) => xyz.map((v, i) => (i % 3 === 2 ? v : i % 3 === 0 ? turn(v, xyz[i + 1])[0] : turn(xyz[i - 1], v)[1]))) }],
        convergence: 2.5,
      },
      { bootstrap: 0, searchAxis: false },
    );
    expect(grid.flags.find((f) => f.code === 'closures-disagree')?.ids).toEqual([`H${wrong + 1}`]);
    expect(grid.mapPattern!.closures!.judged).toBe(check.mapPattern!.closures!.judged);
  });

  it('checkDomain says why when there is no axis, and names a bad convergence', () => {
    const check = checkDomain({ id: 'p', name: 'Parallel', planes: [{ dipDirection: 10, dip: 20 }, { dipDirection: 10, dip: 20 }, { dipDirection: 10, dip: 20 }], lines: [{ trend: 5, plunge: 5 }] }, { bootstrap: 0 });
    expect(check.axis).toBeNull();
    expect(check.flags[0].code).toBe('axis-undefined');
    expect(check.lines).toBeNull();
    expect(() => checkDomain({ id: 'x', name: 'X', planes: [], lines: [], convergence: Number.NaN })).toThrow(/convergence NaN/);
  });
});

describe('checkDomain: the lines\' mean against the axis', () => {
  const AXIS_HERE = { trend: 60, plunge: 20 };
  /** 200 planes whose poles lie on the great circle normal to the axis, each scattered by 0.5° (a tight girdle). */
  function girdlePlanes(seed: number): DomainPlane[] {
    const rnd = mulberry32(seed);
    const { up, right } = profileBasis(ned(AXIS_HERE.trend, AXIS_HERE.plunge));
    return Array.from({ length: 200 }, (_, k) => {
      const t = (Math.PI * k) / 200;
      const pole = jitter(unit3(comb3(up, Math.cos(t), right, Math.sin(t))), 0.5, rnd);
      return { ...planeOfNormal(pole), id: `P${k}` };
    });
  }
  /** 60 lines about a direction `offset`° from the axis, each scattered by 0.5°. */
  function linesOff(offset: number, seed: number) {
    const rnd = mulberry32(seed);
    const { up } = profileBasis(ned(AXIS_HERE.trend, AXIS_HERE.plunge));
    const r = (offset * Math.PI) / 180;
    const centre = unit3(comb3(ned(AXIS_HERE.trend, AXIS_HERE.plunge), Math.cos(r), up, Math.sin(r)));
    return Array.from({ length: 60 }, (_, k) => ({ ...lineOf(jitter(centre, 0.5, rnd)), id: `L${k}` }));
  }
  const flagOf = (offset: number) =>
    checkDomain({ id: 'a', name: 'A', planes: girdlePlanes(5), lines: linesOff(offset, 6) }, { bootstrap: 200, searchAxis: false }).flags.find((f) => f.code === 'line-mean-outside-cone');

  it('checkDomain(planes, lines 1.5° off the axis) notes a difference that is significant but below what a compass reading resolves', () => {
    const flag = flagOf(1.5);
    expect(flag?.severity).toBe('note');
    expect(flag?.message).toMatch(/less than the 3° a single compass reading can resolve/);
  });

  it('checkDomain(planes, lines 6° off the axis) warns', () => {
    const flag = flagOf(6);
    expect(flag?.severity).toBe('warning');
    expect(flag?.message).not.toMatch(/compass/);
  });
});
