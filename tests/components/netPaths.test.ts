import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import proj4 from 'proj4';
import {
  centreCrossPathData,
  circlePathData,
  greatCirclePathData,
  greatCirclesPathData,
  gridPathData,
  markerPathData,
  netToSvg,
  pointsPathData,
  polylinePathData,
  POINTS_SCALE,
  smallCirclePathData,
  ticksPathData,
  trianglesPathData,
  type NetFrame,
} from '../../src/components/net/netPaths';
import { greatCirclePath } from '../../src/core/geometry';
import { projectVectors, type NetKind } from '../../src/core/netProjection';
import { lineToVector } from '../../src/core/vectors';
import type { Line, Plane } from '../../src/core/types';
import { expectClose } from '../helpers/tolerance';

const FRAME: NetFrame = { cx: 206, cy: 213, r: 180 };
const KINDS: NetKind[] = ['equal-area', 'equal-angle'];
/** Path coordinates are rounded to 0.01 viewBox units. */
const ROUNDING = 0.006;

/** Absolute points of each subpath of path data made of M, L, H, V, Z (and h0 dots). */
function subpaths(d: string): { x: number; y: number }[][] {
  const out: { x: number; y: number }[][] = [];
  let cur: { x: number; y: number }[] = [];
  let x = 0, y = 0;
  for (const [, cmd, args] of d.matchAll(/([MLHVZhvA])([^MLHVZhvA]*)/g)) {
    const n = args.trim() === '' ? [] : args.trim().split(/[ ,]+/).map(Number);
    if (cmd === 'M') {
      if (cur.length) out.push(cur);
      [x, y] = n;
      cur = [{ x, y }];
    } else if (cmd === 'L') {
      [x, y] = n;
      cur.push({ x, y });
    } else if (cmd === 'H') cur.push({ x: (x = n[0]), y });
    else if (cmd === 'V') cur.push({ x, y: (y = n[0]) });
    else if (cmd === 'h') cur.push({ x: (x += n[0]), y });
    else if (cmd === 'v') cur.push({ x, y: (y += n[0]) });
    else if (cmd === 'A') cur.push({ x: (x = n[5]), y: (y = n[6]) });
  }
  if (cur.length) out.push(cur);
  return out;
}

/** Net coordinates (x east, y north, primitive 1) of an SVG point in FRAME. */
const toNet = (p: { x: number; y: number }) => ({ x: (p.x - FRAME.cx) / FRAME.r, y: (FRAME.cy - p.y) / FRAME.r });

/**
 * Reference projections from proj4js (a general-purpose library): the lower-hemisphere net is
 * the north polar aspect with a line of trend t and plunge p at longitude t, latitude p.
 * Lambert azimuthal equal-area on a sphere of R = 1/sqrt(2) (rho = 2R sin(c/2) = sqrt(2) sin(c/2),
 * primitive radius 1) and stereographic with k0 = 1 on a sphere of R = 1/2 (rho = 2R tan(c/2)
 * = tan(c/2)); Snyder 1987, polar aspects. proj4's polar aspect has y = -rho cos(lon), so the
 * net's north (y up) is -y.
 */
const R_LAEA = Math.SQRT1_2;
const LAEA = proj4(`+proj=longlat +R=${R_LAEA} +no_defs`, `+proj=laea +lat_0=90 +lon_0=0 +R=${R_LAEA} +x_0=0 +y_0=0 +units=m +no_defs`);
const STERE = proj4('+proj=longlat +R=0.5 +no_defs', '+proj=stere +lat_0=90 +lon_0=0 +k_0=1 +R=0.5 +x_0=0 +y_0=0 +units=m +no_defs');
function reference(line: Line, kind: NetKind): { x: number; y: number } {
  const [x, y] = (kind === 'equal-area' ? LAEA : STERE).forward([line.trend, line.plunge]);
  return { x, y: -y };
}

