import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import proj4 from 'proj4';
import {
  netRadius,
  projectLine,
  projectPath,
  projectVector,
  projectVectors,
  unprojectPoint,
  type Hemisphere,
  type NetKind,
  type NetPoint,
} from '../../src/core/netProjection';
import { greatCirclePath, smallCirclePath } from '../../src/core/geometry';
import { lineToVector, vec3 } from '../../src/core/vectors';
import type { Vec3 } from '../../src/core/types';
import { expectClose, expectDeepClose } from '../helpers/tolerance';

const DEG = Math.PI / 180;
const KINDS: NetKind[] = ['equal-area', 'equal-angle'];
const HEMISPHERES: Hemisphere[] = ['lower', 'upper'];

/**
 * Lambert azimuthal equal-area projection of the sphere, general (oblique) aspect, as printed
 * in Snyder (1987), Map Projections: A Working Manual, USGS Professional Paper 1395, ch. 24:
 * k' = sqrt(2 / (1 + sin φ1 sin φ + cos φ1 cos φ cos(λ − λ0))),
 * x = R k' cos φ sin(λ − λ0), y = R k' (cos φ1 sin φ − sin φ1 cos φ cos(λ − λ0)).
 * (Formulas written from memory; the published numerical example below confirms them.)
 */
function snyderLaeaForward(R: number, lat0: number, lon0: number, lat: number, lon: number): { x: number; y: number; k: number } {
  const [p1, p, dl] = [lat0 * DEG, lat * DEG, (lon - lon0) * DEG];
  const k = Math.sqrt(2 / (1 + Math.sin(p1) * Math.sin(p) + Math.cos(p1) * Math.cos(p) * Math.cos(dl)));
  return {
    x: R * k * Math.cos(p) * Math.sin(dl),
    y: R * k * (Math.cos(p1) * Math.sin(p) - Math.sin(p1) * Math.cos(p) * Math.cos(dl)),
    k,
  };
}

/**
 * Inverse of the above, Snyder (1987) ch. 20 and 24: rho = sqrt(x² + y²), c = 2 asin(rho / 2R),
 * φ = asin(cos c sin φ1 + y sin c cos φ1 / rho), λ = λ0 + atan2(x sin c, rho cos φ1 cos c − y sin φ1 sin c).
 */
function snyderLaeaInverse(R: number, lat0: number, lon0: number, x: number, y: number): { lat: number; lon: number } {
  const p1 = lat0 * DEG;
  const rho = Math.hypot(x, y);
  const c = 2 * Math.asin(rho / (2 * R));
  const lat = Math.asin(Math.cos(c) * Math.sin(p1) + (y * Math.sin(c) * Math.cos(p1)) / rho);
  const lon = lon0 * DEG + Math.atan2(x * Math.sin(c), rho * Math.cos(p1) * Math.cos(c) - y * Math.sin(p1) * Math.sin(c));
  // Snyder adjusts λ into −180°..180° by adding or subtracting 360°.
  const lonDeg = lon / DEG;
  return { lat: lat / DEG, lon: lonDeg - 360 * Math.round(lonDeg / 360) };
}

// proj4js's laea gives NaN unless +x_0/+y_0 are spelt out (seen here with proj4 2.22.0), and the
// source must be a sphere of the same radius so that no datum shift is applied.
const SNYDER_LAEA = '+proj=laea +lat_0=40 +lon_0=-100 +R=3 +x_0=0 +y_0=0 +units=m +no_defs';
const SPHERE3 = '+proj=longlat +R=3 +no_defs';
const SPHERE1 = '+proj=longlat +R=1 +no_defs';

