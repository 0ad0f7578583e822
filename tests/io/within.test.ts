import { describe, it, expect } from 'vitest';
import { readPolygons, selectWithin, AreaError } from '../../src/io/within';
import type { Station } from '../../src/core/station';

const station = (id: string, lon?: number, lat?: number): Station => ({
  id,
  row: 1,
  ...(lon !== undefined && lat !== undefined && { lon, lat }),
  plane: { dipDirection: 120, dip: 40 },
  source: {},
  problems: [],
});

// A unit square with a hole in the middle (RFC 7946 §3.1.6: first ring exterior, then holes).
const SQUARE_WITH_HOLE = JSON.stringify({
  type: 'Polygon',
  coordinates: [
    [[0, 0], [1, 0], [1, 1], [0, 1], [0, 0]],
    [[0.4, 0.4], [0.6, 0.4], [0.6, 0.6], [0.4, 0.6], [0.4, 0.4]],
  ],
});

describe('selectWithin(stations, polygons)', () => {
  it('selectWithin counts points on an edge or a corner as inside, and a hole as outside', () => {
    const s = [station('in', 0.2, 0.2), station('edge', 1, 0.5), station('corner', 0, 0), station('hole', 0.5, 0.5), station('out', 2, 2), station('nowhere')];
    const r = selectWithin(s, readPolygons(SQUARE_WITH_HOLE));
    expect(r.inside.map((x) => x.id)).toEqual(['in', 'edge', 'corner']);
    expect(r.outside.map((x) => x.id)).toEqual(['hole', 'out']);
    expect(r.noLocation.map((x) => x.id)).toEqual(['nowhere']);
  });

  it('selectWithin takes inside any of several polygons (a FeatureCollection or a MultiPolygon)', () => {
    const two = JSON.stringify({
      type: 'FeatureCollection',
      features: [
        { type: 'Feature', properties: {}, geometry: { type: 'Polygon', coordinates: [[[0, 0], [1, 0], [1, 1], [0, 0]]] } },
        { type: 'Feature', properties: {}, geometry: { type: 'MultiPolygon', coordinates: [[[[5, 5], [6, 5], [6, 6], [5, 5]]]] } },
      ],
    });
    const r = selectWithin([station('a', 0.9, 0.1), station('b', 5.9, 5.1), station('c', 3, 3)], readPolygons(two));
    expect(r.inside.map((x) => x.id)).toEqual(['a', 'b']);
  });
});

describe('readPolygons(text)', () => {
  const refusals = [
    { name: 'text that is not JSON', text: 'polygon', message: /not valid JSON/ },
    { name: 'a point', text: '{"type":"Point","coordinates":[0,0]}', message: /holds no polygons/ },
    { name: 'a line feature among polygons', text: '{"type":"FeatureCollection","features":[{"type":"Feature","geometry":{"type":"LineString","coordinates":[[0,0],[1,1]]}}]}', message: /is a LineString, not a Polygon/ },
    { name: 'an open ring', text: '{"type":"Polygon","coordinates":[[[0,0],[1,0],[1,1],[0,1]]]}', message: /closed list of at least four/ },
  ];
  for (const r of refusals) {
    it(`readPolygons refuses ${r.name} with an AreaError`, () => {
      expect(() => readPolygons(r.text)).toThrow(AreaError);
      expect(() => readPolygons(r.text)).toThrow(r.message);
    });
  }
});
