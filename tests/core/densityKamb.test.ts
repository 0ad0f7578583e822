import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import { contours } from 'd3';
import { kambGrid, kambParameters } from '../../src/core/kamb';
import { contourPointToNet, gridNodeToNet, type DensityGrid } from '../../src/core/density';
import { lineToVector } from '../../src/core/vectors';
import { expectClose } from '../helpers/tolerance';

/** Small seeded generator (mulberry32) so statistical tests are repeatable. */
function seeded(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** Uniform unit vectors on the whole sphere (z uniform in [-1, 1]: Archimedes). */
function uniformAxes(n: number, rnd: () => number): Float64Array {
  const out = new Float64Array(3 * n);
  for (let i = 0; i < n; i++) {
    const z = 2 * rnd() - 1;
    const phi = 2 * Math.PI * rnd();
    const r = Math.sqrt(1 - z * z);
    out.set([r * Math.cos(phi), r * Math.sin(phi), z], 3 * i);
  }
  return out;
}

/** n axes scattered within about `spread` (radians) of a line, either end chosen at random. */
function clusterAxes(n: number, trend: number, plunge: number, spread: number, rnd: () => number): Float64Array {
  const m = lineToVector({ trend, plunge });
  const out = new Float64Array(3 * n);
  for (let i = 0; i < n; i++) {
    const x = m.x + spread * (2 * rnd() - 1);
    const y = m.y + spread * (2 * rnd() - 1);
    const z = m.z + spread * (2 * rnd() - 1);
    const s = (rnd() < 0.5 ? -1 : 1) / Math.hypot(x, y, z);
    out.set([x * s, y * s, z * s], 3 * i);
  }
  return out;
}

function concat(...parts: Float64Array[]): Float64Array {
  const out = new Float64Array(parts.reduce((s, p) => s + p.length, 0));
  let at = 0;
  for (const p of parts) {
    out.set(p, at);
    at += p.length;
  }
  return out;
}

/** Lower-hemisphere equal-area net point of a line (Snyder 1987 polar form on a unit primitive, x east, y north). */
function equalAreaPoint(trend: number, plunge: number): { x: number; y: number } {
  const r = Math.SQRT2 * Math.sin(((90 - plunge) * Math.PI) / 360);
  return { x: r * Math.sin((trend * Math.PI) / 180), y: r * Math.cos((trend * Math.PI) / 180) };
}

function centreValue(grid: DensityGrid): number {
  const c = (grid.width - 1) / 2;
  return grid.values[c * grid.width + c];
}

describe('kambParameters', () => {
  // Derived from Kamb's criterion E = 3·sigma with a binomial count (REFERENCES.md "Density contouring"; the N = 100
  // row is quoted there, the others evaluated the same way by hand: A = 9/(N+9), sigma = 3N/(N+9), angle acos(1-A)).
  const rows = [
    { n: 100, area: 0.082569, expected: 8.2569, sigma: 2.7523, angle: 23.447 }, // REFERENCES.md, derived
    { n: 50, area: 0.152542, expected: 7.6271, sigma: 2.5424, angle: 32.064 }, // derived, same formulas
    { n: 10, area: 0.473684, expected: 4.7368, sigma: 1.5789, angle: 58.243 }, // derived, same formulas
    { n: 1000, area: 0.00892, expected: 8.9197, sigma: 2.9732, angle: 7.658 }, // derived, same formulas
  ];
  for (const { n, area, expected, sigma, angle } of rows) {
    it(`kambParameters(${n}) gives A = ${area}, E = ${expected}, sigma = ${sigma}, half-angle ${angle}°`, () => {
      const p = kambParameters(n);
      expectClose(p.area, area, 1e-6, 'area');
      expectClose(p.expected, expected, 1e-4, 'expected');
      expectClose(p.sigma, sigma, 1e-4, 'sigma');
      expectClose(p.countingAngle, angle, 1e-3, 'half-angle');
    });
  }

  it('kambParameters(n) puts the expected count at three standard deviations for any n (Kamb 1959 criterion)', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 10_000_000 }), (n) => {
        const p = kambParameters(n);
        expectClose(p.expected / p.sigma, 3, 1e-9, `E/sigma for n = ${n}`);
      }),
    );
  });

  it('kambParameters(0) throws, naming the count', () => {
    expect(() => kambParameters(0)).toThrow(/direction count 0/);
  });
});

