import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { FIELDS, detectColumns, parseColumnMapping } from '../../src/io/columns';
import { fuzzRuns, fuzzTimeout } from '../helpers/fuzzRuns';

/**
 * Fuzzing parseColumnMapping, the reader of saved column mappings (issue #8, point 5): on any
 * JSON value it throws only its documented TypeError, and what it accepts maps fields to text
 * only, as own properties. (detectColumns has its fuzz property in columns.test.ts.)
 */

describe('parseColumnMapping never lets anything but TypeError escape (fuzz)', () => {
  it('parseColumnMapping(json) on any JSON value throws only TypeError and returns fields mapped to text', () => {
    const key = fc.oneof(fc.constantFrom(...FIELDS, 'bogus', '__proto__', 'constructor', 'toString', ''), fc.string({ maxLength: 8 }));
    const value = fc.oneof(fc.string({ maxLength: 8 }), fc.jsonValue({ maxDepth: 1 }));
    const mapping = fc.oneof(fc.jsonValue({ maxDepth: 3 }), fc.dictionary(key, value, { maxKeys: 5 }), fc.string().map((s) => JSON.parse(JSON.stringify({ [s]: s })) as unknown));
    fc.assert(
      fc.property(mapping, (json) => {
        let m;
        try {
          m = parseColumnMapping(json);
        } catch (e) {
          if (!(e instanceof TypeError)) throw new Error(`parseColumnMapping(${JSON.stringify(json)}) threw ${String(e)}`);
          return;
        }
        expect(Object.getPrototypeOf(m)).toBe(Object.prototype);
        for (const [field, column] of Object.entries(m)) {
          expect((FIELDS as readonly string[]).includes(field)).toBe(true);
          expect(typeof column).toBe('string');
        }
        // A mapping read back is usable as overrides: detection never throws on it.
        expect(() => detectColumns(Object.values(m), m)).not.toThrow();
      }),
      { numRuns: fuzzRuns(3000) },
    );
  }, fuzzTimeout());
});
