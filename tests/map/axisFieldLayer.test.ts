import { describe, expect, it } from 'vitest';
import { localAxisField } from '../../src/core/consistency/localAxisField';
import { checkDomain } from '../../src/core/consistency/domainCheck';
import { ANGLE_CLASSES, arrowOpacity, axisFieldFeatures } from '../../src/map/axisFieldLayer';
import { flagFeatures } from '../../src/map/consistencyFlagsLayer';
import { foldStations, positionsAndPoles } from '../core/consistency/synthetic';

const AXIS = { trend: 60, plunge: 20 };
const stations = foldStations({ seed: 4, n: 200, hinges: 20, badPlanes: 4, badLines: 2, box: [0, 0, 2000, 1000], fold: () => ({ axis: AXIS, swing: 45, wavelength: 800, domain: 'a' }) });

describe('axisFieldFeatures', () => {
  it('axisFieldFeatures(field, toLonLat) gives one arrow per node with an axis, carrying its trend, and one cell per node whose corners are the node\u2019s cell', () => {
    const { xy, poles } = positionsAndPoles(stations);
    const field = localAxisField(xy, poles, { nx: 8, ny: 4, k: 20, bounds: [0, 0, 2000, 1000] });
    const toLonLat = (x: number, y: number): [number, number] => [x / 1000, y / 1000];
    const { arrows, cells } = axisFieldFeatures(field, toLonLat);
    const defined = Array.from(field.trend).filter(Number.isFinite).length;
    expect(arrows.features.length).toBe(defined);
    expect(cells.features.length).toBe(defined);
    for (const a of arrows.features) {
      expect(a.properties.trend).toBe(field.trend[a.properties.node]);
      expect(a.properties.length).toBeCloseTo(Math.cos((field.plunge[a.properties.node] * Math.PI) / 180), 12);
    }
    // Node 9 is column 1, row 1: the cell from (250, 250) to (500, 500) metres.
    const cell = cells.features.find((c) => c.properties.node === 9)!;
    expect(cell.geometry.coordinates[0]).toEqual([[0.25, 0.25], [0.5, 0.25], [0.5, 0.5], [0.25, 0.5], [0.25, 0.25]]);
    // A quarter of a degree of longitude on a 512 px world is 512 × 0.25/360 px (web mercator, common
    // practice); near the equator a quarter degree of latitude is a little more, so the width decides.
    expect(axisFieldFeatures(field, toLonLat).cellPixelsAtZoom0).toBeCloseTo((512 * 0.25) / 360, 9);
  });

  it('arrowOpacity fades arrows from 1 at a 5° cone to 0.2 at 30°, and the angle classes rise without gaps', () => {
    expect(arrowOpacity(2)).toBe(1);
    expect(arrowOpacity(17.5)).toBeCloseTo(0.6, 12);
    expect(arrowOpacity(45)).toBe(0.2);
    expect(arrowOpacity(null)).toBe(0.2);
    expect(ANGLE_CLASSES.map((c) => c.upTo)).toEqual([...ANGLE_CLASSES.map((c) => c.upTo)].sort((a, b) => a - b));
    expect(ANGLE_CLASSES.at(-1)!.upTo).toBeGreaterThan(90);
  });
});

describe('flagFeatures', () => {
  it('flagFeatures(checks) places a ring at every flagged plane and line (the planted ones) and counts those without a position', () => {
    const check = checkDomain(
      {
        id: 'a',
        name: 'A',
        planes: stations.filter((s) => s.plane).map((s) => ({ ...s.plane!, id: s.id })),
        lines: stations.filter((s) => s.line).map((s) => ({ ...s.line!, id: s.id })),
      },
      { bootstrap: 0 },
    );
    const byId = new Map(stations.map((s) => [s.id, [s.x, s.y] as const]));
    const planted = stations.filter((s) => s.bad);
    const { points, unplaced } = flagFeatures([check], (id) => (id === planted[0].id ? undefined : byId.get(id)), (x, y) => [x, y]);
    expect(unplaced).toBe(1);
    expect(points.features.map((f) => f.properties.id).sort()).toEqual(planted.slice(1).map((s) => s.id).sort());
    for (const f of points.features) {
      const s = stations.find((q) => q.id === f.properties.id)!;
      expect(f.geometry.coordinates).toEqual([s.x, s.y]);
      expect(f.properties.kind).toBe(s.kind === 'hinge' ? 'line-off-axis' : 'plane-off-girdle');
    }
  });
});
