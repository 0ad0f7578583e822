import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import { readFileSync } from 'node:fs';
import proj4 from 'proj4';
import {
  builtInCrs,
  crsFromText,
  resolveCrs,
  toLonLat,
  fromLonLat,
  utmZoneFor,
  gridConvergence,
  lonLatProblem,
  inArea,
  describeArea,
  CrsError,
  type Crs,
} from '../../src/io/crs';
import { loadEpsgFromIndex } from '../../src/io/epsgNode';
import { expectClose } from '../helpers/tolerance';

const DEG = Math.PI / 180;

function epsgRecord(code: number): { proj4: string; bbox: number[] } {
  return JSON.parse(readFileSync(new URL(`../../node_modules/epsg-index/s/${code}.json`, import.meta.url), 'utf8'));
}

describe('published projection examples through the built-in definitions', () => {
  it('builtInCrs(27700) projects EPSG Guidance Note 7-2 example: 50°30\'N 0°30\'E -> E 577274.99, N 69740.50', () => {
    // EPSG Guidance Note 7-2, transverse Mercator (method 9807) example: OSGB36 geographic
    // coordinates projected directly, so the datum shift is taken out of the definition here.
    const bng = builtInCrs(27700)!.proj4.replace(/\s*\+towgs84=\S+/, '');
    const [e, n] = proj4('+proj=longlat +ellps=airy +no_defs', bng, [0.5, 50.5]);
    expectClose(e, 577274.99, 0.02, 'easting');
    expectClose(n, 69740.5, 0.02, 'northing');
    const [lon, lat] = proj4('+proj=longlat +ellps=airy +no_defs', bng).inverse([577274.99, 69740.5]);
    expectClose(lon, 0.5, 1e-7, 'longitude back');
    expectClose(lat, 50.5, 1e-7, 'latitude back');
  });

  it('fromLonLat(-73.5, 40.5, tmerc on Clarke 1866) gives Snyder\'s (1987) example x 627106.5, y 4484124.4', () => {
    // Snyder 1987, Map Projections: A Working Manual, transverse Mercator ellipsoid example
    // (central meridian 75°W, k0 0.9996; x given with a 500 km false easting added here).
    const crs = crsFromText('+proj=tmerc +lat_0=0 +lon_0=-75 +k=0.9996 +x_0=500000 +y_0=0 +ellps=clrk66 +units=m +no_defs');
    const p = fromLonLat(-73.5, 40.5, crs);
    expectClose(p.x, 627106.5, 0.1, 'x');
    expectClose(p.y, 4484124.4, 0.1, 'y');
    const back = toLonLat(p.x, p.y, crs);
    expectClose(back.lon, -73.5, 1e-8, 'lon back');
    expectClose(back.lat, 40.5, 1e-8, 'lat back');
  });

  it('toLonLat(fromLonLat(p)) returns p for every built-in CRS inside its area (property)', () => {
    const codes = [32633, 32755, 25832, 26915, 4326, 3857, 27700, 29903, 2157, 2193, 2154, 2056, 28992, 3006, 3035, 31370, 5070];
    for (const code of codes) {
      const crs = builtInCrs(code)!;
      const a = crs.area!;
      fc.assert(
        fc.property(fc.double({ min: 0.1, max: 0.9, noNaN: true }), fc.double({ min: 0.1, max: 0.9, noNaN: true }), (u, v) => {
          const lon = a.west + u * (a.east - a.west);
          const lat = a.south + v * (a.north - a.south);
          const p = fromLonLat(lon, lat, crs);
          const back = toLonLat(p.x, p.y, crs);
          expectClose(back.lon, lon, 1e-6, `${crs.code} lon`);
          expectClose(back.lat, lat, 1e-6, `${crs.code} lat`);
        }),
        { numRuns: 30 },
      );
    }
  });
});

