import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import { readGeoJsonStations, GeoJsonError } from '../../src/io/readGeoJson';
import { expectDeepClose } from '../helpers/tolerance';
import { fuzzRuns, fuzzTimeout } from '../helpers/fuzzRuns';

const point = (lon: number, lat: number, properties: Record<string, unknown>, extra: number[] = []) => ({
  type: 'Feature',
  geometry: { type: 'Point', coordinates: [lon, lat, ...extra] },
  properties,
});

describe('readGeoJsonStations(input)', () => {
  it('readGeoJsonStations reads Point features with measurement properties (RFC 7946 §3.2, §3.3)', () => {
    const fc1 = {
      type: 'FeatureCollection',
      features: [
        point(15.1, 45.2, { station: 'G1', kind: 'bedding', dipdir: 120, dip: 40 }),
        point(15.2, 45.3, { station: 'G2', kind: 'hinge', trend: '125', plunge: 20, note: null }, [312.5]),
      ],
    };
    const { stations, headers, detection } = readGeoJsonStations(JSON.stringify(fc1));
    expect(headers).toEqual(['station', 'kind', 'dipdir', 'dip', 'trend', 'plunge', 'note']);
    expect(detection.mapping).toMatchObject({ id: 'station', kind: 'kind', dipDirection: 'dipdir', dip: 'dip', trend: 'trend', plunge: 'plunge' });
    expect(stations.map((s) => [s.id, s.row, s.lon, s.lat])).toEqual([
      ['G1', 1, 15.1, 45.2],
      ['G2', 2, 15.2, 45.3],
    ]);
    expectDeepClose(stations[0].plane, { dipDirection: 120, dip: 40 }, 1e-12);
    expectDeepClose(stations[1].line, { trend: 125, plunge: 20 }, 1e-12);
    // RFC 7946 §3.1.1: the third position element is height; it fills the elevation.
    expect(stations[1].elevation).toBe(312.5);
    // Property values are kept as text: numbers as JSON writes them, null as empty.
    expect(stations[0].source).toEqual({ station: 'G1', kind: 'bedding', dipdir: '120', dip: '40' });
    expect(stations[1].source.note).toBe('');
  });

  it('readGeoJsonStations reports a non-point geometry as a problem of that feature, and keeps the feature', () => {
    const fc1 = {
      type: 'FeatureCollection',
      features: [
        point(15.1, 45.2, { kind: 'bedding', dipdir: 120, dip: 40 }),
        { type: 'Feature', geometry: { type: 'LineString', coordinates: [[15, 45], [15.1, 45.1]] }, properties: { kind: 'bedding', dipdir: 130, dip: 40 } },
        { type: 'Feature', geometry: { type: 'Point', coordinates: [15] }, properties: { kind: 'bedding', dipdir: 130, dip: 40 } },
      ],
    };
    const { stations } = readGeoJsonStations(fc1);
    expect(stations).toHaveLength(3);
    expect(stations[0].problems).toEqual([]);
    expect(stations[1].problems).toEqual([{ row: 2, column: 'geometry', value: 'LineString', expected: 'a Point geometry (one location per measurement); this feature is not a point' }]);
    expect(stations[2].problems[0].expected).toMatch(/Point coordinates \[longitude, latitude\]/);
  });

  it('readGeoJsonStations gives a feature without geometry no location and no problem', () => {
    const { stations } = readGeoJsonStations({ type: 'Feature', geometry: null, properties: { kind: 'bedding', dipdir: 120, dip: 40 } });
    expect(stations[0].lon).toBeUndefined();
    expect(stations[0].problems).toEqual([]);
  });

  it('readGeoJsonStations reports coordinates that are not longitude and latitude', () => {
    const { stations } = readGeoJsonStations({ type: 'FeatureCollection', features: [point(45.2, 120.1, { kind: 'bedding', dipdir: 120, dip: 40 })] });
    expect(stations[0].problems[0].expected).toMatch(/look swapped/);
  });

  const refusals = [
    { name: 'text that is not JSON', input: '{"type": "FeatureCollection",', message: /not valid JSON/ },
    { name: 'a bare geometry', input: '{"type": "Point", "coordinates": [1, 2]}', message: /expected "type": "FeatureCollection" or "Feature", found "Point"/ },
    { name: 'an empty collection', input: '{"type": "FeatureCollection", "features": []}', message: /no features/ },
    { name: 'a feature that is not a Feature', input: '{"type": "FeatureCollection", "features": [{"type": "Point"}]}', message: /feature 1 is not a GeoJSON Feature/ },
    { name: 'a projected legacy crs', input: '{"type": "FeatureCollection", "crs": {"type": "name", "properties": {"name": "EPSG:32633"}}, "features": []}', message: /reproject the file first/ },
    { name: 'an array', input: '[]', message: /expected a GeoJSON object/ },
  ];
  for (const r of refusals) {
    it(`readGeoJsonStations refuses ${r.name} with a GeoJsonError`, () => {
      expect(() => readGeoJsonStations(r.input)).toThrow(GeoJsonError);
      expect(() => readGeoJsonStations(r.input)).toThrow(r.message);
    });
  }

  it('readGeoJsonStations accepts a legacy crs that names WGS84 longitude/latitude', () => {
    const input = { type: 'FeatureCollection', crs: { type: 'name', properties: { name: 'urn:ogc:def:crs:OGC:1.3:CRS84' } }, features: [point(15, 45, { kind: 'bedding', dipdir: 1, dip: 2 })] };
    expect(readGeoJsonStations(input).stations).toHaveLength(1);
  });

  it('readGeoJsonStations throws nothing but GeoJsonError on arbitrary JSON (fuzz)', () => {
    // Free JSON, and collections of features whose geometry and properties are anything at all.
    const feature = fc.record({ type: fc.constant('Feature'), geometry: fc.oneof(fc.anything(), fc.record({ type: fc.constantFrom('Point', 'Polygon'), coordinates: fc.anything() })), properties: fc.anything() });
    const collection = fc.record({ type: fc.constant('FeatureCollection'), features: fc.array(feature, { maxLength: 4 }) }).map((o) => JSON.stringify(o));
    fc.assert(
      fc.property(fc.oneof(fc.json(), fc.string({ maxLength: 40 }), collection), (text) => {
        try {
          readGeoJsonStations(text);
        } catch (e) {
          if (!(e instanceof GeoJsonError)) throw e;
        }
      }),
      { numRuns: fuzzRuns(1000) },
    );
  }, fuzzTimeout());
});
