import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { CrsError, builtInCrs, crsFromText, fromLonLat, gridConvergence, inArea, lonLatProblem, resolveCrs, toLonLat, utmZoneFor, type Crs, type EpsgRecord } from '../../src/io/crs';
import { nonFiniteNumbers } from '../helpers/finite';
import { anyNumber, finiteNumber, textFrom } from '../helpers/fuzzArbitraries';
import { fuzzRuns, fuzzTimeout } from '../helpers/fuzzRuns';

/**
 * Fuzzing the CRS parser and conversions of io/crs.ts (issue #8, point 5): text that looks like
 * EPSG codes, URNs, UTM zones, built-in names and proj4 definitions, and coordinates of any size.
 * Only CrsError escapes; every CRS read and every converted point is finite.
 *
 * proj4 definitions are built from a fixed set of parameters, so the number of different
 * definitions stays small: crs.ts keeps one converter per definition it has used.
 */

const PIECES = [
  'EPSG', 'epsg', ':', '::', 'urn:ogc:def:crs:EPSG::', 'urn:ogc:def:crs:EPSG:9.9:', '326', '327', '33', '4326', '3857', '27700', '2056', '99999', '0', '1', '60', '61',
  'UTM', 'utm', 'zone', ' ', '\t', 'N', 'S', 'n', 's', 'bng', 'BNG', 'lv95', 'wgs84', 'web mercator', 'CRS84', '+', '=', '-', '.',
];
const PROJ_PARAMS = [
  '+proj=utm', '+proj=merc', '+proj=longlat', '+proj=tmerc', '+proj=lcc', '+proj=laea', '+proj=somerc', '+proj=sterea', '+proj=aea', '+proj=bogus', '+proj=',
  '+zone=33', '+zone=0', '+zone=99', '+zone=x', '+south', '+datum=WGS84', '+datum=none', '+ellps=GRS80', '+ellps=nope', '+lat_0=46.5', '+lat_0=95', '+lon_0=3', '+lon_0=1e308',
  '+lat_1=49', '+lat_2=44', '+lat_1=0', '+lat_2=0', '+k=0.9996', '+k=0', '+k=-1', '+x_0=500000', '+y_0=1e300', '+units=m', '+units=ft', '+no_defs', '+towgs84=0,0,0', '+towgs84=x',
  '+nadgrids=@null', '+nadgrids=missing.gsb', '+a=6378137', '+a=0', '+b=6356752', '+rf=0', '+over',
];
const crsText = fc.oneof(
  textFrom(PIECES, 8),
  fc.array(fc.constantFrom(...PROJ_PARAMS), { minLength: 1, maxLength: 6 }).map((p) => (p[0].startsWith('+proj=') ? p : ['+proj=utm', ...p]).join(' ')),
);

/** Runs f; a throw must be a CrsError; a result must hold only finite numbers. */
function onlyCrsErrors<T>(what: string, f: () => T): T | undefined {
  let r: T;
  try {
    r = f();
  } catch (e) {
    if (!(e instanceof CrsError)) throw new Error(`${what} threw ${String(e)}`);
    return undefined;
  }
  expect(nonFiniteNumbers(r), what).toEqual([]);
  return r;
}

const builtIn = fc.constantFrom(32633, 32755, 32601, 32760, 25832, 26915, 4326, 3857, 27700, 29903, 2157, 2193, 2154, 2056, 28992, 3006, 3035, 31370, 5070).map((c) => builtInCrs(c)!);

describe('io/crs.ts never lets anything but CrsError escape (fuzz)', () => {
  it('crsFromText(text) on EPSG-, UTM-, name- and proj4-like text throws only CrsError and gives only finite areas', () => {
    fc.assert(fc.property(crsText, (t) => void onlyCrsErrors(`crsFromText(${JSON.stringify(t)})`, () => crsFromText(t))), { numRuns: fuzzRuns(1000) });
  }, fuzzTimeout());

  it('toLonLat, fromLonLat and gridConvergence on any coordinates in any CRS read from text throw only CrsError and give finite numbers', () => {
    const crs: fc.Arbitrary<Crs | undefined> = fc.oneof(builtIn, crsText.map((t) => onlyCrsErrors('crsFromText', () => crsFromText(t))));
    fc.assert(
      fc.property(crs, anyNumber, anyNumber, (c, a, b) => {
        if (!c) return;
        onlyCrsErrors(`toLonLat(${a}, ${b}, ${c.proj4})`, () => toLonLat(a, b, c));
        onlyCrsErrors(`fromLonLat(${a}, ${b}, ${c.proj4})`, () => fromLonLat(a, b, c));
        onlyCrsErrors(`gridConvergence(${a}, ${b}, ${c.proj4})`, () => gridConvergence(a, b, c));
        expect(typeof inArea(a, b, c)).toBe('boolean');
      }),
      { numRuns: fuzzRuns(1000) },
    );
  }, fuzzTimeout());

  it('resolveCrs(text, loader) with a loader that answers anything throws only CrsError and gives only finite numbers', async () => {
    const record: fc.Arbitrary<EpsgRecord | undefined | Error> = fc.oneof(
      fc.record({
        code: fc.string({ maxLength: 6 }),
        kind: fc.constantFrom('CRS-PROJCRS', 'CRS-GEOGCRS', 'CRS-VERTCRS', 'CRS-GCENCRS', 'CRS-ENGCRS', '', 'constructor', '__proto__'),
        name: fc.string({ maxLength: 10 }),
        proj4: fc.oneof(crsText, fc.constant('')),
        // The EPSG index is shipped data: its boxes are numbers.
        bbox: fc.oneof(fc.constant(undefined), fc.array(fc.double({ min: -180, max: 180, noNaN: true }), { minLength: 4, maxLength: 4 }), fc.array(fc.double({ noNaN: true }), { maxLength: 3 })),
      }) as fc.Arbitrary<EpsgRecord>,
      fc.constant(undefined),
      fc.constant(new Error('index unreadable')),
    );
    await fc.assert(
      fc.asyncProperty(fc.oneof(fc.integer({ min: 1000, max: 999_999 }).map((n) => `EPSG:${n}`), crsText), record, async (t, r) => {
        const loader = async (): Promise<EpsgRecord | undefined> => {
          if (r instanceof Error) throw r;
          return r;
        };
        let crs: Crs;
        try {
          crs = await resolveCrs(t, loader);
        } catch (e) {
          if (!(e instanceof CrsError)) throw new Error(`resolveCrs(${JSON.stringify(t)}) threw ${String(e)}`);
          return;
        }
        expect(nonFiniteNumbers(crs)).toEqual([]);
      }),
      { numRuns: fuzzRuns(1000) },
    );
  }, fuzzTimeout());

  it('utmZoneFor and lonLatProblem on any numbers: a zone from 1 to 60 or CrsError; a reason or undefined, never a throw', () => {
    fc.assert(
      fc.property(fc.oneof(anyNumber, finiteNumber), anyNumber, (lon, lat) => {
        const z = onlyCrsErrors(`utmZoneFor(${lon}, ${lat})`, () => utmZoneFor(lon, lat));
        if (z) expect(z.zone >= 1 && z.zone <= 60 && Number.isInteger(z.zone)).toBe(true);
        const why = lonLatProblem(lon, lat);
        expect(why === undefined || typeof why === 'string').toBe(true);
      }),
      { numRuns: fuzzRuns(2000) },
    );
  }, fuzzTimeout());
});