describe('builtInCrs(code)', () => {
  it('builtInCrs(code) gives the same proj4 definition as the epsg-index package for generated UTM zones and named grids', () => {
    // Reference: epsg-index 2.0.0 (the EPSG register as proj4 strings). 27700 differs on purpose (see crs.ts).
    const codes = [
      ...Array.from({ length: 60 }, (_, i) => 32601 + i),
      ...Array.from({ length: 60 }, (_, i) => 32701 + i),
      ...Array.from({ length: 10 }, (_, i) => 25828 + i),
      ...Array.from({ length: 23 }, (_, i) => 26901 + i),
      4326, 3857, 29903, 2157, 2193, 2154, 2056, 28992, 3006, 3035, 31370, 5070,
    ];
    for (const code of codes) {
      const theirs = epsgRecord(code).proj4.replace(' +type=crs', '').replace(' +wktext', '');
      expect(builtInCrs(code)?.proj4, `EPSG:${code}`).toBe(theirs);
    }
  });

  it('builtInCrs(code) areas contain the epsg-index area of use of every generated UTM zone', () => {
    for (const code of [32633, 32719, 25830, 26910]) {
      const [north, west, south, east] = epsgRecord(code).bbox;
      const a = builtInCrs(code)!.area!;
      expect(a.west <= west + 0.02 && a.east >= east - 0.02 && a.south <= south && a.north >= north, `EPSG:${code}`).toBe(true);
    }
  });

  it('builtInCrs(code) is undefined for codes outside the table (32661 is UPS North, not a UTM zone)', () => {
    expect(builtInCrs(32661)).toBeUndefined();
    expect(builtInCrs(2263)).toBeUndefined();
  });
});

describe('crsFromText(text) and resolveCrs(text, loader)', () => {
  const rows = [
    { text: 'EPSG:32633', code: 'EPSG:32633' },
    { text: 'epsg:32733', code: 'EPSG:32733' },
    { text: '27700', code: 'EPSG:27700' },
    { text: 'urn:ogc:def:crs:EPSG::2193', code: 'EPSG:2193' },
    { text: 'UTM 33N', code: 'EPSG:32633' },
    { text: 'utm33s', code: 'EPSG:32733' },
    { text: 'utm zone 5 n', code: 'EPSG:32605' },
    { text: 'British National Grid', code: 'EPSG:27700' },
    { text: 'WGS84', code: 'EPSG:4326' },
  ];
  for (const { text, code } of rows) {
    it(`crsFromText(${JSON.stringify(text)}) is ${code}`, () => {
      expect(crsFromText(text).code).toBe(code);
    });
  }

  it('crsFromText(text) refuses an unknown name and an EPSG code it cannot define without the index', () => {
    expect(() => crsFromText('Gauss-Boaga')).toThrow(CrsError);
    expect(() => crsFromText('Gauss-Boaga')).toThrow(/expected EPSG:<code>/);
    expect(() => crsFromText('EPSG:2263')).toThrow(/not in the built-in table/);
    expect(() => crsFromText('UTM 61N')).toThrow(CrsError);
  });

  it('resolveCrs("EPSG:2263", loadEpsgFromIndex) reads the definition from the epsg-index package', async () => {
    const crs = await resolveCrs('EPSG:2263', loadEpsgFromIndex);
    expect(crs.name).toBe('NAD83 / New York Long Island (ftUS)');
    expect(crs.geographic).toBe(false);
    // The same definition used directly through proj4 gives the same point.
    const direct = proj4(epsgRecord(2263).proj4).inverse([984000, 200000]);
    const ours = toLonLat(984000, 200000, crs);
    expectClose(ours.lon, direct[0], 1e-9, 'lon');
    expectClose(ours.lat, direct[1], 1e-9, 'lat');
  });

  it('resolveCrs(text, loader) makes a missing datum-shift grid optional and says so in notes', async () => {
    const crs = await resolveCrs('EPSG:4277', loadEpsgFromIndex);
    expect(crs.proj4).toContain('+nadgrids=@OSTN15_NTv2_OSGBtoETRS.gsb,@null');
    expect(crs.notes[0]).toMatch(/OSTN15_NTv2_OSGBtoETRS.gsb is not available/);
    const p = toLonLat(0.5, 50.5, crs);
    expect(Number.isFinite(p.lon) && Number.isFinite(p.lat)).toBe(true);
  });

  it('resolveCrs(text, loader) reports a code the index does not know, and does not ask for built-in ones', async () => {
    await expect(resolveCrs('EPSG:99999', loadEpsgFromIndex)).rejects.toThrow(/EPSG:99999 is not a coordinate reference system/);
    let asked = 0;
    await resolveCrs('EPSG:2056', async () => {
      asked++;
      return undefined;
    });
    expect(asked).toBe(0);
  });
});

