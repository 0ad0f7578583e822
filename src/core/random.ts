/**
 * Seeded pseudo-random numbers, so that every resampled or sampled result in Foldlens
 * (bootstrap cones, sampled beta pairs) can be reproduced exactly from its seed.
 *
 * Generator: mulberry32 (Tommy Ettinger, public domain), a 32-bit state generator with
 * period 2^32. It is not of cryptographic quality; it is quick, tiny and good enough for
 * resampling statistics where only a few million draws are made.
 */

/** A seeded stream of pseudo-random numbers. Each call advances the stream. */
export interface Random {
  /** The seed the stream was created with (an integer, as given). */
  readonly seed: number;
  /** Next 32-bit unsigned integer in [0, 2^32). */
  nextUint32(): number;
  /** Next number in [0, 1), with 32 random bits. */
  next(): number;
  /**
   * Next integer in [0, n). Uses floor(next() * n): the bias is below n / 2^32 per value,
   * negligible for the index ranges used here (n up to a few million).
   */
  nextInt(n: number): number;
}

/**
 * Creates a seeded mulberry32 stream. The seed must be an integer; it is taken modulo 2^32,
 * so -1 and 4294967295 give the same stream.
 * @example
 * const rng = createRandom(42);
 * rng.next(); // a number in [0, 1), the same every time for seed 42
 */
export function createRandom(seed: number): Random {
  if (!Number.isInteger(seed)) {
    throw new RangeError(`random seed: ${String(seed)} is not an integer (expected a whole number)`);
  }
  let state = seed >>> 0;
  const nextUint32 = (): number => {
    // mulberry32 step: add the Weyl constant, then two multiply-xorshift rounds.
    state = (state + 0x6d2b79f5) | 0;
    let z = state;
    z = Math.imul(z ^ (z >>> 15), z | 1);
    z ^= z + Math.imul(z ^ (z >>> 7), z | 61);
    return (z ^ (z >>> 14)) >>> 0;
  };
  const next = (): number => nextUint32() / 4294967296;
  const nextInt = (n: number): number => {
    if (!(Number.isInteger(n) && n > 0)) {
      throw new RangeError(`nextInt: ${String(n)} is not a positive integer (expected the size of a range)`);
    }
    return Math.floor(next() * n);
  };
  return { seed, nextUint32, next, nextInt };
}
