import { afterEach, describe, expect, it, vi } from 'vitest';
import { readFileSync } from 'node:fs';
import proj4 from 'proj4';
import { CrsError, crsFromText, fromLonLat, pendingEpsgCode, resolveCrs, toLonLat } from '../../src/io/crs';
import { loadEpsgFromTable } from '../../src/io/epsgTable';
import { describeCrsText, prepareCrs, toReadOptions } from '../../src/components/import/importOptions';
import { readFileStations } from '../../src/components/import/parseJob';
import type { Station } from '../../src/core/station';
import { EPSG_TABLE_PATH, makeEpsgTable, readEpsgIndex } from '../../scripts/make-epsg-table';
import { expectClose } from '../helpers/tolerance';

/**
 * EPSG codes outside the built-in table, resolved the way the browser does it: through the table
 * loaded on first use (io/epsgTable.ts, a chunk of its own in a bundle). The loader is exercised
 * here in Node; only its transport (a dynamic import) differs in the browser.
 *
 * References outside the project:
 * - the proj4 definitions the EPSG register gives, as the epsg-index 2.0.0 package carries them
 *   (its one-file-per-code `s/<code>.json`, read separately from the all.json the table is made of);
 * - EPSG Guidance Note 7-2 (IOGP, "Coordinate Conversions and Transformations including
 *   Formulas"), the worked example of each projection method (values from memory; each matched
 *   proj4js to the centimetre, and a wrong value would not);
 * - proj4js itself for the inverse.
 */

function indexFile(code: number): { code: string; kind: string; name: string; proj4: string | null; bbox?: number[] } {
  return JSON.parse(readFileSync(new URL(`../../node_modules/epsg-index/s/${code}.json`, import.meta.url), 'utf8'));
}

/**
 * Geographic coordinates on a definition's own datum: the Guidance Note's examples start from
 * them, so no datum shift may enter the projection check.
 */
const ownGeographic = (def: string): string => `+proj=longlat ${def.split(/\s+/).filter((t) => /^\+(datum|ellps|a|b|rf|towgs84|nadgrids)=/.test(t)).join(' ')} +no_defs`;
const dms = (d: number, m = 0, s = 0): number => Math.sign(d) * (Math.abs(d) + m / 60 + s / 3600);

describe('loadEpsgFromTable(code): the EPSG register\'s definitions, offline', () => {
  // Each row: the definition epsg-index 2.0.0 gives (s/<code>.json, copied here as published).
  const PUBLISHED: { code: number; name: string; proj4: string }[] = [
    { code: 2263, name: 'NAD83 / New York Long Island (ftUS)', proj4: '+proj=lcc +lat_0=40.1666666666667 +lon_0=-74 +lat_1=41.0333333333333 +lat_2=40.6666666666667 +x_0=300000 +y_0=0 +ellps=GRS80 +towgs84=0,0,0,0,0,0,0 +units=us-ft +no_defs +type=crs' },
    { code: 5041, name: 'WGS 84 / UPS North (E,N)', proj4: '+proj=stere +lat_0=90 +lon_0=0 +k=0.994 +x_0=2000000 +y_0=2000000 +datum=WGS84 +units=m +no_defs +type=crs' },
    { code: 3388, name: 'Pulkovo 1942 / Caspian Sea Mercator', proj4: '+proj=merc +lat_ts=42 +lon_0=51 +x_0=0 +y_0=0 +ellps=krass +towgs84=25,-141,-78.5,0,-0.35,-0.736,0 +units=m +no_defs +type=crs' },
    { code: 24200, name: 'JAD69 / Jamaica National Grid', proj4: '+proj=lcc +lat_1=18 +lat_0=18 +lon_0=-77 +k_0=1 +x_0=250000 +y_0=150000 +ellps=clrk66 +towgs84=-33.722,153.789,94.959,8.581,4.478,-4.54,8.95 +units=m +no_defs +type=crs' },
  ];
  for (const p of PUBLISHED) {
    it(`loadEpsgFromTable(${p.code}) gives the published definition of ${p.name}, and resolveCrs uses it`, async () => {
      const record = await loadEpsgFromTable(p.code);
      expect(record).toMatchObject({ code: String(p.code), kind: 'CRS-PROJCRS', name: p.name, proj4: p.proj4 });
      const crs = await resolveCrs(`EPSG:${p.code}`, loadEpsgFromTable);
      expect(crs.proj4).toBe(p.proj4.replace(' +type=crs', ''));
      expect(crs.name).toBe(p.name);
    });
  }

  it('loadEpsgFromTable(code) carries every code of the index unchanged: kind, name, proj4 and area as in s/<code>.json', async () => {
    const { records } = readEpsgIndex();
    const codes = Object.keys(records).map(Number);
    expect(codes.length).toBeGreaterThan(8000);
    for (const code of codes) {
      const file = indexFile(code);
      const record = await loadEpsgFromTable(code);
      expect(record, `EPSG:${code}`).toEqual({ code: file.code, kind: file.kind, name: file.name, proj4: file.proj4 ?? '', ...(file.bbox && { bbox: file.bbox }) });
    }
  });

  it('the committed table is what scripts/make-epsg-table.ts makes from the installed epsg-index (rerun npm run epsg-table if not)', () => {
    const { version, records } = readEpsgIndex();
    expect(readFileSync(EPSG_TABLE_PATH, 'utf8') === makeEpsgTable(version, records)).toBe(true);
  });

  it('loadEpsgFromTable(code) is undefined for codes the index does not have', async () => {
    expect(await loadEpsgFromTable(99999)).toBeUndefined();
    expect(await loadEpsgFromTable(-5)).toBeUndefined();
  });
});