describe('utmZoneFor(lon, lat)', () => {
  // Zone = floor((lon + 180) / 6) + 1, with the Norway (32V) and Svalbard (31X-37X) exceptions: common practice.
  const rows = [
    { lon: 15.2, lat: 45.1, zone: 33, hemisphere: 'N', epsg: 32633 },
    { lon: -0.1, lat: 51.5, zone: 30, hemisphere: 'N', epsg: 32630 },
    { lon: -70.6, lat: -33.4, zone: 19, hemisphere: 'S', epsg: 32719 },
    { lon: 5.3, lat: 60.4, zone: 32, hemisphere: 'N', epsg: 32632 },
    { lon: 10, lat: 78, zone: 33, hemisphere: 'N', epsg: 32633 },
    { lon: 179.9, lat: 0, zone: 60, hemisphere: 'N', epsg: 32660 },
    { lon: -180, lat: -1, zone: 1, hemisphere: 'S', epsg: 32701 },
    { lon: 180, lat: 10, zone: 1, hemisphere: 'N', epsg: 32601 },
  ];
  for (const r of rows) {
    it(`utmZoneFor(${r.lon}, ${r.lat}) is zone ${r.zone}${r.hemisphere}`, () => {
      expect(utmZoneFor(r.lon, r.lat)).toEqual({ zone: r.zone, hemisphere: r.hemisphere, epsg: r.epsg });
    });
  }

  it('utmZoneFor(lon, lat) refuses a latitude beyond 90', () => {
    expect(() => utmZoneFor(10, 95)).toThrow(CrsError);
  });
});

