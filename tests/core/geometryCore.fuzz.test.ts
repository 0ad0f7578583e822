import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import type { Line, Plane, Vec3 } from '../../src/core/types';
import { add, angleBetweenVectors, axialAngle, cross, dot, lineToVector, negate, norm, normalToPlane, normalize, planeNormal, planeOf, poleOf, scale, toLowerHemisphere, vectorToLine } from '../../src/core/vectors';
import { angleBetweenLines, angleBetweenPlanes, apparentDip, greatCirclePath, intersectionOfPlanes, planeThroughLines, rotateAboutAxis, smallCirclePath } from '../../src/core/geometry';
import { netRadius, projectLine, projectPath, projectVector, projectVectors, unprojectPoint, type Hemisphere, type NetKind } from '../../src/core/netProjection';
import { distanceFromGirdle, distancesFromGirdle, fitGirdle, fitGirdleToArray, fitGirdleToPlanes } from '../../src/core/girdle';
import { analyzeFold, analyzeFoldPoles } from '../../src/core/foldAnalysis';
import { profileFrame, profileToEnu, projectDownPlunge, projectPoint } from '../../src/core/downPlunge';
import { apparentDipAngle, apparentDipInSection, apparentPlungeInSection, exaggeratedAngle } from '../../src/core/apparentDip';
import { nonFiniteNumbers } from '../helpers/finite';
import { anyLine, anyNumber, anyPlane, angleLike, finiteNumber, validLine, validPlane } from '../helpers/fuzzArbitraries';
import { fuzzRuns, fuzzTimeout } from '../helpers/fuzzRuns';

/**
 * Fuzzing the geometry core (issue #8, point 5): vectors, geometry, netProjection, girdle,
 * foldAnalysis, downPlunge and apparentDip, on valid input, degenerate input (zero vectors,
 * parallel planes, vertical and horizontal lines, angles at 0, 90 and 360, huge and tiny
 * numbers) and invalid input (NaN, Infinity, dips past 90, unknown net kinds).
 *
 * Two properties everywhere: the only error that escapes is the documented RangeError, and a
 * result never holds NaN or Infinity. Where a function documents that it passes non-finite
 * input through (projectDownPlunge: "non-finite inputs give non-finite outputs at the same
 * index"), that is what is checked instead. The arithmetic helpers of vectors.ts (dot, cross,
 * add...) do not check their input; they are fuzzed with finite vectors of at most 1e6 per
 * component, far beyond any direction cosine or map coordinate passed to them.
 */

/** Runs f; a throw must be a RangeError; a result must hold only finite numbers. */
function onlyRangeErrors<T>(what: string, f: () => T): T | undefined {
  let r: T;
  try {
    r = f();
  } catch (e) {
    if (!(e instanceof RangeError)) throw new Error(`${what} threw ${String(e)}`);
    expect(e.message.length, what).toBeGreaterThan(0);
    return undefined;
  }
  expect(nonFiniteNumbers(r), what).toEqual([]);
  return r;
}

const show = (v: unknown): string => JSON.stringify(v, (_, x) => (typeof x === 'number' && !Number.isFinite(x) ? String(x) : x));

const component = fc.oneof(fc.constantFrom(0, -0, 1, -1, 1e-13, 1e-300, 1e6, -1e6), fc.double({ min: -1e6, max: 1e6, noNaN: true }));
/** Finite vectors, the zero vector and near-zero ones included. */
const finiteVector: fc.Arbitrary<Vec3> = fc.record({ x: component, y: component, z: component });
/** Vectors of anything numeric. */
const anyVector: fc.Arbitrary<Vec3> = fc.oneof(finiteVector, fc.record({ x: anyNumber, y: anyNumber, z: anyNumber }));
/** Unit vectors, from lines. */
const unitVector: fc.Arbitrary<Vec3> = validLine.map(lineToVector);
const kind: fc.Arbitrary<NetKind> = fc.constantFrom('equal-area', 'equal-angle', 'equal-area', 'bogus' as NetKind);
const hemisphere: fc.Arbitrary<Hemisphere> = fc.constantFrom('lower', 'upper', 'lower', 'middle' as Hemisphere);
const steps = fc.oneof(fc.integer({ min: 1, max: 400 }), fc.constantFrom(0, -1, 1.5, Number.NaN, Number.POSITIVE_INFINITY));
const inRange = (l: Line): boolean => l.trend >= 0 && l.trend < 360 && l.plunge >= 0 && l.plunge <= 90;
const planeInRange = (p: Plane): boolean => p.dipDirection >= 0 && p.dipDirection < 360 && p.dip >= 0 && p.dip <= 90;

