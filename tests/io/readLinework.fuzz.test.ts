import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { LineworkError, readLinework } from '../../src/io/readLinework';
import { nonFiniteNumbers } from '../helpers/finite';
import { anyNumber, textFrom } from '../helpers/fuzzArbitraries';
import { fuzzRuns, fuzzTimeout } from '../helpers/fuzzRuns';

/**
 * Fuzzing readLinework (issue #8, point 5) with arbitrary text, arbitrary JSON and GeoJSON-shaped
 * documents whose positions are any numbers or anything at all: only LineworkError escapes, and
 * every position read is finite, longitude within ±180 and latitude within ±90 (RFC 7946 §3.1.1).
 * Heights are NaN where the file gives none, as documented; any height given is finite.
 */

const position = fc.oneof(
  fc.tuple(fc.double({ min: -180, max: 180, noNaN: true }), fc.double({ min: -90, max: 90, noNaN: true })).map((p) => [...p]),
  fc.tuple(fc.double({ min: -180, max: 180, noNaN: true }), fc.double({ min: -90, max: 90, noNaN: true }), anyNumber).map((p) => [...p]),
  fc.array(fc.oneof(anyNumber, fc.string({ maxLength: 3 }), fc.constant(null)), { maxLength: 4 }),
  fc.anything({ maxDepth: 1 }),
);
const line = fc.oneof(fc.array(position, { maxLength: 5 }), fc.anything({ maxDepth: 1 }));
const geometry = fc.oneof(
  fc.record({ type: fc.constant('LineString'), coordinates: line }),
  fc.record({ type: fc.constant('MultiLineString'), coordinates: fc.oneof(fc.array(line, { maxLength: 3 }), fc.anything({ maxDepth: 1 })) }),
  fc.record({ type: fc.constantFrom('Point', 'Polygon', 'GeometryCollection', 'linestring'), coordinates: fc.anything({ maxDepth: 2 }) }),
  fc.constantFrom(null, undefined),
);
const feature = fc.record(
  { type: fc.constantFrom('Feature', 'feature'), id: fc.oneof(fc.string({ maxLength: 4 }), fc.integer(), fc.anything({ maxDepth: 0 })), geometry, properties: fc.oneof(fc.dictionary(fc.constantFrom('id', 'name', 'level'), fc.jsonValue({ maxDepth: 1 })), fc.anything({ maxDepth: 1 })) },
  { requiredKeys: ['type', 'geometry'] },
);
const document = fc.oneof(
  fc.record({ type: fc.constant('FeatureCollection'), features: fc.oneof(fc.array(feature, { maxLength: 3 }), fc.anything({ maxDepth: 1 })) }),
  feature,
  geometry,
);

function onlyLineworkErrors(text: string): void {
  let read;
  try {
    read = readLinework(text);
  } catch (e) {
    if (!(e instanceof LineworkError)) throw new Error(`readLinework threw ${String(e)} for ${text.slice(0, 300)}`);
    return;
  }
  expect(nonFiniteNumbers(read, { allowNaNAt: (p) => /\.heights\[\d+\]$/.test(p) })).toEqual([]);
  for (const f of read) {
    for (const part of f.parts) {
      for (let i = 0; i < part.lonLat.length; i += 2) {
        expect(Math.abs(part.lonLat[i])).toBeLessThanOrEqual(180);
        expect(Math.abs(part.lonLat[i + 1])).toBeLessThanOrEqual(90);
      }
      expect(part.heights.length * 2).toBe(part.lonLat.length);
    }
  }
}

describe('readLinework never lets anything but LineworkError escape (fuzz)', () => {
  it('readLinework(text) on arbitrary text and JSON throws only LineworkError', () => {
    const pieces = ['{', '}', '[', ']', '"type"', ':', '"LineString"', '"Feature"', '"coordinates"', ',', '1', '-200', '1e999', 'null', '\ufeff'];
    fc.assert(fc.property(fc.oneof(textFrom(pieces, 40), fc.json({ maxDepth: 3 })), onlyLineworkErrors), { numRuns: fuzzRuns(2000) });
  }, fuzzTimeout());

  it('readLinework(text) on GeoJSON-shaped linework with any positions throws only LineworkError and reads only finite WGS 84 positions', () => {
    fc.assert(
      fc.property(document, (doc) => {
        const text = JSON.stringify(doc);
        if (text !== undefined) onlyLineworkErrors(text);
      }),
      { numRuns: fuzzRuns(2000) },
    );
  }, fuzzTimeout());
});
