import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { AreaError, readPolygons } from '../../src/io/within';
import { nonFiniteNumbers } from '../helpers/finite';
import { anyNumber, textFrom } from '../helpers/fuzzArbitraries';
import { fuzzRuns, fuzzTimeout } from '../helpers/fuzzRuns';

/**
 * Fuzzing readPolygons, the reader of the command line's `--within` area file (issue #8,
 * point 5): only AreaError escapes, and every polygon accepted has closed rings of at least
 * four finite positions (RFC 7946 §3.1.6).
 */

const position = fc.oneof(fc.tuple(fc.double({ min: -180, max: 180, noNaN: true }), fc.double({ min: -90, max: 90, noNaN: true })).map((p) => [...p]), fc.array(anyNumber, { maxLength: 3 }), fc.anything({ maxDepth: 0 }));
/** Rings that are closed often enough to get past the ring check. */
const ring = fc.oneof(
  fc.array(position, { minLength: 3, maxLength: 5 }).map((r) => [...r, r[0]]),
  fc.array(position, { maxLength: 5 }),
  fc.anything({ maxDepth: 1 }),
);
const geometry = fc.oneof(
  fc.record({ type: fc.constant('Polygon'), coordinates: fc.oneof(fc.array(ring, { maxLength: 2 }), fc.anything({ maxDepth: 1 })) }),
  fc.record({ type: fc.constant('MultiPolygon'), coordinates: fc.array(fc.array(ring, { maxLength: 2 }), { maxLength: 2 }) }),
  fc.record({ type: fc.constantFrom('Point', 'LineString', 'polygon'), coordinates: fc.anything({ maxDepth: 2 }) }),
  fc.constantFrom(null, undefined),
);
const document = fc.oneof(
  fc.record({ type: fc.constant('FeatureCollection'), features: fc.oneof(fc.array(fc.record({ type: fc.constant('Feature'), geometry }), { maxLength: 3 }), fc.anything({ maxDepth: 1 })) }),
  fc.record({ type: fc.constantFrom('Feature', 'feature'), geometry }),
  geometry,
);

function onlyAreaErrors(text: string): void {
  let polygons;
  try {
    polygons = readPolygons(text);
  } catch (e) {
    if (!(e instanceof AreaError)) throw new Error(`readPolygons threw ${String(e)} for ${text.slice(0, 300)}`);
    return;
  }
  expect(nonFiniteNumbers(polygons)).toEqual([]);
  for (const p of polygons) {
    const rings = p.geometry.type === 'Polygon' ? p.geometry.coordinates : p.geometry.coordinates.flat();
    for (const r of rings) {
      expect(r.length).toBeGreaterThanOrEqual(4);
      expect(r[0].slice(0, 2)).toEqual(r[r.length - 1].slice(0, 2));
    }
  }
}

describe('readPolygons never lets anything but AreaError escape (fuzz)', () => {
  it('readPolygons(text) on arbitrary text and JSON throws only AreaError', () => {
    const pieces = ['{', '}', '[', ']', '"type"', ':', '"Polygon"', '"Feature"', '"coordinates"', ',', '0', '1', '1e999', 'null'];
    fc.assert(fc.property(fc.oneof(textFrom(pieces, 40), fc.json({ maxDepth: 3 })), onlyAreaErrors), { numRuns: fuzzRuns(2000) });
  }, fuzzTimeout());

  it('readPolygons(text) on GeoJSON-shaped areas with any rings throws only AreaError and accepts only closed finite rings', () => {
    fc.assert(
      fc.property(document, (doc) => {
        const text = JSON.stringify(doc);
        if (text !== undefined) onlyAreaErrors(text);
      }),
      { numRuns: fuzzRuns(2000) },
    );
  }, fuzzTimeout());
});