describe('Snyder (1987) Lambert azimuthal equal-area example, reproduced outside Foldlens', () => {
  // Snyder (1987), USGS PP 1395, Appendix A numerical example (sphere): R = 3, centre 40°N 100°W,
  // point 20°S 100°E -> k' = 4.3912175, x = -4.2339303, y = 4.0257775 (published).
  it('snyderLaeaForward(3, 40, -100, -20, 100) reproduces the published x, y and k\'', () => {
    const got = snyderLaeaForward(3, 40, -100, -20, 100);
    expectClose(got.x, -4.2339303, 1e-7, 'x');
    expectClose(got.y, 4.0257775, 1e-7, 'y');
    expectClose(got.k, 4.3912175, 1e-7, "k'");
  });

  it('snyderLaeaInverse(3, 40, -100, -4.2339303, 4.0257775) gives back 20°S 100°E (published inverse)', () => {
    const got = snyderLaeaInverse(3, 40, -100, -4.2339303, 4.0257775);
    expectClose(got.lat, -20, 1e-6, 'lat');
    expectClose(got.lon, 100, 1e-6, 'lon');
  });

  it('proj4(sphere R=3 -> laea 40N 100W) gives the published x, y and inverts back (reference library)', () => {
    const [x, y] = proj4(SPHERE3, SNYDER_LAEA, [100, -20]);
    expectClose(x, -4.2339303, 1e-7, 'x');
    expectClose(y, 4.0257775, 1e-7, 'y');
    const [lon, lat] = proj4(SPHERE3, SNYDER_LAEA).inverse([x, y]);
    expectClose(lon, 100, 1e-9, 'lon');
    expectClose(lat, -20, 1e-9, 'lat');
  });
});

/**
 * Our nets as polar aspects of the sphere. Lower hemisphere: the centre (straight down) is the
 * south pole, a line trend t plunge p is the point lon = t, lat = −p; Snyder's south-polar
 * formulas put lon 0 at the top and lon 90 on the right, as our north and east.
 * Upper hemisphere: the centre (straight up) is the north pole and the upward end of the line
 * (azimuth t + 180, elevation p) is lat = p; the north-polar map puts lon 180 at the top and
 * lon 90 on the right, so lon = 180 − (t + 180) = −t.
 */
function asLonLat(trend: number, plunge: number, hemisphere: Hemisphere): [number, number] {
  return hemisphere === 'lower' ? [trend, -plunge] : [-trend, plunge];
}

