import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import { normalizeEigenvalues, readFabric, vollmerIndices, woodcockIndices } from '../../src/core/shapeIndices';
import { expectClose, expectDeepClose } from '../helpers/tolerance';

describe('woodcockIndices / vollmerIndices', () => {
  // Expected values: K = ln(S1/S2)/ln(S2/S3), C = ln(S1/S3) (Woodcock 1977), P = S1-S2, G = 2(S2-S3),
  // R = 3·S3 (Vollmer 1990); formulas from memory, values worked with a calculator (Python math.log).
  const rows = [
    // /work/shared/REFERENCES.md, "Orientation tensor" checks (derived).
    { s: [0.6, 0.3, 0.1], K: 0.63093, C: 1.791759, P: 0.3, G: 0.4, R: 0.3 },
    // derived: ln(5/3)/ln(3/2) = 1.259851, ln(2.5) = 0.916291
    { s: [0.5, 0.3, 0.2], K: 1.259851, C: 0.916291, P: 0.2, G: 0.2, R: 0.6 },
    // derived: ln(3.5)/ln(2) = 1.807355, ln(7) = 1.945910
    { s: [0.7, 0.2, 0.1], K: 1.807355, C: 1.94591, P: 0.5, G: 0.2, R: 0.3 },
    // derived: ln(1.125)/ln(8/3) = 0.120085, ln(3) = 1.098612
    { s: [0.45, 0.4, 0.15], K: 0.120085, C: 1.098612, P: 0.05, G: 0.5, R: 0.45 },
  ];
  for (const { s, K, C, P, G, R } of rows) {
    it(`woodcockIndices([${s}]) is K ${K}, C ${C} and vollmerIndices gives P ${P}, G ${G}, R ${R}`, () => {
      const w = woodcockIndices(s);
      expectClose(w.K as number, K, 1e-6, 'K');
      expectClose(w.C as number, C, 1e-6, 'C');
      expect(w.note).toBeNull();
      expectDeepClose(vollmerIndices(s), { P, G, R }, 1e-12);
    });
  }

  it('woodcockIndices([0.5, 0.5, 0]) gives K = 0 (its limit) and C = null for a perfect girdle', () => {
    const w = woodcockIndices([0.5, 0.5, 0]);
    expect(w.K).toBe(0);
    expect(w.C).toBeNull();
    expect(w.note).toMatch(/one great circle/);
  });

  it('woodcockIndices([1, 0, 0]) gives K = C = null for vectors all on one line', () => {
    expect(woodcockIndices([1, 0, 0])).toMatchObject({ K: null, C: null });
  });

  it('woodcockIndices([0.8, 0.1, 0.1]) gives K = null (unbounded) and C = ln 8 for a rotationally symmetric cluster', () => {
    const w = woodcockIndices([0.8, 0.1, 0.1]);
    expect(w.K).toBeNull();
    // derived: ln(0.8/0.1) = ln 8 = 2.079442
    expectClose(w.C as number, 2.079442, 1e-6, 'C');
    expect(w.note).toMatch(/rotationally symmetric/);
  });

  it('woodcockIndices of equal eigenvalues gives K = null and C = 0 (uniform spread)', () => {
    const w = woodcockIndices([1 / 3, 1 / 3, 1 / 3]);
    expect(w.K).toBeNull();
    expectClose(w.C as number, 0, 1e-12, 'C');
    expect(w.note).toMatch(/uniform/);
  });

  it('woodcockIndices and vollmerIndices never return NaN or Infinity, and P + G + R = 1 (property)', () => {
    const part = fc.oneof(fc.constant(0), fc.constant(1), fc.double({ min: 0, max: 1, noNaN: true }));
    fc.assert(
      fc.property(part, part, part, (a, b, c) => {
        fc.pre(a + b + c > 0);
        const w = woodcockIndices([a, b, c]);
        for (const v of [w.K, w.C]) expect(v === null || Number.isFinite(v)).toBe(true);
        const v = vollmerIndices([a, b, c]);
        expectClose(v.P + v.G + v.R, 1, 1e-12, 'P + G + R');
        expect(v.P >= 0 && v.G >= 0 && v.R >= 0).toBe(true);
      }),
      { numRuns: 2000, seed: 3 },
    );
  });
});

describe('normalizeEigenvalues', () => {
  it('normalizeEigenvalues([1, 3, 6]) sorts and scales to [0.6, 0.3, 0.1]', () => {
    expectDeepClose(normalizeEigenvalues([1, 3, 6]), [0.6, 0.3, 0.1], 1e-15);
  });
  it('normalizeEigenvalues clears a rounding negative to 0', () => {
    expect(normalizeEigenvalues([0.5, 0.5, -1e-17])[2]).toBe(0);
  });
  it('normalizeEigenvalues rejects a real negative, a NaN and a zero sum with messages that name the value', () => {
    expect(() => normalizeEigenvalues([0.6, 0.5, -0.1])).toThrow(/-0.1 is negative/);
    expect(() => normalizeEigenvalues([0.6, Number.NaN, 0])).toThrow(/eigenvalues\[1\]: NaN/);
    expect(() => normalizeEigenvalues([0, 0, 0])).toThrow(/sum 0 is not positive/);
  });
});

describe('readFabric', () => {
  // Rules are Foldlens's convention (see shapeIndices.ts): uniform when R is the largest of P, G, R;
  // else cluster when K > 1 (Woodcock 1977's dividing line, from memory), girdle otherwise; strength from C.
  const rows = [
    { s: [0.6, 0.3, 0.1], shape: 'girdle', strength: 'weak' }, // K 0.63, C 1.79; G 0.4 largest
    { s: [0.7, 0.2, 0.1], shape: 'cluster', strength: 'weak' }, // K 1.81, C 1.95; P 0.5 largest
    { s: [0.5, 0.3, 0.2], shape: 'uniform', strength: null }, // R 0.6 largest
    { s: [0.6, 0.38, 0.02], shape: 'girdle', strength: 'moderate' }, // K 0.16, C = ln 30 = 3.40
    { s: [0.96, 0.03, 0.01], shape: 'cluster', strength: 'strong' }, // K = ln 32/ln 3 = 3.15, C = ln 96 = 4.56
    { s: [0.5, 0.5, 0], shape: 'girdle', strength: 'perfect' }, // K = 0 by limit, C unbounded
    { s: [1, 0, 0], shape: 'cluster', strength: 'perfect' }, // one line
    { s: [1 / 3, 1 / 3, 1 / 3], shape: 'uniform', strength: null },
  ];
  for (const { s, shape, strength } of rows) {
    it(`readFabric([${s.map((x) => x.toFixed(3))}]) reads "${strength ?? ''} ${shape}"`, () => {
      const r = readFabric(s);
      expect(r.shape).toBe(shape);
      expect(r.strength).toBe(strength);
      expect(r.text).toContain(shape);
    });
  }
});