describe('vectors.ts (fuzz)', () => {
  it('the vector arithmetic on finite vectors gives finite results; normalize and vectorToLine give a unit vector, an in-range line, or RangeError', () => {
    fc.assert(
      fc.property(finiteVector, finiteVector, fc.double({ min: -1e6, max: 1e6, noNaN: true }), (a, b, k) => {
        expect(nonFiniteNumbers([dot(a, b), cross(a, b), norm(a), scale(a, k), add(a, b), negate(a), toLowerHemisphere(a)])).toEqual([]);
        const u = onlyRangeErrors(`normalize(${show(a)})`, () => normalize(a));
        if (u) expect(Math.abs(norm(u) - 1)).toBeLessThan(1e-12);
        const l = onlyRangeErrors(`vectorToLine(${show(a)})`, () => vectorToLine(a));
        if (l) expect(inRange(l), show(l)).toBe(true);
        const p = onlyRangeErrors(`normalToPlane(${show(a)})`, () => normalToPlane(a));
        if (p) expect(planeInRange(p), show(p)).toBe(true);
        onlyRangeErrors(`angleBetweenVectors(${show(a)}, ${show(b)})`, () => angleBetweenVectors(a, b));
        onlyRangeErrors(`axialAngle(${show(a)}, ${show(b)})`, () => axialAngle(a, b));
      }),
      { numRuns: fuzzRuns(3000) },
    );
  }, fuzzTimeout());

  it('lineToVector, poleOf, planeOf and planeNormal on any finite angles give finite results, the azimuths in [0, 360)', () => {
    fc.assert(
      fc.property(fc.record({ trend: finiteNumber, plunge: finiteNumber }), fc.record({ dipDirection: finiteNumber, dip: finiteNumber }), (line, plane) => {
        expect(nonFiniteNumbers([lineToVector(line), poleOf(plane), planeOf(line), planeNormal(plane)])).toEqual([]);
        const pole = poleOf(plane);
        expect(pole.trend >= 0 && pole.trend < 360).toBe(true);
      }),
      { numRuns: fuzzRuns(3000) },
    );
  }, fuzzTimeout());
});

describe('geometry.ts (fuzz)', () => {
  it('planeThroughLines, intersectionOfPlanes, angleBetweenLines and angleBetweenPlanes on any input give in-range results or RangeError', () => {
    fc.assert(
      fc.property(fc.oneof(validLine, anyLine), fc.oneof(validLine, anyLine), fc.oneof(validPlane, anyPlane), fc.oneof(validPlane, anyPlane), (a, b, p, q) => {
        const plane = onlyRangeErrors(`planeThroughLines(${show(a)}, ${show(b)})`, () => planeThroughLines(a, b));
        if (plane) expect(planeInRange(plane), show(plane)).toBe(true);
        const line = onlyRangeErrors(`intersectionOfPlanes(${show(p)}, ${show(q)})`, () => intersectionOfPlanes(p, q));
        if (line) expect(inRange(line), show(line)).toBe(true);
        const al = onlyRangeErrors(`angleBetweenLines(${show(a)}, ${show(b)})`, () => angleBetweenLines(a, b));
        if (al !== undefined) expect(al >= 0 && al <= 90).toBe(true);
        const ap = onlyRangeErrors(`angleBetweenPlanes(${show(p)}, ${show(q)})`, () => angleBetweenPlanes(p, q));
        if (ap !== undefined) expect(ap >= 0 && ap <= 90).toBe(true);
      }),
      { numRuns: fuzzRuns(3000) },
    );
  }, fuzzTimeout());

  it('rotateAboutAxis, apparentDip, greatCirclePath and smallCirclePath on any input give finite results or RangeError', () => {
    fc.assert(
      fc.property(finiteVector, anyVector, fc.oneof(angleLike, anyNumber), fc.oneof(validPlane, anyPlane), fc.oneof(validLine, anyLine), steps, (v, axis, degrees, plane, line, n) => {
        onlyRangeErrors(`rotateAboutAxis(${show(v)}, ${show(axis)}, ${degrees})`, () => rotateAboutAxis(v, axis, degrees));
        // Signed: negative when the plane dips away from the direction of the section.
        const dip = onlyRangeErrors(`apparentDip(${show(plane)}, ${degrees})`, () => apparentDip(plane, degrees));
        if (dip !== undefined) expect(Math.abs(dip)).toBeLessThanOrEqual(90);
        onlyRangeErrors(`greatCirclePath(${show(plane)}, ${n})`, () => greatCirclePath(plane, n));
        onlyRangeErrors(`smallCirclePath(${show(line)}, ${degrees}, ${n})`, () => smallCirclePath(line, degrees, n));
      }),
      { numRuns: fuzzRuns(2000) },
    );
  }, fuzzTimeout());
});