describe('published projection examples through the browser path (EPSG Guidance Note 7-2)', () => {
  // Each row: a Guidance Note 7-2 worked example, geographic coordinates on the CRS's own datum ->
  // easting, northing in the CRS's units. Tolerance: the printed precision (0.01) plus proj4js rounding.
  const EXAMPLES: { code: number; method: string; lon: number; lat: number; e: number; n: number; tol?: number }[] = [
    // GN 7-2, Polar Stereographic (variant A), WGS 84 / UPS North: 73°N 44°E.
    { code: 5041, method: 'Polar Stereographic (variant A)', lon: 44, lat: 73, e: 3320416.75, n: 632668.43 },
    // GN 7-2, Lambert Conic Conformal (2SP), NAD27 / Texas South Central, US survey feet: 28°30'N 96°W.
    { code: 32040, method: 'Lambert Conic Conformal (2SP)', lon: -96, lat: 28.5, e: 2963503.91, n: 254759.8 },
    // GN 7-2, Lambert Conic Conformal (1SP), JAD69 / Jamaica National Grid: 17°55'55.80"N 76°56'37.26"W.
    { code: 24200, method: 'Lambert Conic Conformal (1SP)', lon: dms(-76, 56, 37.26), lat: dms(17, 55, 55.8), e: 255966.58, n: 142493.51 },
    // GN 7-2, Mercator (variant B), Pulkovo 1942 / Caspian Sea Mercator: 53°N 53°E.
    { code: 3388, method: 'Mercator (variant B)', lon: 53, lat: 53, e: 165704.29, n: 5171848.07 },
    // GN 7-2, Cassini-Soldner, Trinidad 1903 / Trinidad Grid, Clarke's links: 10°N 62°W.
    { code: 30200, method: 'Cassini-Soldner', lon: -62, lat: 10, e: 66644.94, n: 82536.22, tol: 0.02 },
    // GN 7-2, Hotine Oblique Mercator (variant B), Timbalai 1948 / RSO Borneo (m): 5°23'14.1129"N 115°48'19.8196"E.
    { code: 29873, method: 'Hotine Oblique Mercator (variant B)', lon: dms(115, 48, 19.8196), lat: dms(5, 23, 14.1129), e: 679245.73, n: 596562.78 },
  ];
  for (const x of EXAMPLES) {
    it(`resolveCrs("EPSG:${x.code}", loadEpsgFromTable) projects the ${x.method} example to E ${x.e}, N ${x.n}, and back`, async () => {
      const crs = await resolveCrs(`EPSG:${x.code}`, loadEpsgFromTable);
      const geographic = ownGeographic(crs.proj4);
      const [e, n] = proj4(geographic, crs.proj4, [x.lon, x.lat]);
      expectClose(e, x.e, x.tol ?? 0.01, `EPSG:${x.code} easting`);
      expectClose(n, x.n, x.tol ?? 0.01, `EPSG:${x.code} northing`);
      const [lon, lat] = proj4(geographic, crs.proj4).inverse([x.e, x.n]);
      expectClose(lon, x.lon, 1e-6, 'longitude back');
      expectClose(lat, x.lat, 1e-6, 'latitude back');
      // And through the reader's own functions (WGS 84 in and out, so with the datum shift): a round
      // trip to 1e-7° (about a centimetre; proj4js inverts the geocentric step by iteration).
      const p = fromLonLat(x.lon, x.lat, crs);
      const back = toLonLat(p.x, p.y, crs);
      expectClose(back.lon, x.lon, 1e-7, 'toLonLat(fromLonLat) longitude');
      expectClose(back.lat, x.lat, 1e-7, 'toLonLat(fromLonLat) latitude');
    });
  }

  it('resolveCrs("EPSG:32040", ...) makes the missing NTv2 grid optional and says the datum shift is left out', async () => {
    const crs = await resolveCrs('EPSG:32040', loadEpsgFromTable);
    expect(crs.proj4).toContain('+nadgrids=@NTv2_0.gsb,@null');
    expect(crs.notes.join(' ')).toMatch(/datum shift grid NTv2_0.gsb is not available/);
  });

  it('resolveCrs("EPSG:4087", ...) warns that proj4 computes the equidistant cylindrical on a sphere (GN 7-2 gives N 6097230.31 at 55°N 10°E)', async () => {
    const crs = await resolveCrs('EPSG:4087', loadEpsgFromTable);
    const [, n] = proj4(ownGeographic(crs.proj4), crs.proj4, [10, 55]);
    // GN 7-2, Equidistant Cylindrical, WGS 84 / World Equidistant Cylindrical: N 6097230.31 m. proj4js is 25 km off.
    expect(Math.abs(n - 6097230.31)).toBeGreaterThan(20_000);
    expect(crs.notes.join(' ')).toMatch(/computed on a sphere/);
  });

  it('resolveCrs refuses heights and Earth-centred systems by name, and a code with no proj4 definition', async () => {
    await expect(resolveCrs('EPSG:5703', loadEpsgFromTable)).rejects.toThrow(/EPSG:5703 \(NAVD88 height\) is a vertical \(height\) system; x and y need a projected or geographic/);
    await expect(resolveCrs('EPSG:4978', loadEpsgFromTable)).rejects.toThrow(/EPSG:4978 \(WGS 84\) is an Earth-centred \(geocentric\) system/);
    await expect(resolveCrs('EPSG:2000', loadEpsgFromTable)).rejects.toThrow(/EPSG:2000 \(Anguilla 1957 \/ British West Indies Grid\) has no proj4 definition in the EPSG index/);
    await expect(resolveCrs('EPSG:99999', loadEpsgFromTable)).rejects.toBeInstanceOf(CrsError);
  });
});