describe('projectVector against proj4 polar laea and stere and Snyder\'s formulas (reference library)', () => {
  const laea = {
    lower: proj4(SPHERE1, '+proj=laea +lat_0=-90 +lon_0=0 +R=1 +x_0=0 +y_0=0 +no_defs'),
    upper: proj4(SPHERE1, '+proj=laea +lat_0=90 +lon_0=0 +R=1 +x_0=0 +y_0=0 +no_defs'),
  };
  const stere = {
    lower: proj4(SPHERE1, '+proj=stere +lat_0=-90 +lon_0=0 +k_0=1 +R=1 +x_0=0 +y_0=0 +no_defs'),
    upper: proj4(SPHERE1, '+proj=stere +lat_0=90 +lon_0=0 +k_0=1 +R=1 +x_0=0 +y_0=0 +no_defs'),
  };
  const lineArb = fc.record({ trend: fc.double({ min: 0, max: 359.999, noNaN: true }), plunge: fc.double({ min: 0, max: 90, noNaN: true }) });

  // A horizontal line has two ends on the primitive and projectVector keeps the end it is given,
  // while the upper-net mapping above names the other end: the upper runs leave out lines within
  // 1e-9° of horizontal (their z rounds to 0). Horizontal lines are checked in 'orientation of the net'.
  const lineArbFor = (hemisphere: Hemisphere): fc.Arbitrary<{ trend: number; plunge: number }> =>
    hemisphere === 'lower' ? lineArb : lineArb.filter((l) => l.plunge > 1e-9);

  for (const hemisphere of HEMISPHERES) {
    it(`projectVector(v, 'equal-area', '${hemisphere}') equals proj4 polar laea (lat_0 ${hemisphere === 'lower' ? -90 : 90}) scaled by 1/(R·sqrt 2), on 500 random lines`, () => {
      fc.assert(
        fc.property(lineArbFor(hemisphere), ({ trend, plunge }) => {
          const ours = projectVector(lineToVector({ trend, plunge }), 'equal-area', hemisphere);
          const [x, y] = laea[hemisphere].forward(asLonLat(trend, plunge, hemisphere));
          expectClose(ours.x, x / Math.SQRT2, 1e-12, 'x');
          expectClose(ours.y, y / Math.SQRT2, 1e-12, 'y');
        }),
        { numRuns: 500 },
      );
    });

    it(`projectVector(v, 'equal-angle', '${hemisphere}') equals proj4 polar stere (k_0 = 1) scaled by 1/(2R), on 500 random lines`, () => {
      fc.assert(
        fc.property(lineArbFor(hemisphere), ({ trend, plunge }) => {
          const ours = projectVector(lineToVector({ trend, plunge }), 'equal-angle', hemisphere);
          const [x, y] = stere[hemisphere].forward(asLonLat(trend, plunge, hemisphere));
          expectClose(ours.x, x / 2, 1e-12, 'x');
          expectClose(ours.y, y / 2, 1e-12, 'y');
        }),
        { numRuns: 500 },
      );
    });
  }

  it("projectVector(v, 'equal-area') equals Snyder's general formulas at lat_0 = -90, scaled by 1/(R·sqrt 2)", () => {
    fc.assert(
      fc.property(lineArb, ({ trend, plunge }) => {
        fc.pre(plunge < 89.99); // the general formula's atan2 of the centre is undefined; the centre is checked below
        const ours = projectVector(lineToVector({ trend, plunge }), 'equal-area');
        const s = snyderLaeaForward(1, -90, 0, -plunge, trend);
        expectClose(ours.x, s.x / Math.SQRT2, 1e-12, 'x');
        expectClose(ours.y, s.y / Math.SQRT2, 1e-12, 'y');
      }),
      { numRuns: 300 },
    );
  });
});

describe('netRadius / projectLine radii', () => {
  // REFERENCES.md (derived from Snyder's polar rho, scaled to the primitive): theta = 90 - plunge,
  // equal-area r = sqrt(2)·sin(theta/2), equal-angle r = tan(theta/2).
  const rows: { plunge: number; kind: NetKind; expected: number; tol?: number }[] = [
    { plunge: 30, kind: 'equal-area', expected: 0.707107 },
    { plunge: 30, kind: 'equal-angle', expected: 0.57735 },
    { plunge: 45, kind: 'equal-area', expected: 0.541196 },
    { plunge: 45, kind: 'equal-angle', expected: 0.414214 },
    { plunge: 60, kind: 'equal-area', expected: 0.366025 },
    { plunge: 60, kind: 'equal-angle', expected: 0.267949 },
    // The primitive and the centre: definitions of the nets (common practice).
    { plunge: 0, kind: 'equal-area', expected: 1, tol: 1e-12 },
    { plunge: 90, kind: 'equal-angle', expected: 0, tol: 1e-12 },
  ];
  for (const { plunge, kind, expected, tol = 1e-6 } of rows) {
    it(`netRadius(${plunge}, '${kind}') and |projectLine(123/${plunge})| are ${expected} (REFERENCES.md)`, () => {
      expectClose(netRadius(plunge, kind), expected, tol, 'netRadius');
      for (const hemisphere of HEMISPHERES) {
        const p = projectLine({ trend: 123, plunge }, kind, hemisphere);
        expectClose(Math.hypot(p.x, p.y), expected, tol, `projectLine radius, ${hemisphere}`);
      }
    });
  }

  it('netRadius(95, ...) and an unknown kind throw errors naming the value', () => {
    expect(() => netRadius(95, 'equal-area')).toThrow(/plunge is 95/);
    expect(() => netRadius(10, 'conformal' as NetKind)).toThrow(/kind is "conformal"; expected "equal-area" or "equal-angle"/);
  });
});