describe('netToSvg and polylinePathData', () => {
  it('netToSvg(p, frame) puts north up and east right', () => {
    expect(netToSvg({ x: 0, y: 1 }, FRAME)).toEqual({ x: 206, y: 33 });
    expect(netToSvg({ x: 1, y: 0 }, FRAME)).toEqual({ x: 386, y: 213 });
  });

  it('polylinePathData(parts, frame) writes one subpath per part and skips single points', () => {
    const d = polylinePathData([[{ x: 0, y: 0 }, { x: 1, y: 0 }], [{ x: 0.5, y: 0.5 }]], { cx: 0, cy: 0, r: 10 });
    expect(d).toBe('M0 0L10 0');
  });
});

describe('greatCirclePathData', () => {
  // Vertical planes: their great circles pass through the centre of the net as diameters along
  // the strike (common practice), for both nets.
  for (const kind of KINDS) {
    for (const dipDirection of [0, 37, 90, 145, 270]) {
      it(`greatCirclePathData({dipDirection: ${dipDirection}, dip: 90}, '${kind}') is the diameter along the strike`, () => {
        const [path, ...rest] = subpaths(greatCirclePathData({ dipDirection, dip: 90 }, kind, FRAME));
        expect(rest).toEqual([]);
        const s = ((dipDirection - 90) * Math.PI) / 180; // strike (right-hand rule)
        const along = { x: Math.sin(s), y: Math.cos(s) };
        for (const p of path) {
          const q = toNet(p);
          // Distance from the line through the centre along the strike.
          expectClose(q.x * along.y - q.y * along.x, 0, ROUNDING / FRAME.r * 2, 'distance from the strike diameter');
          expect(Math.hypot(q.x, q.y)).toBeLessThanOrEqual(1 + 1e-4);
        }
        // Ends on the primitive at the two strike points.
        expectClose(toNet(path[0]).x, along.x, 1e-4, 'start x');
        expectClose(toNet(path[0]).y, along.y, 1e-4, 'start y');
        expectClose(toNet(path[path.length - 1]).x, -along.x, 1e-4, 'end x');
        expectClose(toNet(path[path.length - 1]).y, -along.y, 1e-4, 'end y');
      });
    }
  }

  it('greatCirclePathData(plane, kind) matches proj4 at every vertex for random planes', () => {
    fc.assert(
      fc.property(fc.double({ min: 0, max: 359.99, noNaN: true }), fc.double({ min: 0.5, max: 90, noNaN: true }), fc.constantFrom(...KINDS), (dipDirection, dip, kind) => {
        const plane: Plane = { dipDirection, dip };
        const vertices = greatCirclePath(plane, 30);
        const [path] = subpaths(greatCirclePathData(plane, kind, FRAME, 30));
        expect(path.length).toBe(vertices.length);
        path.forEach((p, i) => {
          // Trend and plunge written out (not vectorToLine, which turns horizontal lines to trends below 180).
          const v = vertices[i];
          const ref = reference({ trend: (Math.atan2(v.y, v.x) * 180) / Math.PI, plunge: (Math.asin(Math.min(1, v.z)) * 180) / Math.PI }, kind);
          const q = toNet(p);
          expectClose(q.x, ref.x, 2e-4, `vertex ${i} x`);
          expectClose(q.y, ref.y, 2e-4, `vertex ${i} y`);
        });
      }),
      { numRuns: 60 },
    );
  });

  // The dip line of a plane plots at the radius of a line plunging at the dip.
  // Radii: REFERENCES.md "Net radii" (derived from Snyder 1987 rho = 2R sin(c/2), scaled to the primitive).
  const radii = [
    { dip: 30, kind: 'equal-area', r: 0.707107 }, // REFERENCES.md, plunge 30°
    { dip: 30, kind: 'equal-angle', r: 0.57735 }, // REFERENCES.md, plunge 30°
    { dip: 45, kind: 'equal-area', r: 0.541196 }, // REFERENCES.md, plunge 45°
    { dip: 45, kind: 'equal-angle', r: 0.414214 }, // REFERENCES.md, plunge 45°
    { dip: 60, kind: 'equal-area', r: 0.366025 }, // REFERENCES.md, plunge 60°
    { dip: 60, kind: 'equal-angle', r: 0.267949 }, // REFERENCES.md, plunge 60°
  ] as const;
  for (const row of radii) {
    it(`greatCirclePathData({dipDirection: 120, dip: ${row.dip}}, '${row.kind}') passes through radius ${row.r} along the dip direction`, () => {
      const [path] = subpaths(greatCirclePathData({ dipDirection: 120, dip: row.dip }, row.kind, FRAME, 90));
      const mid = toNet(path[45]); // steps/2 is the dip line
      expectClose(Math.hypot(mid.x, mid.y), row.r, 1e-4, 'radius of the dip line');
      expectClose(((Math.atan2(mid.x, mid.y) * 180) / Math.PI + 360) % 360, 120, 0.01, 'azimuth of the dip line');
    });
  }

  // Stereographic projection maps circles to circles: a plane of dip d plots as an arc of radius
  // R/cos d centred R·tan d from the centre, opposite the dip direction (common practice: the
  // construction of the equal-angle net).
  for (const dip of [10, 35, 70]) {
    it(`greatCirclePathData({dipDirection: 200, dip: ${dip}}, 'equal-angle') is an arc of radius R/cos(dip)`, () => {
      const [path] = subpaths(greatCirclePathData({ dipDirection: 200, dip }, 'equal-angle', FRAME, 90));
      const t = (200 * Math.PI) / 180;
      const centre = { x: -Math.tan((dip * Math.PI) / 180) * Math.sin(t), y: -Math.tan((dip * Math.PI) / 180) * Math.cos(t) };
      for (const p of path) {
        const q = toNet(p);
        expectClose(Math.hypot(q.x - centre.x, q.y - centre.y), 1 / Math.cos((dip * Math.PI) / 180), 1e-4, 'distance from the arc centre');
      }
    });
  }

  it('greatCirclesPathData(planes, kind) holds one subpath per plane', () => {
    const d = greatCirclesPathData([{ dipDirection: 10, dip: 20 }, { dipDirection: 100, dip: 50 }, { dipDirection: 300, dip: 80 }], 'equal-area', FRAME, 20);
    expect(subpaths(d).length).toBe(3);
  });
});