describe('the import with an EPSG code from the table', () => {
  it('prepareCrs("EPSG:3413") looks the code up once; then crsFromText, toReadOptions and the form know it', async () => {
    expect(pendingEpsgCode('EPSG:3413')).toBe(3413);
    expect(() => toReadOptions({ planeNotation: 'auto', lineNotation: 'auto', north: 'true', crs: 'EPSG:3413' })).toThrow(/has not been looked up in the EPSG index yet/);
    await prepareCrs('EPSG:3413');
    expect(pendingEpsgCode('EPSG:3413')).toBeUndefined();
    expect(crsFromText('epsg:3413').name).toBe('WGS 84 / NSIDC Sea Ice Polar Stereographic North');
    expect(toReadOptions({ planeNotation: 'auto', lineNotation: 'auto', north: 'grid', crs: 'EPSG:3413' }).crs?.code).toBe('EPSG:3413');
    expect(describeCrsText('EPSG:3413')).toEqual({ ok: true, text: 'WGS 84 / NSIDC Sea Ice Polar Stereographic North (EPSG:3413)' });
  });

  it('prepareCrs refuses a code in neither table, naming it, and the form says why', async () => {
    await expect(prepareCrs('EPSG:99998')).rejects.toThrow(/EPSG:99998 is not in the built-in table or the EPSG index: check the code, or give its proj4 definition/);
    expect(describeCrsText('EPSG:99998')).toEqual({ ok: false, text: 'EPSG:99998 is not in the built-in table or the EPSG index: check the code, or give its proj4 definition (+proj=...)' });
  });

  it('readFileStations(file) reads x/y in EPSG:2263 (US survey feet) where proj4 puts them with the published definition', async () => {
    // Invented stations on Long Island, New York State Plane (EPSG:2263), feet.
    const csv = 'id,kind,dipdir,dip,x,y\nLI-1,bedding,120,30,1000000,200000\nLI-2,bedding,95,42,1100000,210000\n';
    const stations: Station[] = [];
    await readFileStations(
      new Blob([csv]),
      { format: 'csv', mapping: { id: 'id', kind: 'kind', dipDirection: 'dipdir', dip: 'dip', x: 'x', y: 'y' }, options: { planeNotation: 'auto', lineNotation: 'auto', north: 'true', crs: 'EPSG:2263' } },
      { batch: (b) => stations.push(...b.stations), progress: () => {} },
    );
    const published = indexFile(2263).proj4!;
    for (const [i, [x, y]] of [[1000000, 200000], [1100000, 210000]].entries()) {
      const [lon, lat] = proj4(published, 'WGS84', [x, y]);
      expect(stations[i].problems).toEqual([]);
      expectClose(stations[i].lon!, lon, 1e-9, `${stations[i].id} longitude`);
      expectClose(stations[i].lat!, lat, 1e-9, `${stations[i].id} latitude`);
    }
  });
});

