import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import proj4 from 'proj4';
import {
  DEFAULT_SHOW,
  MAX_DRAWN_LEVELS,
  NET_LAYOUT,
  NET_LAYOUT_NARROW,
  analysisLayer,
  contourLayer,
  drawnLevels,
  fitHeight,
  frameLayers,
  greatCircleLayer,
  highlightLayer,
  legendLayer,
  netAriaLabel,
  poleDotStyle,
  poleLayer,
  sampleForCap,
  type LegendInput,
  type SceneItem,
  type ScenePath,
} from '../../src/components/net/netScene';
import { CONTOUR_OPACITY, contourOpacities } from '../../src/components/net/netStyle';
import { analyzeFold } from '../../src/core/foldAnalysis';
import { describeFold } from '../../src/core/foldDescription';
import { kambGrid } from '../../src/core/kamb';
import type { NetKind } from '../../src/core/netProjection';
import type { Line, PlaneMeasurement } from '../../src/core/types';
import { lineToVector, poleOf } from '../../src/core/vectors';
import { expectClose } from '../helpers/tolerance';

const F = NET_LAYOUT.frame;
const byName = (items: readonly SceneItem[], name: string) => items.find((i) => i.name === name);

/** proj4js reference positions (north polar aspect; see netPaths.test.ts), in SVG units of NET_LAYOUT. */
const R_LAEA = Math.SQRT1_2;
const REF = {
  'equal-area': proj4(`+proj=longlat +R=${R_LAEA} +no_defs`, `+proj=laea +lat_0=90 +lon_0=0 +R=${R_LAEA} +x_0=0 +y_0=0 +units=m +no_defs`),
  'equal-angle': proj4('+proj=longlat +R=0.5 +no_defs', '+proj=stere +lat_0=90 +lon_0=0 +k_0=1 +R=0.5 +x_0=0 +y_0=0 +units=m +no_defs'),
};
function svgOf(line: Line, kind: NetKind): { x: number; y: number } {
  const [x, y] = REF[kind].forward([line.trend, line.plunge]);
  return { x: F.cx + F.r * x, y: F.cy + F.r * y }; // proj4's y points south, as SVG's does
}

// A cylindrical fold about a horizontal N-S axis: limbs dipping east and west, plus a hinge plane.
const PLANES: PlaneMeasurement[] = [
  { dipDirection: 90, dip: 40 }, { dipDirection: 92, dip: 42 }, { dipDirection: 88, dip: 38 },
  { dipDirection: 270, dip: 40 }, { dipDirection: 268, dip: 44 }, { dipDirection: 272, dip: 36 },
];
const ANALYSIS = analyzeFold({ planes: PLANES }, { bootstrap: 100 });
const DESCRIPTION = describeFold(PLANES);

