import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { PLANE_KINDS, LINE_KINDS } from '../../src/core/types';
import { symbolFor, parseImageId, planeImageId, lineImageId, planeShapes, lineShapes } from '../../src/map/symbolCatalog';
import { imageFor } from '../../src/map/symbolImages';
import { rasterize } from '../../src/map/raster';
import { stationFeatures } from '../../src/map/stationFeatures';
import type { Station } from '../../src/core/station';

describe('symbolFor', () => {
  // The dip mark is drawn pointing up and the map turns it clockwise by the dip direction, so a
  // plane's rotation is its dip direction; a line's is its trend (common practice: the mark
  // and the arrow point down-dip / down-plunge).
  const cases: Array<{ s: Pick<Station, 'kind' | 'plane' | 'line'>; image: string; rotation: number; label: string }> = [
    { s: { kind: 'bedding', plane: { dipDirection: 120, dip: 45 } }, image: 'fl-sym/bedding/inclined', rotation: 120, label: '45' },
    { s: { kind: 'bedding', plane: { dipDirection: 300, dip: 12.4 } }, image: 'fl-sym/bedding/inclined', rotation: 300, label: '12' },
    { s: { kind: 'bedding', plane: { dipDirection: 10, dip: 0 } }, image: 'fl-sym/bedding/horizontal', rotation: 0, label: '' },
    { s: { kind: 'fault', plane: { dipDirection: 200, dip: 90 } }, image: 'fl-sym/fault/vertical', rotation: 200, label: '' },
    { s: { kind: 'foliation', plane: { dipDirection: 45, dip: 70, overturned: true } }, image: 'fl-sym/foliation/overturned', rotation: 45, label: '70' },
    { s: { kind: 'hinge', line: { trend: 250, plunge: 14, sense: 'antiform' } }, image: 'fl-sym/hinge/plunging/antiform', rotation: 250, label: '14' },
    { s: { kind: 'lineation', line: { trend: 5, plunge: 90 } }, image: 'fl-sym/lineation/vertical', rotation: 0, label: '' },
    { s: { kind: 'lineation', line: { trend: 135, plunge: 0 } }, image: 'fl-sym/lineation/horizontal', rotation: 135, label: '' },
  ];
  for (const c of cases) {
    it(`symbolFor(${c.s.kind} ${JSON.stringify(c.s.plane ?? c.s.line)}) is ${c.image} turned ${c.rotation}°`, () => {
      expect(symbolFor(c.s)).toEqual({ image: c.image, rotation: c.rotation, label: c.label });
    });
  }

  it('symbolFor returns null for a station without attitude', () => {
    expect(symbolFor({ kind: 'bedding' })).toBeNull();
  });

  it('parseImageId(planeImageId / lineImageId) round-trips for every kind and variant', () => {
    for (const kind of PLANE_KINDS) for (const v of ['inclined', 'horizontal', 'vertical', 'overturned'] as const) {
      expect(parseImageId(planeImageId(kind, v))).toEqual({ type: 'plane', kind, variant: v });
    }
    for (const kind of LINE_KINDS) for (const v of ['plunging', 'horizontal', 'vertical'] as const) {
      const parsed = parseImageId(lineImageId(kind, v, 'synform'));
      expect(parsed).toMatchObject({ type: 'line', kind, variant: v });
    }
    expect(parseImageId('some-host-icon')).toBeNull();
    expect(parseImageId('fl-sym/granite/inclined')).toBeNull();
  });
});

describe('symbol images', () => {
  it('rasterize draws a disc whose painted area matches pi r^2 (analytic)', () => {
    const img = rasterize([{ type: 'disc', center: [0, 0], radius: 5, color: [0, 0, 0] }], 20, 4, 0);
    let coverage = 0;
    for (let i = 3; i < img.data.length; i += 4) coverage += img.data[i] / 255;
    const areaCssPx = coverage / 16; // 4 × 4 device pixels per CSS px
    expect(Math.abs(areaCssPx - Math.PI * 25) / (Math.PI * 25)).toBeLessThan(0.01);
  });

  it('imageFor(plane symbol) puts the dip mark above the strike line (north-up drawing)', () => {
    const img = imageFor('fl-sym/bedding/inclined', 2)!;
    // Sum coloured (non-halo, dark) coverage above and below the centre row.
    let above = 0;
    let below = 0;
    const mid = img.height / 2;
    for (let row = 0; row < img.height; row++) for (let col = 0; col < img.width; col++) {
      const i = (row * img.width + col) * 4;
      const dark = img.data[i] < 100 && img.data[i + 3] > 200;
      if (!dark) continue;
      if (row < mid - 3) above++;
      if (row > mid + 3) below++;
    }
    expect(above).toBeGreaterThan(20);
    expect(below).toBe(0);
  });

  it('imageFor scales with pixel ratio and returns null for foreign ids', () => {
    expect(imageFor('fl-sym/fault/inclined', 1)!.width * 3).toBe(imageFor('fl-sym/fault/inclined', 3)!.width);
    expect(imageFor('fl-num/45', 2)!.width).toBeGreaterThan(0);
    expect(imageFor('not-ours', 2)).toBeNull();
  });

  it('every kind and variant has a drawable, non-empty design', () => {
    for (const kind of PLANE_KINDS) for (const v of ['inclined', 'horizontal', 'vertical', 'overturned'] as const) expect(planeShapes(kind, v).length).toBeGreaterThan(0);
    for (const kind of LINE_KINDS) for (const v of ['plunging', 'horizontal', 'vertical'] as const) expect(lineShapes(kind, v).length).toBeGreaterThan(0);
  });

  it('label images exist for every whole degree 0-90 (property)', () => {
    fc.assert(fc.property(fc.integer({ min: 0, max: 90 }), (d) => imageFor(`fl-num/${d}`, 1) !== null));
  });
});

describe('stationFeatures', () => {
  it('stationFeatures(stations) keeps the input index as feature id and leaves out unusable rows', () => {
    const stations: Station[] = [
      { id: 'A', row: 1, kind: 'bedding', lon: 1, lat: 2, plane: { dipDirection: 90, dip: 30 }, source: {}, problems: [] },
      { id: 'B', row: 2, kind: 'bedding', lon: 1, lat: 2, source: { dip: '95' }, problems: [{ row: 2, column: 'dip', value: '95', expected: 'a dip from 0 to 90' }] },
      { id: 'C', row: 3, kind: 'hinge', lon: 3, lat: 4, line: { trend: 80, plunge: 10 }, source: {}, problems: [] },
    ];
    const fc1 = stationFeatures(stations);
    expect(fc1.features.map((f) => f.id)).toEqual([0, 2]);
    expect(fc1.features[1].properties).toMatchObject({ sid: 'C', family: 'line', rot: 80, lbl: 'fl-num/10' });
  });
});
