import { describe, expect, it } from 'vitest';
import {
  ALL_SYMBOLS_ZOOM,
  KIND_CODES,
  SIZE_STOPS,
  SYMBOL_IMAGE_CODES,
  imageNamesOf,
  kindFilter,
  labelImageExpression,
  overlayFeatures,
  symbolImageExpression,
  symbolOffsetExpression,
  symbolSizeAt,
} from '../../src/map/overlayFeatures';
import { symbolFor } from '../../src/map/symbolCatalog';
import { mapImageOffset } from '../../src/map/symbolImages';
import type { Station } from '../../src/core/station';

const station = (over: Partial<Station> & Pick<Station, 'id'>): Station => ({ row: 1, source: {}, problems: [], lon: 15, lat: 46, ...over });

const stations: Station[] = [
  station({ id: 'P1', kind: 'bedding', plane: { dipDirection: 120, dip: 45 } }),
  station({ id: 'P2', kind: 'fault', plane: { dipDirection: 300, dip: 90 } }),
  station({ id: 'P3', kind: 'foliation', plane: { dipDirection: 10, dip: 0 } }),
  station({ id: 'P4', kind: 'cleavage', plane: { dipDirection: 200, dip: 70, overturned: true } }),
  station({ id: 'L1', kind: 'hinge', line: { trend: 250, plunge: 14, sense: 'synform' } }),
  station({ id: 'L2', kind: 'lineation', line: { trend: 5, plunge: 90 } }),
  station({ id: 'bad', kind: 'bedding', source: { dip: '95' }, problems: [{ row: 7, column: 'dip', value: '95', expected: 'a dip from 0 to 90' }] }),
  station({ id: 'nowhere', kind: 'bedding', plane: { dipDirection: 1, dip: 2 }, lon: undefined, lat: undefined }),
];

describe('overlayFeatures', () => {
  it('overlayFeatures(stations) codes each drawable station as symbolFor draws it, keeping its index as feature id', () => {
    const fc = overlayFeatures(stations, { visibleKinds: null, symbolScale: 1, labelMinZoom: 14, thin: false });
    expect(fc.features.map((f) => f.id)).toEqual([0, 1, 2, 3, 4, 5]);
    for (const f of fc.features) {
      const s = stations[f.id as number];
      const choice = symbolFor(s)!;
      expect(SYMBOL_IMAGE_CODES[f.properties.i]).toBe(choice.image);
      expect(KIND_CODES[f.properties.k]).toBe(s.kind);
      expect(f.properties.r).toBe(choice.rotation);
      expect(f.properties.d).toBe(choice.label === '' ? -1 : Number(choice.label));
      expect(f.properties.sid).toBe(s.id);
      expect(f.geometry.coordinates).toEqual([s.lon, s.lat]);
      expect([f.properties.sz, f.properties.lz]).toEqual([0, 0]);
    }
    expect(imageNamesOf(fc.features)).toEqual(new Set([...fc.features.map((f) => symbolFor(stations[f.id as number])!.image), 'fl-num/45', 'fl-num/70', 'fl-num/14']));
  });

  it('overlayFeatures thins stations on one spot: the first is drawn from the lowest zoom, the next only where every symbol is drawn', () => {
    const same = [0, 1, 2].map((k) => station({ id: `S${k}`, kind: 'bedding', plane: { dipDirection: 90, dip: 30 } }));
    const fc = overlayFeatures(same, { visibleKinds: null, symbolScale: 1, labelMinZoom: 14, thin: true });
    expect(fc.features.map((f) => f.properties.sz)).toEqual([0, ALL_SYMBOLS_ZOOM, ALL_SYMBOLS_ZOOM]);
    expect(fc.features.map((f) => f.properties.lz)).toEqual([14, 20, 20]);
  });

  it('overlayFeatures thins among the kinds shown: a hidden kind neither shows nor takes a cell', () => {
    const two = [station({ id: 'B', kind: 'bedding', plane: { dipDirection: 90, dip: 30 } }), station({ id: 'F', kind: 'foliation', plane: { dipDirection: 90, dip: 30 } })];
    const fc = overlayFeatures(two, { visibleKinds: new Set(['foliation']), symbolScale: 1, labelMinZoom: 14, thin: true });
    expect(fc.features.map((f) => [f.properties.sz, f.properties.lz])).toEqual([[99, 99], [0, 14]]);
  });

  it('symbolImageExpression and symbolOffsetExpression map every code to its image and its offset', () => {
    const image = symbolImageExpression() as unknown[];
    const offset = symbolOffsetExpression() as unknown[];
    expect(image.slice(0, 2)).toEqual(['match', ['get', 'i']]);
    SYMBOL_IMAGE_CODES.forEach((id, i) => {
      expect(image[2 + 2 * i]).toBe(i);
      expect(image[3 + 2 * i]).toBe(id);
      expect(offset[3 + 2 * i]).toEqual(['literal', mapImageOffset(id)]);
    });
    expect(labelImageExpression()).toEqual(['concat', 'fl-num/', ['to-string', ['get', 'd']]]);
  });

  it('kindFilter(kinds) keeps the codes of known kinds and drops unknown names', () => {
    expect(kindFilter(['hinge', 'granite', 'bedding'])).toEqual(['in', ['get', 'k'], ['literal', [KIND_CODES.indexOf('hinge'), KIND_CODES.indexOf('bedding')]]]);
  });

  it('symbolSizeAt(zoom, scale) is the linear interpolation of SIZE_STOPS, clamped at both ends (analytic)', () => {
    for (const [z, f] of SIZE_STOPS) expect(symbolSizeAt(z, 2)).toBeCloseTo(2 * f, 12);
    expect(symbolSizeAt(10, 1)).toBeCloseTo(0.35 + (0.6 - 0.35) / 2, 12);
    expect(symbolSizeAt(3, 1)).toBe(0.35);
    expect(symbolSizeAt(20, 1)).toBe(1);
  });
});