describe('netProjection.ts (fuzz)', () => {
  it('netRadius, projectVector, projectLine and unprojectPoint on any input give points inside the net (or null) or RangeError', () => {
    fc.assert(
      fc.property(anyVector, fc.oneof(validLine, anyLine), fc.record({ x: fc.oneof(fc.double({ min: -1.5, max: 1.5, noNaN: true }), anyNumber), y: fc.oneof(fc.double({ min: -1.5, max: 1.5, noNaN: true }), anyNumber) }), kind, hemisphere, (v, line, p, k, h) => {
        const r = onlyRangeErrors(`netRadius(${line.plunge}, ${k})`, () => netRadius(line.plunge, k));
        if (r !== undefined) expect(r >= 0 && r <= 1 + 1e-12).toBe(true);
        for (const point of [onlyRangeErrors(`projectVector(${show(v)}, ${k}, ${h})`, () => projectVector(v, k, h)), onlyRangeErrors(`projectLine(${show(line)}, ${k}, ${h})`, () => projectLine(line, k, h))]) {
          if (point) expect(Math.hypot(point.x, point.y)).toBeLessThanOrEqual(1 + 1e-9);
        }
        const back = onlyRangeErrors(`unprojectPoint(${show(p)}, ${k}, ${h})`, () => unprojectPoint(p, k, h));
        if (back) expect(Math.abs(norm(back) - 1)).toBeLessThan(1e-9);
      }),
      { numRuns: fuzzRuns(3000) },
    );
  }, fuzzTimeout());

  it('projectVectors on any numbers and projectPath on any vectors give finite points or RangeError', () => {
    fc.assert(
      fc.property(fc.array(fc.oneof(component, anyNumber), { maxLength: 13 }), fc.array(fc.oneof(unitVector, finiteVector, anyVector), { maxLength: 6 }), kind, hemisphere, fc.constantFrom('flip', 'omit', 'bogus'), (xyz, path, k, h, mode) => {
        onlyRangeErrors(`projectVectors(${show(xyz)}, ${k})`, () => projectVectors(Float64Array.from(xyz), k, undefined, h));
        onlyRangeErrors(`projectPath(${show(path)}, ${k}, ${h}, ${mode})`, () => projectPath(path, k, h, { otherHemisphere: mode as 'flip' }));
      }),
      { numRuns: fuzzRuns(2000) },
    );
  }, fuzzTimeout());
});

describe('girdle.ts (fuzz)', () => {
  it('fitGirdle, fitGirdleToArray and fitGirdleToPlanes on any poles or planes give a finite fit or RangeError', () => {
    fc.assert(
      fc.property(fc.array(fc.oneof(unitVector, finiteVector), { maxLength: 8 }), fc.array(fc.oneof(validPlane, anyPlane), { maxLength: 8 }), (poles, planes) => {
        const fit = onlyRangeErrors(`fitGirdle(${show(poles)})`, () => fitGirdle(poles));
        if (fit) expect(inRange(fit.axis), show(fit.axis)).toBe(true);
        onlyRangeErrors(`fitGirdleToArray(${show(poles)})`, () => fitGirdleToArray(poles.flatMap((p) => [p.x, p.y, p.z])));
        onlyRangeErrors(`fitGirdleToPlanes(${show(planes)})`, () => fitGirdleToPlanes(planes));
      }),
      { numRuns: fuzzRuns(2000) },
    );
  }, fuzzTimeout());

  it('distanceFromGirdle and distancesFromGirdle on finite vectors give distances from 0 to 90 or RangeError', () => {
    fc.assert(
      fc.property(finiteVector, fc.oneof(unitVector, finiteVector), fc.array(unitVector, { maxLength: 5 }), (pole, axis, poles) => {
        const d = onlyRangeErrors(`distanceFromGirdle(${show(pole)}, ${show(axis)})`, () => distanceFromGirdle(pole, axis));
        if (d !== undefined) expect(d >= 0 && d <= 90).toBe(true);
        onlyRangeErrors(`distancesFromGirdle(${show(poles)}, ${show(axis)})`, () => distancesFromGirdle(poles.flatMap((p) => [p.x, p.y, p.z]), axis));
      }),
      { numRuns: fuzzRuns(3000) },
    );
  }, fuzzTimeout());
});

