import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { GeoJsonError, readGeoJsonStations } from '../../src/io/readGeoJson';
import { describeProblem } from '../../src/core/station';
import { nonFiniteNumbers } from '../helpers/finite';
import { anyNumber } from '../helpers/fuzzArbitraries';
import { fuzzRuns, fuzzTimeout } from '../helpers/fuzzRuns';

/**
 * Fuzzing readGeoJsonStations with station-shaped GeoJSON (issue #8, point 5): Point features
 * whose coordinates are any numbers (written as 1e999 too, which JSON.parse reads as Infinity)
 * or anything at all, and whose properties hold attitudes, kinds and dates as text, numbers or
 * other JSON. Only GeoJsonError escapes, and no station holds NaN or Infinity. (The free-JSON
 * fuzz property is in readGeoJson.test.ts.)
 */

const coordinate = fc.oneof(fc.double({ min: -200, max: 200, noNaN: true }), anyNumber, fc.constantFrom('15', null, true));
const point = fc.oneof(
  fc.record({ type: fc.constant('Point'), coordinates: fc.array(coordinate, { minLength: 2, maxLength: 3 }) }),
  fc.record({ type: fc.constantFrom('Point', 'LineString', 'MultiPoint'), coordinates: fc.anything({ maxDepth: 2 }) }),
  fc.constantFrom(null),
);
const value = fc.oneof(fc.constantFrom('bedding', 'hinge', 'S1', '120', '95', '030/45SE', 'N30E', '2025-06-01', 'OT', '', '1e400'), anyNumber, fc.jsonValue({ maxDepth: 1 }));
const properties = fc.oneof(fc.dictionary(fc.constantFrom('id', 'kind', 'dipdir', 'dip', 'strike', 'trend', 'plunge', 'elevation', 'date', 'attitude', 'notes', '__proto__'), value, { maxKeys: 6 }), fc.constantFrom(null, [], 'x'));
const collection = fc.record({ type: fc.constant('FeatureCollection'), features: fc.array(fc.record({ type: fc.constant('Feature'), geometry: point, properties }), { minLength: 1, maxLength: 4 }) });

describe('readGeoJsonStations never lets anything but GeoJsonError escape (fuzz)', () => {
  it('readGeoJsonStations(text) on station-shaped GeoJSON with any coordinates and properties gives finite stations or a GeoJsonError', () => {
    fc.assert(
      fc.property(collection, fc.boolean(), (doc, textually) => {
        // JSON.stringify writes Infinity and NaN as null; the text form also writes them as 1e999.
        const text = JSON.stringify(doc, (k, v) => (typeof v === 'number' && !Number.isFinite(v) && textually ? `__NUM${v > 0 ? '' : '-'}__` : v)).replace(/"__NUM(-?)__"/g, '$11e999');
        let read;
        try {
          read = readGeoJsonStations(text);
        } catch (e) {
          if (!(e instanceof GeoJsonError)) throw new Error(`readGeoJsonStations threw ${String(e)} for ${text.slice(0, 300)}`);
          return;
        }
        for (const s of read.stations) {
          expect(nonFiniteNumbers(s), `station ${s.row} of ${text.slice(0, 300)}`).toEqual([]);
          if (s.lon !== undefined) expect(Math.abs(s.lon) <= 180 && Math.abs(s.lat!) <= 90).toBe(true);
          for (const p of s.problems) expect(describeProblem(p)).toMatch(/^row \d+/);
        }
      }),
      { numRuns: fuzzRuns(1500) },
    );
  }, fuzzTimeout());
});
