import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import { normalizeKind, KIND_WORD_TABLE } from '../../src/io/kinds';
import { LINE_KINDS, PLANE_KINDS } from '../../src/core/types';
import { fuzzRuns, fuzzTimeout } from '../helpers/fuzzRuns';

describe('normalizeKind(word)', () => {
  // Kind words of the trade (common practice) and the kind each names.
  const rows = [
    { word: 'bedding', kind: 'bedding' },
    { word: 'Bed', kind: 'bedding' },
    { word: 'S0', kind: 'bedding' },
    { word: 'foliation', kind: 'foliation' },
    { word: 'S1', kind: 'foliation' },
    { word: 'schistosity', kind: 'foliation' },
    { word: 'Slaty cleavage', kind: 'cleavage' },
    { word: 'joints', kind: 'joint' },
    { word: 'FLT', kind: 'fault' },
    { word: 'vein', kind: 'vein' },
    { word: 'F2 axial plane', kind: 'axial-plane' },
    { word: 'axial_surface', kind: 'axial-plane' },
    { word: 'contact', kind: 'contact' },
    { word: 'L1', kind: 'lineation' },
    { word: 'hinge', kind: 'hinge' },
    { word: 'Fold axis', kind: 'hinge' },
    { word: 'fold axes', kind: 'hinge' },
    { word: 'F1 hinge', kind: 'hinge' },
    { word: 'intersection lineation', kind: 'intersection' },
    { word: 'L0-1', kind: 'intersection' },
    { word: 'slickenlines', kind: 'slickenline' },
    { word: 'mineral lineation', kind: 'mineral-lineation' },
    { word: ' plane ', kind: 'plane' },
    { word: 'line', kind: 'line' },
  ];
  for (const { word, kind } of rows) {
    it(`normalizeKind(${JSON.stringify(word)}) is ${kind}`, () => {
      expect(normalizeKind(word)).toBe(kind);
    });
  }

  for (const word of ['', 'pebble', 'F1', 'dyke', 'bedding?', 'S9x']) {
    it(`normalizeKind(${JSON.stringify(word)}) is undefined: no guess for a word not in the table`, () => {
      expect(normalizeKind(word)).toBeUndefined();
    });
  }

  it('KIND_WORD_TABLE names only kinds that types.ts defines', () => {
    const kinds = new Set<string>([...PLANE_KINDS, ...LINE_KINDS]);
    for (const [word, kind] of KIND_WORD_TABLE) expect(kinds.has(kind), word).toBe(true);
    for (const kind of kinds) expect(normalizeKind(kind), kind).toBe(kind);
  });

  it('normalizeKind(word) never throws on arbitrary text (fuzz)', () => {
    fc.assert(fc.property(fc.string({ maxLength: 30 }), (w) => {
      const k = normalizeKind(w);
      expect(k === undefined || typeof k === 'string').toBe(true);
    }), { numRuns: fuzzRuns(100) });
  }, fuzzTimeout());
});