describe('foldAnalysis.ts (fuzz)', () => {
  // Degenerate sets drawn often: repeats, antipodal poles, vertical and horizontal planes.
  const planeSet = fc.oneof(
    fc.array(fc.oneof(validPlane, anyPlane), { maxLength: 8 }),
    fc.array(validPlane, { minLength: 1, maxLength: 3 }).chain((base) => fc.array(fc.constantFrom(...base, { dipDirection: base[0].dipDirection + 180, dip: base[0].dip }, { dipDirection: 0, dip: 90 }, { dipDirection: 0, dip: 0 }), { maxLength: 10 })),
  );

  it('analyzeFold({planes, lines}) on any planes and lines gives an analysis with no NaN or Infinity, or RangeError', () => {
    fc.assert(
      fc.property(planeSet, fc.option(fc.array(fc.oneof(validLine, anyLine), { maxLength: 4 }), { nil: undefined }), fc.constantFrom(0, 0, 10), fc.integer({ min: -5, max: 5 }), (planes, lines, bootstrap, seed) => {
        const a = onlyRangeErrors(`analyzeFold(${show({ planes, lines })})`, () => analyzeFold({ planes, ...(lines && { lines }) }, { bootstrap, seed }));
        if (a?.axis) expect(inRange(a.axis), show(a.axis)).toBe(true);
        // JSON-friendly as documented: nothing turns into null on the way to a file.
        if (a) expect(JSON.stringify(a)).not.toMatch(/null,\s*"[a-z]+":\s*null\]|NaN|Infinity/);
      }),
      { numRuns: fuzzRuns(300) },
    );
  }, fuzzTimeout());

  it('analyzeFoldPoles on unit poles (repeats and antipodes included) and bad options gives a finite analysis or RangeError', () => {
    fc.assert(
      fc.property(fc.array(unitVector, { maxLength: 8 }), fc.constantFrom(0, 5, -1, 1.5), fc.constantFrom(1, 0, 2.5), fc.boolean(), (poles, bootstrap, seed, doubled) => {
        const xyz = (doubled ? [...poles, ...poles.map(negate)] : poles).flatMap((p) => [p.x, p.y, p.z]);
        onlyRangeErrors(`analyzeFoldPoles(${show(xyz)})`, () => analyzeFoldPoles(xyz, { bootstrap, seed }));
      }),
      { numRuns: fuzzRuns(300) },
    );
  }, fuzzTimeout());
});