describe('frame, contour and data layers', () => {
  it('frameLayers(kind, grid) puts N above the primitive, names the net and draws the grid only when asked', () => {
    const [face, frame] = frameLayers('equal-angle', true);
    const north = byName(frame.items, 'north');
    expect(north).toMatchObject({ type: 'text', text: 'N' });
    expect((north as { y: number }).y).toBeLessThan(F.cy - F.r);
    expect(byName(frame.items, 'caption')).toMatchObject({ text: 'Equal-angle net, lower hemisphere' });
    expect(byName(face.items, 'grid')).toBeDefined();
    expect(byName(frameLayers('equal-area', false)[0].items, 'grid')).toBeUndefined();
  });

  it('contourLayer(density, net) draws nothing for a density computed on the other net', () => {
    const poles = new Float64Array([0, 0, 1, 0.1, 0, Math.sqrt(0.99)]);
    const grid = kambGrid(poles, { resolution: 21, net: 'equal-area' });
    expect(contourLayer(grid, 'equal-angle').items).toEqual([]);
    expect(contourLayer(grid, 'equal-area').items.length).toBeGreaterThan(0);
    expect(contourLayer(grid, 'equal-area').clip).toBe(true);
  });

  it('poleLayer(xy) is one element whatever the number of poles, with dots that shrink for many poles', () => {
    const few = poleLayer(new Float64Array(200));
    const many = poleLayer(new Float64Array(200_000));
    expect(few.items.length).toBe(1);
    expect(many.items.length).toBe(1);
    expect((many.items[0] as ScenePath).strokeWidth!).toBeLessThan((few.items[0] as ScenePath).strokeWidth!);
    expect(poleLayer(new Float64Array(0)).items).toEqual([]);
  });

  it('poleDotStyle(n) is full size up to 500 poles, 1.2 units from 20 000, and never grows with n', () => {
    expect(poleDotStyle(100)).toEqual({ width: 3.2, opacity: 1 });
    expect(poleDotStyle(50_000)).toEqual({ width: 1.2, opacity: 0.5 });
    fc.assert(fc.property(fc.integer({ min: 0, max: 10 ** 6 }), fc.integer({ min: 0, max: 10 ** 6 }), (a, b) => {
      const [lo, hi] = a < b ? [a, b] : [b, a];
      expect(poleDotStyle(hi).width).toBeLessThanOrEqual(poleDotStyle(lo).width);
    }));
  });

  it('greatCircleLayer(planes, net, cap) draws at most cap planes and reports how many', () => {
    const planes = Array.from({ length: 1000 }, (_, i) => ({ dipDirection: (i * 7) % 360, dip: 10 + (i % 80) }));
    const layer = greatCircleLayer(planes, 'equal-area', 300);
    expect(layer).toMatchObject({ drawn: 300, total: 1000 });
    expect(((layer.items[0] as ScenePath).d.match(/M/g) ?? []).length).toBe(300);
    expect(greatCircleLayer(planes.slice(0, 5), 'equal-area', 300)).toMatchObject({ drawn: 5, total: 5 });
  });

  it('sampleForCap(items, cap) spreads its picks evenly over the list', () => {
    expect(sampleForCap([0, 1, 2, 3, 4, 5, 6, 7, 8, 9], 5)).toEqual([0, 2, 4, 6, 8]);
    expect(sampleForCap([1, 2], 5)).toEqual([1, 2]);
    expect(() => sampleForCap([1], -1)).toThrow(/cap -1/);
  });
});

describe('analysisLayer', () => {
  for (const kind of ['equal-area', 'equal-angle'] as NetKind[]) {
    it(`analysisLayer(analysis, description, '${kind}', show) puts the axis, beta and limb markers where proj4 projects them`, () => {
      const layer = analysisLayer(ANALYSIS, DESCRIPTION, kind, DEFAULT_SHOW);
      const check = (name: string, line: Line) => {
        const item = byName(layer.items, name) as ScenePath;
        expect(item, name).toBeDefined();
        const ref = svgOf(line, kind);
        expectClose(item.at!.x, ref.x, 1e-6, `${name} x`);
        expectClose(item.at!.y, ref.y, 1e-6, `${name} y`);
      };
      check('axis', ANALYSIS.axis!);
      check('beta', ANALYSIS.beta!);
      if (!DESCRIPTION.ok) throw new Error(DESCRIPTION.reason);
      check('limb-1', DESCRIPTION.limbs[0].pole);
      check('limb-2', DESCRIPTION.limbs[1].pole);
      // The axis of this fold is near horizontal N-S: near the top or bottom of the primitive.
      const axis = byName(layer.items, 'axis') as ScenePath;
      expect(Math.abs(axis.at!.x - F.cx)).toBeLessThan(F.r * 0.1);
      expect(byName(layer.items, 'girdle')).toBeDefined();
      expect(byName(layer.items, 'axial-plane')).toBeDefined();
      expect(byName(layer.items, 'cone')).toBeDefined();
      // The axis is drawn last, on top of everything else in the layer.
      expect(layer.items[layer.items.length - 1].name).toBe('axis');
    });
  }

  it('analysisLayer(analysis, null, net, show) leaves out what the toggles turn off', () => {
    const layer = analysisLayer(ANALYSIS, null, 'equal-area', { ...DEFAULT_SHOW, cone: false, beta: false, girdle: false });
    expect(layer.items.map((i) => i.name)).toEqual(['axis']);
  });

  it('analysisLayer(analysis of parallel planes) draws no axis, girdle or cone', () => {
    const parallel = analyzeFold({ planes: Array.from({ length: 4 }, () => ({ dipDirection: 75, dip: 35 })) });
    const layer = analysisLayer(parallel, describeFold(Array.from({ length: 4 }, () => ({ dipDirection: 75, dip: 35 }))), 'equal-area', DEFAULT_SHOW);
    expect(layer.items).toEqual([]);
  });

  it('highlightLayer(point) rings the point, and draws nothing without one', () => {
    expect(highlightLayer(null).items).toEqual([]);
    expect(highlightLayer({ x: Number.NaN, y: 0 }).items).toEqual([]);
    const [ring] = highlightLayer({ x: 0.5, y: -0.5 }).items as ScenePath[];
    expect(ring.at).toEqual({ x: F.cx + F.r * 0.5, y: F.cy + F.r * 0.5 });
  });
});

