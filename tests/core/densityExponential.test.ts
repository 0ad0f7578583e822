import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import { exponentialGrid, exponentialParameters } from '../../src/core/exponentialDensity';
import { gridNodeToNet, type DensityGrid } from '../../src/core/density';
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

function centreValue(grid: DensityGrid): number {
  const c = (grid.width - 1) / 2;
  return grid.values[c * grid.width + c];
}

/** Largest |a - b| over the grid, in sigma. */
function maxDifference(a: DensityGrid, b: DensityGrid): number {
  let m = 0;
  for (let i = 0; i < a.values.length; i++) m = Math.max(m, Math.abs(a.values[i] - b.values[i]));
  return m;
}

describe('exponentialParameters', () => {
  // k = 2(1 + N/9): Vollmer (1995), from memory (REFERENCES.md). E and sigma: derived in exponentialDensity.ts from the
  // moments of exp(k(c - 1)) with c uniform on [0, 1]; values evaluated independently (closed form in Python).
  const rows = [
    { n: 100, k: 24.222222, expected: 4.12844, sigma: 1.376147, angle: 16.521 },
    { n: 10, k: 4.222222, expected: 2.333686, sigma: 0.799592, angle: 40.2566 },
    { n: 1, k: 2.222222, expected: 0.401234, sigma: 0.247727, angle: 56.633 },
  ];
  for (const { n, k, expected, sigma, angle } of rows) {
    it(`exponentialParameters(${n}) gives k = ${k}, E = ${expected}, sigma = ${sigma}, 1/e angle ${angle}°`, () => {
      const p = exponentialParameters(n);
      expectClose(p.k, k, 1e-6, 'k');
      expectClose(p.expected, expected, 1e-6, 'expected');
      expectClose(p.sigma, sigma, 1e-6, 'sigma');
      expectClose(p.countingAngle, angle, 1e-3, 'angle');
    });
  }

  it('exponentialParameters(n) approaches E = 3·sigma, the Kamb criterion, as n grows', () => {
    // Derived: without the e^-k terms E = N/k and sigma = N/(3k).
    fc.assert(
      fc.property(fc.integer({ min: 200, max: 10_000_000 }), (n) => {
        const p = exponentialParameters(n);
        expectClose(p.expected / p.sigma, 3, 1e-9, `E/sigma for n = ${n}`);
      }),
    );
  });

  it('exponentialGrid at one node over 400 uniform samples of N = 100 has mean E and standard deviation sigma (Monte Carlo)', () => {
    // Checks the derived normalisation against simulation; tolerances about 3.5 standard errors.
    const rnd = seeded(23);
    const sums: number[] = [];
    let grid: DensityGrid | undefined;
    for (let s = 0; s < 400; s++) {
      grid = exponentialGrid(uniformAxes(100, rnd), { resolution: 3 });
      sums.push(centreValue(grid) * grid.sigma);
    }
    const mean = sums.reduce((a, b) => a + b, 0) / sums.length;
    const sd = Math.sqrt(sums.reduce((a, b) => a + (b - mean) ** 2, 0) / (sums.length - 1));
    expectClose(mean, 4.12844, 0.25, 'mean summed weight');
    expectClose(sd, 1.376147, 0.18, 'sd of summed weight');
    expect(grid?.sigma).toBeCloseTo(1.376147, 5);
  });
});