describe('downPlunge.ts (fuzz)', () => {
  it('profileFrame, projectPoint and profileToEnu on any axis give a finite orthonormal frame and finite points, or RangeError', () => {
    const metres = fc.double({ min: -1e8, max: 1e8, noNaN: true });
    fc.assert(
      fc.property(fc.oneof(validLine, anyLine), metres, metres, metres, (axis, e, n, h) => {
        const f = onlyRangeErrors(`profileFrame(${show(axis)})`, () => profileFrame(axis));
        if (f) for (const v of [f.axis, f.right, f.up]) expect(Math.abs(Math.hypot(...v) - 1)).toBeLessThan(1e-12);
        const p = onlyRangeErrors(`projectPoint([${e}, ${n}, ${h}], ${show(axis)})`, () => projectPoint([e, n, h], axis));
        if (p) onlyRangeErrors('profileToEnu', () => profileToEnu(new Float64Array([p.x, p.y, p.depth]), axis));
      }),
      { numRuns: fuzzRuns(3000) },
    );
  }, fuzzTimeout());

  it('projectDownPlunge passes non-finite positions through at their own index only, as documented, and gives finite numbers everywhere else', () => {
    // Positions are metres from a local origin: within ±1e12 m (far past any map; near 1e308 a
    // sum of two products overflows, a limit of the number format, not of the projection).
    const position = fc.oneof(fc.double({ min: -1e8, max: 1e8, noNaN: true }), fc.double({ min: -1e12, max: 1e12, noNaN: true }), fc.constantFrom(Number.NaN, Number.POSITIVE_INFINITY, Number.NEGATIVE_INFINITY));
    fc.assert(
      fc.property(fc.array(position, { maxLength: 12 }), validLine, (values, axis) => {
        const xyz = Float64Array.from(values.slice(0, values.length - (values.length % 3)));
        const out = onlyRangeErrorsAllowingNaN(() => projectDownPlunge(xyz, axis));
        for (let i = 0; i < xyz.length; i += 3) {
          const finiteIn = Number.isFinite(xyz[i]) && Number.isFinite(xyz[i + 1]) && Number.isFinite(xyz[i + 2]);
          if (finiteIn) expect([out[i], out[i + 1], out[i + 2]].every(Number.isFinite), `triple ${i / 3}`).toBe(true);
        }
      }),
      { numRuns: fuzzRuns(3000) },
    );
  }, fuzzTimeout());
});

/** projectDownPlunge is documented to pass non-finite input through; only the error type is checked here. */
function onlyRangeErrorsAllowingNaN(f: () => Float64Array): Float64Array {
  try {
    return f();
  } catch (e) {
    if (!(e instanceof RangeError)) throw new Error(`projectDownPlunge threw ${String(e)}`);
    return new Float64Array(0);
  }
}

describe('apparentDip.ts (fuzz)', () => {
  // Documented: NaN for a vertical plane whose strike runs along the section (the section lies
  // in the plane and shows no trace of it); the profile draws such planes as open rings.
  const noTrace = (dip: number, sinStrikeToSection: number): boolean => Math.sin((dip * Math.PI) / 180) * Math.abs(sinStrikeToSection) < 1e-15 && Math.cos((dip * Math.PI) / 180) < 1e-15;

  it('apparentDipAngle, apparentDipInSection, apparentPlungeInSection and exaggeratedAngle on any input give finite angles in range or RangeError; NaN only where documented', () => {
    fc.assert(
      fc.property(fc.oneof(angleLike, anyNumber), fc.oneof(angleLike, anyNumber), fc.oneof(validPlane, anyPlane), fc.oneof(validLine, anyLine), fc.oneof(fc.constantFrom(1, 2, 10, 0, -1), anyNumber), (a, b, plane, line, ve) => {
        const sinDeg = (x: number): number => Math.sin((x * Math.PI) / 180);
        for (const [what, f, documentedNaN, bound] of [
          [`apparentDipAngle(${a}, ${b})`, () => apparentDipAngle(a, b), () => noTrace(a, sinDeg(b)), 90],
          [`apparentDipInSection(${show(plane)}, ${b})`, () => apparentDipInSection(plane, b), () => noTrace(plane.dip, Math.cos((((b % 360) - (plane.dipDirection % 360)) * Math.PI) / 180)), 90],
          [`apparentPlungeInSection(${show(line)}, ${b})`, () => apparentPlungeInSection(line, b), () => false, 90],
          // Any angle may be stretched (atan2 keeps its quadrant): within ±180.
          [`exaggeratedAngle(${a}, ${ve})`, () => exaggeratedAngle(a, ve), () => false, 180],
        ] as const) {
          let r: number;
          try {
            r = f();
          } catch (e) {
            if (!(e instanceof RangeError)) throw new Error(`${what} threw ${String(e)}`);
            continue;
          }
          if (Number.isNaN(r) && documentedNaN()) continue;
          expect(Number.isFinite(r), `${what} gave ${r}`).toBe(true);
          expect(Math.abs(r), what).toBeLessThanOrEqual(bound + 1e-9);
        }
      }),
      { numRuns: fuzzRuns(3000) },
    );
  }, fuzzTimeout());
});