describe('orientation of the net', () => {
  // Screen convention of Foldlens: x east, y north, north at the top (common practice for nets).
  const rows = [
    { line: { trend: 0, plunge: 0 }, expected: { x: 0, y: 1 } },
    { line: { trend: 90, plunge: 0 }, expected: { x: 1, y: 0 } },
    { line: { trend: 180, plunge: 0 }, expected: { x: 0, y: -1 } },
    { line: { trend: 270, plunge: 0 }, expected: { x: -1, y: 0 } },
    { line: { trend: 0, plunge: 90 }, expected: { x: 0, y: 0 } },
  ];
  for (const kind of KINDS) {
    for (const { line, expected } of rows) {
      it(`projectLine(${line.trend}/${line.plunge}, '${kind}') is (${expected.x}, ${expected.y})`, () => {
        expectDeepClose(projectLine(line, kind), expected, 1e-12);
      });
    }
  }

  it("projectLine(000/30, 'equal-area', 'upper') plots in the south: its upward end points to 180 (common practice)", () => {
    expectDeepClose(projectLine({ trend: 0, plunge: 30 }, 'equal-area', 'upper'), { x: 0, y: -0.707107 }, 1e-6);
  });

  it('projectVector flips an upward vector: (−1, 0, −1) plots like (1, 0, 1), at 000/45', () => {
    expectDeepClose(projectVector(vec3(-1, 0, -1), 'equal-angle'), projectVector(vec3(1, 0, 1), 'equal-angle'), 1e-15);
    expectDeepClose(projectVector(vec3(-1, 0, -1), 'equal-angle'), { x: 0, y: 0.414214 }, 1e-6);
  });

  it('projectVector ignores the length of v: (0, 3, 3) and (0, 1, 1) give the same point', () => {
    expectDeepClose(projectVector(vec3(0, 3, 3), 'equal-area'), projectVector(vec3(0, 1, 1), 'equal-area'), 1e-15);
  });

  it('projectVector of a zero or NaN vector, and an unknown hemisphere, throw errors saying what was expected', () => {
    expect(() => projectVector(vec3(0, 0, 0), 'equal-area')).toThrow(/v is \(0, 0, 0\); expected a non-zero finite vector/);
    expect(() => projectVector(vec3(Number.NaN, 0, 1), 'equal-area')).toThrow(RangeError);
    expect(() => projectVector(vec3(0, 0, 1), 'equal-area', 'middle' as Hemisphere)).toThrow(/hemisphere is "middle"/);
    expect(() => projectLine({ trend: 10, plunge: 91 }, 'equal-area')).toThrow(/plunge is 91/);
  });
});