describe('exponentialGrid', () => {
  it('exponentialGrid(one vertical axis) gives weight exp(k(cos θ - 1)) at the centre and on the primitive', () => {
    // N = 1: k = 2(1 + 1/9) (Vollmer 1995, from memory). Centre node θ = 0, weight 1; east node θ = 90°, weight e^-k.
    const grid = exponentialGrid([{ trend: 0, plunge: 90 }], { resolution: 5 });
    const k = 2 * (1 + 1 / 9);
    expectClose(centreValue(grid) * grid.sigma, 1, 1e-12, 'centre weight');
    const east = 3 * grid.width + 5;
    expectClose(grid.values[east] * grid.sigma, Math.exp(-k), 1e-12, 'primitive weight');
    expect(grid.k).toBe(k);
  });

  it('exponentialGrid(vectors) with truncated buckets stays within 1e-6 sigma of the all-pairs sum', () => {
    const rnd = seeded(29);
    const cases = [
      uniformAxes(1, rnd),
      uniformAxes(30, rnd),
      uniformAxes(5000, rnd),
      concat(clusterAxes(8000, 45, 10, 0.05, rnd), uniformAxes(2000, rnd)),
      clusterAxes(3000, 90, 0, 0.1, rnd), // straddles the primitive
    ];
    for (const v of cases) {
      for (const net of ['equal-area', 'equal-angle'] as const) {
        const fast = exponentialGrid(v, { net, resolution: 25 });
        const naive = exponentialGrid(v, { net, resolution: 25, strategy: 'all-pairs' });
        const max = Math.max(...naive.values);
        const diff = maxDifference(fast, naive);
        expect(diff).toBeLessThanOrEqual(1e-6);
        expect(diff / max).toBeLessThanOrEqual(1e-6);
      }
    }
  });

  it('exponentialGrid(vectors, {tolerance}) keeps a looser truncation within its own tolerance', () => {
    const v = uniformAxes(20000, seeded(31));
    const naive = exponentialGrid(v, { resolution: 15, strategy: 'all-pairs' });
    const loose = exponentialGrid(v, { resolution: 15, tolerance: 1e-2 });
    expect(maxDifference(loose, naive)).toBeLessThanOrEqual(1e-2);
    expect(() => exponentialGrid(v, { tolerance: 0 })).toThrow(/tolerance: 0/);
  });

  it('exponentialGrid(vectors) is unchanged when any subset of the axes is reversed (antipodal symmetry)', () => {
    const rnd = seeded(37);
    const v = concat(uniformAxes(300, rnd), clusterAxes(200, 300, 20, 0.2, rnd));
    const flipped = v.map((c, i) => (Math.floor(i / 3) % 2 === 0 ? -c : c));
    const a = exponentialGrid(v, { resolution: 41 });
    const b = exponentialGrid(flipped, { resolution: 41 });
    expect(maxDifference(a, b)).toBeLessThanOrEqual(1e-12 * Math.max(...a.values));
  });

  it('exponentialGrid(uniform sample) averages one expected weight E per node over the net (statistical, seeded)', () => {
    const grid = exponentialGrid(uniformAxes(5000, seeded(41)), { resolution: 41 });
    let sum = 0;
    let count = 0;
    grid.values.forEach((value, i) => {
      const { x, y } = gridNodeToNet(grid, i % grid.width, Math.floor(i / grid.width));
      if (Math.hypot(x, y) > 1) return;
      sum += value * grid.sigma;
      count++;
    });
    expectClose(sum / count / grid.expected, 1, 0.05, 'mean weight / E');
  });

  it('exponentialGrid(cluster) peaks within one grid step of the cluster’s projected point on both nets', () => {
    // Expected points from the polar forms r = √2·sin(θ/2) and tan(θ/2) (Snyder 1987; REFERENCES.md), θ = 90° - plunge.
    const rnd = seeded(43);
    const v = concat(clusterAxes(80, 120, 40, 0.02, rnd), uniformAxes(300, rnd));
    const theta = (50 * Math.PI) / 180;
    for (const [net, r] of [
      ['equal-area', Math.SQRT2 * Math.sin(theta / 2)],
      ['equal-angle', Math.tan(theta / 2)],
    ] as const) {
      const grid = exponentialGrid(v, { net, resolution: 101 });
      let best = 0;
      grid.values.forEach((value, i) => {
        if (value > grid.values[best]) best = i;
      });
      const p = gridNodeToNet(grid, best % grid.width, Math.floor(best / grid.width));
      const target = { x: r * Math.sin((120 * Math.PI) / 180), y: r * Math.cos((120 * Math.PI) / 180) };
      expectClose(Math.hypot(p.x - target.x, p.y - target.y), 0, grid.step, `${net} peak distance`);
      expect(grid.levels.length).toBeGreaterThan(1);
    }
  });

  it('exponentialGrid(input) never yields NaN or Infinity, for one axis, repeated axes and 10^4 identical axes', () => {
    const inputs: (Float64Array | { trend: number; plunge: number }[])[] = [
      [{ trend: 0, plunge: 0 }],
      Array.from({ length: 40 }, () => ({ trend: 45, plunge: 45 })),
      new Float64Array(30000).map((_, i) => (i % 3 === 2 ? 1 : 0)),
    ];
    for (const input of inputs) {
      for (const net of ['equal-area', 'equal-angle'] as const) {
        const grid = exponentialGrid(input, { net, resolution: 25 });
        expect(grid.values.every(Number.isFinite)).toBe(true);
        expect([grid.expected, grid.sigma, grid.countingAngle].every(Number.isFinite)).toBe(true);
      }
    }
  });
});