describe('when the table cannot be fetched', () => {
  afterEach(() => {
    vi.doUnmock('../../src/io/epsgTable.json');
    vi.resetModules();
  });

  it('loadEpsgFromTable rejects with a message that says to connect once, or use a listed system or a proj4 definition; prepareCrs passes it on', async () => {
    vi.resetModules();
    // As a browser offline on first use: the chunk's fetch fails.
    vi.doMock('../../src/io/epsgTable.json', () => {
      throw new TypeError('Failed to fetch dynamically imported module');
    });
    const fresh = await import('../../src/io/epsgTable');
    await expect(fresh.loadEpsgFromTable(2263)).rejects.toBeInstanceOf(fresh.EpsgTableUnavailableError);
    await expect(fresh.loadEpsgFromTable(2263)).rejects.toThrow(/the EPSG table could not be loaded\. It is downloaded \(about 0\.2 MB\) the first time .* this device may be offline .* Connect once and try again, choose a coordinate system from the list, or give its proj4 definition/);
    const options = await import('../../src/components/import/importOptions');
    await expect(options.prepareCrs('EPSG:2263', fresh.loadEpsgFromTable)).rejects.toThrow(/could not read the EPSG index for EPSG:2263: the EPSG table could not be loaded/);
  });

  it('readFileStations with the CRS the page looked up (ReadRequest.crs) reads EPSG:2263 rows without the table, as the parse worker does', async () => {
    const crs = await resolveCrs('EPSG:2263', loadEpsgFromTable); // looked up "on the page"
    vi.resetModules();
    vi.doMock('../../src/io/epsgTable.json', () => {
      throw new TypeError('Failed to fetch dynamically imported module');
    });
    // A fresh module context, as a worker is: it knows nothing the page looked up.
    const { readFileStations: read, ImportFileError } = await import('../../src/components/import/parseJob');
    const request = { format: 'csv' as const, mapping: { id: 'id', dipDirection: 'dd', dip: 'dip', x: 'x', y: 'y' }, options: { planeNotation: 'auto' as const, lineNotation: 'auto' as const, north: 'true' as const, defaultKind: 'bedding' as const, crs: 'EPSG:2263' } };
    const csv = 'id,dd,dip,x,y\nLI-1,120,30,1000000,200000\n';
    // Without it, the reader looks the code up itself, and says plainly that it cannot.
    const e = await read(new Blob([csv]), request, { batch: () => {}, progress: () => {} }).then(
      () => null,
      (x: unknown) => x,
    );
    expect(e).toBeInstanceOf(ImportFileError);
    expect((e as Error).message).toMatch(/could not read the EPSG index for EPSG:2263: the EPSG table could not be loaded/);
    // With it, the rows are read where proj4 puts them with the published definition.
    const stations: Station[] = [];
    await read(new Blob([csv]), { ...request, crs }, { batch: (b) => stations.push(...b.stations), progress: () => {} });
    const [lon, lat] = proj4(indexFile(2263).proj4!, 'WGS84', [1000000, 200000]);
    expectClose(stations[0].lon!, lon, 1e-9, 'longitude');
    expectClose(stations[0].lat!, lat, 1e-9, 'latitude');
  });
});