describe('unprojectPoint and round trips', () => {
  const inDisc = fc
    .tuple(fc.double({ min: -1, max: 1, noNaN: true }), fc.double({ min: -1, max: 1, noNaN: true }))
    .filter(([x, y]) => x * x + y * y <= 1)
    .map(([x, y]) => ({ x, y }));
  const unitArb = fc
    .tuple(fc.double({ min: -1, max: 1, noNaN: true }), fc.double({ min: -1, max: 1, noNaN: true }), fc.double({ min: -1, max: 1, noNaN: true }))
    .filter(([x, y, z]) => Math.hypot(x, y, z) > 0.1)
    .map(([x, y, z]) => {
      const n = Math.hypot(x, y, z);
      return vec3(x / n, y / n, z / n);
    });

  for (const kind of KINDS) {
    for (const hemisphere of HEMISPHERES) {
      it(`unprojectPoint(projectVector(v, '${kind}', '${hemisphere}')) gives v in the ${hemisphere} hemisphere (property)`, () => {
        const s = hemisphere === 'lower' ? 1 : -1;
        fc.assert(
          fc.property(unitArb, (v) => {
            const want = s * v.z < 0 ? vec3(-v.x, -v.y, -v.z) : v;
            const back = unprojectPoint(projectVector(v, kind, hemisphere), kind, hemisphere) as Vec3;
            expect(back).not.toBeNull();
            expectDeepClose(back, want, 1e-12);
          }),
        );
      });

      it(`projectVector(unprojectPoint(p, '${kind}', '${hemisphere}')) gives p back for any point of the disc (property)`, () => {
        fc.assert(
          fc.property(inDisc, (p) => {
            const v = unprojectPoint(p, kind, hemisphere) as Vec3;
            expectClose(Math.hypot(v.x, v.y, v.z), 1, 1e-12, 'unit length');
            expectDeepClose(projectVector(v, kind, hemisphere), p, 1e-12);
          }),
        );
      });
    }
  }

  it("unprojectPoint({x: 1, y: 0}, 'equal-area') is east, horizontal; the centre is straight down (or up on the upper net)", () => {
    expectDeepClose(unprojectPoint({ x: 1, y: 0 }, 'equal-area'), { x: 0, y: 1, z: 0 }, 1e-15);
    expectDeepClose(unprojectPoint({ x: 0, y: 0 }, 'equal-angle'), { x: 0, y: 0, z: 1 }, 0);
    expectDeepClose(unprojectPoint({ x: 0, y: 0 }, 'equal-angle', 'upper'), { x: 0, y: 0, z: -1 }, 0);
  });

  it('unprojectPoint of a point outside the primitive (0.8, 0.8) returns null; a NaN coordinate throws', () => {
    expect(unprojectPoint({ x: 0.8, y: 0.8 }, 'equal-area')).toBeNull();
    expect(unprojectPoint({ x: 1 + 1e-6, y: 0 }, 'equal-angle', 'upper')).toBeNull();
    expect(() => unprojectPoint({ x: Number.NaN, y: 0 }, 'equal-area')).toThrow(/point is \(NaN, 0\); expected finite net coordinates/);
  });
});

describe('properties of the two nets', () => {
  /** Shoelace area of a closed polygon. */
  const polygonArea = (pts: NetPoint[]): number =>
    Math.abs(pts.reduce((sum, p, i) => sum + p.x * pts[(i + 1) % pts.length].y - pts[(i + 1) % pts.length].x * p.y, 0)) / 2;

  it("projectPath(smallCirclePath(axis, a), 'equal-area') encloses π(1 − cos a): equal area for caps anywhere in the hemisphere", () => {
    // Derived from the definition of an equal-area projection (Snyder 1987): the hemisphere (area 2π)
    // maps onto the unit disc (area π), so every region keeps half its spherical area; a cap of
    // half-angle a has area 2π(1 − cos a).
    fc.assert(
      fc.property(fc.double({ min: 0, max: 360, noNaN: true }), fc.double({ min: 5, max: 60, noNaN: true }), fc.double({ min: 0.001, max: 1, noNaN: true }), (trend, half, f) => {
        const axis = { trend, plunge: half + (90 - half) * f }; // keeps the whole cap below the horizontal
        const [ring] = projectPath(smallCirclePath(axis, half, 2000), 'equal-area');
        expectClose(polygonArea(ring.slice(0, -1)), Math.PI * (1 - Math.cos(half * DEG)), 1e-5);
      }),
      { numRuns: 40 },
    );
  });

  it("projectPath(smallCirclePath(axis, a), 'equal-angle') is a circle: circles stay circles on the stereographic net (common practice)", () => {
    fc.assert(
      fc.property(fc.double({ min: 0, max: 360, noNaN: true }), fc.double({ min: 2, max: 40, noNaN: true }), fc.double({ min: 0, max: 1, noNaN: true }), (trend, half, f) => {
        const axis = { trend, plunge: half + (90 - half) * f }; // keeps the whole cap below the horizontal
        const [ring] = projectPath(smallCirclePath(axis, half, 24), 'equal-angle');
        // Circumcentre of three points of the ring; every other point must lie at the same distance.
        const [a, b, c] = [ring[0], ring[8], ring[16]];
        const d = 2 * (a.x * (b.y - c.y) + b.x * (c.y - a.y) + c.x * (a.y - b.y));
        const sq = (p: NetPoint): number => p.x * p.x + p.y * p.y;
        const ux = (sq(a) * (b.y - c.y) + sq(b) * (c.y - a.y) + sq(c) * (a.y - b.y)) / d;
        const uy = (sq(a) * (c.x - b.x) + sq(b) * (a.x - c.x) + sq(c) * (b.x - a.x)) / d;
        const r = Math.hypot(a.x - ux, a.y - uy);
        for (const p of ring) expectClose(Math.hypot(p.x - ux, p.y - uy), r, 1e-9, 'distance to centre');
      }),
      { numRuns: 100 },
    );
  });
});

