import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import { contours, geoAzimuthalEqualArea, geoStereographic } from 'd3';
import {
  axesFromLines,
  contourLevels,
  contourPointToNet,
  gridNodeToNet,
  netGridNodes,
  netInverse,
  readAxes,
} from '../../src/core/density';
import type { NetKind } from '../../src/core/netProjection';
import { bucketAxes, capChord, sumAllAxes, sumNearAxis } from '../../src/core/sphereBuckets';
import { expectClose, expectAzimuth } from '../helpers/tolerance';

const RAD = 180 / Math.PI;

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
function uniformAxes(n: number, seed: number): Float64Array {
  const rnd = seeded(seed);
  const out = new Float64Array(3 * n);
  for (let i = 0; i < n; i++) {
    const z = 2 * rnd() - 1;
    const phi = 2 * Math.PI * rnd();
    const r = Math.sqrt(1 - z * z);
    out.set([r * Math.cos(phi), r * Math.sin(phi), z], 3 * i);
  }
  return out;
}

function trendPlunge([n, e, d]: readonly number[]): { trend: number; plunge: number } {
  return { trend: (Math.atan2(e, n) * RAD + 360) % 360, plunge: Math.asin(d) * RAD };
}

describe('netInverse', () => {
  // Net radii for a unit primitive, theta = 90 - plunge: REFERENCES.md "Net projections", derived from Snyder (1987).
  const rows: { net: NetKind; r: number; plunge: number }[] = [
    { net: 'equal-area', r: 0.707107, plunge: 30 },
    { net: 'equal-area', r: 0.541196, plunge: 45 },
    { net: 'equal-area', r: 0.366025, plunge: 60 },
    { net: 'equal-angle', r: 0.57735, plunge: 30 },
    { net: 'equal-angle', r: 0.414214, plunge: 45 },
    { net: 'equal-angle', r: 0.267949, plunge: 60 },
  ];
  for (const { net, r, plunge } of rows) {
    it(`netInverse(x, y, '${net}') at radius ${r} gives plunge ${plunge}° toward atan2(x, y)`, () => {
      const azimuth = 35;
      const x = r * Math.sin(azimuth / RAD);
      const y = r * Math.cos(azimuth / RAD);
      const got = trendPlunge(netInverse(x, y, net));
      expectClose(got.plunge, plunge, 1e-4, 'plunge');
      expectAzimuth(got.trend, azimuth, 1e-9, 'trend');
    });
  }

  it('netInverse(0, 0, net) is the vertical and netInverse(1, 0, net) is horizontal toward 090 on both nets', () => {
    for (const net of ['equal-area', 'equal-angle'] as const) {
      expect(netInverse(0, 0, net)).toEqual([0, 0, 1]);
      const [n, e, d] = netInverse(1, 0, net);
      expectClose(n, 0, 1e-15, `${net} north`);
      expectClose(e, 1, 1e-15, `${net} east`);
      expectClose(d, 0, 1e-15, `${net} down`);
    }
  });

  it('netInverse agrees with the inverse of d3-geo azimuthal equal-area and stereographic projections centred on the nadir', () => {
    // Reference library: d3-geo. Its raw radii are 2·sin(c/2) (equal-area) and tan(c/2) (stereographic), so scales
    // 1/√2 and 1 put the primitive at radius 1; latitude = plunge, longitude = 180 - trend, screen y down (seen here).
    const ea = geoAzimuthalEqualArea().scale(Math.SQRT1_2).translate([0, 0]).rotate([0, -90]);
    const st = geoStereographic().scale(1).translate([0, 0]).rotate([0, -90]);
    fc.assert(
      fc.property(fc.double({ min: -0.99, max: 0.99, noNaN: true }), fc.double({ min: -0.99, max: 0.99, noNaN: true }), (x, y) => {
        fc.pre(Math.hypot(x, y) <= 0.999 && Math.hypot(x, y) > 1e-6);
        for (const [net, projection] of [
          ['equal-area', ea],
          ['equal-angle', st],
        ] as const) {
          const [lon, lat] = projection.invert!([x, -y])!;
          const got = trendPlunge(netInverse(x, y, net));
          expectClose(got.plunge, lat, 1e-9, `${net} plunge at (${x}, ${y})`);
          expectAzimuth(got.trend, 180 - lon, 1e-7, `${net} trend at (${x}, ${y})`);
        }
      }),
    );
  });

  it('netInverse(x, y, "equal-area") past the primitive gives the antipode of the lower-hemisphere direction at radius √(2 - r²) opposite', () => {
    // Derived: r = √2·sin(θ/2) with θ > 90° continues to the upper hemisphere; the antipode has θ' = 180° - θ, so
    // r' = √2·cos(θ/2) = √(2 - r²) at the opposite azimuth. This is the hemisphere wrap the grid relies on.
    for (const [x, y] of [
      [1.01, 0],
      [0.3, -1.05],
      [-1.1, 0.6],
    ]) {
      const r = Math.hypot(x, y);
      const s = Math.sqrt(2 - r * r) / r;
      const [n, e, d] = netInverse(x, y, 'equal-area');
      const [n2, e2, d2] = netInverse(-x * s, -y * s, 'equal-area');
      expect(d).toBeLessThan(0);
      expectClose(n, -n2, 1e-12, 'north');
      expectClose(e, -e2, 1e-12, 'east');
      expectClose(d, -d2, 1e-12, 'down');
    }
  });
});

