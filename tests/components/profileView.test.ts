import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { profileFrame, projectDownPlunge } from '../../src/core/downPlunge';
import { toDegrees } from '../../src/core/math';
import { normalizeAzimuth } from '../../src/core/math';
import { applyZoom, compassPoint, edgeAzimuths, exaggerationOf, fitAffine, fromScreen, profileLayout, scaleBar, toScreen, type PlotBox } from '../../src/components/profile/profileView';
import { expectAzimuth, expectClose } from '../helpers/tolerance';

const BOX: PlotBox = { left: 16, top: 66, width: 640, height: 300 };

describe('fitAffine(extent, box) draws profiles at true scale', () => {
  it('fitAffine(extent, box) puts projectDownPlunge points at x\'·sx + tx, y\'·sy + ty with |sy| = sx, so drawn distances are true distances times one scale (REFERENCES.md, axis 090/30)', () => {
    // REFERENCES.md "Profiles" (derived): axis 090/30 takes (100, 0, 0) to (0, 50) and (0, 0, 100) to (0, 86.603).
    const p = projectDownPlunge(new Float64Array([100, 0, 0, 0, 0, 100]), { trend: 90, plunge: 30 });
    expectClose(p[1], 50, 5e-4, 'first y\'');
    expectClose(p[4], 86.603, 5e-4, 'second y\'');
    const a = fitAffine({ minX: -200, minY: -100, maxX: 200, maxY: 100 }, BOX);
    expect(exaggerationOf(a)).toBe(1);
    const [x1, y1] = toScreen(a, p[0], p[1]);
    const [x2, y2] = toScreen(a, p[3], p[4]);
    // Same x' (0) gives the same drawn x; the drawn gap is 36.603 m times the one scale, upward on the page.
    expectClose(x1 - x2, 0, 1e-9, 'drawn x difference');
    expectClose(y1 - y2, 36.603 * a.sx, 5e-4 * a.sx, 'drawn y difference (SVG y grows downward)');
  });

  it('fitAffine(extent, box) centres the data and fits the larger span with 4% padding (layoutProfile)', () => {
    const a = fitAffine({ minX: 0, minY: 0, maxX: 1000, maxY: 100 }, BOX);
    // Width limits: 1000 m + 2 × 40 m padding across 640 units (padding = 0.04 × larger span).
    expectClose(a.sx, 640 / 1080, 1e-12, 'scale');
    const [cx, cy] = toScreen(a, 500, 50);
    expectClose(cx, BOX.left + BOX.width / 2, 1e-9, 'centre x');
    expectClose(cy, BOX.top + BOX.height / 2, 1e-9, 'centre y');
  });

  it('fitAffine(extent, box, ve) stretches heights only: |sy| = ve·sx', () => {
    const a = fitAffine({ minX: 0, minY: 600, maxX: 4000, maxY: 900 }, BOX, 2);
    expectClose(exaggerationOf(a), 2, 1e-12, 'ratio');
    expect(() => fitAffine(null, BOX, 0)).toThrow(/vertical exaggeration 0 is not a positive number/);
  });

  it('fitAffine(null, box) gives a drawable view for an empty profile', () => {
    const a = fitAffine(null, BOX);
    expect(Number.isFinite(a.sx) && Number.isFinite(a.tx) && Number.isFinite(a.sy) && Number.isFinite(a.ty)).toBe(true);
  });

  it('fromScreen(applyZoom(a, t), toScreen(applyZoom(a, t), x, y)) gives (x, y) back for any zoom (property)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0.01, max: 10, noNaN: true }),
        fc.double({ min: -1e4, max: 1e4, noNaN: true }),
        fc.double({ min: 0.5, max: 400, noNaN: true }),
        fc.double({ min: -1e4, max: 1e4, noNaN: true }),
        fc.double({ min: -1e4, max: 1e4, noNaN: true }),
        fc.double({ min: -5e4, max: 5e4, noNaN: true }),
        fc.double({ min: -5e4, max: 5e4, noNaN: true }),
        (s, tx, k, zx, zy, x, y) => {
          const a = applyZoom({ sx: s, tx, sy: -2 * s, ty: 300 }, { k, x: zx, y: zy });
          const [X, Y] = toScreen(a, x, y);
          const [bx, by] = fromScreen(a, X, Y);
          return Math.abs(bx - x) < 1e-6 * (1 + Math.abs(x)) && Math.abs(by - y) < 1e-6 * (1 + Math.abs(y));
        },
      ),
    );
  });
});