describe('kambGrid', () => {
  it('kambGrid(axes) counts, at the centre node, the axes within 23.447° of the vertical for N = 100', () => {
    // Hand count: 7 axes at 23° from the vertical (inside the cap), 3 at 24° (outside), 90 horizontal (90° away).
    const lines = [
      ...Array.from({ length: 7 }, (_, i) => ({ trend: i * 50, plunge: 67 })),
      ...Array.from({ length: 3 }, (_, i) => ({ trend: 10 + i * 100, plunge: 66 })),
      ...Array.from({ length: 90 }, (_, i) => ({ trend: i * 4, plunge: 0 })),
    ];
    const grid = kambGrid(lines, { resolution: 11 });
    expectClose(centreValue(grid) * grid.sigma, 7, 1e-12, 'centre count');
    expectClose(centreValue(grid), 7 / 2.7523, 1e-4, 'centre value in sigma'); // sigma from REFERENCES.md
  });

  it('kambGrid(axes) counts both ends of an axis: upward and downward vectors of the same line count alike', () => {
    const down = Float64Array.of(0, 0, 1, 0.6, 0, 0.8);
    const up = Float64Array.of(0, 0, -1, -0.6, 0, -0.8);
    expect(Array.from(kambGrid(up, { resolution: 21 }).values)).toEqual(Array.from(kambGrid(down, { resolution: 21 }).values));
  });

  it('kambGrid(vectors) is unchanged, exactly, when any subset of the axes is reversed (antipodal symmetry)', () => {
    const rnd = seeded(7);
    const v = concat(uniformAxes(300, rnd), clusterAxes(200, 300, 20, 0.2, rnd));
    const flipped = v.map((c, i) => (Math.floor(i / 3) % 3 === 0 ? -c : c));
    for (const net of ['equal-area', 'equal-angle'] as const) {
      const a = kambGrid(v, { net, resolution: 41 });
      const b = kambGrid(flipped, { net, resolution: 41 });
      expect(Array.from(b.values)).toEqual(Array.from(a.values));
    }
  });

  it('kambGrid(vectors) with buckets equals the all-pairs loop exactly on random, clustered and small data', () => {
    const rnd = seeded(11);
    const cases = [
      uniformAxes(1, rnd),
      uniformAxes(7, rnd),
      uniformAxes(2000, rnd),
      concat(clusterAxes(3000, 45, 10, 0.05, rnd), uniformAxes(500, rnd)),
      clusterAxes(400, 90, 0, 0.1, rnd), // straddles the primitive
    ];
    for (const v of cases) {
      for (const net of ['equal-area', 'equal-angle'] as const) {
        const fast = kambGrid(v, { net, resolution: 31 });
        const naive = kambGrid(v, { net, resolution: 31, strategy: 'all-pairs' });
        expect(Array.from(fast.values)).toEqual(Array.from(naive.values));
      }
    }
  });

  it('kambGrid(uniform sample) averages one expected count E per node over the net (statistical, seeded)', () => {
    // For uniform axes the count at any node is binomial(N, A) with mean E = N·A (Kamb 1959 construction).
    const grid = kambGrid(uniformAxes(5000, seeded(3)), { resolution: 41 });
    let sum = 0;
    let count = 0;
    for (let row = 0; row < grid.height; row++) {
      for (let col = 0; col < grid.width; col++) {
        const { x, y } = gridNodeToNet(grid, col, row);
        if (Math.hypot(x, y) > 1) continue;
        sum += grid.values[row * grid.width + col] * grid.sigma;
        count++;
      }
    }
    expectClose(sum / count / grid.expected, 1, 0.05, 'mean count / E');
  });

  it('kambGrid at one node over 400 uniform samples of N = 100 has mean 8.2569 and standard deviation 2.7523', () => {
    // Binomial(100, 9/109): mean and sd from REFERENCES.md (derived). Tolerances are about 3.5 standard errors.
    const rnd = seeded(5);
    const counts: number[] = [];
    for (let s = 0; s < 400; s++) {
      const grid = kambGrid(uniformAxes(100, rnd), { resolution: 3 });
      counts.push(centreValue(grid) * grid.sigma);
    }
    const mean = counts.reduce((a, b) => a + b, 0) / counts.length;
    const sd = Math.sqrt(counts.reduce((a, b) => a + (b - mean) ** 2, 0) / (counts.length - 1));
    expectClose(mean, 8.2569, 0.5, 'mean count');
    expectClose(sd, 2.7523, 0.35, 'sd of count');
  });

  it('kambGrid(cluster) is highest at the node nearest the cluster’s projected point, and its plateau is centred there', () => {
    // A tight cluster alone: every node whose cap holds the whole cluster shares the maximum (N), and those nodes
    // surround the cluster. Expected point from the equal-area polar form (Snyder 1987), tolerance one grid step.
    const v = clusterAxes(1000, 120, 40, 0.005, seeded(13));
    const grid = kambGrid(v, { resolution: 101 });
    const target = equalAreaPoint(120, 40);
    const col = Math.round((target.x - grid.x0) / grid.step);
    const row = Math.round((grid.y0 - target.y) / grid.step);
    const max = Math.max(...grid.values);
    expectClose(max * grid.sigma, 1000, 1e-9, 'maximum count');
    expect(grid.values[row * grid.width + col]).toBe(max);
    let sx = 0;
    let sy = 0;
    let m = 0;
    grid.values.forEach((value, i) => {
      if (value !== max) return;
      const p = gridNodeToNet(grid, i % grid.width, Math.floor(i / grid.width));
      sx += p.x;
      sy += p.y;
      m++;
    });
    expect(m).toBeGreaterThan(4);
    expectClose(Math.hypot(sx / m - target.x, sy / m - target.y), 0, grid.step, 'plateau centre distance');
  });

  it('kambGrid(cluster) gives d3-contour rings around the cluster’s projected point at the highest level', () => {
    const rnd = seeded(17);
    const v = concat(clusterAxes(300, 200, 55, 0.03, rnd), uniformAxes(700, rnd));
    const grid = kambGrid(v, { resolution: 81 });
    const top = grid.levels[grid.levels.length - 1];
    expect(grid.levels[0]).toBe(2);
    const [polygon] = contours().size([grid.width, grid.height]).thresholds([top])(Array.from(grid.values))[0].coordinates;
    const ring = polygon[0].map((p) => contourPointToNet(grid, p));
    const cx = ring.reduce((s, p) => s + p.x, 0) / ring.length;
    const cy = ring.reduce((s, p) => s + p.y, 0) / ring.length;
    const target = equalAreaPoint(200, 55);
    expectClose(Math.hypot(cx - target.x, cy - target.y), 0, 0.05, 'ring centre distance');
  });

  it('kambGrid(axes) just outside the primitive holds the count of the antipodal direction inside the opposite side', () => {
    // Derived: past the primitive r = √2·sin(θ/2) continues with θ > 90°; the antipode lies at r' = √(2 - r²) on the
    // opposite azimuth. Reference count: a direct loop over the axes with the Kamb cap (Kamb 1959).
    const rnd = seeded(19);
    const v = concat(clusterAxes(150, 270, 3, 0.15, rnd), uniformAxes(150, rnd));
    const grid = kambGrid(v, { resolution: 41 });
    const { minCos } = kambParameters(300);
    const centre = (grid.width - 1) / 2;
    for (const [col, row] of [
      [grid.width - 1, centre], // east, outside
      [centre, 0], // north, outside
    ]) {
      const { x, y } = gridNodeToNet(grid, col, row);
      const r = Math.hypot(x, y);
      const rr = Math.sqrt(2 - r * r);
      const theta = 2 * Math.asin(rr / Math.SQRT2);
      const u = [(-y / r) * Math.sin(theta), (-x / r) * Math.sin(theta), Math.cos(theta)];
      let count = 0;
      for (let i = 0; i < v.length; i += 3) if (Math.abs(u[0] * v[i] + u[1] * v[i + 1] + u[2] * v[i + 2]) >= minCos) count++;
      expect(r).toBeGreaterThan(1);
      expectClose(grid.values[row * grid.width + col] * grid.sigma, count, 1e-9, `count at node (${col}, ${row})`);
    }
  });

  it('kambGrid(input) never yields NaN or Infinity, for one axis, repeated axes, vertical and horizontal axes, on both nets', () => {
    const inputs = [
      [{ trend: 0, plunge: 90 }],
      Array.from({ length: 50 }, () => ({ trend: 90, plunge: 0 })),
      [
        { trend: 0, plunge: 0 },
        { trend: 180, plunge: 0 },
        { trend: 360, plunge: 90 },
      ],
    ];
    for (const lines of inputs) {
      for (const net of ['equal-area', 'equal-angle'] as const) {
        const grid = kambGrid(lines, { net, resolution: 25 });
        expect(grid.values.every(Number.isFinite)).toBe(true);
        expect([grid.expected, grid.sigma, grid.countingAngle].every(Number.isFinite)).toBe(true);
      }
    }
  });

  it('kambGrid(lines) equals kambGrid(vectors) for the same lines and reports n, method and net', () => {
    const lines = [
      { trend: 10, plunge: 20 },
      { trend: 200, plunge: 70 },
    ];
    const vectors = Float64Array.from(lines.flatMap((l) => Object.values(lineToVector(l))));
    const a = kambGrid(lines, { net: 'equal-angle', resolution: 15 });
    const b = kambGrid(vectors, { net: 'equal-angle', resolution: 15 });
    expect(Array.from(a.values)).toEqual(Array.from(b.values));
    expect([a.n, a.method, a.net, a.width, a.height]).toEqual([2, 'kamb', 'equal-angle', 17, 17]);
  });

  it('kambGrid rejects bad options, naming the option and the value', () => {
    const v = Float64Array.of(0, 0, 1);
    expect(() => kambGrid(v, { interval: -1 })).toThrow(/interval: -1/);
    expect(() => kambGrid(v, { resolution: 5000 })).toThrow(/resolution: 5000/);
    expect(() => kambGrid(v, { strategy: 'guess' as 'buckets' })).toThrow(/strategy: "guess"/);
  });
});
