import { describe, it, expect } from 'vitest';
import { createRandom } from '../../src/core/random';

describe('createRandom', () => {
  // Reference outputs of the C form of mulberry32 as published by its author (from memory),
  // compiled with gcc here: uint32 state += 0x6D2B79F5, two multiply-xorshift rounds.
  const rows = [
    { seed: 0, expected: [1144304738, 1416247, 958946056, 627933444, 2007157716] },
    { seed: 1, expected: [2693262067, 11749833, 2265367787, 4213581821, 4159151403] },
    { seed: 123456789, expected: [1107202814, 4169434471, 3372958138, 885470128, 1301683845] },
    { seed: 4294967295, expected: [3850105811, 813802916, 3073704848] },
  ];
  for (const { seed, expected } of rows) {
    it(`createRandom(${seed}).nextUint32() matches the C reference stream`, () => {
      const rng = createRandom(seed);
      expect(expected.map(() => rng.nextUint32())).toEqual(expected);
    });
  }

  it('createRandom(-1) gives the same stream as createRandom(4294967295) (seed taken modulo 2^32)', () => {
    const a = createRandom(-1);
    const b = createRandom(4294967295);
    for (let i = 0; i < 10; i++) expect(a.next()).toBe(b.next());
  });

  it('createRandom(seed).next() stays in [0, 1) and is roughly uniform over 10 bins (chi-square, 9 d.f.)', () => {
    const rng = createRandom(2024);
    const bins = new Array(10).fill(0);
    const draws = 100_000;
    let lo = 1;
    let hi = 0;
    for (let i = 0; i < draws; i++) {
      const u = rng.next();
      lo = Math.min(lo, u);
      hi = Math.max(hi, u);
      bins[Math.floor(u * 10)]++;
    }
    expect(lo).toBeGreaterThanOrEqual(0);
    expect(hi).toBeLessThan(1);
    const e = draws / 10;
    const chi2 = bins.reduce((s, o) => s + ((o - e) * (o - e)) / e, 0);
    // 27.88 is the 0.999 quantile of chi-square with 9 degrees of freedom (standard tables).
    expect(chi2).toBeLessThan(27.88);
  });

  it('createRandom(seed).nextInt(n) returns every integer of [0, n) and nothing else', () => {
    const rng = createRandom(5);
    const seen = new Set<number>();
    for (let i = 0; i < 2000; i++) {
      const k = rng.nextInt(7);
      expect(Number.isInteger(k) && k >= 0 && k < 7).toBe(true);
      seen.add(k);
    }
    expect([...seen].sort()).toEqual([0, 1, 2, 3, 4, 5, 6]);
  });

  it('createRandom(1.5) and nextInt(0) throw errors that name the value', () => {
    expect(() => createRandom(1.5)).toThrow(/1\.5 is not an integer/);
    expect(() => createRandom(1).nextInt(0)).toThrow(/0 is not a positive integer/);
  });
});
