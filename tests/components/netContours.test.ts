import { describe, expect, it } from 'vitest';
import proj4 from 'proj4';
import { contourBands } from '../../src/components/net/contourPaths';
import { gridNodeToNet, netGridNodes, type DensityGrid } from '../../src/core/density';
import { kambGrid } from '../../src/core/kamb';
import { createRandom } from '../../src/core/random';
import { lineToVector } from '../../src/core/vectors';
import type { NetFrame } from '../../src/components/net/netPaths';
import { expectClose } from '../helpers/tolerance';

const FRAME: NetFrame = { cx: 206, cy: 213, r: 180 };

/** A DensityGrid over the equal-area net whose value at each node is f(net x, net y). */
function syntheticGrid(f: (x: number, y: number) => number, levels: number[], resolution = 101): DensityGrid {
  const nodes = netGridNodes(resolution, 'equal-area');
  const values = new Float64Array(nodes.width * nodes.height);
  for (let row = 0; row < nodes.height; row++) {
    for (let col = 0; col < nodes.width; col++) {
      const p = gridNodeToNet(nodes, col, row);
      values[row * nodes.width + col] = f(p.x, p.y);
    }
  }
  return { method: 'kamb', net: 'equal-area', n: 1, width: nodes.width, height: nodes.height, values, levels, expected: 3, sigma: 1, countingAngle: 10, x0: nodes.x0, y0: nodes.y0, step: nodes.step };
}

/** Every vertex of path data made of M, L and Z, as net coordinates of FRAME. */
function vertices(d: string): { x: number; y: number }[][] {
  return d
    .split('Z')
    .filter((s) => s !== '')
    .map((ring) => [...ring.matchAll(/[ML](-?[\d.]+) (-?[\d.]+)/g)].map((m) => ({ x: (Number(m[1]) - FRAME.cx) / FRAME.r, y: (FRAME.cy - Number(m[2])) / FRAME.r })));
}

describe('contourBands', () => {
  it('contourBands(grid, frame) of a cone-shaped density gives circles of the analytic radius', () => {
    // v = 10(1 - r): the level-5 contour is the circle r = 0.5, the level-8 one r = 0.2.
    const grid = syntheticGrid((x, y) => 10 * (1 - Math.hypot(x, y)), [5, 8]);
    const bands = contourBands(grid, FRAME);
    expect(bands.map((b) => b.level)).toEqual([5, 8]);
    for (const [band, r] of [[bands[0], 0.5], [bands[1], 0.2]] as const) {
      const rings = vertices(band.d);
      expect(rings.length).toBe(1);
      // Marching squares interpolates linearly along cell edges; v is linear in r, so the only error
      // is the chord of the circle across a cell, below step²/(8r) (derived), plus rounding.
      for (const p of rings[0]) expectClose(Math.hypot(p.x, p.y), r, grid.step ** 2 / (8 * r) + 1e-4, `radius of the ${band.level} contour`);
    }
  });

  it('contourBands(grid, frame) keeps north up and east right: a peak at net (0.3, 0.5) stays there', () => {
    const grid = syntheticGrid((x, y) => 10 * Math.max(0, 1 - Math.hypot(x - 0.3, y - 0.5) / 0.4), [5]);
    const [band] = contourBands(grid, FRAME);
    const ring = vertices(band.d)[0];
    const c = ring.reduce((s, p) => ({ x: s.x + p.x / ring.length, y: s.y + p.y / ring.length }), { x: 0, y: 0 });
    expectClose(c.x, 0.3, 0.01, 'centre x (east)');
    expectClose(c.y, 0.5, 0.01, 'centre y (north)');
    for (const p of ring) expectClose(Math.hypot(p.x - 0.3, p.y - 0.5), 0.2, 0.002, 'radius');
  });

  it('contourBands(grid, frame, only) draws only the given levels, and none when no value reaches them', () => {
    const grid = syntheticGrid((x, y) => 10 * (1 - Math.hypot(x, y)), [2, 4, 6, 8]);
    expect(contourBands(grid, FRAME, [4, 8]).map((b) => b.level)).toEqual([4, 8]);
    expect(contourBands(grid, FRAME, [20])).toEqual([]);
    expect(contourBands({ ...grid, levels: [] }, FRAME)).toEqual([]);
  });

  it('contourBands(grid, frame) rejects a grid whose values do not fill width × height', () => {
    const grid = syntheticGrid(() => 1, [0.5], 11);
    expect(() => contourBands({ ...grid, values: new Float64Array(5) }, FRAME)).toThrow(/grid has 5 values; expected width × height = 169/);
  });

  it('contourBands(kambGrid(poles), frame) puts the highest contour around the cluster centre that proj4 projects', () => {
    // 300 poles scattered about 120/40; the densest contour surrounds that line.
    const rng = createRandom(5);
    const xyz = new Float64Array(900);
    for (let i = 0; i < 300; i++) {
      const v = lineToVector({ trend: 120 + (rng.next() - 0.5) * 16, plunge: 40 + (rng.next() - 0.5) * 12 });
      xyz.set([v.x, v.y, v.z], 3 * i);
    }
    const grid = kambGrid(xyz, { net: 'equal-area' });
    const bands = contourBands(grid, FRAME);
    const top = vertices(bands[bands.length - 1].d).flat();
    const c = top.reduce((s, p) => ({ x: s.x + p.x / top.length, y: s.y + p.y / top.length }), { x: 0, y: 0 });
    // proj4js Lambert azimuthal equal-area, north polar aspect on R = 1/sqrt(2) (primitive radius 1); its y points south.
    const R = Math.SQRT1_2;
    const [px, py] = proj4(`+proj=longlat +R=${R} +no_defs`, `+proj=laea +lat_0=90 +lon_0=0 +R=${R} +x_0=0 +y_0=0 +units=m +no_defs`).forward([120, 40]);
    expectClose(c.x, px, 0.05, 'top contour centre x');
    expectClose(c.y, -py, 0.05, 'top contour centre y');
  });
});