describe('gridConvergence(lon, lat, crs)', () => {
  it('gridConvergence on a spherical transverse Mercator is atan(tan Δλ · sin φ), even 10° from the meridian', () => {
    // Derived: spherical TM (Snyder 1987) x = R·atanh(cos φ sin Δλ), y = R·atan(tan φ / cos Δλ);
    // along a meridian dx/dy = -sin φ tan Δλ, so tan γ = tan Δλ · sin φ.
    const crs = crsFromText('+proj=tmerc +approx +lat_0=0 +lon_0=0 +k=1 +x_0=0 +y_0=0 +a=6371000 +b=6371000 +units=m +no_defs');
    for (const [lon, lat] of [[10, 45], [-10, 45], [5, -30], [-3, 70], [0, 20]]) {
      const expected = Math.atan(Math.tan(lon * DEG) * Math.sin(lat * DEG)) / DEG;
      expectClose(gridConvergence(lon, lat, crs), expected, 1e-6, `γ at (${lon}, ${lat})`);
    }
  });

  it('gridConvergence in a UTM zone matches γ ≈ Δλ·sin φ to first order, positive east of the central meridian in the north', () => {
    // Derived (small Δλ): γ = Δλ sin φ + O(Δλ³); with Δλ = 0.5° the cubic term is below 1e-5°.
    const utm33 = builtInCrs(32633)!; // central meridian 15°E
    const rows = [
      { lon: 15.5, lat: 45, expected: 0.5 * Math.sin(45 * DEG) },
      { lon: 14.5, lat: 45, expected: -0.5 * Math.sin(45 * DEG) },
      { lon: 15.5, lat: 10, expected: 0.5 * Math.sin(10 * DEG) },
      { lon: 15, lat: 60, expected: 0 },
    ];
    for (const r of rows) expectClose(gridConvergence(r.lon, r.lat, utm33), r.expected, 1e-5, `γ at (${r.lon}, ${r.lat})`);
    expectClose(gridConvergence(15.5, -45, builtInCrs(32733)!), -0.5 * Math.sin(45 * DEG), 1e-5, 'γ south of the equator');
  });

  it('gridConvergence at the EPSG 7-2 point of the British National Grid matches the third-order series', () => {
    // Series γ = Δλ sin φ [1 + (Δλ² cos² φ / 3)(1 + 3η² + 2η⁴)], η² = e'² cos² φ (standard TM series, from memory).
    // The point is on OSGB36, so the projection is used without the datum shift (as in the 7-2 example).
    const crs = crsFromText(builtInCrs(27700)!.proj4.replace(/\s*\+towgs84=\S+/, ''));
    const a = 6377563.396;
    const b = 6356256.909; // Airy 1830 (EPSG)
    const ep2 = (a * a - b * b) / (b * b);
    const phi = 50.5 * DEG;
    const dl = 2.5 * DEG; // 0.5°E minus the 2°W central meridian
    const eta2 = ep2 * Math.cos(phi) ** 2;
    const series = dl * Math.sin(phi) * (1 + ((dl * dl * Math.cos(phi) ** 2) / 3) * (1 + 3 * eta2 + 2 * eta2 * eta2));
    expectClose(gridConvergence(0.5, 50.5, crs), series / DEG, 1e-5, 'γ');
  });

  it('gridConvergence is 0 for a geographic CRS', () => {
    expect(gridConvergence(15, 45, builtInCrs(4326)!)).toBe(0);
  });
});

describe('lonLatProblem(lon, lat) and inArea(lon, lat, crs)', () => {
  const rows = [
    { lon: 15, lat: 45, problem: undefined },
    { lon: -180, lat: -90, problem: undefined },
    { lon: 45, lat: 120, problem: /look swapped/ },
    { lon: 200, lat: 45, problem: /longitude from -180 to 180/ },
    { lon: 500000, lat: 4980000, problem: /projected coordinates/ },
    { lon: Number.NaN, lat: 0, problem: /numbers/ },
  ];
  for (const r of rows) {
    it(`lonLatProblem(${r.lon}, ${r.lat}) is ${r.problem ?? 'undefined'}`, () => {
      const p = lonLatProblem(r.lon, r.lat);
      if (r.problem === undefined) expect(p).toBeUndefined();
      else expect(p).toMatch(r.problem);
    });
  }

  it('inArea(lon, lat, crs) accepts a zone widened by the margin and refuses beyond it', () => {
    const utm33: Crs = builtInCrs(32633)!;
    expect(inArea(18.9, 45, utm33)).toBe(true);
    expect(inArea(19.1, 45, utm33)).toBe(false);
    expect(inArea(19.1, 45, utm33, 5)).toBe(true);
    expect(inArea(15, -2, utm33)).toBe(false);
    expect(describeArea(utm33.area!)).toBe('12°E to 18°E, 0°N to 84°N');
  });

  it('inArea(lon, lat, crs) handles an area that crosses the antimeridian', () => {
    const crs: Crs = { ...builtInCrs(4326)!, area: { west: 170, east: -170, south: -50, north: -30 } };
    expect(inArea(179, -40, crs, 0)).toBe(true);
    expect(inArea(-175, -40, crs, 0)).toBe(true);
    expect(inArea(0, -40, crs, 0)).toBe(false);
  });
});