describe('projectVectors', () => {
  it('projectVectors(xyz, kind, out, hemisphere) equals projectVector point by point, including flipped and unnormalised vectors (property)', () => {
    const vecArb = fc
      .tuple(fc.double({ min: -5, max: 5, noNaN: true }), fc.double({ min: -5, max: 5, noNaN: true }), fc.double({ min: -5, max: 5, noNaN: true }))
      .filter(([x, y, z]) => Math.hypot(x, y, z) > 1e-3);
    fc.assert(
      fc.property(fc.array(vecArb, { maxLength: 40 }), fc.constantFrom(...KINDS), fc.constantFrom(...HEMISPHERES), (vs, kind, hemisphere) => {
        const xyz = Float64Array.from(vs.flat());
        const out = projectVectors(xyz, kind, undefined, hemisphere);
        expect(out).toHaveLength(2 * vs.length);
        vs.forEach(([x, y, z], i) => {
          const p = projectVector(vec3(x, y, z), kind, hemisphere);
          expectClose(out[2 * i], p.x, 1e-14, `x[${i}]`);
          expectClose(out[2 * i + 1], p.y, 1e-14, `y[${i}]`);
        });
      }),
    );
  });

  it('projectVectors writes into a given out buffer and returns it, leaving xyz unchanged', () => {
    const xyz = new Float64Array([0, 0, 1, 1, 0, 0, 0, -2, 0]);
    const copy = xyz.slice();
    const out = new Float64Array(8).fill(7);
    const got = projectVectors(xyz, 'equal-area', out);
    expect(got).toBe(out);
    expect(Array.from(xyz)).toEqual(Array.from(copy));
    expectDeepClose(Array.from(out), [0, 0, 0, 1, -1, 0, 7, 7], 1e-15);
  });

  it('projectVectors rejects a length of 4, a short out buffer and a zero vector at index 1, with the numbers in the message', () => {
    expect(() => projectVectors(new Float64Array(4), 'equal-area')).toThrow(/length 4; expected a multiple of 3/);
    expect(() => projectVectors(new Float64Array([0, 0, 1, 0, 0, 1]), 'equal-area', new Float64Array(3))).toThrow(/out has length 3; expected at least 4/);
    expect(() => projectVectors(new Float64Array([0, 0, 1, 0, 0, 0]), 'equal-angle')).toThrow(/vector 1 is \(0, 0, 0\)/);
  });
});