describe('smallCirclePathData', () => {
  // A cone of 30° about the vertical is the circle of plunge 60: REFERENCES.md net radii.
  for (const [kind, r] of [['equal-area', 0.366025], ['equal-angle', 0.267949]] as const) {
    it(`smallCirclePathData({trend: 0, plunge: 90}, 30, '${kind}') is the circle of radius ${r}`, () => {
      const paths = subpaths(smallCirclePathData({ trend: 0, plunge: 90 }, 30, kind, FRAME, 72));
      expect(paths.length).toBe(1);
      for (const p of paths[0]) expectClose(Math.hypot(toNet(p).x, toNet(p).y), r, 1e-4, 'radius');
    });
  }

  it('smallCirclePathData(axis, 20, kind) about a horizontal axis wraps to the opposite side of the primitive', () => {
    const paths = subpaths(smallCirclePathData({ trend: 90, plunge: 0 }, 20, 'equal-area', FRAME, 72));
    expect(paths.length).toBe(2);
    const xs = paths.map((p) => toNet(p[Math.floor(p.length / 2)]).x);
    expect(Math.min(...xs)).toBeLessThan(-0.7); // near west
    expect(Math.max(...xs)).toBeGreaterThan(0.7); // near east
  });
});

describe('pointsPathData and trianglesPathData', () => {
  it('pointsPathData(xy, frame) writes one zero-length segment per point, in tenths of a unit', () => {
    fc.assert(
      fc.property(fc.array(fc.tuple(fc.double({ min: 0, max: 360, noNaN: true }), fc.double({ min: 0, max: 90, noNaN: true })), { minLength: 1, maxLength: 40 }), (rows) => {
        const xyz = new Float64Array(rows.flatMap(([trend, plunge]) => {
          const v = lineToVector({ trend, plunge });
          return [v.x, v.y, v.z];
        }));
        const xy = projectVectors(xyz, 'equal-area');
        const d = pointsPathData(xy, FRAME);
        const dots = [...d.matchAll(/M(-?\d+) (-?\d+)h0/g)];
        expect(dots.length).toBe(rows.length);
        expect(d).toBe(dots.map((m) => m[0]).join(''));
        rows.forEach(([trend, plunge], i) => {
          const ref = reference({ trend, plunge }, 'equal-area');
          expectClose(Number(dots[i][1]) / POINTS_SCALE, FRAME.cx + FRAME.r * ref.x, 0.051, `dot ${i} x`);
          expectClose(Number(dots[i][2]) / POINTS_SCALE, FRAME.cy - FRAME.r * ref.y, 0.051, `dot ${i} y`);
        });
      }),
      { numRuns: 40 },
    );
  });

  it('pointsPathData(empty) is the empty string', () => {
    expect(pointsPathData(new Float64Array(0), FRAME)).toBe('');
  });

  it('trianglesPathData(xy, frame, size) centres a triangle of side size on each point', () => {
    const xy = Float64Array.of(0, 0, 0.5, -0.25);
    const tris = subpaths(trianglesPathData(xy, FRAME, 9));
    expect(tris.length).toBe(2);
    tris.forEach((t, i) => {
      const c = netToSvg({ x: xy[2 * i], y: xy[2 * i + 1] }, FRAME);
      expectClose((t[0].x + t[1].x + t[2].x) / 3, c.x, 0.01, 'centroid x');
      expectClose((t[0].y + t[1].y + t[2].y) / 3, c.y, 0.01, 'centroid y');
      expectClose(Math.hypot(t[1].x - t[2].x, t[1].y - t[2].y), 9, 0.01, 'base');
    });
  });
});