describe('netGridNodes and grid coordinates', () => {
  it('netGridNodes(5, "equal-area") has 7 × 7 unit-vector nodes with nodes 1..5 spanning the primitive', () => {
    const g = netGridNodes(5, 'equal-area');
    expect([g.width, g.height]).toEqual([7, 7]);
    expect(gridNodeToNet(g, 1, 1)).toEqual({ x: -1, y: 1 });
    expect(gridNodeToNet(g, 5, 5)).toEqual({ x: 1, y: -1 });
    expect(gridNodeToNet(g, 3, 3)).toEqual({ x: 0, y: 0 });
    for (let i = 0; i < g.directions.length; i += 3) {
      const len = Math.hypot(g.directions[i], g.directions[i + 1], g.directions[i + 2]);
      expectClose(len, 1, 1e-15, `node ${i / 3} length`);
    }
    // Centre node is vertical; node (5, 3) is on the primitive due east (x = east, y = north).
    expect(Array.from(g.directions.subarray(3 * (3 * 7 + 3), 3 * (3 * 7 + 3) + 3))).toEqual([0, 0, 1]);
    const east = Array.from(g.directions.subarray(3 * (3 * 7 + 5), 3 * (3 * 7 + 5) + 3));
    expectClose(east[1], 1, 1e-15, 'east node');
    // Row 0 is north: node (3, 1) is due north on the primitive.
    const north = Array.from(g.directions.subarray(3 * (1 * 7 + 3), 3 * (1 * 7 + 3) + 3));
    expectClose(north[0], 1, 1e-15, 'north node');
  });

  it('netGridNodes(resolution, net) evaluates every node of every cell that meets the primitive, and not the far corners', () => {
    for (const net of ['equal-area', 'equal-angle'] as const) {
      const g = netGridNodes(21, net);
      const at = (col: number, row: number): number => g.evaluated[row * g.width + col];
      for (let row = 0; row + 1 < g.height; row++) {
        for (let col = 0; col + 1 < g.width; col++) {
          // A cell meets the unit circle when its nearest point is inside and its farthest corner outside.
          const a = gridNodeToNet(g, col, row);
          const b = gridNodeToNet(g, col + 1, row + 1);
          const nx = Math.max(a.x, Math.min(0, b.x));
          const ny = Math.max(b.y, Math.min(0, a.y));
          const far = Math.max(Math.hypot(a.x, a.y), Math.hypot(b.x, a.y), Math.hypot(a.x, b.y), Math.hypot(b.x, b.y));
          if (Math.hypot(nx, ny) <= 1 && far >= 1) {
            expect([at(col, row), at(col + 1, row), at(col, row + 1), at(col + 1, row + 1)]).toEqual([1, 1, 1, 1]);
          }
        }
      }
      expect(at(0, 0)).toBe(0);
      expect(at(g.width - 1, g.height - 1)).toBe(0);
    }
  });

  it('netGridNodes(resolution, net) rejects a resolution that is not a whole number from 3 to 1001', () => {
    expect(() => netGridNodes(2, 'equal-area')).toThrow(/resolution: 2 .*3 to 1001/);
    expect(() => netGridNodes(10.5, 'equal-area')).toThrow(/resolution: 10.5/);
    expect(() => netGridNodes(11, 'polar' as NetKind)).toThrow(/net: "polar"/);
  });

  it('contourPointToNet(grid, p) puts d3-contour rings around the node that holds a peak', () => {
    // Reference library: d3-contour places node (col, row) at (col + 0.5, row + 0.5).
    const g = netGridNodes(9, 'equal-area');
    const values = new Float64Array(g.width * g.height);
    const col = 7;
    const row = 4;
    values[row * g.width + col] = 1;
    const [ring] = contours().size([g.width, g.height]).thresholds([0.5])(Array.from(values))[0].coordinates[0];
    const pts = ring.map((p) => contourPointToNet(g, p));
    const centre = gridNodeToNet(g, col, row);
    for (const p of pts) expectClose(Math.hypot(p.x - centre.x, p.y - centre.y), g.step / 2, 1e-12, 'ring radius');
  });
});

