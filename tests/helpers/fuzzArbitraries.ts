import fc from 'fast-check';

/**
 * fast-check arbitraries shared by the fuzz properties (tests/**\/*.fuzz.test.ts): numbers that
 * break naive arithmetic, angles around their edges, and text from the alphabets the parsers
 * read, mixed with arbitrary Unicode.
 */

/** Edge values: zeros, limits of the double format, the angles where formulas turn (0, 90, 180, 360). */
export const EDGE_NUMBERS: readonly number[] = [
  0, -0, 1, -1, 90, -90, 180, 360, 359.9999999, 90.0000001, 1e-300, -1e-300, 5e-324, 1e-12, 1e300, -1e300, Number.MAX_VALUE, -Number.MAX_VALUE, 2 ** 53, 0.1 + 0.2,
];

/** Any finite double, edges drawn often. */
export const finiteNumber: fc.Arbitrary<number> = fc.oneof(
  fc.constantFrom(...EDGE_NUMBERS),
  fc.double({ noNaN: true, noDefaultInfinity: true }),
  fc.double({ min: -1000, max: 1000, noNaN: true }),
  fc.integer({ min: -400, max: 400 }),
);

/** Any number at all: finite ones, NaN and the infinities. */
export const anyNumber: fc.Arbitrary<number> = fc.oneof(finiteNumber, fc.constantFrom(Number.NaN, Number.POSITIVE_INFINITY, Number.NEGATIVE_INFINITY));

/** Angles in degrees in and around their ranges (negative, past 360, just past 90). */
export const angleLike: fc.Arbitrary<number> = fc.oneof(
  fc.constantFrom(0, 90, 180, 270, 360, -0, 89.9999999, 90.0000001, 1e-9, -1e-9),
  fc.double({ min: -720, max: 720, noNaN: true }),
  fc.integer({ min: 0, max: 360 }),
);

/** A trend (any finite azimuth) and a plunge from 0 to 90: a valid line. */
export const validLine = fc.record({ trend: fc.double({ min: -1e6, max: 1e6, noNaN: true }), plunge: fc.oneof(fc.constantFrom(0, 90), fc.double({ min: 0, max: 90, noNaN: true })) });

/** A dip direction (any finite azimuth) and a dip from 0 to 90: a valid plane. */
export const validPlane = fc.record({ dipDirection: fc.double({ min: -1e6, max: 1e6, noNaN: true }), dip: fc.oneof(fc.constantFrom(0, 90), fc.double({ min: 0, max: 90, noNaN: true })) });

/** A line whose fields may be anything numeric, valid or not. */
export const anyLine = fc.record({ trend: fc.oneof(angleLike, anyNumber), plunge: fc.oneof(angleLike, anyNumber) });

/** A plane whose fields may be anything numeric, valid or not. */
export const anyPlane = fc.record({ dipDirection: fc.oneof(angleLike, anyNumber), dip: fc.oneof(angleLike, anyNumber) });

/** Text from an alphabet, mixed with arbitrary strings (UTF-16 units included, lone surrogates too). */
export function textFrom(pieces: readonly string[], maxLength = 24): fc.Arbitrary<string> {
  return fc.oneof(
    fc.array(fc.constantFrom(...pieces), { maxLength }).map((a) => a.join('')),
    fc.string({ maxLength }),
    fc.string({ unit: 'binary', maxLength }),
  );
}

/**
 * A JSON document with one change at a random place: a value replaced by any JSON value, a key
 * removed, or an unknown key added. Deep mutations of a valid document reach the checks a
 * random document never gets past.
 * @example mutatedJson({ a: [1, 2] }) // draws e.g. { a: [1, "x"] } or { a: [1, 2], zz: null }
 */
export function mutatedJson(valid: unknown): fc.Arbitrary<unknown> {
  const paths: (string | number)[][] = [];
  const walk = (v: unknown, path: (string | number)[]): void => {
    paths.push(path);
    if (Array.isArray(v)) v.forEach((x, i) => walk(x, [...path, i]));
    else if (v !== null && typeof v === 'object') for (const [k, x] of Object.entries(v)) walk(x, [...path, k]);
  };
  walk(valid, []);
  const value = fc.oneof(fc.jsonValue({ maxDepth: 2 }), fc.constantFrom(1e999, -0, '', '__proto__', null, [], {}, 'NaN', 91, -1, 360));
  return fc.record({ at: fc.nat({ max: paths.length - 1 }), op: fc.constantFrom('replace', 'remove', 'add'), value, key: fc.constantFrom('zz', '__proto__', 'constructor', 'id', 'name') }).map(({ at, op, value: v, key }) => {
    const copy = JSON.parse(JSON.stringify(valid)) as unknown;
    const path = paths[at];
    if (path.length === 0) return op === 'replace' ? v : copy;
    let parent = copy as Record<string | number, unknown>;
    for (const p of path.slice(0, -1)) parent = parent[p] as Record<string | number, unknown>;
    const last = path[path.length - 1];
    if (op === 'replace') parent[last] = v;
    else if (op === 'remove') {
      if (Array.isArray(parent)) parent.splice(last as number, 1);
      else delete parent[last];
    } else {
      const target = parent[last];
      if (target !== null && typeof target === 'object' && !Array.isArray(target)) Object.defineProperty(target, key, { value: v, enumerable: true, configurable: true, writable: true });
      else if (Array.isArray(target)) target.push(v);
    }
    return copy;
  });
}