describe('projectPath', () => {
  const radius = (p: NetPoint): number => Math.hypot(p.x, p.y);

  it("projectPath(greatCirclePath(030/50), 'equal-area') is one part from rim to rim, the same points as projectVector", () => {
    const path = greatCirclePath({ dipDirection: 30, dip: 50 }, 36);
    const parts = projectPath(path, 'equal-area');
    expect(parts).toHaveLength(1);
    expect(parts[0]).toHaveLength(37);
    parts[0].forEach((p, i) => expectDeepClose(p, projectVector(path[i], 'equal-area'), 1e-15, `point ${i}`));
    expectClose(radius(parts[0][0]), 1, 1e-12, 'start on the primitive');
    expectClose(radius(parts[0][36]), 1, 1e-12, 'end on the primitive');
  });

  it("projectPath(greatCirclePath(030/50), 'equal-angle', 'upper') is one part, the lower-hemisphere arc drawn through its upper ends", () => {
    const path = greatCirclePath({ dipDirection: 30, dip: 50 }, 36);
    const parts = projectPath(path, 'equal-angle', 'upper');
    expect(parts).toHaveLength(1);
    expect(parts[0]).toHaveLength(37);
    // Every vertex is plotted through its opposite end, the horizontal end points included (so the
    // arc stays continuous), which is where projectVector plots the negated vector.
    parts[0].forEach((p, i) => expectDeepClose(p, projectVector(vec3(-path[i].x, -path[i].y, -path[i].z), 'equal-angle', 'upper'), 1e-15, `point ${i}`));
    // The arc is the lower-net arc turned through 180° about the centre.
    const lower = projectPath(path, 'equal-angle')[0];
    expectDeepClose(parts[0][18], { x: -lower[18].x, y: -lower[18].y }, 1e-15, 'middle point');
  });

  it('projectPath of a cone about the horizontal axis 000/00 splits into two arcs that jump across the net at the primitive', () => {
    // The cone of 30° about a horizontal north axis: half its lines point up, so their lower ends are
    // near south; on the net the cone shows as two arcs, one by north and one by south (common practice).
    for (const kind of KINDS) {
      const parts = projectPath(smallCirclePath({ trend: 0, plunge: 0 }, 30, 72), kind);
      expect(parts).toHaveLength(2);
      for (const part of parts) {
        expectClose(radius(part[0]), 1, 1e-12, 'part starts on the primitive');
        expectClose(radius(part[part.length - 1]), 1, 1e-12, 'part ends on the primitive');
      }
      // Where one arc leaves the net the other enters at the diametrically opposite point.
      expectDeepClose(parts[1][0], { x: -parts[0][parts[0].length - 1].x, y: -parts[0][parts[0].length - 1].y }, 1e-12);
      const [northArc, southArc] = parts[0][1].y > 0 ? parts : [parts[1], parts[0]];
      expect(northArc.every((p) => p.y >= -1e-12)).toBe(true);
      expect(southArc.every((p) => p.y <= 1e-12)).toBe(true);
      // The crossings are the lines 030/00 and 330/00 on the rim (the cone meets the horizontal 30° from its axis).
      const ends = northArc.filter((p) => Math.abs(radius(p) - 1) < 1e-12).map((p) => Math.round((Math.atan2(p.x, p.y) / DEG) * 1e6) / 1e6);
      expect(ends.sort((a, b) => a - b)).toEqual([-30, 30]);
    }
  });

  it("projectPath(..., {otherHemisphere: 'omit'}) keeps only the lower arc of that cone, as one joined part", () => {
    const parts = projectPath(smallCirclePath({ trend: 0, plunge: 0 }, 30, 72), 'equal-area', 'lower', { otherHemisphere: 'omit' });
    expect(parts).toHaveLength(1);
    expect(parts[0].every((p) => p.y > 0)).toBe(true);
  });

  it('projectPath of a cone wholly below the horizontal is one closed ring; an empty path gives no parts', () => {
    const parts = projectPath(smallCirclePath({ trend: 100, plunge: 60 }, 20, 30), 'equal-angle');
    expect(parts).toHaveLength(1);
    expect(parts[0]).toHaveLength(31);
    expectDeepClose(parts[0][30], parts[0][0], 1e-15);
    expect(projectPath([], 'equal-area')).toEqual([]);
  });

  it('projectPath with a zero vector at index 2 or an unknown option throws, naming it', () => {
    expect(() => projectPath([vec3(0, 0, 1), vec3(1, 0, 1), vec3(0, 0, 0)], 'equal-area')).toThrow(/vectors\[2\] is \(0, 0, 0\)/);
    expect(() => projectPath([vec3(0, 0, 1)], 'equal-area', 'lower', { otherHemisphere: 'mirror' as 'flip' })).toThrow(/otherHemisphere is "mirror"/);
  });
});