describe('scaleBar(affine, maxLength)', () => {
  const rows: { sx: number; max: number; metres: number; source: string }[] = [
    // Round lengths 1, 2 or 5 × 10^k (common practice for scale bars), the largest that fits.
    { sx: 0.2, max: 150, metres: 500, source: '150 units = 750 m: 500 m fits, 1 km does not' },
    { sx: 0.2, max: 200, metres: 1000, source: '200 units = 1000 m exactly' },
    { sx: 0.05, max: 160, metres: 2000, source: '160 units = 3200 m: 2 km' },
    { sx: 3, max: 100, metres: 20, source: '100 units = 33.3 m: 20 m' },
  ];
  for (const row of rows) {
    it(`scaleBar({sx: ${row.sx}}, ${row.max}) is ${row.metres} m drawn ${row.metres * row.sx} units long (${row.source})`, () => {
      const bar = scaleBar({ sx: row.sx, tx: 0, sy: -row.sx, ty: 0 }, row.max);
      expect(bar.metres).toBe(row.metres);
      expectClose(bar.length, row.metres * row.sx, 1e-9, 'length');
      expect(bar.length).toBeLessThanOrEqual(row.max + 1e-9);
    });
  }

  it('scaleBar(applyZoom(a, {k: 4})) shows a shorter round length after zooming in, drawn at the zoomed scale', () => {
    const a = { sx: 0.2, tx: 0, sy: -0.2, ty: 0 };
    const zoomed = applyZoom(a, { k: 4, x: 0, y: 0 });
    const bar = scaleBar(zoomed, 160);
    expect(bar.metres).toBe(200);
    expectClose(bar.length, 200 * 0.8, 1e-9, 'length');
  });
});

describe('edge labels and layout', () => {
  it('edgeAzimuths(axis) puts on the right the azimuth of profileFrame(axis).right and on the left the opposite (downPlunge.ts frame)', () => {
    fc.assert(
      fc.property(fc.double({ min: 0, max: 359.9, noNaN: true }), fc.double({ min: 0, max: 89, noNaN: true }), (trend, plunge) => {
        const e = edgeAzimuths({ trend, plunge }, null);
        const [east, north] = profileFrame({ trend, plunge }).right;
        const right = normalizeAzimuth(toDegrees(Math.atan2(east, north)));
        expectAzimuth(e.right, right, 1e-9, 'right');
        expectAzimuth(e.left, right + 180, 1e-9, 'left');
        // Profile up leans toward the trend by the plunge: v = (sin p sin t, sin p cos t, cos p).
        const [ve, vn, vu] = profileFrame({ trend, plunge }).up;
        expectClose(e.upLean, toDegrees(Math.atan2(Math.hypot(ve, vn), vu)), 1e-9, 'lean');
      }),
    );
  });

  const compass: { azimuth: number; expected: string; source: string }[] = [
    // 16-point compass, 22.5° apart (common practice).
    { azimuth: 165, expected: 'SSE', source: 'right of a 075 axis' },
    { azimuth: 345, expected: 'NNW', source: 'left of a 075 axis' },
    { azimuth: 359, expected: 'N', source: 'rounds to north' },
    { azimuth: 11.2, expected: 'N', source: 'just under 11.25' },
    { azimuth: 11.3, expected: 'NNE', source: 'just over 11.25' },
    { azimuth: 247.5, expected: 'WSW', source: 'exact point' },
  ];
  for (const row of compass) {
    it(`compassPoint(${row.azimuth}) is ${row.expected} (${row.source})`, () => {
      expect(compassPoint(row.azimuth)).toBe(row.expected);
    });
  }

  it('edgeAzimuths(axis, sectionAzimuths) faces the start of a section on the left and its end on the right', () => {
    expect(edgeAzimuths({ trend: 75, plunge: 12 }, [150, 170])).toEqual({ left: 330, right: 170, upLean: 0, upToward: 0 });
  });

  it('profileLayout(extent, ve, narrow, key height) follows the data\'s shape within limits and puts the key beside or below', () => {
    const wide = profileLayout({ minX: 0, minY: 0, maxX: 4000, maxY: 2000 }, 1, false, 300);
    expect(wide.plot.width).toBe(640);
    // 4000 × 2000 m with 8% of 4000 m padding: 4320 × 2320, aspect 0.537.
    expectClose(wide.plot.height, 640 * (2320 / 4320), 1e-9, 'plot height');
    expect(wide.legend.x).toBeGreaterThan(wide.plot.left + wide.plot.width);
    const flat = profileLayout({ minX: 0, minY: 0, maxX: 10000, maxY: 10 }, 1, false, 100);
    expect(flat.plot.height).toBe(220);
    const narrow = profileLayout({ minX: 0, minY: 0, maxX: 4000, maxY: 2000 }, 1, true, 300);
    expect(narrow.legend.y).toBeGreaterThan(narrow.plot.top + narrow.plot.height);
    expect(narrow.height).toBe(narrow.legend.y + 300 + 12);
  });
});