describe('legend and contour shading', () => {
  it('legendLayer(input) lists only what is drawn, with counts and the axis', () => {
    const v = lineToVector(poleOf(PLANES[0]));
    const density = kambGrid(new Float64Array([v.x, v.y, v.z, v.x, v.y, v.z]), { resolution: 21 });
    const base: LegendInput = { poles: 6, lines: 0, greatCircles: null, analysis: ANALYSIS, description: DESCRIPTION, density, show: DEFAULT_SHOW };
    const texts = (input: LegendInput) => legendLayer(input).items.filter((i) => i.type === 'text').map((i) => (i as { text: string }).text);
    const all = texts(base);
    expect(all).toContain('Poles (6)');
    expect(all.some((t) => t.startsWith('π axis '))).toBe(true);
    expect(all).toContain('Limb maxima');
    expect(all).not.toContain('Lines (0)');
    expect(all).toContain('KAMB CONTOURS');
    const off = texts({ ...base, show: { ...DEFAULT_SHOW, poles: false, contours: false, limbs: false } });
    expect(off).not.toContain('Poles (6)');
    expect(off).not.toContain('KAMB CONTOURS');
    expect(off).not.toContain('Limb maxima');
    const capped = texts({ ...base, show: { ...DEFAULT_SHOW, greatCircles: true }, greatCircles: { drawn: 300, total: 4000 } });
    expect(capped).toContain('Great circles (300 of 4\u202f000)');
  });

  it('legendLayer(input) draws nothing, not even its title, when nothing is on the net, and fitHeight(layout, bottom) then ends the narrow drawing under the caption', () => {
    const empty = legendLayer({ poles: 0, lines: 0, greatCircles: null, analysis: null, description: null, density: null, show: DEFAULT_SHOW }, NET_LAYOUT_NARROW);
    expect(empty.items).toEqual([]);
    expect(fitHeight(NET_LAYOUT_NARROW, empty.bottom).height).toBe(NET_LAYOUT_NARROW.captionY + 6);
    const full = legendLayer({ poles: 6, lines: 2, greatCircles: null, analysis: ANALYSIS, description: DESCRIPTION, density: null, show: DEFAULT_SHOW }, NET_LAYOUT_NARROW);
    const lowest = Math.max(...full.items.map((i) => (i.type === 'text' ? i.y : 0)));
    expect(fitHeight(NET_LAYOUT_NARROW, full.bottom).height).toBeGreaterThan(lowest);
    expect(fitHeight(NET_LAYOUT, full.bottom)).toBe(NET_LAYOUT); // the wide layout keeps its size
  });

  it('legendLayer(input) shows one swatch per drawn contour level and says when levels were thinned', () => {
    const levels = Array.from({ length: 25 }, (_, i) => 2 * (i + 1));
    const density = { ...kambGrid(new Float64Array([0, 0, 1]), { resolution: 11 }), levels };
    const items = legendLayer({ poles: 1, lines: 0, greatCircles: null, analysis: null, description: null, density, show: DEFAULT_SHOW }).items;
    const swatches = items.filter((i) => i.name?.startsWith('key-level-') && i.type === 'path');
    expect(swatches.length).toBe(drawnLevels(levels).length);
    expect(byName(items, 'key-levels-note')).toMatchObject({ text: `${drawnLevels(levels).length} of 25 levels drawn` });
  });

  const levelRows = [
    { input: [2, 4, 6], max: 10, expected: [2, 4, 6] },
    { input: [2, 4, 6, 8, 10], max: 3, expected: [2, 6, 10] },
    { input: Array.from({ length: 16 }, (_, i) => 2 * (i + 1)), max: 10, expected: [2, 6, 10, 14, 18, 22, 26, 30] }, // every 2nd level: evenly 4 sigma apart
    { input: [2, Number.NaN, 4], max: 10, expected: [2, 4] },
  ];
  for (const row of levelRows) {
    it(`drawnLevels(${JSON.stringify(row.input.length > 6 ? `${row.input.length} levels` : row.input)}, ${row.max}) is ${JSON.stringify(row.expected)}`, () => {
      expect(drawnLevels(row.input, row.max)).toEqual(row.expected);
    });
  }

  it(`drawnLevels(levels) never returns more than MAX_DRAWN_LEVELS (${MAX_DRAWN_LEVELS}) levels, evenly spaced`, () => {
    fc.assert(fc.property(fc.integer({ min: 0, max: 500 }), (n) => {
      const levels = Array.from({ length: n }, (_, i) => i + 1);
      const out = drawnLevels(levels);
      expect(out.length).toBeLessThanOrEqual(MAX_DRAWN_LEVELS);
      expect(new Set(out.slice(1).map((v, i) => v - out[i])).size).toBeLessThanOrEqual(1);
    }));
  });

  it('contourOpacities(n) composites layer by layer to the cumulative opacities, from lowest to highest', () => {
    // Porter & Duff (1984), "Compositing digital images", the over operator for one colour:
    // alpha = a_top + a_below·(1 - a_top).
    fc.assert(fc.property(fc.integer({ min: 1, max: 60 }), (n) => {
      const { layer, cumulative } = contourOpacities(n);
      let alpha = 0;
      layer.forEach((a, i) => {
        alpha = a + alpha * (1 - a);
        expectClose(alpha, cumulative[i], 1e-12, `band ${i}`);
        expect(a).toBeGreaterThan(0);
      });
      if (n > 1) {
        expectClose(cumulative[0], CONTOUR_OPACITY.lowest, 1e-12, 'lowest');
        expectClose(cumulative[n - 1], CONTOUR_OPACITY.highest, 1e-12, 'highest');
      }
    }));
  });

  it('netAriaLabel(analysis, poles, lines, net) sums up the axis, or says why there is none', () => {
    expect(netAriaLabel(ANALYSIS, 6, 0, 'equal-area')).toMatch(/^Equal-area net, lower hemisphere: 6 poles, 0 lines; fold axis \d{3}\/\d{2}, 95% cone [\d.]+°\.$/);
    const parallel = analyzeFold({ planes: [{ dipDirection: 1, dip: 2 }, { dipDirection: 1, dip: 2 }, { dipDirection: 1, dip: 2 }] });
    expect(netAriaLabel(parallel, 3, 1, 'equal-angle')).toBe('Equal-angle net, lower hemisphere: 3 poles, 1 line; no fold axis (all planes parallel).');
    expect(netAriaLabel(null, 0, 0, 'equal-area')).toBe('Equal-area net, lower hemisphere: 0 poles, 0 lines; no fold axis (no planes).');
  });
});