describe('markers and frame', () => {
  it('markerPathData(symbol, size) gives shapes centred on the origin and rejects unknown symbols', () => {
    expect(markerPathData('square', 10)).toBe('M-5 -5h10v10h-10Z');
    expect(markerPathData('disc', 10)).toBe(circlePathData(0, 0, 5));
    expect(() => markerPathData('star' as never, 10)).toThrow(/symbol "star" is not known/);
  });

  // Plunge rings at 10° spacing: REFERENCES.md net radii for 30° and 60°.
  for (const [kind, r30, r60] of [['equal-area', 0.707107, 0.366025], ['equal-angle', 0.57735, 0.267949]] as const) {
    it(`gridPathData('${kind}', frame) draws plunge circles at the radii of 30° and 60° plunge`, () => {
      const d = gridPathData(kind, FRAME);
      const rings = [...d.matchAll(/A([\d.]+) /g)].map((m) => Number(m[1]) / FRAME.r);
      expect(rings.length).toBe(16); // 8 rings of two arcs
      expect(rings.some((r) => Math.abs(r - r30) < 1e-4)).toBe(true);
      expect(rings.some((r) => Math.abs(r - r60) < 1e-4)).toBe(true);
      expect((d.match(/L/g) ?? []).length).toBe(36); // a trend line every 10°
    });
  }

  it('gridPathData(kind, frame, 7) rejects a spacing that does not divide 90', () => {
    expect(() => gridPathData('equal-area', FRAME, 7)).toThrow(/spacing 7/);
  });

  it('ticksPathData(frame, 9) draws four ticks just outside the primitive at N, E, S, W', () => {
    const ticks = subpaths(ticksPathData(FRAME, 9));
    expect(ticks.length).toBe(4);
    for (const [a, b] of ticks) {
      expectClose(Math.hypot(a.x - FRAME.cx, a.y - FRAME.cy), FRAME.r, 1e-9, 'tick start on the primitive');
      expectClose(Math.hypot(b.x - FRAME.cx, b.y - FRAME.cy), FRAME.r + 9, 1e-9, 'tick end');
    }
    expect(ticks[0][1].y).toBeLessThan(FRAME.cy - FRAME.r); // the first tick is north, at the top
    expect(centreCrossPathData(FRAME, 5)).toBe('M201 213H211M206 208V218');
  });
});
