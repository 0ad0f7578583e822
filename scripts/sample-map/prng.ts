/**
 * Seeded pseudo-random numbers for the sample map, so that the same seed always gives the
 * same district, byte for byte.
 */

/** A source of uniform numbers in [0, 1) plus the derived draws the generator needs. */
export interface Random {
  /** Uniform in [0, 1). */
  next(): number;
  /** Uniform in [lo, hi). */
  uniform(lo: number, hi: number): number;
  /** Standard normal deviate times sigma. */
  gaussian(sigma: number): number;
  /** Integer in [0, n). */
  int(n: number): number;
}

/**
 * Mulberry32, a 32-bit generator with a single word of state (Tommy Ettinger's public-domain
 * design, widely reproduced); ample for placing a few thousand points, and trivially portable.
 * Normal deviates come from the Box-Muller transform (Box & Muller 1958, Ann. Math. Stat. 29).
 * @example
 * const rnd = createRandom(7); rnd.uniform(0, 10); // the same number on every run
 */
export function createRandom(seed: number): Random {
  let state = seed >>> 0;
  const next = (): number => {
    state = (state + 0x6d2b79f5) >>> 0;
    let t = state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
  return {
    next,
    uniform: (lo, hi) => lo + (hi - lo) * next(),
    gaussian: (sigma) => {
      // 1 - next() lies in (0, 1], so the logarithm is finite.
      const r = Math.sqrt(-2 * Math.log(1 - next()));
      return sigma * r * Math.cos(2 * Math.PI * next());
    },
    int: (n) => Math.floor(next() * n),
  };
}