describe('contourLevels', () => {
  // Contours at 2-sigma intervals starting at 2 sigma (common practice for Kamb contours).
  const rows = [
    { values: [0, 3, 7.5], interval: 2, expected: [2, 4, 6] },
    { values: [0, 6], interval: 2, expected: [2, 4, 6] },
    { values: [0, 1.9], interval: 2, expected: [] },
    { values: [1, 3.1], interval: 1.5, expected: [1.5, 3] },
  ];
  for (const { values, interval, expected } of rows) {
    it(`contourLevels([${values}], ${interval}) is [${expected}]`, () => {
      expect(contourLevels(Float64Array.from(values), interval)).toEqual(expected);
    });
  }
  it('contourLevels(values, 0) throws, naming the interval', () => {
    expect(() => contourLevels(Float64Array.of(1), 0)).toThrow(/interval 0/);
  });
});

describe('axesFromLines and readAxes', () => {
  it('axesFromLines([{trend: 90, plunge: 0}, {trend: 0, plunge: 90}]) gives east and down', () => {
    const v = axesFromLines([
      { trend: 90, plunge: 0 },
      { trend: 0, plunge: 90 },
    ]);
    const expected = [0, 1, 0, 0, 0, 1];
    expected.forEach((e, i) => expectClose(v[i], e, 1e-15, `component ${i}`));
  });

  it('axesFromLines rejects a bad trend or plunge, naming the line, the field and the value', () => {
    expect(() => axesFromLines([{ trend: 10, plunge: 20 }, { trend: 10, plunge: 95 }])).toThrow(/line 1, field plunge: 95/);
    expect(() => axesFromLines([{ trend: Number.NaN, plunge: 20 }])).toThrow(/line 0, field trend: NaN/);
    expect(() => axesFromLines([{ trend: -5, plunge: 20 }])).toThrow(/line 0, field trend: -5/);
  });

  it('readAxes rejects empty input, a ragged array and vectors that are not unit length', () => {
    expect(() => readAxes(new Float64Array(0))).toThrow(/at least one direction/);
    expect(() => readAxes([])).toThrow(/at least one direction/);
    expect(() => readAxes(Float64Array.of(0, 0, 1, 0))).toThrow(/length 4 is not a multiple of 3/);
    expect(() => readAxes(Float64Array.of(0, 0, 1, 0, 0, 2))).toThrow(/direction 1 .* has length 2/);
    expect(() => readAxes(Float64Array.of(Number.NaN, 0, 1))).toThrow(/direction 0/);
  });

  it('readAxes(vectors) returns the same array without copying or altering it', () => {
    const v = Float64Array.of(0, -1, 0);
    expect(readAxes(v)).toBe(v);
    expect(Array.from(v)).toEqual([0, -1, 0]);
  });
});

describe('sphereBuckets', () => {
  it('sumNearAxis(buckets, u, minCos, w) equals sumAllAxes(vectors, u, minCos, w) exactly for random axes and caps', () => {
    // The all-pairs loop is the reference: the bucketed search may only skip axes outside the cap.
    fc.assert(
      fc.property(
        fc.integer({ min: 1, max: 400 }),
        fc.integer({ min: 0, max: 2 ** 31 - 1 }),
        fc.double({ min: 0.01, max: 0.99999, noNaN: true }),
        (n, seed, minCos) => {
          const v = uniformAxes(n, seed);
          const b = bucketAxes(v, capChord(minCos));
          const queries = uniformAxes(20, seed + 1);
          const w = (c: number): number => c * c;
          for (let q = 0; q < queries.length; q += 3) {
            const [x, y, z] = [queries[q], queries[q + 1], queries[q + 2]];
            const near = sumNearAxis(b, x, y, z, minCos, () => 1);
            const all = sumAllAxes(v, x, y, z, minCos, () => 1);
            expect(near).toBe(all);
            expectClose(sumNearAxis(b, x, y, z, minCos, w), sumAllAxes(v, x, y, z, minCos, w), 1e-12 * n, 'weighted sum');
          }
        },
      ),
      { numRuns: 60 },
    );
  });

  it('sumNearAxis counts axes lying exactly on cell faces and on the coordinate axes', () => {
    // Vectors on ±x, ±y, ±z and the cube diagonals sit on cell boundaries of every grid size.
    const s = 1 / Math.sqrt(3);
    const v = Float64Array.of(1, 0, 0, 0, -1, 0, 0, 0, 1, s, s, s, -s, s, -s);
    for (const minCos of [0.5, 0.9, 0.999999]) {
      const b = bucketAxes(v, capChord(minCos));
      for (let i = 0; i < v.length; i += 3) {
        for (const sign of [1, -1]) {
          const [x, y, z] = [sign * v[i], sign * v[i + 1], sign * v[i + 2]];
          expect(sumNearAxis(b, x, y, z, minCos, () => 1)).toBe(sumAllAxes(v, x, y, z, minCos, () => 1));
        }
      }
    }
  });

  it('sumNearAxis(buckets, u, 0, w) refuses a cap of 90° or more, which needs the all-pairs loop', () => {
    const b = bucketAxes(Float64Array.of(0, 0, 1), 1);
    expect(() => sumNearAxis(b, 0, 0, 1, 0, () => 1)).toThrow(/cap cosine 0/);
  });
});
